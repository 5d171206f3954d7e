import type { EntityManager } from 'typeorm';

export interface PendingRegistration {
  readonly id: string;
  readonly email: string;
  readonly displayName: string;
  readonly passwordHash: string;
  readonly expiresAt: Date;
}

/**
 * Stores the pending registration of an address; a repeated request replaces the previous one
 * (new password, name, token and expiry: the old link stops working).
 */
export async function upsertPendingRegistration(
  db: EntityManager,
  v: {
    email: string;
    displayName: string;
    passwordHash: string;
    tokenHash: string;
    expiresAt: Date;
  },
): Promise<string> {
  const rows: Array<{ id: string }> = await db.query(
    `INSERT INTO pending_registrations (email, display_name, password_hash, token_hash, expires_at)
     VALUES ($1, $2, $3, $4, $5)
     ON CONFLICT (email) DO UPDATE SET display_name = EXCLUDED.display_name,
       password_hash = EXCLUDED.password_hash, token_hash = EXCLUDED.token_hash,
       expires_at = EXCLUDED.expires_at, created_at = now()
     RETURNING id`,
    [v.email, v.displayName, v.passwordHash, v.tokenHash, v.expiresAt],
  );
  return rows[0]!.id;
}

/** Removes and returns the pending registration of a token (used or not, a token works once). */
export async function takePendingRegistration(
  db: EntityManager,
  tokenHash: string,
): Promise<PendingRegistration | null> {
  // A SELECT over the DELETE, so TypeORM answers rows (a bare DELETE … RETURNING gives [rows, count]).
  const rows: Array<Record<string, unknown>> = await db.query(
    `WITH taken AS (
       DELETE FROM pending_registrations WHERE token_hash = $1
       RETURNING id, email, display_name, password_hash, expires_at
     ) SELECT * FROM taken`,
    [tokenHash],
  );
  const r = rows[0];
  if (!r) return null;
  return {
    id: r['id'] as string,
    email: r['email'] as string,
    displayName: r['display_name'] as string,
    passwordHash: r['password_hash'] as string,
    expiresAt: r['expires_at'] as Date,
  };
}

/** Forgets registrations whose link expired more than a day ago. */
export async function deleteStalePendingRegistrations(db: EntityManager): Promise<void> {
  await db.query(`DELETE FROM pending_registrations WHERE expires_at < now() - interval '1 day'`);
}
