/**
 * Fit of λ and |H_AB| to a driving-force series log10 k(ΔG°) by Levenberg–Marquardt in log space.
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';

import { BOLTZMANN_EV_PER_K, HBAR_EV_S } from '../../core/constants';
import { CalcRefusal } from '../../core/method';
import type { MethodDefinition, WarningSink } from '../../core/method';
import { marcusRateLog } from '../../rates/marcus/marcus';
import { mljRateLog, mljTermsEstimate, mljTermsMessage } from '../../rates/mlj/mlj';

export type FitModel = 'marcus' | 'mlj';

export interface SeriesPoint {
  readonly deltaG0Ev: number;
  /** Observed rate constant, s⁻¹ (> 0). */
  readonly k: number;
}

export interface ModelSettings {
  readonly model: FitModel;
  readonly temperatureK: number;
  /** Fixed quantum mode (model 'mlj' only). */
  readonly hbarOmegaEv?: number;
  readonly lambdaVibEv?: number;
}

export interface DrivingForceInputs extends ModelSettings {
  readonly points: readonly SeriesPoint[];
}

export interface DrivingForceFit extends ModelSettings {
  /** Fitted λ (λ_s for 'mlj'), eV. */
  readonly lambdaEv: number;
  /** Fitted |H_AB|, eV. */
  readonly couplingEv: number;
  /** Covariance of the internal parameters (λ, ln|H|), from s²(JᵀJ)⁻¹. */
  readonly parameterCovariance: readonly [readonly [number, number], readonly [number, number]];
  readonly standardErrors: { readonly lambda: number; readonly coupling: number };
  /** SE(log10 |H|) = SE(H)/(H ln 10). */
  readonly log10CouplingStandardError: number;
  /** 2×2 covariance of (λ, |H|) in eV². */
  readonly covariance: readonly [readonly [number, number], readonly [number, number]];
  /** corr(λ, |H|). */
  readonly correlation: number;
  readonly rmsLog10Residual: number;
  /** Observed minus fitted log10 k, in the order of the points. */
  readonly residuals: readonly number[];
  readonly degreesOfFreedom: number;
}

const LN10 = Math.LN10;
const LN_TWO_PI_OVER_HBAR = Math.log((2 * Math.PI) / HBAR_EV_S);
const PARAMETER_COUNT = 2;
/** λ is kept in [1e-4, 20] eV and ln|H| in [ln 1e-12, ln 5] eV during the search. */
const MIN_VALUES = [1e-4, Math.log(1e-12)];
const MAX_VALUES = [20, Math.log(5)];

/** Levenberg–Marquardt iterations of one start (three starts per fit). */
export const FIT_MAX_ITERATIONS = 300;
const FIT_STARTS = 3;
/** Rate evaluations per point and iteration: the model and a central-difference gradient in 2 parameters. */
const EVALUATIONS_PER_POINT = 1 + 2 * PARAMETER_COUNT;
/**
 * Series size limit: points of one fit. Far above any measured driving-force series (tens of
 * points); a larger one is a file read the wrong way, and refused naming `points`.
 */
export const FIT_MAX_POINTS = 10_000;
/**
 * Work limit of an MLJ fit: vibronic terms summed over the whole fit at most, i.e. starts ×
 * iterations × rate evaluations per point × points × terms per rate. A term costs about 70 ns of
 * one CPU on an idle machine and about 200 ns with the API test suite running beside it (measured
 * on Node 20: 1e5 terms in 7 ms; 4.6e7 terms in 9.9 s), so 2e7 terms stay within the default 10 s
 * budget even on a loaded machine; beyond it the request is refused naming ħω.
 */
export const FIT_MAX_MLJ_TERM_EVALUATIONS = 2e7;

/**
 * log10 k(ΔG°) of the fitted model at (λ, ln|H|): classical Marcus, or MLJ with the fixed mode.
 * Uses the rate kernels of `rates/` so there is one implementation of each formula.
 */
