/**
 * Screens, their chunks and results through the TypeORM entities; answers plain objects
 * (contracts shapes). Raw SQL stays where a statement does what the query builder cannot in one
 * round trip, each with its reason: the chunk store (CTE over two tables, per streamed chunk) and
 * the copy of reused results (INSERT … SELECT inside the database, up to a million rows). The
 * chunk queue's claims (FOR UPDATE SKIP LOCKED) live in screen-queue.ts, the result COPY in
 * screen-results-writer.ts.
 */
import { In, Not, type EntityManager } from 'typeorm';
import {
  ScreenChunkEntity,
  ScreenEntity,
  ScreenInputEntity,
  ScreenResultEntity,
} from '@gapwise/db';
import type { InputChunk } from './screen-parser';
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

type ScreenWithNow = ScreenEntity & { readonly now: Date };

function toScreen(r: ScreenWithNow): Screen {
  const start = r.startedAt?.getTime() ?? null;
  const end = (r.finishedAt ?? r.now).getTime();
  const seconds = start === null ? null : Math.max((end - start) / 1000, 1e-3);
  const rate = seconds === null || r.rowsDone === 0 ? null : r.rowsDone / seconds;
  const left = r.rowCount - r.rowsDone;
  return {
    id: r.id,
    workspaceId: r.workspaceId,
    name: r.name,
    status: r.status as ScreenStatus,
    inputHash: r.inputHash,
    softwareVersion: r.softwareVersion,
    rowCount: r.rowCount,
    badRowCount: r.badRowCount,
    badRows: r.badRows,
    badRowChoice: r.badRowChoice as BadRowChoice,
    score: {
      kind: r.scoreKind as ScreenScoreKind,
      floorEv: r.scoreFloorEv,
      assumedHbarOmegaEv: r.scoreHbarOmegaEv,
    },
    progress: {
      rowsDone: r.rowsDone,
      rowCount: r.rowCount,
      chunksDone: r.chunksDone,
      chunkCount: r.chunkCount,
      rowsPerSecond: rate,
      etaSeconds: r.status === 'running' && rate ? left / rate : null,
    },
    reusedFrom: r.reusedFrom,
    error: r.error,
    uploadMs: r.uploadMs,
    createdAt: r.createdAt.toISOString(),
    startedAt: r.startedAt?.toISOString() ?? null,
    finishedAt: r.finishedAt?.toISOString() ?? null,
  };
}

/**
 * Screens with the database's clock (`now`): the rate and ETA of a running screen are measured
 * against the same clock that wrote `started_at`.
 */
async function screensWithNow(
  db: EntityManager,
  where: (q: ReturnType<typeof screenQuery>) => ReturnType<typeof screenQuery>,
): Promise<Screen[]> {
  const { entities, raw } = await where(screenQuery(db))
    .addSelect('now()', 'db_now')
    .getRawAndEntities<{ db_now: Date }>();
  return entities.map((e, i) => toScreen({ ...e, now: raw[i]!.db_now }));
}

const screenQuery = (db: EntityManager) => db.getRepository(ScreenEntity).createQueryBuilder('s');

export async function findScreen(db: EntityManager, id: string): Promise<Screen | null> {
  const [screen] = await screensWithNow(db, (q) => q.where('s.id = :id', { id }));
  return screen ?? null;
}

export async function screenWorkspace(db: EntityManager, id: string): Promise<string | null> {
  const screen = await db
    .getRepository(ScreenEntity)
    .findOne({ where: { id }, select: { id: true, workspaceId: true } });
  return screen?.workspaceId ?? null;
}

export async function listScreens(db: EntityManager, workspaceId: string): Promise<Screen[]> {
  return screensWithNow(db, (q) =>
    q
      .where('s.workspaceId = :workspaceId', { workspaceId })
      .orderBy('s.createdAt', 'DESC')
      .limit(200),
  );
}

/** The units the file's header named, by column. */
export async function screenColumnUnits(
  db: EntityManager,
  screenId: string,
): Promise<Record<string, string>> {
  const screen = await db
    .getRepository(ScreenEntity)
    .findOneOrFail({ where: { id: screenId }, select: { id: true, columnUnits: true } });
  return screen.columnUnits ?? {};
}

