/**
 * The binary COPY payload of screen results, read back by the real PostgreSQL of the test
 * cluster: every value arrives exactly as written (doubles round-trip exactly in JavaScript and
 * in PostgreSQL ≥ 12, whose float8 output is the shortest exact decimal), non-finite values and
 * the regimes of rates not computed arrive as NULL, any UTF-8 text arrives unchanged.
 */
import fc from 'fast-check';
import pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testClusterUrl } from '../../../../test/api/support/test-database';
import type { ChunkResult } from './chunk-computer';
import { SCREEN_RESULT_COPY_COLUMNS, screenResultsCopyPayload } from './pg-binary-copy';

let client: pg.Client;
const SCREEN = '0b8f7a52-3c1d-4e6f-9a0b-123456789abc';

beforeAll(async () => {
  client = new pg.Client({ connectionString: testClusterUrl() });
  await client.connect();
  // The column types of screen_results (migration 1796176187568), as a temporary table.
  await client.query(`CREATE TEMP TABLE results_copy (
    screen_id uuid NOT NULL, row_number integer NOT NULL, donor text NOT NULL,
    acceptor text NOT NULL, solvent text NOT NULL, delta_g_cs double precision,
    delta_g_cr double precision, lambda_inner double precision, lambda_outer double precision,
    lambda_total double precision, coupling double precision, temperature_k double precision,
    log10k_cs_marcus double precision, log10k_cr_marcus double precision,
    log10k_cs_mlj double precision, log10k_cr_mlj double precision, regime_cs text,
    regime_cr text, warning_mask integer NOT NULL, score double precision)`);
});
afterAll(async () => {
  await client?.end();
});

function chunk(values: number[], texts: string[]): ChunkResult {
  const n = values.length;
  const col = (shift: number) => Float64Array.from(values, (_, i) => values[(i + shift) % n]!);
  return {
    size: n,
    lines: values.map((_, i) => i + 2),
    donor: values.map((_, i) => texts[i % texts.length]!),
    acceptor: values.map((_, i) => `A${i}`),
    solvent: values.map((_, i) => (i % 2 ? '' : 'acetonitrile')),
    deltaGCs: col(0),
    deltaGCr: col(1),
    lambdaInner: col(2),
    lambdaOuter: col(3),
    lambdaTotal: col(4),
    coupling: col(5),
    temperature: col(6),
    log10kCsMarcus: col(7),
    log10kCrMarcus: col(8),
    log10kCsMlj: col(9),
    log10kCrMlj: col(10),
    regimeCs: Uint8Array.from(values, (_, i) => i % 3),
    regimeCr: Uint8Array.from(values, (_, i) => (i + 1) % 3),
    warningMask: Int32Array.from(values, (_, i) => (i * 37) % 1024),
    score: col(11),
  };
}

async function copyAndReadBack(r: ChunkResult): Promise<Record<string, unknown>[]> {
  await client.query('TRUNCATE results_copy');
  const payload = screenResultsCopyPayload(SCREEN, r);
  const stream = client.query(
    copyFrom(
      `COPY results_copy (${SCREEN_RESULT_COPY_COLUMNS.join(', ')}) FROM STDIN (FORMAT binary)`,
    ),
  );
  await pipeline(Readable.from([payload]), stream);
  const { rows } = await client.query('SELECT * FROM results_copy ORDER BY row_number');
  return rows;
}

const same = (a: unknown, b: unknown) => Object.is(a, b);
const orNull = (v: number) => (Number.isFinite(v) ? v : null);
const REGIME = ['normal', 'activationless', 'inverted'];

function expectRows(rows: Record<string, unknown>[], r: ChunkResult): boolean {
  if (rows.length !== r.size) return false;
  return rows.every((row, i) => {
    const ok =
      row['screen_id'] === SCREEN &&
      row['row_number'] === r.lines[i] &&
      row['donor'] === r.donor[i] &&
      row['acceptor'] === r.acceptor[i] &&
      row['solvent'] === r.solvent[i] &&
      same(row['delta_g_cs'], orNull(r.deltaGCs[i]!)) &&
      same(row['delta_g_cr'], orNull(r.deltaGCr[i]!)) &&
      same(row['lambda_inner'], orNull(r.lambdaInner[i]!)) &&
      same(row['lambda_outer'], orNull(r.lambdaOuter[i]!)) &&
      same(row['lambda_total'], orNull(r.lambdaTotal[i]!)) &&
      same(row['coupling'], orNull(r.coupling[i]!)) &&
      same(row['temperature_k'], orNull(r.temperature[i]!)) &&
      same(row['log10k_cs_marcus'], orNull(r.log10kCsMarcus[i]!)) &&
      same(row['log10k_cr_marcus'], orNull(r.log10kCrMarcus[i]!)) &&
      same(row['log10k_cs_mlj'], orNull(r.log10kCsMlj[i]!)) &&
      same(row['log10k_cr_mlj'], orNull(r.log10kCrMlj[i]!)) &&
      row['regime_cs'] ===
        (Number.isFinite(r.log10kCsMarcus[i]!) ? REGIME[r.regimeCs[i]!] : null) &&
      row['regime_cr'] ===
        (Number.isFinite(r.log10kCrMarcus[i]!) ? REGIME[r.regimeCr[i]!] : null) &&
      row['warning_mask'] === r.warningMask[i] &&
      same(row['score'], orNull(r.score[i]!));
    if (!ok) console.error('row differs', i, row);
    return ok;
  });
}

describe('screenResultsCopyPayload', () => {
  it('arrives exactly: extreme doubles, −0, NaN and ±∞ as NULL, regimes only with a rate', async () => {
    const values = [
      0,
      -0,
      1,
      -0.3,
      8.617333262e-5,
      Number.MIN_VALUE,
      2.2250738585072014e-308,
      Number.MAX_VALUE,
      -1e300,
      Math.PI,
      Number.NaN,
      Number.POSITIVE_INFINITY,
      Number.NEGATIVE_INFINITY,
    ];
    const r = chunk(values, ['ZnP', 'Ru(bpy)₃²⁺', 'é', '']);
    const rows = await copyAndReadBack(r);
    expect(expectRows(rows, r)).toBe(true);
    expect(rows.filter((row) => row['regime_cs'] === null).length).toBeGreaterThan(0);
    expect(Object.is(rows[1]!['delta_g_cs'], -0)).toBe(true);
  });

  it('round-trips any doubles and any text (fast-check)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.double(), { minLength: 1, maxLength: 40 }),
        fc.array(fc.string({ unit: 'grapheme' }), { minLength: 1, maxLength: 5 }),
        async (values, texts) => {
          // PostgreSQL text holds no NUL character.
          const clean = texts.map((t) => t.replace(/\0/g, ''));
          const r = chunk(values, clean);
          return expectRows(await copyAndReadBack(r), r);
        },
      ),
      { numRuns: 40 },
    );
  });

  it('refuses a screen id that is not a UUID', () => {
    expect(() => screenResultsCopyPayload('screen-1', chunk([1], ['D']))).toThrow(/UUID/);
  });
});