export function modelLog10k(
  settings: ModelSettings,
  deltaG0Ev: number,
  lambdaEv: number,
  lnCoupling: number,
): number {
  const couplingEv = Math.exp(lnCoupling);
  if (settings.model === 'marcus') {
    return marcusRateLog(deltaG0Ev, lambdaEv, couplingEv, settings.temperatureK) / LN10;
  }
  return (
    mljRateLog(
      deltaG0Ev,
      lambdaEv,
      settings.lambdaVibEv!,
      settings.hbarOmegaEv!,
      couplingEv,
      settings.temperatureK,
    ).lnK / LN10
  );
}

/**
 * Starting values of SCIENCE.md §14: λ₀ = −ΔG° at the largest observed k, and H₀ from
 * k_max = (2π/ħ)H²(4πλ₀k_BT)^(−½). λ₀ is floored at 0.05 eV for a maximum at ΔG° ≥ 0.
 */
export function startingValues(points: readonly SeriesPoint[], temperatureK: number): number[] {
  let best = points[0];
  for (const p of points) if (p.k > best.k) best = p;
  const lambdaEv = Math.max(-best.deltaG0Ev, 0.05);
  const lnCoupling =
    0.5 *
    (Math.log(best.k) -
      LN_TWO_PI_OVER_HBAR +
      0.5 * Math.log(4 * Math.PI * lambdaEv * BOLTZMANN_EV_PER_K * temperatureK));
  return [lambdaEv, clamp(lnCoupling, MIN_VALUES[1], MAX_VALUES[1])];
}

function clamp(x: number, low: number, high: number): number {
  return Math.min(Math.max(x, low), high);
}

/** Central-difference gradient of log10 k with respect to (λ, ln|H|). */
export function modelGradient(
  settings: ModelSettings,
  deltaG0Ev: number,
  params: readonly number[],
): [number, number] {
  const out: [number, number] = [0, 0];
  for (let j = 0; j < PARAMETER_COUNT; j++) {
    const step = 1e-6 * Math.max(1, Math.abs(params[j]));
    const up = [...params];
    const down = [...params];
    up[j] += step;
    down[j] -= step;
    out[j] =
      (modelLog10k(settings, deltaG0Ev, up[0], up[1]) -
        modelLog10k(settings, deltaG0Ev, down[0], down[1])) /
      (2 * step);
  }
  return out;
}

function sumSquares(settings: ModelSettings, points: readonly SeriesPoint[], p: number[]): number {
  let rss = 0;
  for (const point of points) {
    const r = Math.log10(point.k) - modelLog10k(settings, point.deltaG0Ev, p[0], p[1]);
    rss += r * r;
  }
  return rss;
}

/** One Levenberg–Marquardt run from `start`; returns (λ, ln|H|). */
function runLevenbergMarquardt(
  settings: ModelSettings,
  points: readonly SeriesPoint[],
  start: number[],
): number[] {
  const data = { x: points.map((p) => p.deltaG0Ev), y: points.map((p) => Math.log10(p.k)) };
  const result = levenbergMarquardt(
    data,
    ([lambdaEv, lnCoupling]) =>
      (x) =>
        modelLog10k(settings, x, lambdaEv, lnCoupling),
    {
      initialValues: start,
      minValues: MIN_VALUES,
      maxValues: MAX_VALUES,
      jacobianFunction: (params) => (x) => modelGradient(settings, x, params),
      damping: 1e-2,
      maxIterations: FIT_MAX_ITERATIONS,
      // Keep iterating down to round-off: noise-free series are fitted exactly.
      errorTolerance: 1e-26,
    },
  );
  return result.parameterValues;
}

