import seedrandom from 'seedrandom';
import { describe, expect, it } from 'vitest';

import { computeOk, computeRefused, numberOutput } from '../../methods/testing/answers';

import { CalcRefusal } from '../../core/method';
import {
  confidenceBandLog10k,
  drivingForceSeriesMethod,
  fitDrivingForceSeries,
} from './driving-force-series';

const T = 298.15;
const KT = 8.617333262e-5 * T;
const HBAR = 6.582119569e-16;

/** Marcus log10 k written out here from SCIENCE.md §1 (independent of the rate kernels). */
function marcusLog10(deltaG0: number, lambda: number, coupling: number): number {
  const lnK =
    Math.log((2 * Math.PI) / HBAR) +
    2 * Math.log(coupling) -
    0.5 * Math.log(4 * Math.PI * lambda * KT) -
    (deltaG0 + lambda) ** 2 / (4 * lambda * KT);
  return lnK / Math.LN10;
}

/** MLJ (T = 0 mode) log10 k by a plain 200-term sum, SCIENCE.md §2. */
function mljLog10(dg: number, ls: number, lv: number, w: number, h: number): number {
  const s = lv / w;
  let sum = 0;
  let poisson = Math.exp(-s);
  for (let n = 0; n < 200; n++) {
    sum += poisson * Math.exp(-((dg + ls + n * w) ** 2) / (4 * ls * KT));
    poisson *= s / (n + 1);
  }
  return Math.log10((((2 * Math.PI) / HBAR) * h * h * sum) / Math.sqrt(4 * Math.PI * ls * KT));
}

const GRID = [-0.1, -0.3, -0.5, -0.7, -0.9, -1.1, -1.3, -1.5];
const points = (log10: (x: number) => number, noise: (i: number) => number = () => 0) =>
  GRID.map((x, i) => ({ deltaG0Ev: x, k: 10 ** (log10(x) + noise(i)) }));

