/**
 * `reorg.gapSamples`: λ and ΔG° from energy-gap samples in both diabatic states, with diabatic
 * free-energy curves and correlated-sample error bars (SCIENCE.md §7).
 */
import { BOLTZMANN_EV_PER_K } from '../../core/constants';
import { CalcRefusal } from '../../core/method';
import type { FieldError, MethodDefinition, WarningSink } from '../../core/method';
import {
  GapSampleAccumulator,
  type BlockLevel,
  type GapStatistics,
} from '../gap-accumulator/gap-accumulator';
import {
  countInBins,
  equalWidthEdges,
  freedmanDiaconisBinCount,
  MAX_HISTOGRAM_BINS,
  percentileSorted,
  type Histogram,
} from '../histogram/histogram';
import { mergeDiabaticCurves } from '../merged-curve/merged-curve';

/** Bins with at least this many counts are fitted by the parabola (SCIENCE.md §7). */
const WELL_POPULATED = 10;
const MIN_HISTOGRAM_SAMPLES = 20;
const REACTANT = 'reactantSamples';
const PRODUCT = 'productSamples';

export interface GapSampleInputs {
  /** ΔE = E_P − E_R sampled in the reactant state, eV. */
  readonly reactant: Float64Array;
  /** ΔE = E_P − E_R sampled in the product state, eV. */
  readonly product: Float64Array;
  readonly temperatureK: number;
  /** Fixed bin count instead of Freedman–Diaconis. */
  readonly bins?: number;
}

export interface Parabola {
  /** G(x) = a x² + b x + c, eV. */
  readonly a: number;
  readonly b: number;
  readonly c: number;
  /** λ = 1/(4a). */
  readonly lambda: number;
  /** Position of the minimum, −b/(2a): ΔG° + λ (reactant) or ΔG° − λ (product). */
  readonly minimumX: number;
  readonly binsUsed: number;
}

/**
 * What the analysis needs of one state before counting: the accumulator's statistics and the
 * interquartile range (exact from sorted samples here; from the accumulator's quartile subsample
 * on the streaming path of the server's trace analyses).
 */
export interface GapStateSummary {
  readonly stats: GapStatistics;
  readonly iqr: number;
}

/** One state's samples, sorted, with streaming statistics. */
interface StateSummary extends GapStateSummary {
  readonly sorted: Float64Array;
}

function summarise(values: Float64Array): StateSummary {
  const accumulator = new GapSampleAccumulator(false);
  accumulator.pushMany(values);
  const sorted = values.slice().sort();
  const iqr = percentileSorted(sorted, 0.75) - percentileSorted(sorted, 0.25);
  return { stats: accumulator.statistics(), sorted, iqr };
}

/** Refusals A20, A21 and A22 that concern one state's samples alone. */
function sampleErrors(
  field: string,
  state: GapStateSummary,
  bins: number | undefined,
): FieldError[] {
  const n = state.stats.count;
  if (n < 2) return [{ field, message: `Too few samples for a variance (N = ${n}).` }];
  if (n < MIN_HISTOGRAM_SAMPLES) {
    return [{ field, message: `Too few samples for a histogram (N = ${n}).` }];
  }
  if (!(state.stats.variance > 0) || (bins === undefined && !(state.iqr > 0))) {
    return [
      {
        field,
        message: 'All values identical: cannot build histogram / variance-based λ.',
      },
    ];
  }
  const count = bins ?? histogramBinCount(state);
  if (count > MAX_HISTOGRAM_BINS) {
    return [{ field, message: 'Histogram degenerate; remove outliers or give a bin width.' }];
  }
  return [];
}

function histogramBinCount(state: GapStateSummary): number {
  const { stats, iqr } = state;
  return freedmanDiaconisBinCount(iqr, stats.count, stats.min, stats.max);
}

function histogramEdges(state: GapStateSummary, bins: number | undefined): number[] {
  return equalWidthEdges(state.stats.min, state.stats.max, bins ?? histogramBinCount(state));
}

/**
 * Weighted least-squares parabola G = ax² + bx + c through (x_i, G_i) with weights w_i, solved
 * from the 3×3 normal equations in x − x̄ (for conditioning) and mapped back.
 */
