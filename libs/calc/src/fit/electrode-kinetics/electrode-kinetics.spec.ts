import seedrandom from 'seedrandom';
import { describe, expect, it } from 'vitest';

import { computeOk, computeRefused, warningCodes } from '../../methods/testing/answers';
import {
  ELECTRODE_FIT_MAX_POINTS,
  fitElectrodeKinetics,
  fitElectrodeModel,
  mhcLog10k,
} from './electrode-kinetics';
import type { ElectrodeDirection, ElectrodePoint } from './electrode-kinetics';

const T = 298.15;
const KT = 8.617333262e-5 * T;

/**
 * MHC log10 k written out here (SCIENCE.md §11) by a plain trapezoid sum on a fine grid,
 * independent of the adaptive quadrature of the core.
 */
function mhcLog10Trapezoid(lambdaEv: number, etaV: number, direction: ElectrodeDirection): number {
  const l = lambdaEv / KT;
  const integral = (e: number) => {
    const centre = l + e;
    const half = 12 * Math.sqrt(l) + 40;
    const n = 40_000;
    const h = (2 * half) / n;
    let sum = 0;
    for (let i = 0; i <= n; i++) {
      const x = centre - half + i * h;
      const f = Math.exp(-((x - centre) ** 2) / (4 * l)) / (1 + Math.exp(x));
      sum += (i === 0 || i === n ? 0.5 : 1) * f;
    }
    return sum * h;
  };
  const e = ((direction === 'reduction' ? 1 : -1) * etaV) / KT;
  return Math.log10(integral(e) / integral(0));
}

