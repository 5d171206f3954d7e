import type { StateKind } from '../cascade-design';

/**
 * Colour of a state by kind, from the product palette: excited singlets teal, triplets the cool
 * blue, charge-separated states amber (intermediates) and burnt orange (final), ground and
 * products charcoal.
 */
export const KIND_COLOURS: Record<StateKind, string> = {
  ground: '#37474f',
  singlet: '#00796b',
  triplet: '#1e63b5',
  csIntermediate: '#c77c00',
  csFinal: '#b3541e',
  product: '#5d4037',
};

/** Round ticks (eV) over [lo, hi]: about `count` of them at 1, 2 or 5 × 10ⁿ. */
export function energyTicks(lo: number, hi: number, count = 6): number[] {
  const span = hi - lo || 1;
  const raw = span / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? raw;
  const ticks: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + 1e-9; t += step)
    ticks.push(Number(t.toFixed(10)));
  return ticks;
}
