/**
 * `fit.electrodeKinetics`: fits Marcus–Hush–Chidsey (λ, k⁰) and Butler–Volmer (α, k⁰) to measured
 * electrode rate constants k(η) in log space, with standard errors, residuals and the Akaike and
 * Bayesian information criteria that say which model the data favour.
 */
import { BOLTZMANN_EV_PER_K } from '../../core/constants';
import { CalcRefusal } from '../../core/method';
import type { MethodDefinition, WarningSink } from '../../core/method';
import { logMhcIntegral } from '../../electrode/mhc/mhc';

const LN10 = Math.LN10;

export type ElectrodeDirection = 'reduction' | 'oxidation';
export type ElectrodeModel = 'mhc' | 'butlerVolmer';

export interface ElectrodePoint {
  /** Overpotential η = E − E°′ in V (reduction favoured when negative, SCIENCE.md §0). */
  readonly overpotentialV: number;
  /** Observed rate constant (> 0), any rate unit; k⁰ comes back in the same unit. */
  readonly k: number;
  /** Which rate was measured: k_red or k_ox. */
  readonly direction: ElectrodeDirection;
}

export interface ElectrodeFitInputs {
  readonly points: readonly ElectrodePoint[];
  readonly temperatureK: number;
}

/** One model's fit: two parameters with their standard errors and the fit statistics. */
export interface ElectrodeModelFit {
  readonly model: ElectrodeModel;
  /** λ in eV (MHC) or α (Butler–Volmer). */
  readonly shape: number;
  readonly shapeStandardError: number;
  readonly log10k0: number;
  readonly log10k0StandardError: number;
  /** k⁰ in the unit of the input rates. */
  readonly k0: number;
  /** corr(shape, log10 k⁰). */
  readonly correlation: number;
  /** Observed − fitted log10 k, in the order of the points. */
  readonly residuals: readonly number[];
  readonly rss: number;
  readonly rmsLog10Residual: number;
  readonly degreesOfFreedom: number;
  readonly aic: number;
  readonly aicc: number | null;
  readonly bic: number;
  readonly iterations: number;
}

export type ElectrodeVerdict = 'mhc' | 'butlerVolmer' | 'indistinguishable';

export interface ElectrodeFit {
  readonly mhc: ElectrodeModelFit;
  readonly butlerVolmer: ElectrodeModelFit;
  /** AIC(BV) − AIC(MHC): positive favours MHC. */
  readonly deltaAic: number;
  readonly deltaBic: number;
  /** Akaike weight of MHC, exp(−AIC_MHC/2)/Σ exp(−AIC/2). */
  readonly mhcAkaikeWeight: number;
  readonly verdict: ElectrodeVerdict;
}

const PARAMETER_COUNT = 2;
/** Points of one fit at most (the work limit; see README "Limits and budgets"). */
export const ELECTRODE_FIT_MAX_POINTS = 100;
/** Levenberg–Marquardt iterations per model at most. */
export const ELECTRODE_FIT_MAX_ITERATIONS = 40;
/** λ is kept in [0.01, 4] eV during the search. */
export const MHC_LAMBDA_MIN_EV = 0.01;
export const MHC_LAMBDA_MAX_EV = 4;
/** A |ΔAIC| below this is no evidence either way (Burnham & Anderson 2002, §2.6). */
const AIC_DECISIVE = 2;
/** Step in λ (eV) of the central-difference derivative of ln I. */
const LAMBDA_STEP_EV = 1e-5;

/**
 * log10 k of MHC with k⁰ factored out: log10 k⁰ + [ln I(λ̃, ±η̃) − ln I(λ̃, 0)]/ln 10, + for
 * reduction and − for oxidation (k_ox(η) = k_red(−η)), λ̃ = λ/k_BT, η̃ = eη/k_BT.
 * References: C. E. D. Chidsey, Science 1991, 251, 919 (doi 10.1126/science.251.4996.919).
 */
export function mhcLog10k(
  point: Pick<ElectrodePoint, 'overpotentialV' | 'direction'>,
  lambdaEv: number,
  log10k0: number,
  temperatureK: number,
): number {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  const lambdaOverKt = lambdaEv / thermalEv;
  const sign = point.direction === 'reduction' ? 1 : -1;
  const etaOverKt = (sign * point.overpotentialV) / thermalEv;
  return (
    log10k0 + (logMhcIntegral(lambdaOverKt, etaOverKt) - logMhcIntegral(lambdaOverKt, 0)) / LN10
  );
}

