import seedrandom from 'seedrandom';
import { describe, expect, it } from 'vitest';

import { calculate } from '../../methods/calculate';
import { computeOk, computeRefused, numberOutput } from '../../methods/testing/answers';

import {
  einsteinMobilityCm2PerVS,
  hoppingMethod,
  hoppingTransport,
  logMarcusRate,
  piWeightedDiffusionCm2PerS,
  randomWalkDiffusionCm2PerS,
} from './hopping';

const warnCodes = (inputs: Parameters<typeof hoppingTransport>[0]) => {
  const codes: string[] = [];
  hoppingMethod.compute(inputs, { warn: (code) => codes.push(code) });
  return codes;
};

/**
 * Continuous-time kinetic Monte Carlo of independent walkers (Gillespie 1977): each walker waits
 * an exponential time with the total rate, then hops to a neighbour chosen ∝ its rate.
 * Returns D = ⟨|r(t)|²⟩/(2nt) and its standard error over walkers (cm² s⁻¹).
 */
function kineticMonteCarlo(
  vectorsAngstrom: number[][],
  rates: number[],
  dimensions: number,
  totalTime: number,
  walkers: number,
  seed: string,
): { diffusion: number; standardError: number } {
  const random = seedrandom(seed);
  const totalRate = rates.reduce((a, b) => a + b, 0);
  const squared: number[] = [];
  for (let w = 0; w < walkers; w++) {
    const position = new Array(dimensions).fill(0);
    let time = -Math.log(1 - random()) / totalRate;
    while (time < totalTime) {
      let pick = random() * totalRate;
      let j = 0;
      while (pick > rates[j] && j < rates.length - 1) pick -= rates[j++];
      for (let d = 0; d < dimensions; d++) position[d] += vectorsAngstrom[j][d];
      time += -Math.log(1 - random()) / totalRate;
    }
    squared.push(position.reduce((s, x) => s + (x * 1e-8) ** 2, 0));
  }
  const mean = squared.reduce((a, b) => a + b, 0) / walkers;
  const variance = squared.reduce((s, x) => s + (x - mean) ** 2, 0) / (walkers - 1);
  const scale = 1 / (2 * dimensions * totalTime);
  return { diffusion: mean * scale, standardError: Math.sqrt(variance / walkers) * scale };
}

describe('hopping kernels', () => {
  it('gives the exact 1D chain result D = r²k (SCIENCE.md §12)', () => {
    expect(randomWalkDiffusionCm2PerS([3.5, 3.5], [2e12, 2e12], 1)).toBeCloseTo(
      3.5e-8 ** 2 * 2e12,
      20,
    );
  });

  it('has the P_i-weighted form smaller by the number of neighbours (SCIENCE.md §12)', () => {
    const random = randomWalkDiffusionCm2PerS([4, 4, 4, 4], [1e12, 1e12, 1e12, 1e12], 2);
    const weighted = piWeightedDiffusionCm2PerS([4, 4, 4, 4], [1e12, 1e12, 1e12, 1e12], 2);
    expect(random / weighted).toBeCloseTo(4, 12);
  });

  it('agrees with a seeded kinetic Monte Carlo on an anisotropic 2D lattice', () => {
    // Two bond types with different lengths and rates; KMC is an independent algorithm.
    const vectors = [
      [4, 0],
      [-4, 0],
      [0, 6],
      [0, -6],
    ];
    const rates = [3, 3, 1, 1];
    const exact = randomWalkDiffusionCm2PerS([4, 4, 6, 6], rates, 2);
    const kmc = kineticMonteCarlo(vectors, rates, 2, 50, 4000, 'hopping-kmc');
    expect(Math.abs(kmc.diffusion - exact)).toBeLessThan(4 * kmc.standardError);
    expect(kmc.standardError / exact).toBeLessThan(0.03);
  });

  it('matches the Marcus example k = 8.978e10 s⁻¹ (SCIENCE.md §1)', () => {
    expect(Math.exp(logMarcusRate(0.01, -0.3, 0.8, 298.15)) / 8.978e10).toBeCloseTo(1, 3);
  });

  it('uses k_BT/e = 0.025852 V at 300 K for the mobility (SCIENCE.md §16)', () => {
    expect(einsteinMobilityCm2PerVS(0.025852, 300)).toBeCloseTo(1, 5);
  });
});

