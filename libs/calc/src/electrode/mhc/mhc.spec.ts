import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { computeOk, computeRefused, numberOutput } from '../../methods/testing/answers';
import { calculate } from '../../methods/calculate';

import { integrateAdaptive } from './adaptive-gauss-kronrod';
import { logErfc, logMhcClosedForm, logMhcIntegral, mhcMethod, mhcRates, softplus } from './mhc';

const KT_298 = 8.617333262e-5 * 298.15;

/**
 * Independent check: plain composite Simpson rule, 400 001 points on [−400, 400], on the
 * unscaled integrand with a naive logistic (fine where it does not overflow).
 */
function simpsonMhc(lambdaOverKt: number, etaOverKt: number): number {
  const n = 400_000;
  const a = -400;
  const h = 800 / n;
  const f = (x: number) => {
    const gauss = Math.exp(-((x - lambdaOverKt - etaOverKt) ** 2) / (4 * lambdaOverKt));
    return x > 700 ? 0 : gauss / (1 + Math.exp(x));
  };
  let sum = f(a) + f(a + n * h);
  for (let i = 1; i < n; i++) sum += (i % 2 === 1 ? 4 : 2) * f(a + i * h);
  return (sum * h) / 3;
}

function warningsOf(inputs: Parameters<typeof mhcRates>[0]): string[] {
  const codes: string[] = [];
  mhcMethod.compute(inputs, { warn: (code) => codes.push(code) });
  return codes;
}

describe('adaptive Gauss–Kronrod', () => {
  it('integrates e^x on [0, 1] to e − 1 (exact)', () => {
    expect(integrateAdaptive(Math.exp, 0, 1).integral).toBeCloseTo(Math.E - 1, 14);
  });
  it('integrates a narrow peak, 1/(1e-4 + x²) on [−1, 1] = 2·100·atan(100) (exact)', () => {
    const exact = 200 * Math.atan(100);
    const result = integrateAdaptive((x) => 1 / (1e-4 + x * x), -1, 1);
    expect(Math.abs(result.integral / exact - 1)).toBeLessThan(1e-11);
  });
});

describe('logErfc', () => {
  it.each([
    [25.9, -674.6373518953192],
    [26, -679.8311997631943],
    [30, -903.9741171106439],
    [100, -10005.177585122665],
  ])('matches mpmath log(erfc(%d)) on both sides of the series switch', (z, expected) => {
    // Expected values: mpmath (mp.dps = 30), log(erfc(z)), computed independently for this test.
    expect(Math.abs(logErfc(z) / expected - 1)).toBeLessThan(1e-13);
  });
  it('matches erfc(3) = 2.209049699858544e-5 (Abramowitz & Stegun table 7.1, from memory)', () => {
    expect(Math.exp(logErfc(3))).toBeCloseTo(2.209049699858544e-5, 15);
  });
});

describe('MHC integral (quadrature reference)', () => {
  it('gives I(10, 0) = 0.2155837199 (SCIENCE.md §11, mpmath.quad to 30 digits)', () => {
    expect(Math.exp(logMhcIntegral(10, 0))).toBeCloseTo(0.2155837199, 10);
  });

  it.each([
    [1, 0],
    [10, -5],
    [12, 7],
    [40, -30],
    [4, 20],
  ])('agrees with an independent composite Simpson rule at λ̃ = %d, η̃ = %d', (l, e) => {
    const reference = simpsonMhc(l, e);
    expect(Math.abs(Math.exp(logMhcIntegral(l, e)) / reference - 1)).toBeLessThan(1e-9);
  });

  it('obeys detailed balance I(λ̃, η̃)/I(λ̃, −η̃) = e^(−η̃) (exact property)', () => {
    for (const [l, e] of [
      [0.5, 3],
      [12, -4],
      [60, 25],
      [200, -150],
    ]) {
      const logRatio = logMhcIntegral(l, e) - logMhcIntegral(l, -e);
      expect(logRatio).toBeCloseTo(-e, 9);
    }
  });

  it('saturates at 2√(πλ̃) for η̃ → −∞ (exact limit)', () => {
    const l = 12;
    expect(Math.exp(logMhcIntegral(l, -500)) / (2 * Math.sqrt(Math.PI * l))).toBeCloseTo(1, 12);
  });

  it('tends to π e^(−λ̃/4) for large λ̃ at η̃ = 0 (exact limit)', () => {
    // The relative correction falls like 1/λ̃ (about 2.5/λ̃), so check that it shrinks tenfold.
    const gap = (l: number) => Math.abs(logMhcIntegral(l, 0) - (Math.log(Math.PI) - l / 4));
    expect(gap(4000)).toBeLessThan(1e-3);
    expect(gap(400) / gap(4000)).toBeCloseTo(10, 0);
  });

  it('stays finite in log space where the rate underflows', () => {
    // Detailed balance and saturation together: ln I(λ̃, η̃) → −η̃ + ln(2√(πλ̃)) for η̃ ≫ λ̃.
    const value = logMhcIntegral(1000, 3000);
    expect(value).toBeCloseTo(-3000 + Math.log(2 * Math.sqrt(Math.PI * 1000)), 6);
  });
});

