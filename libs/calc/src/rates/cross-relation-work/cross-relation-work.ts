/**
 * `rate.crossRelationWork`: the Marcus cross relation with work terms for charged reactants
 * (Marcus & Sutin 1985 form), Debye–Hückel-screened Coulomb work at ionic strength μ.
 */
import { AVOGADRO_PER_MOL, COULOMB_EV_ANGSTROM } from '../../core/constants';
import { CalcRefusal, type MethodDefinition } from '../../core/method';
import { thermalEnergyEv, WARNING_CODES } from '../../core/warnings';
import {
  DEFAULT_COLLISION_FREQUENCY,
  equilibriumConstantLog,
} from '../cross-relation/cross-relation';
import { readTemperature } from '../rate-inputs';
import { reportRate } from '../rate-log';

const SELF_EXCHANGE_MESSAGE =
  'Self-exchange rates must be positive and below the collision limit Z.';
const MAX_LN_EQUILIBRIUM = 700;
/** Å³ per litre. */
const CUBIC_ANGSTROM_PER_LITRE = 1e27;

/**
 * Debye–Hückel inverse screening length κ (Å⁻¹) at ionic strength μ (mol/L):
 * κ² = 2N_A μ e²/(ε ε₀ k_BT) = 8π (e²/4πε₀) n/(ε k_BT), n = N_A μ per Å³.
 * Gives κ = 0.329 √μ Å⁻¹ in water at 25 °C (ε = 78.4; the "β" of Marcus & Sutin 1985, from memory).
 * Reference: P. Debye, E. Hückel, Phys. Z. 1923, 24, 185.
 */
export function debyeKappaPerAngstrom(
  ionicStrengthM: number,
  epsilon: number,
  temperatureK: number,
): number {
  const n = (AVOGADRO_PER_MOL * ionicStrengthM) / CUBIC_ANGSTROM_PER_LITRE;
  return Math.sqrt(
    (8 * Math.PI * COULOMB_EV_ANGSTROM * n) / (epsilon * thermalEnergyEv(temperatureK)),
  );
}

/**
 * Coulomb work (eV) to bring charges z_i, z_j to contact distance r (Å), screened:
 * w = z_i z_j e²/(4πε₀ ε r (1 + κr)).
 * Reference: R. A. Marcus, N. Sutin, Biochim. Biophys. Acta 1985, 811, 265
 * (doi 10.1016/0304-4173(85)90014-X; from memory), their work-term expression.
 */
export function screenedWorkEv(
  chargeI: number,
  chargeJ: number,
  distanceAngstrom: number,
  epsilon: number,
  kappaPerAngstrom: number,
): number {
  return (
    (chargeI * chargeJ * COULOMB_EV_ANGSTROM) /
    (epsilon * distanceAngstrom * (1 + kappaPerAngstrom * distanceAngstrom))
  );
}

/** Work terms of the cross reaction 1 + 2 → 1′ + 2′ and of the two self-exchanges, eV. */
export interface WorkTerms {
  /** Reactants 1 and 2 (cross reaction). */
  readonly w12: number;
  /** Products 1′ and 2′ (cross reaction). */
  readonly w21: number;
  /** Self-exchange 1/1′. */
  readonly w11: number;
  /** Self-exchange 2/2′. */
  readonly w22: number;
}

/**
 * ln k12 and its parts with work terms (Marcus & Sutin 1985; N. Sutin, Prog. Inorg. Chem. 1983,
 * 30, 441; from memory):
 * k12 = (k11 k22 K12 f12)^½ W12,
 * ln f12 = [ln K12 + (w12 − w21)/k_BT]² / {4[ln(k11k22/Z²) + (w11 + w22)/k_BT]},
 * W12 = exp[−(w12 + w21 − w11 − w22)/(2k_BT)].
 * With every w = 0 this is the plain cross relation term for term.
 */
export function crossRelationWorkLog(
  lnK11: number,
  lnK22: number,
  lnEquilibrium: number,
  lnZ: number,
  work: WorkTerms,
  thermalEv: number,
): { lnK12: number; lnF: number; lnW: number; denominator: number } {
  const denominator = lnK11 + lnK22 - 2 * lnZ + (work.w11 + work.w22) / thermalEv;
  const numerator = lnEquilibrium + (work.w12 - work.w21) / thermalEv;
  const lnF = (numerator * numerator) / (4 * denominator);
  const lnW = -(work.w12 + work.w21 - work.w11 - work.w22) / (2 * thermalEv);
  return { lnK12: 0.5 * (lnK11 + lnK22 + lnEquilibrium + lnF) + lnW, lnF, lnW, denominator };
}