/**
 * log10 k of Butler–Volmer: k_red = k⁰ exp(−αeη/k_BT), k_ox = k⁰ exp((1 − α)eη/k_BT).
 * References: A. J. Bard, L. R. Faulkner, Electrochemical Methods, 2nd ed., Wiley, 2001, eq. 3.3.9.
 */
export function butlerVolmerLog10k(
  point: Pick<ElectrodePoint, 'overpotentialV' | 'direction'>,
  alpha: number,
  log10k0: number,
  temperatureK: number,
): number {
  const etaOverKt = point.overpotentialV / (BOLTZMANN_EV_PER_K * temperatureK);
  const exponent = point.direction === 'reduction' ? -alpha * etaOverKt : (1 - alpha) * etaOverKt;
  return log10k0 + exponent / LN10;
}

interface ModelSpec {
  readonly model: ElectrodeModel;
  readonly bounds: readonly [number, number];
  value(point: ElectrodePoint, shape: number, log10k0: number): number;
  /** ∂ log10 k / ∂ shape at the point (∂/∂ log10 k⁰ is 1 for both models). */
  slope(point: ElectrodePoint, shape: number): number;
}

function specFor(model: ElectrodeModel, temperatureK: number): ModelSpec {
  if (model === 'butlerVolmer') {
    const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
    return {
      model,
      bounds: [0, 1],
      value: (p, alpha, log10k0) => butlerVolmerLog10k(p, alpha, log10k0, temperatureK),
      // Both directions: ∂/∂α = −η̃/ln 10.
      slope: (p) => -p.overpotentialV / thermalEv / LN10,
    };
  }
  return {
    model,
    bounds: [MHC_LAMBDA_MIN_EV, MHC_LAMBDA_MAX_EV],
    value: (p, lambdaEv, log10k0) => mhcLog10k(p, lambdaEv, log10k0, temperatureK),
    slope: (p, lambdaEv) => {
      const h = LAMBDA_STEP_EV * Math.max(1, lambdaEv);
      return (
        (mhcLog10k(p, lambdaEv + h, 0, temperatureK) -
          mhcLog10k(p, lambdaEv - h, 0, temperatureK)) /
        (2 * h)
      );
    },
  };
}

function observed(points: readonly ElectrodePoint[]): number[] {
  return points.map((p) => Math.log10(p.k));
}

/** The best log10 k⁰ for a fixed shape is linear: the mean offset of the observations. */
function bestLog10k0(spec: ModelSpec, points: readonly ElectrodePoint[], shape: number): number {
  const y = observed(points);
  let sum = 0;
  points.forEach((p, i) => (sum += y[i] - spec.value(p, shape, 0)));
  return sum / points.length;
}

function residualsOf(
  spec: ModelSpec,
  points: readonly ElectrodePoint[],
  shape: number,
  log10k0: number,
): number[] {
  const y = observed(points);
  return points.map((p, i) => y[i] - spec.value(p, shape, log10k0));
}

const sumOfSquares = (r: readonly number[]) => r.reduce((s, x) => s + x * x, 0);

/** Starting shape: the best of a grid (log-spaced λ for MHC, α in steps of 0.1 for BV). */
function startingShape(spec: ModelSpec, points: readonly ElectrodePoint[]): number {
  const [low, high] = spec.bounds;
  const grid: number[] = [];
  if (spec.model === 'mhc') {
    for (let i = 0; i <= 15; i++) grid.push(0.05 * (2.5 / 0.05) ** (i / 15));
  } else {
    for (let i = 1; i <= 9; i++) grid.push(low + (i / 10) * (high - low));
  }
  let best = grid[0];
  let bestRss = Number.POSITIVE_INFINITY;
  for (const shape of grid) {
    const rss = sumOfSquares(residualsOf(spec, points, shape, bestLog10k0(spec, points, shape)));
    if (rss < bestRss) {
      bestRss = rss;
      best = shape;
    }
  }
  return best;
}

/** JᵀJ = [[a, b], [b, d]] of the model (shape, log10 k⁰) at the point set. */
function normalMatrix(
  spec: ModelSpec,
  points: readonly ElectrodePoint[],
  shape: number,
): { slopes: number[]; a: number; b: number; d: number } {
  const slopes = points.map((p) => spec.slope(p, shape));
  let a = 0;
  let b = 0;
  for (const g of slopes) {
    a += g * g;
    b += g;
  }
  return { slopes, a, b, d: points.length };
}

