import seedrandom from 'seedrandom';
import { describe, expect, it } from 'vitest';

import { analyseGapSamples } from '../gap-samples/gap-samples';
import { mergeDiabaticCurves } from './merged-curve';

const T = 298.15;
const KT = 8.617333262e-5 * T;

function normals(n: number, mean: number, sd: number, seed: string): Float64Array {
  const random = seedrandom(seed);
  return Float64Array.from(
    { length: n },
    () => mean + sd * Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random()),
  );
}

describe('mergeDiabaticCurves (exact algebra)', () => {
  // A non-Gaussian G_R on a grid; the product-state counts follow G_P = G_R + x exactly.
  const h = 0.02;
  const edges = Array.from({ length: 91 }, (_, i) => -0.9 + i * h);
  const x = edges.slice(0, -1).map((e) => e + h / 2);
  const gTrue = x.map((v) => 3 * (v - 0.05) ** 2 + 8 * (v - 0.05) ** 4);
  const NR = 1e6;
  const NP = 3e5;
  const weightR = gTrue.map((g) => Math.exp(-g / KT));
  const weightP = gTrue.map((g, i) => Math.exp(-(g + x[i]) / KT));
  const zR = weightR.reduce((s, w) => s + w, 0);
  const zP = weightP.reduce((s, w) => s + w, 0);
  const countsR = weightR.map((w) => (NR * w) / zR);
  const countsP = weightP.map((w) => (NP * w) / zP);
  // Each state is left empty where its share of the bin is below 10⁻¹² (the tails a simulation
  // never visits), and one bin in the middle is empty in both.
  const fullR = countsR.slice();
  const fullP = countsP.slice();
  for (let i = 0; i < x.length; i++) {
    if (fullR[i] < 1e-12 * fullP[i]) countsR[i] = 0;
    if (fullP[i] < 1e-12 * fullR[i]) countsP[i] = 0;
  }
  countsR[45] = 0;
  countsP[45] = 0;
  // −k_BT ln of the reactant density the full (unmasked) reactant histogram would give.
  const expectedGR = (i: number) => -KT * Math.log(weightR[i] / (zR * h));

  it('fits the shift −k_BT ln(Z_P/Z_R) and returns the reactant curve on every populated bin', () => {
    const merged = mergeDiabaticCurves(edges, countsR, countsP, KT)!;
    // Emptied bins remove mass: the normalisations change by −k_BT ln(N/N′).
    const nR = countsR.reduce((s, c) => s + c, 0);
    const nP = countsP.reduce((s, c) => s + c, 0);
    const renormR = -KT * Math.log(NR / nR);
    const renormP = -KT * Math.log(NP / nP);
    expect(merged.shiftEv).toBeCloseTo(-KT * Math.log(zP / zR) + renormR - renormP, 10);
    const both = x.filter((_, i) => countsR[i] > 0 && countsP[i] > 0).length;
    const onlyR = x.filter((_, i) => countsR[i] > 0 && countsP[i] === 0).length;
    const onlyP = x.filter((_, i) => countsR[i] === 0 && countsP[i] > 0).length;
    expect(onlyR).toBeGreaterThan(3);
    expect(onlyP).toBeGreaterThan(3);
    expect(merged.overlapBins).toBe(both);
    expect(merged.x.length).toBe(both + onlyR + onlyP);
    expect(merged.x).not.toContain(x[45]);
    merged.x.forEach((xi, k) => {
      const i = Math.round((xi - x[0]) / h);
      expect(xi).toBeCloseTo(x[i], 12);
      expect(merged.reactant[k]).toBeCloseTo(expectedGR(i) + renormR, 9);
      expect(merged.product[k]).toBeCloseTo(merged.reactant[k] + xi, 12);
    });
  });

  it('returns null when no bin is populated in both states', () => {
    const r = edges.slice(0, -1).map((_, i) => (i < 20 ? 5 : 0));
    const p = edges.slice(0, -1).map((_, i) => (i >= 20 ? 5 : 0));
    expect(mergeDiabaticCurves(edges, r, p, KT)).toBeNull();
  });
});

describe('merged curve of reorg.gapSamples on seeded linear-response samples', () => {
  // ⟨ΔE⟩_R = ΔG° + λ, ⟨ΔE⟩_P = ΔG° − λ, σ² = 2λk_BT (SCIENCE.md §7).
  const lambda = 0.15;
  const deltaG0 = -0.05;
  const n = 50_000;
  const sd = Math.sqrt(2 * lambda * KT);
  const outputs = analyseGapSamples(
    {
      reactant: normals(n, deltaG0 + lambda, sd, 'merge-R'),
      product: normals(n, deltaG0 - lambda, sd, 'merge-P'),
      temperatureK: T,
    },
    { warn: () => undefined },
  ) as Record<string, any>;
  const merged = outputs.mergedCurve;
  // Analytic G_R(x) = −k_BT ln N(x; ΔG° + λ, 2λk_BT) = (x − ΔG° − λ)²/(4λ) + (k_BT/2) ln(2πσ²).
  const analytic = (x: number) =>
    (x - deltaG0 - lambda) ** 2 / (4 * lambda) + 0.5 * KT * Math.log(2 * Math.PI * sd * sd);
  const gauss = (x: number, mu: number) =>
    Math.exp(-((x - mu) ** 2) / (2 * sd * sd)) / Math.sqrt(2 * Math.PI * sd * sd);

  it('fits a shift equal to ΔG° within its standard error', () => {
    expect(merged.overlapBins).toBe(outputs.linearFreeEnergyCheck.overlapBins);
    expect(merged.overlapBins).toBeGreaterThan(20);
    expect(merged.shiftStandardError).toBeGreaterThan(0);
    expect(merged.shiftStandardError).toBeLessThan(0.005);
    expect(Math.abs(merged.shiftEv - deltaG0)).toBeLessThan(4 * merged.shiftStandardError);
  });

  it('equals the analytic parabola within sampling error, also where one state is empty', () => {
    const h = merged.x[1] - merged.x[0];
    let checked = 0;
    let productOnly = 0;
    merged.x.forEach((x: number, k: number) => {
      // Expected counts of both states in this bin from the analytic densities.
      const expected = n * h * (gauss(x, deltaG0 + lambda) + gauss(x, deltaG0 - lambda));
      if (expected < 30) return;
      checked++;
      const i = outputs.freeEnergyCurves.x.indexOf(x);
      if (outputs.freeEnergyCurves.reactant[i] === null) productOnly++;
      // Poisson SE of −k_BT ln n is k_BT/√n; 4.5 SE plus a binning allowance.
      const tolerance = (4.5 * KT) / Math.sqrt(expected) + 0.002;
      expect(Math.abs(merged.reactant[k] - analytic(x))).toBeLessThan(tolerance);
      expect(Math.abs(merged.product[k] - (analytic(x) + x))).toBeLessThan(tolerance);
    });
    expect(checked).toBeGreaterThan(40);
    // The merge fills the product side, where the reactant histogram alone has nothing.
    expect(productOnly).toBeGreaterThan(5);
  });

  it('is null when the two states do not overlap', () => {
    const far = analyseGapSamples(
      {
        reactant: normals(5000, 3, 0.05, 'far-R'),
        product: normals(5000, 1, 0.05, 'far-P'),
        temperatureK: T,
      },
      { warn: () => undefined },
    ) as Record<string, any>;
    expect(far.mergedCurve).toBeNull();
  });
});
