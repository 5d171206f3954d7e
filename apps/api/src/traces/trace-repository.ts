/**
 * Rows of `traces` and `trace_analyses` in and out, as plain contract objects (never entities).
 */
import type { EntityManager } from 'typeorm';
import type {
  Trace,
  TraceAnalysis,
  TraceAnalysisResult,
  TraceAnalysisStatus,
  TraceBadLine,
  TraceFileUnit,
  TraceState,
} from '@gapwise/contracts';

type Row = Record<string, unknown>;

/** TypeORM answers UPDATE … RETURNING with [rows, affected count]. */
async function updateReturning(db: EntityManager, sql: string, params: unknown[]): Promise<Row[]> {
  const raw: unknown = await db.query(sql, params);
  if (Array.isArray(raw) && raw.length === 2 && Array.isArray(raw[0]) && typeof raw[1] === 'number')
    return raw[0] as Row[];
  return raw as Row[];
}

const iso = (value: unknown): string =>
  value instanceof Date ? value.toISOString() : String(value);
const isoOrNull = (value: unknown): string | null =>
  value === null || value === undefined ? null : iso(value);

const TRACE_COLUMNS = `t.id, t.workspace_id, t.state, t.file_name, t.size_bytes, t.sha256, t.object_key, t.gzip,
  t.unit, t.column_setting, t.column_index, t.column_name, t.delimiter, t.skip_bad_lines,
  t.sample_count, t.line_count, t.skipped_line_count, t.skipped_lines, t.min_ev, t.max_ev, t.mean_ev,
  t.uploaded_at, t.uploaded_by, u.display_name AS uploader_name`;

/** A trace with what only the server needs (its object key). */
export interface StoredTrace extends Trace {
  readonly objectKey: string;
}

function toTrace(r: Row): StoredTrace {
  return {
    id: String(r['id']),
    workspaceId: String(r['workspace_id']),
    state: r['state'] as TraceState,
    fileName: String(r['file_name']),
    sizeBytes: Number(r['size_bytes']),
    sha256: String(r['sha256']),
    objectKey: String(r['object_key']),
    gzip: Boolean(r['gzip']),
    unit: r['unit'] as TraceFileUnit,
    columnSetting: (r['column_setting'] as string | null) ?? null,
    columnIndex: Number(r['column_index']),
    columnName: (r['column_name'] as string | null) ?? null,
    delimiter: r['delimiter'] as Trace['delimiter'],
    skipBadLines: Boolean(r['skip_bad_lines']),
    sampleCount: Number(r['sample_count']),
    lineCount: Number(r['line_count']),
    skippedLineCount: Number(r['skipped_line_count']),
    skippedLines: (r['skipped_lines'] as TraceBadLine[]) ?? [],
    minEv: Number(r['min_ev']),
    maxEv: Number(r['max_ev']),
    meanEv: Number(r['mean_ev']),
    uploadedAt: iso(r['uploaded_at']),
    uploadedBy: r['uploaded_by']
      ? { id: String(r['uploaded_by']), displayName: String(r['uploader_name'] ?? '') }
      : null,
  };
}

/** The public shape (no object key). */
export function publicTrace(t: StoredTrace): Trace {
  const { objectKey: _objectKey, ...rest } = t;
  return rest;
}

export interface NewTrace {
  readonly workspaceId: string;
  readonly state: TraceState;
  readonly fileName: string;
  readonly sizeBytes: number;
  readonly sha256: string;
  readonly objectKey: string;
  readonly gzip: boolean;
  readonly unit: TraceFileUnit;
  readonly columnSetting: string | null;
  readonly columnIndex: number;
  readonly columnName: string | null;
  readonly delimiter: string;
  readonly skipBadLines: boolean;
  readonly sampleCount: number;
  readonly lineCount: number;
  readonly skippedLineCount: number;
  readonly skippedLines: TraceBadLine[];
  readonly minEv: number;
  readonly maxEv: number;
  readonly meanEv: number;
  readonly uploadedBy: string;
}

export async function insertTrace(db: EntityManager, t: NewTrace): Promise<string> {
  const rows: Array<{ id: string }> = await db.query(
    `INSERT INTO traces (workspace_id, state, file_name, size_bytes, sha256, object_key, gzip, unit,
       column_setting, column_index, column_name, delimiter, skip_bad_lines, sample_count, line_count,
       skipped_line_count, skipped_lines, min_ev, max_ev, mean_ev, uploaded_by)
     VALUES ($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11,$12,$13,$14,$15,$16,$17,$18,$19,$20,$21) RETURNING id`,
    [
      t.workspaceId,
      t.state,
      t.fileName,
      t.sizeBytes,
      t.sha256,
      t.objectKey,
      t.gzip,
      t.unit,
      t.columnSetting,
      t.columnIndex,
      t.columnName,
      t.delimiter,
      t.skipBadLines,
      t.sampleCount,
      t.lineCount,
      t.skippedLineCount,
      JSON.stringify(t.skippedLines),
      t.minEv,
      t.maxEv,
      t.meanEv,
      t.uploadedBy,
    ],
  );
  return rows[0].id;
}

export async function findTrace(db: EntityManager, id: string): Promise<StoredTrace | null> {
  const rows: Row[] = await db.query(
    `SELECT ${TRACE_COLUMNS} FROM traces t LEFT JOIN users u ON u.id = t.uploaded_by WHERE t.id = $1`,
    [id],
  );
  return rows[0] ? toTrace(rows[0]) : null;
}

