/**
 * `gapwise calc --help`, generated from the method registry (`methodCatalog`), so the help can
 * never list a method, input or unit the dispatcher does not know.
 */
import { methodCatalog, type CatalogEntry } from '@gapwise/calc';

function describeInput(input: CatalogEntry['inputs'][number]): string {
  const unit = input.unit === '' ? input.quantity : `${input.quantity}, ${input.unit}`;
  const others = input.units.filter((u) => u !== input.unit);
  const accepted = others.length > 0 ? ` (also ${others.join(', ')})` : '';
  const need = input.required
    ? 'required'
    : input.defaultValue !== undefined
      ? `optional, default ${input.defaultValue}`
      : 'optional';
  return `      ${input.name.padEnd(20)} ${unit}${accepted}; ${need}. ${input.description}`;
}

function describeMethod(method: CatalogEntry): string[] {
  return [
    `  ${method.id}`,
    `    ${method.summary}`,
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
    '',
    'Exit codes: 0 every answer ok; 2 a request was refused, named an unknown method or was not',
    'valid JSON (in --batch: any line); 1 malformed command line.',
    '',
    'Methods:',
    ...methodCatalog().flatMap((method) => [...describeMethod(method), '']),
  ].join('\n');
}