/** Normal deviate by Box–Muller (for seeded noise). */
function gaussian(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

function codes(inputs: Parameters<typeof fitDrivingForceSeries>[0]): string[] {
  const out: string[] = [];
  drivingForceSeriesMethod.compute(inputs, { warn: (c) => out.push(c) });
  return out;
}

describe('fit.drivingForceSeries', () => {
  it('recovers λ and H exactly from noise-free Marcus data (exact self-consistency)', () => {
    const fit = fitDrivingForceSeries({
      points: points((x) => marcusLog10(x, 0.75, 0.012)),
      temperatureK: T,
      model: 'marcus',
    });
    expect(fit.lambdaEv).toBeCloseTo(0.75, 9);
    expect(fit.couplingEv / 0.012).toBeCloseTo(1, 9);
    expect(fit.rmsLog10Residual).toBeLessThan(1e-9);
  });

  it('recovers λ_s and H from noise-free MLJ data with the fixed mode', () => {
    const fit = fitDrivingForceSeries({
      points: points((x) => mljLog10(x, 0.4, 0.25, 0.18, 0.003)),
      temperatureK: T,
      model: 'mlj',
      hbarOmegaEv: 0.18,
      lambdaVibEv: 0.25,
    });
    expect(fit.lambdaEv).toBeCloseTo(0.4, 8);
    expect(fit.couplingEv / 0.003).toBeCloseTo(1, 8);
  });

  it('matches s²(JᵀJ)⁻¹ built from the analytic Jacobian (independent derivation)', () => {
    const random = seedrandom('fit-covariance');
    const data = points(
      (x) => marcusLog10(x, 0.8, 0.01),
      () => 0.15 * gaussian(random),
    );
    const fit = fitDrivingForceSeries({ points: data, temperatureK: T, model: 'marcus' });
    const l = fit.lambdaEv;
    // ∂y/∂λ and ∂y/∂ln H of y = log10 k (differentiated by hand from SCIENCE.md §1).
    const rows = data.map((p) => [
      (-1 / (2 * l) - ((p.deltaG0Ev + l) * (l - p.deltaG0Ev)) / (4 * l * l * KT)) / Math.LN10,
      2 / Math.LN10,
    ]);
    const a = rows.reduce((s, r) => s + r[0] * r[0], 0);
    const b = rows.reduce((s, r) => s + r[0] * r[1], 0);
    const d = rows.reduce((s, r) => s + r[1] * r[1], 0);
    const rss = data.reduce(
      (s, p) => s + (Math.log10(p.k) - marcusLog10(p.deltaG0Ev, l, fit.couplingEv)) ** 2,
      0,
    );
    const s2 = rss / (data.length - 2);
    const det = a * d - b * b;
    expect(fit.standardErrors.lambda / Math.sqrt((s2 * d) / det)).toBeCloseTo(1, 5);
    const seLnH = Math.sqrt((s2 * a) / det);
    expect(fit.standardErrors.coupling / (fit.couplingEv * seLnH)).toBeCloseTo(1, 5);
    expect(fit.correlation).toBeCloseTo(-b / Math.sqrt(a * d), 5);
    expect(fit.covariance[0][1]).toBe(fit.covariance[1][0]);
  });

  it('has standard errors that cover the truth about 95 % of the time (seeded noise)', () => {
    const random = seedrandom('fit-coverage');
    let covered = 0;
    const trials = 200;
    for (let t = 0; t < trials; t++) {
      const fit = fitDrivingForceSeries({
        points: points(
          (x) => marcusLog10(x, 0.8, 0.01),
          () => 0.2 * gaussian(random),
        ),
        temperatureK: T,
        model: 'marcus',
      });
      if (Math.abs(fit.lambdaEv - 0.8) < 2.45 * fit.standardErrors.lambda) covered++;
    }
    // 2.45 ≈ Student t(0.975, 6 dof); binomial SD of the rate at 200 trials ≈ 1.5 %.
    expect(covered / trials).toBeGreaterThan(0.89);
    expect(covered / trials).toBeLessThan(0.995);
  });

  it('draws a delta-method band that contains the fit and widens away from the data', () => {
    const random = seedrandom('fit-band');
    const fit = fitDrivingForceSeries({
      points: points(
        (x) => marcusLog10(x, 0.8, 0.01),
        () => 0.1 * gaussian(random),
      ),
      temperatureK: T,
      model: 'marcus',
    });
    const band = confidenceBandLog10k(fit, [-0.8, -3]);
    expect(band.lower[0]).toBeLessThan(band.log10k[0]);
    expect(band.upper[0]).toBeGreaterThan(band.log10k[0]);
    expect(band.upper[1] - band.lower[1]).toBeGreaterThan(5 * (band.upper[0] - band.lower[0]));
  });

  it('warns fit-poorly-separated with normal-region data only (B29) and fit-few-degrees-of-freedom (B30)', () => {
    const normalOnly = [-0.05, -0.1, -0.15, -0.2, -0.25].map((x, i) => ({
      deltaG0Ev: x,
      k: 10 ** (marcusLog10(x, 0.8, 0.01) + 0.05 * Math.sin(3 * i)),
    }));
    const warnings = codes({ points: normalOnly, temperatureK: T, model: 'marcus' });
    expect(warnings).toContain('fit-poorly-separated');
    expect(warnings).toContain('fit-few-degrees-of-freedom');
    const wide = points(
      (x) => marcusLog10(x, 0.8, 0.01),
      (i) => 0.05 * Math.sin(3 * i),
    );
    expect(
      codes({
        points: [...wide, ...wide.map((p) => ({ ...p, k: p.k * 1.1 }))],
        temperatureK: T,
        model: 'marcus',
      }),
    ).toEqual([]);
  });

  it('refuses points that cannot separate λ and H', () => {
    // All three points identical in ΔG° would be refused at read; a collinear ln-k set with a
    // flat Jacobian is refused at compute.
    expect(() =>
      fitDrivingForceSeries({
        points: [
          { deltaG0Ev: -0.5, k: 1e9 },
          { deltaG0Ev: -0.5, k: 2e9 },
          { deltaG0Ev: -0.5, k: 3e9 },
        ],
        temperatureK: T,
        model: 'marcus',
      }),
    ).toThrow(CalcRefusal);
  });
});

describe('fit.drivingForceSeries through the dispatcher', () => {
  const message = 'Need ≥ 3 distinct points with k > 0 to fit λ and H with uncertainties.';

  it('refuses fewer than 3 points, duplicate ΔG° only, and k ≤ 0 (A15)', () => {
    expect(
      computeRefused('fit.drivingForceSeries', {
        points: [
          { deltaG0: -0.3, k: 1e9 },
          { deltaG0: -0.5, k: 1e10 },
        ],
        temperature: T,
      }),
    ).toEqual([{ field: 'points', message }]);
    expect(
      computeRefused('fit.drivingForceSeries', {
        points: [
          { deltaG0: -0.3, k: 1e9 },
          { deltaG0: -0.3, k: 2e9 },
          { deltaG0: -0.3, k: 3e9 },
        ],
        temperature: T,
      }),
    ).toEqual([{ field: 'points', message }]);
    const errors = computeRefused('fit.drivingForceSeries', {
      points: [
        { deltaG0: -0.3, k: 1e9 },
        { deltaG0: -0.5, k: 0 },
        { deltaG0: -0.7, k: 1e10 },
      ],
      temperature: T,
    });
    expect(errors).toContainEqual({ field: 'points[1].k', message });
  });

  it('needs hbarOmega and lambdaVib for the mlj model', () => {
    const errors = computeRefused('fit.drivingForceSeries', {
      points: points((x) => marcusLog10(x, 0.8, 0.01)).map((p) => ({
        deltaG0: p.deltaG0Ev,
        k: p.k,
      })),
      temperature: T,
      model: 'mlj',
    });
    expect(errors.map((e) => e.field).sort()).toEqual(['hbarOmega', 'lambdaVib']);
  });

  it('fits through the dispatcher with energies in kcal/mol', () => {
    const answer = computeOk('fit.drivingForceSeries', {
      points: points((x) => marcusLog10(x, 0.75, 0.012)).map((p) => ({
        deltaG0: { value: p.deltaG0Ev * 23.06054783, unit: 'kcal/mol' },
        k: p.k,
      })),
      temperature: T,
    });
    expect(numberOutput(answer, 'lambda')).toBeCloseTo(0.75, 7);
  });
});
