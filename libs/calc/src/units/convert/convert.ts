/**
 * `units.convert`: converts a value between two units of the same kind (CALC-API.md).
 */
import type { InputReader, MethodDefinition } from '../../core/method';
import { convertUnits, knownUnits, tryConvertUnits, unitDimension } from '../../core/units';

export interface ConvertInputs {
  readonly value: number;
  readonly from: string;
  readonly to: string;
}

function readUnitName(reader: InputReader, name: string): string {
  const raw = reader.raw(name);
  if (typeof raw === 'string') return raw;
  reader.fail(
    name,
    raw === undefined
      ? `Field ${name} is required.`
      : `Field ${name} must be a unit string, one of ${knownUnits().join(', ')}.`,
  );
  return '';
}

export const convertMethod = {
  id: 'units.convert',
  summary: 'Converts a value between units of one kind (energy ↔ cm⁻¹ ↔ hartree are all energies).',
  references: [
    'E. Tiesinga, P. J. Mohr, D. B. Newell, B. N. Taylor, Rev. Mod. Phys. 2021, 93, 025010 (CODATA 2018); doi 10.1103/RevModPhys.93.025010',
  ],
  inputs: [
    {
      name: 'value',
      quantity: 'dimensionless',
      required: true,
      description: 'The number to convert.',
    },
    {
      name: 'from',
      quantity: 'string',
      required: true,
      description: `Unit of value: ${knownUnits().join(', ')}.`,
    },
    {
      name: 'to',
      quantity: 'string',
      required: true,
      description: 'Target unit, of the same kind.',
    },
  ],
  outputs: [{ name: 'value', unit: '', description: 'The value in the target unit.' }],
  read(reader) {
    const value = reader.number('value');
    const from = readUnitName(reader, 'from');
    const to = readUnitName(reader, 'to');
    if (from !== '' && to !== '' && Number.isFinite(value)) {
      const result = tryConvertUnits(value, from, to);
      if (!result.ok) {
        reader.fail(result.field, result.message);
      } else if (!Number.isFinite(result.value)) {
        reader.fail('value', 'Field value is out of range after conversion.');
      } else if (unitDimension(from) === 'temperature' && convertUnits(value, from, 'K') < 0) {
        reader.fail('value', 'Temperature below absolute zero (0 K).');
      }
    }
    return { value, from, to };
  },
  compute(inputs) {
    const result = tryConvertUnits(inputs.value, inputs.from, inputs.to);
    return { value: result.ok ? result.value : Number.NaN };
  },
} satisfies MethodDefinition<ConvertInputs>;

/** What `units.convert` answers (the compiler reads it through `MethodOutputs`). */
export type ConvertOutputs = ReturnType<(typeof convertMethod)['compute']>;
