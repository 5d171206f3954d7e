import { expm, matrix } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { calculate } from '../../methods/calculate';
import { BOLTZMANN_EV_PER_K } from '../../core/constants';
import { marcusRateLog } from '../../rates/marcus/marcus';
import { populationsAt } from './master-equation';

const KT = BOLTZMANN_EV_PER_K * 298.15;

type Outputs = Record<string, any>;

function run(inputs: Record<string, unknown>): { outputs: Outputs; warnings: { code: string }[] } {
  const answer = calculate({ method: 'kinetics.network', inputs });
  if (!answer.ok) throw new Error(JSON.stringify(answer.errors));
  return { outputs: answer.outputs as Outputs, warnings: answer.warnings };
}

function refused(inputs: Record<string, unknown>): string[] {
  const answer = calculate({ method: 'kinetics.network', inputs });
  if (answer.ok) throw new Error('expected a refusal');
  return answer.errors.map((e) => e.field);
}

/** Golden-rule Marcus rate, s⁻¹ (SCIENCE.md §1), from the core's log form. */
function marcusRate(
  deltaG0: number,
  lambda: number,
  coupling: number,
  temperature: number,
): number {
  return Math.exp(marcusRateLog(deltaG0, lambda, coupling, temperature));
}

/** |a − b| ≤ abs + rel·|b| */
function close(actual: number, expected: number, rel: number, abs = 0): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(abs + rel * Math.abs(expected));
}

