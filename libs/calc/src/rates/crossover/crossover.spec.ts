import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  relativeError,
  warningCodes,
} from '../../methods/testing/answers';

// CODATA 2018 in SI (Tiesinga et al. 2021), independent of constants.ts.
const HBAR_J_S = 1.054571817e-34;
const KB_J_PER_K = 1.380649e-23;
const E_C = 1.602176634e-19;

const base = { deltaG0: -0.3, lambda: 0.8, coupling: 0.01, temperature: 298.15, tauL: 2e-13 };

/** SCIENCE.md §3 solvent-controlled limit τ_L⁻¹ (λ/(16πk_BT))^½ exp(−ΔG‡/k_BT), in SI units. */
function solventLimitSi(dG: number, lam: number, t: number, tauL: number): number {
  const kT = KB_J_PER_K * t;
  const activation = ((dG + lam) * E_C) ** 2 / (4 * lam * E_C);
  return (1 / tauL) * Math.sqrt((lam * E_C) / (16 * Math.PI * kT)) * Math.exp(-activation / kT);
}

describe('rate.crossover', () => {
  it('computes κ_A = 4π|H|²τ_L/(ħλ) (Zusman 1980) and k = k_NA/(1 + κ_A)', () => {
    const answer = computeOk('rate.crossover', base);
    const kappa = (4 * Math.PI * (0.01 * E_C) ** 2 * 2e-13) / (HBAR_J_S * 0.8 * E_C);
    expect(relativeError(numberOutput(answer, 'adiabaticity'), kappa)).toBeLessThan(1e-8);
    // k_NA is the SCIENCE.md §1 worked example, 8.978e10 s⁻¹ (independent SciPy computation).
    expect(relativeError(numberOutput(answer, 'kNonadiabatic'), 8.978e10)).toBeLessThan(1e-3);
    // κ from SI constants vs eV constants differ at ~1e-10 (rounded CODATA eV values).
    expect(
      relativeError(numberOutput(answer, 'k'), numberOutput(answer, 'kNonadiabatic') / (1 + kappa)),
    ).toBeLessThan(1e-8);
    expect(
      relativeError(numberOutput(answer, 'kAdiabatic'), solventLimitSi(-0.3, 0.8, 298.15, 2e-13)),
    ).toBeLessThan(1e-7);
  });

  it('tends to the nonadiabatic rate as τ_L → 0 (SCIENCE.md §3 limit)', () => {
    const answer = computeOk('rate.crossover', { ...base, tauL: 1e-18 });
    const marcus = computeOk('rate.marcus', {
      deltaG0: -0.3,
      lambda: 0.8,
      coupling: 0.01,
      temperature: 298.15,
    });
    expect(relativeError(numberOutput(answer, 'k'), numberOutput(marcus, 'k'))).toBeLessThan(1e-5);
  });

  it('tends to the solvent-controlled limit for κ_A ≫ 1, independent of H (SCIENCE.md §3)', () => {
    const strong = computeOk('rate.crossover', { ...base, coupling: 0.2, tauL: 1e-9 });
    expect(numberOutput(strong, 'adiabaticity')).toBeGreaterThan(1e5);
    expect(
      relativeError(numberOutput(strong, 'k'), numberOutput(strong, 'kAdiabatic')),
    ).toBeLessThan(1e-5);
    const stronger = computeOk('rate.crossover', { ...base, coupling: 0.3, tauL: 1e-9 });
    expect(relativeError(numberOutput(stronger, 'k'), numberOutput(strong, 'k'))).toBeLessThan(
      1e-5,
    );
  });

  it('accepts τ_L in ps and refuses τ_L ≤ 0 (VALIDATION.md A12)', () => {
    const ps = computeOk('rate.crossover', { ...base, tauL: { value: 0.2, unit: 'ps' } });
    expect(ps.outputs['k']).toBe(computeOk('rate.crossover', base).outputs['k']);
    expect(computeRefused('rate.crossover', { ...base, tauL: 0 })).toEqual([
      { field: 'tauL', message: 'Must be > 0.' },
    ]);
  });

  it('keeps the Marcus validity warnings and warns at κ_A = 29.8 (SCIENCE.md §3 tool rule)', () => {
    // |H| for κ_A = 29.8 from κ_A = 4π|H|²τ_L/(ħλ), in SI units independent of the code.
    const lambdaJ = 0.8 * E_C;
    const couplingEv = Math.sqrt((29.8 * HBAR_J_S * lambdaJ) / (4 * Math.PI * 2e-13)) / E_C;
    const answer = computeOk('rate.crossover', { ...base, coupling: couplingEv, deltaG0: -1.2 });
    expect(numberOutput(answer, 'adiabaticity')).toBeCloseTo(29.8, 6); // ħ rounding (CODATA digits)
    expect(warningCodes(answer)).toContain('inverted-region');
    expect(warningCodes(answer)).toContain('coupling-large');
    expect(answer.warnings.find((w) => w.code === 'coupling-large')!.message).toContain('κ_A');
    // κ_A > 10: adiabatic (CALC-API.md couplingRegime from κ_A when τ_L is known).
    expect(answer.outputs.couplingRegime).toBe('adiabatic');
  });

  it('classifies couplingRegime from κ_A: < 0.1 nonadiabatic, 0.1–10 intermediate', () => {
    const kappaOf = (h: number) => (4 * Math.PI * (h * E_C) ** 2 * 2e-13) / (HBAR_J_S * 0.8 * E_C);
    expect(kappaOf(0.001)).toBeLessThan(0.1);
    expect(computeOk('rate.crossover', { ...base, coupling: 0.001 }).outputs.couplingRegime).toBe(
      'nonadiabatic',
    );
    expect(kappaOf(0.01)).toBeGreaterThan(0.1);
    expect(kappaOf(0.01)).toBeLessThan(10);
    const mid = computeOk('rate.crossover', { ...base, coupling: 0.01 });
    expect(mid.outputs.couplingRegime).toBe('intermediate');
    expect(warningCodes(mid)).toContain('coupling-large');
  });
});
