import { calculate } from './calculate';

import { describe, expect, it } from 'vitest';
import { FIT_MAX_POINTS } from '../fit/driving-force-series/driving-force-series';
import { MLJ_TERMS_LIMIT, mljRateLog, mljTermsEstimate } from '../rates/mlj/mlj';

/**
 * Work limits of the core: a request that would need more work than a limit is refused up front
 * with the field named (a refusal, never a silent cap), so no server thread is kept busy by it.
 */
type Answer = ReturnType<typeof calculate>;

function errorsOf(answer: Answer): { field: string; message: string }[] {
  expect(answer.ok).toBe(false);
  return (answer as { errors: { field: string; message: string }[] }).errors;
}

const mlj = (lambdaVib: number, hbarOmega: number) => ({
  method: 'rate.mlj',
  inputs: {
    deltaG0: -0.5,
    lambdaSolvent: 0.3,
    lambdaVib,
    hbarOmega,
    coupling: 0.01,
    temperature: 298.15,
  },
});

describe('MLJ terms', () => {
  it('refuses ħω = 1e-12 eV with λ_v = 1000 eV (S = 1e15) naming hbarOmega', () => {
    const errors = errorsOf(calculate(mlj(1000, 1e-12)));
    const error = errors.find((e) => e.field === 'hbarOmega');
    expect(error?.message).toMatch(/vibronic terms/);
    expect(error?.message).toMatch(/S = λ_v\/ħω = 1\.00e\+15/);
    expect(error?.message).toMatch(/larger ħω/);
  });

  it('refuses S = 1e5 (the sum needs more than the limit) and accepts S = 5e4', () => {
    expect(errorsOf(calculate(mlj(1, 1e-5))).map((e) => e.field)).toContain('hbarOmega');
    const accepted = calculate(mlj(0.5, 1e-5));
    expect(accepted.ok).toBe(true);
    const terms = (accepted as unknown as { outputs: { termsUsed: number } }).outputs.termsUsed;
    expect(terms).toBeLessThanOrEqual(MLJ_TERMS_LIMIT);
  });

  it('estimates at least the terms the sum really uses', () => {
    for (const [dG, lamS, lamV, hw] of [
      [-0.5, 0.3, 1, 1e-5],
      [-0.5, 0.3, 0.5, 1e-5],
      [-2, 0.1, 0.3, 0.01],
      [0.2, 0.5, 0.25, 0.18],
    ]) {
      const used = mljRateLog(dG, lamS, lamV, hw, 0.01, 298.15, 10 * MLJ_TERMS_LIMIT).termsUsed;
      expect(mljTermsEstimate(dG, lamS, lamV, hw)).toBeGreaterThanOrEqual(used);
    }
  });
});

describe('driving-force fits', () => {
  const points = [-0.2, -0.5, -0.8, -1.1].map((deltaG0, i) => ({ deltaG0, k: 10 ** (8 + i) }));

  it('refuses an MLJ fit with ħω = 1e-12 eV and λ_v = 1000 eV on 4 points, naming hbarOmega', () => {
    const errors = errorsOf(
      calculate({
        method: 'fit.drivingForceSeries',
        inputs: { points, temperature: 298.15, model: 'mlj', hbarOmega: 1e-12, lambdaVib: 1000 },
      }),
    );
    expect(errors.find((e) => e.field === 'hbarOmega')?.message).toMatch(/vibronic terms/);
  });

  it(`refuses more than ${FIT_MAX_POINTS} points, naming points`, () => {
    const many = Array.from({ length: FIT_MAX_POINTS + 1 }, (_, i) => ({
      deltaG0: -i / FIT_MAX_POINTS,
      k: 1e9,
    }));
    const errors = errorsOf(
      calculate({
        method: 'fit.drivingForceSeries',
        inputs: { points: many, temperature: 298.15 },
      }),
    );
    expect(errors.find((e) => e.field === 'points')?.message).toMatch(/at most 10,000 points/);
  });
});

describe('Monte Carlo', () => {
  it('refuses samples × MLJ terms beyond the work limit, naming samples', () => {
    // S = 5e4: each sample sums about 5e4 terms; 10 000 samples are 5e8 terms.
    const errors = errorsOf(
      calculate({
        method: 'uncertainty.monteCarlo',
        inputs: {
          method: 'rate.mlj',
          inputs: { ...mlj(0.5, 1e-5).inputs, deltaG0: { value: -0.5, sigma: 0.05 } },
          samples: 10_000,
          seed: 1,
        },
      }),
    );
    const error = errors.find((e) => e.field === 'samples');
    expect(error?.message).toMatch(/exceed the work limit/);
    expect(error?.message).toMatch(/use at most \d[\d,]* samples/);
  });
});
