import { describe, expect, it } from 'vitest';

import { computeRefused } from '../../methods/testing/answers';

import { CalcRefusal } from '../../core/method';
import { butlerVolmerMethod, butlerVolmerRates } from './butler-volmer';

const BASE = { k0: 1, alpha: 0.5, temperatureK: 298.15 };

describe('Butler–Volmer', () => {
  it('gives ×49 at η = −0.2 V, α = 0.5 and ×4.8e12 at −1.5 V, 298.15 K (SCIENCE.md §11)', () => {
    expect(butlerVolmerRates({ ...BASE, overpotentialV: -0.2 }).kRed).toBeCloseTo(49, 0);
    const far = butlerVolmerRates({ ...BASE, overpotentialV: -1.5 }).kRed;
    expect(far / 4.8e12).toBeCloseTo(1, 1);
  });

  it('returns k⁰ for both directions at η = 0 and kRed/kOx = e^(−eη/k_BT) (exact)', () => {
    const zero = butlerVolmerRates({ ...BASE, k0: 3.3, alpha: 0.37, overpotentialV: 0 });
    expect(zero.kRed).toBe(3.3);
    expect(zero.kOx).toBe(3.3);
    const kT = 8.617333262e-5 * 298.15;
    const r = butlerVolmerRates({ ...BASE, alpha: 0.37, overpotentialV: 0.08 });
    expect(Math.log(r.kRed / r.kOx)).toBeCloseTo(-0.08 / kT, 12);
  });

  it('keeps an exact log10 where the rate underflows', () => {
    const r = butlerVolmerRates({ ...BASE, alpha: 1, overpotentialV: 50 });
    expect(r.kRed).toBe(0);
    expect(r.log10kRed).toBeCloseTo(-50 / (8.617333262e-5 * 298.15) / Math.LN10, 9);
  });

  it('refuses an overpotential whose rate would overflow', () => {
    expect(() =>
      butlerVolmerMethod.compute({ ...BASE, alpha: 0.5, overpotentialV: -50 }, { warn: () => {} }),
    ).toThrow(CalcRefusal);
  });
});

describe('electrode.butlerVolmer through the dispatcher', () => {
  it('refuses α outside [0, 1] and k⁰ ≤ 0', () => {
    const errors = computeRefused('electrode.butlerVolmer', {
      k0: 0,
      alpha: 1.5,
      overpotential: 0.1,
      temperature: 298.15,
    });
    expect(errors.map((e) => e.field).sort()).toEqual(['alpha', 'k0']);
  });
});