export async function listTraces(db: EntityManager, workspaceId: string): Promise<StoredTrace[]> {
  const rows: Row[] = await db.query(
    `SELECT ${TRACE_COLUMNS} FROM traces t LEFT JOIN users u ON u.id = t.uploaded_by
     WHERE t.workspace_id = $1 ORDER BY t.uploaded_at DESC, t.id`,
    [workspaceId],
  );
  return rows.map(toTrace);
}

/** How many trace rows point at a stored object (objects are shared by identical uploads). */
export async function countObjectReferences(db: EntityManager, objectKey: string): Promise<number> {
  const rows: Array<{ n: string }> = await db.query(
    'SELECT count(*) AS n FROM traces WHERE object_key = $1',
    [objectKey],
  );
  return Number(rows[0]?.n ?? 0);
}

// ---------------------------------------------------------------------------------------------
// Analyses

const ANALYSIS_COLUMNS = `id, workspace_id, reactant_trace_id, product_trace_id, temperature_k, status, progress,
  result, error, attempts, created_at, started_at, finished_at`;

function toAnalysis(r: Row, withResult = true): TraceAnalysis {
  return {
    id: String(r['id']),
    workspaceId: String(r['workspace_id']),
    reactantTraceId: String(r['reactant_trace_id']),
    productTraceId: String(r['product_trace_id']),
    temperatureK: Number(r['temperature_k']),
    status: r['status'] as TraceAnalysisStatus,
    progress: Number(r['progress']),
    result: withResult ? ((r['result'] as TraceAnalysisResult | null) ?? null) : null,
    error: (r['error'] as TraceAnalysis['error']) ?? null,
    attempts: Number(r['attempts']),
    createdAt: iso(r['created_at']),
    startedAt: isoOrNull(r['started_at']),
    finishedAt: isoOrNull(r['finished_at']),
  };
}

export async function insertAnalysis(
  db: EntityManager,
  a: {
    workspaceId: string;
    reactantTraceId: string;
    productTraceId: string;
    temperatureK: number;
    createdBy: string;
  },
): Promise<string> {
  const rows: Array<{ id: string }> = await db.query(
    `INSERT INTO trace_analyses (workspace_id, reactant_trace_id, product_trace_id, temperature_k, created_by)
     VALUES ($1, $2, $3, $4, $5) RETURNING id`,
    [a.workspaceId, a.reactantTraceId, a.productTraceId, a.temperatureK, a.createdBy],
  );
  return rows[0].id;
}

export async function findAnalysis(
  db: EntityManager,
  id: string,
  withResult = true,
): Promise<TraceAnalysis | null> {
  const rows: Row[] = await db.query(
    `SELECT ${ANALYSIS_COLUMNS} FROM trace_analyses WHERE id = $1`,
    [id],
  );
  return rows[0] ? toAnalysis(rows[0], withResult) : null;
}

/** Analyses of a workspace, newest first, without their (large) results. */
export async function listAnalyses(
  db: EntityManager,
  workspaceId: string,
): Promise<TraceAnalysis[]> {
  const rows: Row[] = await db.query(
    `SELECT ${ANALYSIS_COLUMNS.replace('result,', 'NULL AS result,')} FROM trace_analyses
     WHERE workspace_id = $1 ORDER BY created_at DESC, id`,
    [workspaceId],
  );
  return rows.map((r) => toAnalysis(r, false));
}

/**
 * Claims an analysis for a run: `queued` or `running` (a retried run whose worker died) becomes
 * `running` with one more attempt. Returns null when it is already finished (nothing to do).
 */
export async function claimAnalysis(db: EntityManager, id: string): Promise<TraceAnalysis | null> {
  const rows = await updateReturning(
    db,
    `UPDATE trace_analyses SET status = 'running', attempts = attempts + 1, progress = 0,
       started_at = now()
     WHERE id = $1 AND status IN ('queued', 'running') RETURNING ${ANALYSIS_COLUMNS}`,
    [id],
  );
  return rows[0] ? toAnalysis(rows[0]) : null;
}

export async function setProgress(db: EntityManager, id: string, progress: number): Promise<void> {
  await db.query(`UPDATE trace_analyses SET progress = $2 WHERE id = $1 AND status = 'running'`, [
    id,
    progress,
  ]);
}

/**
 * Stores the result and marks the analysis done, once: a second writer (a retried job that
 * raced a slow first one) finds it already done and changes nothing. Returns whether it wrote.
 */
export async function completeAnalysis(
  db: EntityManager,
  id: string,
  result: TraceAnalysisResult,
): Promise<boolean> {
  const rows = await updateReturning(
    db,
    `UPDATE trace_analyses SET status = 'done', progress = 1, result = $2, error = NULL, finished_at = now()
     WHERE id = $1 AND status <> 'done' RETURNING id`,
    [id, JSON.stringify(result)],
  );
  return rows.length === 1;
}

export async function failAnalysis(
  db: EntityManager,
  id: string,
  errors: ReadonlyArray<{ field: string; message: string }>,
): Promise<void> {
  await db.query(
    `UPDATE trace_analyses SET status = 'failed', error = $2, finished_at = now()
     WHERE id = $1 AND status <> 'done'`,
    [id, JSON.stringify(errors)],
  );
}
