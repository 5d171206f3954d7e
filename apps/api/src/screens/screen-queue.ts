/**
 * The `screen-chunk` queue on pg-boss: one job per chunk, and the worker loop that runs them.
 * Any number of processes (the server's built-in worker, `npm run worker` on this or other
 * machines) may run the loop against the same PostgreSQL; pg-boss hands each job to one of them,
 * and a job whose worker died is expired and retried (the chunk write is idempotent, see
 * screen-results-writer.ts).
 */
import { hostname } from 'node:os';
import PgBoss from 'pg-boss';
import type { DataSource, EntityManager } from 'typeorm';
import type { ComputeRunner } from '../compute/compute-tasks';
import type { ScreenSettings } from '../config';
import { processChunk } from './screen-results-writer';

export const SCREEN_QUEUE = 'screen-chunk';

export interface ScreenJobData {
  readonly screenId: string;
  readonly chunkIndex: number;
}

export interface ScreenQueueOptions {
  /** A job running longer than this is taken as lost (worker died) and retried. */
  readonly expireInSeconds: number;
  readonly retryLimit: number;
}

export const DEFAULT_SCREEN_QUEUE_OPTIONS: ScreenQueueOptions = {
  expireInSeconds: 120,
  retryLimit: 8,
};

/** Creates the queue (idempotent; pg-boss needs it before `send`). */
export async function ensureScreenQueue(
  boss: PgBoss,
  options = DEFAULT_SCREEN_QUEUE_OPTIONS,
): Promise<void> {
  await boss.createQueue(SCREEN_QUEUE, {
    name: SCREEN_QUEUE,
    retryLimit: options.retryLimit,
    retryDelay: 1,
    expireInSeconds: options.expireInSeconds,
  });
}

/**
 * Sends one job per chunk index, inside the caller's transaction (pg-boss `db` option), so the
 * screen's rows and its jobs are committed together or not at all.
 */
export async function enqueueChunks(
  boss: PgBoss,
  tx: EntityManager,
  screenId: string,
  chunkIndexes: readonly number[],
  options = DEFAULT_SCREEN_QUEUE_OPTIONS,
): Promise<void> {
  if (chunkIndexes.length === 0) return;
  const db = {
    executeSql: async (text: string, values: unknown[]) => ({ rows: await tx.query(text, values) }),
  };
  const jobs = chunkIndexes.map((chunkIndex) => ({
    name: SCREEN_QUEUE,
    data: { screenId, chunkIndex } satisfies ScreenJobData,
    retryLimit: options.retryLimit,
    retryDelay: 1,
    expireInSeconds: options.expireInSeconds,
  }));
  for (let i = 0; i < jobs.length; i += 500) await boss.insert(jobs.slice(i, i + 500), { db });
}

export interface ScreenWorker {
  readonly id: string;
  /** Chunks this worker computed and stored. */
  readonly processed: () => number;
  stop(): Promise<void>;
}

export interface ScreenWorkerOptions {
  /** Wait between polls when the queue is empty. */
  readonly idleMs?: number;
  readonly log?: (message: string) => void;
  /** Test hook: hold each chunk's transaction open this long before commit (kill tests). */
  readonly chunkDelayMs?: number;
  /** Where chunks compute: the server's pool; unset, on this thread (standalone worker). */
  readonly compute?: ComputeRunner;
}

/**
 * Starts the worker loop: fetch one job, compute and store its chunk, complete the job, and
 * fetch again at once while there is work (no polling delay between busy jobs).
 */
