import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  warningCodes,
} from '../../methods/testing/answers';

describe('rate.ruler', () => {
  it('reproduces the SCIENCE.md §9 examples (Moser et al. 1992, from memory)', () => {
    // R = 10 Å, ΔG° = −0.5 eV, λ = 0.7 eV → log10 k = 8.983.
    const example = computeOk('rate.ruler', { distance: 10, deltaG0: -0.5, lambda: 0.7 });
    expect(numberOutput(example, 'log10k')).toBeCloseTo(8.983, 3);
    expect(numberOutput(example, 'k')).toBeCloseTo(10 ** 8.982857, -3);
    // Contact distance 3.6 Å with −ΔG° = λ → 13.
    const contact = computeOk('rate.ruler', { distance: 3.6, deltaG0: -0.7, lambda: 0.7 });
    expect(numberOutput(contact, 'log10k')).toBeCloseTo(13, 12);
    expect(warningCodes(contact)).toEqual([]);
  });

  it('uses slope 1.2 − 0.8ρ; ρ = 0.75 equals the default 0.6 (Page et al. 1999, from memory)', () => {
    const plain = computeOk('rate.ruler', { distance: 15, deltaG0: -0.4, lambda: 0.9 });
    const packed = computeOk('rate.ruler', {
      distance: 15,
      deltaG0: -0.4,
      lambda: 0.9,
      packingDensity: 0.75,
    });
    expect(numberOutput(packed, 'log10k')).toBeCloseTo(numberOutput(plain, 'log10k'), 12);
    const loose = computeOk('rate.ruler', {
      distance: 13.6,
      deltaG0: -0.9,
      lambda: 0.9,
      packingDensity: 0,
    });
    // Activationless, 10 Å beyond contact at slope 1.2 → 13 − 12 = 1.
    expect(numberOutput(loose, 'log10k')).toBeCloseTo(1, 12);
  });

  it('uses the endergonic variant for ΔG° > 0 with a warning (B22; SCIENCE.md §9, from memory)', () => {
    const answer = computeOk('rate.ruler', { distance: 8, deltaG0: 0.1, lambda: 0.8 });
    // 13 − 0.6·4.4 − 3.1(−0.1 + 0.8)²/0.8 − 0.1/0.06, worked by hand.
    const expected = 13 - 0.6 * 4.4 - (3.1 * 0.7 * 0.7) / 0.8 - 0.1 / 0.06;
    expect(numberOutput(answer, 'log10k')).toBeCloseTo(expected, 12);
    expect(warningCodes(answer)).toContain('ruler-endergonic');
  });

  it('warns outside the calibrated 3.6–25 Å range (B23)', () => {
    expect(
      warningCodes(computeOk('rate.ruler', { distance: 30, deltaG0: -0.5, lambda: 0.7 })),
    ).toContain('ruler-range');
    expect(
      warningCodes(computeOk('rate.ruler', { distance: 2, deltaG0: -0.5, lambda: 0.7 })),
    ).toContain('ruler-range');
  });

  it('refuses R ≤ 0 (A10), λ ≤ 0 (A1) and ρ outside [0, 1]', () => {
    const errors = computeRefused('rate.ruler', {
      distance: 0,
      deltaG0: -0.5,
      lambda: 0,
      packingDensity: 2,
    });
    expect(errors).toEqual([
      { field: 'distance', message: 'Radii and distances must be > 0.' },
      { field: 'lambda', message: 'Reorganization energy must be a positive number.' },
      { field: 'packingDensity', message: 'Packing density must be between 0 and 1.' },
    ]);
  });
});
