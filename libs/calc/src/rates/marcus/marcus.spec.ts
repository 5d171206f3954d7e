import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  relativeError,
  warningCodes,
} from '../../methods/testing/answers';
import { marcusActivationEv, marcusRateLog } from './marcus';

// SI constants typed here from CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 2021, 93, 025010),
// independently of constants.ts: ħ in J s, k_B in J/K (exact), e in C (exact).
const HBAR_J_S = 1.054571817e-34;
const KB_J_PER_K = 1.380649e-23;
const E_C = 1.602176634e-19;

/** Independent reference: the Marcus rate evaluated in SI units (joules), not in eV. */
function marcusRateSi(
  deltaG0Ev: number,
  lambdaEv: number,
  couplingEv: number,
  temperatureK: number,
) {
  const [dG, lam, h] = [deltaG0Ev * E_C, lambdaEv * E_C, couplingEv * E_C];
  const kT = KB_J_PER_K * temperatureK;
  return (
    ((2 * Math.PI) / HBAR_J_S) *
    h *
    h *
    (1 / Math.sqrt(4 * Math.PI * lam * kT)) *
    Math.exp(-((dG + lam) ** 2) / (4 * lam * kT))
  );
}

const base = { deltaG0: -0.3, lambda: 0.8, coupling: 0.01, temperature: 298.15 };

