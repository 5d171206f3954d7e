import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  relativeError,
  warningCodes,
} from '../../methods/testing/answers';
import { marcusRateLog } from '../marcus/marcus';
import { mljMinimumTerms, mljRateLog } from './mlj';

// CODATA 2018 (Tiesinga et al. 2021), typed here independently of constants.ts.
const KB_EV = 8.617333262e-5;
const TWO_PI_OVER_HBAR = (2 * Math.PI) / 6.582119569e-16; // ħ in eV s, CODATA 2018

/**
 * Independent reference: the MLJ sum of SCIENCE.md §2 with Poisson weights built by products in
 * linear space (w₀ = e^−S, w_n = w_(n−1) S/n) over a fixed, generous 400 terms.
 */
function mljDirect(
  dG: number,
  lamS: number,
  lamV: number,
  hw: number,
  h: number,
  t: number,
): number {
  const kT = KB_EV * t;
  const s = lamV / hw;
  let weight = Math.exp(-s);
  let sum = 0;
  for (let n = 0; n < 400; n++) {
    if (n > 0) weight *= s / n;
    sum += weight * Math.exp(-((dG + lamS + n * hw) ** 2) / (4 * lamS * kT));
  }
  return TWO_PI_OVER_HBAR * h * h * (1 / Math.sqrt(4 * Math.PI * lamS * kT)) * sum;
}

/** Modified Bessel function I_p(z) by its power series (Abramowitz & Stegun 9.6.10). */
function besselI(p: number, z: number): number {
  const order = Math.abs(p);
  let term = (z / 2) ** order;
  for (let k = 1; k <= order; k++) term /= k;
  let sum = term;
  for (let k = 1; k < 200; k++) {
    term *= (z * z) / 4 / (k * (k + order));
    sum += term;
    if (term < 1e-17 * sum) break;
  }
  return sum;
}

/**
 * Independent reference: the finite-temperature MLJ sum of SCIENCE.md §2, over p = −60 … 60,
 * exp[−S coth(x/2)] e^(px/2) I_p(S/sinh(x/2)) × Gaussian, x = ħω/k_BT.
 */
function mljThermal(
  dG: number,
  lamS: number,
  lamV: number,
  hw: number,
  h: number,
  t: number,
): number {
  const kT = KB_EV * t;
  const s = lamV / hw;
  const x = hw / kT;
  let sum = 0;
  for (let p = -60; p <= 60; p++) {
    const weight = Math.exp(-s / Math.tanh(x / 2) + (p * x) / 2) * besselI(p, s / Math.sinh(x / 2));
    sum += weight * Math.exp(-((dG + lamS + p * hw) ** 2) / (4 * lamS * kT));
  }
  return TWO_PI_OVER_HBAR * h * h * (1 / Math.sqrt(4 * Math.PI * lamS * kT)) * sum;
}

const base = {
  deltaG0: -1,
  lambdaSolvent: 0.5,
  lambdaVib: 0.18,
  hbarOmega: 0.18,
  coupling: 0.01,
  temperature: 298.15,
};

