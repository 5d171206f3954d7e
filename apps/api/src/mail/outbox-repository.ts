import type { EntityManager } from 'typeorm';
import type { OutgoingMail } from './mailer';

export interface OutboxRow extends OutgoingMail {
  readonly id: string;
  readonly status: 'pending' | 'sent' | 'failed';
  readonly attempts: number;
}

export async function insertOutbox(
  db: EntityManager,
  kind: string,
  mail: OutgoingMail,
  relatedId: string | null,
): Promise<string> {
  const rows = await db.query(
    `INSERT INTO mail_outbox (kind, to_address, subject, text_body, html_body, related_id)
     VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
    [kind, mail.to, mail.subject, mail.text, mail.html ?? null, relatedId],
  );
  return rows[0].id;
}

/** Locks a pending row for sending (another worker holding it is skipped). */
export async function lockPending(db: EntityManager, id: string): Promise<OutboxRow | null> {
  const rows: Array<Record<string, unknown>> = await db.query(
    `SELECT * FROM mail_outbox WHERE id = $1 AND status = 'pending' FOR UPDATE SKIP LOCKED`,
    [id],
  );
  const r = rows[0];
  if (!r) return null;
  return {
    id: r['id'] as string,
    to: r['to_address'] as string,
    subject: r['subject'] as string,
    text: (r['text_body'] as string) ?? '',
    html: (r['html_body'] as string | null) ?? null,
    status: r['status'] as OutboxRow['status'],
    attempts: r['attempts'] as number,
  };
}

/** Marks a message sent and clears its bodies (they may carry one-time links). */
export async function markSent(db: EntityManager, id: string): Promise<void> {
  await db.query(
    `UPDATE mail_outbox SET status = 'sent', sent_at = now(), attempts = attempts + 1,
       text_body = NULL, html_body = NULL, last_error = NULL WHERE id = $1`,
    [id],
  );
}

/** Records a failed attempt; the row stays pending so it is retried, never lost. */
export async function markAttemptFailed(
  db: EntityManager,
  id: string,
  error: string,
): Promise<void> {
  await db.query('UPDATE mail_outbox SET attempts = attempts + 1, last_error = $2 WHERE id = $1', [
    id,
    error.slice(0, 500),
  ]);
}

export async function pendingIds(db: EntityManager): Promise<string[]> {
  const rows: Array<{ id: string }> = await db.query(
    `SELECT id FROM mail_outbox WHERE status = 'pending' ORDER BY created_at LIMIT 500`,
  );
  return rows.map((r) => r.id);
}