describe('rate.marcus', () => {
  it('reproduces the worked example of SCIENCE.md §1 (independent SciPy computation)', () => {
    // SCIENCE.md §1: H = 0.010 eV, λ = 0.80 eV, ΔG° = −0.30 eV, 298.15 K → ΔG‡ = 0.078125 eV,
    // k = 8.978e10 s⁻¹.
    const answer = computeOk('rate.marcus', base);
    expect(relativeError(numberOutput(answer, 'k'), 8.978e10)).toBeLessThan(1e-3);
    expect(numberOutput(answer, 'activationFreeEnergy')).toBeCloseTo(0.078125, 12);
    expect(answer.outputs['regime']).toBe('normal');
    expect(answer.warnings).toEqual([]);
  });

  it('agrees with an independent SI-unit evaluation over many inputs', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1.5, max: 0.5, noNaN: true }),
        fc.double({ min: 0.1, max: 2, noNaN: true }),
        fc.double({ min: 1e-4, max: 0.04, noNaN: true }),
        fc.double({ min: 200, max: 400, noNaN: true }),
        (dG, lam, h, t) => {
          const expected = marcusRateSi(dG, lam, h, t);
          fc.pre(expected > 1e-250);
          const actual = Math.exp(marcusRateLog(dG, lam, h, t));
          // eV-unit k_B and ħ are CODATA values rounded to 10 digits (≈1e-10 relative); the
          // exponent (≤ ~600 here) amplifies that, so agree to 2e-7.
          expect(relativeError(actual, expected)).toBeLessThan(2e-7);
        },
      ),
    );
  });

  it('accepts typed units: 8.5 kcal/mol and 50 cm⁻¹ equal their eV values (CALC-API example)', () => {
    // 1 eV = 23.06054783 kcal/mol = 8065.543937 cm⁻¹ (CODATA 2018, SCIENCE.md §16).
    const typed = computeOk('rate.marcus', {
      deltaG0: -0.35,
      lambda: { value: 8.5, unit: 'kcal/mol' },
      coupling: { value: 50, unit: 'cm-1' },
      temperature: { value: 25, unit: 'degC' },
    });
    const expected = marcusRateSi(-0.35, 8.5 / 23.06054783, 50 / 8065.543937, 298.15);
    expect(relativeError(numberOutput(typed, 'k'), expected)).toBeLessThan(1e-9);
  });

  it('is activationless at −ΔG° = λ with k_max = (2π/ħ)H²(4πλk_BT)^−½ (Marcus 1956)', () => {
    const answer = computeOk('rate.marcus', { ...base, deltaG0: -0.8 });
    const kT = KB_J_PER_K * 298.15;
    const kMax =
      (((2 * Math.PI) / HBAR_J_S) * (0.01 * E_C) ** 2) / Math.sqrt(4 * Math.PI * 0.8 * E_C * kT);
    expect(relativeError(numberOutput(answer, 'k'), kMax)).toBeLessThan(1e-9);
    expect(answer.outputs['regime']).toBe('activationless');
    expect(numberOutput(answer, 'activationFreeEnergy')).toBe(0);
  });

  it('gives the Arrhenius slope E_a = ΔG‡ − k_BT/2 (SCIENCE.md §15, exact for T-independent λ)', () => {
    const t = 298.15;
    const dInvT = 1e-7;
    const slope =
      (marcusRateLog(-0.3, 0.8, 0.01, 1 / (1 / t + dInvT)) -
        marcusRateLog(-0.3, 0.8, 0.01, 1 / (1 / t - dInvT))) /
      (2 * dInvT);
    const kB = KB_J_PER_K / E_C;
    const activation = -kB * slope;
    expect(activation).toBeCloseTo(marcusActivationEv(-0.3, 0.8) - (kB * t) / 2, 6);
  });

  it('is a Gaussian in ΔG° centred at −λ: k(−λ + d) = k(−λ − d)', () => {
    const up = marcusRateLog(-0.8 + 0.25, 0.8, 0.01, 298.15);
    const down = marcusRateLog(-0.8 - 0.25, 0.8, 0.01, 298.15);
    expect(up).toBeCloseTo(down, 10);
  });

  it('classifies the regime by the CALC-API rule', () => {
    expect(computeOk('rate.marcus', { ...base, deltaG0: -0.805 }).outputs['regime']).toBe(
      'activationless',
    );
    expect(computeOk('rate.marcus', { ...base, deltaG0: -0.85 }).outputs['regime']).toBe(
      'inverted',
    );
    expect(computeOk('rate.marcus', { ...base, deltaG0: 0.2 }).outputs['regime']).toBe('normal');
  });

  it('keeps log10 k exact when k underflows, and warns rate-underflow (VALIDATION.md B2)', () => {
    const answer = computeOk('rate.marcus', { ...base, deltaG0: -30 });
    expect(numberOutput(answer, 'k')).toBe(0);
    // Independent: log10 of the SI formula written in logs by hand.
    const kT = KB_J_PER_K * 298.15;
    const lam = 0.8 * E_C;
    const ln =
      Math.log((2 * Math.PI) / HBAR_J_S) +
      2 * Math.log(0.01 * E_C) -
      0.5 * Math.log(4 * Math.PI * lam * kT) -
      (-30 * E_C + lam) ** 2 / (4 * lam * kT);
    expect(numberOutput(answer, 'log10k')).toBeCloseTo(ln / Math.LN10, 6);
    expect(warningCodes(answer)).toContain('rate-underflow');
    expect(warningCodes(answer)).toContain('inverted-region');
  });

  it('uses |H| for a negative coupling, with a note, and gives k = 0 for H = 0', () => {
    const negative = computeOk('rate.marcus', { ...base, coupling: -0.01 });
    expect(numberOutput(negative, 'k')).toBe(numberOutput(computeOk('rate.marcus', base), 'k'));
    expect(warningCodes(negative)).toContain('coupling-negative');
    const zero = computeOk('rate.marcus', { ...base, coupling: 0 });
    expect(zero.outputs['k']).toBe(0);
    expect(zero.outputs['log10k']).toBeNull();
    expect(warningCodes(zero)).toContain('coupling-zero');
  });

  it('warns in the inverted region (B1), for λ < k_BT (B3), |H| > k_BT (B4), |H| > λ/10 (B5)', () => {
    expect(warningCodes(computeOk('rate.marcus', { ...base, deltaG0: -1.2 }))).toContain(
      'inverted-region',
    );
    expect(
      warningCodes(computeOk('rate.marcus', { ...base, lambda: 0.02, deltaG0: 0, coupling: 1e-4 })),
    ).toContain('lambda-below-kt');
    // SCIENCE.md §3: the golden-rule value at H = 0.1 eV must carry the warning.
    const strong = computeOk('rate.marcus', { ...base, coupling: 0.1 });
    expect(warningCodes(strong)).toContain('coupling-large');
    expect(warningCodes(strong)).toContain('coupling-barrier-lowering');
    expect(warningCodes(computeOk('rate.marcus', base))).not.toContain('coupling-large');
  });

  it('warns on temperature (B8) and on suspicious magnitudes and units (B9, B10, B11)', () => {
    expect(warningCodes(computeOk('rate.marcus', { ...base, temperature: 77 }))).toContain(
      'temperature-range',
    );
    expect(warningCodes(computeOk('rate.marcus', { ...base, temperature: 600 }))).toContain(
      'temperature-range',
    );
    const kjAsEv = computeOk('rate.marcus', { ...base, lambda: 77, deltaG0: -30 });
    expect(warningCodes(kjAsEv)).toEqual(
      expect.arrayContaining(['value-unusually-large', 'energy-unit-suspect']),
    );
    const typedKj = computeOk('rate.marcus', { ...base, lambda: { value: 77, unit: 'kJ/mol' } });
    expect(warningCodes(typedKj)).not.toContain('energy-unit-suspect');
    const tinyCm1 = computeOk('rate.marcus', { ...base, coupling: { value: 0.005, unit: 'cm-1' } });
    expect(warningCodes(tinyCm1)).toContain('coupling-unit-suspect');
    const hugeEv = computeOk('rate.marcus', { ...base, lambda: 40, coupling: 12 });
    expect(warningCodes(hugeEv)).toContain('coupling-unit-suspect');
  });

  it('refuses λ ≤ 0 (A1), T ≤ 0 K (A2), non-numbers (A3), bad units (A4), 2|H| ≥ λ (A5)', () => {
    expect(computeRefused('rate.marcus', { ...base, lambda: 0 })).toEqual([
      { field: 'lambda', message: 'Reorganization energy must be a positive number.' },
    ]);
    expect(
      computeRefused('rate.marcus', { ...base, temperature: { value: -300, unit: 'degC' } }),
    ).toEqual([
      { field: 'temperature', message: 'Temperature must be > 0 K (absolute). Did you enter °C?' },
    ]);
    expect(computeRefused('rate.marcus', { ...base, deltaG0: '-0.3' })).toEqual([
      { field: 'deltaG0', message: 'Field deltaG0 is not a finite number.' },
    ]);
    expect(
      computeRefused('rate.marcus', { ...base, lambda: { value: 8.5, unit: 'kcal' } }),
    ).toEqual([
      {
        field: 'lambda',
        message:
          "Unrecognised unit 'kcal' for an energy; use one of eV, meV, kJ/mol, kcal/mol, cm-1, hartree.",
      },
    ]);
    expect(computeRefused('rate.marcus', { ...base, coupling: -0.4 })).toEqual([
      {
        field: 'coupling',
        message: 'Coupling too strong: delocalized (Robin–Day class III); no diabatic ET rate.',
      },
    ]);
  });

  it('lists every bad field at once', () => {
    const errors = computeRefused('rate.marcus', {
      deltaG0: Number.NaN,
      lambda: -1,
      temperature: 0,
    });
    expect(errors.map((e) => e.field)).toEqual(['deltaG0', 'lambda', 'coupling', 'temperature']);
  });

  it('gives finite outputs for any valid input (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -50, max: 50, noNaN: true }),
        fc.double({ min: 1e-3, max: 50, noNaN: true }),
        fc.double({ min: -0.999, max: 0.999, noNaN: true }),
        fc.double({ min: 1, max: 2000, noNaN: true }),
        (dG, lam, hFraction, t) => {
          const answer = computeOk('rate.marcus', {
            deltaG0: dG,
            lambda: lam,
            coupling: (hFraction * lam) / 2,
            temperature: t,
          });
          for (const value of Object.values(answer.outputs)) {
            if (typeof value === 'number') expect(Number.isFinite(value)).toBe(true);
          }
        },
      ),
    );
  });

  describe('one rule for regime and the inverted-region warning (CALC-API.md)', () => {
    it('never returns activationless together with inverted-region, nor inverted without it', () => {
      fc.assert(
        fc.property(
          fc.double({ min: 0.05, max: 2, noNaN: true }),
          fc.double({ min: -0.03, max: 0.03, noNaN: true }),
          (lambda, offset) => {
            const answer = computeOk('rate.marcus', {
              ...base,
              lambda,
              deltaG0: -lambda * (1 + offset),
            });
            const warned = warningCodes(answer).includes('inverted-region');
            expect(warned).toBe(answer.outputs['regime'] === 'inverted');
          },
        ),
        { numRuns: 300, seed: 13 },
      );
    });

    it('is activationless without a warning just inside the band (|ΔG° + λ| = 0.009 λ)', () => {
      const answer = computeOk('rate.marcus', { ...base, deltaG0: -0.8 * 1.009 });
      expect(answer.outputs['regime']).toBe('activationless');
      expect(warningCodes(answer)).not.toContain('inverted-region');
    });
  });

  describe('couplingRegime from the Landau–Zener γ with ν_n = 1e13 s⁻¹ (CALC-API.md)', () => {
    // γ = π^(3/2)H²/(hν_n(λk_BT)^½) (Newton & Sutin 1984, from memory), in SI here.
    const H_J_S = 6.62607015e-34;
    const gammaOf = (h: number, lam: number) =>
      (Math.PI ** 1.5 * (h * E_C) ** 2) /
      (H_J_S * 1e13 * Math.sqrt(lam * E_C * KB_J_PER_K * 298.15));

    it('is nonadiabatic for SCIENCE.md §3’s H = 0.01 eV, λ = 0.8 eV (γ = 0.094)', () => {
      expect(gammaOf(0.01, 0.8)).toBeCloseTo(0.094, 3);
      const answer = computeOk('rate.marcus', base);
      expect(answer.outputs['couplingRegime']).toBe('nonadiabatic');
      expect(warningCodes(answer)).not.toContain('coupling-large');
    });

    it('is adiabatic, with the warning, for H = 0.1 eV, λ = 0.5 eV (γ = 12, SCIENCE.md §3)', () => {
      expect(gammaOf(0.1, 0.5)).toBeCloseTo(11.9, 1);
      const answer = computeOk('rate.marcus', { ...base, lambda: 0.5, coupling: 0.1 });
      expect(answer.outputs['couplingRegime']).toBe('adiabatic');
      const warning = answer.warnings.find((w) => w.code === 'coupling-large');
      expect(warning?.message).toContain('γ');
    });

    it('is intermediate and warns between γ = 0.1 and 10 even when |H| < k_BT', () => {
      const h = 0.02; // γ ≈ 0.38, |H| < k_BT = 0.0257 eV
      expect(gammaOf(h, 0.8)).toBeGreaterThan(0.1);
      const answer = computeOk('rate.marcus', { ...base, coupling: h });
      expect(answer.outputs['couplingRegime']).toBe('intermediate');
      expect(warningCodes(answer)).toContain('coupling-large');
    });
  });
});
