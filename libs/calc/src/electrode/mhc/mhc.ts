/**
 * Electrode kinetics in the Marcus–Hush–Chidsey (MHC) picture: the reference integral by
 * adaptive quadrature and the closed form of Zeng et al. (2014) beside it.
 */
import erfc from '@stdlib/math-base-special-erfc';

import { BOLTZMANN_EV_PER_K } from '../../core/constants';
import type { MethodDefinition, WarningSink } from '../../core/method';
import { integrateAdaptive } from './adaptive-gauss-kronrod';

const LN10 = Math.LN10;
/** Tails where the log-integrand is this far below its maximum (e^-50 ≈ 2e-22) are dropped. */
const TAIL_LOG_DROP = 50;
/** Range of λ/k_BT where the closed form stayed within 5 % of quadrature (SCIENCE.md §11). */
const CLOSED_FORM_MIN_LAMBDA_KT = 8;
const CLOSED_FORM_MAX_LAMBDA_KT = 16;

/** ln(1 + eˣ), without overflow for large x or loss of precision for very negative x. */
export function softplus(x: number): number {
  return Math.max(x, 0) + Math.log1p(Math.exp(-Math.abs(x)));
}

/**
 * ln erfc(z), finite for every finite z.
 *
 * Method: `@stdlib/math-base-special-erfc` below z = 26; above, where erfc underflows, the
 * asymptotic series erfc z ≈ e^(−z²)/(z√π) · (1 − 1/(2z²) + 3/(4z⁴) − 15/(8z⁶) + 105/(16z⁸)).
 * Notes: at z = 26 the first omitted term is ~1e-14 relative.
 * References: M. Abramowitz, I. A. Stegun, Handbook of Mathematical Functions, NBS, 1964,
 * eq. 7.1.23.
 */
export function logErfc(z: number): number {
  if (z < 26) return Math.log(erfc(z));
  const inv2 = 1 / (z * z);
  const series =
    1 - inv2 / 2 + (3 * inv2 * inv2) / 4 - (15 * inv2 ** 3) / 8 + (105 * inv2 ** 4) / 16;
  return -z * z - Math.log(z * Math.sqrt(Math.PI)) + Math.log(series);
}

/**
 * ln I(λ̃, η̃), with I(λ̃, η̃) = ∫ exp(−(x − λ̃ − η̃)²/(4λ̃)) / (1 + eˣ) dx over the real line
 * (λ̃ = λ/k_BT, η̃ = eη/k_BT; reduction rate for the overpotential η).
 *
 * Method: the log-integrand h(x) = −(x − μ)²/(4λ̃) − ln(1 + eˣ), μ = λ̃ + η̃, is concave, so its
 * maximum x* is found by bisection on h′ within [μ − 2λ̃, μ]. The integrand is scaled by
 * e^(−h(x*)) (no underflow for any λ̃, η̃) and integrated by adaptive Gauss–Kronrod 7-15 over
 * μ ± 2√(λ̃(50 − h(x*))), beyond which the Gaussian factor alone is below e^(−50) of the peak;
 * the range is split at x = 0 (Fermi step), x = μ (Gaussian centre) and x*.
 * Notes: relative accuracy ~1e-12 for any λ̃ > 0 and finite η̃.
 * References: C. E. D. Chidsey, Science 1991, 251, 919 (doi 10.1126/science.251.4996.919);
 * R. A. Marcus, J. Chem. Phys. 1965, 43, 679; N. S. Hush, J. Chem. Phys. 1958, 28, 962.
 */
export function logMhcIntegral(lambdaOverKt: number, etaOverKt: number): number {
  const centre = lambdaOverKt + etaOverKt;
  const logIntegrand = (x: number) => -((x - centre) ** 2) / (4 * lambdaOverKt) - softplus(x);
  // h'(x) = −(x − μ)/(2λ̃) − 1/(1 + e^−x) is decreasing: ≥ 0 at μ − 2λ̃, < 0 at μ.
  let low = centre - 2 * lambdaOverKt;
  let high = centre;
  for (let i = 0; i < 200 && high - low > 1e-13 * (1 + Math.abs(low)); i++) {
    const middle = 0.5 * (low + high);
    const slope = -(middle - centre) / (2 * lambdaOverKt) - 1 / (1 + Math.exp(-middle));
    if (slope > 0) low = middle;
    else high = middle;
  }
  const peakX = 0.5 * (low + high);
  const peakLog = logIntegrand(peakX);
  const halfRange = 2 * Math.sqrt(lambdaOverKt * (TAIL_LOG_DROP - peakLog));
  const scaled = (x: number) => Math.exp(logIntegrand(x) - peakLog);
  const { integral } = integrateAdaptive(scaled, centre - halfRange, centre + halfRange, {
    relTolerance: 1e-13,
    breakpoints: [0, centre, peakX],
  });
  return peakLog + Math.log(integral);
}