/**
 * Levenberg–Marquardt in two parameters (shape, log10 k⁰), written out: at each step solve
 * (JᵀJ + μ·diag JᵀJ) δ = Jᵀr, accept when the residual sum falls (μ ÷ 3), else μ × 4; the shape
 * is clamped to its bounds. Stops when the relative fall of the residual sum is below 1e-15 or the
 * step below 1e-13.
 * References: K. Levenberg, Q. Appl. Math. 1944, 2, 164 (doi 10.1090/qam/10666);
 * D. W. Marquardt, J. Soc. Ind. Appl. Math. 1963, 11, 431 (doi 10.1137/0111030).
 */
function levenbergMarquardt(
  spec: ModelSpec,
  points: readonly ElectrodePoint[],
): { shape: number; log10k0: number; iterations: number } {
  const [low, high] = spec.bounds;
  let shape = startingShape(spec, points);
  let log10k0 = bestLog10k0(spec, points, shape);
  let residuals = residualsOf(spec, points, shape, log10k0);
  let rss = sumOfSquares(residuals);
  let mu = 1e-3;
  let iterations = 0;
  for (; iterations < ELECTRODE_FIT_MAX_ITERATIONS && rss > 0; iterations++) {
    const { slopes, a, b, d } = normalMatrix(spec, points, shape);
    let ga = 0;
    let gd = 0;
    slopes.forEach((g, i) => {
      ga += g * residuals[i];
      gd += residuals[i];
    });
    let accepted = false;
    let stepSize = 0;
    for (let attempt = 0; attempt < 12 && !accepted; attempt++) {
      const aa = a * (1 + mu);
      const dd = d * (1 + mu);
      const det = aa * dd - b * b;
      if (!(det > 0)) {
        mu *= 4;
        continue;
      }
      const dShape = (dd * ga - b * gd) / det;
      const dK0 = (aa * gd - b * ga) / det;
      const trialShape = Math.min(Math.max(shape + dShape, low), high);
      const trialK0 = log10k0 + dK0;
      const trialResiduals = residualsOf(spec, points, trialShape, trialK0);
      const trialRss = sumOfSquares(trialResiduals);
      if (trialRss <= rss) {
        stepSize = Math.abs(trialShape - shape) + Math.abs(trialK0 - log10k0);
        const fall = rss - trialRss;
        shape = trialShape;
        log10k0 = trialK0;
        residuals = trialResiduals;
        const previous = rss;
        rss = trialRss;
        mu = Math.max(mu / 3, 1e-12);
        accepted = true;
        if (fall <= 1e-15 * previous) stepSize = 0;
      } else {
        mu *= 4;
      }
    }
    if (!accepted || stepSize < 1e-13) {
      iterations++;
      break;
    }
  }
  return { shape, log10k0, iterations };
}

/** Residuals, covariance s²(JᵀJ)⁻¹ and information criteria at the optimum. */
function describe(
  spec: ModelSpec,
  points: readonly ElectrodePoint[],
  shape: number,
  log10k0: number,
  iterations: number,
): ElectrodeModelFit {
  const n = points.length;
  const residuals = residualsOf(spec, points, shape, log10k0);
  const rss = sumOfSquares(residuals);
  const { a, b, d } = normalMatrix(spec, points, shape);
  const determinant = a * d - b * b;
  if (!(determinant > 1e-12 * a * d)) {
    throw new CalcRefusal([
      {
        field: 'points',
        message:
          spec.model === 'mhc'
            ? 'λ and k⁰ cannot be separated by these points (the rates do not bend with η).'
            : 'α and k⁰ cannot be separated by these points (one overpotential only).',
      },
    ]);
  }
  const degreesOfFreedom = n - PARAMETER_COUNT;
  const s2 = degreesOfFreedom > 0 ? rss / degreesOfFreedom : Number.NaN;
  const varShape = (s2 * d) / determinant;
  const varK0 = (s2 * a) / determinant;
  const cov = (-s2 * b) / determinant;
  const seShape = Math.sqrt(varShape);
  const seK0 = Math.sqrt(varK0);
  // Gaussian errors in log10 k with unknown variance: −2 ln L = n ln(RSS/n) + const; the
  // constant is the same for both models, so it is left out. RSS is floored so that exact data
  // give a finite criterion.
  const logLikelihoodTerm = n * Math.log(Math.max(rss, 1e-300) / n);
  const p = PARAMETER_COUNT + 1; // two parameters and the error variance
  const aic = logLikelihoodTerm + 2 * p;
  return {
    model: spec.model,
    shape,
    shapeStandardError: seShape,
    log10k0,
    log10k0StandardError: seK0,
    k0: 10 ** log10k0,
    correlation: seShape > 0 && seK0 > 0 ? cov / (seShape * seK0) : 0,
    residuals,
    rss,
    rmsLog10Residual: Math.sqrt(rss / n),
    degreesOfFreedom,
    aic,
    aicc: n - p - 1 > 0 ? aic + (2 * p * (p + 1)) / (n - p - 1) : null,
    bic: logLikelihoodTerm + p * Math.log(n),
    iterations,
  };
}

