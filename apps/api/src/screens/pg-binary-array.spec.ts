/**
 * Binary array parameters, read back by the real PostgreSQL of the test cluster: every value must
 * arrive exactly as written — the reference is PostgreSQL's own decoding (array_recv) compared
 * with what node-postgres' text encoding of the same values gives, and JavaScript's exact
 * round trip of doubles (shortest decimal output of float8 since PostgreSQL 12, documented under
 * extra_float_digits).
 */
import fc from 'fast-check';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testClusterUrl } from '../../../../test/api/support/test-database';
import { float8ArrayParam, int4ArrayParam, textArrayParam } from './pg-binary-array';

let client: pg.Client;

beforeAll(async () => {
  client = new pg.Client({ connectionString: testClusterUrl() });
  await client.connect();
});
afterAll(async () => {
  await client.end();
});

/** Elements of `$1::<type>[]` as PostgreSQL decoded them, in order, with its own length. */
async function readBack(param: unknown, type: string): Promise<{ values: unknown[]; n: number }> {
  const { rows } = await client.query(
    `SELECT coalesce(array_length($1::${type}[], 1), 0) AS n,
            array(SELECT x FROM unnest($1::${type}[]) WITH ORDINALITY AS t(x, i) ORDER BY i) AS values`,
    [param],
  );
  return { values: rows[0].values as unknown[], n: rows[0].n as number };
}

/** Equality that tells −0 from +0 (Object.is) and treats null alike. */
function sameValues(actual: unknown[], expected: unknown[]): boolean {
  return actual.length === expected.length && actual.every((v, i) => Object.is(v, expected[i]));
}

describe('float8ArrayParam', () => {
  it('arrives exactly, with non-finite values as NULL, like the text encoding of the same array', async () => {
    const values = [
      0,
      -0,
      1,
      -0.3,
      8.617333262e-5,
      Number.MIN_VALUE, // smallest subnormal
      2.2250738585072014e-308, // smallest normal
      Number.MAX_VALUE,
      -1e300,
      Math.PI,
      Number.NaN,
      Number.POSITIVE_INFINITY,
      Number.NEGATIVE_INFINITY,
    ];
    const expected = values.map((v) => (Number.isFinite(v) ? v : null));
    const binary = await readBack(float8ArrayParam(values), 'float8');
    const text = await readBack(expected, 'float8');
    expect(binary.n).toBe(values.length);
    expect(sameValues(binary.values, expected)).toBe(true);
    // The text encoding writes −0 as "0" (String(−0) === '0'); binary keeps the sign.
    const textIndexOfNegativeZero = 1;
    expect(Object.is(text.values[textIndexOfNegativeZero], 0)).toBe(true);
    expect(Object.is(binary.values[textIndexOfNegativeZero], -0)).toBe(true);
    const others = (list: unknown[]) => list.filter((_, i) => i !== textIndexOfNegativeZero);
    expect(sameValues(others(binary.values), others(text.values))).toBe(true);
  });

  it('round-trips any double (fast-check)', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(fc.double(), { maxLength: 50 }), async (values) => {
        const { values: back } = await readBack(float8ArrayParam(values), 'float8');
        return sameValues(
          back,
          values.map((v) => (Number.isFinite(v) ? v : null)),
        );
      }),
      { numRuns: 60 },
    );
  });

  it('reads a Float64Array and an empty array', async () => {
    const typed = new Float64Array([1.5, -2.25, 1e-12]);
    expect((await readBack(float8ArrayParam(typed), 'float8')).values).toEqual([1.5, -2.25, 1e-12]);
    expect(await readBack(float8ArrayParam([]), 'float8')).toEqual({ values: [], n: 0 });
  });
});

describe('int4ArrayParam', () => {
  it('arrives exactly at the int32 bounds and refuses a value outside them', async () => {
    const values = new Int32Array([0, 1, -1, 2147483647, -2147483648, 42]);
    expect((await readBack(int4ArrayParam(values), 'int4')).values).toEqual(Array.from(values));
    expect(() => int4ArrayParam([2147483648])).toThrow(RangeError);
  });
});

describe('textArrayParam', () => {
  it('arrives exactly for UTF-8 text, empty strings and NULL', async () => {
    const values = ['PTZ', '', 'λ-dyad (Ru²⁺/Ru³⁺)', 'naïve, "quoted" {braces}', null, '🧪'];
    const binary = await readBack(textArrayParam(values), 'text');
    expect(binary.values).toEqual(values);
    expect(binary.values).toEqual((await readBack(values, 'text')).values);
  });

  it('round-trips any string without NUL (fast-check)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.option(fc.string({ unit: 'grapheme' }).filter((s) => !s.includes('\0'))), {
          maxLength: 30,
        }),
        async (values) => {
          const { values: back } = await readBack(textArrayParam(values), 'text');
          return back.length === values.length && back.every((v, i) => v === values[i]);
        },
      ),
      { numRuns: 60 },
    );
  });
});
