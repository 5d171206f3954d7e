/**
 * `coupling.gmh`: generalized Mulliken–Hush coupling from adiabatic data (SCIENCE.md §8).
 */
import { CM1_PER_EV } from '../../core/constants';
import type { MethodDefinition } from '../../core/method';
import { WARNING_CODES } from '../../core/warnings';

const GMH_MESSAGE = 'Adiabatic gap must be > 0; dipoles cannot both be zero.';

/**
 * H_AB = μ₁₂ ΔE₁₂ / √((Δμ₁₂)² + 4μ₁₂²), with the adiabatic transition dipole μ₁₂ and the
 * adiabatic dipole difference Δμ₁₂ projected on the CT direction (any one dipole unit) and the
 * vertical gap ΔE₁₂ in eV. Returns |H_AB| (the sign is gauge-dependent).
 * References: R. J. Cave, M. D. Newton, Chem. Phys. Lett. 1996, 249, 15
 * (doi 10.1016/0009-2614(95)01310-5); R. J. Cave, M. D. Newton, J. Chem. Phys. 1997, 106, 9213
 * (doi 10.1063/1.474023). Volume number of the 1996 paper from memory.
 */
export function gmhCouplingEv(
  transitionDipole: number,
  dipoleDifference: number,
  transitionEnergyEv: number,
): number {
  const mu = Math.abs(transitionDipole);
  return (mu * transitionEnergyEv) / Math.hypot(dipoleDifference, 2 * mu);
}

export interface GmhInputs {
  readonly transitionDipoleDebye: number;
  readonly dipoleDifferenceDebye: number;
  readonly transitionEnergyEv: number;
}

export const gmhMethod = {
  id: 'coupling.gmh',
  summary: 'Generalized Mulliken–Hush coupling from adiabatic dipoles and gap.',
  references: [
    'R. J. Cave, M. D. Newton, Chem. Phys. Lett. 1996, 249, 15; doi 10.1016/0009-2614(95)01310-5',
    'R. J. Cave, M. D. Newton, J. Chem. Phys. 1997, 106, 9213; doi 10.1063/1.474023',
  ],
  inputs: [
    {
      name: 'transitionDipole',
      quantity: 'dipole',
      required: true,
      description: 'Adiabatic transition dipole μ₁₂ (projected on the CT axis).',
    },
    {
      name: 'dipoleDifference',
      quantity: 'dipole',
      required: true,
      description: 'Adiabatic dipole difference Δμ₁₂ (same axis).',
    },
    {
      name: 'transitionEnergy',
      quantity: 'energy',
      required: true,
      description: 'Vertical adiabatic gap ΔE₁₂ (> 0).',
    },
  ],
  outputs: [
    { name: 'coupling', unit: 'eV', description: '|H_AB|.' },
    { name: 'couplingCm1', unit: 'cm-1', description: '|H_AB| in cm⁻¹.' },
  ],
  read(reader) {
    const transitionDipoleDebye = reader.quantity('transitionDipole', 'dipole');
    const dipoleDifferenceDebye = reader.quantity('dipoleDifference', 'dipole');
    const transitionEnergyEv = reader.quantity('transitionEnergy', 'energy', {
      greaterThan: 0,
      message: GMH_MESSAGE,
    });
    if (transitionEnergyEv > 1e5)
      reader.fail(
        'transitionEnergy',
        'Field transitionEnergy is outside the supported range (≤ 1e5 eV).',
      );
    if (transitionDipoleDebye === 0 && dipoleDifferenceDebye === 0) {
      reader.fail('transitionDipole', GMH_MESSAGE);
    }
    for (const [name, value] of [
      ['transitionDipole', transitionDipoleDebye],
      ['dipoleDifference', dipoleDifferenceDebye],
    ] as const) {
      if (Math.abs(value) > 1e6)
        reader.fail(name, `Field ${name} is outside the supported range (|value| ≤ 1e6 D).`);
    }
    return { transitionDipoleDebye, dipoleDifferenceDebye, transitionEnergyEv };
  },
  compute(inputs, sink) {
    const { transitionDipoleDebye, dipoleDifferenceDebye, transitionEnergyEv } = inputs;
    if (Math.abs(transitionDipoleDebye) > Math.abs(dipoleDifferenceDebye) / 2) {
      sink.warn(
        WARNING_CODES.gmhStrongMixing,
        'Strongly mixed states; two-state GMH may need more states (Cave & Newton 2002 diagnostic).',
      );
    }
    const coupling = gmhCouplingEv(
      transitionDipoleDebye,
      dipoleDifferenceDebye,
      transitionEnergyEv,
    );
    return { coupling, couplingCm1: coupling * CM1_PER_EV };
  },
} satisfies MethodDefinition<GmhInputs>;

/** What `coupling.gmh` answers (the compiler reads it through `MethodOutputs`). */
export type GmhOutputs = ReturnType<(typeof gmhMethod)['compute']>;
