import {
  formatMeasured,
  formatNumber,
  type MaterialResults,
  type MonteCarloSummary,
} from '@gapwise/contracts';

/**
 * What the material page shows of a result: headline values with the precision their Monte Carlo
 * interval supports, per-neighbour bars and the μ(T) polyline. Pure, so the spec checks it.
 */

/** σ estimated from a 95 % interval of a roughly normal distribution: (p97.5 − p2.5)/3.92. */
export function sigmaOf(summary: MonteCarloSummary | undefined): number | null {
  if (!summary) return null;
  const s = (summary.p975 - summary.p025) / 3.92;
  return Number.isFinite(s) && s > 0 ? s : null;
}

export function headline(results: MaterialResults): { diffusion: string; mobility: string } {
  const mc = results.monteCarlo;
  return {
    diffusion: `${formatMeasured(results.diffusion, sigmaOf(mc?.diffusion))} cm² s⁻¹`,
    mobility: `${formatMeasured(results.mobility, sigmaOf(mc?.mobility))} cm² V⁻¹ s⁻¹`,
  };
}

export interface Bar {
  readonly label: string;
  readonly share: number;
  readonly percent: string;
}

export function contributionBars(labels: readonly string[], results: MaterialResults): Bar[] {
  return results.contributions.map((share, i) => ({
    label: labels[i] ?? `n${i + 1}`,
    share,
    percent: `${formatNumber(share * 100, 3)} %`,
  }));
}

/** SVG geometry of μ against T (log μ axis) in a 600 × 240 box with 60/20/20/40 margins. */
export function mobilityCurve(
  results: MaterialResults,
  temperatureK: number,
): {
  points: string;
  xTicks: { x: number; label: string }[];
  yTicks: { y: number; label: string }[];
  marker: { x: number; y: number } | null;
} {
  const pts = results.mobilityVsTemperature.filter((p) => p.mobility > 0);
  if (pts.length < 2) return { points: '', xTicks: [], yTicks: [], marker: null };
  const [x0, x1, y0, y1] = [60, 580, 200, 20];
  const tMin = pts[0].temperatureK;
  const tMax = pts[pts.length - 1].temperatureK;
  const logs = pts.map((p) => Math.log10(p.mobility));
  const lMin = Math.floor(Math.min(...logs) * 2) / 2;
  const lMax = Math.max(Math.ceil(Math.max(...logs) * 2) / 2, lMin + 0.5);
  const sx = (t: number) => x0 + ((t - tMin) / (tMax - tMin)) * (x1 - x0);
  const sy = (l: number) => y0 + ((l - lMin) / (lMax - lMin)) * (y1 - y0);
  const xTicks = [tMin, (tMin + tMax) / 2, tMax].map((t) => ({
    x: sx(t),
    label: formatNumber(t, 3),
  }));
  const yTicks: { y: number; label: string }[] = [];
  const step = lMax - lMin > 3 ? 1 : 0.5;
  for (let l = lMin; l <= lMax + 1e-9; l += step) {
    yTicks.push({ y: sy(l), label: formatNumber(10 ** l, 2) });
  }
  const own = pts.find((p) => p.temperatureK === temperatureK);
  return {
    points: pts
      .map((p, i) => `${sx(p.temperatureK).toFixed(1)},${sy(logs[i]).toFixed(1)}`)
      .join(' '),
    xTicks,
    yTicks,
    marker: own ? { x: sx(own.temperatureK), y: sy(Math.log10(own.mobility)) } : null,
  };
}