describe('rate.mlj', () => {
  it('equals the classical Marcus rate with λ_s exactly when S = 0 (SCIENCE.md §2)', () => {
    const mlj = mljRateLog(-0.4, 0.6, 0, 0.18, 0.02, 298.15);
    expect(mlj.lnK).toBe(marcusRateLog(-0.4, 0.6, 0.02, 298.15));
    expect(mlj.termsUsed).toBe(1);
    const answer = computeOk('rate.mlj', { ...base, lambdaVib: 0 });
    const marcus = computeOk('rate.marcus', {
      deltaG0: -1,
      lambda: 0.5,
      coupling: 0.01,
      temperature: 298.15,
    });
    expect(answer.outputs['log10k']).toBe(marcus.outputs['log10k']);
  });

  it('agrees with a direct linear-space summation (different algorithm) to 1e-12', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -3, max: 0.5, noNaN: true }),
        fc.double({ min: 0.05, max: 1.5, noNaN: true }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        fc.double({ min: 0.1, max: 0.3, noNaN: true }),
        fc.double({ min: 250, max: 350, noNaN: true }),
        (dG, lamS, lamV, hw, t) => {
          const expected = mljDirect(dG, lamS, lamV, hw, 0.005, t);
          fc.pre(expected > 1e-200);
          const actual = Math.exp(mljRateLog(dG, lamS, lamV, hw, 0.005, t).lnK);
          expect(relativeError(actual, expected)).toBeLessThan(1e-12);
        },
      ),
    );
  });

  it('tends to the finite-temperature (Bessel) form as ħω/k_BT grows (SCIENCE.md §2)', () => {
    // SCIENCE.md §2: the T = 0 form is the x = ħω/k_BT ≫ 1 limit of the thermal sum (0.04% at
    // ħω = 0.18 eV for its example). Hot-band terms scale as S e^(−x), so the gap must shrink
    // roughly e-fold per k_BT of mode energy.
    for (const dG of [-0.3, -1, -2]) {
      const gap = (hw: number) =>
        relativeError(
          Math.exp(mljRateLog(dG, 0.5, hw, hw, 0.01, 298.15).lnK),
          mljThermal(dG, 0.5, hw, hw, 0.01, 298.15),
        );
      expect(gap(0.18)).toBeLessThan(1e-2);
      expect(gap(0.3)).toBeLessThan(gap(0.18) / 20);
      expect(gap(0.4)).toBeLessThan(1e-4);
    }
  });

  it('sums at least to max(S, n*) + 5 and then below 1e-15 of the sum (SCIENCE.md §2)', () => {
    const answer = computeOk('rate.mlj', { ...base, deltaG0: -2, lambdaVib: 0.36 });
    const terms = numberOutput(answer, 'termsUsed');
    // n* = −(ΔG° + λ_s)/ħω = 1.5/0.18 = 8.33; S = 2 → at least ceil(8.33) + 5 = 14 terms.
    expect(terms).toBeGreaterThanOrEqual(14);
    expect(mljMinimumTerms(-2, 0.5, 2, 0.18)).toBe(14);
    expect(numberOutput(answer, 'huangRhys')).toBeCloseTo(2, 14);
    const truncated = mljRateLog(-2, 0.5, 0.36, 0.18, 0.01, 298.15, terms - 1);
    const full = mljDirect(-2, 0.5, 0.36, 0.18, 0.01, 298.15);
    expect(relativeError(Math.exp(truncated.lnK), full)).toBeLessThan(1e-13);
  });

  it('exceeds classical Marcus (same total λ) by orders of magnitude deep in the inverted region', () => {
    // SCIENCE.md §2: nuclear tunnelling through the quantum mode dominates when −ΔG° ≫ λ.
    const mlj = mljRateLog(-2.5, 0.3, 0.4, 0.18, 0.01, 298.15).lnK;
    const marcus = marcusRateLog(-2.5, 0.7, 0.01, 298.15);
    expect((mlj - marcus) / Math.LN10).toBeGreaterThan(5);
  });

  it('reports non-convergence when the term cap is reached (B7)', () => {
    expect(mljRateLog(-1, 0.5, 5, 0.01, 0.01, 298.15, 20).converged).toBe(false);
  });

  it('refuses up front a request whose sum would need more terms than the work limit', () => {
    // S = 5e9: the sum would need billions of terms; refused before any is summed.
    const errors = computeRefused('rate.mlj', {
      ...base,
      lambdaVib: 50000,
      hbarOmega: 1e-5,
      coupling: 1e-4,
    });
    expect(errors.find((e) => e.field === 'hbarOmega')?.message).toMatch(/vibronic terms/);
  });

  it('warns for a low-frequency mode ħω < 4k_BT (B6) and λ_s < k_BT (B3)', () => {
    expect(warningCodes(computeOk('rate.mlj', { ...base, hbarOmega: 0.05 }))).toContain(
      'low-frequency-mode',
    );
    expect(warningCodes(computeOk('rate.mlj', base))).not.toContain('low-frequency-mode');
    expect(warningCodes(computeOk('rate.mlj', { ...base, lambdaSolvent: 0.02 }))).toContain(
      'lambda-below-kt',
    );
  });

  it('refuses ħω ≤ 0 (A6), λ_v < 0 (A7), λ_s ≤ 0 (A1), 2|H| ≥ λ_s + λ_v (A5)', () => {
    expect(computeRefused('rate.mlj', { ...base, hbarOmega: 0 })).toEqual([
      { field: 'hbarOmega', message: 'Mode energy must be > 0.' },
    ]);
    expect(computeRefused('rate.mlj', { ...base, lambdaVib: -0.1 })).toEqual([
      { field: 'lambdaVib', message: 'Huang–Rhys factor must be ≥ 0.' },
    ]);
    expect(computeRefused('rate.mlj', { ...base, lambdaSolvent: -0.5 })).toEqual([
      { field: 'lambdaSolvent', message: 'Reorganization energy must be a positive number.' },
    ]);
    expect(computeRefused('rate.mlj', { ...base, coupling: 0.34 })[0].field).toBe('coupling');
  });

  it('keeps log10 k exact when k underflows', () => {
    const answer = computeOk('rate.mlj', { ...base, deltaG0: 20, coupling: 0.001 });
    expect(answer.outputs['k']).toBe(0);
    expect(warningCodes(answer)).toContain('rate-underflow');
    // For ΔG° ≫ 0 only n = 0 matters: the Marcus exponent with λ_s times e^−S.
    const expected = (marcusRateLog(20, 0.5, 0.001, 298.15) - 1) / Math.LN10;
    expect(numberOutput(answer, 'log10k')).toBeCloseTo(expected, 8);
  });

  it('gives finite outputs for any valid input (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -10, max: 10, noNaN: true }),
        fc.double({ min: 0.01, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 3, noNaN: true }),
        fc.double({ min: 0.01, max: 0.5, noNaN: true }),
        fc.double({ min: 50, max: 1000, noNaN: true }),
        (dG, lamS, lamV, hw, t) => {
          const answer = computeOk('rate.mlj', {
            deltaG0: dG,
            lambdaSolvent: lamS,
            lambdaVib: lamV,
            hbarOmega: hw,
            coupling: lamS / 10,
            temperature: t,
          });
          expect(Number.isFinite(answer.outputs['log10k'])).toBe(true);
          expect(Number.isFinite(answer.outputs['k'])).toBe(true);
        },
      ),
      { numRuns: 200 },
    );
  });
});
