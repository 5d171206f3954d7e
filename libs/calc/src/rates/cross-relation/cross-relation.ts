/**
 * `rate.crossRelation`: the Marcus cross relation (SCIENCE.md §10).
 */
import { BOLTZMANN_EV_PER_K } from '../../core/constants';
import type { MethodDefinition } from '../../core/method';
import { WARNING_CODES } from '../../core/warnings';
import { readTemperature } from '../rate-inputs';
import { reportRate } from '../rate-log';

/** Default collision frequency Z in M⁻¹ s⁻¹ (Marcus 1963). */
export const DEFAULT_COLLISION_FREQUENCY = 1e11;
/** |ln K12| above this would overflow K12 itself; such requests are refused. */
const MAX_LN_EQUILIBRIUM = 700;
const SELF_EXCHANGE_MESSAGE =
  'Self-exchange rates must be positive and below the collision limit Z.';

/**
 * ln K12 for a one-electron step from the potential difference ΔE° (V, acceptor couple minus
 * donor couple): K12 = exp(eΔE°/k_BT) = exp(FΔE°/RT).
 */
export function equilibriumConstantLog(deltaEV: number, temperatureK: number): number {
  return deltaEV / (BOLTZMANN_EV_PER_K * temperatureK);
}

/**
 * ln f12 = (ln K12)² / [4 ln(k11 k22/Z²)] (natural logs throughout).
 * Reference: R. A. Marcus, J. Phys. Chem. 1963, 67, 853 (doi 10.1021/j100798a033).
 */
export function crossRelationLnF(
  lnK11: number,
  lnK22: number,
  lnEquilibrium: number,
  lnZ: number,
): number {
  return (lnEquilibrium * lnEquilibrium) / (4 * (lnK11 + lnK22 - 2 * lnZ));
}

/**
 * ln k12 of the Marcus cross relation k12 = (k11 k22 K12 f12)^½, from ln k11, ln k22 (M⁻¹ s⁻¹),
 * ln K12 and ln Z. Exact within the Marcus model with λ12 = (λ11 + λ22)/2 and a common Z; work
 * terms omitted. Requires k11 k22 < Z².
 * References: R. A. Marcus, J. Phys. Chem. 1963, 67, 853; R. A. Marcus, Annu. Rev. Phys. Chem.
 * 1964, 15, 155 (doi 10.1146/annurev.pc.15.100164.001103).
 */
export function crossRelationRateLog(
  lnK11: number,
  lnK22: number,
  lnEquilibrium: number,
  lnZ: number,
): number {
  return 0.5 * (lnK11 + lnK22 + lnEquilibrium + crossRelationLnF(lnK11, lnK22, lnEquilibrium, lnZ));
}

export interface CrossRelationInputs {
  readonly k11: number;
  readonly k22: number;
  readonly lnEquilibrium: number;
  readonly collisionFrequency: number;
}