describe('Zeng 2014 closed form', () => {
  it('keeps the saturation and detailed-balance limits (exact properties)', () => {
    expect(Math.exp(logMhcClosedForm(12, -400)) / (2 * Math.sqrt(Math.PI * 12))).toBeCloseTo(1, 12);
    expect(logMhcClosedForm(12, 3) - logMhcClosedForm(12, -3)).toBeCloseTo(-3, 12);
  });

  it.each([
    [1, 0.116],
    [8, 0.048],
    [12, 0.032],
    [40, 0.27],
    [60, 0.42],
  ])('has max error over η̃ ∈ [−60, 60] near SCIENCE.md §11 table at λ̃ = %d', (l, tabled) => {
    // Table of SCIENCE.md §11 (SciPy quadrature, independent of this code), 2 significant digits.
    let worst = 0;
    for (let e = -60; e <= 60; e += 0.25) {
      worst = Math.max(worst, Math.abs(Math.expm1(logMhcClosedForm(l, e) - logMhcIntegral(l, e))));
    }
    expect(Math.abs(worst / tabled - 1)).toBeLessThan(0.03);
  });
});

describe('electrode.mhc method', () => {
  it('reproduces the enhancement ×18.8 at η = −0.2 V and ×84 at −1.5 V, λ = 0.3 eV (SCIENCE.md §11)', () => {
    const base = mhcRates({ lambdaEv: 0.3, overpotentialV: 0, temperatureK: 298.15, prefactor: 1 });
    const at = (v: number) =>
      mhcRates({ lambdaEv: 0.3, overpotentialV: v, temperatureK: 298.15, prefactor: 1 })
        .kRedIntegral / base.kRedIntegral;
    expect(at(-0.2)).toBeCloseTo(18.8, 1);
    expect(at(-1.5)).toBeCloseTo(84, 0);
  });

  it('scales every rate by the prefactor and reports kRed/kOx = e^(−eη/k_BT)', () => {
    const one = mhcRates({
      lambdaEv: 0.4,
      overpotentialV: 0.05,
      temperatureK: 298.15,
      prefactor: 1,
    });
    const big = mhcRates({
      lambdaEv: 0.4,
      overpotentialV: 0.05,
      temperatureK: 298.15,
      prefactor: 1e6,
    });
    expect(big.kRedIntegral / one.kRedIntegral).toBeCloseTo(1e6, 3);
    expect(Math.log(one.kRedIntegral / one.kOxIntegral)).toBeCloseTo(-0.05 / KT_298, 10);
    expect(one.kRedRelativeDifference).toBeCloseTo(one.kRed / one.kRedIntegral - 1, 12);
  });

  it('warns mhc-closed-form-inaccurate outside 8–16 k_BT only (B25)', () => {
    expect(
      warningsOf({ lambdaEv: 0.3, overpotentialV: 0, temperatureK: 298.15, prefactor: 1 }),
    ).toEqual([]);
    expect(
      warningsOf({ lambdaEv: 1.0, overpotentialV: 0, temperatureK: 298.15, prefactor: 1 }),
    ).toEqual(['mhc-closed-form-inaccurate']);
    expect(
      warningsOf({ lambdaEv: 0.1, overpotentialV: 0, temperatureK: 298.15, prefactor: 1 }),
    ).toEqual(['mhc-closed-form-inaccurate']);
  });

  it('warns mhc-far-from-butler-volmer when |eη| > λ (B26)', () => {
    expect(
      warningsOf({ lambdaEv: 0.3, overpotentialV: -0.31, temperatureK: 298.15, prefactor: 1 }),
    ).toEqual(['mhc-far-from-butler-volmer']);
  });

  it('softplus is stable at both ends', () => {
    expect(softplus(800)).toBe(800);
    expect(softplus(-800)).toBe(0);
    expect(softplus(0)).toBeCloseTo(Math.LN2, 15);
  });
});

describe('electrode.mhc through the dispatcher', () => {
  it('computes with units and echoes finite outputs', () => {
    const answer = computeOk('electrode.mhc', {
      lambda: { value: 0.3, unit: 'eV' },
      overpotential: { value: -200, unit: 'mV' },
      temperature: 298.15,
    });
    const base = computeOk('electrode.mhc', { lambda: 0.3, overpotential: 0, temperature: 298.15 });
    expect(numberOutput(answer, 'kRedIntegral') / numberOutput(base, 'kRedIntegral')).toBeCloseTo(
      18.8,
      1,
    );
  });

  it('refuses λ ≤ 0 and a non-finite overpotential (A25)', () => {
    const errors = computeRefused('electrode.mhc', {
      lambda: 0,
      overpotential: 'inf',
      temperature: 298.15,
    });
    expect(errors.map((e) => e.field).sort()).toEqual(['lambda', 'overpotential']);
    expect(errors.find((e) => e.field === 'lambda')?.message).toBe(
      'λ must be > 0; overpotential must be finite.',
    );
  });

  it('gives finite outputs for any valid input (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 5, noNaN: true }),
        fc.double({ min: -10, max: 10, noNaN: true }),
        fc.double({ min: 10, max: 2000, noNaN: true }),
        (lambda, overpotential, temperature) => {
          const answer = calculate({
            method: 'electrode.mhc',
            inputs: { lambda, overpotential, temperature },
          });
          return answer.ok;
        },
      ),
      { numRuns: 200 },
    );
  });
});
