import type { EntityManager } from 'typeorm';
import type { ApiToken, ApiTokenScope } from '@gapwise/contracts';
import { hashToken } from '../auth/session-tokens';
import { isUuid } from '../http/validate';
import { authCache, cacheable, forgetToken, tokenTag, userTag } from '../http/auth-cache';

type Row = Record<string, unknown>;
const toToken = (r: Row): ApiToken => ({
  id: r['id'] as string,
  name: r['name'] as string,
  prefix: r['prefix'] as string,
  createdAt: (r['created_at'] as Date).toISOString(),
  lastUsedAt: r['last_used_at'] ? (r['last_used_at'] as Date).toISOString() : null,
  revokedAt: r['revoked_at'] ? (r['revoked_at'] as Date).toISOString() : null,
  scope: r['scope'] as ApiTokenScope,
  expiresAt: r['expires_at'] ? (r['expires_at'] as Date).toISOString() : null,
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
    const rows: Row[] = await db.query(
      `SELECT id, user_id, scope, expires_at FROM api_tokens WHERE token_hash = $1
         AND revoked_at IS NULL AND (expires_at IS NULL OR expires_at > now())`,
      [hash],
    );
    const row = rows[0];
    if (!row) return null;
    return {
      userId: row['user_id'] as string,
      scope: row['scope'] as ApiTokenScope,
      tokenId: row['id'] as string,
      expiresAt: row['expires_at'] ? (row['expires_at'] as Date).getTime() : Infinity,
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
    await db.query('UPDATE api_tokens SET last_used_at = now() WHERE id = $1', [grant.tokenId]);
  }
  return { userId: grant.userId, scope: grant.scope, tokenId: grant.tokenId };
}

export async function listTokens(db: EntityManager, userId: string): Promise<ApiToken[]> {
  const rows: Row[] = await db.query(
    'SELECT * FROM api_tokens WHERE user_id = $1 ORDER BY created_at DESC, id',
    [userId],
  );
  return rows.map(toToken);
}

export async function insertToken(
  db: EntityManager,
  userId: string,
  name: string,
  token: string,
  scope: ApiTokenScope,
  expiresAt: Date | null,
): Promise<ApiToken> {
  const rows: Row[] = await db.query(
    `INSERT INTO api_tokens (user_id, name, prefix, token_hash, scope, expires_at)
     VALUES ($1, $2, $3, $4, $5, $6) RETURNING *`,
    [userId, name, token.slice(0, 10), hashToken(token), scope, expiresAt],
  );
  return toToken(rows[0]!);
}

/** Revokes one of the user's tokens; false when the user has no such token. */
export async function revokeToken(db: EntityManager, userId: string, id: string): Promise<boolean> {
  if (!isUuid(id)) return false;
  const rows: Row[] = await db.query('SELECT id FROM api_tokens WHERE id = $1 AND user_id = $2', [
    id,
    userId,
  ]);
  if (!rows[0]) return false;
  forgetToken(id);
  await db.query('UPDATE api_tokens SET revoked_at = coalesce(revoked_at, now()) WHERE id = $1', [
    id,
  ]);
  return true;
}
