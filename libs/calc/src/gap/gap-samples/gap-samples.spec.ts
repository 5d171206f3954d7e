import seedrandom from 'seedrandom';
import { describe, expect, it } from 'vitest';

import { computeOk, computeRefused, numberOutput } from '../../methods/testing/answers';

import { CalcRefusal } from '../../core/method';
import { analyseGapSamples, fitParabola } from './gap-samples';

const T = 298.15;
const KT = 8.617333262e-5 * T;

function normals(n: number, mean: number, sd: number, seed: string): Float64Array {
  const random = seedrandom(seed);
  return Float64Array.from(
    { length: n },
    () => mean + sd * Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random()),
  );
}

function run(reactant: Float64Array, product: Float64Array, bins?: number) {
  const codes: string[] = [];
  const outputs = analyseGapSamples(
    { reactant, product, temperatureK: T, bins },
    { warn: (code) => codes.push(code) },
  );
  return { outputs: outputs as Record<string, any>, codes };
}

function refusal(reactant: Float64Array, product: Float64Array): CalcRefusal {
  try {
    run(reactant, product);
  } catch (error) {
    if (error instanceof CalcRefusal) return error;
    throw error;
  }
  throw new Error('not refused');
}

/** Linear-response Gaussian samples: ⟨ΔE⟩_R = ΔG° + λ, ⟨ΔE⟩_P = ΔG° − λ, σ² = 2λk_BT (§7). */
function linearResponse(n: number, deltaG0: number, lambda: number, seed: string) {
  const sd = Math.sqrt(2 * lambda * KT);
  return {
    reactant: normals(n, deltaG0 + lambda, sd, `${seed}-R`),
    product: normals(n, deltaG0 - lambda, sd, `${seed}-P`),
  };
}

