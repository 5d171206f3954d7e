import type { EntityManager } from 'typeorm';
import { PendingRegistrationEntity } from '@gapwise/db';

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
  const result = await db
    .createQueryBuilder()
    .insert()
    .into(PendingRegistrationEntity)
    .values({ ...v, createdAt: () => 'now()' })
    .orUpdate(
      ['display_name', 'password_hash', 'token_hash', 'expires_at', 'created_at'],
      ['email'],
    )
    .returning(['id'])
    .execute();
  return (result.raw as Array<{ id: string }>)[0]!.id;
}

/** Removes and returns the pending registration of a token (used or not, a token works once). */
export async function takePendingRegistration(
  db: EntityManager,
  tokenHash: string,
): Promise<PendingRegistration | null> {
  const result = await db
    .createQueryBuilder()
    .delete()
    .from(PendingRegistrationEntity)
    .where('token_hash = :tokenHash', { tokenHash })
    .returning('id, email, display_name, password_hash, expires_at')
    .execute();
  const r = (result.raw as Array<Record<string, unknown>>)[0];
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
  await db
    .createQueryBuilder()
    .delete()
    .from(PendingRegistrationEntity)
    .where(`expires_at < now() - interval '1 day'`)
    .execute();
}
