/** A linear map from a data interval to a drawing interval (pixels or PDF points). */
export interface LinearScale {
  readonly domain: readonly [number, number];
  readonly range: readonly [number, number];
  (value: number): number;
  invert(position: number): number;
}

export function linearScale(
  domain: readonly [number, number],
  range: readonly [number, number],
): LinearScale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const k = d1 === d0 ? 0 : (r1 - r0) / (d1 - d0);
  const f = ((v: number) => r0 + (v - d0) * k) as LinearScale;
  Object.defineProperty(f, 'domain', { value: [d0, d1] });
  Object.defineProperty(f, 'range', { value: [r0, r1] });
  f.invert = (p: number) => (k === 0 ? d0 : d0 + (p - r0) / k);
  return f;
}

/** Round tick values covering a domain (1, 2, 5 × 10ⁿ steps), about `count` of them. */
export function niceTicks(lo: number, hi: number, count = 6): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const ticks: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) {
    ticks.push(Math.abs(t) < step * 1e-9 ? 0 : Number(t.toPrecision(12)));
  }
  return ticks;
}

/** An SVG/PDF path through the points; a null y (or one outside `clip`) breaks the line. */
export function linePath(
  points: ReadonlyArray<{ readonly x: number; readonly y: number | null }>,
  x: (v: number) => number,
  y: (v: number) => number,
  clip?: readonly [number, number],
): string {
  let d = '';
  let pen = false;
  for (const p of points) {
    const visible =
      p.y !== null && Number.isFinite(p.y) && (!clip || (p.y >= clip[0] && p.y <= clip[1]));
    if (!visible) {
      pen = false;
      continue;
    }
    d += `${pen ? 'L' : 'M'}${x(p.x).toFixed(2)},${y(p.y as number).toFixed(2)}`;
    pen = true;
  }
  return d;
}
