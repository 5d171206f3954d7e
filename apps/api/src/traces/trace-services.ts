/**
 * What the trace routes need besides the database: the object store and the `trace-analysis`
 * queue (its pg-boss instance, and in the server a worker loop). Built once per process by the
 * runtime (or per test file).
 */
import PgBoss from 'pg-boss';
import type { DataSource, EntityManager } from 'typeorm';
import type { ComputeRunner } from '../compute/compute-tasks';
import type { Config } from '../config';
import {
  DEFAULT_TRACE_QUEUE_OPTIONS,
  enqueueTraceAnalysis,
  ensureTraceQueue,
  startTraceWorker,
  type TraceQueueOptions,
  type TraceWorker,
  type TraceWorkerOptions,
} from './trace-analysis-queue';
import { TraceObjectStore, type TraceStoreConfig } from './trace-object-store';

export interface TraceServices {
  readonly store: TraceObjectStore;
  readonly boss: PgBoss;
  readonly queueOptions: TraceQueueOptions;
  /** The worker loop of this process, if it runs one. */
  worker: TraceWorker | null;
  enqueue(tx: EntityManager, analysisId: string): Promise<void>;
  /** Starts a worker loop (if none runs). */
  startWorker(options?: TraceWorkerOptions): TraceWorker;
  stop(): Promise<void>;
}

export interface TraceServicesOptions {
  readonly connectionString: string;
  readonly store: TraceStoreConfig | TraceObjectStore;
  readonly runWorker: boolean;
  readonly queueOptions?: Partial<TraceQueueOptions>;
  /** How often pg-boss looks for expired jobs (seconds; tests use 1). */
  readonly maintenanceIntervalSeconds?: number;
  readonly worker?: TraceWorkerOptions;
  /** The server's compute pool: the worker loop runs each analysis in it. */
  readonly compute?: ComputeRunner;
  readonly log?: (message: string) => void;
}

/** The trace services' options from the validated configuration (config.ts, read once at start). */
export function traceServicesOptions(
  config: Pick<Config, 'databaseUrl' | 'objectStore' | 'traces'>,
): TraceServicesOptions {
  const { traces, objectStore } = config;
  return {
    connectionString: config.databaseUrl,
    store: objectStore,
    queueOptions: {
      ...DEFAULT_TRACE_QUEUE_OPTIONS,
      ...(traces.jobExpireSeconds !== undefined
        ? { expireInSeconds: traces.jobExpireSeconds }
        : {}),
      ...(traces.jobRetryLimit !== undefined ? { retryLimit: traces.jobRetryLimit } : {}),
    },
    runWorker: traces.runWorker,
    maintenanceIntervalSeconds: traces.maintenanceSeconds,
  };
}

export async function startTraceServices(
  db: DataSource,
  options: TraceServicesOptions,
): Promise<TraceServices> {
  const store =
    options.store instanceof TraceObjectStore ? options.store : new TraceObjectStore(options.store);
  const queueOptions = { ...DEFAULT_TRACE_QUEUE_OPTIONS, ...options.queueOptions };
  const boss = new PgBoss({
    connectionString: options.connectionString,
    max: 3,
    application_name: 'gapwise-traces',
    supervise: true,
    schedule: false,
    ...(options.maintenanceIntervalSeconds
      ? { maintenanceIntervalSeconds: options.maintenanceIntervalSeconds }
      : {}),
  });
  boss.on('error', (error: Error) => options.log?.(`pg-boss (traces): ${error.message}`));
  await boss.start();
  await ensureTraceQueue(boss, queueOptions);
  const services: TraceServices = {
    store,
    boss,
    queueOptions,
    worker: null,
    enqueue: (tx, analysisId) => enqueueTraceAnalysis(boss, tx, analysisId, queueOptions),
    startWorker(workerOptions) {
      services.worker ??= startTraceWorker(boss, db, store, {
        log: options.log,
        compute: options.compute,
        ...options.worker,
        ...workerOptions,
      });
      return services.worker;
    },
    async stop() {
      await services.worker?.stop('handBack').catch(() => undefined);
      services.worker = null;
      await boss.stop({ graceful: true, wait: true, timeout: 5000 }).catch(() => undefined);
      if (!(options.store instanceof TraceObjectStore)) store.destroy();
    },
  };
  if (options.runWorker) services.startWorker();
  return services;
}