/** Fits one model (λ, k⁰ for MHC; α, k⁰ for Butler–Volmer) to the points. */
export function fitElectrodeModel(
  model: ElectrodeModel,
  inputs: ElectrodeFitInputs,
): ElectrodeModelFit {
  const spec = specFor(model, inputs.temperatureK);
  const { shape, log10k0, iterations } = levenbergMarquardt(spec, inputs.points);
  return describe(spec, inputs.points, shape, log10k0, iterations);
}

/**
 * Fits both models to log10 k(η) and compares them by AIC and BIC.
 *
 * Method: least squares in log10 k (errors taken as equal in log k, the usual case for rate
 * constants spanning decades); MHC with parameters (λ, log10 k⁰) by the quadrature of
 * `logMhcIntegral`, Butler–Volmer with (α, log10 k⁰); Levenberg–Marquardt from the best point of
 * a grid in the shape parameter; standard errors from s²(JᵀJ)⁻¹ with s² = RSS/(N − 2).
 * AIC = N ln(RSS/N) + 2p and BIC = N ln(RSS/N) + p ln N with p = 3 (two parameters and the
 * variance). Both models have the same p, so ΔAIC = ΔBIC = N ln(RSS_BV/RSS_MHC); |ΔAIC| < 2 is
 * reported as indistinguishable.
 * References: H. Akaike, IEEE Trans. Autom. Control 1974, 19, 716 (doi 10.1109/TAC.1974.1100705);
 * G. Schwarz, Ann. Stat. 1978, 6, 461 (doi 10.1214/aos/1176344136); K. P. Burnham,
 * D. R. Anderson, Model Selection and Multimodel Inference, 2nd ed., Springer, 2002, §2.6;
 * C. E. D. Chidsey, Science 1991, 251, 919.
 */
export function fitElectrodeKinetics(inputs: ElectrodeFitInputs): ElectrodeFit {
  const mhc = fitElectrodeModel('mhc', inputs);
  const butlerVolmer = fitElectrodeModel('butlerVolmer', inputs);
  const deltaAic = butlerVolmer.aic - mhc.aic;
  const deltaBic = butlerVolmer.bic - mhc.bic;
  const mhcAkaikeWeight = 1 / (1 + Math.exp(-deltaAic / 2));
  const verdict: ElectrodeVerdict =
    Math.abs(deltaAic) < AIC_DECISIVE ? 'indistinguishable' : deltaAic > 0 ? 'mhc' : 'butlerVolmer';
  return { mhc, butlerVolmer, deltaAic, deltaBic, mhcAkaikeWeight, verdict };
}

/** Warnings of the fit (codes in the method's description). */
export function warnElectrodeFit(
  fit: ElectrodeFit,
  inputs: ElectrodeFitInputs,
  sink: WarningSink,
): void {
  const [low, high] = [MHC_LAMBDA_MIN_EV, MHC_LAMBDA_MAX_EV];
  if (fit.mhc.shape <= low * 1.0001 || fit.mhc.shape >= high * 0.9999) {
    sink.warn(
      'fit-at-bound',
      `λ reached the bound of the search (${low}–${high} eV); the data do not determine it.`,
    );
  }
  if (fit.butlerVolmer.shape <= 0 || fit.butlerVolmer.shape >= 1) {
    sink.warn('fit-at-bound', 'α reached 0 or 1; the Butler–Volmer fit is at its bound.');
  }
  const maxEta = Math.max(...inputs.points.map((p) => Math.abs(p.overpotentialV)));
  if (maxEta < 0.5 * fit.mhc.shape) {
    sink.warn(
      'fit-poorly-separated',
      `All |η| ≤ ${maxEta.toFixed(3)} V are well below λ/2: the curvature that sets λ is weak; ` +
        'its standard error is large.',
    );
  }
  if (fit.mhc.degreesOfFreedom < 5) {
    sink.warn(
      'fit-few-degrees-of-freedom',
      `Few degrees of freedom (N − p = ${fit.mhc.degreesOfFreedom}); linearised SE optimistic.`,
    );
  }
}

const POINTS_MESSAGE = 'Need ≥ 3 points at ≥ 3 distinct overpotentials with k > 0 to fit.';

function modelOutputs(fit: ElectrodeModelFit) {
  return {
    log10k0: fit.log10k0,
    log10k0StandardError: fit.log10k0StandardError,
    k0: fit.k0,
    correlation: fit.correlation,
    residuals: fit.residuals,
    rmsLog10Residual: fit.rmsLog10Residual,
    degreesOfFreedom: fit.degreesOfFreedom,
    aic: fit.aic,
    aicc: fit.aicc,
    bic: fit.bic,
  };
}

