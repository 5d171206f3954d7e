/**
 * The chunk computer's fast path (the core's kernels after a domain check) against its
 * reference path (the core's `calculate`, which validates every field): same ΔG°_CS, ΔG°_CR,
 * λ_outer, |H_AB| and warning bits for every row the fast path takes, and rows it declines are
 * exactly those the reference path refuses or that lie at its domain edges.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeChunk, deriveFast, deriveThroughCalculate, warningCodes } from './chunk-computer';
import type { InputChunk } from './screen-parser';

type Values = InputChunk['values'];
const KEYS = [
  'donorOxidation',
  'acceptorReduction',
  'excitationEnergy',
  'distance',
  'radiusDonor',
  'radiusAcceptor',
  'epsilon',
  'refractiveIndex',
  'epsilonReference',
  'chargeDonor',
  'chargeAcceptor',
  'lambdaInner',
  'lambdaOuter',
  'coupling',
  'coupling0',
  'distance0',
  'beta',
  'hbarOmega',
  'temperature',
] as const;

function chunkOf(rows: Array<Partial<Record<(typeof KEYS)[number], number>>>): InputChunk {
  const values = Object.fromEntries(
    KEYS.map((k) => [k, Float64Array.from(rows, (r) => r[k] ?? Number.NaN)]),
  ) as unknown as Values;
  return {
    index: 0,
    lines: rows.map((_, i) => i + 2),
    donor: rows.map((_, i) => `Med-${i}`),
    acceptor: rows.map((_, i) => `Med-${i + 100}`),
    solvent: rows.map(() => ''),
    values,
  } as InputChunk;
}

const nan = Number.NaN;
const row = fc.record({
  donorOxidation: fc.double({ min: -2, max: 2.5, noNaN: true }),
  acceptorReduction: fc.double({ min: -2.5, max: 1, noNaN: true }),
  excitationEnergy: fc.oneof(fc.double({ min: 0.5, max: 6, noNaN: true }), fc.constant(-1)),
  distance: fc.double({ min: 3, max: 40, noNaN: true }),
  radiusDonor: fc.oneof(fc.double({ min: 1, max: 8, noNaN: true }), fc.constant(nan)),
  radiusAcceptor: fc.double({ min: 1, max: 8, noNaN: true }),
  epsilon: fc.double({ min: 1, max: 80, noNaN: true }),
  refractiveIndex: fc.double({ min: 1, max: 1.8, noNaN: true }),
  epsilonReference: fc.oneof(fc.constant(nan), fc.double({ min: 1, max: 80, noNaN: true })),
  chargeDonor: fc.oneof(
    { arbitrary: fc.constant(nan), weight: 6 },
    { arbitrary: fc.integer({ min: -3, max: 3 }), weight: 3 },
    { arbitrary: fc.constant(0.5), weight: 1 },
  ),
  chargeAcceptor: fc.oneof(
    { arbitrary: fc.constant(nan), weight: 6 },
    { arbitrary: fc.integer({ min: -3, max: 3 }), weight: 3 },
    { arbitrary: fc.constant(12), weight: 1 },
  ),
  lambdaInner: fc.double({ min: 0, max: 0.5, noNaN: true }),
  lambdaOuter: fc.oneof(fc.constant(nan), fc.double({ min: 0.1, max: 1.5, noNaN: true })),
  coupling: fc.oneof(fc.constant(nan), fc.double({ min: 1e-5, max: 0.05, noNaN: true })),
  coupling0: fc.oneof(fc.double({ min: 0.001, max: 20, noNaN: true }), fc.constant(nan)),
  distance0: fc.double({ min: 2, max: 5, noNaN: true }),
  beta: fc.double({ min: 0, max: 2, noNaN: true }),
  hbarOmega: fc.oneof(fc.constant(nan), fc.double({ min: 0.05, max: 0.25, noNaN: true })),
  temperature: fc.double({ min: 100, max: 600, noNaN: true }),
});

const close = (a: number, b: number) =>
  (Number.isNaN(a) && Number.isNaN(b)) || Math.abs(a - b) <= 1e-12 * Math.max(1, Math.abs(b));

describe('screen chunk computer: fast path equals the calculate path', () => {
  it('gives the same derived values and warning bits for every row it takes', () => {
    let fast = 0;
    fc.assert(
      fc.property(row, (r) => {
        const v = chunkOf([r]).values;
        const out = new Float64Array(5);
        const ref = deriveThroughCalculate(v, 0);
        if (!deriveFast(v, 0, out)) {
          // Declined rows: the reference path refuses them, or they sit at a domain edge.
          return;
        }
        fast++;
        expect(ref.refused).toBe(false);
        expect(close(out[0], ref.dCs)).toBe(true);
        expect(close(out[1], ref.dCr)).toBe(true);
        expect(close(out[2], ref.lambdaOuter)).toBe(true);
        expect(close(out[3], ref.coupling)).toBe(true);
        expect(warningCodes(out[4])).toEqual(warningCodes(ref.mask));
      }),
      // Fixed seed: how many generated rows take the fast path must not vary between runs.
      { numRuns: 800, seed: 20261202 },
    );
    expect(fast).toBeGreaterThan(100);
  });

  it('declines every row the calculate path refuses (refusals keep their messages)', () => {
    fc.assert(
      fc.property(row, (r) => {
        const v = chunkOf([r]).values;
        if (deriveThroughCalculate(v, 0).refused)
          expect(deriveFast(v, 0, new Float64Array(5))).toBe(false);
      }),
      { numRuns: 600 },
    );
  });

  it('carries no reference-electrode advice on a plain row (no "other" warning)', () => {
    const c = chunkOf([
      {
        donorOxidation: 0.9,
        acceptorReduction: -1.2,
        excitationEnergy: 2.5,
        distance: 9,
        radiusDonor: 3.8,
        radiusAcceptor: 4,
        epsilon: 35.94,
        refractiveIndex: 1.3442,
        lambdaInner: 0.2,
        coupling: 0.005,
        temperature: 298.15,
      },
    ]);
    const result = computeChunk(c, { kind: 'cs-fast-cr-inverted' });
    expect(warningCodes(result.warningMask[0])).not.toContain('other');
    expect(Number.isFinite(result.log10kCsMarcus[0])).toBe(true);
  });
});
