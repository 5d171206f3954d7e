/**
 * The shortcuts taken for speed (issue 17: 20 states in < 16 ms, 2000 Monte Carlo samples in
 * < 1 s) give what the plain routes give:
 * - relaxation times and mode shapes of a reversible network by the symmetric eigen path equal
 *   −1/λ of the eigenvalues of K_TT, computed independently by mathjs `eigs` on K_TT itself;
 * - the yield sensitivity with only the varied link's rates recomputed equals central
 *   differences of full recomputes through `calculate`.
 */
import { eigs } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { calculate } from '../../methods/calculate';
import { rateMatrix, rateTable, relaxationModes, reversibleWeights } from './master-equation';

function chain(lambdaOf: (i: number) => number, withIsc = false) {
  const n = 8;
  const states = Array.from({ length: n }, (_, i) => ({
    id: i === 0 ? 'G' : `S${i}`,
    energy: i === 0 ? 0 : 2.2 - 0.1 * i,
    kind: i === 0 ? 'ground' : i === 1 ? 'excited' : 'chargeSeparated',
  }));
  const links: Record<string, unknown>[] = [];
  for (let i = 1; i < n - 1; i++)
    links.push({ from: states[i].id, to: states[i + 1].id, lambda: lambdaOf(i), coupling: 0.002 });
  for (let i = 1; i < n; i++) links.push({ from: states[i].id, to: 'G', k: 10 ** (9 - 0.5 * i) });
  if (withIsc) links.push({ from: 'S1', to: 'S4', k: 3e7 });
  return { states, links };
}

describe('kinetics.network fast paths', () => {
  it('symmetric relaxation modes equal −1/λ of K_TT (mathjs eigs, independent)', () => {
    // A chain S1 … S7 of ET steps with detailed-balance reverses and decays to G (absorbing).
    const rates: [number, number, number][] = [];
    const energies = [0, 2.1, 2.0, 1.85, 1.8, 1.6, 1.55, 1.4];
    const kT = 0.025693;
    for (let i = 1; i < 7; i++) {
      const kf = 10 ** (9 + (i % 3));
      rates.push([i, i + 1, kf], [i + 1, i, kf * Math.exp((energies[i + 1] - energies[i]) / kT)]);
    }
    for (let i = 1; i < 8; i++) rates.push([i, 0, 10 ** (8 - 0.5 * i)]);
    const table = rateTable(
      8,
      rates.map(([from, to, kPerS]) => ({ from, to, kPerS })),
    );
    const transient = [false, true, true, true, true, true, true, true];
    const order = [1, 2, 3, 4, 5, 6, 7];
    expect(reversibleWeights(table, order)).toBeDefined();
    const { modes } = relaxationModes(table, transient);
    const k = rateMatrix(table);
    const kTT = order.map((r) => order.map((c) => k[r][c]));
    const reference = (eigs(kTT).values as number[])
      .map((lambda) => -1 / lambda)
      .sort((a, b) => b - a);
    expect(modes).toHaveLength(7);
    modes.forEach((mode, i) => {
      expect(Math.abs(mode.timeS - reference[i])).toBeLessThanOrEqual(1e-9 * reference[i]);
    });
    // Each shape is a right eigenvector of K_TT: K_TT v = −v/τ.
    for (const mode of modes) {
      const kv = kTT.map((row) => row.reduce((s, x, c) => s + x * mode.shape[c], 0));
      kv.forEach((x, r) =>
        expect(Math.abs(x + mode.shape[r] / mode.timeS)).toBeLessThanOrEqual(
          1e-8 * Math.max(...kTT.map((row) => Math.abs(row[r]))),
        ),
      );
    }
  });

  it('a fixed rate between transient states is not reversible: the general path is taken', () => {
    const table = rateTable(3, [
      { from: 1, to: 2, kPerS: 1e8 },
      { from: 1, to: 0, kPerS: 1e9 },
      { from: 2, to: 0, kPerS: 1e5 },
    ]);
    expect(reversibleWeights(table, [1, 2])).toBeUndefined();
    const { modes } = relaxationModes(table, [false, true, true]);
    // Closed form: the two lifetimes 1/(k_12 + k_10) and 1/k_20.
    expect(modes.map((m) => m.timeS)).toEqual([
      expect.closeTo(1e-5, 15),
      expect.closeTo(1 / 1.1e9, 20),
    ]);
  });

  it.each([false, true])(
    'sensitivity equals central differences of full recomputes (intersystem crossing: %s)',
    (withIsc) => {
      const base = (i: number) => 0.5 + 0.03 * i;
      const answer = calculate({
        method: 'kinetics.network',
        inputs: { ...chain(base, withIsc), target: 'S7' },
      });
      if (!answer.ok || answer.outputs.report !== 'full') throw new Error('refused');
      const entries = answer.outputs.sensitivity!.entries;
      const formation = (lambdaOf: (i: number) => number) => {
        const a = calculate({
          method: 'kinetics.network',
          inputs: { ...chain(lambdaOf, withIsc), report: 'yields' },
        });
        if (!a.ok) throw new Error('refused');
        return a.outputs.formationYields['S7'];
      };
      const h = 1e-3;
      for (const link of [1, 3, 5]) {
        const up = formation((i) => base(i) * (i === link ? Math.exp(h) : 1));
        const down = formation((i) => base(i) * (i === link ? Math.exp(-h) : 1));
        const expected = (up - down) / (2 * h);
        const entry = entries.find((e) => e.link === link - 1 && e.parameter === 'lambda')!;
        expect(Math.abs(entry.dYieldDLn - expected)).toBeLessThanOrEqual(
          1e-9 + 1e-6 * Math.abs(expected),
        );
      }
    },
  );
});