describe('kinetics.network: master equation against closed forms', () => {
  it('A → B → C follows the consecutive first-order closed form at every time', () => {
    // p_A = e^(−k1 t), p_B = k1/(k2 − k1)(e^(−k1 t) − e^(−k2 t)): consecutive first-order
    // reactions, e.g. P. Atkins, J. de Paula, Physical Chemistry, 9th ed., OUP 2010, §21.4
    // (any physical chemistry text; from memory).
    const k1 = 2e9;
    const k2 = 5e8;
    const { outputs } = run({
      states: [
        { id: 'A', energy: 1, kind: 'excited' },
        { id: 'B', energy: 0.5 },
        { id: 'C', energy: 0 },
      ],
      links: [
        { from: 'A', to: 'B', k: k1 },
        { from: 'B', to: 'C', k: k2 },
      ],
      timeStart: 1e-13,
      timeEnd: 1e-6,
    });
    const times: number[] = outputs.times;
    expect(times.length).toBeGreaterThan(60);
    times.forEach((t, n) => {
      const pA = Math.exp(-k1 * t);
      const pB = (k1 / (k2 - k1)) * (Math.exp(-k1 * t) - Math.exp(-k2 * t));
      close(outputs.populations.A[n], pA, 1e-10, 1e-14);
      close(outputs.populations.B[n], pB, 1e-10, 1e-14);
      close(outputs.populations.C[n], 1 - pA - pB, 1e-9, 1e-14);
    });
    expect(outputs.yields).toEqual({ C: expect.any(Number) });
    close(outputs.yields.C, 1, 1e-14);
    // Occupation times 1/k1 and 1/k2: the integrals of the closed forms.
    close(outputs.occupationTimes.A, 1 / k1, 1e-13);
    close(outputs.occupationTimes.B, 1 / k2, 1e-13);
    // Lifetimes from the eigenvalues −k1, −k2.
    close(outputs.lifetimes.A, 1 / k1, 1e-9);
    close(outputs.lifetimes.B, 1 / k2, 1e-9);
    expect(outputs.dominantPathway.states).toEqual(['A', 'B', 'C']);
  });

  it('competing decays give φ_i = k_i/Σk and p_A = e^(−Σk t)', () => {
    // Parallel first-order decays (any physical chemistry text): φ_i = k_i/Σk.
    const k = { B: 3e8, C: 1e9, D: 2e7 };
    const sum = k.B + k.C + k.D;
    const { outputs } = run({
      states: [
        { id: 'A', energy: 2, kind: 'excited' },
        { id: 'B', energy: 0 },
        { id: 'C', energy: 0.1 },
        { id: 'D', energy: 0.2 },
      ],
      links: [
        { from: 'A', to: 'B', k: k.B },
        { from: 'A', to: 'C', lifetime: { value: 1000, unit: 'ps' } },
        { from: 'A', to: 'D', k: k.D },
      ],
    });
    for (const id of ['B', 'C', 'D'] as const) close(outputs.yields[id], k[id] / sum, 1e-13);
    outputs.times.forEach((t: number, n: number) =>
      close(outputs.populations.A[n], Math.exp(-sum * t), 1e-9, 1e-15),
    );
    // Integrated flux along each decay equals its yield.
    const flux = outputs.flux.find((f: any) => f.to === 'C').flux;
    close(flux, k.C / sum, 1e-13);
  });

  it('a reversible ET pair reaches the Boltzmann ratio with the two-state closed form', () => {
    // Two states exchanging by first-order steps relax with rate k_f + k_r to
    // p_B/p_A = k_f/k_r = exp(−ΔG°/k_BT) (detailed balance; any physical chemistry text).
    const deltaG0 = -0.05;
    const { outputs } = run({
      states: [
        { id: 'A', energy: 0.05, kind: 'excited' },
        { id: 'B', energy: 0 },
      ],
      links: [{ from: 'A', to: 'B', lambda: 0.6, coupling: { value: 20, unit: 'cm-1' } }],
    });
    const kf = marcusRate(deltaG0, 0.6, 20 / 8065.543937, 298.15);
    const kr = marcusRate(-deltaG0, 0.6, 20 / 8065.543937, 298.15);
    const ratio = Math.exp(-deltaG0 / KT);
    close(outputs.yields.B / outputs.yields.A, ratio, 1e-12);
    close(outputs.yields.A + outputs.yields.B, 1, 1e-14);
    const pAInfinity = kr / (kf + kr);
    outputs.times.forEach((t: number, n: number) => {
      const pA = pAInfinity + (1 - pAInfinity) * Math.exp(-(kf + kr) * t);
      close(outputs.populations.A[n], pA, 1e-9, 1e-14);
    });
    const last = outputs.times.length - 1;
    close(outputs.populations.B[last] / outputs.populations.A[last], ratio, 1e-9);
  });

  it('keeps Σp = 1 to 1e-12 at every time, and detailed balance on every ET link', () => {
    const { outputs } = run(triad());
    outputs.times.forEach((_: number, n: number) => {
      const total = Object.values(outputs.populations as Record<string, number[]>).reduce(
        (s, p) => s + p[n],
        0,
      );
      expect(Math.abs(total - 1)).toBeLessThan(1e-12);
    });
    expect(outputs.populationSumError).toBeLessThan(1e-12);
    const energies = Object.fromEntries(
      triad().states.map((s) => [s.id, s.energy as number]),
    ) as Record<string, number>;
    const et = outputs.rates.filter((r: any) => r.source === 'electronTransfer');
    expect(et.length).toBeGreaterThan(3);
    for (const forward of et) {
      const reverse = outputs.rates.find(
        (r: any) => r.source === 'detailedBalance' && r.link === forward.link,
      );
      // k_r/k_f = exp((G_to − G_from)/k_BT) (microscopic reversibility)…
      close(
        reverse.k / forward.k,
        Math.exp((energies[forward.to] - energies[forward.from]) / KT),
        1e-10,
      );
      // …and, independently, the classical Marcus rate computed for the reverse driving force.
      const link = triad().links[forward.link] as { lambda: number; coupling: number };
      close(
        reverse.k,
        marcusRate(
          energies[forward.from] - energies[forward.to],
          link.lambda,
          link.coupling,
          298.15,
        ),
        1e-10,
        1e-300,
      );
    }
  });
});