/**
 * ln of the Zeng–Smith–Bai–Bazant closed form for the MHC reduction integral:
 * I ≈ √(πλ̃)/(1 + e^η̃) · erfc[(λ̃ − √(1 + √λ̃ + η̃²))/(2√λ̃)]; oxidation uses −η̃.
 *
 * Notes: the formula as recalled in SCIENCE.md §11 (full text not checked). Measured against
 * quadrature its error is < 5 % only for 8 ≲ λ̃ ≲ 16, and up to 42 % at λ̃ = 60; quadrature
 * (`logMhcIntegral`) is the reference. Exact in the η̃ → ±∞ limits and in detailed balance.
 * References: Y. Zeng, R. B. Smith, P. Bai, M. Z. Bazant, J. Electroanal. Chem. 2014, 735, 77
 * (doi 10.1016/j.jelechem.2014.09.038).
 */
export function logMhcClosedForm(lambdaOverKt: number, etaOverKt: number): number {
  const rootLambda = Math.sqrt(lambdaOverKt);
  const argument =
    (lambdaOverKt - Math.sqrt(1 + rootLambda + etaOverKt * etaOverKt)) / (2 * rootLambda);
  return 0.5 * Math.log(Math.PI * lambdaOverKt) - softplus(etaOverKt) + logErfc(argument);
}

export interface MhcInputs {
  readonly lambdaEv: number;
  readonly overpotentialV: number;
  readonly temperatureK: number;
  /** Multiplies every rate (e.g. (2π/ħ)|H|²ρ_M k_BT (4πλk_BT)^−½ in s⁻¹); 1 by default. */
  readonly prefactor: number;
}

export interface MhcRates {
  readonly kRed: number;
  readonly kOx: number;
  readonly kRedIntegral: number;
  readonly kOxIntegral: number;
  readonly log10kRed: number;
  readonly log10kOx: number;
  readonly log10kRedIntegral: number;
  readonly log10kOxIntegral: number;
  /** (closed form − integral)/integral for reduction and oxidation. */
  readonly kRedRelativeDifference: number;
  readonly kOxRelativeDifference: number;
  readonly lambdaOverKt: number;
}

/** Both MHC rates by quadrature and by the closed form; see `logMhcIntegral`. */
export function mhcRates(inputs: MhcInputs): MhcRates {
  const thermalEv = BOLTZMANN_EV_PER_K * inputs.temperatureK;
  const lambdaOverKt = inputs.lambdaEv / thermalEv;
  // eη in eV equals η in V for one electron.
  const etaOverKt = inputs.overpotentialV / thermalEv;
  const logPrefactor = Math.log(inputs.prefactor);
  const logRedIntegral = logPrefactor + logMhcIntegral(lambdaOverKt, etaOverKt);
  const logOxIntegral = logPrefactor + logMhcIntegral(lambdaOverKt, -etaOverKt);
  const logRed = logPrefactor + logMhcClosedForm(lambdaOverKt, etaOverKt);
  const logOx = logPrefactor + logMhcClosedForm(lambdaOverKt, -etaOverKt);
  return {
    kRed: Math.exp(logRed),
    kOx: Math.exp(logOx),
    kRedIntegral: Math.exp(logRedIntegral),
    kOxIntegral: Math.exp(logOxIntegral),
    log10kRed: logRed / LN10,
    log10kOx: logOx / LN10,
    log10kRedIntegral: logRedIntegral / LN10,
    log10kOxIntegral: logOxIntegral / LN10,
    kRedRelativeDifference: Math.expm1(logRed - logRedIntegral),
    kOxRelativeDifference: Math.expm1(logOx - logOxIntegral),
    lambdaOverKt,
  };
}

const REFUSAL_MESSAGE = 'λ must be > 0; overpotential must be finite.';

