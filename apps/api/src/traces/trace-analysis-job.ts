/**
 * One run of a trace-analysis job: claim the row, stream both files back from object storage
 * through the analysis, and store the result in one transaction keyed by the analysis id.
 */
import type { Readable } from 'node:stream';
import { setTimeout as sleep } from 'node:timers/promises';
import type { DataSource } from 'typeorm';
import {
  analyzeTraces,
  readColumnSetting,
  TraceAnalysisRefusal,
  type TraceAnalysisInput,
  type TraceParseSettings,
} from '@gapwise/traces';
import type { ComputeRunner } from '../compute/compute-tasks';
import { AppError } from '../http/app-error';
import { analyzeTracesInPool } from './trace-analysis-task';
import type { TraceObjectStore } from './trace-object-store';
import {
  claimAnalysis,
  completeAnalysis,
  failAnalysis,
  findTrace,
  setProgress,
  type StoredTrace,
} from './trace-repository';

export interface JobRunOptions {
  /**
   * The server's compute pool: the analysis runs in one of its worker threads. Without it (the
   * demo seed, a one-shot command with no HTTP to answer) the analysis runs on this thread.
   */
  readonly compute?: ComputeRunner;
  readonly signal?: AbortSignal;
  readonly progressEveryMs?: number;
  readonly onProgress?: (analysisId: string, fraction: number) => void;
  readonly tmpDir?: string;
  readonly chunkDelayMs?: number;
  /** pg-boss will not retry after this run: record a failure instead of leaving it queued. */
  readonly lastAttempt?: boolean;
}

export type JobOutcome = 'done' | 'failed' | 'already-finished';

/** The settings a stored trace was accepted with, to read it again the same way. */
export function settingsOf(trace: StoredTrace): TraceParseSettings {
  return {
    unit: trace.unit,
    column: readColumnSetting(trace.columnSetting),
    skipBadLines: trace.skipBadLines,
    delimiter: trace.delimiter,
  };
}

export function analysisInputOf(
  trace: StoredTrace,
  open: () => Promise<AsyncIterable<Uint8Array>>,
): TraceAnalysisInput {
  return {
    open,
    settings: settingsOf(trace),
    sizeBytes: trace.sizeBytes,
    info: {
      traceId: trace.id,
      fileName: trace.fileName,
      sha256: trace.sha256,
      sizeBytes: trace.sizeBytes,
      unit: trace.unit,
      columnIndex: trace.columnIndex,
      columnName: trace.columnName,
      sampleCount: trace.sampleCount,
      skippedLineCount: trace.skippedLineCount,
    },
  };
}

async function* delayed(
  source: Readable,
  ms: number,
  signal?: AbortSignal,
): AsyncIterable<Uint8Array> {
  for await (const chunk of source) {
    yield chunk as Uint8Array;
    await sleep(ms, undefined, { signal }).catch(() => undefined);
  }
}

export async function runTraceAnalysisJob(
  db: DataSource,
  store: TraceObjectStore,
  analysisId: string,
  options: JobRunOptions = {},
): Promise<JobOutcome> {
  const claimed = await claimAnalysis(db.manager, analysisId);
  if (!claimed) return 'already-finished';
  const [reactant, product] = await Promise.all([
    findTrace(db.manager, claimed.reactantTraceId),
    findTrace(db.manager, claimed.productTraceId),
  ]);
  if (!reactant || !product) {
    await failAnalysis(db.manager, analysisId, [
      { field: 'traces', message: 'A trace of this analysis no longer exists.' },
    ]);
    return 'failed';
  }
  const open = (trace: StoredTrace) => async (): Promise<AsyncIterable<Uint8Array>> => {
    const body = await store.open(trace.objectKey);
    return options.chunkDelayMs ? delayed(body, options.chunkDelayMs, options.signal) : body;
  };
  const every = options.progressEveryMs ?? 250;
  let lastWrite = 0;
  let pending: Promise<void> = Promise.resolve();
  const onProgress = (fraction: number) => {
    options.onProgress?.(analysisId, fraction);
    const now = Date.now();
    if (now - lastWrite < every) return;
    lastWrite = now;
    pending = pending
      .then(() => setProgress(db.manager, analysisId, fraction))
      .catch(() => undefined);
  };
  try {
    const analyze = options.compute
      ? (...args: Parameters<typeof analyzeTraces>) =>
          analyzeTracesInPool(options.compute!, ...args)
      : analyzeTraces;
    const result = await analyze(
      analysisInputOf(reactant, open(reactant)),
      analysisInputOf(product, open(product)),
      claimed.temperatureK,
      { onProgress, signal: options.signal, tmpDir: options.tmpDir },
    );
    if (options.signal?.aborted) throw options.signal.reason;
    await pending;
    await db.transaction((tx) => completeAnalysis(tx, analysisId, result));
    return 'done';
  } catch (error) {
    await pending;
    if (error instanceof TraceAnalysisRefusal) {
      await failAnalysis(db.manager, analysisId, error.errors);
      return 'failed';
    }
    // Over its budget it would be over it again on a retry: recorded as failed, with the advice.
    if (error instanceof AppError && error.code === 'calculation-over-budget') {
      await failAnalysis(db.manager, analysisId, [{ field: 'analysis', message: error.message }]);
      return 'failed';
    }
    if (options.lastAttempt && !options.signal?.aborted) {
      await failAnalysis(db.manager, analysisId, [
        {
          field: 'analysis',
          message: `The analysis could not be completed: ${(error as Error)?.message ?? error}`,
        },
      ]);
    }
    throw error;
  }
}