describe('kinetics.network: stiff networks', () => {
  it('A ⇌ B at 1e13/1e12 s⁻¹ with 1e-3 and 1e-2 s⁻¹ leaks matches the exact two-state solution', () => {
    // Exact solution of the 2×2 transient block (closed form with Vieta's formulas, so no
    // difference of the large rates is taken): det = k_f k_c + k_d k_b + k_d k_c,
    // ∫p_A = (k_b + k_c)/det, ∫p_B = k_f/det, p_B(t) = k_f (e^(λ1 t) − e^(λ2 t))/(λ1 − λ2).
    const kf = 1e13;
    const kb = 1e12;
    const kc = 1e-3;
    const kd = 1e-2;
    const { outputs } = run({
      states: [
        { id: 'A', energy: 1, kind: 'excited' },
        { id: 'B', energy: 0.9 },
        { id: 'C', energy: 0 },
        { id: 'D', energy: 0 },
      ],
      links: [
        { from: 'A', to: 'B', k: kf },
        { from: 'B', to: 'A', k: kb },
        { from: 'B', to: 'C', k: kc },
        { from: 'A', to: 'D', k: kd },
      ],
      timeStart: 1e-16,
      timeEnd: 1e4,
    });
    const det = kf * kc + kd * kb + kd * kc;
    const trace = kf + kb + kc + kd;
    const lambdaFast = -(trace + Math.sqrt(trace * trace - 4 * det)) / 2;
    const lambdaSlow = det / lambdaFast;
    close(outputs.yields.C, (kc * kf) / det, 1e-12);
    close(outputs.yields.D, (kd * (kb + kc)) / det, 1e-12);
    close(outputs.relaxationTimes[0], -1 / lambdaSlow, 1e-10);
    outputs.times.forEach((t: number, n: number) => {
      const pB =
        (kf * (Math.exp(lambdaSlow * t) - Math.exp(lambdaFast * t))) / (lambdaSlow - lambdaFast);
      const pC =
        ((kc * kf) / (lambdaSlow - lambdaFast)) *
        (Math.expm1(lambdaSlow * t) / lambdaSlow - Math.expm1(lambdaFast * t) / lambdaFast);
      close(outputs.populations.B[n], pB, 1e-9, 1e-15);
      close(outputs.populations.C[n], pC, 1e-8, 1e-300);
    });
  });

  it('agrees with mathjs expm on a five-state network spanning 1e-3 to 1e13 s⁻¹', () => {
    // mathjs expm (Padé with scaling and squaring, an independent implementation) at times where
    // ‖K t‖ stays moderate, so the reference itself is accurate.
    const rates = [
      [0, 1e13, 0, 0, 1e8],
      [2e11, 0, 5e9, 0, 0],
      [0, 1e7, 0, 3e6, 1e-3],
      [0, 0, 0, 0, 1e-2],
      [0, 0, 0, 0, 0],
    ];
    const n = rates.length;
    const k = Array.from({ length: n }, (_, j) =>
      Array.from({ length: n }, (__, i) =>
        i === j ? -rates[i].reduce((s, x) => s + x, 0) : rates[i][j],
      ),
    );
    for (const t of [1e-14, 3e-12, 2e-10, 5e-9]) {
      const reference = expm(matrix(k.map((row) => row.map((x) => x * t)))).toArray() as number[][];
      const p = populationsAt(rates, [1, 0, 0, 0, 0], t);
      for (let j = 0; j < n; j++) close(p[j], reference[j][0], 1e-7, 1e-12);
    }
  });
});