/**
 * Least-squares fit of λ and |H_AB| to log10 k_i(ΔG°_i).
 *
 * Method: Levenberg–Marquardt (package `ml-levenberg-marquardt`, central-difference Jacobian)
 * in log10 k with parameters (λ, ln|H|), so |H| > 0 throughout; started from SCIENCE.md §14
 * values and from two fallbacks (λ₀ = 0.5 and 1.5 eV), keeping the lowest residual sum.
 * Covariance cov = s²(JᵀJ)⁻¹, s² = RSS/(N − 2), with J the Jacobian of the residuals at the
 * optimum, then mapped to (λ, |H|) with ∂H/∂ln H = H.
 * Notes: linearised standard errors are optimistic when N − 2 < 5 (warning B30); with only
 * normal-region data λ and H are strongly correlated (warning B29).
 * References: K. Levenberg, Q. Appl. Math. 1944, 2, 164 (doi 10.1090/qam/10666);
 * D. W. Marquardt, J. Soc. Ind. Appl. Math. 1963, 11, 431 (doi 10.1137/0111030);
 * R. A. Marcus, N. Sutin, Biochim. Biophys. Acta 1985, 811, 265; for the inverted-region series,
 * G. L. Closs, J. R. Miller, Science 1988, 240, 440 (doi 10.1126/science.240.4851.440).
 */
export function fitDrivingForceSeries(inputs: DrivingForceInputs): DrivingForceFit {
  const { points } = inputs;
  const settings: ModelSettings = {
    model: inputs.model,
    temperatureK: inputs.temperatureK,
    hbarOmegaEv: inputs.hbarOmegaEv,
    lambdaVibEv: inputs.lambdaVibEv,
  };
  const first = startingValues(points, inputs.temperatureK);
  const starts = [first, [0.5, first[1]], [1.5, first[1]]].slice(0, FIT_STARTS);
  let best: number[] = first;
  let bestRss = Number.POSITIVE_INFINITY;
  for (const start of starts) {
    const params = runLevenbergMarquardt(settings, points, start);
    const rss = sumSquares(settings, points, params);
    if (rss < bestRss) {
      bestRss = rss;
      best = params;
    }
  }
  return describeFit(settings, points, best);
}

/** Residuals, covariance and derived statistics at the optimum `params` = (λ, ln|H|). */
function describeFit(
  settings: ModelSettings,
  points: readonly SeriesPoint[],
  params: number[],
): DrivingForceFit {
  const n = points.length;
  const degreesOfFreedom = n - PARAMETER_COUNT;
  const residuals = points.map(
    (p) => Math.log10(p.k) - modelLog10k(settings, p.deltaG0Ev, params[0], params[1]),
  );
  const rss = residuals.reduce((s, r) => s + r * r, 0);
  let a = 0;
  let b = 0;
  let d = 0; // JᵀJ = [[a, b], [b, d]]
  for (const p of points) {
    const [g0, g1] = modelGradient(settings, p.deltaG0Ev, params);
    a += g0 * g0;
    b += g0 * g1;
    d += g1 * g1;
  }
  const determinant = a * d - b * b;
  if (!(determinant > 1e-14 * a * d)) {
    throw new CalcRefusal([
      {
        field: 'points',
        message: 'λ and H cannot be separated by these points (singular Jacobian).',
      },
    ]);
  }
  const s2 = rss / degreesOfFreedom;
  const varLambda = (s2 * d) / determinant;
  const varLnH = (s2 * a) / determinant;
  const covLambdaLnH = (-s2 * b) / determinant;
  const couplingEv = Math.exp(params[1]);
  const seLambda = Math.sqrt(varLambda);
  const seLnH = Math.sqrt(varLnH);
  return {
    ...settings,
    lambdaEv: params[0],
    couplingEv,
    parameterCovariance: [
      [varLambda, covLambdaLnH],
      [covLambdaLnH, varLnH],
    ],
    standardErrors: { lambda: seLambda, coupling: couplingEv * seLnH },
    log10CouplingStandardError: seLnH / LN10,
    covariance: [
      [varLambda, couplingEv * covLambdaLnH],
      [couplingEv * covLambdaLnH, couplingEv * couplingEv * varLnH],
    ],
    correlation: seLambda > 0 && seLnH > 0 ? covLambdaLnH / (seLambda * seLnH) : 0,
    rmsLog10Residual: Math.sqrt(rss / n),
    residuals,
    degreesOfFreedom,
  };
}

export interface ConfidenceBand {
  readonly deltaG0: number[];
  readonly log10k: number[];
  readonly lower: number[];
  readonly upper: number[];
}