describe('transport.hopping method', () => {
  const base = {
    neighbours: [
      { distanceAngstrom: 5, couplingEv: 0.005, deltaG0Ev: 0 },
      { distanceAngstrom: 5, couplingEv: -0.005, deltaG0Ev: 0 },
    ],
    lambdaEv: 0.2,
    temperatureK: 300,
    dimensions: 1 as const,
    form: 'random-walk' as const,
  };

  it('reports rates, D = r²k for the symmetric chain, and μ = D/(k_BT/e)', () => {
    const out = hoppingTransport(base);
    const k = Math.exp(logMarcusRate(0.005, 0, 0.2, 300));
    expect(out.rates[0]).toBeCloseTo(k, 0);
    expect(out.rates[1]).toBe(out.rates[0]);
    expect(out.diffusion / (5e-8 ** 2 * k)).toBeCloseTo(1, 12);
    expect(out.mobility).toBeCloseTo(out.diffusion / (8.617333262e-5 * 300), 15);
  });

  it('gives k = 0 and a null log10 for J = 0', () => {
    const out = hoppingTransport({
      ...base,
      neighbours: [{ distanceAngstrom: 5, couplingEv: 0, deltaG0Ev: 0 }],
    });
    expect(out.rates).toEqual([0]);
    expect(out.log10Rates).toEqual([null]);
    expect(out.diffusion).toBe(0);
  });

  it('warns hopping-band-regime when J > λ/4 or J > k_BT (B27)', () => {
    expect(warnCodes(base)).toEqual([]);
    expect(
      warnCodes({ ...base, neighbours: [{ distanceAngstrom: 5, couplingEv: 0.06, deltaG0Ev: 0 }] }),
    ).toEqual(['hopping-band-regime', 'coupling-large']); // J > k_BT is also B4 (SCIENCE.md §3)
  });

  it('warns hopping-pi-weighted-form and halves D on the chain with that form (B28)', () => {
    expect(warnCodes({ ...base, form: 'pi-weighted' })).toEqual(['hopping-pi-weighted-form']);
    const out = hoppingTransport({ ...base, form: 'pi-weighted' });
    expect(out.diffusion / out.diffusionRandomWalk).toBeCloseTo(0.5, 12);
  });
});

describe('transport.hopping through the dispatcher', () => {
  const neighbour = { distance: 5, coupling: { value: 40, unit: 'cm-1' }, deltaG0: 0 };

  it('computes with units in the neighbour list', () => {
    const answer = computeOk('transport.hopping', {
      neighbors: [neighbour, { ...neighbour, distance: { value: 0.5, unit: 'nm' } }],
      lambda: 0.2,
      temperature: 300,
      dimensions: 1,
    });
    const rates = answer.outputs['rates'] as number[];
    expect(rates[0]).toBe(rates[1]);
    expect(numberOutput(answer, 'diffusion') / (5e-8 ** 2 * rates[0])).toBeCloseTo(1, 12);
  });

  it('refuses an empty list, a zero distance and n ∉ {1, 2, 3} (A26)', () => {
    const message = 'Need ≥ 1 neighbour with r > 0 and n = 1, 2 or 3.';
    expect(
      computeRefused('transport.hopping', {
        neighbors: [],
        lambda: 0.2,
        temperature: 300,
        dimensions: 1,
      }),
    ).toEqual([{ field: 'neighbors', message }]);
    const errors = computeRefused('transport.hopping', {
      neighbors: [{ ...neighbour, distance: 0 }],
      lambda: 0.2,
      temperature: 300,
      dimensions: 4,
    });
    expect(errors).toContainEqual({ field: 'neighbors[0].distance', message });
    expect(errors).toContainEqual({ field: 'dimensions', message });
  });

  describe('the same refusals and ranges as the rate methods', () => {
    const request = (inputs: object) => ({
      neighbors: [{ distance: 5, coupling: 0.005 }],
      lambda: 0.2,
      temperature: 300,
      dimensions: 1,
      ...inputs,
    });

    it('refuses 2|J| ≥ λ as class III, as rate.marcus does (VALIDATION.md A5)', () => {
      const marcus = computeRefused('rate.marcus', {
        deltaG0: 0,
        lambda: 0.2,
        coupling: 0.1,
        temperature: 300,
      });
      const errors = computeRefused(
        'transport.hopping',
        request({
          neighbors: [
            { distance: 5, coupling: 0.005 },
            { distance: 5, coupling: 0.1 },
          ],
        }),
      );
      expect(errors).toContainEqual({ field: 'neighbors[1].coupling', message: marcus[0].message });
    });

    it('treats λ = 1e-300 eV as rate.marcus does (same warnings, same refusal or rate)', () => {
      const marcus = calculate({
        method: 'rate.marcus',
        inputs: { deltaG0: 0, lambda: 1e-300, coupling: 0.005, temperature: 300 },
      });
      const hopping = calculate({
        method: 'transport.hopping',
        inputs: request({ lambda: 1e-300 }),
      });
      expect(hopping.ok).toBe(marcus.ok);
      if (hopping.ok && marcus.ok) {
        expect(hopping.warnings.map((w) => w.code)).toContain('lambda-below-kt');
        expect(marcus.warnings.map((w) => w.code)).toContain('lambda-below-kt');
        expect((hopping.outputs['log10Rates'] as number[])[0]).toBeCloseTo(
          marcus.outputs['log10k'] as number,
          9,
        );
      }
      // Beyond the energy range the rate methods accept, both refuse on λ.
      const tooLarge = computeRefused('transport.hopping', request({ lambda: 1e6 }));
      expect(tooLarge.map((e) => e.field)).toContain('lambda');
    });

    it('reports couplingRegime per hop and the §3 warnings', () => {
      const answer = computeOk(
        'transport.hopping',
        request({
          neighbors: [
            { distance: 5, coupling: 0.005 },
            { distance: 5, coupling: 0.05 },
          ],
        }),
      );
      expect(answer.outputs['couplingRegimes']).toEqual(['nonadiabatic', 'intermediate']);
      expect(answer.warnings.map((w) => w.code)).toContain('coupling-large');
    });
  });
});

