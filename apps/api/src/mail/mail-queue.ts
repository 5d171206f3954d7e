import PgBoss from 'pg-boss';
import type { DataSource, EntityManager } from 'typeorm';
import type { Mailer } from './mailer';
import { lockPending, markAttemptFailed, markSent, pendingIds } from './outbox-repository';

export const MAIL_QUEUE = 'mail';

export interface MailQueue {
  /** Enqueues the send of an outbox row inside the caller's transaction. */
  enqueue(tx: EntityManager, outboxId: string): Promise<void>;
  stop(): Promise<void>;
}

export interface MailQueueOptions {
  readonly connectionString: string;
  readonly retryLimit?: number;
  /** Seconds before the first retry; doubled each time (backoff). */
  readonly retryDelay?: number;
  readonly pollingIntervalSeconds?: number;
  readonly log?: (message: string) => void;
}

/**
 * The `mail` queue on pg-boss (its schema `pgboss` lives in our database). A job carries only
 * the outbox row id; the row is written in the same transaction as the invitation, and the job
 * too (pg-boss `db` option), so either both exist or neither. A failed SMTP send throws, pg-boss
 * retries with exponential backoff, and the row stays `pending` (with its attempts and last
 * error) until it is sent; `resendPending` puts pending rows back in the queue on start.
 */
export async function startMailQueue(
  dataSource: DataSource,
  mailer: Mailer,
  options: MailQueueOptions,
): Promise<MailQueue> {
  const retryLimit = options.retryLimit ?? 8;
  const boss = new PgBoss({
    connectionString: options.connectionString,
    max: 3,
    application_name: 'gapwise-queue',
    supervise: true,
    schedule: false,
  });
  boss.on('error', (error: Error) => options.log?.(`pg-boss: ${error.message}`));
  await boss.start();
  await boss.createQueue(MAIL_QUEUE, {
    name: MAIL_QUEUE,
    retryLimit,
    retryDelay: options.retryDelay ?? 5,
    retryBackoff: true,
  });

  await boss.work<{ outboxId: string }>(
    MAIL_QUEUE,
    {
      pollingIntervalSeconds: options.pollingIntervalSeconds ?? 1,
      batchSize: 1,
      includeMetadata: true,
    },
    async (jobs) => {
      for (const job of jobs) {
        let failure: unknown = null;
        await dataSource.transaction(async (tx) => {
          const row = await lockPending(tx, job.data.outboxId);
          if (!row) return; // already sent, or being sent by another worker
          try {
            await mailer.send(row);
            await markSent(tx, row.id);
          } catch (error) {
            failure = error;
            await markAttemptFailed(tx, row.id, (error as Error)?.message ?? String(error));
          }
        });
        // Thrown after the commit, so the attempt is recorded and pg-boss schedules a retry.
        if (failure) throw failure;
      }
    },
  );

  const queue: MailQueue = {
    async enqueue(tx, outboxId) {
      await boss.send(
        MAIL_QUEUE,
        { outboxId },
        {
          retryLimit,
          retryDelay: options.retryDelay ?? 5,
          retryBackoff: true,
          db: {
            executeSql: async (text: string, values: unknown[]) => ({
              rows: await tx.query(text, values),
            }),
          },
        },
      );
    },
    async stop() {
      await boss.stop({ graceful: true, wait: true, timeout: 5000 });
    },
  };
  return queue;
}

/** Re-enqueues every pending outbox row (after a crash or a pg-boss outage). */
export async function resendPending(dataSource: DataSource, queue: MailQueue): Promise<number> {
  const ids = await pendingIds(dataSource.manager);
  for (const id of ids) await dataSource.transaction((tx) => queue.enqueue(tx, id));
  return ids.length;
}