export function fitParabola(x: number[], g: number[], w: number[]): Parabola {
  const n = x.length;
  let sw = 0;
  let swx = 0;
  for (let i = 0; i < n; i++) {
    sw += w[i];
    swx += w[i] * x[i];
  }
  const centre = swx / sw;
  // Normal equations for G = p2 u² + p1 u + p0, u = x − centre.
  const s = new Array<number>(5).fill(0);
  const t = new Array<number>(3).fill(0);
  for (let i = 0; i < n; i++) {
    const u = x[i] - centre;
    let power = w[i];
    for (let k = 0; k < 5; k++) {
      s[k] += power;
      if (k < 3) t[k] += power * g[i];
      power *= u;
    }
  }
  const [p0, p1, p2] = solve3(
    [
      [s[0], s[1], s[2]],
      [s[1], s[2], s[3]],
      [s[2], s[3], s[4]],
    ],
    t,
  );
  const a = p2;
  const b = p1 - 2 * p2 * centre;
  const c = p0 - p1 * centre + p2 * centre * centre;
  return { a, b, c, lambda: 1 / (4 * a), minimumX: -b / (2 * a), binsUsed: n };
}

/** Solves a 3×3 system by Cramer's rule (the matrix is small and symmetric positive-definite). */
function solve3(m: number[][], v: number[]): [number, number, number] {
  const det = (q: number[][]) =>
    q[0][0] * (q[1][1] * q[2][2] - q[1][2] * q[2][1]) -
    q[0][1] * (q[1][0] * q[2][2] - q[1][2] * q[2][0]) +
    q[0][2] * (q[1][0] * q[2][1] - q[1][1] * q[2][0]);
  const d = det(m);
  const column = (j: number) => m.map((row, i) => row.map((x, k) => (k === j ? v[i] : x)));
  return [det(column(0)) / d, det(column(1)) / d, det(column(2)) / d];
}

interface Curve {
  readonly x: number[];
  /** −k_BT ln(count/(N h)) + offset, or null for an empty bin. */
  readonly g: (number | null)[];
  readonly counts: number[];
}

function freeEnergyOnGrid(
  binCounts: ArrayLike<number>,
  sampleCount: number,
  edges: number[],
  thermalEv: number,
  offsetEv: number,
): Curve {
  const counts = Array.from(binCounts);
  const width = edges[1] - edges[0];
  const x: number[] = [];
  const g: (number | null)[] = [];
  for (let i = 0; i < counts.length; i++) {
    x.push(0.5 * (edges[i] + edges[i + 1]));
    // Empty bins have G = ∞: never take log(0), leave a gap.
    g.push(
      counts[i] > 0 ? offsetEv - thermalEv * Math.log(counts[i] / (sampleCount * width)) : null,
    );
  }
  return { x, g, counts };
}

/** Parabola through the well-populated bins (count ≥ 10, weights √count), with fallbacks. */
function stateParabola(curve: Curve, field: string, warnings: WarningSink): Parabola {
  const pick = (minimum: number) => {
    const x: number[] = [];
    const g: number[] = [];
    const w: number[] = [];
    curve.counts.forEach((count, i) => {
      if (count >= minimum) {
        x.push(curve.x[i]);
        g.push(curve.g[i] as number);
        w.push(Math.sqrt(count));
      }
    });
    return { x, g, w };
  };
  let chosen = pick(WELL_POPULATED);
  if (chosen.x.length < 3) {
    chosen = pick(1);
    if (chosen.x.length < 3) {
      throw new CalcRefusal([{ field, message: 'Too few populated bins to fit a parabola.' }]);
    }
    warnings.warn(
      'gap-sparse-bins',
      `Sparse bins (${field}): fewer than 3 bins hold ≥ 10 samples; fit weighted by √count.`,
    );
  }
  return fitParabola(chosen.x, chosen.g, chosen.w);
}

/** Common grid for both states: width min(h_R, h_P), spanning both ranges. */
function commonEdges(reactant: readonly number[], product: readonly number[]): number[] {
  const width = Math.min(reactant[1] - reactant[0], product[1] - product[0]);
  const low = Math.min(reactant[0], product[0]);
  const high = Math.max(reactant[reactant.length - 1], product[product.length - 1]);
  const bins = Math.max(1, Math.ceil((high - low) / width));
  if (bins > MAX_HISTOGRAM_BINS) {
    throw new CalcRefusal([
      { field: REACTANT, message: 'Histogram degenerate; remove outliers or give a bin width.' },
    ]);
  }
  return equalWidthEdges(low, high, bins);
}

