import { describe, expect, it } from 'vitest';
import { adiabaticSurfaces, parabolaGeometry, reactantFreeEnergy } from './parabolas';
import { linearScale, linePath, niceTicks } from './scale';

// Expected values follow from the two-state model of SCIENCE.md §3 and the linear free-energy
// relation of §7, worked by hand: λ = 0.8 eV, ΔG° = −0.3 eV gives ΔG‡ = 0.25/3.2 = 0.078125 eV.
/** G_P(x) = G_R(x) + x, the linear free-energy relation (SCIENCE.md §7). */
const productFreeEnergy = (gap: number, deltaG0: number, lambda: number) =>
  reactantFreeEnergy(gap, deltaG0, lambda) + gap;
describe('parabola geometry', () => {
  const g = parabolaGeometry({ deltaG0: -0.3, lambda: 0.8, coupling: 0.05 });

  it('puts the diabatic crossing at ΔE = 0 with height ΔG‡', () => {
    expect(reactantFreeEnergy(0, -0.3, 0.8)).toBeCloseTo(0.078125, 12);
    expect(productFreeEnergy(0, -0.3, 0.8)).toBeCloseTo(0.078125, 12);
    const atZero = g.points.find((p) => p.gap === 0);
    expect(atZero).toBeDefined();
    expect(atZero!.reactant - atZero!.product).toBe(0);
    expect(g.crossing).toEqual({ gap: 0, energy: reactantFreeEnergy(0, -0.3, 0.8) });
  });

  it('has its minima at ΔG° ± λ, at 0 and ΔG°', () => {
    expect(g.reactantMinimum.gap).toBeCloseTo(0.5, 12);
    expect(g.productMinimum).toEqual({ gap: -0.3 - 0.8, energy: -0.3 });
    expect(productFreeEnergy(-1.1, -0.3, 0.8)).toBeCloseTo(-0.3, 12);
    // λ is the product curve above its minimum, at the reactant's equilibrium gap.
    expect(productFreeEnergy(0.5, -0.3, 0.8) - -0.3).toBeCloseTo(0.8, 12);
  });

  it('splits the adiabatic surfaces by exactly 2|H_AB| at the crossing, also in plot units', () => {
    expect(g.adiabaticAtCrossing.upper - g.adiabaticAtCrossing.lower).toBeCloseTo(0.1, 14);
    const y = linearScale(g.energyDomain, [300, 0]);
    const perEv = 300 / (g.energyDomain[1] - g.energyDomain[0]);
    const split = y(g.adiabaticAtCrossing.lower) - y(g.adiabaticAtCrossing.upper);
    expect(split).toBeCloseTo(2 * 0.05 * perEv, 9);
    const arrow = g.arrows.find((a) => a.id === 'splitting')!;
    expect(arrow.to - arrow.from).toBeCloseTo(0.1, 14);
  });

  it('uses |H_AB| whatever its sign, and the surfaces stay apart from the diabats far away', () => {
    const s = adiabaticSurfaces(0, -0.3, 0.8, -0.05);
    expect(s.upper - s.lower).toBeCloseTo(0.1, 14);
    const far = adiabaticSurfaces(0.5, -0.3, 0.8, 0.05);
    expect(far.lower).toBeLessThanOrEqual(reactantFreeEnergy(0.5, -0.3, 0.8));
  });

  it('refuses λ ≤ 0 and NaN', () => {
    expect(() => parabolaGeometry({ deltaG0: 0, lambda: 0, coupling: 0 })).toThrow(RangeError);
    expect(() => parabolaGeometry({ deltaG0: Number.NaN, lambda: 1, coupling: 0 })).toThrow(
      RangeError,
    );
  });

  it('keeps the crossing inside the drawn range in the inverted region', () => {
    const inv = parabolaGeometry({ deltaG0: -1.5, lambda: 0.6, coupling: 0.01 });
    expect(inv.gapDomain[0]).toBeLessThan(-2.1);
    expect(inv.gapDomain[1]).toBeGreaterThan(0);
  });
});

describe('scale helpers', () => {
  it('maps and inverts', () => {
    const s = linearScale([0, 2], [100, 300]);
    expect(s(1)).toBe(200);
    expect(s.invert(250)).toBe(1.5);
  });
  it('gives round ticks', () => {
    expect(niceTicks(-0.3, 0.8, 6)).toEqual([-0.2, 0, 0.2, 0.4, 0.6, 0.8]);
  });
  it('breaks a path at missing values', () => {
    const d = linePath(
      [
        { x: 0, y: 0 },
        { x: 1, y: null },
        { x: 2, y: 1 },
      ],
      (v) => v,
      (v) => v,
    );
    expect(d).toBe('M0.00,0.00M2.00,1.00');
  });
});
