/**
 * The one dispatcher of the calculation core: validates a request against CALC-API.md, converts
 * units, runs the method and returns the answer shape with warnings. It never throws, whatever it
 * is given, and never returns NaN or ±Infinity: a non-finite output for valid input is refused
 * as an internal error rather than shown as a number.
 */
import { isPlainObject, RequestInputReader, WarningCollector } from './inputs';
import {
  CalcRefusal,
  type CalcAnswer,
  type CalcOutputs,
  type CalcWarning,
  type FieldError,
  type MethodDefinition,
} from './method';
import { allMethods, findMethod } from './registry';
import type { MethodOutputs, TypedMethodId } from '../method-outputs';

const REQUEST_KEYS = new Set(['method', 'inputs']);

function refuse(errors: FieldError[]): CalcAnswer {
  return { ok: false, errors };
}

function describeThrown(thrown: unknown): string {
  return thrown instanceof Error ? thrown.message : String(thrown);
}

/** An answer whose outputs have the type `O` (see `MethodOutputs`). */
export type Answer<O> =
  | {
      readonly ok: true;
      readonly method: string;
      readonly outputs: O;
      readonly warnings: CalcWarning[];
    }
  | { readonly ok: false; readonly errors: FieldError[] };

/**
 * Runs a calculation request `{ method, inputs }` (CALC-API.md). Never throws.
 * Unknown method: error on field `method`; a request that is not an object: error on `request`.
 * A literal id of `MethodOutputs` types the outputs; any other request answers `CalcOutputs`.
 */
export function calculate<M extends TypedMethodId>(request: {
  readonly method: M;
  readonly inputs: unknown;
}): Answer<MethodOutputs[M]>;
export function calculate(request: unknown): CalcAnswer;
export function calculate(request: unknown): CalcAnswer {
  try {
    if (!isPlainObject(request)) {
      return refuse([
        {
          field: 'request',
          message: 'Request must be a JSON object { "method": …, "inputs": { … } }.',
        },
      ]);
    }
    const errors: FieldError[] = [];
    for (const key of Object.keys(request)) {
      if (!REQUEST_KEYS.has(key)) {
        errors.push({
          field: key,
          message: `Unknown field '${key}' in request; use method and inputs.`,
        });
      }
    }
    const methodId = request['method'];
    if (typeof methodId !== 'string') {
      errors.push({
        field: 'method',
        message:
          'Field method is required: a method id such as rate.marcus (see gapwise calc --help).',
      });
      return refuse(errors);
    }
    const method = findMethod(methodId);
    if (!method) {
      errors.push({ field: 'method', message: unknownMethodMessage(methodId) });
      return refuse(errors);
    }
    const answer = runDefinition(method, request['inputs']);
    if (errors.length === 0) return answer;
    return refuse(errors.concat(answer.ok ? [] : answer.errors));
  } catch (thrown) {
    return internalError('method', thrown);
  }
}

/**
 * Runs one method on raw inputs (bare numbers or `{ value, unit }`), as `calculate` does, for
 * callers that dispatch themselves (e.g. `uncertainty.monteCarlo`). Never throws.
 */
export function runMethod(methodId: string, rawInputs: unknown): CalcAnswer {
  try {
    const method = findMethod(methodId);
    if (!method) return refuse([{ field: 'method', message: unknownMethodMessage(methodId) }]);
    return runDefinition(method, rawInputs);
  } catch (thrown) {
    return internalError('method', thrown);
  }
}

function unknownMethodMessage(methodId: string): string {
  const known = allMethods()
    .map((m) => m.id)
    .join(', ');
  return `Unknown method '${methodId}'; known methods: ${known}.`;
}

function internalError(field: string, thrown: unknown): CalcAnswer {
  return refuse([
    {
      field,
      message: `Internal error (${describeThrown(thrown)}); this is a bug, please report it.`,
    },
  ]);
}

