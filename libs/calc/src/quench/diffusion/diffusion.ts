/** Diffusion-limited bimolecular quenching: Smoluchowski–Stokes–Einstein k_d and the
 * encounter-complex quenching constant. */
import {
  BOLTZMANN_EV_PER_K,
  COULOMB_EV_ANGSTROM,
  GAS_CONSTANT_J_PER_MOL_K,
} from '../../core/constants';
import type { MethodDefinition, WarningSink } from '../../core/method';

/** 1 m³ = 1000 L, so m³ mol⁻¹ s⁻¹ × 1000 = M⁻¹ s⁻¹. */
const LITRES_PER_CUBIC_METRE = 1000;
const POSITIVE_MESSAGE = 'Must be > 0.';

/**
 * Diffusion rate constant k_d = 8RT/(3η) in M⁻¹ s⁻¹ (η in Pa s).
 *
 * Method: Smoluchowski's encounter rate 4π(D_A + D_B)R with Stokes–Einstein diffusion
 * coefficients k_BT/(6πηr) and equal radii (R = 2r, stick boundary), so the radii cancel.
 * Notes: water at 25 °C (0.890 mPa s) gives 7.43e9 M⁻¹ s⁻¹; mixing mPa s with Pa s, or L
 * with m³, are the usual factor-1000 errors (SCIENCE.md §13).
 * References: M. von Smoluchowski, Z. Phys. Chem. 1917, 92, 129; P. Debye,
 * Trans. Electrochem. Soc. 1942, 82, 265 (doi 10.1149/1.3071413).
 */
export function smoluchowskiRateM1S1(viscosityPaS: number, temperatureK: number): number {
  return (
    ((8 * GAS_CONSTANT_J_PER_MOL_K * temperatureK) / (3 * viscosityPaS)) * LITRES_PER_CUBIC_METRE
  );
}

/**
 * Debye factor δ/(e^δ − 1) for the Coulomb interaction of ions, with
 * δ = z_A z_B e²/(4πε₀ ε_s k_BT R) (R in Å); 1 for δ = 0.
 *
 * Notes: > 1 for attractive pairs (2.50 for a ±1 pair in acetonitrile at 7 Å, SCIENCE.md §13).
 * References: P. Debye, Trans. Electrochem. Soc. 1942, 82, 265 (doi 10.1149/1.3071413).
 */
export function debyeFactor(
  chargeProduct: number,
  epsilon: number,
  distanceAngstrom: number,
  temperatureK: number,
): number {
  const delta =
    (chargeProduct * COULOMB_EV_ANGSTROM) /
    (epsilon * BOLTZMANN_EV_PER_K * temperatureK * distanceAngstrom);
  // δ/expm1(δ) keeps full precision near δ = 0 and never overflows for repulsive pairs.
  return delta === 0 ? 1 : delta / Math.expm1(delta);
}

/**
 * Quenching constant of the encounter-complex scheme, k_q = k_d/(1 + k₋d/k_et).
 * References: D. Rehm, A. Weller, Isr. J. Chem. 1970, 8, 259 (doi 10.1002/ijch.197000029).
 */
export function encounterQuenchingRate(
  diffusionRate: number,
  escapeRatePerS: number,
  transferRatePerS: number,
): number {
  return diffusionRate / (1 + escapeRatePerS / transferRatePerS);
}

export interface QuenchInputs {
  readonly viscosityPaS: number;
  readonly temperatureK: number;
  readonly kEtPerS?: number;
  readonly kMinusDiffusionPerS?: number;
  /** z_A z_B; 0 (neutral) by default. */
  readonly chargeProduct: number;
  readonly epsilon?: number;
  readonly distanceAngstrom?: number;
  /** A measured k_q (e.g. Stern–Volmer) to compare with k_d. */
  readonly kqObserved?: number;
}

export interface QuenchResult {
  readonly kDiffusion: number;
  readonly kDiffusionNeutral: number;
  readonly debyeFactor: number;
  readonly kq: number;
  readonly equilibriumConstant?: number;
  readonly kqObservedOverKd?: number;
}

/** k_d (with the Debye factor for ions), k_q, and K_d = k_d/k₋d when k₋d is given. */
export function diffusionQuenching(inputs: QuenchInputs): QuenchResult {
  const kDiffusionNeutral = smoluchowskiRateM1S1(inputs.viscosityPaS, inputs.temperatureK);
  const factor =
    inputs.chargeProduct === 0
      ? 1
      : debyeFactor(
          inputs.chargeProduct,
          inputs.epsilon!,
          inputs.distanceAngstrom!,
          inputs.temperatureK,
        );
  const kDiffusion = kDiffusionNeutral * factor;
  const { kEtPerS, kMinusDiffusionPerS, kqObserved } = inputs;
  const scheme = kEtPerS !== undefined && kMinusDiffusionPerS !== undefined;
  return {
    kDiffusion,
    kDiffusionNeutral,
    debyeFactor: factor,
    kq: scheme ? encounterQuenchingRate(kDiffusion, kMinusDiffusionPerS, kEtPerS) : kDiffusion,
    ...(kMinusDiffusionPerS !== undefined && kMinusDiffusionPerS > 0
      ? { equilibriumConstant: kDiffusion / kMinusDiffusionPerS }
      : {}),
    ...(kqObserved !== undefined ? { kqObservedOverKd: kqObserved / kDiffusion } : {}),
  };
}