function blockTable(levels: readonly BlockLevel[]) {
  return levels.map((l) => ({
    blockSize: l.blockSize,
    blocks: l.blocks,
    standardError: l.standardError,
  }));
}

/**
 * Analysis of energy-gap samples ΔE = E_P − E_R drawn in the reactant and the product state.
 *
 * Method (SCIENCE.md §7):
 * - linear response: λ_St = (⟨ΔE⟩_R − ⟨ΔE⟩_P)/2, ΔG° = (⟨ΔE⟩_R + ⟨ΔE⟩_P)/2, and
 *   λ_var = σ²/(2k_BT) per state (n − 1 variances); cumulant ΔG° = ⟨ΔE⟩_R − σ_R²/(2k_BT) and
 *   ⟨ΔE⟩_P + σ_P²/(2k_BT);
 * - one-pass Welford moments and Flyvbjerg–Petersen blocking (`GapSampleAccumulator`); standard
 *   errors from the block-SE plateau, SE(λ_St) = SE(ΔG°) = ½√(SE_R² + SE_P²);
 * - Freedman–Diaconis histograms with exact type-7 quartiles (numpy's `bins='fd'`);
 * - diabatic free-energy curves on a common grid (width min(h_R, h_P)):
 *   G_R(x) = −k_BT ln P_R(x), G_P(x) = ΔG°(means) − k_BT ln P_P(x); empty bins are left out;
 * - ΔG‡ = G_R(0) − min G_R from weighted local quadratic fits near ΔE = 0 and near the minimum
 *   (σ_i ∝ 1/√n_i), with its standard error; else from the one bin holding ΔE = 0 (reactant, or
 *   product through G_R(0) = G_P(0)); else from the reactant parabola (b²/(4a)) with warning B20;
 *   the Gaussian (cumulant) estimate k_BT⟨ΔE⟩_R²/(2σ_R²) beside it;
 * - parabolas G = ax² + bx + c through bins with count ≥ 10 (weights √count): λ = 1/(4a);
 * - the exact linear free-energy relation G_P(x) − G_R(x) = x checked on bins populated in
 *   both states (mean and rms of the deviation);
 * - the merged curve (`mergeDiabaticCurves`): both histograms combined through that relation,
 *   the constant (≈ ΔG°) fitted on the overlap; null when the states share no populated bin.
 * References: A. Warshel, J. Phys. Chem. 1982, 86, 2218 (doi 10.1021/j100209a016); M. Tachiya,
 * J. Phys. Chem. 1989, 93, 7050 (doi 10.1021/j100357a004); G. King, A. Warshel, J. Chem. Phys.
 * 1990, 93, 8682 (doi 10.1063/1.459255); J. Blumberger, Chem. Rev. 2015, 115, 11191
 * (doi 10.1021/acs.chemrev.5b00298); H. Flyvbjerg, H. G. Petersen, J. Chem. Phys. 1989, 91, 461;
 * D. Freedman, P. Diaconis, Z. Wahrscheinlichkeitstheorie verw. Geb. 1981, 57, 453.
 */
export function analyseGapSamples(inputs: GapSampleInputs, warnings: WarningSink): GapOutputs {
  const reactant = summarise(inputs.reactant);
  const product = summarise(inputs.product);
  const plan = planGapHistograms(reactant, product, inputs.bins);
  const counts: GapHistogramCounts = {
    reactant: countInBins(reactant.sorted, plan.reactantEdges),
    product: countInBins(product.sorted, plan.productEdges),
    commonReactant: countInBins(reactant.sorted, plan.commonEdges),
    commonProduct: countInBins(product.sorted, plan.commonEdges),
  };
  return gapOutputsFromCounts(reactant, product, plan, counts, inputs.temperatureK, warnings);
}

/** Bin edges of both states' own histograms and of the common grid of the free-energy curves. */
export interface GapHistogramPlan {
  readonly reactantEdges: number[];
  readonly productEdges: number[];
  readonly commonEdges: number[];
}

/** Counts of each state's samples in the plan's edges (`countInBins` or `HistogramCounter`). */
export interface GapHistogramCounts {
  readonly reactant: ArrayLike<number>;
  readonly product: ArrayLike<number>;
  readonly commonReactant: ArrayLike<number>;
  readonly commonProduct: ArrayLike<number>;
}