/** Runs a method definition on raw inputs (the registry-free core of `calculate`). */
export function runDefinition(method: MethodDefinition<any>, rawInputs: unknown): CalcAnswer {
  const reader = new RequestInputReader(rawInputs);
  const inputs = method.read(reader);
  const unknown = reader.unknownFields();
  if (unknown.length > 0) {
    const names = method.inputs.map((input) => input.name).join(', ');
    for (const field of unknown) {
      reader.fail(field, `Unknown input '${field}' for ${method.id}; its inputs are ${names}.`);
    }
  }
  if (reader.failed) return refuse([...reader.fieldErrors]);
  const warnings = new WarningCollector();
  reader.warnMixedReferences(warnings);
  let outputs: CalcOutputs;
  try {
    outputs = method.compute(inputs, warnings);
  } catch (thrown) {
    if (thrown instanceof CalcRefusal) return refuse(thrown.errors);
    return internalError('method', thrown);
  }
  const checked = finiteOutputs(outputs, 'outputs');
  if (!checked.ok) {
    return refuse([
      {
        field: checked.path,
        message:
          'Internal error: a non-finite output for valid input; this is a bug, please report it.',
      },
    ]);
  }
  return {
    ok: true,
    method: method.id,
    outputs: checked.value as CalcOutputs,
    warnings: warnings.list(),
  };
}

type Checked = { ok: true; value: unknown } | { ok: false; path: string };

/**
 * Copies outputs into plain JSON values (typed arrays become arrays) and rejects any NaN, ±∞,
 * function or other value JSON cannot carry. `null` is allowed (log10 k when k is exactly 0).
 */
function finiteOutputs(value: unknown, path: string): Checked {
  if (value === null || typeof value === 'string' || typeof value === 'boolean') {
    return { ok: true, value };
  }
  if (typeof value === 'number')
    return Number.isFinite(value) ? { ok: true, value } : { ok: false, path };
  if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
    return finiteOutputs(Array.from(value as unknown as ArrayLike<number>), path);
  }
  if (Array.isArray(value)) {
    const out: unknown[] = new Array(value.length);
    for (let i = 0; i < value.length; i++) {
      const item = finiteOutputs(value[i], `${path}[${i}]`);
      if (!item.ok) return item;
      out[i] = item.value;
    }
    return { ok: true, value: out };
  }
  if (isPlainObject(value)) {
    const out: Record<string, unknown> = {};
    for (const key of Object.keys(value)) {
      const item = value[key];
      if (item === undefined) continue;
      // Scalars inline: no path string or result object per field (the batch CLI's hot path).
      if (typeof item === 'number' && Number.isFinite(item)) {
        out[key] = item;
        continue;
      }
      if (item === null || typeof item === 'string' || typeof item === 'boolean') {
        out[key] = item;
        continue;
      }
      const checked = finiteOutputs(item, `${path}.${key}`);
      if (!checked.ok) return checked;
      out[key] = checked.value;
    }
    return { ok: true, value: out };
  }
  return { ok: false, path };
}

/**
 * The one serialisation of an answer, shared by the command line and the HTTP API so both give
 * byte-identical bodies for the same request.
 */
export function serializeAnswer(answer: CalcAnswer): string {
  return JSON.stringify(answer);
}

/**
 * The canonical (converted) values of a request's scalar inputs, for echoing back to the user
 * (VALIDATION.md general rules). Undefined when the request is refused.
 */
export function canonicalInputs(request: unknown): Record<string, number | string> | undefined {
  try {
    if (!isPlainObject(request) || typeof request['method'] !== 'string') return undefined;
    const method = findMethod(request['method']);
    if (!method) return undefined;
    const reader = new RequestInputReader(request['inputs']);
    method.read(reader);
    return reader.failed || reader.unknownFields().length > 0 ? undefined : { ...reader.echo };
  } catch {
    return undefined;
  }
}