describe('hopping tensor, principal values, contributions and validity (SCIENCE.md §12)', () => {
  const k = Math.exp(logMarcusRate(0.005, 0, 0.2, 300));
  const cubic = (a: number) =>
    [
      [a, 0, 0],
      [-a, 0, 0],
      [0, a, 0],
      [0, -a, 0],
      [0, 0, a],
      [0, 0, -a],
    ].map((v) => ({
      distanceAngstrom: a,
      couplingEv: 0.005,
      deltaG0Ev: 0,
      vectorAngstrom: v as [number, number, number],
    }));

  it('gives the isotropic simple-cubic result D_xx = D_yy = D_zz = a²k (6 neighbours, n = 3)', () => {
    // Closed form: D = (1/2n) Σ r²k = (1/6)·6a²k = a²k (random walk; Coropceanu et al. 2007).
    const out = hoppingTransport({
      neighbours: cubic(4),
      lambdaEv: 0.2,
      temperatureK: 300,
      dimensions: 3,
      form: 'random-walk',
    });
    const a2k = 4e-8 ** 2 * k;
    expect(out.diffusion / a2k).toBeCloseTo(1, 12);
    const t = out.diffusionTensor!;
    for (let i = 0; i < 3; i++) expect(t[i][i] / a2k).toBeCloseTo(1, 12);
    expect(t[0][1]).toBe(0);
    const kT = 8.617333262e-5 * 300;
    expect(out.principalMobility!.largest / (a2k / kT)).toBeCloseTo(1, 10);
    expect(out.principalMobility!.smallest / (a2k / kT)).toBeCloseTo(1, 10);
    // Einstein relation μ = eD/k_BT (Einstein 1905) holds for the scalar and the trace.
    expect(out.mobility).toBeCloseTo(out.diffusion / kT, 15);
    expect(out.contributions.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 14);
    expect(out.contributions[0]).toBeCloseTo(1 / 6, 14);
  });

  it('gives the 1D chain tensor D_xx = a²k and zero elsewhere (D = ka² along the chain)', () => {
    const out = hoppingTransport({
      neighbours: [
        { distanceAngstrom: 3.5, couplingEv: 0.005, deltaG0Ev: 0, vectorAngstrom: [3.5, 0, 0] },
        { distanceAngstrom: 3.5, couplingEv: 0.005, deltaG0Ev: 0, vectorAngstrom: [-3.5, 0, 0] },
      ],
      lambdaEv: 0.2,
      temperatureK: 300,
      dimensions: 1,
      form: 'random-walk',
    });
    expect(out.diffusionTensor![0][0] / (3.5e-8 ** 2 * k)).toBeCloseTo(1, 12);
    expect(out.diffusion / out.diffusionTensor![0][0]).toBeCloseTo(1, 12);
    expect(out.principalMobility!.middle).toBe(0);
    expect(Math.abs(out.principalAxes![0][0])).toBeCloseTo(1, 12);
  });

  it('finds the principal axes of a lattice rotated by 30° in the plane (eigenvalues invariant)', () => {
    const c = Math.cos(Math.PI / 6);
    const s = Math.sin(Math.PI / 6);
    const rot = (x: number, y: number): [number, number, number] => [
      c * x - s * y,
      s * x + c * y,
      0,
    ];
    const base = [
      { v: [4, 0], J: 0.008 },
      { v: [-4, 0], J: 0.008 },
      { v: [0, 6], J: 0.003 },
      { v: [0, -6], J: 0.003 },
    ];
    const make = (turn: boolean) =>
      hoppingTransport({
        neighbours: base.map((b) => ({
          distanceAngstrom: Math.hypot(b.v[0], b.v[1]),
          couplingEv: b.J,
          deltaG0Ev: 0,
          vectorAngstrom: turn ? rot(b.v[0], b.v[1]) : [b.v[0], b.v[1], 0],
        })),
        lambdaEv: 0.2,
        temperatureK: 300,
        dimensions: 2,
        form: 'random-walk',
      });
    const plain = make(false);
    const turned = make(true);
    expect(turned.principalMobility!.largest / plain.mobilityTensor![0][0]).toBeCloseTo(1, 10);
    expect(turned.principalMobility!.middle / plain.mobilityTensor![1][1]).toBeCloseTo(1, 10);
    const axis = turned.principalAxes![0];
    expect(Math.abs(axis[0] * c + axis[1] * s)).toBeCloseTo(1, 10);
  });

  it('flags hops with |J| > λ/4 or |J| > k_BT as band or transient-localization', () => {
    const out = hoppingTransport({
      neighbours: [
        { distanceAngstrom: 5, couplingEv: 0.005, deltaG0Ev: 0 },
        { distanceAngstrom: 5, couplingEv: 0.08, deltaG0Ev: 0 },
      ],
      lambdaEv: 0.2,
      temperatureK: 300,
      dimensions: 1,
      form: 'random-walk',
    });
    expect(out.validity.map((v) => v.regime)).toEqual([
      'hopping',
      'band-or-transient-localization',
    ]);
    expect(out.validity[1].couplingOverLambda).toBeCloseTo(0.4, 12);
    expect(out.diffusionTensor).toBeNull();
  });

  it('reads vectors through the dispatcher and refuses a mix of vectors and distances', () => {
    const answer = computeOk('transport.hopping', {
      neighbors: [
        { vector: [3, 4, 0], coupling: 0.005 },
        { vector: [{ value: -0.3, unit: 'nm' }, -4], coupling: 0.005 },
      ],
      lambda: 0.2,
      temperature: 300,
      dimensions: 2,
    });
    expect(numberOutput(answer, 'diffusion') / (5e-8 ** 2 * k * 0.5)).toBeCloseTo(1, 10);
    const errors = computeRefused('transport.hopping', {
      neighbors: [
        { vector: [3, 4, 0], coupling: 0.005 },
        { distance: 5, coupling: 0.005 },
      ],
      lambda: 0.2,
      temperature: 300,
      dimensions: 2,
    });
    expect(errors.map((e) => e.field)).toContain('neighbors');
    const clash = computeRefused('transport.hopping', {
      neighbors: [{ vector: [3, 4, 0], distance: 6, coupling: 0.005 }],
      lambda: 0.2,
      temperature: 300,
      dimensions: 2,
    });
    expect(clash.map((e) => e.field)).toEqual(['neighbors[0].distance']);
  });

  it('propagates σ on λ and couplings by uncertainty.monteCarlo (interval brackets nominal)', () => {
    const answer = computeOk('uncertainty.monteCarlo', {
      method: 'transport.hopping',
      inputs: {
        neighbors: [
          { distance: 5, coupling: { value: 0.005, sigma: 0.001 } },
          { distance: 5, coupling: { value: 0.005, sigma: 0.001 } },
        ],
        lambda: { value: 0.2, sigma: 0.02 },
        temperature: 300,
        dimensions: 1,
      },
      samples: 2000,
      seed: 7,
    });
    const mobility = answer.outputs['mobility'] as { p025: number; median: number; p975: number };
    const nominal = hoppingTransport(base1D()).mobility;
    expect(mobility.p025).toBeLessThan(nominal);
    expect(mobility.p975).toBeGreaterThan(nominal);
    expect(mobility.median / nominal).toBeGreaterThan(0.8);
    expect(mobility.median / nominal).toBeLessThan(1.25);
  });
});

function base1D() {
  return {
    neighbours: [
      { distanceAngstrom: 5, couplingEv: 0.005, deltaG0Ev: 0 },
      { distanceAngstrom: 5, couplingEv: 0.005, deltaG0Ev: 0 },
    ],
    lambdaEv: 0.2,
    temperatureK: 300,
    dimensions: 1 as const,
    form: 'random-walk' as const,
  };
}
