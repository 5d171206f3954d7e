import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  relativeError,
  warningCodes,
} from '../../methods/testing/answers';

// Faraday and gas constants (exact in the 2019 SI; CODATA 2018) for K12 = exp(FΔE/RT).
const FARADAY = 96485.33212;
const GAS_R = 8.314462618;
const KB_EV = 8.617333262e-5;

describe('rate.crossRelation', () => {
  it('is exact against Marcus rates with λ12 = (λ11 + λ22)/2 and a common Z (Marcus 1963)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.4, max: 2, noNaN: true }),
        fc.double({ min: 0.4, max: 2, noNaN: true }),
        fc.double({ min: -0.3, max: 0.3, noNaN: true }),
        (l11, l22, dG) => {
          // Independent model: k = Z exp(−(ΔG° + λ)²/(4λk_BT)) for each reaction.
          const z = 1e11;
          const kT = KB_EV * 298.15;
          const rate = (lam: number, g: number) => z * Math.exp(-((g + lam) ** 2) / (4 * lam * kT));
          const l12 = (l11 + l22) / 2;
          const answer = computeOk('rate.crossRelation', {
            k11: rate(l11, 0),
            k22: rate(l22, 0),
            K12: Math.exp(-dG / kT),
          });
          expect(relativeError(numberOutput(answer, 'k12'), rate(l12, dG))).toBeLessThan(1e-9);
        },
      ),
    );
  });

  it('converts ΔE to K12 = exp(FΔE/RT) (one electron; Nernst slope 59.16 mV per decade)', () => {
    const answer = computeOk('rate.crossRelation', {
      k11: 1e3,
      k22: 1e5,
      deltaE: 0.2,
      temperature: 298.15,
    });
    const expectedK = Math.exp((FARADAY * 0.2) / (GAS_R * 298.15));
    expect(relativeError(numberOutput(answer, 'K12'), expectedK)).toBeLessThan(1e-9);
    expect(numberOutput(answer, 'K12')).toBeCloseTo(10 ** (0.2 / 0.0591597), -1);
    const mv = computeOk('rate.crossRelation', {
      k11: 1e3,
      k22: 1e5,
      deltaE: { value: 200, unit: 'mV' },
      temperature: 298.15,
    });
    expect(relativeError(numberOutput(mv, 'k12'), numberOutput(answer, 'k12'))).toBeLessThan(1e-12);
  });

  it('has f12 = 1 and k12 = √(k11k22) for K12 = 1 (exact)', () => {
    const answer = computeOk('rate.crossRelation', { k11: 4e2, k22: 9e4, K12: 1 });
    expect(numberOutput(answer, 'f12')).toBe(1);
    expect(numberOutput(answer, 'k12')).toBeCloseTo(6000, 8);
  });

  it('warns when strongly asymmetric (B24)', () => {
    const answer = computeOk('rate.crossRelation', { k11: 1e8, k22: 1e8, K12: 1e14 });
    expect(warningCodes(answer)).toContain('cross-relation-asymmetric');
  });

  it('refuses non-positive k or K12 and k11k22 ≥ Z² (A14); needs exactly one of K12, deltaE', () => {
    const message = 'Self-exchange rates must be positive and below the collision limit Z.';
    expect(computeRefused('rate.crossRelation', { k11: 0, k22: 1, K12: -1 })).toEqual([
      { field: 'k11', message },
      { field: 'K12', message },
    ]);
    expect(computeRefused('rate.crossRelation', { k11: 1e11, k22: 1e11, K12: 2 })).toEqual([
      { field: 'k11', message },
    ]);
    expect(computeRefused('rate.crossRelation', { k11: 1, k22: 1 })[0].field).toBe('K12');
    expect(
      computeRefused('rate.crossRelation', {
        k11: 1,
        k22: 1,
        K12: 1,
        deltaE: 0.1,
        temperature: 298,
      })[0].field,
    ).toBe('deltaE');
    expect(computeRefused('rate.crossRelation', { k11: 1, k22: 1, deltaE: 0.1 })[0].field).toBe(
      'temperature',
    );
  });
});