describe('reorg.gapSamples', () => {
  const { reactant, product } = linearResponse(20_000, -0.3, 0.8, 'gauss');
  const { outputs, codes } = run(reactant, product);

  it('gives λ from means = λ from variances within sampling error on Gaussian data', () => {
    expect(outputs.lambdaFromMeans).toBeCloseTo(0.8, 2);
    // Relative SE of a variance is √(2/(N − 1)) = 1 % at N = 2×10⁴: allow 4 SE.
    for (const v of [outputs.lambdaFromVarianceReactant, outputs.lambdaFromVarianceProduct]) {
      expect(Math.abs(v / outputs.lambdaFromMeans - 1)).toBeLessThan(0.04);
    }
    expect(outputs.deltaG0FromMeans).toBeCloseTo(-0.3, 2);
    expect(Math.abs(outputs.linearResponseRatio - 1)).toBeLessThan(0.03);
    expect(codes).not.toContain('gap-nonlinear-response');
    expect(codes).not.toContain('gap-non-gaussian');
  });

  it('recovers ΔG‡ = (ΔG° + λ)²/(4λ) = 0.078125 eV from the curves (SCIENCE.md §1 example)', () => {
    expect(Math.abs(outputs.activationFreeEnergy - 0.078125)).toBeLessThan(0.01);
    expect(outputs.activationFreeEnergySource).toBe('local-fit');
    // Within 4 of its own standard errors of the exact value.
    expect(Math.abs(outputs.activationFreeEnergy - 0.078125)).toBeLessThan(
      4 * outputs.activationFreeEnergyStandardError,
    );
    // Gaussian (cumulant) estimate k_BT⟨ΔE⟩_R²/(2σ_R²) beside it: exact for Gaussian data.
    expect(Math.abs(outputs.activationFreeEnergyCumulant - 0.078125)).toBeLessThan(0.005);
  });

  it('has a smaller spread from the local fit than from the one bin at ΔE = 0 (24 seeded sets)', () => {
    // Synthetic linear-response sets of SCIENCE.md §1's example (λ = 0.8, ΔG° = −0.3 eV,
    // N = 2×10⁴ per state, fixed seeds): ΔG‡ = 0.078125 eV exactly.
    const fit: number[] = [];
    const oneBin: number[] = [];
    const errors: number[] = [];
    const sd = Math.sqrt(2 * 0.8 * KT);
    for (let set = 0; set < 24; set++) {
      const o = run(
        normals(20_000, 0.5, sd, `spread-r-${set}`),
        normals(20_000, -1.1, sd, `spread-p-${set}`),
      ).outputs;
      fit.push(o.activationFreeEnergy);
      oneBin.push(o.activationFreeEnergyOneBin);
      errors.push(o.activationFreeEnergyStandardError);
    }
    const spread = (v: number[]) => {
      const m = v.reduce((a, b) => a + b, 0) / v.length;
      return Math.sqrt(v.reduce((a, b) => a + (b - m) ** 2, 0) / (v.length - 1));
    };
    const meanOf = (v: number[]) => v.reduce((a, b) => a + b, 0) / v.length;
    expect(spread(fit)).toBeLessThan(spread(oneBin));
    // Unbiased within 3 standard errors of the mean of 24 sets.
    expect(Math.abs(meanOf(fit) - 0.078125)).toBeLessThan((3 * spread(fit)) / Math.sqrt(24));
    // The reported standard error matches the observed spread within a factor 2.
    expect(meanOf(errors) / spread(fit)).toBeGreaterThan(0.5);
    expect(meanOf(errors) / spread(fit)).toBeLessThan(2);
  });

  it('fits parabolas with λ = 1/(4a) near 0.8 eV and minima at ΔG° ± λ', () => {
    expect(Math.abs(outputs.lambdaFromParabolaReactant / 0.8 - 1)).toBeLessThan(0.05);
    expect(Math.abs(outputs.lambdaFromParabolaProduct / 0.8 - 1)).toBeLessThan(0.05);
    expect(outputs.parabola.reactant.minimumX).toBeCloseTo(0.5, 1);
    expect(outputs.parabola.product.minimumX).toBeCloseTo(-1.1, 1);
  });

  it('satisfies G_P − G_R = x where both states populate a bin (exact relation, Tachiya 1989)', () => {
    // A small λ so that the two states overlap over many bins.
    const small = linearResponse(50_000, -0.05, 0.15, 'overlap');
    const check = run(small.reactant, small.product).outputs.linearFreeEnergyCheck;
    expect(check.overlapBins).toBeGreaterThan(10);
    expect(Math.abs(check.meanDeviation)).toBeLessThan(0.01);
    expect(check.rmsDeviation).toBeLessThan(0.03);
  });

  it('reports curves in eV with null only for unpopulated bins', () => {
    const curves = outputs.freeEnergyCurves;
    expect(curves.x.length).toBe(curves.reactant.length);
    expect(curves.x.length).toBe(curves.product.length);
    for (let i = 0; i < curves.x.length; i++) {
      expect(curves.reactant[i] !== null || curves.product[i] !== null).toBe(true);
    }
  });

  it('gives naive SE ≈ block SE for independent samples (statistical inefficiency ≈ 1)', () => {
    expect(outputs.naiveStandardErrors.meanReactant).toBeCloseTo(
      Math.sqrt(outputs.varianceReactant / 20_000),
      12,
    );
    expect(Math.abs(outputs.statisticalInefficiency.reactant - 1)).toBeLessThan(0.4);
    expect(outputs.standardErrors.lambdaFromMeans).toBeCloseTo(
      0.5 * Math.hypot(outputs.standardErrors.meanReactant, outputs.standardErrors.meanProduct),
      15,
    );
  });

  it('warns gap-nonlinear-response for λ_St = 0.80 with λ_var = 1.00 and 0.61 eV (B17, §7)', () => {
    const r = normals(20_000, 0.5, Math.sqrt(2 * 1.0 * KT), 'nl-R');
    const p = normals(20_000, -1.1, Math.sqrt(2 * 0.61 * KT), 'nl-P');
    expect(run(r, p).codes).toContain('gap-nonlinear-response');
  });

  it('warns gap-non-gaussian for skewed samples (B19)', () => {
    const random = seedrandom('skew');
    const skewed = Float64Array.from({ length: 5000 }, () => 0.5 - 0.2 * Math.log(1 - random()));
    expect(run(skewed, normals(5000, -1.1, 0.2, 'skew-P')).codes).toContain('gap-non-gaussian');
  });

  it('warns gap-error-bars-unreliable for a short, strongly correlated series (B18)', () => {
    const random = seedrandom('corr');
    const r = new Float64Array(400);
    let x = 0;
    for (let i = 0; i < r.length; i++) {
      x = 0.995 * x + 0.02 * (random() - 0.5);
      r[i] = 0.5 + x;
    }
    expect(run(r, normals(400, -1.1, 0.2, 'corr-P')).codes).toContain('gap-error-bars-unreliable');
  });

  it('warns gap-crossing-not-sampled and extrapolates ΔG‡ when ΔE = 0 is never seen (B20)', () => {
    const { outputs: far, codes: farCodes } = run(
      normals(5000, 3, 0.05, 'far-R'),
      normals(5000, 1, 0.05, 'far-P'),
    );
    expect(farCodes).toContain('gap-crossing-not-sampled');
    expect(far.activationFreeEnergySource).toBe('parabola-extrapolation');
  });

  it('warns gap-sparse-bins when fewer than 3 bins hold ≥ 10 samples (B21)', () => {
    const { codes: sparse } = run(normals(25, 0.5, 0.2, 's-R'), normals(25, -1.1, 0.2, 's-P'), 20);
    expect(sparse).toContain('gap-sparse-bins');
  });

  it('refuses swapped files: λ from means ≤ 0 (A24)', () => {
    expect(refusal(product, reactant).errors[0].message).toMatch(/Negative λ from means/);
  });

  it('refuses constant data (A20) and too few samples (A21)', () => {
    const constant = new Float64Array(100).fill(0.7);
    expect(refusal(constant, product).errors).toEqual([
      {
        field: 'reactantSamples',
        message: 'All values identical: cannot build histogram / variance-based λ.',
      },
    ]);
    expect(refusal(reactant, Float64Array.of(1)).errors[0].message).toMatch(/N = 1/);
    expect(refusal(reactant, product.subarray(0, 10)).errors[0].message).toMatch(
      /Too few samples for a histogram/,
    );
  });

  it('refuses an IQR of zero even with non-zero variance (A20/A22)', () => {
    const spiky = new Float64Array(100).fill(0.5);
    spiky[3] = 0.9;
    expect(refusal(spiky, product).errors[0].field).toBe('reactantSamples');
  });
});

