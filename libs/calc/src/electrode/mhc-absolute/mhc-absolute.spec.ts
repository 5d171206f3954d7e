import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeOk, computeRefused, numberOutput } from '../../methods/testing/answers';

const KB = 8.617333262e-5;
const T = 298.15;
const KT = KB * T;
const base = {
  lambda: 0.3,
  overpotential: -0.1,
  temperature: T,
  coupling: 0.001,
  densityOfStates: 0.3,
};

describe('electrode.mhcAbsolute', () => {
  it('k⁰ at λ = 10 k_BT uses I(10, 0) = 0.2155837199 (SCIENCE.md §11, mpmath to 30 digits)', () => {
    const answer = computeOk('electrode.mhcAbsolute', {
      ...base,
      lambda: 10 * KT,
      overpotential: 0,
    });
    const expected = evaluate(
      '(2 pi / 6.582119569e-16) * H^2 * rho * kt / sqrt(4 pi * 10 kt * kt) * 0.2155837199',
      { H: 0.001, rho: 0.3, kt: KT },
    ) as number;
    expect(numberOutput(answer, 'k0') / expected).toBeCloseTo(1, 9);
    expect(numberOutput(answer, 'kRed')).toBeCloseTo(numberOutput(answer, 'kOx'), 6);
    // The stated conversion: k⁰ (cm s⁻¹) = k⁰ (s⁻¹) × δr, 1 Å = 1e-8 cm by default.
    expect(numberOutput(answer, 'k0CmPerS')).toBeCloseTo(numberOutput(answer, 'k0') * 1e-8, 12);
    expect(answer.outputs['conversion']).toContain('δr');
    const thicker = computeOk('electrode.mhcAbsolute', {
      ...base,
      reactionLayer: { value: 0.2, unit: 'nm' },
    });
    expect(numberOutput(thicker, 'k0CmPerS') / numberOutput(thicker, 'k0')).toBeCloseTo(2e-8, 20);
  });

  it('keeps detailed balance k_red/k_ox = exp(−eη/k_BT) at every η (exact)', () => {
    for (const eta of [-0.4, -0.1, 0.05, 0.25]) {
      const answer = computeOk('electrode.mhcAbsolute', { ...base, overpotential: eta });
      const ratio = numberOutput(answer, 'kRed') / numberOutput(answer, 'kOx');
      expect(ratio / Math.exp(-eta / KT)).toBeCloseTo(1, 9);
    }
  });

  it('saturates at (2π/ħ)|H|²ρ_M for η → −∞ (I → 2√(πλ̃), exact limit) with no Tafel growth', () => {
    const answer = computeOk('electrode.mhcAbsolute', { ...base, overpotential: -3 });
    const limit = evaluate('(2 pi / 6.582119569e-16) * 0.001^2 * 0.3') as number;
    expect(numberOutput(answer, 'kRed') / limit).toBeCloseTo(1, 6);
    const slope = answer.outputs['tafelSlope'];
    expect(slope === null || (slope as number) > 1e6).toBe(true);
    expect(answer.warnings.map((w) => w.code)).toContain('mhc-far-from-butler-volmer');
  });

  it('gives the Tafel slope 2 ln10 k_BT/e at η = 0 for any λ (α = ½ by detailed balance)', () => {
    const expected = 2 * Math.LN10 * KT * 1000; // ≈ 118.3 mV/decade at 298.15 K
    for (const lambda of [0.2, 0.8]) {
      const answer = computeOk('electrode.mhcAbsolute', { ...base, lambda, overpotential: 0 });
      expect(numberOutput(answer, 'tafelSlope')).toBeCloseTo(expected, 4);
    }
    // Away from η = 0 the cathodic slope grows (α drifts below ½, SCIENCE.md §11).
    const cathodic = computeOk('electrode.mhcAbsolute', { ...base, overpotential: -0.2 });
    expect(numberOutput(cathodic, 'tafelSlope')).toBeGreaterThan(expected);
  });

  it('notes H = 0 (k = 0) and H < 0 (|H| used)', () => {
    const zero = computeOk('electrode.mhcAbsolute', { ...base, coupling: 0 });
    expect(numberOutput(zero, 'kRed')).toBe(0);
    expect(zero.warnings.map((w) => w.code)).toContain('coupling-zero');
    const negative = computeOk('electrode.mhcAbsolute', { ...base, coupling: -0.001 });
    expect(negative.warnings.map((w) => w.code)).toContain('coupling-negative');
    expect(numberOutput(negative, 'kRed')).toBe(
      numberOutput(computeOk('electrode.mhcAbsolute', base), 'kRed'),
    );
  });

  it('refuses bad inputs naming the field', () => {
    const fields = (inputs: unknown) =>
      computeRefused('electrode.mhcAbsolute', inputs).map((e) => e.field);
    expect(fields({ ...base, lambda: 0 })).toContain('lambda');
    expect(fields({ ...base, densityOfStates: 0 })).toContain('densityOfStates');
    expect(fields({ ...base, reactionLayer: -1 })).toContain('reactionLayer');
    expect(fields({ ...base, temperature: 0 })).toContain('temperature');
    expect(fields({ ...base, overpotential: 'x' })).toContain('overpotential');
    expect(
      fields({ ...base, overpotential: { value: 0.1, unit: 'V', reference: 'SCE' } }),
    ).toContain('overpotential');
  });
});