/**
 * First half of `analyseGapSamples`, for callers that stream the samples (the server's trace
 * analyses read 10⁷-line files twice instead of holding them): refusals A20–A22 and A24 from the
 * two states' summaries, then the edges the samples must be counted into.
 */
export function planGapHistograms(
  reactant: GapStateSummary,
  product: GapStateSummary,
  bins?: number,
): GapHistogramPlan {
  const errors = [
    ...sampleErrors(REACTANT, reactant, bins),
    ...sampleErrors(PRODUCT, product, bins),
  ];
  if (errors.length > 0) throw new CalcRefusal(errors);
  if (!((reactant.stats.mean - product.stats.mean) / 2 > 0)) {
    throw new CalcRefusal([
      {
        field: REACTANT,
        message:
          'Negative λ from means: check the sign convention ΔE = E_P − E_R and that the files ' +
          'are not swapped.',
      },
    ]);
  }
  const reactantEdges = histogramEdges(reactant, bins);
  const productEdges = histogramEdges(product, bins);
  return { reactantEdges, productEdges, commonEdges: commonEdges(reactantEdges, productEdges) };
}

/**
 * Second half of `analyseGapSamples`: every output from the two states' summaries and their
 * counts in the plan's edges (see the method notes above `analyseGapSamples`).
 */
export function gapOutputsFromCounts(
  reactant: GapStateSummary,
  product: GapStateSummary,
  plan: GapHistogramPlan,
  counts: GapHistogramCounts,
  temperatureK: number,
  warnings: WarningSink,
) {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  const r = reactant.stats;
  const p = product.stats;
  const lambdaFromMeans = (r.mean - p.mean) / 2;
  const deltaG0FromMeans = (r.mean + p.mean) / 2;
  const lambdaFromVarianceReactant = r.variance / (2 * thermalEv);
  const lambdaFromVarianceProduct = p.variance / (2 * thermalEv);
  const linearResponseRatio =
    (lambdaFromVarianceReactant + lambdaFromVarianceProduct) / 2 / lambdaFromMeans;

  const histograms: { reactant: Histogram; product: Histogram } = {
    reactant: { edges: plan.reactantEdges, counts: Array.from(counts.reactant) },
    product: { edges: plan.productEdges, counts: Array.from(counts.product) },
  };
  const edges = plan.commonEdges;
  const curveR = freeEnergyOnGrid(counts.commonReactant, r.count, edges, thermalEv, 0);
  const curveP = freeEnergyOnGrid(
    counts.commonProduct,
    p.count,
    edges,
    thermalEv,
    deltaG0FromMeans,
  );
  const parabolaR = stateParabola(curveR, REACTANT, warnings);
  const parabolaP = stateParabola(curveP, PRODUCT, warnings);

  const curves = {
    x: [] as number[],
    reactant: [] as (number | null)[],
    product: [] as (number | null)[],
  };
  const deviations: number[] = [];
  for (let i = 0; i < curveR.x.length; i++) {
    const gr = curveR.g[i];
    const gp = curveP.g[i];
    if (gr === null && gp === null) continue;
    curves.x.push(curveR.x[i]);
    curves.reactant.push(gr);
    curves.product.push(gp);
    if (gr !== null && gp !== null) deviations.push(gp - gr - curveR.x[i]);
  }

  const mergedCurve = mergeDiabaticCurves(
    edges,
    counts.commonReactant,
    counts.commonProduct,
    thermalEv,
  );

  const barrier = activationFreeEnergy(curveR, curveP, edges, parabolaR, r, p, thermalEv, warnings);
  const seR = r.plateau.standardError;
  const seP = p.plateau.standardError;
  const seCombined = 0.5 * Math.hypot(seR, seP);
  warnGap(
    { lambdaFromMeans, lambdaFromVarianceReactant, lambdaFromVarianceProduct },
    r,
    p,
    warnings,
  );

  return {
    meanReactant: r.mean,
    meanProduct: p.mean,
    varianceReactant: r.variance,
    varianceProduct: p.variance,
    lambdaFromMeans,
    deltaG0FromMeans,
    lambdaFromVarianceReactant,
    lambdaFromVarianceProduct,
    linearResponseRatio,
    deltaG0CumulantReactant: r.mean - r.variance / (2 * thermalEv),
    deltaG0CumulantProduct: p.mean + p.variance / (2 * thermalEv),
    freeEnergyCurves: curves,
    activationFreeEnergy: barrier.value,
    activationFreeEnergySource: barrier.source,
    activationFreeEnergyStandardError: barrier.standardError,
    activationFreeEnergyOneBin: barrier.oneBin,
    // Gaussian (second-cumulant) estimate: G_R(x) = k_BT (x − ⟨ΔE⟩_R)²/(2σ_R²).
    activationFreeEnergyCumulant: (thermalEv * r.mean * r.mean) / (2 * r.variance),
    parabola: { reactant: parabolaR, product: parabolaP },
    lambdaFromParabolaReactant: parabolaR.lambda,
    lambdaFromParabolaProduct: parabolaP.lambda,
    linearFreeEnergyCheck: {
      overlapBins: deviations.length,
      meanDeviation: deviations.length > 0 ? mean(deviations) : null,
      rmsDeviation: deviations.length > 0 ? Math.sqrt(mean(deviations.map((d) => d * d))) : null,
    },
    mergedCurve,
    standardErrors: {
      meanReactant: seR,
      meanProduct: seP,
      lambdaFromMeans: seCombined,
      deltaG0FromMeans: seCombined,
    },
    naiveStandardErrors: { meanReactant: r.naiveStandardError, meanProduct: p.naiveStandardError },
    statisticalInefficiency: {
      reactant: r.statisticalInefficiency,
      product: p.statisticalInefficiency,
    },
    blockPlateau: { reactant: r.plateau, product: p.plateau },
    blockAnalysis: { reactant: blockTable(r.blockLevels), product: blockTable(p.blockLevels) },
    skewness: { reactant: r.skewness, product: p.skewness },
    excessKurtosis: { reactant: r.excessKurtosis, product: p.excessKurtosis },
    sampleCounts: { reactant: r.count, product: p.count },
    histograms,
  };
}