export const crossRelationMethod = {
  id: 'rate.crossRelation',
  summary: 'Marcus cross relation k12 = (k11 k22 K12 f12)^½ for a one-electron cross reaction.',
  references: [
    'R. A. Marcus, J. Phys. Chem. 1963, 67, 853; doi 10.1021/j100798a033',
    'R. A. Marcus, Annu. Rev. Phys. Chem. 1964, 15, 155; doi 10.1146/annurev.pc.15.100164.001103',
  ],
  inputs: [
    {
      name: 'k11',
      quantity: 'rateSecondOrder',
      required: true,
      description: 'Self-exchange rate of couple 1 (> 0).',
    },
    {
      name: 'k22',
      quantity: 'rateSecondOrder',
      required: true,
      description: 'Self-exchange rate of couple 2 (> 0).',
    },
    {
      name: 'K12',
      quantity: 'dimensionless',
      required: false,
      description: 'Equilibrium constant of the cross reaction (give K12 or deltaE).',
    },
    {
      name: 'deltaE',
      quantity: 'potential',
      required: false,
      label: 'Potential difference ΔE° of the cross reaction',
      description: 'ΔE° = E°(acceptor) − E°(donor), one electron (give K12 or deltaE).',
    },
    {
      name: 'temperature',
      quantity: 'temperature',
      required: false,
      description: 'Absolute temperature (needed with deltaE).',
    },
    {
      name: 'Z',
      quantity: 'rateSecondOrder',
      required: false,
      description: 'Collision frequency Z.',
      defaultValue: DEFAULT_COLLISION_FREQUENCY,
    },
  ],
  outputs: [
    { name: 'k12', unit: 'M-1 s-1', description: 'Cross-reaction rate constant.' },
    { name: 'f12', unit: '', description: 'Correction factor f12.' },
    { name: 'K12', unit: '', description: 'Equilibrium constant used.' },
    { name: 'log10k12', unit: '', description: 'log10 of k12 in M⁻¹ s⁻¹.' },
  ],
  read(reader) {
    const positive = { greaterThan: 0, message: SELF_EXCHANGE_MESSAGE };
    const k11 = reader.quantity('k11', 'rateSecondOrder', positive);
    const k22 = reader.quantity('k22', 'rateSecondOrder', positive);
    const equilibrium = reader.optionalNumber('K12', positive);
    const deltaEV = reader.optionalQuantity('deltaE', 'potential');
    const temperatureK =
      reader.raw('temperature') === undefined ? undefined : readTemperature(reader);
    const collisionFrequency = reader.quantity('Z', 'rateSecondOrder', {
      ...positive,
      defaultValue: DEFAULT_COLLISION_FREQUENCY,
    });
    let lnEquilibrium = Number.NaN;
    if (equilibrium !== undefined && deltaEV !== undefined) {
      reader.fail('deltaE', 'Give K12 or deltaE, not both.');
    } else if (equilibrium !== undefined) {
      lnEquilibrium = Math.log(equilibrium);
    } else if (deltaEV !== undefined) {
      if (temperatureK === undefined) {
        reader.fail('temperature', 'Field temperature is required with deltaE.');
      } else {
        lnEquilibrium = equilibriumConstantLog(deltaEV, temperatureK);
        if (Math.abs(lnEquilibrium) > MAX_LN_EQUILIBRIUM) {
          reader.fail('deltaE', 'deltaE too large: K12 outside the floating-point range.');
        }
      }
    } else {
      reader.fail('K12', 'Give K12 or deltaE.');
    }
    if (k11 > 0 && k22 > 0 && collisionFrequency > 0) {
      // Compare in logs: the product k11 k22 may overflow.
      if (Math.log(k11) + Math.log(k22) >= 2 * Math.log(collisionFrequency)) {
        reader.fail('k11', SELF_EXCHANGE_MESSAGE);
      }
    }
    return { k11, k22, lnEquilibrium, collisionFrequency };
  },
  compute(inputs, sink) {
    const lnK11 = Math.log(inputs.k11);
    const lnK22 = Math.log(inputs.k22);
    const lnZ = Math.log(inputs.collisionFrequency);
    const lnEq = inputs.lnEquilibrium;
    const lnF = crossRelationLnF(lnK11, lnK22, lnEq, lnZ);
    if (Math.abs(lnEq) > 2 * Math.abs(lnK11 + lnK22 - 2 * lnZ)) {
      sink.warn(
        WARNING_CODES.crossRelationAsymmetric,
        'Strongly asymmetric: f12 correction large; work terms may matter.',
      );
    }
    const rate = reportRate(crossRelationRateLog(lnK11, lnK22, lnEq, lnZ), false, sink, 'k11');
    return {
      k12: rate.k,
      f12: Math.exp(lnF),
      K12: Math.exp(lnEq),
      log10k12: rate.log10k,
    };
  },
} satisfies MethodDefinition<CrossRelationInputs>;

/** What `rate.crossRelation` answers (the compiler reads it through `MethodOutputs`). */
export type CrossRelationOutputs = ReturnType<(typeof crossRelationMethod)['compute']>;
