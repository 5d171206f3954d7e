/**
 * Demo energy-gap traces (synthetic): the two committed files of `db/seed/traces/` (seeded AR(1)
 * samples of an invented dyad, λ = 0.62 eV, ΔG° = −0.35 eV at 300 K, in kcal/mol) uploaded to the
 * demo lab through the same ingest use-case as the API (object store, SHA-256, parser, row and
 * audit event), and one finished analysis of them, computed in this process by the job's own code
 * (`runTraceAnalysisJob`) instead of waiting for a worker. Idempotent: a trace is matched by
 * workspace, state, file name and checksum (its object is put back if the store lost it), and
 * the analysis by its two traces.
 */
import { createHash } from 'node:crypto';
import { createReadStream, readFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import type { DataSource } from 'typeorm';
import { REPO_ROOT } from '../config';
import { runTraceAnalysisJob } from './trace-analysis-job';
import type { TraceObjectStore } from './trace-object-store';
import type { TraceServices } from './trace-services';
import {
  ingestUpload,
  readUploadSettings,
  recordUploadedTrace,
  startAnalysis,
} from './trace-use-case';

export const DEMO_TRACE_FILES = {
  reactant: join(REPO_ROOT, 'db/seed/traces/demo-dyad-reactant.csv'),
  product: join(REPO_ROOT, 'db/seed/traces/demo-dyad-product.csv'),
} as const;
/** The files' sampling temperature and units (db/seed/traces/generate.ts). */
export const DEMO_TRACE_TEMPERATURE_K = 300;
const DEMO_TRACE_UNIT = 'kcal/mol';
const DEMO_TRACE_COLUMN = 'dE_kcal';

export interface DemoTraceSeedOptions {
  readonly labName: string;
  readonly editorEmail: string;
}

export interface DemoTraceSeedReport {
  /** Trace rows added (0 when they were there). */
  readonly traces: number;
  /** Whether a finished analysis was added. */
  readonly analysis: boolean;
  readonly analysisId: string | null;
}

async function firstId(db: DataSource, sql: string, params: unknown[]): Promise<string | null> {
  const [row] = await db.query(sql, params);
  return row?.id ?? null;
}

/** Adds the demo traces and their analysis where missing; answers what it added. */
export async function seedDemoTraces(
  db: DataSource,
  store: TraceObjectStore,
  options: DemoTraceSeedOptions,
): Promise<DemoTraceSeedReport> {
  const lab = await firstId(
    db,
    'SELECT id FROM workspaces WHERE name = $1 ORDER BY created_at LIMIT 1',
    [options.labName],
  );
  const editor = await firstId(db, 'SELECT id FROM users WHERE email = $1', [options.editorEmail]);
  if (!lab || !editor) return { traces: 0, analysis: false, analysisId: null };
  // Only the store is used on these paths: no job is queued, the analysis runs below.
  const services = {
    store,
    enqueue: async () => undefined,
  } as unknown as TraceServices;

  let added = 0;
  const traceIds = {} as Record<'reactant' | 'product', string>;
  for (const state of ['reactant', 'product'] as const) {
    const path = DEMO_TRACE_FILES[state];
    const fileName = basename(path);
    const sha256 = createHash('sha256').update(readFileSync(path)).digest('hex');
    const [existing] = (await db.query(
      `SELECT id, object_key FROM traces
       WHERE workspace_id = $1 AND state = $2 AND file_name = $3 AND sha256 = $4
       ORDER BY uploaded_at LIMIT 1`,
      [lab, state, fileName, sha256],
    )) as Array<{ id: string; object_key: string }>;
    const upload = readUploadSettings({
      state,
      unit: DEMO_TRACE_UNIT,
      column: DEMO_TRACE_COLUMN,
    });
    if (existing) {
      traceIds[state] = existing.id;
      // The row outlived its object (a wiped store): the same bytes go back to the same key.
      if (!(await store.exists(existing.object_key))) {
        await ingestUpload(services, createReadStream(path), upload);
      }
      continue;
    }
    const ingested = await ingestUpload(services, createReadStream(path), upload);
    const trace = await recordUploadedTrace(db, services, editor, lab, fileName, upload, ingested);
    traceIds[state] = trace.id;
    added++;
  }

  const analyses = (await db.query(
    `SELECT id, status FROM trace_analyses
     WHERE reactant_trace_id = $1 AND product_trace_id = $2 ORDER BY created_at`,
    [traceIds.reactant, traceIds.product],
  )) as Array<{ id: string; status: string }>;
  if (analyses.some((a) => a.status === 'done')) {
    return { traces: added, analysis: false, analysisId: null };
  }
  // A run an earlier seed left unfinished is resumed; otherwise a new one is created.
  const pending = analyses.find((a) => a.status === 'queued' || a.status === 'running');
  const analysisId =
    pending?.id ??
    (
      await startAnalysis(db, services, editor, lab, {
        reactantTraceId: traceIds.reactant,
        productTraceId: traceIds.product,
        temperature: DEMO_TRACE_TEMPERATURE_K,
      })
    ).id;
  const outcome = await runTraceAnalysisJob(db, store, analysisId, { lastAttempt: true });
  if (outcome !== 'done') throw new Error(`the demo trace analysis ended '${outcome}'`);
  return { traces: added, analysis: true, analysisId };
}
