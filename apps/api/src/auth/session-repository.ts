import type { EntityManager } from 'typeorm';
import { SessionEntity } from '@gapwise/db';
import { isUuid } from '../http/validate';
import {
  authCache,
  cacheable,
  forgetSession,
  forgetUser,
  sessionTag,
  userTag,
} from '../http/auth-cache';

/** Why a session ended (stored, for support questions). */
export type RevokeReason =
  'sign-out' | 'sign-out-everywhere' | 'password-changed' | 'password-reset' | 'refresh-reuse';

/**
 * A refresh token of the generation just before the current one, presented within this many
 * seconds of the refresh that replaced it, is a concurrent refresh (two tabs, a retried request)
 * and gets the current tokens instead of revoking the session.
 */
export const REFRESH_GRACE_SECONDS = 10;

const repo = (db: EntityManager) => db.getRepository(SessionEntity);

export async function createSession(
  db: EntityManager,
  userId: string,
  lifetimeSeconds: number,
): Promise<{ id: string; generation: number }> {
  const saved = await repo(db).save(
    repo(db).create({
      userId,
      generation: 0,
      expiresAt: new Date(Date.now() + lifetimeSeconds * 1000),
    }),
  );
  return { id: saved.id, generation: saved.generation };
}

/**
 * True while the session of an access token is neither revoked nor expired. Outside a
 * transaction a live answer is cached (see auth-cache.ts) until its expiry at the latest.
 */
export async function sessionIsLive(
  db: EntityManager,
  sid: string,
  userId: string,
): Promise<boolean> {
  if (!isUuid(sid) || !isUuid(userId)) return false;
  const fetch = async (): Promise<number | null> => {
    const rows: Array<{ expires_at: Date }> = await repo(db)
      .createQueryBuilder('s')
      .select('s.expires_at', 'expires_at')
      .where('s.id = :sid AND s.user_id = :userId', { sid, userId })
      .andWhere('s.revoked_at IS NULL AND s.expires_at > now()')
      .getRawMany();
    return rows[0] ? rows[0].expires_at.getTime() : null;
  };
  const expiresAt = cacheable(db)
    ? await authCache.get(
        `live:${sid}:${userId}`,
        [sessionTag(sid), userTag(userId)],
        fetch,
        (at) => at !== null,
        (at) => at ?? 0,
      )
    : await fetch();
  return expiresAt !== null && expiresAt > Date.now();
}

export type RefreshOutcome =
  | { readonly kind: 'rotated'; readonly generation: number }
  | { readonly kind: 'invalid' }
  | { readonly kind: 'reused' };

/**
 * Trades a refresh token of generation `generation` for the next one. The current generation
 * rotates (the session's life starts again); the previous one within the grace period gets the
 * current generation; any other is a reused token and revokes the whole session.
 */
export async function rotateRefresh(
  db: EntityManager,
  sid: string,
  userId: string,
  generation: number,
  lifetimeSeconds: number,
): Promise<RefreshOutcome> {
  if (!isUuid(sid) || !isUuid(userId)) return { kind: 'invalid' };
  const result = await repo(db)
    .createQueryBuilder()
    .update(SessionEntity)
    .set({
      generation: () => 'generation + 1',
      refreshedAt: () => 'now()',
      expiresAt: new Date(Date.now() + lifetimeSeconds * 1000),
    })
    .where('id = :sid AND user_id = :userId AND generation = :generation', {
      sid,
      userId,
      generation,
    })
    .andWhere('revoked_at IS NULL AND expires_at > now()')
    .returning(['generation'])
    .execute();
  const rotated = (result.raw as Array<{ generation: number }>)[0];
  if (rotated) return { kind: 'rotated', generation: rotated.generation };

  const session = await repo(db).findOne({ where: { id: sid, userId } });
  if (!session || session.revokedAt || session.expiresAt.getTime() <= Date.now())
    return { kind: 'invalid' };
  const recent = session.refreshedAt.getTime() > Date.now() - REFRESH_GRACE_SECONDS * 1000;
  if (generation === session.generation - 1 && recent)
    return { kind: 'rotated', generation: session.generation };
  await revokeSession(db, sid, 'refresh-reuse');
  return { kind: 'reused' };
}

export async function revokeSession(
  db: EntityManager,
  sid: string,
  reason: RevokeReason,
): Promise<void> {
  if (!isUuid(sid)) return;
  forgetSession(sid);
  await repo(db)
    .createQueryBuilder()
    .update(SessionEntity)
    .set({ revokedAt: () => 'now()', revokedReason: reason })
    .where('id = :sid AND revoked_at IS NULL', { sid })
    .execute();
}

/** Ends every live session of a user, except `keepSid` (the one asking) when given. */
export async function revokeUserSessions(
  db: EntityManager,
  userId: string,
  reason: RevokeReason,
  keepSid?: string,
): Promise<number> {
  forgetUser(userId);
  const q = repo(db)
    .createQueryBuilder()
    .update(SessionEntity)
    .set({ revokedAt: () => 'now()', revokedReason: reason })
    .where('user_id = :userId AND revoked_at IS NULL', { userId });
  if (keepSid && isUuid(keepSid)) q.andWhere('id <> :keepSid', { keepSid });
  const result = await q.execute();
  return result.affected ?? 0;
}
