import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  relativeError,
  warningCodes,
} from '../../methods/testing/answers';

// CODATA 2018 in SI (Tiesinga et al. 2021), independent of constants.ts.
const H_J_S = 6.62607015e-34;
const HBAR_J_S = 1.054571817e-34;
const KB_J_PER_K = 1.380649e-23;
const E_C = 1.602176634e-19;

/** Golden-rule Marcus rate in SI (SCIENCE.md §1), independent of the code. */
function marcusSi(dG: number, lam: number, h: number, t: number): number {
  const kT = KB_J_PER_K * t;
  const [g, l, c] = [dG * E_C, lam * E_C, h * E_C];
  return (
    ((2 * Math.PI) / HBAR_J_S) *
    c *
    c *
    (1 / Math.sqrt(4 * Math.PI * l * kT)) *
    Math.exp(-((g + l) ** 2) / (4 * l * kT))
  );
}

const base = { deltaG0: -0.3, lambda: 0.8, coupling: 0.01, temperature: 298.15 };

describe('rate.landauZener', () => {
  it('gives SCIENCE.md §3’s example: γ = 0.094, κ_el = 0.165, k = 0.876 × golden rule', () => {
    const answer = computeOk('rate.landauZener', { ...base, nuclearFrequency: 1e13 });
    expect(numberOutput(answer, 'gamma')).toBeCloseTo(0.094, 3);
    expect(numberOutput(answer, 'transmission')).toBeCloseTo(0.165, 3);
    const golden = marcusSi(-0.3, 0.8, 0.01, 298.15);
    expect(numberOutput(answer, 'k') / golden).toBeCloseTo(0.876, 3);
    // ν_el exp(−ΔG‡/k_BT) is the golden-rule rate exactly (SCIENCE.md §3).
    expect(relativeError(numberOutput(answer, 'kGoldenRule'), golden)).toBeLessThan(1e-9);
    expect(answer.outputs['adiabaticity']).toBe('nonadiabatic');
    expect(answer.outputs['couplingRegime']).toBe('nonadiabatic');
  });

  it('uses h, not ħ, in ν_el (independent SI computation)', () => {
    const answer = computeOk('rate.landauZener', base);
    const kT = KB_J_PER_K * 298.15;
    const nuEl = ((2 * (0.01 * E_C) ** 2) / H_J_S) * Math.sqrt(Math.PI ** 3 / (0.8 * E_C * kT));
    expect(relativeError(numberOutput(answer, 'electronicFrequency'), nuEl)).toBeLessThan(1e-9);
    expect(relativeError(numberOutput(answer, 'gamma'), nuEl / 2e13)).toBeLessThan(1e-9);
  });

  it('tends to the golden rule as γ → 0 (SCIENCE.md §3 limit)', () => {
    const answer = computeOk('rate.landauZener', { ...base, coupling: 1e-5 });
    expect(
      relativeError(numberOutput(answer, 'k'), marcusSi(-0.3, 0.8, 1e-5, 298.15)),
    ).toBeLessThan(1e-6);
  });

  it('tends to κ_el = 1, k = ν_n exp(−ΔG‡/k_BT), for γ ≫ 1, with the warning (SCIENCE.md §3)', () => {
    const answer = computeOk('rate.landauZener', {
      ...base,
      coupling: 0.3,
      nuclearFrequency: 1e12,
    });
    expect(numberOutput(answer, 'transmission')).toBeCloseTo(1, 10);
    const kT = KB_J_PER_K * 298.15;
    const tst = 1e12 * Math.exp(-((0.5 * E_C) ** 2 / (4 * 0.8 * E_C)) / kT);
    expect(relativeError(numberOutput(answer, 'k'), tst)).toBeLessThan(1e-9);
    expect(answer.outputs['adiabaticity']).toBe('adiabatic');
    expect(warningCodes(answer)).toContain('coupling-large');
  });

  it('refuses class III, λ ≤ 0 and ν_n ≤ 0, naming the field (A1, A5, A12)', () => {
    const fields = (inputs: object) =>
      computeRefused('rate.landauZener', { ...base, ...inputs }).map((e) => e.field);
    expect(fields({ coupling: 0.4 })).toContain('coupling');
    expect(fields({ lambda: 0 })).toContain('lambda');
    expect(fields({ nuclearFrequency: 0 })).toContain('nuclearFrequency');
    expect(fields({ nuclearFrequency: 1e30 })).toContain('nuclearFrequency');
  });

  it('gives k = 0 for H = 0 with a note', () => {
    const answer = computeOk('rate.landauZener', { ...base, coupling: 0 });
    expect(answer.outputs['k']).toBe(0);
    expect(answer.outputs['log10k']).toBeNull();
    expect(warningCodes(answer)).toContain('coupling-zero');
  });
});
