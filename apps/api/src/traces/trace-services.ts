/**
 * What the trace routes need besides the database: the object store and the `trace-analysis`
 * queue (its pg-boss instance, and in the server a worker loop). Built once per process by the
 * runtime (or per test file).
 */
import PgBoss from 'pg-boss';
import type { DataSource, EntityManager } from 'typeorm';
import type { ComputeRunner } from '../compute/compute-tasks';
import { ConfigError } from '../config';
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

/** Object-store settings from the environment (defaults: the local fake of `npm run s3:start`). */
export function traceStoreConfigFromEnv(
  env: Record<string, string | undefined> = process.env,
): TraceStoreConfig {
  const endpoint = env['S3_ENDPOINT'] || `http://127.0.0.1:${env['S3_PORT'] || '4568'}`;
  try {
    const url = new URL(endpoint);
    if (url.protocol !== 'http:' && url.protocol !== 'https:') throw new Error();
  } catch {
    throw new ConfigError([`S3_ENDPOINT must be an http or https URL (got "${endpoint}")`]);
  }
  return {
    endpoint,
    region: env['S3_REGION'] || 'us-east-1',
    bucket: env['S3_BUCKET'] || 'gapwise',
    accessKeyId: env['S3_ACCESS_KEY_ID'] || 'S3RVER',
    secretAccessKey: env['S3_SECRET_ACCESS_KEY'] || 'S3RVER',
    forcePathStyle: (env['S3_FORCE_PATH_STYLE'] ?? 'true') !== 'false',
  };
}

/** Queue timings from the environment (TRACE_JOB_EXPIRE_SECONDS, TRACE_JOB_RETRY_LIMIT). */
export function traceQueueOptionsFromEnv(
  env: Record<string, string | undefined> = process.env,
): TraceQueueOptions {
  const int = (name: string, fallback: number, min: number, max: number) => {
    const raw = env[name];
    if (raw === undefined || raw === '') return fallback;
    const n = Number(raw);
    if (!Number.isInteger(n) || n < min || n > max)
      throw new ConfigError([`${name} must be an integer from ${min} to ${max}`]);
    return n;
  };
  return {
    expireInSeconds: int(
      'TRACE_JOB_EXPIRE_SECONDS',
      DEFAULT_TRACE_QUEUE_OPTIONS.expireInSeconds,
      1,
      24 * 3600,
    ),
    retryLimit: int('TRACE_JOB_RETRY_LIMIT', DEFAULT_TRACE_QUEUE_OPTIONS.retryLimit, 0, 100),
    retryDelaySeconds: DEFAULT_TRACE_QUEUE_OPTIONS.retryDelaySeconds,
  };
}

/**
 * Everything the server's trace services take from the environment: S3_* (object store),
 * TRACE_JOB_EXPIRE_SECONDS / TRACE_JOB_RETRY_LIMIT (queue), GAPWISE_TRACE_WORKER=false (no worker
 * in this process), GAPWISE_TRACE_MAINTENANCE_SECONDS (how often lost jobs are expired).
 */
export function traceServicesOptionsFromEnv(
  env: Record<string, string | undefined>,
  connectionString: string,
): TraceServicesOptions {
  const maintenance = env['GAPWISE_TRACE_MAINTENANCE_SECONDS'];
  if (
    maintenance !== undefined &&
    maintenance !== '' &&
    !(Number.isInteger(Number(maintenance)) && Number(maintenance) >= 1)
  ) {
    throw new ConfigError([
      'GAPWISE_TRACE_MAINTENANCE_SECONDS must be a whole number of seconds ≥ 1',
    ]);
  }
  return {
    connectionString,
    store: traceStoreConfigFromEnv(env),
    queueOptions: traceQueueOptionsFromEnv(env),
    runWorker: env['GAPWISE_TRACE_WORKER'] !== 'false',
    maintenanceIntervalSeconds: maintenance ? Number(maintenance) : undefined,
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
