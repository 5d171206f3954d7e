import { describe, expect, it } from 'vitest';
import { computeOk, computeRefused, numberOutput } from '../../methods/testing/answers';

describe('coupling.distanceDecay', () => {
  it('halves H at R − R₀ = 2 ln2/β (exact, H ∝ e^(−βR/2))', () => {
    const beta = 1.1;
    const answer = computeOk('coupling.distanceDecay', {
      coupling0: -0.02,
      distance0: 4,
      beta,
      distance: 4 + (2 * Math.LN2) / beta,
    });
    expect(numberOutput(answer, 'coupling')).toBeCloseTo(-0.01, 14);
  });

  it('β = 1.38 Å⁻¹ is 0.6 decades of rate per Å (SCIENCE.md §8)', () => {
    const h = (distance: number) =>
      numberOutput(
        computeOk('coupling.distanceDecay', {
          coupling0: 0.01,
          distance0: 3.6,
          beta: 1.38,
          distance,
        }),
        'coupling',
      );
    expect(Math.log10((h(10) / h(11)) ** 2)).toBeCloseTo(0.6, 2);
  });

  it('refuses β < 0 and non-positive distances (A10)', () => {
    expect(
      computeRefused('coupling.distanceDecay', {
        coupling0: 0.01,
        distance0: 0,
        beta: -1,
        distance: 5,
      }),
    ).toEqual([
      { field: 'distance0', message: 'Radii and distances must be > 0.' },
      { field: 'beta', message: 'Decay constant β must be ≥ 0 Å⁻¹.' },
    ]);
  });
});
