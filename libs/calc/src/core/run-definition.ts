/**
 * Runs one method definition on raw inputs: reads and validates them, computes, and checks that
 * every output is a finite JSON value. The bottom of the dispatcher: it knows no registry, so a
 * method that runs another (`uncertainty.monteCarlo`) calls this with the definition it was given,
 * and the dispatcher above (`methods/calculate.ts`) adds the lookup by id.
 */
import { isPlainObject, RequestInputReader, WarningCollector } from './inputs';
import {
  CalcRefusal,
  type CalcAnswer,
  type CalcOutputs,
  type FieldError,
  type MethodDefinition,
} from './method';

/** A refusal answer with these field errors. */
export function refuse(errors: FieldError[]): CalcAnswer {
  return { ok: false, errors };
}

function describeThrown(thrown: unknown): string {
  return thrown instanceof Error ? thrown.message : String(thrown);
}

/** The answer for an exception that escaped a method: a bug, said as one, never a crash. */
export function internalError(field: string, thrown: unknown): CalcAnswer {
  return refuse([
    {
      field,
      message: `Internal error (${describeThrown(thrown)}); this is a bug, please report it.`,
    },
  ]);
}

/** Runs a method definition on raw inputs (the registry-free core of `calculate`). Never throws for a method that reads through the reader.. */
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