export interface CrossRelationWorkInputs {
  readonly k11: number;
  readonly k22: number;
  readonly lnEquilibrium: number;
  readonly collisionFrequency: number;
  readonly temperatureK: number;
  readonly charges: { z1: number; z2: number; z1p: number; z2p: number };
  readonly radius1: number;
  readonly radius2: number;
  readonly epsilon: number;
  readonly ionicStrengthM: number;
}

/** The four work terms for contact distances r11 = 2a₁, r22 = 2a₂, r12 = a₁ + a₂. */
export function crossRelationWorkTerms(inputs: CrossRelationWorkInputs): WorkTerms {
  const { z1, z2, z1p, z2p } = inputs.charges;
  const kappa = debyeKappaPerAngstrom(inputs.ionicStrengthM, inputs.epsilon, inputs.temperatureK);
  const r12 = inputs.radius1 + inputs.radius2;
  return {
    w12: screenedWorkEv(z1, z2, r12, inputs.epsilon, kappa),
    w21: screenedWorkEv(z1p, z2p, r12, inputs.epsilon, kappa),
    w11: screenedWorkEv(z1, z1p, 2 * inputs.radius1, inputs.epsilon, kappa),
    w22: screenedWorkEv(z2, z2p, 2 * inputs.radius2, inputs.epsilon, kappa),
  };
}

const RADIUS_MESSAGE = 'Radii and distances must be > 0.';