/** A new screen row (status `uploaded`, no input hash yet); answers its id. */
export async function insertScreen(
  db: EntityManager,
  v: {
    workspaceId: string;
    name: string;
    softwareVersion: string;
    scoreKind: string;
    scoreFloorEv: number | null;
    scoreHbarOmegaEv: number;
    chunkSize: number;
    createdBy: string;
  },
): Promise<string> {
  const repo = db.getRepository(ScreenEntity);
  const saved = await repo.save(repo.create({ ...v, status: 'uploaded', inputHash: '' }));
  return saved.id;
}

/** What the parse found, written once the whole file has been read. */
export async function recordUploadSummary(
  db: EntityManager,
  screenId: string,
  v: {
    inputHash: string;
    rowCount: number;
    badRowCount: number;
    badRows: ReadonlyArray<{ line: number; message: string }>;
    badRowChoice: BadRowChoice;
    chunkCount: number;
    uploadMs: number;
    columnUnits: Readonly<Record<string, string>>;
  },
): Promise<void> {
  await db
    .getRepository(ScreenEntity)
    .update(
      { id: screenId },
      { ...v, badRows: v.badRows.map((b) => ({ ...b })), columnUnits: { ...v.columnUnits } },
    );
}

/** Stores a chunk's inputs and its chunk row. */
export async function storeChunk(
  tx: EntityManager,
  screenId: string,
  chunk: InputChunk,
  encoded: string,
): Promise<void> {
  // Raw on purpose: one statement (a CTE over both tables) per streamed chunk is one round trip
  // instead of two, and the upload of a large screen is bound by these round trips.
  await tx.query(
    `WITH input AS (INSERT INTO screen_inputs (screen_id, chunk_index, payload) VALUES ($1, $2, $3))
     INSERT INTO screen_chunks (screen_id, chunk_index, first_line, last_line, row_count) VALUES ($1, $2, $4, $5, $6)`,
    [
      screenId,
      chunk.index,
      encoded,
      chunk.lines[0],
      chunk.lines[chunk.lines.length - 1],
      chunk.lines.length,
    ],
  );
}

/** The latest finished screen of the workspace with the same inputs and software version. */
export async function finishedScreenWithInputs(
  db: EntityManager,
  workspaceId: string,
  inputHash: string,
  softwareVersion: string,
  exceptId: string,
): Promise<string | null> {
  const screen = await db.getRepository(ScreenEntity).findOne({
    where: { workspaceId, inputHash, softwareVersion, status: 'done', id: Not(exceptId) },
    select: { id: true },
    order: { finishedAt: 'DESC' },
  });
  return screen?.id ?? null;
}

/** Copies the results of a finished screen with the same inputs and marks this one done. */
export async function reuseResults(
  tx: EntityManager,
  screenId: string,
  fromId: string,
): Promise<void> {
  // Raw on purpose: INSERT … SELECT copies up to a million rows inside the database; reading
  // them into entities and writing them back would move every row over the wire twice.
  await tx.query(
    `INSERT INTO screen_results (screen_id, row_number, donor, acceptor, solvent, delta_g_cs, delta_g_cr,
       lambda_inner, lambda_outer, lambda_total, coupling, temperature_k, log10k_cs_marcus, log10k_cr_marcus,
       log10k_cs_mlj, log10k_cr_mlj, regime_cs, regime_cr, warning_mask, score)
     SELECT $1, row_number, donor, acceptor, solvent, delta_g_cs, delta_g_cr, lambda_inner, lambda_outer,
       lambda_total, coupling, temperature_k, log10k_cs_marcus, log10k_cr_marcus, log10k_cs_mlj, log10k_cr_mlj,
       regime_cs, regime_cr, warning_mask, score FROM screen_results WHERE screen_id = $2
     ON CONFLICT DO NOTHING`,
    [screenId, fromId],
  );
  await tx
    .getRepository(ScreenChunkEntity)
    .update({ screenId }, { status: 'done', finishedAt: () => 'now()' });
  await tx.getRepository(ScreenEntity).update(
    { id: screenId },
    {
      status: 'done',
      reusedFrom: fromId,
      rowsDone: () => 'row_count',
      chunksDone: () => 'chunk_count',
      startedAt: () => 'now()',
      finishedAt: () => 'now()',
    },
  );
}

