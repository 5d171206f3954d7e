import fc from 'fast-check';
import { eigs } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeOk, computeRefused } from '../../methods/testing/answers';

/** Tridiagonal Toeplitz matrix a on the diagonal, b beside it. */
function chain(n: number, a: number, b: number): number[][] {
  return Array.from({ length: n }, (_, i) =>
    Array.from({ length: n }, (_, j) => (i === j ? a : Math.abs(i - j) === 1 ? b : 0)),
  );
}

function energiesOf(hamiltonian: number[][]) {
  const answer = computeOk('evb.multiState', { hamiltonian });
  return {
    energies: answer.outputs['energies'] as number[],
    vectors: answer.outputs['vectors'] as number[][],
  };
}

describe('evb.multiState', () => {
  it('agrees with mathjs eigs (Jacobi rotations, an independent general-purpose solver)', () => {
    // A 4-state donor–bridge–bridge–acceptor Hamiltonian (eV); values invented for the check.
    const hamiltonian = [
      [0.0, 0.05, 0.0, 0.0],
      [0.05, 0.8, 0.12, 0.0],
      [0.0, 0.12, 0.75, 0.04],
      [0.0, 0.0, 0.04, -0.1],
    ];
    const reference = (eigs(hamiltonian).values as number[]).map(Number).sort((x, y) => x - y);
    const { energies } = energiesOf(hamiltonian);
    energies.forEach((energy, k) => expect(energy).toBeCloseTo(reference[k], 12));
  });

  it('gives a + 2b cos(kπ/(n + 1)) for a tridiagonal Toeplitz chain (exact, e.g. Golub & Van Loan)', () => {
    const [n, a, b] = [6, 0.3, -0.05];
    const exact = Array.from(
      { length: n },
      (_, k) => a + 2 * b * Math.cos(((k + 1) * Math.PI) / (n + 1)),
    ).sort((x, y) => x - y);
    const { energies } = energiesOf(chain(n, a, b));
    energies.forEach((energy, k) => expect(energy).toBeCloseTo(exact[k], 10));
  });

  it('returns orthonormal eigenvectors with H v = E v for random symmetric matrices', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 6 }).chain((n) =>
          fc
            .array(fc.double({ min: -1, max: 1, noNaN: true }), {
              minLength: n * n,
              maxLength: n * n,
            })
            .map((flat) => {
              const m = Array.from({ length: n }, (_, i) => flat.slice(i * n, i * n + n));
              return m.map((row, i) => row.map((_, j) => (i <= j ? m[i][j] : m[j][i])));
            }),
        ),
        (h) => {
          const { energies, vectors } = energiesOf(h);
          for (let k = 1; k < energies.length; k++)
            expect(energies[k]).toBeGreaterThanOrEqual(energies[k - 1]);
          vectors.forEach((v, k) => {
            const hv = h.map((row) => row.reduce((sum, value, j) => sum + value * v[j], 0));
            hv.forEach((component, i) => expect(component).toBeCloseTo(energies[k] * v[i], 8));
            vectors.forEach((w, l) => {
              const dot = v.reduce((sum, value, i) => sum + value * w[i], 0);
              expect(dot).toBeCloseTo(k === l ? 1 : 0, 8);
            });
          });
        },
      ),
      { numRuns: 60 },
    );
  });

  it('agrees with the two-state closed form for 2×2 (splitting 2|H| at the crossing)', () => {
    const { energies } = energiesOf([
      [0.1, 0.04],
      [0.04, 0.1],
    ]);
    expect(energies[1] - energies[0]).toBeCloseTo(0.08, 12);
  });

  it('accepts elements with units', () => {
    const { energies } = energiesOf([
      [
        { value: 0, unit: 'cm-1' },
        { value: 806.5543937, unit: 'cm-1' },
      ] as unknown as number[],
      [
        { value: 806.5543937, unit: 'cm-1' },
        { value: 0, unit: 'cm-1' },
      ] as unknown as number[],
    ]);
    expect(energies[1] - energies[0]).toBeCloseTo(0.2, 12);
  });

  it('refuses non-square, asymmetric and non-numeric matrices', () => {
    expect(computeRefused('evb.multiState', { hamiltonian: [[1, 2]] })[0].message).toBe(
      'Hamiltonian must be a square matrix.',
    );
    expect(
      computeRefused('evb.multiState', {
        hamiltonian: [
          [1, 2],
          [3, 4],
        ],
      })[0],
    ).toEqual({
      field: 'hamiltonian[0][1]',
      message: 'Hamiltonian must be symmetric (H_ij = H_ji).',
    });
    expect(
      computeRefused('evb.multiState', {
        hamiltonian: [
          [1, 'x'],
          ['x', 4],
        ],
      })[0].field,
    ).toBe('hamiltonian[0][1]');
    expect(computeRefused('evb.multiState', { hamiltonian: [] })[0].field).toBe('hamiltonian');
  });
});
