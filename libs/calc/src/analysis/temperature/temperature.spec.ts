import { evaluate, inv, matrix, multiply, transpose } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeOk, computeRefused, numberOutput } from '../../methods/testing/answers';
import { marcusRateLog } from '../../rates/marcus/marcus';

const KB = 8.617333262e-5;
const H = 4.135667696e-15;

/** Independent least squares with mathjs: β = (XᵀX)⁻¹Xᵀy, cov = s²(XᵀX)⁻¹. */
function mathjsLine(x: number[], y: number[]) {
  const X = matrix(x.map((xi) => [1, xi]));
  const xtxInv = inv(multiply(transpose(X), X));
  const beta = multiply(multiply(xtxInv, transpose(X)), matrix(y)).toArray() as number[];
  const fitted = multiply(X, matrix(beta)).toArray() as number[];
  const rss = y.reduce((s, yi, i) => s + (yi - fitted[i]!) ** 2, 0);
  const cov = multiply(rss / (x.length - 2), xtxInv).toArray() as number[][];
  return {
    intercept: beta[0]!,
    slope: beta[1]!,
    se: [Math.sqrt(cov[0]![0]!), Math.sqrt(cov[1]![1]!)],
  };
}

describe('analysis.temperature', () => {
  const points = [
    { temperature: 278.15, k: 1.9e6 },
    { temperature: 288.15, k: 3.4e6 },
    { temperature: 298.15, k: 6.1e6 },
    { temperature: 308.15, k: 9.8e6 },
    { temperature: 318.15, k: 1.62e7 },
  ];

  it('matches an independent mathjs least-squares fit (values and standard errors)', () => {
    const answer = computeOk('analysis.temperature', { points });
    const x = points.map((p) => 1 / p.temperature);
    const arr = mathjsLine(
      x,
      points.map((p) => Math.log(p.k)),
    );
    expect(numberOutput(answer, 'arrheniusEa')).toBeCloseTo(-arr.slope * KB, 10);
    expect(numberOutput(answer, 'arrheniusPrefactor') / Math.exp(arr.intercept)).toBeCloseTo(1, 9);
    const eyr = mathjsLine(
      x,
      points.map((p) => Math.log((H * p.k) / (KB * p.temperature))),
    );
    expect(numberOutput(answer, 'eyringEnthalpy')).toBeCloseTo(-eyr.slope * KB, 10);
    const jPerMolK = 96485.33212;
    expect(numberOutput(answer, 'eyringEntropy')).toBeCloseTo(eyr.intercept * KB * jPerMolK, 7);
    const se = answer.outputs['standardErrors'] as Record<string, number>;
    expect(se['arrheniusEa']).toBeCloseTo(arr.se[1]! * KB, 10);
    expect(se['lnArrheniusPrefactor']).toBeCloseTo(arr.se[0]!, 8);
    expect(se['eyringEnthalpy']).toBeCloseTo(eyr.se[1]! * KB, 10);
    expect(se['eyringEntropy']).toBeCloseTo(eyr.se[0]! * KB * jPerMolK, 6);
    const residuals = answer.outputs['residuals'] as { arrhenius: number[] };
    expect(residuals.arrhenius).toHaveLength(5);
    expect(residuals.arrhenius.reduce((s, r) => s + r, 0)).toBeCloseTo(0, 12);
    // Eyring: ΔH‡ = E_a − k_BT_m to first order in the T range (SCIENCE.md §15).
    const tm = numberOutput(answer, 'meanTemperature');
    expect(numberOutput(answer, 'eyringEnthalpy')).toBeCloseTo(
      numberOutput(answer, 'arrheniusEa') - KB * tm,
      3,
    );
  });

  it('recovers an exact Arrhenius law with zero residuals and zero errors (limiting case)', () => {
    const exact = [250, 300, 350, 400].map((t) => ({
      temperature: t,
      k: evaluate('1e12 * exp(-0.4 / (kb * t))', { kb: KB, t }) as number,
    }));
    const answer = computeOk('analysis.temperature', { points: exact });
    expect(numberOutput(answer, 'arrheniusEa')).toBeCloseTo(0.4, 10);
    expect(numberOutput(answer, 'arrheniusPrefactor') / 1e12).toBeCloseTo(1, 8);
    expect(
      (answer.outputs['standardErrors'] as Record<string, number>)['arrheniusEa'],
    ).toBeLessThan(1e-12);
  });

  it('puts the Marcus E_a = ΔG‡ − k_BT/2 beside a fit of Marcus rates (SCIENCE.md §15)', () => {
    const lambda = 0.8;
    const deltaG0 = -0.3;
    const marcusPoints = [290, 295, 300, 305, 310].map((t) => ({
      temperature: t,
      k: Math.exp(marcusRateLog(deltaG0, lambda, 0.01, t)),
    }));
    const answer = computeOk('analysis.temperature', { points: marcusPoints, lambda, deltaG0 });
    const tm = numberOutput(answer, 'meanTemperature');
    const predicted = (lambda + deltaG0) ** 2 / (4 * lambda) - (KB * tm) / 2;
    expect(numberOutput(answer, 'marcusEa')).toBeCloseTo(predicted, 12);
    // The fitted slope of exact Marcus rates equals the prediction to within 1e-5 eV.
    expect(Math.abs(numberOutput(answer, 'arrheniusEa') - predicted)).toBeLessThan(1e-5);
    // With ΔS° (J mol⁻¹ K⁻¹) the SCIENCE.md §15 form, evaluated by mathjs.
    const withEntropy = computeOk('analysis.temperature', {
      points: marcusPoints,
      lambda,
      deltaG0,
      deltaS0: -20,
    });
    const expected = evaluate('(l + g) * (l + g + 2 * t * s) / (4 * l) - kb * t / 2', {
      l: lambda,
      g: deltaG0,
      t: tm,
      s: -20 / 96485.33212,
      kb: KB,
    }) as number;
    expect(numberOutput(withEntropy, 'marcusEa')).toBeCloseTo(expected, 12);
    // A nonadiabatic rate gives a negative apparent ΔS‡ and the note that says why.
    expect(numberOutput(answer, 'eyringEntropy')).toBeLessThan(0);
    expect(answer.warnings.map((w) => w.code)).toContain('eyring-entropy-apparent');
  });

  it('warns temperature-range (B8) for points outside 150–500 K', () => {
    const cold = [100, 120, 140].map((t) => ({ temperature: t, k: Math.exp(20 - 500 / t) }));
    const answer = computeOk('analysis.temperature', { points: cold });
    expect(answer.warnings.map((w) => w.code)).toContain('temperature-range');
  });

  it('refuses fewer than 3 points, repeated temperatures, k ≤ 0 and T ≤ 0, naming the field', () => {
    const fields = (inputs: unknown) =>
      computeRefused('analysis.temperature', inputs).map((e) => e.field);
    expect(fields({ points: points.slice(0, 2) })).toContain('points');
    expect(fields({ points: [points[0], points[0], { temperature: 300, k: 1 }] })).toContain(
      'points',
    );
    expect(fields({ points: [...points.slice(0, 2), { temperature: 300, k: 0 }] })).toContain(
      'points[2].k',
    );
    expect(fields({ points: [...points.slice(0, 2), { temperature: -3, k: 1 }] })).toContain(
      'points[2].temperature',
    );
    expect(fields({ points, lambda: 0.8 })).toContain('deltaG0');
    expect(fields({ points, deltaS0: 3 })).toContain('deltaS0');
  });
});