describe('kinetics.network: landscape, lifetimes, pathway, sensitivity', () => {
  it('places each ET transition state at G_i + (λ + ΔG°)²/(4λ) and builds the tree', () => {
    const { outputs } = run({
      states: [
        { id: 'S1', energy: 2.0, kind: 'excited' },
        { id: 'CS1', energy: 1.6, kind: 'chargeSeparated' },
        { id: 'CS2', energy: 1.2, kind: 'chargeSeparated' },
        { id: 'S0', energy: 0, kind: 'ground' },
      ],
      links: [
        { from: 'S1', to: 'CS1', lambda: 0.5, coupling: 0.005 },
        { from: 'CS1', to: 'CS2', lambda: 0.7, coupling: 0.002 },
        { from: 'CS2', to: 'S0', lambda: 0.8, coupling: 0.0005 },
        { from: 'S1', to: 'S0', lifetime: 5e-9 },
      ],
    });
    // By hand: 2.0 + (0.5 − 0.4)²/2.0 = 2.005; 1.6 + (0.7 − 0.4)²/2.8 = 1.632142857…;
    // 1.2 + (0.8 − 1.2)²/3.2 = 1.25.
    const ts = outputs.landscape.transitionStates.map((t: any) => t.energy);
    close(ts[0], 2.005, 1e-12);
    close(ts[1], 1.6 + 0.09 / 2.8, 1e-12);
    close(ts[2], 1.25, 1e-12);
    // Joins in order of rising TS energy: CS2–S0 at 1.25, then CS1 at 1.632…, then S1 at 2.005.
    const joins = outputs.landscape.tree.nodes.filter((n: any) => n.kind === 'join');
    expect(joins.map((j: any) => j.minima.length)).toEqual([2, 3, 4]);
    expect(outputs.landscape.tree.roots).toHaveLength(1);
    expect(outputs.landscape.decays).toEqual([{ link: 3, from: 'S1', to: 'S0', k: 2e8 }]);
  });

  it('gives the charge-separated lifetime from the eigenvalues and the sensitivity in closed form', () => {
    // A* → CS by ET (k_et, reverse negligible at ΔG° = −0.5 eV), A* → G by decay (k_d), CS → G by
    // decay (k_cs): φ_CS = k_et/(k_et + k_d), lifetime of CS = 1/k_cs.
    // Since k_et ∝ |H|², dφ/d ln|H| = 2φ(1 − φ); dφ/d ln λ = φ(1 − φ)·d ln k/d ln λ with
    // d ln k/d ln λ = −1/2 − (λ² − ΔG°²)/(4λk_BT) (differentiating the Marcus expression).
    const lambda = 0.6;
    const coupling = 0.001;
    const deltaG0 = -0.5;
    const kd = 1e8;
    const kcs = 2e5;
    const { outputs } = run({
      states: [
        { id: 'X', energy: 2, kind: 'excited' },
        { id: 'CS', energy: 1.5, kind: 'chargeSeparated' },
        { id: 'G', energy: 0, kind: 'ground' },
      ],
      links: [
        { from: 'X', to: 'CS', lambda, coupling },
        { from: 'X', to: 'G', k: kd },
        { from: 'CS', to: 'G', k: kcs },
      ],
    });
    const ket = marcusRate(deltaG0, lambda, coupling, 298.15);
    const phi = ket / (ket + kd);
    expect(outputs.longLived.state).toBe('CS');
    // The slow eigenvalue of the 2×2 block, with the detailed-balance back step CS → X
    // (k_et e^(ΔG°/k_BT)) included: λ_slow = det/λ_fast (Vieta), det = k_et k_cs + k_d k_b + k_d k_cs.
    const kb = ket * Math.exp(deltaG0 / KT);
    const det = ket * kcs + kd * kb + kd * kcs;
    const trace = ket + kd + kb + kcs;
    const lambdaSlow = det / (-(trace + Math.sqrt(trace * trace - 4 * det)) / 2);
    close(outputs.longLived.lifetime, -1 / lambdaSlow, 1e-9);
    close(outputs.longLived.formationYield, phi, 1e-6);
    expect(outputs.sensitivity.target).toBe('CS');
    const byParameter = Object.fromEntries(
      outputs.sensitivity.entries.map((e: any) => [e.parameter, e.dYieldDLn]),
    );
    close(byParameter.coupling, 2 * phi * (1 - phi), 1e-5);
    const dLnK = -0.5 - (lambda * lambda - deltaG0 * deltaG0) / (4 * lambda * KT);
    close(byParameter.lambda, phi * (1 - phi) * dLnK, 1e-4);
    expect(outputs.dominantPathway.states).toEqual(phi > 0.5 ? ['X', 'CS', 'G'] : ['X', 'G']);
  });

  it('warns about mixed states and steps faster than vibrational relaxation', () => {
    const { warnings } = run({
      states: [
        { id: 'A', energy: 0.01, kind: 'excited' },
        { id: 'B', energy: 0 },
        { id: 'C', energy: -0.3 },
      ],
      links: [
        { from: 'A', to: 'B', lambda: 0.5, coupling: 0.02 },
        { from: 'B', to: 'C', k: 5e13 },
      ],
    });
    const codes = warnings.map((w) => w.code);
    expect(codes).toContain('mixed-states');
    expect(codes).toContain('step-too-fast');
    const quiet = run({
      states: [
        { id: 'A', energy: 0.3, kind: 'excited' },
        { id: 'B', energy: 0 },
      ],
      links: [{ from: 'A', to: 'B', lambda: 0.5, coupling: 0.002 }],
    });
    expect(quiet.warnings.map((w) => w.code)).not.toContain('mixed-states');
    expect(quiet.warnings.map((w) => w.code)).not.toContain('step-too-fast');
  });
});

describe('kinetics.network: final states joined by ET', () => {
  it('keeps the ground state final when recombination to it is an ET step', () => {
    // CS → G by ET over 1.5 eV: the detailed-balance re-excitation G → CS (≈ e^(−58) of the
    // forward rate) is listed but left out, so G stays absorbing: yield 1, and the CS lifetime
    // is 1/k_CR exactly (a single exponential).
    const { outputs } = run({
      states: [
        { id: 'CS', energy: 1.5, kind: 'chargeSeparated' },
        { id: 'G', energy: 0, kind: 'ground' },
      ],
      links: [{ from: 'CS', to: 'G', lambda: 0.8, coupling: 0.0001 }],
      initial: 'CS',
    });
    const kcr = marcusRate(-1.5, 0.8, 0.0001, 298.15);
    const reverse = outputs.rates.find((r: any) => r.source === 'detailedBalance');
    expect(reverse.included).toBe(false);
    close(outputs.yields.G, 1, 1e-15);
    close(outputs.longLived.lifetime, 1 / kcr, 1e-9);
  });
});

