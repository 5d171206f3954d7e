/**
 * The `reorg.gapSamples` outputs of a finished trace analysis as the page reads them (eV), and
 * the small transformations the plots need (bin densities, Gaussian overlays, the tilted curve of
 * the linear free-energy relation).
 */
export interface GapHistogram {
  readonly edges: number[];
  readonly counts: number[];
}

export interface GapBlockLevel {
  readonly blockSize: number;
  readonly blocks: number;
  readonly standardError: number;
}

export interface GapPlateau {
  readonly blockSize: number;
  readonly blocks: number;
  readonly standardError: number;
  readonly reached: boolean;
}

export interface PerState<T> {
  readonly reactant: T;
  readonly product: T;
}

export interface GapOutputs {
  readonly meanReactant: number;
  readonly meanProduct: number;
  readonly varianceReactant: number;
  readonly varianceProduct: number;
  readonly lambdaFromMeans: number;
  readonly deltaG0FromMeans: number;
  readonly lambdaFromVarianceReactant: number;
  readonly lambdaFromVarianceProduct: number;
  readonly linearResponseRatio: number;
  readonly deltaG0CumulantReactant: number;
  readonly deltaG0CumulantProduct: number;
  readonly freeEnergyCurves: {
    x: number[];
    reactant: (number | null)[];
    product: (number | null)[];
  };
  readonly activationFreeEnergy: number;
  readonly activationFreeEnergySource: string;
  readonly lambdaFromParabolaReactant: number;
  readonly lambdaFromParabolaProduct: number;
  readonly linearFreeEnergyCheck: {
    overlapBins: number;
    meanDeviation: number | null;
    rmsDeviation: number | null;
  };
  /**
   * Both histograms merged through G_P = G_R + x (null without overlap; absent from analyses
   * finished before it was computed).
   */
  readonly mergedCurve?: GapMergedCurve | null;
  readonly standardErrors: {
    meanReactant: number;
    meanProduct: number;
    lambdaFromMeans: number;
    deltaG0FromMeans: number;
  };
  readonly naiveStandardErrors: { meanReactant: number; meanProduct: number };
  readonly statisticalInefficiency: PerState<number>;
  readonly blockPlateau: PerState<GapPlateau>;
  readonly blockAnalysis: PerState<GapBlockLevel[]>;
  readonly skewness: PerState<number>;
  readonly excessKurtosis: PerState<number>;
  readonly sampleCounts: PerState<number>;
  readonly histograms: PerState<GapHistogram>;
}

export interface GapMergedCurve {
  readonly x: number[];
  /** Merged G_R(x), eV. */
  readonly reactant: number[];
  /** Merged G_P(x) = G_R(x) + x, eV. */
  readonly product: number[];
  readonly overlapBins: number;
  /** The constant aligning the states (≈ ΔG°), eV. */
  readonly shiftEv: number;
  readonly shiftStandardError: number;
}

export interface DensityPoint {
  readonly x0: number;
  readonly x1: number;
  /** Bin density, eV⁻¹. */
  readonly density: number;
}

/** Bin densities count/(N·h) of a histogram. */
export function binDensities(h: GapHistogram): DensityPoint[] {
  const n = h.counts.reduce((s, c) => s + c, 0);
  return h.counts.map((c, i) => {
    const width = h.edges[i + 1] - h.edges[i];
    return {
      x0: h.edges[i],
      x1: h.edges[i + 1],
      density: n > 0 && width > 0 ? c / (n * width) : 0,
    };
  });
}

/** Normal density with mean μ and variance σ² at x. */
export function normalDensity(x: number, mean: number, variance: number): number {
  return Math.exp(-((x - mean) ** 2) / (2 * variance)) / Math.sqrt(2 * Math.PI * variance);
}

/** `count` evenly spaced points of the Gaussian overlay over [low, high]. */
export function gaussianOverlay(
  mean: number,
  variance: number,
  low: number,
  high: number,
  count = 160,
): Array<{ x: number; y: number }> {
  const out: Array<{ x: number; y: number }> = [];
  for (let i = 0; i < count; i++) {
    const x = low + ((high - low) * i) / (count - 1);
    out.push({ x, y: normalDensity(x, mean, variance) });
  }
  return out;
}

/**
 * The exact linear free-energy relation G_P(x) = G_R(x) + x: the reactant curve tilted by x, to be
 * drawn over the product curve (they coincide where both states sample x).
 */
export function tiltedReactant(
  curves: GapOutputs['freeEnergyCurves'],
): Array<{ x: number; g: number }> {
  const out: Array<{ x: number; g: number }> = [];
  curves.x.forEach((x, i) => {
    const g = curves.reactant[i];
    if (g !== null && g !== undefined) out.push({ x, g: g + x });
  });
  return out;
}

/** The merged G_R(x) as points to draw, or none when the analysis has no merged curve. */
export function mergedReactant(
  merged: GapMergedCurve | null | undefined,
): Array<{ x: number; g: number }> {
  if (!merged) return [];
  return merged.x
    .map((x, i) => ({ x, g: merged.reactant[i] }))
    .filter((q) => Number.isFinite(q.x) && Number.isFinite(q.g));
}
