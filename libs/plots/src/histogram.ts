import { linearScale, niceTicks } from './scale';

/**
 * A Monte Carlo distribution of log10 k drawn with axes: bars per bin as a share of the samples
 * (the bins touching the interval marked), the median, and round ticks on both axes. Pure
 * geometry in drawing units (y down), for the pair page; the PDF maps the same bins onto its
 * own axes.
 */
export interface HistogramInputs {
  /** Bin edges (one more than counts), ascending. */
  readonly edges: readonly number[];
  readonly counts: readonly number[];
  /** The interval drawn darker, and the median marked. */
  readonly low: number;
  readonly high: number;
  readonly median: number;
}

export interface HistogramFrame {
  readonly width: number;
  readonly height: number;
  /** Room for the tick labels and axis titles: left, bottom, top, right. */
  readonly margin: {
    readonly left: number;
    readonly bottom: number;
    readonly top: number;
    readonly right: number;
  };
}

export interface HistogramGeometry {
  readonly inner: {
    readonly x: number;
    readonly y: number;
    readonly width: number;
    readonly height: number;
  };
  readonly bars: ReadonlyArray<{
    x: number;
    y: number;
    width: number;
    height: number;
    inside: boolean;
  }>;
  /** Share of samples per bin, in percent. */
  readonly shares: readonly number[];
  readonly xTicks: ReadonlyArray<{ value: number; x: number }>;
  readonly yTicks: ReadonlyArray<{ value: number; y: number }>;
  readonly medianX: number;
}

/** Null when there is nothing to draw (no bins, no samples, or non-finite edges). */
export function histogramGeometry(
  h: HistogramInputs,
  frame: HistogramFrame,
): HistogramGeometry | null {
  const n = h.counts.length;
  if (n === 0 || h.edges.length !== n + 1 || !h.edges.every(Number.isFinite)) return null;
  const total = h.counts.reduce((a, b) => a + b, 0);
  if (!(total > 0)) return null;
  const lo = h.edges[0];
  const hi = h.edges[n];
  if (!(hi > lo)) return null;
  const shares = h.counts.map((c) => (100 * c) / total);
  const top = Math.max(...shares) * 1.1;
  const m = frame.margin;
  const inner = {
    x: m.left,
    y: m.top,
    width: frame.width - m.left - m.right,
    height: frame.height - m.top - m.bottom,
  };
  const sx = linearScale([lo, hi], [inner.x, inner.x + inner.width]);
  const sy = linearScale([0, top], [inner.y + inner.height, inner.y]);
  const bars = shares.map((share, i) => {
    const x0 = sx(h.edges[i]);
    const x1 = sx(h.edges[i + 1]);
    return {
      x: x0,
      y: sy(share),
      width: Math.max(0.5, x1 - x0 - 1),
      height: sy(0) - sy(share),
      inside: h.edges[i + 1] >= h.low && h.edges[i] <= h.high,
    };
  });
  return {
    inner,
    bars,
    shares,
    xTicks: niceTicks(lo, hi, Math.max(2, Math.round(inner.width / 60))).map((value) => ({
      value,
      x: sx(value),
    })),
    yTicks: niceTicks(0, top, 3).map((value) => ({ value, y: sy(value) })),
    medianX: sx(h.median),
  };
}