/** The outputs of `reorg.gapSamples`, in memory or streamed (`gapOutputsFromCounts`). */
export type GapOutputs = ReturnType<typeof gapOutputsFromCounts>;

function mean(values: number[]): number {
  return values.reduce((s, v) => s + v, 0) / values.length;
}

/** A value of a local fit with its standard error (eV). */
interface FittedValue {
  readonly value: number;
  readonly standardError: number;
  readonly binsUsed: number;
}

/**
 * Weighted least-squares quadratic through points (x_i, G_i) with σ_i² = (k_BT)²/n_i — the
 * variance of −k_BT ln n_i for a Poisson count, i.e. weights 1/σ_i² = n_i/(k_BT)² — and the fitted
 * value at `at` (or at the vertex when `at` is null) with its standard error from the covariance
 * (JᵀWJ)⁻¹ (known σ's, no rescaling). At the vertex the slope is zero, so the vertex position's
 * own uncertainty does not enter to first order. Null with fewer than 4 points (no degree of
 * freedom left) or an ill-conditioned system.
 * Reference: P. R. Bevington, D. K. Robinson, Data Reduction and Error Analysis for the Physical
 * Sciences, 3rd ed., McGraw-Hill 2003, ch. 7 (weighted polynomial least squares; from memory).
 */
function localQuadraticValue(
  x: number[],
  g: number[],
  counts: number[],
  thermalEv: number,
  at: number | null,
): FittedValue | null {
  if (x.length < 4) return null;
  const centre = x.reduce((s, v) => s + v, 0) / x.length;
  const s = new Array<number>(5).fill(0);
  const t = new Array<number>(3).fill(0);
  for (let i = 0; i < x.length; i++) {
    const u = x[i] - centre;
    let power = counts[i] / (thermalEv * thermalEv);
    for (let k = 0; k < 5; k++) {
      s[k] += power;
      if (k < 3) t[k] += power * g[i];
      power *= u;
    }
  }
  const m = [
    [s[0], s[1], s[2]],
    [s[1], s[2], s[3]],
    [s[2], s[3], s[4]],
  ];
  const inverse = invert3(m);
  if (!inverse) return null;
  const p = inverse.map((row) => row[0] * t[0] + row[1] * t[1] + row[2] * t[2]);
  let u0: number;
  if (at === null) {
    if (!(p[2] > 0)) return null; // no minimum
    u0 = -p[1] / (2 * p[2]);
  } else {
    u0 = at - centre;
  }
  const basis = [1, u0, u0 * u0];
  const value = p[0] + p[1] * u0 + p[2] * u0 * u0;
  let variance = 0;
  for (let i = 0; i < 3; i++)
    for (let j = 0; j < 3; j++) variance += basis[i] * inverse[i][j] * basis[j];
  if (!(variance >= 0) || !Number.isFinite(value)) return null;
  return { value, standardError: Math.sqrt(variance), binsUsed: x.length };
}