/**
 * Pointwise confidence band of the fitted log10 k over a ΔG° grid by the delta method:
 * var(y) = gᵀ C g with g = ∂y/∂(λ, ln|H|) and C the parameter covariance; band y ± z·√var.
 * @param z normal quantile; 1.96 (default) for a 95 % band (a Student t would be wider for
 *   few degrees of freedom).
 * References: G. A. F. Seber, C. J. Wild, Nonlinear Regression, Wiley, 1989, §5.1.
 */
export function confidenceBandLog10k(
  fit: DrivingForceFit,
  deltaG0Grid: ArrayLike<number>,
  z = 1.96,
): ConfidenceBand {
  const params = [fit.lambdaEv, Math.log(fit.couplingEv)];
  const c = fit.parameterCovariance;
  const band: ConfidenceBand = { deltaG0: [], log10k: [], lower: [], upper: [] };
  for (let i = 0; i < deltaG0Grid.length; i++) {
    const x = deltaG0Grid[i];
    const y = modelLog10k(fit, x, params[0], params[1]);
    const [g0, g1] = modelGradient(fit, x, params);
    const variance = g0 * g0 * c[0][0] + 2 * g0 * g1 * c[0][1] + g1 * g1 * c[1][1];
    const half = z * Math.sqrt(Math.max(variance, 0));
    band.deltaG0.push(x);
    band.log10k.push(y);
    band.lower.push(y - half);
    band.upper.push(y + half);
  }
  return band;
}

/** Warnings B29 and B30 of VALIDATION.md. */
export function warnFit(
  fit: DrivingForceFit,
  points: readonly SeriesPoint[],
  sink: WarningSink,
): void {
  const inverted = points.some((p) => -p.deltaG0Ev > fit.lambdaEv);
  if (!inverted || Math.abs(fit.correlation) > 0.95) {
    sink.warn(
      'fit-poorly-separated',
      `λ and H poorly separated (corr = ${fit.correlation.toFixed(3)}${
        inverted ? '' : '; no point with −ΔG° > λ'
      }); uncertainties large.`,
    );
  }
  if (fit.degreesOfFreedom < 5) {
    sink.warn(
      'fit-few-degrees-of-freedom',
      `Few degrees of freedom (N − p = ${fit.degreesOfFreedom}); linearised SE optimistic, ` +
        'consider bootstrap.',
    );
  }
}

const A15_MESSAGE = 'Need ≥ 3 distinct points with k > 0 to fit λ and H with uncertainties.';

