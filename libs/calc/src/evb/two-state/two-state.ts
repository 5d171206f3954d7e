/**
 * `evb.twoState`: two diabatic states mixed by a coupling (SCIENCE.md §3, two-state EVB).
 */
import type { MethodDefinition } from '../../core/method';
import { noteCouplingSign, WARNING_CODES } from '../../core/warnings';
import { readEnergy } from '../../rates/rate-inputs';

export interface TwoStateMixing {
  /** Lower adiabatic energy, eV. */
  readonly ground: number;
  /** Upper adiabatic energy, eV. */
  readonly excited: number;
  /** excited − ground = √((E₂ − E₁)² + 4H²), eV. */
  readonly splitting: number;
  /** Weight |c₁|² of diabatic state 1 in the ground state. */
  readonly groundWeight1: number;
}

/**
 * Eigenvalues of the 2×2 diabatic Hamiltonian [[E₁, H], [H, E₂]]:
 * E_g,e = (E₁ + E₂)/2 ∓ ½√((E₂ − E₁)² + 4H²), and the ground-state weight of state 1,
 * |c₁|² = ½(1 + (E₂ − E₁)/Δ), written as 2H²/(Δ(Δ − x)) for x = E₂ − E₁ < 0 to avoid cancellation.
 * At the crossing (E₁ = E₂) the splitting is exactly 2|H|.
 * References: A. Warshel, R. M. Weiss, J. Am. Chem. Soc. 1980, 102, 6218 (doi 10.1021/ja00540a008);
 * B. S. Brunschwig, N. Sutin, Coord. Chem. Rev. 1999, 187, 233 (doi 10.1016/S0010-8545(99)90001-8).
 * From memory.
 */
export function twoStateMixing(
  energy1Ev: number,
  energy2Ev: number,
  couplingEv: number,
): TwoStateMixing {
  const gapEv = energy2Ev - energy1Ev;
  const splitting = Math.hypot(gapEv, 2 * couplingEv);
  const mean = 0.5 * (energy1Ev + energy2Ev);
  let groundWeight1: number;
  if (splitting === 0) {
    groundWeight1 = 0.5;
  } else if (gapEv >= 0) {
    groundWeight1 = 0.5 * (1 + gapEv / splitting);
  } else {
    groundWeight1 = (2 * couplingEv * couplingEv) / (splitting * (splitting - gapEv));
  }
  return {
    ground: mean - 0.5 * splitting,
    excited: mean + 0.5 * splitting,
    splitting,
    groundWeight1,
  };
}

export interface TwoStateInputs {
  readonly energy1Ev: number;
  readonly energy2Ev: number;
  readonly couplingEv: number;
}

export const twoStateMethod = {
  id: 'evb.twoState',
  summary: 'Adiabatic energies and mixing of two diabatic states coupled by H.',
  references: [
    'A. Warshel, R. M. Weiss, J. Am. Chem. Soc. 1980, 102, 6218; doi 10.1021/ja00540a008',
    'B. S. Brunschwig, N. Sutin, Coord. Chem. Rev. 1999, 187, 233',
  ],
  inputs: [
    { name: 'energy1', quantity: 'energy', required: true, description: 'Diabatic energy E₁.' },
    { name: 'energy2', quantity: 'energy', required: true, description: 'Diabatic energy E₂.' },
    {
      name: 'coupling',
      quantity: 'energy',
      required: true,
      description: 'Diabatic coupling H₁₂ (either sign).',
    },
  ],
  outputs: [
    { name: 'ground', unit: 'eV', description: 'Lower adiabatic energy.' },
    { name: 'excited', unit: 'eV', description: 'Upper adiabatic energy.' },
    { name: 'splitting', unit: 'eV', description: 'Adiabatic splitting (2|H| at the crossing).' },
    {
      name: 'groundWeight1',
      unit: '',
      description: 'Weight of diabatic state 1 in the ground state.',
    },
  ],
  read(reader) {
    return {
      energy1Ev: readEnergy(reader, 'energy1'),
      energy2Ev: readEnergy(reader, 'energy2'),
      couplingEv: readEnergy(reader, 'coupling'),
    };
  },
  compute(inputs, sink) {
    noteCouplingSign(inputs.couplingEv, sink);
    const mixing = twoStateMixing(inputs.energy1Ev, inputs.energy2Ev, inputs.couplingEv);
    if (mixing.splitting === 0) {
      sink.warn(
        WARNING_CODES.degenerateStates,
        'Degenerate uncoupled states: any mixture is an eigenstate; weight 0.5 reported.',
      );
    }
    return { ...mixing };
  },
} satisfies MethodDefinition<TwoStateInputs>;

/** What `evb.twoState` answers (the compiler reads it through `MethodOutputs`). */
export type TwoStateOutputs = ReturnType<(typeof twoStateMethod)['compute']>;
