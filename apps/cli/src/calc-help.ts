/**
 * `gapwise calc --help`, generated from the method registry (`methodCatalog`), so the help can
 * never list a method, input or unit the dispatcher does not know.
 */
import {
  FERROCENE_SOLVENTS,
  methodCatalog,
  REFERENCE_ELECTRODES,
  type CatalogEntry,
} from '@gapwise/calc';

function describeInput(input: CatalogEntry['inputs'][number]): string {
  const unit = input.unit === '' ? input.quantity : `${input.quantity}, ${input.unit}`;
  const others = input.units.filter((u) => u !== input.unit);
  const accepted = others.length > 0 ? ` (also ${others.join(', ')})` : '';
  const need = input.required
    ? 'required'
    : input.defaultValue !== undefined
      ? `optional, default ${input.defaultValue}`
      : 'optional';
  const scale = input.referenced ? ' Accepts a reference electrode (see above).' : '';
  return `      ${input.name.padEnd(20)} ${unit}${accepted}; ${need}. ${input.description}${scale}`;
}

function describeMethod(method: CatalogEntry): string[] {
  return [
    `  ${method.id}`,
    `    ${method.summary}`,
    ...method.references.map((reference) => `    source: ${reference}`),
    '    inputs:',
    ...method.inputs.map(describeInput),
    '    outputs:',
    ...method.outputs.map(
      (output) =>
        `      ${output.name.padEnd(20)} ${output.unit === '' ? '-' : output.unit}. ${output.description}`,
    ),
    '    sources:',
    ...method.references.map((reference) => `      ${reference}`),
  ];
}

export function calcHelp(): string {
  return [
    'Usage:',
    '  gapwise calc < request.json           one request in, one answer line out',
    '  gapwise calc --batch < requests.jsonl one request per line, one answer per line, in order',
    '',
    'Request: { "method": "<id>", "inputs": { "<name>": number | { "value": number, "unit": "<unit>" } } }',
    'A bare number is in the canonical unit shown below.',
    'An energy of light (excitation energy) also accepts a wavelength: { "value": 496, "unit": "nm" }.',
    'An electrode potential may name its reference electrode and solvent and is put on SHE:',
    `  { "value": 0.35, "unit": "V", "reference": "Fc", "solvent": "MeCN" }; reference one of`,
    `  ${REFERENCE_ELECTRODES.join(', ')}; Fc needs solvent ${FERROCENE_SOLVENTS.join(', ')}.`,
    '',
    'Exit codes: 0 every answer ok; 2 a request was refused, named an unknown method or was not',
    'valid JSON (in --batch: any line); 1 malformed command line.',
    '',
    'Methods:',
    ...methodCatalog().flatMap((method) => [...describeMethod(method), '']),
  ].join('\n');
}
