/**
 * The one dispatcher of the calculation core: validates a request against CALC-API.md, converts
 * units, runs the method and returns the answer shape with warnings. It never throws, whatever it
 * is given, and never returns NaN or ±Infinity: a non-finite output for valid input is refused
 * as an internal error rather than shown as a number.
 */
import { isPlainObject } from '../core/inputs';
import type { CalcAnswer, CalcWarning, FieldError } from '../core/method';
import { internalError, refuse, runDefinition } from '../core/run-definition';
import type { MethodOutputs, TypedMethodId } from './method-outputs';
import { allMethods, findMethod } from './registry';

const REQUEST_KEYS = new Set(['method', 'inputs']);

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

function unknownMethodMessage(methodId: string): string {
  const known = allMethods()
    .map((m) => m.id)
    .join(', ');
  return `Unknown method '${methodId}'; known methods: ${known}.`;
}

/**
 * The one serialisation of an answer, shared by the command line and the HTTP API so both give
 * byte-identical bodies for the same request.
 */
export function serializeAnswer(answer: CalcAnswer): string {
  return JSON.stringify(answer);
}