/** Inverse of a symmetric 3×3 matrix by cofactors; null when (nearly) singular. */
function invert3(m: number[][]): number[][] | null {
  const [[a, b, c], [d, e, f], [g, h, k]] = m;
  const A = e * k - f * h;
  const B = -(d * k - f * g);
  const C = d * h - e * g;
  const det = a * A + b * B + c * C;
  const scale = Math.abs(a * e * k) + Math.abs(b * f * g) + Math.abs(c * d * h);
  if (!(Math.abs(det) > 1e-14 * scale)) return null;
  return [
    [A / det, -(b * k - c * h) / det, (b * f - c * e) / det],
    [B / det, (a * k - c * g) / det, -(a * f - c * d) / det],
    [C / det, -(a * h - b * g) / det, (a * e - b * d) / det],
  ];
}

/** Bins whose centres lie within `halfWidth` of `centre`: the reactant curve's, and the product
 * curve's mapped onto G_R by the linear free-energy relation G_R(x) = G_P(x) − x. */
function binsNear(
  curveR: Curve,
  curveP: Curve | null,
  centre: number,
  halfWidth: number,
): { x: number[]; g: number[]; counts: number[] } {
  const x: number[] = [];
  const g: number[] = [];
  const counts: number[] = [];
  for (let i = 0; i < curveR.x.length; i++) {
    const xi = curveR.x[i];
    if (Math.abs(xi - centre) > halfWidth) continue;
    if (curveR.g[i] !== null) {
      x.push(xi);
      g.push(curveR.g[i] as number);
      counts.push(curveR.counts[i]);
    }
    if (curveP && curveP.g[i] !== null) {
      x.push(xi);
      g.push((curveP.g[i] as number) - xi);
      counts.push(curveP.counts[i]);
    }
  }
  return { x, g, counts };
}

interface Barrier {
  readonly value: number;
  readonly source: string;
  readonly standardError: number | null;
  /** G_R in the one bin holding ΔE = 0 minus the lowest raw bin (null when that bin is empty). */
  readonly oneBin: number | null;
}

/**
 * ΔG‡ = G_R(0) − min G_R (SCIENCE.md §7). Both ends come from weighted local quadratic fits
 * (`localQuadraticValue`, σ_i ∝ 1/√n_i) instead of single noisy bins: G_R(0) from the bins within
 * max(5 bin widths, σ_R) of ΔE = 0 (reactant bins, and product bins through G_R = G_P − x),
 * min G_R from the vertex of a fit to the reactant bins within σ_R of ⟨ΔE⟩_R. The two standard
 * errors are combined in quadrature. When a fit is not possible (fewer than 4 bins), the one-bin
 * reading, then the reactant parabola (b²/(4a), warning B20) are used, as before.
 */
function activationFreeEnergy(
  curveR: Curve,
  curveP: Curve,
  edges: number[],
  parabolaR: Parabola,
  r: GapStatistics,
  p: GapStatistics,
  thermalEv: number,
  warnings: WarningSink,
): Barrier {
  const populated = curveR.g.filter((g): g is number => g !== null);
  const minimum = Math.min(...populated);
  const bins = curveR.x.length;
  const zeroBin =
    0 >= edges[0] && 0 <= edges[bins]
      ? Math.min(bins - 1, Math.floor(((0 - edges[0]) / (edges[bins] - edges[0])) * bins))
      : -1;
  const overlap = r.max >= p.min && p.max >= r.min;
  const crossingSampled = (r.min <= 0 && 0 <= r.max) || (p.min <= 0 && 0 <= p.max);
  if (!overlap && !crossingSampled) {
    warnings.warn(
      'gap-crossing-not-sampled',
      'Crossing region not sampled (ΔE = 0 outside both sets, no overlap); ΔG‡ is an extrapolation.',
    );
  }
  let oneBin: number | null = null;
  let oneBinSource = '';
  if (zeroBin >= 0 && curveR.g[zeroBin] !== null) {
    oneBin = (curveR.g[zeroBin] as number) - minimum;
    oneBinSource = 'reactant-histogram';
  } else if (zeroBin >= 0 && curveP.g[zeroBin] !== null) {
    // G_R(0) = G_P(0) − 0 by the linear free-energy relation.
    oneBin = (curveP.g[zeroBin] as number) - minimum;
    oneBinSource = 'product-histogram';
  }
  const width = edges[1] - edges[0];
  const sdR = Math.sqrt(r.variance);
  if (crossingSampled) {
    const near = binsNear(curveR, curveP, 0, Math.max(5 * width, sdR));
    const well = binsNear(curveR, null, r.mean, sdR);
    const atCrossing = localQuadraticValue(near.x, near.g, near.counts, thermalEv, 0);
    const atMinimum = localQuadraticValue(well.x, well.g, well.counts, thermalEv, null);
    if (atCrossing && atMinimum) {
      return {
        value: atCrossing.value - atMinimum.value,
        source: 'local-fit',
        standardError: Math.hypot(atCrossing.standardError, atMinimum.standardError),
        oneBin,
      };
    }
  }
  if (oneBin !== null) return { value: oneBin, source: oneBinSource, standardError: null, oneBin };
  // G_R(0) − G_R(min) of the parabola: c − (c − b²/(4a)).
  return {
    value: (parabolaR.b * parabolaR.b) / (4 * parabolaR.a),
    source: 'parabola-extrapolation',
    standardError: null,
    oneBin,
  };
}

