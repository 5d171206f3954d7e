/**
 * Freedman–Diaconis histograms with the same edges and bin assignment as numpy's
 * `histogram_bin_edges(x, bins='fd')` and `histogram`, so a user can reproduce them.
 */

/** Largest number of bins accepted (VALIDATION.md A22). */
export const MAX_HISTOGRAM_BINS = 100_000;

export interface Histogram {
  /** n + 1 equal-width edges from min to max. */
  readonly edges: number[];
  readonly counts: number[];
}

/**
 * Percentile of ascending `sorted` data by linear interpolation between order statistics
 * (Hyndman & Fan definition 7; numpy's default `linear` method).
 * References: R. J. Hyndman, Y. Fan, Am. Stat. 1996, 50, 361 (doi 10.2307/2684934).
 */
export function percentileSorted(sorted: ArrayLike<number>, fraction: number): number {
  const position = fraction * (sorted.length - 1);
  const below = Math.floor(position);
  const above = Math.min(below + 1, sorted.length - 1);
  const weight = position - below;
  return sorted[below] + weight * (sorted[above] - sorted[below]);
}

/**
 * Freedman–Diaconis bin count: h = 2·IQR·N^(−1/3), n = ⌈(max − min)/h⌉ (at least 1).
 * Returns 0 when IQR = 0 (the rule is undefined; callers refuse, VALIDATION.md A20).
 * References: D. Freedman, P. Diaconis, Z. Wahrscheinlichkeitstheorie verw. Geb. 1981, 57, 453
 * (doi 10.1007/BF01025868).
 */
export function freedmanDiaconisBinCount(
  iqr: number,
  count: number,
  min: number,
  max: number,
): number {
  // count ** (−1/3) rather than cbrt(1/count): the same rounding as numpy, so the same ceil.
  const width = 2 * iqr * count ** (-1 / 3);
  if (!(width > 0)) return 0;
  return Math.max(1, Math.ceil((max - min) / width));
}

/** `bins + 1` equal-width edges from `min` to `max`, built as numpy's `linspace` builds them. */
export function equalWidthEdges(min: number, max: number, bins: number): number[] {
  const low = min === max ? min - 0.5 : min;
  const high = min === max ? max + 0.5 : max;
  const step = (high - low) / bins;
  const edges = new Array<number>(bins + 1);
  for (let i = 0; i < bins; i++) edges[i] = low + i * step;
  edges[bins] = high;
  return edges;
}

/**
 * Counts of `values` in equal-width `edges`: bin i holds edges[i] ≤ x < edges[i+1], the last
 * bin also its right edge; values outside are ignored. Same rule and rounding fix-ups as numpy.
 */
export function countInBins(values: ArrayLike<number>, edges: readonly number[]): number[] {
  const bins = edges.length - 1;
  const counts = new Array<number>(bins).fill(0);
  const low = edges[0];
  const high = edges[bins];
  const scale = bins / (high - low);
  for (let i = 0; i < values.length; i++) {
    const x = values[i];
    if (x < low || x > high) continue;
    let index = Math.floor((x - low) * scale);
    if (index === bins) index--;
    // Rounding in (x − low)·scale can land one bin off: compare with the edges themselves.
    if (x < edges[index]) index--;
    else if (index < bins - 1 && x >= edges[index + 1]) index++;
    counts[index]++;
  }
  return counts;
}

/** Freedman–Diaconis histogram of `values` with exact quartiles (sorts a copy). */
export function freedmanDiaconisHistogram(values: ArrayLike<number>): Histogram & { iqr: number } {
  const sorted = Float64Array.from(values).sort();
  const iqr = percentileSorted(sorted, 0.75) - percentileSorted(sorted, 0.25);
  const min = sorted[0];
  const max = sorted[sorted.length - 1];
  const bins = freedmanDiaconisBinCount(iqr, sorted.length, min, max);
  if (bins === 0 || bins > MAX_HISTOGRAM_BINS) return { edges: [], counts: [], iqr };
  const edges = equalWidthEdges(min, max, bins);
  return { edges, counts: countInBins(sorted, edges), iqr };
}
