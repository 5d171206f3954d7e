import { lgamma } from 'mathjs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { logGamma } from './log-gamma';

describe('logGamma', () => {
  it('equals ln n! summed directly for n = 0 … 170', () => {
    let lnFactorial = 0;
    for (let n = 0; n <= 170; n++) {
      if (n > 0) lnFactorial += Math.log(n);
      expect(Math.abs(logGamma(n + 1) - lnFactorial)).toBeLessThanOrEqual(
        1e-13 * Math.max(1, lnFactorial),
      );
    }
  });

  it('gives Γ(½) = √π and Γ(3/2) = √π/2 (exact)', () => {
    expect(logGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 14);
    expect(logGamma(1.5)).toBeCloseTo(0.5 * Math.log(Math.PI) - Math.LN2, 14);
  });

  it('agrees with mathjs lgamma (an independent implementation)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 1e6, noNaN: true }), (x) => {
        const expected = lgamma(x) as number;
        expect(Math.abs(logGamma(x) - expected)).toBeLessThanOrEqual(
          1e-11 * Math.max(1, Math.abs(expected)),
        );
      }),
    );
  });

  it('is NaN outside x > 0', () => {
    expect(logGamma(0)).toBeNaN();
    expect(logGamma(-1)).toBeNaN();
  });
});
