import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { marcusRateLog } from './marcus/marcus';
import { mljRateLog } from './mlj/mlj';
import { marcusLog10kIntoArrays, mljLog10kIntoArrays } from './vector-arrays';

/** Expected values: the scalar kernels of this library, pair by pair (independent loop). */
const pairs = <T>(arb: fc.Arbitrary<T>) => fc.array(arb, { minLength: 1, maxLength: 40 });
const columns = <T extends object>(rows: T[], key: keyof T) =>
  Float64Array.from(rows, (r) => r[key] as number);

describe('vector paths with per-pair parameters', () => {
  it('marcusLog10kIntoArrays equals the scalar Marcus kernel for every pair', () => {
    fc.assert(
      fc.property(
        pairs(
          fc.record({
            dG: fc.double({ min: -4, max: 2, noNaN: true }),
            lam: fc.double({ min: 0.02, max: 3, noNaN: true }),
            h: fc.double({ min: -0.05, max: 0.05, noNaN: true }).filter((h) => h !== 0),
            t: fc.double({ min: 50, max: 800, noNaN: true }),
          }),
        ),
        (rows) => {
          const out = new Float64Array(rows.length);
          const got = marcusLog10kIntoArrays(
            out,
            columns(rows, 'dG'),
            columns(rows, 'lam'),
            columns(rows, 'h'),
            columns(rows, 't'),
          );
          expect(got).toBe(out);
          rows.forEach((r, i) => {
            const scalar = marcusRateLog(r.dG, r.lam, r.h, r.t) / Math.LN10;
            expect(Math.abs(out[i] - scalar)).toBeLessThanOrEqual(
              1e-12 * Math.max(1, Math.abs(scalar)),
            );
          });
        },
      ),
    );
  });

  it('marcusLog10kIntoArrays: −∞ for H = 0 and NaN for a missing input, without touching others', () => {
    const out = new Float64Array(3);
    marcusLog10kIntoArrays(
      out,
      [-0.3, -0.3, Number.NaN],
      [0.8, 0.8, 0.8],
      [0, 0.01, 0.01],
      [298, 298, 298],
    );
    expect(out[0]).toBe(Number.NEGATIVE_INFINITY);
    expect(Number.isFinite(out[1])).toBe(true);
    expect(out[2]).toBeNaN();
  });

  it('mljLog10kIntoArrays equals the scalar MLJ kernel for every pair, term counts included', () => {
    fc.assert(
      fc.property(
        pairs(
          fc.record({
            dG: fc.double({ min: -3, max: 1, noNaN: true }),
            lamS: fc.double({ min: 0.05, max: 1.5, noNaN: true }),
            lamV: fc.double({ min: 0, max: 2, noNaN: true }),
            hw: fc.double({ min: 0.05, max: 0.3, noNaN: true }),
            h: fc.double({ min: 1e-4, max: 0.03, noNaN: true }),
            t: fc.double({ min: 150, max: 500, noNaN: true }),
          }),
        ),
        (rows) => {
          const out = new Float64Array(rows.length);
          const terms = new Float64Array(rows.length);
          mljLog10kIntoArrays(
            out,
            columns(rows, 'dG'),
            columns(rows, 'lamS'),
            columns(rows, 'lamV'),
            columns(rows, 'hw'),
            columns(rows, 'h'),
            columns(rows, 't'),
            terms,
          );
          rows.forEach((r, i) => {
            const scalar = mljRateLog(r.dG, r.lamS, r.lamV, r.hw, r.h, r.t);
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

  it('mljLog10kIntoArrays gives NaN (not a runaway sum) where ħω or λ_s is missing', () => {
    const out = new Float64Array(2);
    const terms = new Float64Array(2);
    const started = performance.now();
    mljLog10kIntoArrays(
      out,
      [-0.5, -0.5],
      [0.6, Number.NaN],
      [0.2, 0.2],
      [Number.NaN, 0.18],
      [0.01, 0.01],
      [298, 298],
      terms,
    );
    expect(out[0]).toBeNaN();
    expect(out[1]).toBeNaN();
    expect([...terms]).toEqual([0, 0]);
    expect(performance.now() - started).toBeLessThan(50);
  });

  it('refuses arrays shorter than the driving forces', () => {
    expect(() =>
      marcusLog10kIntoArrays(new Float64Array(2), [0, 1], [1], [0.01, 0.01], [300, 300]),
    ).toThrow(RangeError);
    expect(() =>
      mljLog10kIntoArrays(
        new Float64Array(1),
        [0, 1],
        [1, 1],
        [0.1, 0.1],
        [0.2, 0.2],
        [0.01, 0.01],
        [300, 300],
      ),
    ).toThrow(RangeError);
  });
});
