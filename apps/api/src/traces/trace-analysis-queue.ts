/**
 * The `trace-analysis` queue on pg-boss and its worker loop.
 *
 * A job carries only the analysis id; it is inserted in the same transaction as the analysis row
 * (pg-boss `db` option), so a queued analysis always has its job. The worker claims the row,
 * streams both files back from object storage through the analysis, and writes the result in one
 * transaction that only succeeds while the row is not yet `done` — so a retried job (worker
 * stopped, process killed, job expired) recomputes from scratch and never counts twice.
 * A stopped worker hands its running job back (fail → retry); a killed one loses it until
 * pg-boss expires it (`expireInSeconds`) and retries it.
 */
import { hostname } from 'node:os';
import PgBoss from 'pg-boss';
import type { DataSource, EntityManager } from 'typeorm';
import type { ComputeRunner } from '../compute/compute-tasks';
import { runTraceAnalysisJob } from './trace-analysis-job';
import type { TraceObjectStore } from './trace-object-store';

export const TRACE_ANALYSIS_QUEUE = 'trace-analysis';

export interface TraceQueueOptions {
  /** A job running longer than this is taken as lost (its worker died) and retried. */
  readonly expireInSeconds: number;
  readonly retryLimit: number;
  readonly retryDelaySeconds: number;
}

export const DEFAULT_TRACE_QUEUE_OPTIONS: TraceQueueOptions = {
  expireInSeconds: 30 * 60,
  retryLimit: 4,
  retryDelaySeconds: 2,
};

export async function ensureTraceQueue(boss: PgBoss, options: TraceQueueOptions): Promise<void> {
  await boss.createQueue(TRACE_ANALYSIS_QUEUE, {
    name: TRACE_ANALYSIS_QUEUE,
    retryLimit: options.retryLimit,
    retryDelay: options.retryDelaySeconds,
    expireInSeconds: options.expireInSeconds,
  });
}

export interface TraceWorker {
  readonly id: string;
  /** Jobs this worker finished (done or refused). */
  readonly finished: () => number;
  /**
   * Stops the loop. `handBack` (default): a running job is interrupted and failed so pg-boss
   * retries it at once elsewhere. `abandon`: it is left active, as if the process had died.
   */
  stop(mode?: 'handBack' | 'abandon'): Promise<void>;
}

export interface TraceWorkerOptions {
  /** The server's compute pool, where each analysis runs (trace-analysis-task.ts). */
  readonly compute?: ComputeRunner;
  readonly idleMs?: number;
  /** Minimum time between progress writes. */
  readonly progressEveryMs?: number;
  readonly log?: (message: string) => void;
  /** Test hook: called with each progress fraction (may await to slow the job down). */
  readonly onProgress?: (analysisId: string, fraction: number) => void;
  readonly tmpDir?: string;
  /** Test hook: pause after each chunk read from object storage (to interrupt a job midway). */
  readonly chunkDelayMs?: number;
}

export function startTraceWorker(
  boss: PgBoss,
  db: DataSource,
  store: TraceObjectStore,
  options: TraceWorkerOptions = {},
): TraceWorker {
  const id = `${hostname()}:${process.pid}:${Math.random().toString(36).slice(2, 8)}`;
  const idleMs = options.idleMs ?? 300;
  let stopping: 'handBack' | 'abandon' | null = null;
  let finished = 0;
  let wake: (() => void) | null = null;
  let current: AbortController | null = null;

  const loop = (async () => {
    while (!stopping) {
      let jobs: Array<PgBoss.JobWithMetadata<{ analysisId: string }>> = [];
      try {
        jobs = await boss.fetch<{ analysisId: string }>(TRACE_ANALYSIS_QUEUE, {
          batchSize: 1,
          includeMetadata: true,
        });
      } catch (error) {
        if (stopping) break;
        options.log?.(`trace worker ${id}: fetch failed: ${(error as Error).message}`);
      }
      if (jobs.length === 0) {
        await new Promise<void>((resolve) => {
          const timer = setTimeout(resolve, idleMs);
          wake = () => {
            clearTimeout(timer);
            resolve();
          };
        });
        wake = null;
        continue;
      }
      for (const job of jobs) {
        current = new AbortController();
        try {
          const outcome = await runTraceAnalysisJob(db, store, job.data.analysisId, {
            signal: current.signal,
            compute: options.compute,
            progressEveryMs: options.progressEveryMs,
            onProgress: options.onProgress,
            tmpDir: options.tmpDir,
            chunkDelayMs: options.chunkDelayMs,
            lastAttempt: job.retryCount >= job.retryLimit,
          });
          finished += 1;
          await boss.complete(TRACE_ANALYSIS_QUEUE, job.id, { outcome });
        } catch (error) {
          if (stopping === 'abandon') break;
          const message = (error as Error)?.message ?? String(error);
          options.log?.(
            `trace worker ${id}: analysis ${job.data.analysisId} interrupted: ${message}`,
          );
          await boss.fail(TRACE_ANALYSIS_QUEUE, job.id, { message }).catch(() => undefined);
        } finally {
          current = null;
        }
      }
    }
  })();

  return {
    id,
    finished: () => finished,
    async stop(mode = 'handBack') {
      stopping = mode;
      current?.abort(
        new Error(mode === 'abandon' ? 'worker abandoned the job' : 'worker stopping'),
      );
      (wake as (() => void) | null)?.();
      await loop;
    },
  };
}

/** Sends the job of a new analysis inside the caller's transaction. */
export async function enqueueTraceAnalysis(
  boss: PgBoss,
  tx: EntityManager,
  analysisId: string,
  options: TraceQueueOptions,
): Promise<void> {
  await boss.send(
    TRACE_ANALYSIS_QUEUE,
    { analysisId },
    {
      retryLimit: options.retryLimit,
      retryDelay: options.retryDelaySeconds,
      expireInSeconds: options.expireInSeconds,
      singletonKey: analysisId,
      db: {
        executeSql: async (text: string, values: unknown[]) => ({
          rows: await tx.query(text, values),
        }),
      },
    },
  );
}