export async function markScreenRunning(db: EntityManager, screenId: string): Promise<void> {
  await db
    .getRepository(ScreenEntity)
    .update({ id: screenId }, { status: 'running', startedAt: () => 'now()' });
}

/** Queued chunks of a screen are skipped from now on. */
export async function cancelPendingChunks(db: EntityManager, screenId: string): Promise<void> {
  await db
    .getRepository(ScreenChunkEntity)
    .update({ screenId, status: 'pending' }, { status: 'cancelled' });
}

/** Cancels an uploaded or running screen; false when it was neither. */
export async function markScreenCancelled(db: EntityManager, screenId: string): Promise<boolean> {
  const result = await db
    .getRepository(ScreenEntity)
    .update(
      { id: screenId, status: In(['uploaded', 'running']) },
      { status: 'cancelled', finishedAt: () => 'now()' },
    );
  return (result.affected ?? 0) > 0;
}

/** Status and software version of a screen, its row locked (FOR UPDATE) for a re-run. */
export async function lockScreenState(
  db: EntityManager,
  screenId: string,
): Promise<{ status: string; softwareVersion: string } | null> {
  const screen = await screenQuery(db)
    .select(['s.id', 's.status', 's.softwareVersion'])
    .where('s.id = :screenId', { screenId })
    .setLock('pessimistic_write')
    .getOne();
  return screen ? { status: screen.status, softwareVersion: screen.softwareVersion } : null;
}

/** Drops every result and queues every chunk again (results of another software version). */
export async function resetScreenResults(
  db: EntityManager,
  screenId: string,
  softwareVersion: string,
): Promise<void> {
  await db.getRepository(ScreenResultEntity).delete({ screenId });
  await db.getRepository(ScreenChunkEntity).update({ screenId }, { status: 'pending' });
  await db
    .getRepository(ScreenEntity)
    .update({ id: screenId }, { rowsDone: 0, chunksDone: 0, softwareVersion });
}

/** Queues again every chunk that did not finish. */
export async function requeueUnfinishedChunks(db: EntityManager, screenId: string): Promise<void> {
  await db
    .getRepository(ScreenChunkEntity)
    .update({ screenId, status: Not('done') }, { status: 'pending' });
}

export async function pendingChunkIndexes(db: EntityManager, screenId: string): Promise<number[]> {
  const chunks = await db.getRepository(ScreenChunkEntity).find({
    where: { screenId, status: 'pending' },
    select: { screenId: true, chunkIndex: true },
    order: { chunkIndex: 'ASC' },
  });
  return chunks.map((c) => c.chunkIndex);
}

/** Restarts a screen: running while chunks are pending, else done at once. */
export async function markScreenRestarted(
  db: EntityManager,
  screenId: string,
  pending: number,
): Promise<void> {
  await db.getRepository(ScreenEntity).update(
    { id: screenId },
    {
      status: pending === 0 ? 'done' : 'running',
      error: null,
      startedAt: () => 'now()',
      finishedAt: pending === 0 ? () => 'now()' : null,
    },
  );
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

type ResultQueryBuilder = ReturnType<typeof resultsOf>;

/** A query over one screen's results, filtered as asked. */
function resultsOf(db: EntityManager, screenId: string, query: ResultQuery) {
  const q = db
    .getRepository(ScreenResultEntity)
    .createQueryBuilder('r')
    .where('r.screen_id = :screenId', { screenId });
  // Column names come from the COLUMN_SQL whitelist, never from the request text; values are
  // parameters.
  query.ranges.forEach((range, i) => {
    const col = `r.${COLUMN_SQL[range.column]}`;
    if (range.min !== undefined) q.andWhere(`${col} >= :min${i}`, { [`min${i}`]: range.min });
    if (range.max !== undefined) q.andWhere(`${col} <= :max${i}`, { [`max${i}`]: range.max });
  });
  if (query.regimeCs) q.andWhere('r.regime_cs = :regimeCs', { regimeCs: query.regimeCs });
  if (query.regimeCr) q.andWhere('r.regime_cr = :regimeCr', { regimeCr: query.regimeCr });
  if (query.warningMask)
    q.andWhere('(r.warning_mask & :warningMask) <> 0', { warningMask: query.warningMask });
  if (query.noWarnings) q.andWhere('r.warning_mask = 0');
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    q.andWhere('(r.donor ILIKE :like OR r.acceptor ILIKE :like)', { like });
  }
  return q;
}