export const drivingForceSeriesMethod = {
  id: 'fit.drivingForceSeries',
  summary:
    'Levenberg–Marquardt fit of λ and |H_AB| to log10 k versus ΔG° (Marcus or MLJ), with ' +
    'standard errors and covariance.',
  references: [
    'D. W. Marquardt, J. Soc. Ind. Appl. Math. 1963, 11, 431. doi:10.1137/0111030',
    'R. A. Marcus, N. Sutin, Biochim. Biophys. Acta 1985, 811, 265.',
    'J. Jortner, J. Chem. Phys. 1976, 64, 4860. doi:10.1063/1.432142',
  ],
  inputs: [
    {
      name: 'points',
      quantity: 'array',
      required: true,
      label: 'Series points',
      description: 'Series [{ deltaG0 (eV), k (s⁻¹) }], ≥ 3 distinct ΔG°.',
    },
    { name: 'temperature', quantity: 'temperature', required: true, description: 'Temperature.' },
    {
      name: 'model',
      quantity: 'string',
      required: false,
      label: 'Rate model',
      defaultValue: 'marcus',
      description: "'marcus' or 'mlj'.",
    },
    {
      name: 'hbarOmega',
      quantity: 'energy',
      required: false,
      description: 'Fixed mode energy ħω (mlj).',
    },
    { name: 'lambdaVib', quantity: 'energy', required: false, description: 'Fixed λ_vib (mlj).' },
  ],
  outputs: [
    { name: 'lambda', unit: 'eV', description: 'Fitted λ (λ_s for mlj).' },
    { name: 'coupling', unit: 'eV', description: 'Fitted |H_AB|.' },
    { name: 'standardErrors', unit: 'eV', description: '{ lambda, coupling }.' },
    { name: 'log10CouplingStandardError', unit: '', description: 'SE of log10 |H_AB|.' },
    { name: 'covariance', unit: 'eV2', description: '2×2 covariance of (λ, |H|).' },
    { name: 'correlation', unit: '', description: 'corr(λ, |H|).' },
    { name: 'rmsLog10Residual', unit: '', description: 'Root-mean-square residual in log10 k.' },
    { name: 'residuals', unit: '', description: 'Observed − fitted log10 k per point.' },
    { name: 'degreesOfFreedom', unit: '', description: 'N − 2.' },
  ],
  read(reader) {
    const children = reader.objectArray('points', { minLength: 3, message: A15_MESSAGE });
    const points = children.map((child) => ({
      deltaG0Ev: child.quantity('deltaG0', 'energy'),
      k: child.quantity('k', 'rateFirstOrder', { greaterThan: 0, message: A15_MESSAGE }),
    }));
    const distinct = new Set(points.map((p) => p.deltaG0Ev).filter(Number.isFinite));
    if (children.length >= 3 && distinct.size < 3) reader.fail('points', A15_MESSAGE);
    const temperatureK = reader.quantity('temperature', 'temperature', {
      greaterThan: 0,
      message: 'Temperature must be > 0 K (absolute). Did you enter °C?',
    });
    const model = reader.choice<FitModel>('model', ['marcus', 'mlj'], 'marcus');
    const read =
      model === 'mlj' ? reader.quantity.bind(reader) : reader.optionalQuantity.bind(reader);
    const hbarOmegaEv = read('hbarOmega', 'energy', {
      greaterThan: 0,
      message: 'Mode energy must be > 0.',
    });
    const lambdaVibEv = read('lambdaVib', 'energy', {
      atLeast: 0,
      message: 'Huang–Rhys factor must be ≥ 0.',
    });
    if (points.length > FIT_MAX_POINTS)
      reader.fail(
        'points',
        `A fit takes at most ${FIT_MAX_POINTS.toLocaleString('en-US')} points (got ${points.length.toLocaleString('en-US')}).`,
      );
    if (model === 'mlj' && hbarOmegaEv! > 0 && lambdaVibEv! >= 0) {
      // The most terms a rate of this fit may need: the lowest ΔG° with λ_s at its lower bound.
      const lowestDeltaG0Ev = Math.min(...points.map((p) => p.deltaG0Ev));
      const terms = mljTermsEstimate(lowestDeltaG0Ev, MIN_VALUES[0], lambdaVibEv!, hbarOmegaEv!);
      const evaluations = FIT_STARTS * FIT_MAX_ITERATIONS * EVALUATIONS_PER_POINT * points.length;
      const limit = Math.floor(FIT_MAX_MLJ_TERM_EVALUATIONS / evaluations);
      if (terms > limit)
        reader.fail('hbarOmega', mljTermsMessage(terms, lambdaVibEv! / hbarOmegaEv!, limit));
    }
    return { points, temperatureK, model, hbarOmegaEv, lambdaVibEv };
  },
  compute(inputs, warnings) {
    const fit = fitDrivingForceSeries(inputs);
    warnFit(fit, inputs.points, warnings);
    return {
      lambda: fit.lambdaEv,
      coupling: fit.couplingEv,
      standardErrors: fit.standardErrors,
      log10CouplingStandardError: fit.log10CouplingStandardError,
      covariance: fit.covariance,
      correlation: fit.correlation,
      rmsLog10Residual: fit.rmsLog10Residual,
      residuals: fit.residuals,
      degreesOfFreedom: fit.degreesOfFreedom,
    };
  },
} satisfies MethodDefinition<DrivingForceInputs>;

/** What `fit.drivingForceSeries` answers (the compiler reads it through `MethodOutputs`). */
export type DrivingForceSeriesOutputs = ReturnType<(typeof drivingForceSeriesMethod)['compute']>;
