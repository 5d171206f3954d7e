import type { SolventScanRow } from '@gapwise/contracts';

/** SVG geometry of log k_CS and log k_CR against the Pekar factor (600 × 260 box). */
export interface SolventChart {
  readonly cs: string;
  readonly cr: string;
  readonly dots: { x: number; yCs: number | null; yCr: number | null; label: string }[];
  readonly xTicks: { x: number; label: string }[];
  readonly yTicks: { y: number; label: string }[];
}

export function solventChart(rows: readonly SolventScanRow[]): SolventChart | null {
  const ok = rows
    .filter((r) => r.log10kCS !== null || r.log10kCR !== null)
    .slice()
    .sort((a, b) => a.pekar - b.pekar);
  if (ok.length < 2) return null;
  const [x0, x1, y0, y1] = [60, 580, 220, 20];
  const xs = ok.map((r) => r.pekar);
  const ys = ok.flatMap((r) => [r.log10kCS, r.log10kCR]).filter((v): v is number => v !== null);
  const xMin = Math.min(0, ...xs);
  const xMax = Math.max(...xs);
  const yMin = Math.floor(Math.min(...ys));
  const yMax = Math.max(Math.ceil(Math.max(...ys)), yMin + 1);
  const sx = (x: number) => x0 + ((x - xMin) / (xMax - xMin || 1)) * (x1 - x0);
  const sy = (y: number) => y0 + ((y - yMin) / (yMax - yMin)) * (y1 - y0);
  const line = (pick: (r: SolventScanRow) => number | null) =>
    ok
      .filter((r) => pick(r) !== null)
      .map((r) => `${sx(r.pekar).toFixed(1)},${sy(pick(r)!).toFixed(1)}`)
      .join(' ');
  const step = yMax - yMin > 8 ? 2 : 1;
  const yTicks: { y: number; label: string }[] = [];
  for (let y = yMin; y <= yMax; y += step) yTicks.push({ y: sy(y), label: String(y) });
  const xTicks = [0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6]
    .filter((x) => x >= xMin && x <= xMax + 1e-9)
    .map((x) => ({ x: sx(x), label: x.toFixed(1) }));
  return {
    cs: line((r) => r.log10kCS),
    cr: line((r) => r.log10kCR),
    dots: ok.map((r) => ({
      x: sx(r.pekar),
      yCs: r.log10kCS === null ? null : sy(r.log10kCS),
      yCr: r.log10kCR === null ? null : sy(r.log10kCR),
      label: r.solvent.name,
    })),
    xTicks,
    yTicks,
  };
}
