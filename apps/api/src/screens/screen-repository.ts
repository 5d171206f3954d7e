/** SQL for screens; returns plain objects (contracts shapes), never entities. */
import type { EntityManager } from 'typeorm';
import {
  SCREEN_NUMERIC_COLUMNS,
  type BadRowChoice,
  type Screen,
  type ScreenNumericColumn,
  type ScreenResultPage,
  type ScreenResultRow,
  type ScreenScoreKind,
  type ScreenStatus,
} from '@gapwise/contracts';
import { adiabaticityMeasures } from '@gapwise/calc';
import { warningCodes } from './chunk-computer';

export const COLUMN_SQL: Record<ScreenNumericColumn | 'donor' | 'acceptor', string> = {
  rowNumber: 'row_number',
  deltaGCs: 'delta_g_cs',
  deltaGCr: 'delta_g_cr',
  lambdaInner: 'lambda_inner',
  lambdaOuter: 'lambda_outer',
  lambdaTotal: 'lambda_total',
  coupling: 'coupling',
  temperature: 'temperature_k',
  log10kCsMarcus: 'log10k_cs_marcus',
  log10kCrMarcus: 'log10k_cr_marcus',
  log10kCsMlj: 'log10k_cs_mlj',
  log10kCrMlj: 'log10k_cr_mlj',
  score: 'score',
  donor: 'donor',
  acceptor: 'acceptor',
};

interface ScreenRow {
  id: string;
  workspace_id: string;
  name: string;
  status: string;
  input_hash: string;
  software_version: string;
  row_count: number;
  bad_row_count: number;
  bad_rows: Array<{ line: number; message: string }>;
  bad_row_choice: string;
  score_kind: string;
  score_floor_ev: number | null;
  score_hbar_omega_ev: number | null;
  chunk_count: number;
  chunks_done: number;
  rows_done: number;
  reused_from: string | null;
  error: string | null;
  upload_ms: number | null;
  created_at: Date;
  started_at: Date | null;
  finished_at: Date | null;
  now: Date;
}

function toScreen(r: ScreenRow): Screen {
  const start = r.started_at?.getTime() ?? null;
  const end = (r.finished_at ?? r.now).getTime();
  const seconds = start === null ? null : Math.max((end - start) / 1000, 1e-3);
  const rate = seconds === null || r.rows_done === 0 ? null : r.rows_done / seconds;
  const left = r.row_count - r.rows_done;
  return {
    id: r.id,
    workspaceId: r.workspace_id,
    name: r.name,
    status: r.status as ScreenStatus,
    inputHash: r.input_hash,
    softwareVersion: r.software_version,
    rowCount: r.row_count,
    badRowCount: r.bad_row_count,
    badRows: r.bad_rows,
    badRowChoice: r.bad_row_choice as BadRowChoice,
    score: {
      kind: r.score_kind as ScreenScoreKind,
      floorEv: r.score_floor_ev,
      assumedHbarOmegaEv: r.score_hbar_omega_ev,
    },
    progress: {
      rowsDone: r.rows_done,
      rowCount: r.row_count,
      chunksDone: r.chunks_done,
      chunkCount: r.chunk_count,
      rowsPerSecond: rate,
      etaSeconds: r.status === 'running' && rate ? left / rate : null,
    },
    reusedFrom: r.reused_from,
    error: r.error,
    uploadMs: r.upload_ms,
    createdAt: r.created_at.toISOString(),
    startedAt: r.started_at?.toISOString() ?? null,
    finishedAt: r.finished_at?.toISOString() ?? null,
  };
}

const SCREEN_COLUMNS = `id, workspace_id, name, status, input_hash, software_version, row_count, bad_row_count,
  bad_rows, bad_row_choice, score_kind, score_floor_ev, score_hbar_omega_ev, chunk_count, chunks_done, rows_done, reused_from,
  error, upload_ms, created_at, started_at, finished_at, now() AS now`;

export async function findScreen(db: EntityManager, id: string): Promise<Screen | null> {
  const rows: ScreenRow[] = await db.query(`SELECT ${SCREEN_COLUMNS} FROM screens WHERE id = $1`, [
    id,
  ]);
  return rows[0] ? toScreen(rows[0]) : null;
}

export async function screenWorkspace(db: EntityManager, id: string): Promise<string | null> {
  const rows: Array<{ workspace_id: string }> = await db.query(
    'SELECT workspace_id FROM screens WHERE id = $1',
    [id],
  );
  return rows[0]?.workspace_id ?? null;
}