/** Warnings B17, B18 and B19 of VALIDATION.md. */
function warnGap(
  lambdas: {
    lambdaFromMeans: number;
    lambdaFromVarianceReactant: number;
    lambdaFromVarianceProduct: number;
  },
  r: GapStatistics,
  p: GapStatistics,
  warnings: WarningSink,
): void {
  const {
    lambdaFromMeans: st,
    lambdaFromVarianceReactant: vr,
    lambdaFromVarianceProduct: vp,
  } = lambdas;
  const ratioRP = vr / vp;
  if (
    Math.abs(vr / st - 1) > 0.1 ||
    Math.abs(vp / st - 1) > 0.1 ||
    ratioRP < 0.9 ||
    ratioRP > 1.1
  ) {
    warnings.warn(
      'gap-nonlinear-response',
      `Linear-response/Gaussian assumption violated (λ_St = ${st.toFixed(3)} eV, λ_var = ` +
        `${vr.toFixed(3)} and ${vp.toFixed(3)} eV); single-λ Marcus rate not reliable.`,
    );
  }
  for (const [name, s] of [
    ['reactant', r],
    ['product', p],
  ] as const) {
    if (!s.plateau.reached || s.plateau.blocks < 10 || s.statisticalInefficiency > s.count / 50) {
      warnings.warn(
        'gap-error-bars-unreliable',
        `Trajectory too short/correlated for reliable error bars (${name}: plateau ` +
          `${s.plateau.reached ? 'reached' : 'not reached'}, statistical inefficiency ` +
          `${s.statisticalInefficiency.toFixed(1)}, N = ${s.count}).`,
      );
    }
    if (Math.abs(s.skewness) > 0.3 || s.excessKurtosis > 0.5) {
      warnings.warn(
        'gap-non-gaussian',
        `Non-Gaussian gap distribution (${name}: skewness ${s.skewness.toFixed(2)}, excess ` +
          `kurtosis ${s.excessKurtosis.toFixed(2)}).`,
      );
    }
  }
}