/** Normal deviate by Box–Muller (for seeded noise). */
function gaussian(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

/** η from −0.6 to 0.6 V: reduction rates at η < 0, oxidation at η > 0 (as a voltammogram gives). */
const ETAS = Array.from({ length: 13 }, (_, i) => -0.6 + 0.1 * i);
function pointsFrom(
  log10k: (eta: number, direction: ElectrodeDirection) => number,
  noise: (i: number) => number = () => 0,
  etas: readonly number[] = ETAS,
): ElectrodePoint[] {
  return etas.map((eta, i) => {
    const direction: ElectrodeDirection = eta <= 0 ? 'reduction' : 'oxidation';
    return { overpotentialV: eta, direction, k: 10 ** (log10k(eta, direction) + noise(i)) };
  });
}

describe('fit.electrodeKinetics', () => {
  it('the MHC model agrees with an independent trapezoid sum and keeps detailed balance', () => {
    for (const eta of [-0.5, -0.1, 0.2]) {
      const ours = mhcLog10k({ overpotentialV: eta, direction: 'reduction' }, 0.6, 0, T);
      expect(ours).toBeCloseTo(mhcLog10Trapezoid(0.6, eta, 'reduction'), 8);
      const ox = mhcLog10k({ overpotentialV: eta, direction: 'oxidation' }, 0.6, 0, T);
      // k_red/k_ox = e^(−eη/k_BT) (SCIENCE.md §11).
      expect(ours - ox).toBeCloseTo(-eta / KT / Math.LN10, 9);
    }
  });

  it('recovers λ and k⁰ exactly from noise-free MHC data', () => {
    const points = pointsFrom(
      (eta, d) => Math.log10(50) + mhcLog10k({ overpotentialV: eta, direction: d }, 0.62, 0, T),
    );
    const fit = fitElectrodeKinetics({ points, temperatureK: T });
    expect(fit.mhc.shape).toBeCloseTo(0.62, 7);
    expect(fit.mhc.k0).toBeCloseTo(50, 5);
    expect(Math.max(...fit.mhc.residuals.map(Math.abs))).toBeLessThan(1e-8);
    // The curvature at |η| up to 0.6 V rules Butler–Volmer out.
    expect(fit.verdict).toBe('mhc');
    expect(fit.deltaAic).toBeGreaterThan(10);
  });

  it('recovers α and k⁰ exactly from noise-free Butler–Volmer data', () => {
    const alpha = 0.42;
    const points = pointsFrom(
      (eta, d) =>
        Math.log10(3.2e-3) + ((d === 'reduction' ? -alpha : 1 - alpha) * eta) / KT / Math.LN10,
    );
    const fit = fitElectrodeKinetics({ points, temperatureK: T });
    expect(fit.butlerVolmer.shape).toBeCloseTo(alpha, 10);
    expect(fit.butlerVolmer.k0).toBeCloseTo(3.2e-3, 12);
    expect(fit.verdict).toBe('butlerVolmer');
  });

  it('recovers the parameters within their standard errors under seeded noise', () => {
    const sigma = 0.05; // log10 units
    let insideMhc = 0;
    let insideBv = 0;
    const seeds = ['a', 'b', 'c', 'd', 'e', 'f', 'g', 'h'];
    for (const seed of seeds) {
      const random = seedrandom(seed);
      const noise = ETAS.map(() => sigma * gaussian(random));
      const mhcPoints = pointsFrom(
        (eta, d) => 1 + mhcLog10k({ overpotentialV: eta, direction: d }, 0.8, 0, T),
        (i) => noise[i],
      );
      const mhc = fitElectrodeModel('mhc', { points: mhcPoints, temperatureK: T });
      expect(mhc.shapeStandardError).toBeGreaterThan(0);
      if (Math.abs(mhc.shape - 0.8) < 2 * mhc.shapeStandardError) insideMhc++;
      // Never further than 4 SE (would be a 6e-5 event).
      expect(Math.abs(mhc.shape - 0.8)).toBeLessThan(4 * mhc.shapeStandardError);
      expect(Math.abs(mhc.log10k0 - 1)).toBeLessThan(4 * mhc.log10k0StandardError);
      const bvPoints = pointsFrom(
        (eta, d) => ((d === 'reduction' ? -0.55 : 0.45) * eta) / KT / Math.LN10,
        (i) => noise[i],
      );
      const bv = fitElectrodeModel('butlerVolmer', { points: bvPoints, temperatureK: T });
      if (Math.abs(bv.shape - 0.55) < 2 * bv.shapeStandardError) insideBv++;
      expect(Math.abs(bv.shape - 0.55)).toBeLessThan(4 * bv.shapeStandardError);
    }
    // About 95 % of 2-SE intervals should hold the truth: at least 6 of 8.
    expect(insideMhc).toBeGreaterThanOrEqual(6);
    expect(insideBv).toBeGreaterThanOrEqual(6);
  });

  it('MHC data at |eη| ≪ λ look like Butler–Volmer with α → ½ (limiting case, SCIENCE.md §11)', () => {
    const small = [-0.04, -0.03, -0.02, -0.01, 0.01, 0.02, 0.03, 0.04];
    const points = pointsFrom(
      (eta, d) => mhcLog10k({ overpotentialV: eta, direction: d }, 1.0, 0, T),
      () => 0,
      small,
    );
    const fit = fitElectrodeModel('butlerVolmer', { points, temperatureK: T });
    // α(η) = ½ + eη/(4λ) to first order (Chidsey 1991): within |η| ≤ 0.04 V, |α − ½| ≤ 0.01.
    expect(Math.abs(fit.shape - 0.5)).toBeLessThan(0.01);
    expect(fit.rmsLog10Residual).toBeLessThan(5e-3);
  });

  it('fits the Chidsey 1991 ferrocene-alkanethiol monolayer on gold (from memory)', () => {
    // C. E. D. Chidsey, Science 1991, 251, 919: HS(CH2)16O2C-Fc diluted in HS(CH2)15CH3 on gold,
    // 1 M HClO4, 25 °C; reported λ = 0.85 eV and k⁰ ≈ 1.25 s⁻¹ (both from memory, unchecked).
    // The individual points are not recalled: these are log10 k read off the published curve at
    // those values and rounded to 0.05, as one reads a figure; the rounding acts as noise.
    const table: [number, ElectrodeDirection, number][] = [
      [-0.7, 'reduction', 3.9],
      [-0.6, 'reduction', 3.6],
      [-0.5, 'reduction', 3.25],
      [-0.4, 'reduction', 2.8],
      [-0.3, 'reduction', 2.25],
      [-0.2, 'reduction', 1.6],
      [-0.1, 'reduction', 0.9],
      [0, 'reduction', 0.1],
      [0.1, 'oxidation', 0.9],
      [0.2, 'oxidation', 1.6],
      [0.3, 'oxidation', 2.25],
      [0.4, 'oxidation', 2.8],
      [0.5, 'oxidation', 3.25],
      [0.6, 'oxidation', 3.6],
      [0.7, 'oxidation', 3.9],
    ];
    const points = table.map(([overpotentialV, direction, log10k]) => ({
      overpotentialV,
      direction,
      k: 10 ** log10k,
    }));
    const fit = fitElectrodeKinetics({ points, temperatureK: T });
    expect(Math.abs(fit.mhc.shape - 0.85)).toBeLessThan(0.08);
    expect(fit.mhc.k0).toBeGreaterThan(0.8);
    expect(fit.mhc.k0).toBeLessThan(2);
    expect(fit.verdict).toBe('mhc');
  });

  it('answers through the dispatcher with both models and the verdict', () => {
    const answer = computeOk('fit.electrodeKinetics', {
      temperature: T,
      points: pointsFrom((eta, d) =>
        mhcLog10k({ overpotentialV: eta, direction: d }, 0.5, 2, T),
      ).map((p) => ({ overpotential: p.overpotentialV, k: p.k, direction: p.direction })),
    });
    const out = answer.outputs as {
      mhc: { lambda: number; k0: number };
      butlerVolmer: { alpha: number };
      verdict: string;
    };
    expect(out.mhc.lambda).toBeCloseTo(0.5, 6);
    expect(out.mhc.k0).toBeCloseTo(100, 3);
    expect(out.verdict).toBe('mhc');
    expect(warningCodes(answer)).not.toContain('fit-at-bound');
  });

  it('warns on few degrees of freedom and on data far below λ', () => {
    const answer = computeOk('fit.electrodeKinetics', {
      temperature: T,
      points: [-0.03, -0.02, -0.01, 0.01].map((eta) => ({
        overpotential: eta,
        k: 10 ** mhcLog10k({ overpotentialV: eta, direction: 'reduction' }, 0.9, 0, T),
      })),
    });
    expect(warningCodes(answer)).toContain('fit-few-degrees-of-freedom');
    expect(warningCodes(answer)).toContain('fit-poorly-separated');
  });

  it('refuses too few points, k ≤ 0, a bad temperature and more points than the work limit', () => {
    const two = computeRefused('fit.electrodeKinetics', {
      temperature: T,
      points: [
        { overpotential: -0.1, k: 1 },
        { overpotential: -0.2, k: 2 },
      ],
    });
    expect(two[0].field).toBe('points');
    const negative = computeRefused('fit.electrodeKinetics', {
      temperature: T,
      points: [
        { overpotential: -0.1, k: 1 },
        { overpotential: -0.2, k: -2 },
        { overpotential: -0.3, k: 3 },
      ],
    });
    expect(negative.map((e) => e.field)).toContain('points[1].k');
    const cold = computeRefused('fit.electrodeKinetics', {
      temperature: -5,
      points: [-0.1, -0.2, -0.3].map((eta) => ({ overpotential: eta, k: 1 })),
    });
    expect(cold[0].field).toBe('temperature');
    const many = computeRefused('fit.electrodeKinetics', {
      temperature: T,
      points: Array.from({ length: ELECTRODE_FIT_MAX_POINTS + 1 }, (_, i) => ({
        overpotential: -0.001 * i,
        k: 1 + i,
      })),
    });
    expect(many[0].field).toBe('points');
    expect(many[0].message).toContain(String(ELECTRODE_FIT_MAX_POINTS));
  });
});
