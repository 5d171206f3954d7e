import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  relativeError,
  warningCodes,
} from '../../methods/testing/answers';

const KB_EV = 8.617333262e-5; // CODATA 2018, typed here independently of constants.ts

/**
 * Independent reference: the ground surface on a brute-force grid of 2·10⁶ + 1 points over
 * [−1, 2] (no refinement), reactant minimum = lowest point left of the crossing, barrier top =
 * highest point between it and the product minimum.
 */
function bruteForceBarrier(dG: number, lam: number, h: number): number {
  const n = 2_000_000;
  const eg = (x: number) => {
    const e1 = lam * x * x;
    const e2 = lam * (x - 1) ** 2 + dG;
    return (e1 + e2) / 2 - Math.sqrt((e2 - e1) ** 2 + 4 * h * h) / 2;
  };
  const crossing = (lam + dG) / (2 * lam);
  let minLeft = Infinity;
  let top = -Infinity;
  for (let i = 0; i <= n; i++) {
    const x = -1 + (3 * i) / n;
    if (x <= crossing) minLeft = Math.min(minLeft, eg(x));
    if (x >= 0 && x <= 1) top = Math.max(top, eg(x));
  }
  return top - minLeft;
}

const base = { deltaG0: -0.3, lambda: 0.8, coupling: 0.05, temperature: 298.15 };

describe('evb.adiabaticBarrier', () => {
  it('is exact in the symmetric case: λ/4 − |H| + H²/λ (SCIENCE.md §3)', () => {
    for (const h of [0.01, 0.05, 0.15, -0.3]) {
      const answer = computeOk('evb.adiabaticBarrier', { ...base, deltaG0: 0, coupling: h });
      const exact = 0.8 / 4 - Math.abs(h) + (h * h) / 0.8;
      expect(numberOutput(answer, 'barrier')).toBeCloseTo(exact, 11);
      expect(numberOutput(answer, 'barrierApproximate')).toBeCloseTo(exact, 12);
    }
  });

  it('finds the Brunschwig–Sutin form 0.0043 eV (11 %) low for λ = 0.8, ΔG° = −0.3, H = 0.05 eV (SCIENCE.md §3)', () => {
    const answer = computeOk('evb.adiabaticBarrier', base);
    const exact = numberOutput(answer, 'barrier');
    const approx = numberOutput(answer, 'barrierApproximate');
    // Closed form by hand: 0.5²/3.2 − 0.05 + 0.05²/0.5.
    expect(approx).toBeCloseTo(0.25 / 3.2 - 0.05 + 0.0025 / 0.5, 12);
    expect(exact - approx).toBeCloseTo(0.0043, 4);
    expect((exact - approx) / exact).toBeCloseTo(0.11, 1);
    expect(Math.abs(exact - bruteForceBarrier(-0.3, 0.8, 0.05))).toBeLessThan(1e-9);
  });

  it('agrees with a brute-force grid over a range of asymmetric cases', () => {
    for (const [dG, lam, h] of [
      [-0.1, 0.5, 0.02],
      [0.2, 1.0, 0.1],
      [-0.4, 0.9, 0.06],
      [-0.3, 0.8, 0],
    ]) {
      const answer = computeOk('evb.adiabaticBarrier', {
        ...base,
        deltaG0: dG,
        lambda: lam,
        coupling: h,
      });
      expect(
        Math.abs(numberOutput(answer, 'barrier') - bruteForceBarrier(dG, lam, h)),
      ).toBeLessThan(1e-9);
    }
    // H = 0: the diabatic Marcus barrier (ΔG° + λ)²/(4λ).
    const cusp = computeOk('evb.adiabaticBarrier', { ...base, coupling: 0 });
    expect(numberOutput(cusp, 'barrier')).toBeCloseTo(0.25 / 3.2, 10);
  });

  it('gives k = ν_n exp(−ΔG‡_ad/k_BT) (SCIENCE.md §3 adiabatic TST)', () => {
    const answer = computeOk('evb.adiabaticBarrier', { ...base, nuclearFrequency: 5e12 });
    const expected = 5e12 * Math.exp(-numberOutput(answer, 'barrier') / (KB_EV * 298.15));
    expect(relativeError(numberOutput(answer, 'k'), expected)).toBeLessThan(1e-12);
    // γ = 0.094 × (0.05/0.01)² × 2 = 4.7 (SCIENCE.md §3 form): intermediate.
    expect(answer.outputs['couplingRegime']).toBe('intermediate');
    expect(warningCodes(answer)).not.toContain('coupling-barrier-lowering');
  });

  it('refuses 2|H| ≥ λ (class III, A5) and a ground surface with one minimum, naming the field', () => {
    expect(
      computeRefused('evb.adiabaticBarrier', { ...base, coupling: 0.4 }).map((e) => e.field),
    ).toContain('coupling');
    // Deep inverted region: the reactant well is not on the ground surface.
    expect(
      computeRefused('evb.adiabaticBarrier', { ...base, deltaG0: -1.5 }).map((e) => e.field),
    ).toEqual(['deltaG0']);
    expect(
      computeRefused('evb.adiabaticBarrier', { ...base, nuclearFrequency: -1 }).map((e) => e.field),
    ).toContain('nuclearFrequency');
  });

  it('warns that the adiabatic rate overestimates for weak coupling (γ < 0.1)', () => {
    const answer = computeOk('evb.adiabaticBarrier', { ...base, coupling: 0.005 });
    expect(warningCodes(answer)).toContain('adiabatic-rate-weak-coupling');
    expect(answer.outputs['couplingRegime']).toBe('nonadiabatic');
  });
});
