/**
 * `evb.multiState`: adiabatic states of a multi-state diabatic Hamiltonian.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { MethodDefinition } from '../../core/method';
import { MAX_ENERGY_EV } from '../../rates/rate-inputs';

/** Largest Hamiltonian accepted (the eigen-solver is O(n³) per sweep). */
export const MAX_STATES = 200;
/** Relative asymmetry |H_ij − H_ji| / max|H| above which the matrix is refused. */
const SYMMETRY_TOLERANCE = 1e-12;

export interface Eigensystem {
  /** Eigenvalues in ascending order, eV. */
  readonly energies: number[];
  /** vectors[k] is the normalised eigenvector of energies[k] (largest component positive). */
  readonly vectors: number[][];
}

/** Scales a vector to unit length and turns it so its largest-magnitude component is positive. */
function normaliseVector(vector: readonly number[]): number[] {
  const norm = Math.hypot(...vector);
  let pivot = 0;
  for (let i = 1; i < vector.length; i++) {
    if (Math.abs(vector[i]) > Math.abs(vector[pivot]) + 1e-12) pivot = i;
  }
  const sign = vector[pivot] < 0 ? -1 : 1;
  return vector.map((component) => (sign * component) / norm);
}

/**
 * Eigenvalues and eigenvectors of a real symmetric Hamiltonian by ml-matrix's
 * `EigenvalueDecomposition` (Householder tridiagonalisation and the symmetric QL algorithm, the
 * JAMA port of EISPACK tred2/tql2; G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed.,
 * Johns Hopkins 2013, §8.3), sorted ascending, with a deterministic sign for each vector.
 * ml-matrix is used rather than mathjs because loading mathjs costs seconds at every start of the
 * command line and a worker; the specs check the result against mathjs `eigs` (Jacobi rotations)
 * as an independent reference.
 */
export function symmetricEigensystem(hamiltonianEv: readonly (readonly number[])[]): Eigensystem {
  const n = hamiltonianEv.length;
  if (n === 1) return { energies: [hamiltonianEv[0][0]], vectors: [[1]] };
  // Symmetrise exactly so round-off asymmetry below the tolerance cannot upset the solver.
  // Elements below 1e-30 of the largest one are set to zero: they cannot change any eigenvalue
  // at double precision (relative 1e-16), and subnormal numbers stall the QL iteration.
  const scale = Math.max(...hamiltonianEv.flat().map(Math.abs));
  const matrix = hamiltonianEv.map((row, i) =>
    row.map((value, j) => {
      const symmetric = 0.5 * (value + hamiltonianEv[j][i]);
      return Math.abs(symmetric) < 1e-30 * scale || Math.abs(symmetric) < 1e-300 ? 0 : symmetric;
    }),
  );
  const decomposition = new EigenvalueDecomposition(new Matrix(matrix), { assumeSymmetric: true });
  const columns = decomposition.eigenvectorMatrix.transpose().to2DArray();
  const pairs = decomposition.realEigenvalues
    .map((value, k) => ({ value, vector: normaliseVector(columns[k]) }))
    .sort((a, b) => a.value - b.value);
  return { energies: pairs.map((p) => p.value), vectors: pairs.map((p) => p.vector) };
}

export interface MultiStateInputs {
  readonly hamiltonianEv: number[][];
}

export const multiStateMethod = {
  id: 'evb.multiState',
  summary: 'Adiabatic energies and states of a symmetric multi-state diabatic Hamiltonian.',
  references: [
    'G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed., Johns Hopkins University Press 2013, §8.3 (symmetric QR/QL)',
    'J. H. Wilkinson, C. Reinsch, Handbook for Automatic Computation II: Linear Algebra, Springer 1971 (tred2/tql2)',
  ],
  inputs: [
    {
      name: 'hamiltonian',
      quantity: 'array',
      required: true,
      label: 'Diabatic Hamiltonian',
      description:
        'Square symmetric matrix of diabatic energies and couplings, eV (elements may be { value, unit }).',
    },
  ],
  outputs: [
    { name: 'energies', unit: 'eV', description: 'Adiabatic energies, ascending.' },
    {
      name: 'vectors',
      unit: '',
      description: 'vectors[k]: normalised eigenvector of energies[k] in the diabatic basis.',
    },
  ],
  read(reader) {
    const hamiltonianEv = reader.quantityMatrix('hamiltonian', 'energy');
    const n = hamiltonianEv.length;
    if (n === 0 || reader.failed) return { hamiltonianEv };
    if (hamiltonianEv[0].length !== n) {
      reader.fail('hamiltonian', 'Hamiltonian must be a square matrix.');
    } else if (n > MAX_STATES) {
      reader.fail('hamiltonian', `Hamiltonian larger than ${MAX_STATES} states is not supported.`);
    } else {
      const scale = Math.max(...hamiltonianEv.flat().map(Math.abs));
      if (scale > MAX_ENERGY_EV) {
        reader.fail(
          'hamiltonian',
          `Hamiltonian elements must satisfy |H_ij| ≤ ${MAX_ENERGY_EV} eV.`,
        );
      }
      for (let i = 0; i < n; i++) {
        for (let j = i + 1; j < n; j++) {
          if (Math.abs(hamiltonianEv[i][j] - hamiltonianEv[j][i]) > SYMMETRY_TOLERANCE * scale) {
            reader.fail(`hamiltonian[${i}][${j}]`, 'Hamiltonian must be symmetric (H_ij = H_ji).');
          }
        }
      }
    }
    return { hamiltonianEv };
  },
  compute(inputs) {
    return { ...symmetricEigensystem(inputs.hamiltonianEv) };
  },
} satisfies MethodDefinition<MultiStateInputs>;

/** What `evb.multiState` answers (the compiler reads it through `MethodOutputs`). */
export type MultiStateOutputs = ReturnType<(typeof multiStateMethod)['compute']>;
