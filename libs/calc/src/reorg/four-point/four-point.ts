/**
 * `reorg.fourPoint`: Nelsen four-point inner-sphere reorganization energy (SCIENCE.md §6).
 */
import type { InputReader, MethodDefinition } from '../../core/method';
import { differenceScale } from '../../core/units';
import { WARNING_CODES } from '../../core/warnings';

/**
 * Four-point λ: λ₁ = E_initial(geom_final) − E_initial(geom_initial) and
 * λ₂ = E_final(geom_initial) − E_final(geom_final); λ_inner = λ₁ + λ₂ (the self-exchange pair sum
 * when initial/final are the neutral and charged states of one molecule).
 * References: S. F. Nelsen, S. C. Blackstock, Y. Kim, J. Am. Chem. Soc. 1987, 109, 677
 * (doi 10.1021/ja00237a007); J.-L. Brédas, D. Beljonne, V. Coropceanu, J. Cornil, Chem. Rev. 2004,
 * 104, 4971 (doi 10.1021/cr040084k). Both from memory.
 */
export function fourPointLambdas(
  initialAtInitial: number,
  initialAtFinal: number,
  finalAtFinal: number,
  finalAtInitial: number,
): { lambdaInitial: number; lambdaFinal: number; lambdaInner: number } {
  const lambdaInitial = initialAtFinal - initialAtInitial;
  const lambdaFinal = finalAtInitial - finalAtFinal;
  return { lambdaInitial, lambdaFinal, lambdaInner: lambdaInitial + lambdaFinal };
}

const FOUR_POINT_MESSAGE = 'Provide all four energies in one unit.';
const NAMES = ['initialAtInitial', 'initialAtFinal', 'finalAtFinal', 'finalAtInitial'] as const;

export interface FourPointInputs {
  /** The four energies as typed (same unit), so differences are taken before converting. */
  readonly typed: readonly [number, number, number, number];
  /** eV per typed unit. */
  readonly evPerUnit: number;
}

/** The typed number of a field already validated by the reader (bare or `{ value, unit }`). */
function typedValue(reader: InputReader, name: string): number {
  const raw = reader.raw(name);
  return typeof raw === 'number' ? raw : ((raw as { value: number }).value as number);
}

export const fourPointMethod = {
  id: 'reorg.fourPoint',
  summary: 'Inner-sphere λ from four energies (Nelsen four-point method).',
  references: [
    'S. F. Nelsen, S. C. Blackstock, Y. Kim, J. Am. Chem. Soc. 1987, 109, 677; doi 10.1021/ja00237a007',
    'J.-L. Brédas, D. Beljonne, V. Coropceanu, J. Cornil, Chem. Rev. 2004, 104, 4971; doi 10.1021/cr040084k',
  ],
  inputs: [
    {
      name: 'initialAtInitial',
      quantity: 'energy',
      required: true,
      description: 'Initial state at its own optimised geometry.',
    },
    {
      name: 'initialAtFinal',
      quantity: 'energy',
      required: true,
      description: 'Initial state at the final state’s geometry.',
    },
    {
      name: 'finalAtFinal',
      quantity: 'energy',
      required: true,
      description: 'Final state at its own optimised geometry.',
    },
    {
      name: 'finalAtInitial',
      quantity: 'energy',
      required: true,
      description: 'Final state at the initial state’s geometry.',
    },
  ],
  outputs: [
    { name: 'lambdaInner', unit: 'eV', description: 'λ_inner = λ_initial + λ_final.' },
    {
      name: 'lambdaInitial',
      unit: 'eV',
      description: 'λ₁ = E_initial(geom_final) − E_initial(geom_initial).',
    },
    {
      name: 'lambdaFinal',
      unit: 'eV',
      description: 'λ₂ = E_final(geom_initial) − E_final(geom_final).',
    },
  ],
  read(reader) {
    const values = NAMES.map((name) => reader.optionalQuantity(name, 'energy'));
    NAMES.forEach((name, i) => {
      if (values[i] === undefined) reader.fail(name, FOUR_POINT_MESSAGE);
      // Total energies of large molecules reach ~1e5 eV; far beyond that is a units slip.
      else if (Math.abs(values[i]!) > 1e9)
        reader.fail(name, `Field ${name} is outside the supported range (|value| ≤ 1e9 eV).`);
    });
    // A bare number is in eV, the canonical unit.
    const units = NAMES.map((name) => reader.unitOf(name) || 'eV');
    if (values.every((value) => value !== undefined && Number.isFinite(value))) {
      units.forEach((unit, i) => {
        if (unit !== units[0]) reader.fail(NAMES[i], FOUR_POINT_MESSAGE);
      });
    }
    if (reader.failed) return { typed: [0, 0, 0, 0], evPerUnit: 1 };
    const [a, b, c, d] = NAMES.map((name) => typedValue(reader, name));
    return { typed: [a, b, c, d], evPerUnit: differenceScale(units[0], 'energy') };
  },
  compute(inputs, sink) {
    const [ii, iF, ff, fi] = inputs.typed;
    // Differences in the typed unit first: totals of ~500 hartree lose digits if converted first.
    const typedLambdas = fourPointLambdas(ii, iF, ff, fi);
    const lambdaInitial = typedLambdas.lambdaInitial * inputs.evPerUnit;
    const lambdaFinal = typedLambdas.lambdaFinal * inputs.evPerUnit;
    if (lambdaInitial < 0 || lambdaFinal < 0) {
      sink.warn(
        WARNING_CODES.fourPointNegative,
        'A partial λ is negative: check that each geometry is the optimised minimum of its own ' +
          'state and that the four energies are not swapped.',
      );
    }
    return {
      lambdaInner: typedLambdas.lambdaInner * inputs.evPerUnit,
      lambdaInitial,
      lambdaFinal,
    };
  },
} satisfies MethodDefinition<FourPointInputs>;

/** What `reorg.fourPoint` answers (the compiler reads it through `MethodOutputs`). */
export type FourPointOutputs = ReturnType<(typeof fourPointMethod)['compute']>;
