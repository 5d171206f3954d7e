import { IsNull, type EntityManager } from 'typeorm';
import type { ApiToken, ApiTokenScope } from '@gapwise/contracts';
import { ApiTokenEntity } from '@gapwise/db';
import { hashToken } from '../auth/session-tokens';
import { isUuid } from '../http/validate';
import { authCache, cacheable, forgetToken, tokenTag, userTag } from '../http/auth-cache';

const toToken = (t: ApiTokenEntity): ApiToken => ({
  id: t.id,
  name: t.name,
  prefix: t.prefix,
  createdAt: t.createdAt.toISOString(),
  lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
  revokedAt: t.revokedAt?.toISOString() ?? null,
  scope: t.scope,
  expiresAt: t.expiresAt?.toISOString() ?? null,
});

interface TokenGrant {
  readonly userId: string;
  readonly scope: ApiTokenScope;
  readonly tokenId: string;
  /** Epoch ms, or +∞ for a token without expiry. */
  readonly expiresAt: number;
}

/** `last_used_at` is refreshed at most this often per token (a write per request is not worth it). */
export const LAST_USED_RESOLUTION_MS = 60_000;
const lastMarked = new Map<string, number>();

/**
 * The user and scope of a live (not revoked, not expired) API token; marks it used (at most once
 * a minute per token). Outside a transaction a live grant is cached (see auth-cache.ts).
 */
export async function findApiTokenGrant(
  db: EntityManager,
  token: string,
): Promise<{ userId: string; scope: ApiTokenScope; tokenId: string } | null> {
  if (token.length > 200) return null;
  const hash = hashToken(token);
  const fetch = async (): Promise<TokenGrant | null> => {
    const row = await db
      .getRepository(ApiTokenEntity)
      .createQueryBuilder('t')
      .select(['t.id', 't.userId', 't.scope', 't.expiresAt'])
      .where('t.tokenHash = :hash AND t.revokedAt IS NULL', { hash })
      .andWhere('(t.expiresAt IS NULL OR t.expiresAt > now())')
      .getOne();
    if (!row) return null;
    return {
      userId: row.userId,
      scope: row.scope,
      tokenId: row.id,
      expiresAt: row.expiresAt ? row.expiresAt.getTime() : Infinity,
    };
  };
  // The cache key is the hash: the token itself is a secret and stays out of memory dumps.
  const grant = cacheable(db)
    ? await authCache.get(
        `token-hash:${hash}`,
        (g) => (g ? [tokenTag(g.tokenId), userTag(g.userId)] : []),
        fetch,
        (g) => g !== null,
        (g) => g?.expiresAt ?? 0,
      )
    : await fetch();
  if (!grant || grant.expiresAt <= Date.now()) return null;
  const now = Date.now();
  if ((lastMarked.get(grant.tokenId) ?? 0) + LAST_USED_RESOLUTION_MS <= now) {
    if (lastMarked.size > 50_000) lastMarked.clear();
    lastMarked.set(grant.tokenId, now);
    await db
      .getRepository(ApiTokenEntity)
      .update({ id: grant.tokenId }, { lastUsedAt: () => 'now()' });
  }
  return { userId: grant.userId, scope: grant.scope, tokenId: grant.tokenId };
}

export async function listTokens(db: EntityManager, userId: string): Promise<ApiToken[]> {
  const tokens = await db
    .getRepository(ApiTokenEntity)
    .find({ where: { userId }, order: { createdAt: 'DESC', id: 'ASC' } });
  return tokens.map(toToken);
}

export async function insertToken(
  db: EntityManager,
  userId: string,
  name: string,
  token: string,
  scope: ApiTokenScope,
  expiresAt: Date | null,
): Promise<ApiToken> {
  const repo = db.getRepository(ApiTokenEntity);
  const saved = await repo.save(
    repo.create({
      userId,
      name,
      prefix: token.slice(0, 10),
      tokenHash: hashToken(token),
      scope,
      expiresAt,
    }),
  );
  return toToken(saved);
}

/** Revokes one of the user's tokens; false when the user has no such token. */
export async function revokeToken(db: EntityManager, userId: string, id: string): Promise<boolean> {
  if (!isUuid(id)) return false;
  const repo = db.getRepository(ApiTokenEntity);
  if (!(await repo.exists({ where: { id, userId } }))) return false;
  forgetToken(id);
  await repo.update({ id, revokedAt: IsNull() }, { revokedAt: () => 'now()' });
  return true;
}