export async function listScreens(db: EntityManager, workspaceId: string): Promise<Screen[]> {
  const rows: ScreenRow[] = await db.query(
    `SELECT ${SCREEN_COLUMNS} FROM screens WHERE workspace_id = $1 ORDER BY created_at DESC LIMIT 200`,
    [workspaceId],
  );
  return rows.map(toScreen);
}

/** One term of a custom score: weight × column. */
export interface CustomScoreTerm {
  readonly column: ScreenNumericColumn;
  readonly weight: number;
}

export interface ResultQuery {
  /** `custom` sorts by the custom score (only with `custom` terms). */
  readonly sort: ScreenNumericColumn | 'donor' | 'acceptor' | 'custom';
  readonly descending: boolean;
  readonly offset: number;
  readonly limit: number;
  readonly ranges: ReadonlyArray<{ column: ScreenNumericColumn; min?: number; max?: number }>;
  readonly regimeCs?: string;
  readonly regimeCr?: string;
  /** Rows carrying any of these warning bits. */
  readonly warningMask?: number;
  /** true: only rows without warnings. */
  readonly noWarnings?: boolean;
  /** Substring of donor or acceptor. */
  readonly q?: string;
  /** A custom score Σ weight × column (empty when a term's column is empty), sent per row. */
  readonly custom?: readonly CustomScoreTerm[];
}

/**
 * The SQL of the custom score, weights as parameters after `first` (columns come from the
 * COLUMN_SQL whitelist, never from the request text).
 */
function customSql(query: ResultQuery, first: number): { sql: string; params: number[] } {
  const terms = query.custom ?? [];
  if (!terms.length) return { sql: 'NULL::double precision', params: [] };
  return {
    sql: `(${terms.map((t, i) => `$${first + i}::double precision * ${COLUMN_SQL[t.column]}`).join(' + ')})`,
    params: terms.map((t) => t.weight),
  };
}

function whereOf(screenId: string, query: ResultQuery): { sql: string; params: unknown[] } {
  const params: unknown[] = [screenId];
  const parts = ['screen_id = $1'];
  for (const r of query.ranges) {
    const col = COLUMN_SQL[r.column];
    if (r.min !== undefined) {
      params.push(r.min);
      parts.push(`${col} >= $${params.length}`);
    }
    if (r.max !== undefined) {
      params.push(r.max);
      parts.push(`${col} <= $${params.length}`);
    }
  }
  if (query.regimeCs) {
    params.push(query.regimeCs);
    parts.push(`regime_cs = $${params.length}`);
  }
  if (query.regimeCr) {
    params.push(query.regimeCr);
    parts.push(`regime_cr = $${params.length}`);
  }
  if (query.warningMask) {
    params.push(query.warningMask);
    parts.push(`(warning_mask & $${params.length}) <> 0`);
  }
  if (query.noWarnings) parts.push('warning_mask = 0');
  if (query.q) {
    params.push(`%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`);
    parts.push(`(donor ILIKE $${params.length} OR acceptor ILIKE $${params.length})`);
  }
  return { sql: parts.join(' AND '), params };
}

const RESULT_COLUMNS = `row_number, donor, acceptor, solvent, delta_g_cs, delta_g_cr, lambda_inner, lambda_outer,
  lambda_total, coupling, temperature_k, log10k_cs_marcus, log10k_cr_marcus, log10k_cs_mlj, log10k_cr_mlj,
  regime_cs, regime_cr, warning_mask, score`;

interface ResultRow {
  row_number: number;
  donor: string;
  acceptor: string;
  solvent: string;
  delta_g_cs: number | null;
  delta_g_cr: number | null;
  lambda_inner: number | null;
  lambda_outer: number | null;
  lambda_total: number | null;
  coupling: number | null;
  temperature_k: number | null;
  log10k_cs_marcus: number | null;
  log10k_cr_marcus: number | null;
  log10k_cs_mlj: number | null;
  log10k_cr_mlj: number | null;
  regime_cs: string | null;
  regime_cr: string | null;
  warning_mask: number;
  score: number | null;
  custom_score?: number | null;
}

/**
 * The coupling regime of a row (CALC-API.md `couplingRegime`), from the stored |H_AB|, total λ and
 * T with the core's Landau–Zener γ at ν_n = 1e13 s⁻¹; a screen has no τ_L, so κ_A never applies.
 * Derived on reading because it is a pure function of stored columns (no column to keep in step).
 */
export function couplingRegimeOf(
  coupling: number | null,
  lambdaTotal: number | null,
  temperatureK: number | null,
): string | null {
  if (coupling === null || lambdaTotal === null || temperatureK === null) return null;
  if (!(lambdaTotal > 0) || !(temperatureK > 0) || !Number.isFinite(coupling)) return null;
  return adiabaticityMeasures(Math.abs(coupling), lambdaTotal, temperatureK).regime;
}

