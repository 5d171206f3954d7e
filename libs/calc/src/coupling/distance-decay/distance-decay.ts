/**
 * `coupling.distanceDecay`: exponential decay of the coupling with distance (SCIENCE.md §8).
 */
import type { MethodDefinition } from '../../core/method';
import { warnCouplingMagnitude } from '../../core/warnings';
import { readEnergy } from '../../rates/rate-inputs';

const RADIUS_MESSAGE = 'Radii and distances must be > 0.';

/**
 * H(R) = H₀ exp[−β(R − R₀)/2], β defined for the rate (k ∝ H² ∝ e^(−βR)), so the coupling decays
 * with β/2; keeps the sign of H₀. β in Å⁻¹, distances in Å.
 * References: J. R. Miller, L. T. Calcaterra, G. L. Closs, J. Am. Chem. Soc. 1984, 106, 3047
 * (doi 10.1021/ja00322a058); C. C. Moser et al., Nature 1992, 355, 796 (doi 10.1038/355796a0);
 * both from memory.
 */
export function distanceDecayCouplingEv(
  coupling0Ev: number,
  distance0Angstrom: number,
  betaPerAngstrom: number,
  distanceAngstrom: number,
): number {
  return coupling0Ev * Math.exp((-betaPerAngstrom * (distanceAngstrom - distance0Angstrom)) / 2);
}

export interface DistanceDecayInputs {
  readonly coupling0Ev: number;
  readonly distance0Angstrom: number;
  readonly betaPerAngstrom: number;
  readonly distanceAngstrom: number;
  readonly coupling0Unit: string;
}

export const distanceDecayMethod = {
  id: 'coupling.distanceDecay',
  summary: 'Coupling at distance R from H₀ at R₀ with rate decay constant β: H₀ e^(−β(R−R₀)/2).',
  references: [
    'J. R. Miller, L. T. Calcaterra, G. L. Closs, J. Am. Chem. Soc. 1984, 106, 3047; doi 10.1021/ja00322a058',
    'C. C. Moser, J. M. Keske, K. Warncke, R. S. Farid, P. L. Dutton, Nature 1992, 355, 796; doi 10.1038/355796a0',
  ],
  inputs: [
    {
      name: 'coupling0',
      quantity: 'energy',
      required: true,
      description: 'Coupling H₀ at the reference distance.',
    },
    {
      name: 'distance0',
      quantity: 'distance',
      required: true,
      description: 'Reference distance R₀ (> 0).',
    },
    {
      name: 'beta',
      quantity: 'inverseDistance',
      required: true,
      description: 'Decay constant β of the rate (≥ 0), Å⁻¹.',
    },
    { name: 'distance', quantity: 'distance', required: true, description: 'Distance R (> 0).' },
  ],
  outputs: [{ name: 'coupling', unit: 'eV', description: 'H(R), same sign as H₀.' }],
  read(reader) {
    const coupling0Ev = readEnergy(reader, 'coupling0');
    const positive = { greaterThan: 0, message: RADIUS_MESSAGE };
    const distance0Angstrom = reader.quantity('distance0', 'distance', positive);
    const betaPerAngstrom = reader.quantity('beta', 'inverseDistance', {
      atLeast: 0,
      message: 'Decay constant β must be ≥ 0 Å⁻¹.',
    });
    const distanceAngstrom = reader.quantity('distance', 'distance', positive);
    if (betaPerAngstrom > 100)
      reader.fail('beta', 'Field beta is outside the supported range (≤ 100 A-1).');
    for (const [name, value] of [
      ['distance0', distance0Angstrom],
      ['distance', distanceAngstrom],
    ] as const) {
      if (value > 1e4) reader.fail(name, `Field ${name} is outside the supported range (≤ 1e4 A).`);
    }
    if ((betaPerAngstrom * (distanceAngstrom - distance0Angstrom)) / 2 < -600) {
      reader.fail('distance', 'Extrapolation to R far below R₀ exceeds the floating-point range.');
    }
    return {
      coupling0Ev,
      distance0Angstrom,
      betaPerAngstrom,
      distanceAngstrom,
      coupling0Unit: reader.unitOf('coupling0'),
    };
  },
  compute(inputs, sink) {
    warnCouplingMagnitude('coupling0', inputs.coupling0Ev, inputs.coupling0Unit, sink);
    return {
      coupling: distanceDecayCouplingEv(
        inputs.coupling0Ev,
        inputs.distance0Angstrom,
        inputs.betaPerAngstrom,
        inputs.distanceAngstrom,
      ),
    };
  },
} satisfies MethodDefinition<DistanceDecayInputs>;

/** What `coupling.distanceDecay` answers (the compiler reads it through `MethodOutputs`). */
export type DistanceDecayOutputs = ReturnType<(typeof distanceDecayMethod)['compute']>;