export const gapSamplesMethod = {
  id: 'reorg.gapSamples',
  summary:
    'λ and ΔG° from energy-gap samples of both states: means, variances, free-energy curves, ' +
    'block-averaged error bars.',
  references: [
    'A. Warshel, J. Phys. Chem. 1982, 86, 2218. doi:10.1021/j100209a016',
    'M. Tachiya, J. Phys. Chem. 1989, 93, 7050. doi:10.1021/j100357a004',
    'G. King, A. Warshel, J. Chem. Phys. 1990, 93, 8682. doi:10.1063/1.459255',
    'J. Blumberger, Chem. Rev. 2015, 115, 11191. doi:10.1021/acs.chemrev.5b00298',
    'H. Flyvbjerg, H. G. Petersen, J. Chem. Phys. 1989, 91, 461. doi:10.1063/1.457480',
    'D. Freedman, P. Diaconis, Z. Wahrscheinlichkeitstheorie verw. Geb. 1981, 57, 453.',
  ],
  inputs: [
    {
      name: 'reactantSamples',
      quantity: 'array',
      required: true,
      description: 'ΔE = E_P − E_R sampled in the reactant state (eV).',
    },
    {
      name: 'productSamples',
      quantity: 'array',
      required: true,
      description: 'ΔE = E_P − E_R sampled in the product state (eV).',
    },
    {
      name: 'temperature',
      quantity: 'temperature',
      required: true,
      description: 'Temperature of the sampling.',
    },
    {
      name: 'bins',
      quantity: 'integer',
      required: false,
      description: 'Fixed bin count (default Freedman–Diaconis).',
    },
  ],
  outputs: [
    { name: 'meanReactant', unit: 'eV', description: '⟨ΔE⟩_R.' },
    { name: 'meanProduct', unit: 'eV', description: '⟨ΔE⟩_P.' },
    { name: 'varianceReactant', unit: 'eV2', description: 'σ_R² (n − 1).' },
    { name: 'varianceProduct', unit: 'eV2', description: 'σ_P² (n − 1).' },
    { name: 'lambdaFromMeans', unit: 'eV', description: '(⟨ΔE⟩_R − ⟨ΔE⟩_P)/2.' },
    { name: 'deltaG0FromMeans', unit: 'eV', description: '(⟨ΔE⟩_R + ⟨ΔE⟩_P)/2.' },
    { name: 'lambdaFromVarianceReactant', unit: 'eV', description: 'σ_R²/(2k_BT).' },
    { name: 'lambdaFromVarianceProduct', unit: 'eV', description: 'σ_P²/(2k_BT).' },
    { name: 'linearResponseRatio', unit: '', description: 'Mean variance λ ÷ λ from means.' },
    {
      name: 'freeEnergyCurves',
      unit: 'eV',
      description: '{ x, reactant, product } (null = empty bin).',
    },
    {
      name: 'mergedCurve',
      unit: 'eV',
      description:
        '{ x, reactant, product, overlapBins, shiftEv, shiftStandardError }: G_R and G_P = G_R + x ' +
        'merged from both histograms, shift (≈ ΔG°) fitted on the overlap; null without overlap.',
    },
    {
      name: 'activationFreeEnergy',
      unit: 'eV',
      description:
        'ΔG‡ = G_R(0) − min G_R from weighted local quadratic fits (weights ∝ bin count) at the crossing and the minimum.',
    },
    {
      name: 'activationFreeEnergyStandardError',
      unit: 'eV',
      description: 'Standard error of ΔG‡ from the two fits (null for a fallback estimate).',
    },
    {
      name: 'activationFreeEnergyCumulant',
      unit: 'eV',
      description: 'Gaussian (cumulant) ΔG‡ = k_BT⟨ΔE⟩_R²/(2σ_R²).',
    },
    {
      name: 'activationFreeEnergyOneBin',
      unit: 'eV',
      description: 'G_R in the one bin holding ΔE = 0 minus the lowest bin (null when empty).',
    },
    {
      name: 'standardErrors',
      unit: 'eV',
      description: 'Block-plateau SEs of the means, λ and ΔG°.',
    },
    { name: 'statisticalInefficiency', unit: '', description: 'N·SE²/σ² per state.' },
    {
      name: 'histograms',
      unit: 'eV',
      description: 'Freedman–Diaconis { edges, counts } per state.',
    },
  ],
  read(reader) {
    const reactant = reader.quantityArray(REACTANT, 'energy', {
      minLength: 1,
      message: 'No data rows found.',
    });
    const product = reader.quantityArray(PRODUCT, 'energy', {
      minLength: 1,
      message: 'No data rows found.',
    });
    const temperatureK = reader.quantity('temperature', 'temperature', {
      greaterThan: 0,
      message: 'Temperature must be > 0 K (absolute). Did you enter °C?',
    });
    const bins = reader.optionalInteger('bins', {
      atLeast: 1,
      atMost: MAX_HISTOGRAM_BINS,
      message: `Bins must be between 1 and ${MAX_HISTOGRAM_BINS}.`,
    });
    return { reactant, product, temperatureK, bins };
  },
  compute: (inputs, warnings) => analyseGapSamples(inputs, warnings),
} satisfies MethodDefinition<GapSampleInputs>;

/** What `reorg.gapSamples` answers (the compiler reads it through `MethodOutputs`). */
export type GapSamplesOutputs = ReturnType<(typeof gapSamplesMethod)['compute']>;