describe('kinetics.network: refusals name the field', () => {
  it('refuses unknown states, bad numbers, duplicate steps and a missing start', () => {
    expect(
      refused({
        states: [{ id: 'A', energy: 0 }, { id: 'A' }],
        links: [
          { from: 'A', to: 'Z', k: 1 },
          { from: 'A', to: 'A', lambda: -1, coupling: 0.01 },
          { from: 'A', to: 'A' },
        ],
      }),
    ).toEqual(
      expect.arrayContaining([
        'states[1].id',
        'states[1].energy',
        'links[0].to',
        'links[1].lambda',
        'links[2].k',
        'initial',
      ]),
    );
    expect(
      refused({
        states: [
          { id: 'A', energy: 0, kind: 'excited' },
          { id: 'B', energy: 0 },
        ],
        links: [
          { from: 'A', to: 'B', lambda: 0.5, coupling: 0.01 },
          { from: 'B', to: 'A', lambda: 0.5, coupling: 0.01 },
          { from: 'A', to: 'B', lambda: 0.1, coupling: 0.06 },
        ],
        timeEnd: 1e-20,
      }),
    ).toEqual(expect.arrayContaining(['links[1]', 'links[2].coupling', 'timeEnd']));
  });
});

describe('kinetics.network under uncertainty.monteCarlo', () => {
  it('gives yield intervals that follow the percentiles of the sampled rate', () => {
    // φ_B = k_B/(k_B + k_C) is monotone in k_B, so its 2.5 % and 97.5 % points are φ at the
    // normal's points k_B ± 1.96 σ (exact for the distribution; the sample adds ~2 % noise at
    // 2000 samples).
    const kB = 1e9;
    const sigma = 2e8;
    const kC = 1e9;
    const answer = calculate({
      method: 'uncertainty.monteCarlo',
      inputs: {
        method: 'kinetics.network',
        samples: 2000,
        seed: 7,
        inputs: {
          states: [
            { id: 'A', energy: 1, kind: 'excited' },
            { id: 'B', energy: 0 },
            { id: 'C', energy: 0 },
          ],
          links: [
            { from: 'A', to: 'B', k: { value: kB, sigma } },
            { from: 'A', to: 'C', k: kC },
          ],
          report: 'yields',
        },
      },
    });
    if (!answer.ok) throw new Error(JSON.stringify(answer.errors));
    const summary = (answer.outputs as any)['yields.B'];
    const phi = (k: number) => k / (k + kC);
    close(summary.median, phi(kB), 0.01);
    close(summary.p025, phi(kB - 1.96 * sigma), 0.02);
    close(summary.p975, phi(kB + 1.96 * sigma), 0.02);
    expect((answer.outputs as any).samplesUsed).toBe(2000);
  });
});

/** A donor–bridge–acceptor triad of our own invention (energies in eV, rates from Marcus). */
function triad() {
  return {
    states: [
      { id: 'S0', energy: 0, kind: 'ground' },
      { id: 'S1', energy: 2.1, kind: 'excited' },
      { id: 'T1', energy: 1.7, kind: 'excited' },
      { id: 'CS1', energy: 1.75, kind: 'chargeSeparated' },
      { id: 'CS2', energy: 1.45, kind: 'chargeSeparated' },
    ],
    links: [
      { from: 'S1', to: 'S0', lifetime: 3e-9 },
      { from: 'S1', to: 'T1', k: 1e8 },
      { from: 'T1', to: 'S0', lifetime: 2e-5 },
      { from: 'S1', to: 'CS1', lambda: 0.55, coupling: 0.004 },
      { from: 'T1', to: 'CS1', lambda: 0.55, coupling: 0.002 },
      { from: 'CS1', to: 'CS2', lambda: 0.6, coupling: 0.003 },
      { from: 'CS1', to: 'S0', lambda: 0.7, coupling: 0.003 },
      { from: 'CS2', to: 'S0', lambda: 0.8, coupling: 0.00005 },
      { from: 'CS2', to: 'T1', lambda: 0.8, coupling: 0.0001 },
    ],
  };
}
