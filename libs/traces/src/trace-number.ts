/**
 * Strict decimal number reading straight from bytes (no string per value on the fast path).
 *
 * Grammar (VALIDATION.md general rules): `[+-]? (digits [. digits?] | . digits) ([eE] [+-]? digits)?`
 * — decimal point `.` only, optional exponent; no hex, no `_`, no locale comma, no `nan`/`inf`.
 *
 * Method: Clinger's fast path. While the significand has at most 15 significant digits it is an
 * exact double (< 2^53), and 10^k is an exact double for |k| ≤ 22, so one IEEE multiplication or
 * division gives the correctly rounded value. Anything else falls back to `Number(text)` on the
 * already validated text, which is also correctly rounded. Out-of-range input ('1e400') yields
 * ±Infinity and is reported by the caller as non-finite.
 *
 * Reference: W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990,
 * doi:10.1145/93542.93557.
 */

const EXACT_POWERS_OF_TEN = Float64Array.from({ length: 23 }, (_, k) => 10 ** k);

/** Sentinel returned for text that does not follow the grammar. */
export const NOT_A_NUMBER = Symbol('not-a-number');

const PLUS = 0x2b;
const MINUS = 0x2d;
const DOT = 0x2e;
const ZERO = 0x30;
const NINE = 0x39;
const LOWER_E = 0x65;
const UPPER_E = 0x45;

/** Status codes of `parseStrictInto`. */
export const PARSED = 0;
export const NOT_NUMBER = 1;

/**
 * Reads bytes [start, end) of `buf` as a number. Returns the value (possibly ±Infinity when the
 * text overflows a double) or `NOT_A_NUMBER` when the text breaks the grammar.
 */
export function readStrictNumber(
  buf: Uint8Array,
  start: number,
  end: number,
): number | typeof NOT_A_NUMBER {
  return parseStrictInto(buf, start, end, scratch) === PARSED ? scratch[0] : NOT_A_NUMBER;
}

/** One reusable slot for `readStrictNumber` (the parse is synchronous). */
const scratch = new Float64Array(1);

/**
 * The strict reader for hot loops: writes the value to `out[0]` and returns `PARSED`
 * or `NOT_NUMBER` — a small integer, so no number object is allocated per call.
 */
export function parseStrictInto(
  buf: Uint8Array,
  start: number,
  end: number,
  out: Float64Array,
): number {
  let i = start;
  if (i >= end) return NOT_NUMBER;
  let negative = false;
  let c = buf[i];
  if (c === PLUS || c === MINUS) {
    negative = c === MINUS;
    i++;
  }
  let significand = 0;
  let significantDigits = 0;
  let decimalExponent = 0;
  let digits = 0;
  while (i < end) {
    c = buf[i];
    if (c < ZERO || c > NINE) break;
    if (significand !== 0 || c !== ZERO) {
      significand = significand * 10 + (c - ZERO);
      significantDigits++;
    }
    digits++;
    i++;
  }
  if (i < end && buf[i] === DOT) {
    i++;
    while (i < end) {
      c = buf[i];
      if (c < ZERO || c > NINE) break;
      if (significand !== 0 || c !== ZERO) {
        significand = significand * 10 + (c - ZERO);
        significantDigits++;
      }
      decimalExponent--;
      digits++;
      i++;
    }
  }
  if (digits === 0) return NOT_NUMBER;
  if (i < end && (buf[i] === LOWER_E || buf[i] === UPPER_E)) {
    i++;
    let exponentNegative = false;
    if (i < end && (buf[i] === PLUS || buf[i] === MINUS)) {
      exponentNegative = buf[i] === MINUS;
      i++;
    }
    let exponent = 0;
    let exponentDigits = 0;
    while (i < end) {
      c = buf[i];
      if (c < ZERO || c > NINE) break;
      if (exponent < 1e6) exponent = exponent * 10 + (c - ZERO);
      exponentDigits++;
      i++;
    }
    if (exponentDigits === 0) return NOT_NUMBER;
    decimalExponent += exponentNegative ? -exponent : exponent;
  }
  if (i !== end) return NOT_NUMBER;
  if (significand === 0) {
    out[0] = negative ? -0 : 0;
  } else if (significantDigits <= 15 && decimalExponent >= -22 && decimalExponent <= 22) {
    const magnitude =
      decimalExponent >= 0
        ? significand * EXACT_POWERS_OF_TEN[decimalExponent]
        : significand / EXACT_POWERS_OF_TEN[-decimalExponent];
    out[0] = negative ? -magnitude : magnitude;
  } else {
    out[0] = Number(latin1(buf, start, end));
  }
  return PARSED;
}

/** Text of bytes [start, end) read as Latin-1 (for messages and the slow path). */
export function latin1(buf: Uint8Array, start: number, end: number): string {
  let text = '';
  for (let i = start; i < end; i++) text += String.fromCharCode(buf[i]);
  return text;
}

/** Words many languages parse as floats that the strict grammar refuses as non-finite (A18). */
const NON_FINITE_WORDS = new Set([
  'nan',
  'inf',
  'infinity',
  '+nan',
  '-nan',
  '+inf',
  '-inf',
  '+infinity',
  '-infinity',
]);

export function isNonFiniteWord(text: string): boolean {
  return NON_FINITE_WORDS.has(text.toLowerCase());
}
