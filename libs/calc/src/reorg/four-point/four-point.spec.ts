import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  warningCodes,
} from '../../methods/testing/answers';

/**
 * Independent model: one harmonic mode, E_N(q) = ½kq², E_C(q) = ½k(q − Δ)² + E₀, with the neutral
 * minimum at q = 0 and the charged one at q = Δ. Then λ₁ = λ₂ = ½kΔ² exactly (Nelsen 1987).
 */
function harmonicFourPoint(forceConstant: number, displacement: number, offset: number) {
  const neutral = (q: number) => 0.5 * forceConstant * q * q;
  const charged = (q: number) => 0.5 * forceConstant * (q - displacement) ** 2 + offset;
  return {
    initialAtInitial: neutral(0),
    initialAtFinal: neutral(displacement),
    finalAtFinal: charged(displacement),
    finalAtInitial: charged(0),
  };
}

describe('reorg.fourPoint', () => {
  it('returns λ₁ = λ₂ = ½kΔ² for a harmonic mode (exact)', () => {
    const answer = computeOk('reorg.fourPoint', harmonicFourPoint(8, 0.15, 6.2));
    const half = 0.5 * 8 * 0.15 * 0.15;
    expect(numberOutput(answer, 'lambdaInitial')).toBeCloseTo(half, 12);
    expect(numberOutput(answer, 'lambdaFinal')).toBeCloseTo(half, 12);
    expect(numberOutput(answer, 'lambdaInner')).toBeCloseTo(2 * half, 12);
  });

  it('takes hartree totals near −500 E_h without losing the difference (SCIENCE.md §6)', () => {
    // 1 E_h = 27.211386245988 eV (CODATA 2018, SCIENCE.md §6). Differences of 1.0e-3 and 1.2e-3 E_h.
    const hartree = (value: number) => ({ value, unit: 'hartree' });
    const answer = computeOk('reorg.fourPoint', {
      initialAtInitial: hartree(-500.123456),
      initialAtFinal: hartree(-500.122456),
      finalAtFinal: hartree(-499.901234),
      finalAtInitial: hartree(-499.900034),
    });
    expect(numberOutput(answer, 'lambdaInitial')).toBeCloseTo(1.0e-3 * 27.211386245988, 9);
    expect(numberOutput(answer, 'lambdaFinal')).toBeCloseTo(1.2e-3 * 27.211386245988, 9);
  });

  it('warns when a partial λ is negative', () => {
    const answer = computeOk('reorg.fourPoint', {
      initialAtInitial: 0,
      initialAtFinal: -0.1,
      finalAtFinal: 1,
      finalAtInitial: 1.2,
    });
    expect(warningCodes(answer)).toContain('four-point-negative');
  });

  it('refuses a missing energy or mixed units (A28)', () => {
    const message = 'Provide all four energies in one unit.';
    expect(
      computeRefused('reorg.fourPoint', {
        initialAtInitial: 0,
        initialAtFinal: 0.1,
        finalAtFinal: 1,
      }),
    ).toEqual([{ field: 'finalAtInitial', message }]);
    expect(
      computeRefused('reorg.fourPoint', {
        initialAtInitial: 0,
        initialAtFinal: 0.1,
        finalAtFinal: { value: 1, unit: 'kcal/mol' },
        finalAtInitial: 1.2,
      }),
    ).toEqual([{ field: 'finalAtFinal', message }]);
  });
});