export function startScreenWorker(
  boss: PgBoss,
  db: DataSource,
  options: ScreenWorkerOptions = {},
): ScreenWorker {
  const id = `${hostname()}:${process.pid}:${Math.random().toString(36).slice(2, 8)}`;
  const idleMs = options.idleMs ?? 250;
  let stopping = false;
  let processed = 0;
  let wake: (() => void) | null = null;

  const loop = (async () => {
    await ensureScreenQueue(boss);
    while (!stopping) {
      let jobs: Array<PgBoss.Job<ScreenJobData>> = [];
      try {
        jobs = await boss.fetch<ScreenJobData>(SCREEN_QUEUE, { batchSize: 1 });
      } catch (err) {
        options.log?.(`screen worker ${id}: fetch failed: ${(err as Error).message}`);
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
        try {
          const delay = options.chunkDelayMs;
          const hooks = delay
            ? { beforeCommit: () => new Promise<void>((r) => setTimeout(r, delay)) }
            : {};
          const outcome = await processChunk(
            db,
            job.data.screenId,
            job.data.chunkIndex,
            id,
            hooks,
            options.compute,
          );
          if (outcome === 'done') processed += 1;
          await boss.complete(SCREEN_QUEUE, job.id, { outcome });
        } catch (err) {
          options.log?.(
            `screen worker ${id}: chunk ${job.data.chunkIndex} failed: ${(err as Error).message}`,
          );
          await recordChunkError(db, job.data.screenId, err as Error);
          await boss
            .fail(SCREEN_QUEUE, job.id, { message: (err as Error).message })
            .catch(() => undefined);
        }
      }
    }
  })();

  return {
    id,
    processed: () => processed,
    async stop() {
      stopping = true;
      (wake as (() => void) | null)?.();
      await loop;
    },
  };
}

async function recordChunkError(db: DataSource, screenId: string, err: Error): Promise<void> {
  await db
    .query('UPDATE screens SET error = $2 WHERE id = $1', [screenId, err.message.slice(0, 500)])
    .catch(() => undefined);
}

/** The screen queue of one process: its pg-boss instance and, optionally, a worker loop. */
export interface ScreenService {
  readonly boss: PgBoss;
  readonly queueOptions: ScreenQueueOptions;
  readonly worker: ScreenWorker | null;
  enqueue(tx: EntityManager, screenId: string, chunkIndexes: readonly number[]): Promise<void>;
  stop(): Promise<void>;
}

export interface ScreenServiceOptions {
  readonly connectionString: string;
  /** Run a worker loop in this process (the server does by default; see README). */
  readonly runWorker: boolean;
  readonly queueOptions?: ScreenQueueOptions;
  /** How often pg-boss expires lost jobs (its maintenance); default 60 s. */
  readonly maintenanceIntervalSeconds?: number;
  readonly log?: (message: string) => void;
  readonly chunkDelayMs?: number;
  /** Where the in-process worker computes chunks (the server passes its pool). */
  readonly compute?: ComputeRunner;
}

/** Starts pg-boss for screens (its own small connection pool) and the worker when asked. */
export async function startScreenService(
  db: DataSource,
  options: ScreenServiceOptions,
): Promise<ScreenService> {
  const queueOptions = options.queueOptions ?? DEFAULT_SCREEN_QUEUE_OPTIONS;
  const boss = new PgBoss({
    connectionString: options.connectionString,
    max: 3,
    application_name: 'gapwise-screens',
    supervise: true,
    schedule: false,
    maintenanceIntervalSeconds: options.maintenanceIntervalSeconds ?? 60,
  });
  boss.on('error', (error: Error) => options.log?.(`pg-boss (screens): ${error.message}`));
  await boss.start();
  await ensureScreenQueue(boss, queueOptions);
  const worker = options.runWorker
    ? startScreenWorker(boss, db, {
        log: options.log,
        chunkDelayMs: options.chunkDelayMs,
        compute: options.compute,
      })
    : null;
  return {
    boss,
    queueOptions,
    worker,
    enqueue: (tx, screenId, chunkIndexes) =>
      enqueueChunks(boss, tx, screenId, chunkIndexes, queueOptions),
    async stop() {
      await worker?.stop();
      await boss.stop({ graceful: true, wait: true, timeout: 5000 });
    },
  };
}

/** The screen service's options from the validated configuration (config.ts, read once at start). */
export function screenServiceOptions(
  databaseUrl: string,
  screens: ScreenSettings,
): ScreenServiceOptions {
  return {
    connectionString: databaseUrl,
    runWorker: screens.runWorker,
    queueOptions: {
      ...DEFAULT_SCREEN_QUEUE_OPTIONS,
      ...(screens.jobExpireSeconds !== undefined
        ? { expireInSeconds: screens.jobExpireSeconds }
        : {}),
    },
    maintenanceIntervalSeconds: screens.maintenanceSeconds,
    chunkDelayMs: screens.testChunkDelayMs,
  };
}
