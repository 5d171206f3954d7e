import type { DataSource } from 'typeorm';
import { createDataSource } from '@gapwise/db';
import type { Config } from './config';
import type { AppDeps } from './http/context';
import { ComputePool } from './compute/compute-pool';
import { createSmtpMailer, type Mailer } from './mail/mailer';
import { resendPending, startMailQueue, type MailQueue } from './mail/mail-queue';
import { provideScreenService } from './screens/routes';
import { reportPdfStoreFor } from './reports/report-pdf-store';
import { screenServiceOptions, startScreenService } from './screens/screen-queue';
import { provideTraceServices } from './traces/routes';
import { startTraceServices, traceServicesOptions } from './traces/trace-services';

export interface Runtime extends AppDeps {
  readonly dataSource: DataSource;
  readonly mailer: Mailer;
  readonly queue: MailQueue;
  close(): Promise<void>;
}

/**
 * Connects to PostgreSQL, applies pending migrations (when asked), starts the pg-boss mail queue
 * and the SMTP mailer. `close()` stops them in reverse order.
 */
export async function startRuntime(
  config: Config,
  options: {
    migrate?: boolean;
    log?: (message: string) => void;
    mailRetryDelaySeconds?: number;
  } = {},
): Promise<Runtime> {
  const log = options.log ?? ((m: string) => console.error(m));
  const dataSource = createDataSource({ url: config.databaseUrl });
  await dataSource.initialize();
  let compute: ComputePool | undefined;
  try {
    compute = await ComputePool.start({
      threads: config.calcThreads,
      queue: config.calcQueue,
      interactiveBudgetMs: config.calcBudgetMs,
      backgroundBudgetMs: config.backgroundCalcBudgetMs,
    });
    if (options.migrate) {
      const done = await dataSource.runMigrations({ transaction: 'each' });
      if (done.length) log(`applied migrations: ${done.map((m) => m.name).join(', ')}`);
    }
    const mailer = createSmtpMailer(config);
    const queue = await startMailQueue(dataSource, mailer, {
      connectionString: config.databaseUrl,
      retryDelay: options.mailRetryDelaySeconds,
      log,
    });
    const resent = await resendPending(dataSource, queue).catch(() => 0);
    if (resent) log(`re-queued ${resent} unsent e-mail(s)`);
    // Screens: pg-boss queue `screen-chunk`, with one worker in this process unless
    // GAPWISE_SCREEN_WORKER=false (apps/api/src/screens/README.md).
    const screens = await startScreenService(dataSource, {
      ...screenServiceOptions(config.databaseUrl, config.screens),
      log,
      compute,
    });
    // Traces: object store (S3_*) and pg-boss queue `trace-analysis`, with one worker in this
    // process unless GAPWISE_TRACE_WORKER=false (apps/api/src/traces/README.md).
    const traces = await startTraceServices(dataSource, {
      ...traceServicesOptions(config),
      log,
      compute,
    });
    const runtime: Runtime = {
      config,
      dataSource,
      compute,
      mailer,
      queue,
      log,
      // Report PDFs in the S3-API object store named by S3_ENDPOINT (reports/report-pdf-store.ts).
      reportPdfStore: reportPdfStoreFor(config.objectStore),
      async close() {
        // The pool first: its threads are ended at once, running calculations included, so the
        // queues below are not kept waiting for them (SIGTERM stops the server within 10 s).
        await compute!.destroy().catch(() => undefined);
        await traces.stop().catch(() => undefined);
        await screens.stop().catch(() => undefined);
        await queue.stop().catch(() => undefined);
        mailer.close();
        await dataSource.destroy();
      },
    };
    provideScreenService(runtime, screens);
    provideTraceServices(runtime, traces);
    return runtime;
  } catch (error) {
    await compute?.destroy().catch(() => undefined);
    await dataSource.destroy().catch(() => undefined);
    throw error;
  }
}