describe('fitParabola', () => {
  it('recovers an exact parabola (exact algebra)', () => {
    const x = [-1, 0, 0.5, 2, 3];
    const g = x.map((v) => 2 * v * v - 3 * v + 1);
    const fit = fitParabola(x, g, [1, 2, 3, 4, 5]);
    expect(fit.a).toBeCloseTo(2, 10);
    expect(fit.b).toBeCloseTo(-3, 10);
    expect(fit.c).toBeCloseTo(1, 10);
    expect(fit.lambda).toBeCloseTo(0.125, 10);
  });
});

describe('reorg.gapSamples through the dispatcher', () => {
  it('refuses empty arrays (A17) and non-numeric or non-finite elements (A16, A18)', () => {
    const errors = computeRefused('reorg.gapSamples', {
      reactantSamples: [],
      productSamples: [0.1, 'abc', null, -0.2],
      temperature: T,
    });
    expect(errors).toContainEqual({ field: 'reactantSamples', message: 'No data rows found.' });
    expect(errors.map((e) => e.field)).toContain('productSamples[1]');
    expect(errors.map((e) => e.field)).toContain('productSamples[2]');
  });

  it('computes and returns JSON-safe outputs (null only in curve gaps)', () => {
    const { reactant, product } = linearResponse(5000, -0.3, 0.8, 'dispatch');
    const answer = computeOk('reorg.gapSamples', {
      reactantSamples: Array.from(reactant),
      productSamples: Array.from(product),
      temperature: T,
    });
    expect(numberOutput(answer, 'lambdaFromMeans')).toBeCloseTo(0.8, 1);
    expect(JSON.parse(JSON.stringify(answer))).toEqual(answer);
  });
});