/** B33, and a note when only one of k_et and k₋d is given. */
export function warnQuench(inputs: QuenchInputs, result: QuenchResult, sink: WarningSink): void {
  if (inputs.kqObserved !== undefined && inputs.kqObserved > result.kDiffusion) {
    sink.warn(
      'kq-above-diffusion-limit',
      `k_q cannot exceed k_d (${result.kDiffusion.toPrecision(3)} M⁻¹ s⁻¹); check inputs ` +
        '(viscosity in Pa s, not mPa s?).',
    );
  }
  if ((inputs.kEtPerS === undefined) !== (inputs.kMinusDiffusionPerS === undefined)) {
    sink.warn(
      'quench-scheme-incomplete',
      'k_q = k_d: the encounter-complex scheme needs both kET and kMinusDiffusion.',
    );
  }
}

export const diffusionMethod = {
  id: 'quench.diffusion',
  summary:
    'Diffusion-limited rate constant 8RT/(3η) (with the Debye factor for ions) and the ' +
    'encounter-complex quenching constant.',
  references: [
    'M. von Smoluchowski, Z. Phys. Chem. 1917, 92, 129.',
    'P. Debye, Trans. Electrochem. Soc. 1942, 82, 265. doi:10.1149/1.3071413',
    'D. Rehm, A. Weller, Isr. J. Chem. 1970, 8, 259. doi:10.1002/ijch.197000029',
  ],
  inputs: [
    { name: 'viscosity', quantity: 'viscosity', required: true, description: 'Solvent viscosity.' },
    { name: 'temperature', quantity: 'temperature', required: true, description: 'Temperature.' },
    {
      name: 'kET',
      quantity: 'rateFirstOrder',
      required: false,
      description: 'ET rate within the encounter complex.',
    },
    {
      name: 'kMinusDiffusion',
      quantity: 'rateFirstOrder',
      required: false,
      description: 'Escape rate k₋d of the encounter complex.',
    },
    {
      name: 'chargeProduct',
      quantity: 'integer',
      required: false,
      defaultValue: 0,
      description: 'z_A z_B for ions (Debye factor).',
    },
    {
      name: 'epsilon',
      quantity: 'dimensionless',
      required: false,
      description: 'Static dielectric constant (ions only).',
    },
    {
      name: 'distance',
      quantity: 'distance',
      required: false,
      description: 'Encounter distance R (ions only).',
    },
    {
      name: 'kqObserved',
      quantity: 'rateSecondOrder',
      required: false,
      description: 'Measured k_q to compare with k_d.',
    },
  ],
  outputs: [
    { name: 'kDiffusion', unit: 'M-1 s-1', description: 'k_d (× Debye factor for ions).' },
    { name: 'kDiffusionNeutral', unit: 'M-1 s-1', description: '8RT/(3η).' },
    { name: 'debyeFactor', unit: '', description: 'δ/(e^δ − 1); 1 for neutral partners.' },
    { name: 'kq', unit: 'M-1 s-1', description: 'k_d/(1 + k₋d/k_ET), or k_d.' },
    {
      name: 'equilibriumConstant',
      unit: 'M-1',
      description: 'K_d = k_d/k₋d (when k₋d > 0 given).',
    },
    { name: 'kqObservedOverKd', unit: '', description: 'kqObserved/k_d (when given).' },
  ],
  read(reader) {
    const positive = { greaterThan: 0, message: POSITIVE_MESSAGE };
    const viscosityPaS = reader.quantity('viscosity', 'viscosity', positive);
    const temperatureK = reader.quantity('temperature', 'temperature', {
      greaterThan: 0,
      message: 'Temperature must be > 0 K (absolute). Did you enter °C?',
    });
    const kEtPerS = reader.optionalQuantity('kET', 'rateFirstOrder', positive);
    const kMinusDiffusionPerS = reader.optionalQuantity('kMinusDiffusion', 'rateFirstOrder', {
      atLeast: 0,
      message: 'Must be ≥ 0.',
    });
    const chargeProduct = reader.optionalInteger('chargeProduct') ?? 0;
    const epsilon = reader.optionalNumber('epsilon', positive);
    const distanceAngstrom = reader.optionalQuantity('distance', 'distance', positive);
    const kqObserved = reader.optionalQuantity('kqObserved', 'rateSecondOrder', positive);
    if (chargeProduct !== 0) {
      if (epsilon === undefined) reader.fail('epsilon', 'Needed for ions (chargeProduct ≠ 0).');
      if (distanceAngstrom === undefined) {
        reader.fail('distance', 'Needed for ions (chargeProduct ≠ 0).');
      }
    }
    return {
      viscosityPaS,
      temperatureK,
      kEtPerS,
      kMinusDiffusionPerS,
      chargeProduct,
      epsilon,
      distanceAngstrom,
      kqObserved,
    };
  },
  compute(inputs, warnings) {
    const result = diffusionQuenching(inputs);
    warnQuench(inputs, result, warnings);
    return { ...result };
  },
} satisfies MethodDefinition<QuenchInputs>;

/** What `quench.diffusion` answers (the compiler reads it through `MethodOutputs`). */
export type DiffusionOutputs = ReturnType<(typeof diffusionMethod)['compute']>;