export function toResultRow(r: ResultRow): ScreenResultRow {
  return {
    rowNumber: r.row_number,
    donor: r.donor,
    acceptor: r.acceptor,
    solvent: r.solvent,
    deltaGCs: r.delta_g_cs,
    deltaGCr: r.delta_g_cr,
    lambdaInner: r.lambda_inner,
    lambdaOuter: r.lambda_outer,
    lambdaTotal: r.lambda_total,
    coupling: r.coupling,
    temperature: r.temperature_k,
    log10kCsMarcus: r.log10k_cs_marcus,
    log10kCrMarcus: r.log10k_cr_marcus,
    log10kCsMlj: r.log10k_cs_mlj,
    log10kCrMlj: r.log10k_cr_mlj,
    regimeCs: r.regime_cs,
    regimeCr: r.regime_cr,
    couplingRegime: couplingRegimeOf(r.coupling, r.lambda_total, r.temperature_k),
    warnings: warningCodes(r.warning_mask),
    score: r.score,
    ...(r.custom_score !== undefined && r.custom_score !== null
      ? { customScore: r.custom_score }
      : {}),
  };
}

function orderOf(query: ResultQuery): string {
  const dir = query.descending ? 'DESC' : 'ASC';
  const key = query.sort === 'custom' ? 'custom_score' : COLUMN_SQL[query.sort];
  return `ORDER BY ${key} ${dir} NULLS LAST, row_number ${dir}`;
}

/** SELECT … FROM … WHERE … ORDER BY … LIMIT/OFFSET with the custom score, and its parameters. */
function pageSql(
  screenId: string,
  query: ResultQuery,
  limit: number,
  offset: number,
): { sql: string; params: unknown[] } {
  const where = whereOf(screenId, query);
  const custom = customSql(query, where.params.length + 1);
  const n = where.params.length + custom.params.length;
  return {
    sql: `SELECT ${RESULT_COLUMNS}, ${custom.sql} AS custom_score FROM screen_results WHERE ${where.sql} ${orderOf(query)} LIMIT $${n + 1} OFFSET $${n + 2}`,
    params: [...where.params, ...custom.params, limit, offset],
  };
}

export async function queryResults(
  db: EntityManager,
  screenId: string,
  query: ResultQuery,
): Promise<ScreenResultPage> {
  const where = whereOf(screenId, query);
  const page = pageSql(screenId, query, query.limit, query.offset);
  const [rows, count] = await Promise.all([
    db.query(page.sql, page.params) as Promise<ResultRow[]>,
    db.query(
      `SELECT count(*)::int AS n FROM screen_results WHERE ${where.sql}`,
      where.params,
    ) as Promise<Array<{ n: number }>>,
  ]);
  return {
    items: rows.map(toResultRow),
    total: count[0].n,
    offset: query.offset,
    limit: query.limit,
  };
}

/** Every filtered row in order, in batches (for the streamed CSV export). */
export async function* streamResults(
  db: EntityManager,
  screenId: string,
  query: ResultQuery,
  batch = 5000,
): AsyncGenerator<ScreenResultRow[]> {
  for (let offset = 0; ; offset += batch) {
    const page = pageSql(screenId, query, batch, offset);
    const rows: ResultRow[] = await db.query(page.sql, page.params);
    if (rows.length === 0) return;
    yield rows.map(toResultRow);
    if (rows.length < batch) return;
  }
}

export async function findResult(
  db: EntityManager,
  screenId: string,
  row: number,
): Promise<ScreenResultRow | null> {
  const rows: ResultRow[] = await db.query(
    `SELECT ${RESULT_COLUMNS} FROM screen_results WHERE screen_id = $1 AND row_number = $2`,
    [screenId, row],
  );
  return rows[0] ? toResultRow(rows[0]) : null;
}

/** The stored input chunk holding a line of the uploaded file. */
export async function inputPayloadForLine(
  db: EntityManager,
  screenId: string,
  line: number,
): Promise<{ chunkIndex: number; payload: string } | null> {
  const rows: Array<{ chunk_index: number; payload: string }> = await db.query(
    `SELECT i.chunk_index, i.payload FROM screen_chunks c
       JOIN screen_inputs i ON i.screen_id = c.screen_id AND i.chunk_index = c.chunk_index
      WHERE c.screen_id = $1 AND c.first_line <= $2 AND c.last_line >= $2`,
    [screenId, line],
  );
  return rows[0] ? { chunkIndex: rows[0].chunk_index, payload: rows[0].payload } : null;
}

export { SCREEN_NUMERIC_COLUMNS };
