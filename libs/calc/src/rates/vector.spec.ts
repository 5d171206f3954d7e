import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { marcusRateLog } from './marcus/marcus';
import { mljRateLog } from './mlj/mlj';
import { marcusLog10kInto, mljLog10kInto } from './vector';

const driving = (values: number[]) => Float64Array.from(values);

describe('vector paths', () => {
  it('marcusLog10kInto agrees with the scalar kernel and writes into the given array', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -5, max: 2, noNaN: true }), { minLength: 1, maxLength: 50 }),
        fc.double({ min: 0.05, max: 3, noNaN: true }),
        fc.double({ min: -0.02, max: 0.02, noNaN: true }).filter((h) => h !== 0),
        fc.double({ min: 100, max: 600, noNaN: true }),
        (dGs, lam, h, t) => {
          const out = new Float64Array(dGs.length);
          expect(marcusLog10kInto(out, driving(dGs), lam, h, t)).toBe(out);
          dGs.forEach((dG, i) => {
            const scalar = marcusRateLog(dG, lam, h, t) / Math.LN10;
            expect(Math.abs(out[i] - scalar)).toBeLessThanOrEqual(
              1e-12 * Math.max(1, Math.abs(scalar)),
            );
          });
        },
      ),
    );
  });

  it('mljLog10kInto agrees with the scalar kernel, term counts included', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -3, max: 1, noNaN: true }), { minLength: 1, maxLength: 20 }),
        fc.double({ min: 0.05, max: 1.5, noNaN: true }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        fc.double({ min: 0.05, max: 0.3, noNaN: true }),
        (dGs, lamS, lamV, hw) => {
          const out = new Float64Array(dGs.length);
          const terms = new Float64Array(dGs.length);
          mljLog10kInto(out, driving(dGs), lamS, lamV, hw, 0.01, 298.15, terms);
          dGs.forEach((dG, i) => {
            const scalar = mljRateLog(dG, lamS, lamV, hw, 0.01, 298.15);
            const log10 = scalar.lnK / Math.LN10;
            expect(Math.abs(out[i] - log10)).toBeLessThanOrEqual(
              1e-11 * Math.max(1, Math.abs(log10)),
            );
            expect(Math.abs(terms[i] - scalar.termsUsed)).toBeLessThanOrEqual(1);
          });
        },
      ),
    );
  });

  it('refuses an output array shorter than the input', () => {
    expect(() => marcusLog10kInto(new Float64Array(1), driving([0, 1]), 1, 0.01, 300)).toThrow(
      RangeError,
    );
  });
});
