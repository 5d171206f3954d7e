/**
 * Test helpers for specs of the calculation core: run a request through the real dispatcher and
 * unwrap the answer, failing with the refusal's messages when it was not what the test expects.
 */
import { calculate } from '../calculate';
import type { CalcAnswer, CalcWarning, FieldError } from '../../core/method';

export type OkAnswer = Extract<CalcAnswer, { ok: true }>;

/** Runs `{ method, inputs }` and returns the successful answer (throws with the errors if refused). */
export function computeOk(method: string, inputs: unknown): OkAnswer {
  const answer = calculate({ method, inputs });
  if (!answer.ok) throw new Error(`${method} refused: ${JSON.stringify(answer.errors)}`);
  return answer;
}

/** Runs `{ method, inputs }` and returns the refusal's errors (throws if it was computed). */
export function computeRefused(method: string, inputs: unknown): FieldError[] {
  const answer = calculate({ method, inputs });
  if (answer.ok)
    throw new Error(`${method} computed but should refuse: ${JSON.stringify(answer.outputs)}`);
  return answer.errors;
}

/** Output `name` of a successful answer as a number. */
export function numberOutput(answer: OkAnswer, name: string): number {
  const value = answer.outputs[name];
  if (typeof value !== 'number')
    throw new Error(`output ${name} is not a number: ${String(value)}`);
  return value;
}

export function warningCodes(answer: OkAnswer): string[] {
  return answer.warnings.map((w: CalcWarning) => w.code);
}

/** Relative difference |a − b| / |b|. */
export function relativeError(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}