export const crossRelationWorkMethod = {
  id: 'rate.crossRelationWork',
  summary:
    'Marcus cross relation with Coulomb work terms for charged reactants (Marcus & Sutin 1985), screened at ionic strength μ.',
  references: [
    'R. A. Marcus, N. Sutin, Biochim. Biophys. Acta 1985, 811, 265; doi 10.1016/0304-4173(85)90014-X (from memory)',
    'N. Sutin, Prog. Inorg. Chem. 1983, 30, 441; doi 10.1002/9780470166314.ch9 (from memory)',
    'P. Debye, E. Hückel, Phys. Z. 1923, 24, 185',
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
      description: 'Equilibrium constant of 1 + 2 → 1′ + 2′ (give K12 or deltaE).',
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
      required: true,
      description: 'Absolute temperature.',
    },
    {
      name: 'Z',
      quantity: 'rateSecondOrder',
      required: false,
      description: 'Collision frequency Z.',
      defaultValue: DEFAULT_COLLISION_FREQUENCY,
    },
    {
      name: 'charge1',
      quantity: 'dimensionless',
      required: true,
      label: 'Charge z₁',
      description: 'Charge of reactant 1.',
    },
    {
      name: 'charge2',
      quantity: 'dimensionless',
      required: true,
      label: 'Charge z₂',
      description: 'Charge of reactant 2.',
    },
    {
      name: 'productCharge1',
      quantity: 'dimensionless',
      required: true,
      label: 'Charge z₁′',
      description: 'Charge of product 1′ (z₁ ± 1).',
    },
    {
      name: 'productCharge2',
      quantity: 'dimensionless',
      required: true,
      label: 'Charge z₂′',
      description: 'Charge of product 2′ (z₂ ∓ 1).',
    },
    {
      name: 'radius1',
      quantity: 'distance',
      required: true,
      label: 'Radius a₁',
      description: 'Radius of reactant 1 (r11 = 2a₁, r12 = a₁ + a₂).',
    },
    {
      name: 'radius2',
      quantity: 'distance',
      required: true,
      label: 'Radius a₂',
      description: 'Radius of reactant 2.',
    },
    {
      name: 'epsilon',
      quantity: 'dimensionless',
      required: true,
      description: 'Static dielectric constant ε_s of the solvent (≥ 1).',
    },
    {
      name: 'ionicStrength',
      quantity: 'dimensionless',
      required: false,
      label: 'Ionic strength μ',
      description: 'Ionic strength μ, mol/L (≥ 0).',
      defaultValue: 0,
    },
  ],
  outputs: [
    { name: 'k12', unit: 'M-1 s-1', description: 'Cross-reaction rate constant with work terms.' },
    { name: 'log10k12', unit: '', description: 'log10 of k12 in M⁻¹ s⁻¹.' },
    { name: 'f12', unit: '', description: 'Correction factor f12 with work terms.' },
    {
      name: 'W12',
      unit: '',
      description: 'Work factor W12 = exp[−(w12 + w21 − w11 − w22)/(2k_BT)].',
    },
    { name: 'K12', unit: '', description: 'Equilibrium constant used.' },
    { name: 'workTerms', unit: 'eV', description: '{ w12, w21, w11, w22 } in eV.' },
  ],
  read(reader) {
    const positive = { greaterThan: 0, message: SELF_EXCHANGE_MESSAGE };
    const k11 = reader.quantity('k11', 'rateSecondOrder', positive);
    const k22 = reader.quantity('k22', 'rateSecondOrder', positive);
    const equilibrium = reader.optionalNumber('K12', positive);
    const deltaEV = reader.optionalQuantity('deltaE', 'potential');
    const temperatureK = readTemperature(reader);
    const collisionFrequency = reader.quantity('Z', 'rateSecondOrder', {
      ...positive,
      defaultValue: DEFAULT_COLLISION_FREQUENCY,
    });
    const z1 = reader.integer('charge1');
    const z2 = reader.integer('charge2');
    const z1p = reader.integer('productCharge1');
    const z2p = reader.integer('productCharge2');
    const radius1 = reader.quantity('radius1', 'distance', {
      greaterThan: 0,
      message: RADIUS_MESSAGE,
    });
    const radius2 = reader.quantity('radius2', 'distance', {
      greaterThan: 0,
      message: RADIUS_MESSAGE,
    });
    const epsilon = reader.number('epsilon', {
      atLeast: 1,
      message: 'Dielectric constant and refractive index must be ≥ 1.',
    });
    const ionicStrengthM = reader.number('ionicStrength', {
      atLeast: 0,
      defaultValue: 0,
      message: 'Field ionicStrength must be ≥ 0 mol/L.',
    });
    if ([z1, z2, z1p, z2p].every(Number.isFinite)) {
      if (Math.abs(z1p - z1) !== 1) {
        reader.fail('productCharge1', 'One electron moves: productCharge1 must be charge1 ± 1.');
      } else if (z2p - z2 !== -(z1p - z1)) {
        reader.fail(
          'productCharge2',
          'One electron moves from one reactant to the other: productCharge2 must be charge2 ∓ 1 (opposite to couple 1).',
        );
      }
    }
    let lnEquilibrium = Number.NaN;
    if (equilibrium !== undefined && deltaEV !== undefined) {
      reader.fail('deltaE', 'Give K12 or deltaE, not both.');
    } else if (equilibrium !== undefined) {
      lnEquilibrium = Math.log(equilibrium);
    } else if (deltaEV !== undefined) {
      lnEquilibrium = equilibriumConstantLog(deltaEV, temperatureK);
      if (Math.abs(lnEquilibrium) > MAX_LN_EQUILIBRIUM) {
        reader.fail('deltaE', 'deltaE too large: K12 outside the floating-point range.');
      }
    } else {
      reader.fail('K12', 'Give K12 or deltaE.');
    }
    if (k11 > 0 && k22 > 0 && collisionFrequency > 0) {
      if (Math.log(k11) + Math.log(k22) >= 2 * Math.log(collisionFrequency)) {
        reader.fail('k11', SELF_EXCHANGE_MESSAGE);
      }
    }
    return {
      k11,
      k22,
      lnEquilibrium,
      collisionFrequency,
      temperatureK,
      charges: { z1, z2, z1p, z2p },
      radius1,
      radius2,
      epsilon,
      ionicStrengthM,
    };
  },
  compute(inputs, sink) {
    const work = crossRelationWorkTerms(inputs);
    const thermalEv = thermalEnergyEv(inputs.temperatureK);
    const lnK11 = Math.log(inputs.k11);
    const lnK22 = Math.log(inputs.k22);
    const lnZ = Math.log(inputs.collisionFrequency);
    const result = crossRelationWorkLog(lnK11, lnK22, inputs.lnEquilibrium, lnZ, work, thermalEv);
    if (!(result.denominator < 0)) {
      throw new CalcRefusal([
        {
          field: 'k11',
          message: `${SELF_EXCHANGE_MESSAGE} (with the self-exchange work terms w11 + w22).`,
        },
      ]);
    }
    if (Math.abs(inputs.lnEquilibrium) > 2 * Math.abs(lnK11 + lnK22 - 2 * lnZ)) {
      sink.warn(
        WARNING_CODES.crossRelationAsymmetric,
        'Strongly asymmetric: f12 correction large; work terms may matter.',
      );
    }
    const rate = reportRate(result.lnK12, false, sink, 'k11');
    return {
      k12: rate.k,
      log10k12: rate.log10k,
      f12: Math.exp(result.lnF),
      W12: Math.exp(result.lnW),
      K12: Math.exp(inputs.lnEquilibrium),
      workTerms: { ...work },
    };
  },
} satisfies MethodDefinition<CrossRelationWorkInputs>;

/** What `rate.crossRelationWork` answers (the compiler reads it through `MethodOutputs`). */
export type CrossRelationWorkOutputs = ReturnType<(typeof crossRelationWorkMethod)['compute']>;