/** Warnings B25 and B26 of VALIDATION.md. */
export function warnMhc(inputs: MhcInputs, lambdaOverKt: number, warnings: WarningSink): void {
  if (lambdaOverKt < CLOSED_FORM_MIN_LAMBDA_KT || lambdaOverKt > CLOSED_FORM_MAX_LAMBDA_KT) {
    warnings.warn(
      'mhc-closed-form-inaccurate',
      `λ/k_BT = ${lambdaOverKt.toFixed(1)} is outside 8–16, where the closed form's error ` +
        'reaches 42 %; use kRedIntegral/kOxIntegral (numerical integral).',
    );
  }
  if (Math.abs(inputs.overpotentialV) > inputs.lambdaEv) {
    warnings.warn(
      'mhc-far-from-butler-volmer',
      '|eη| > λ: far from the Butler–Volmer regime (MHC rates saturate); a BV comparison is ' +
        'meaningless here.',
    );
  }
}

export const mhcMethod = {
  id: 'electrode.mhc',
  summary:
    'Marcus–Hush–Chidsey electrode rates: adaptive quadrature (reference) and the Zeng 2014 ' +
    'closed form, with their difference.',
  references: [
    'C. E. D. Chidsey, Science 1991, 251, 919. doi:10.1126/science.251.4996.919',
    'Y. Zeng, R. B. Smith, P. Bai, M. Z. Bazant, J. Electroanal. Chem. 2014, 735, 77. ' +
      'doi:10.1016/j.jelechem.2014.09.038',
    'R. Piessens et al., QUADPACK, Springer 1983. doi:10.1007/978-3-642-61786-7',
  ],
  inputs: [
    { name: 'lambda', quantity: 'energy', required: true, description: 'Reorganization energy λ.' },
    {
      name: 'overpotential',
      quantity: 'potential',
      required: true,
      description: 'η = E − E°′ (reduction favoured when negative).',
    },
    { name: 'temperature', quantity: 'temperature', required: true, description: 'Temperature.' },
    {
      name: 'prefactor',
      quantity: 'dimensionless',
      required: false,
      defaultValue: 1,
      description: 'Multiplies every rate (e.g. the electronic factor in s⁻¹).',
    },
  ],
  outputs: [
    { name: 'kRed', unit: 'prefactor', description: 'Reduction rate, Zeng 2014 closed form.' },
    { name: 'kOx', unit: 'prefactor', description: 'Oxidation rate, Zeng 2014 closed form.' },
    { name: 'kRedIntegral', unit: 'prefactor', description: 'Reduction rate by quadrature.' },
    { name: 'kOxIntegral', unit: 'prefactor', description: 'Oxidation rate by quadrature.' },
    { name: 'log10kRed', unit: '', description: 'log10 of kRed.' },
    { name: 'log10kOx', unit: '', description: 'log10 of kOx.' },
    { name: 'log10kRedIntegral', unit: '', description: 'log10 of kRedIntegral.' },
    { name: 'log10kOxIntegral', unit: '', description: 'log10 of kOxIntegral.' },
    {
      name: 'kRedRelativeDifference',
      unit: '',
      description: '(kRed − kRedIntegral)/kRedIntegral: the closed form’s error here.',
    },
    {
      name: 'kOxRelativeDifference',
      unit: '',
      description: '(kOx − kOxIntegral)/kOxIntegral.',
    },
    { name: 'lambdaOverKt', unit: '', description: 'λ/k_BT.' },
  ],
  read(reader) {
    const lambdaEv = reader.quantity('lambda', 'energy', {
      greaterThan: 0,
      message: REFUSAL_MESSAGE,
    });
    const overpotentialV = reader.quantity('overpotential', 'potential', {
      message: REFUSAL_MESSAGE,
    });
    const temperatureK = reader.quantity('temperature', 'temperature', {
      greaterThan: 0,
      message: 'Temperature must be > 0 K (absolute). Did you enter °C?',
    });
    const prefactor =
      reader.optionalNumber('prefactor', { greaterThan: 0, message: 'Must be > 0.' }) ?? 1;
    return { lambdaEv, overpotentialV, temperatureK, prefactor };
  },
  compute(inputs, warnings) {
    const rates = mhcRates(inputs);
    warnMhc(inputs, rates.lambdaOverKt, warnings);
    return { ...rates };
  },
} satisfies MethodDefinition<MhcInputs>;

/** What `electrode.mhc` answers (the compiler reads it through `MethodOutputs`). */
export type MhcOutputs = ReturnType<(typeof mhcMethod)['compute']>;