/**
 * One page of filtered rows in the asked order, with the custom score Σ weight × column
 * (weights as parameters, columns from the whitelist) selected as `custom_score`.
 */
function resultPage(
  q: ResultQueryBuilder,
  query: ResultQuery,
  limit: number,
  offset: number,
): ResultQueryBuilder {
  const terms = query.custom ?? [];
  const custom = terms.length
    ? `(${terms.map((t, i) => `CAST(:weight${i} AS double precision) * r.${COLUMN_SQL[t.column]}`).join(' + ')})`
    : 'CAST(NULL AS double precision)';
  terms.forEach((t, i) => q.setParameter(`weight${i}`, t.weight));
  const dir = query.descending ? 'DESC' : 'ASC';
  return q
    .select(RESULT_COLUMNS.map((c) => `r.${c} AS ${c}`))
    .addSelect(custom, 'custom_score')
    .orderBy(
      query.sort === 'custom' ? 'custom_score' : `r.${COLUMN_SQL[query.sort]}`,
      dir,
      'NULLS LAST',
    )
    .addOrderBy('r.row_number', dir)
    .limit(limit)
    .offset(offset);
}

const RESULT_COLUMNS = [
  'row_number',
  'donor',
  'acceptor',
  'solvent',
  'delta_g_cs',
  'delta_g_cr',
  'lambda_inner',
  'lambda_outer',
  'lambda_total',
  'coupling',
  'temperature_k',
  'log10k_cs_marcus',
  'log10k_cr_marcus',
  'log10k_cs_mlj',
  'log10k_cr_mlj',
  'regime_cs',
  'regime_cr',
  'warning_mask',
  'score',
] as const;

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

export async function queryResults(
  db: EntityManager,
  screenId: string,
  query: ResultQuery,
): Promise<ScreenResultPage> {
  const [rows, total] = await Promise.all([
    resultPage(
      resultsOf(db, screenId, query),
      query,
      query.limit,
      query.offset,
    ).getRawMany<ResultRow>(),
    resultsOf(db, screenId, query).getCount(),
  ]);
  return { items: rows.map(toResultRow), total, offset: query.offset, limit: query.limit };
}

/** Every filtered row in order, in batches (for the streamed CSV export). */
export async function* streamResults(
  db: EntityManager,
  screenId: string,
  query: ResultQuery,
  batch = 5000,
): AsyncGenerator<ScreenResultRow[]> {
  for (let offset = 0; ; offset += batch) {
    const rows = await resultPage(
      resultsOf(db, screenId, query),
      query,
      batch,
      offset,
    ).getRawMany<ResultRow>();
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
  const found = await db
    .getRepository(ScreenResultEntity)
    .createQueryBuilder('r')
    .select(RESULT_COLUMNS.map((c) => `r.${c} AS ${c}`))
    .where('r.screen_id = :screenId AND r.row_number = :row', { screenId, row })
    .getRawOne<ResultRow>();
  return found ? toResultRow(found) : null;
}

/** The stored input chunk holding a line of the uploaded file. */
export async function inputPayloadForLine(
  db: EntityManager,
  screenId: string,
  line: number,
): Promise<{ chunkIndex: number; payload: string } | null> {
  const input = await db
    .getRepository(ScreenInputEntity)
    .createQueryBuilder('i')
    .innerJoin(
      ScreenChunkEntity,
      'c',
      'c.screen_id = i.screen_id AND c.chunk_index = i.chunk_index',
    )
    .where('c.screen_id = :screenId AND c.first_line <= :line AND c.last_line >= :line', {
      screenId,
      line,
    })
    .getOne();
  return input ? { chunkIndex: input.chunkIndex, payload: input.payload } : null;
}

export { SCREEN_NUMERIC_COLUMNS };
