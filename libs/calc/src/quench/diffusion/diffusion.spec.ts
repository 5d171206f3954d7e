import { describe, expect, it } from 'vitest';

import { computeOk, computeRefused, numberOutput } from '../../methods/testing/answers';

import {
  debyeFactor,
  diffusionMethod,
  diffusionQuenching,
  encounterQuenchingRate,
  smoluchowskiRateM1S1,
} from './diffusion';

const NEUTRAL = { temperatureK: 298.15, chargeProduct: 0 };
const codes = (inputs: Parameters<typeof diffusionQuenching>[0]) => {
  const out: string[] = [];
  diffusionMethod.compute(inputs, { warn: (code) => out.push(code) });
  return out;
};

describe('quench.diffusion', () => {
  it('gives 7.43e9 M⁻¹ s⁻¹ for water at 0.890 mPa s (SCIENCE.md §13)', () => {
    expect(smoluchowskiRateM1S1(0.89e-3, 298.15) / 7.43e9).toBeCloseTo(1, 3);
  });

  it('gives 1.94e10 M⁻¹ s⁻¹ for acetonitrile at 0.341 mPa s (SCIENCE.md §13)', () => {
    expect(smoluchowskiRateM1S1(0.341e-3, 298.15) / 1.94e10).toBeCloseTo(1, 2);
  });

  it('gives the Debye factor 2.50 for a ±1 pair in acetonitrile (ε 35.94) at 7 Å (SCIENCE.md §13)', () => {
    expect(debyeFactor(-1, 35.94, 7, 298.15)).toBeCloseTo(2.5, 2);
    expect(debyeFactor(0, 35.94, 7, 298.15)).toBe(1);
    // δ/(e^δ − 1) at small δ is 1 − δ/2 + δ²/12 (Taylor series, exact).
    const delta = 1e-6;
    const tiny = debyeFactor(1, 14.3996454784 / (8.617333262e-5 * 298.15 * 7) / delta, 7, 298.15);
    expect(tiny).toBeCloseTo(1 - delta / 2, 12);
  });

  it('applies the encounter-complex scheme and its limits (exact algebra)', () => {
    expect(encounterQuenchingRate(1e10, 1e10, 1e10)).toBe(5e9);
    const out = diffusionQuenching({
      ...NEUTRAL,
      viscosityPaS: 0.89e-3,
      kEtPerS: 1e14,
      kMinusDiffusionPerS: 1e9,
    });
    expect(out.kq / out.kDiffusion).toBeCloseTo(1 / (1 + 1e-5), 12);
    expect(out.equilibriumConstant).toBeCloseTo(out.kDiffusion / 1e9, 6);
    expect(diffusionQuenching({ ...NEUTRAL, viscosityPaS: 0.89e-3 }).kq).toBe(
      smoluchowskiRateM1S1(0.89e-3, 298.15),
    );
  });

  it('warns kq-above-diffusion-limit when a measured k_q exceeds k_d (B33)', () => {
    expect(codes({ ...NEUTRAL, viscosityPaS: 0.89e-3, kqObserved: 5e9 })).toEqual([]);
    expect(codes({ ...NEUTRAL, viscosityPaS: 0.89e-3, kqObserved: 2e10 })).toEqual([
      'kq-above-diffusion-limit',
    ]);
  });

  it('notes quench-scheme-incomplete when only one of kET and kMinusDiffusion is given', () => {
    expect(codes({ ...NEUTRAL, viscosityPaS: 0.89e-3, kEtPerS: 1e12 })).toEqual([
      'quench-scheme-incomplete',
    ]);
  });
});

describe('quench.diffusion through the dispatcher', () => {
  it('converts cP to Pa s (0.89 cP water → 7.43e9 M⁻¹ s⁻¹, SCIENCE.md §13)', () => {
    const answer = computeOk('quench.diffusion', {
      viscosity: { value: 0.89, unit: 'cP' },
      temperature: { value: 25, unit: 'degC' },
    });
    expect(numberOutput(answer, 'kDiffusion') / 7.43e9).toBeCloseTo(1, 3);
  });

  it('refuses viscosity ≤ 0 (A12), and ε or R ≤ 0 for ions (A27)', () => {
    expect(computeRefused('quench.diffusion', { viscosity: 0, temperature: 298.15 })).toEqual([
      { field: 'viscosity', message: 'Must be > 0.' },
    ]);
    const errors = computeRefused('quench.diffusion', {
      viscosity: 3.41e-4,
      temperature: 298.15,
      chargeProduct: -1,
      epsilon: 0,
      distance: -7,
    });
    expect(errors.map((e) => e.field).sort()).toEqual(['distance', 'epsilon']);
  });
});