export const electrodeKineticsFitMethod = {
  id: 'fit.electrodeKinetics',
  summary:
    'Fits λ and k⁰ (Marcus–Hush–Chidsey) and α and k⁰ (Butler–Volmer) to measured k(η) in log ' +
    'space, with standard errors, residuals and AIC/BIC to say which model fits better.',
  references: [
    'C. E. D. Chidsey, Science 1991, 251, 919. doi:10.1126/science.251.4996.919',
    'D. W. Marquardt, J. Soc. Ind. Appl. Math. 1963, 11, 431. doi:10.1137/0111030',
    'H. Akaike, IEEE Trans. Autom. Control 1974, 19, 716. doi:10.1109/TAC.1974.1100705',
    'G. Schwarz, Ann. Stat. 1978, 6, 461. doi:10.1214/aos/1176344136',
  ],
  inputs: [
    {
      name: 'points',
      quantity: 'array',
      required: true,
      label: 'Measured rates',
      description:
        "[{ overpotential (V), k (> 0, any rate unit), direction: 'reduction' | 'oxidation' " +
        "(default 'reduction') }], ≥ 3 distinct η, at most 100.",
    },
    { name: 'temperature', quantity: 'temperature', required: true, description: 'Temperature.' },
  ],
  outputs: [
    { name: 'mhc', unit: '', description: 'MHC fit: lambda (eV) ± lambdaStandardError, k0, …' },
    {
      name: 'butlerVolmer',
      unit: '',
      description: 'Butler–Volmer fit: alpha ± alphaStandardError, k0, …',
    },
    { name: 'deltaAic', unit: '', description: 'AIC(BV) − AIC(MHC); > 0 favours MHC.' },
    { name: 'deltaBic', unit: '', description: 'BIC(BV) − BIC(MHC).' },
    { name: 'mhcAkaikeWeight', unit: '', description: 'Akaike weight of MHC (0–1).' },
    {
      name: 'verdict',
      unit: '',
      description: "'mhc', 'butlerVolmer' or 'indistinguishable' (|ΔAIC| < 2).",
    },
  ],
  read(reader) {
    const children = reader.objectArray('points', { minLength: 3, message: POINTS_MESSAGE });
    if (children.length > ELECTRODE_FIT_MAX_POINTS) {
      reader.fail(
        'points',
        `A fit takes at most ${ELECTRODE_FIT_MAX_POINTS} points (got ${children.length}).`,
      );
      return { points: [], temperatureK: Number.NaN };
    }
    const points = children.map((child) => ({
      overpotentialV: child.quantity('overpotential', 'potential', {
        atLeast: -3,
        atMost: 3,
        message: 'Overpotential must be within ±3 V.',
      }),
      k: child.number('k', { greaterThan: 0, message: POINTS_MESSAGE }),
      direction: child.choice<ElectrodeDirection>(
        'direction',
        ['reduction', 'oxidation'],
        'reduction',
      ),
    }));
    const distinct = new Set(points.map((p) => p.overpotentialV).filter(Number.isFinite));
    if (children.length >= 3 && distinct.size < 3) reader.fail('points', POINTS_MESSAGE);
    const temperatureK = reader.quantity('temperature', 'temperature', {
      greaterThan: 0,
      message: 'Temperature must be > 0 K (absolute). Did you enter °C?',
    });
    return { points, temperatureK };
  },
  compute(inputs, warnings) {
    const fit = fitElectrodeKinetics(inputs);
    warnElectrodeFit(fit, inputs, warnings);
    return {
      mhc: {
        lambda: fit.mhc.shape,
        lambdaStandardError: fit.mhc.shapeStandardError,
        ...modelOutputs(fit.mhc),
      },
      butlerVolmer: {
        alpha: fit.butlerVolmer.shape,
        alphaStandardError: fit.butlerVolmer.shapeStandardError,
        ...modelOutputs(fit.butlerVolmer),
      },
      deltaAic: fit.deltaAic,
      deltaBic: fit.deltaBic,
      mhcAkaikeWeight: fit.mhcAkaikeWeight,
      verdict: fit.verdict,
    };
  },
} satisfies MethodDefinition<ElectrodeFitInputs>;

/** What `fit.electrodeKinetics` answers (the compiler reads it through `MethodOutputs`). */
export type ElectrodeKineticsFitOutputs = ReturnType<
  (typeof electrodeKineticsFitMethod)['compute']
>;
