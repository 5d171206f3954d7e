import { calculate } from '../../methods/calculate';

import { describe, expect, it } from 'vitest';

import { SeededSampler, summarise } from './monte-carlo';

const KT = 8.617333262e-5 * 298.15;
/** Standard normal 97.5 % point (exact to 16 digits; any normal table). */
const Z975 = 1.959963984540054;

function monteCarlo(
  inner: Record<string, unknown>,
  samples: number,
  seed: number,
  method = 'rate.marcus',
) {
  return calculate({
    method: 'uncertainty.monteCarlo',
    inputs: { method, inputs: inner, samples, seed },
  });
}

/** log10 of the Marcus rate written out from SCIENCE.md §1 (independent of the core). */
function marcusLog10(deltaG0: number, lambda: number, coupling: number): number {
  const lnK =
    Math.log((2 * Math.PI) / 6.582119569e-16) +
    2 * Math.log(coupling) -
    0.5 * Math.log(4 * Math.PI * lambda * KT) -
    (deltaG0 + lambda) ** 2 / (4 * lambda * KT);
  return lnK / Math.LN10;
}

describe('uncertainty.monteCarlo', () => {
  const inner = {
    deltaG0: { value: -0.3, sigma: 0.05 },
    lambda: 0.8,
    coupling: 0.01,
    temperature: 298.15,
  };

  it('reproduces a result exactly from the same seed, and differs for another seed', () => {
    const a = monteCarlo(inner, 500, 7);
    const b = monteCarlo(inner, 500, 7);
    const c = monteCarlo(inner, 500, 8);
    expect(a.ok).toBe(true);
    expect(JSON.stringify(b)).toBe(JSON.stringify(a));
    expect(JSON.stringify(c)).not.toBe(JSON.stringify(a));
  });

  it('matches the exact quantiles of log10 k when only ΔG° is uncertain', () => {
    // log10 k is quadratic in ΔG° and decreasing for ΔG° > −λ (all but ~1e-23 of the mass), so
    // its quantiles are the transformed quantiles of ΔG°: p025 ↔ ΔG° at 97.5 %, and so on.
    const answer = monteCarlo(inner, 20_000, 1);
    if (!answer.ok) throw new Error(JSON.stringify(answer.errors));
    const log10k = answer.outputs['log10k'] as { median: number; p025: number; p975: number };
    expect(log10k.median).toBeCloseTo(marcusLog10(-0.3, 0.8, 0.01), 1);
    expect(Math.abs(log10k.median - marcusLog10(-0.3, 0.8, 0.01))).toBeLessThan(0.012);
    // Sampling SE of a 2.5 % point at N = 2×10⁴ is ≈ 0.005 in log10 k: allow 5 SE.
    expect(Math.abs(log10k.p025 - marcusLog10(-0.3 + Z975 * 0.05, 0.8, 0.01))).toBeLessThan(0.025);
    expect(Math.abs(log10k.p975 - marcusLog10(-0.3 - Z975 * 0.05, 0.8, 0.01))).toBeLessThan(0.025);
    const histogram = (answer.outputs['histograms'] as Record<string, { counts: number[] }>)[
      'log10k'
    ];
    expect(histogram.counts.reduce((a, b) => a + b, 0)).toBe(20_000);
  });

  it('keeps uniform draws within their bounds and spreads them evenly', () => {
    const answer = monteCarlo(
      { value: { low: 1, high: 3 }, from: 'eV', to: 'eV' },
      4000,
      3,
      'units.convert',
    );
    if (!answer.ok) throw new Error(JSON.stringify(answer.errors));
    const value = answer.outputs['value'] as {
      min: number;
      max: number;
      p025: number;
      p975: number;
      median: number;
    };
    expect(value.min).toBeGreaterThanOrEqual(1);
    expect(value.max).toBeLessThan(3);
    // Exact quantiles of U(1, 3): 1.05, 2, 2.95; binomial SE of each ≈ 0.005–0.016.
    expect(value.p025).toBeCloseTo(1.05, 1);
    expect(value.median).toBeCloseTo(2, 1);
    expect(value.p975).toBeCloseTo(2.95, 1);
  });

  it('passes units through to dimensioned inputs (1 eV = 23.06054783 kcal/mol, CODATA 2018)', () => {
    const answer = monteCarlo(
      { ...inner, deltaG0: { value: -0.3 * 23.06054783, sigma: 0, unit: 'kcal/mol' } },
      20,
      1,
    );
    if (!answer.ok) throw new Error(JSON.stringify(answer.errors));
    const log10k = answer.outputs['log10k'] as { median: number };
    expect(log10k.median).toBeCloseTo(marcusLog10(-0.3, 0.8, 0.01), 8);
  });

  it('leaves out refused samples and counts them in a warning', () => {
    const answer = monteCarlo({ ...inner, lambda: { value: 0.06, sigma: 0.05 } }, 2000, 5);
    if (!answer.ok) throw new Error(JSON.stringify(answer.errors));
    const refused = answer.outputs['samplesRefused'] as number;
    // rate.marcus refuses λ ≤ 0 and 2|H| ≥ λ (A1, A5), i.e. λ ≤ 0.02 eV here:
    // P = Φ((0.02 − 0.06)/0.05) = Φ(−0.8) = 0.2119 (normal table), ≈ 424 ± 18 of 2000.
    expect(Math.abs(refused - 424)).toBeLessThan(60);
    expect(answer.outputs['samplesUsed']).toBe(2000 - refused);
    expect(answer.warnings.map((w) => w.code)).toContain('monte-carlo-samples-refused');
  });

  it('refuses a malformed distribution, itself as the method, and a refused nominal request', () => {
    const bad = monteCarlo({ ...inner, lambda: { value: 0.8, sigma: -1 } }, 100, 1);
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.errors[0].field).toBe('inputs.lambda');
    const self = monteCarlo(inner, 100, 1, 'uncertainty.monteCarlo');
    expect(self.ok).toBe(false);
    if (!self.ok) expect(self.errors[0].field).toBe('method');
    const nominal = monteCarlo({ ...inner, temperature: -5 }, 100, 1);
    expect(nominal.ok).toBe(false);
    if (!nominal.ok) expect(nominal.errors[0].field).toBe('inputs.temperature');
  });
});

describe('SeededSampler', () => {
  it('draws standard normals with mean 0 and sd 1 (Box–Muller)', () => {
    const sampler = new SeededSampler(42);
    const values = Float64Array.from({ length: 100_000 }, () => sampler.standardNormal());
    const s = summarise(values);
    expect(Math.abs(s.mean)).toBeLessThan(0.015);
    expect(s.sd).toBeCloseTo(1, 1);
    // Normal 97.5 % point (table): 1.95996; sampling SE at N = 1e5 ≈ 0.008.
    expect(Math.abs(s.p975 - Z975)).toBeLessThan(0.04);
  });
});
