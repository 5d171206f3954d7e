import type { EntityManager } from 'typeorm';

/**
 * What every authenticated request needs — a session is live, an API token's grant, the caller's
 * role in a workspace — kept in this process for a few seconds so that a read costs one query
 * instead of three or four.
 *
 * Only positive answers are kept (a live session, a live token, a membership): a refusal always
 * asks PostgreSQL, so nothing granted later is ever refused from the cache. Every write that takes
 * access away calls `forget*` (sign-out, sign-out everywhere, password change and reset, role
 * change, member removal, workspace and account deletion, token revocation) — inside or outside
 * its transaction. Because a concurrent read may have fetched the old row just before such a
 * write commits, a key stays uncacheable for `BLOCK_MS` after it is forgotten, and an answer
 * fetched before the last `forget` of any of its tags is not stored. `TTL_MS` bounds how long
 * another API process (they do not share this cache) can keep answering from an old grant.
 */
export const AUTH_CACHE_TTL_MS = 5_000;
const BLOCK_MS = 5_000;
/** Far above what one process serves at once; when reached the cache starts again empty. */
const MAX_ENTRIES = 50_000;

interface Entry<T> {
  readonly value: T;
  readonly tags: readonly string[];
  readonly until: number;
}

class AuthCache {
  private readonly entries = new Map<string, Entry<unknown>>();
  private readonly forgotten = new Map<string, number>();
  /** Counts for tests and the benchmark: answers served from memory vs fetched. */
  hits = 0;
  misses = 0;

  /**
   * The cached answer for `key`, or `fetch()`'s answer, stored when `keep(value)` says so (until
   * `validUntil(value)` at most) and no tag was forgotten since the fetch started. Tags may be
   * given up front or worked out from the answer (a token's owner is known only once fetched).
   */
  async get<T>(
    key: string,
    tagsOf: readonly string[] | ((value: T) => readonly string[]),
    fetch: () => Promise<T>,
    keep: (value: T) => boolean,
    validUntil: (value: T) => number = () => Number.POSITIVE_INFINITY,
  ): Promise<T> {
    const now = Date.now();
    const entry = this.entries.get(key) as Entry<T> | undefined;
    if (entry && entry.until > now) {
      this.hits++;
      return entry.value;
    }
    if (entry) this.entries.delete(key);
    this.misses++;
    const started = now;
    const value = await fetch();
    const tags = typeof tagsOf === 'function' ? (keep(value) ? tagsOf(value) : []) : tagsOf;
    if (keep(value) && this.storable([key, ...tags], started)) {
      if (this.entries.size >= MAX_ENTRIES) this.entries.clear();
      const until = Math.min(Date.now() + AUTH_CACHE_TTL_MS, validUntil(value));
      this.entries.set(key, { value, tags, until });
    }
    return value;
  }

  private storable(tags: readonly string[], started: number): boolean {
    for (const tag of tags) {
      const at = this.forgotten.get(tag);
      if (at !== undefined && at + BLOCK_MS >= started) return false;
    }
    return true;
  }

  /** Drops every entry carrying one of `tags` (or keyed by it) and blocks re-caching them. */
  forget(...tags: string[]): void {
    const now = Date.now();
    for (const [tag, at] of this.forgotten) if (at + BLOCK_MS < now) this.forgotten.delete(tag);
    const set = new Set(tags);
    for (const tag of set) this.forgotten.set(tag, now);
    for (const [key, entry] of this.entries) {
      if (set.has(key) || entry.tags.some((t) => set.has(t))) this.entries.delete(key);
    }
  }

  /** Empties the cache (tests that change grants with direct SQL, bypassing the app). */
  clear(): void {
    this.entries.clear();
    this.forgotten.clear();
  }
}

/** One per process: grants are facts about the database, the same for every app it serves. */
export const authCache = new AuthCache();

/**
 * True when `db` is the data source's own manager, not a transaction's: checks made inside a write
 * transaction stay authoritative (they read, and may lock, the current rows).
 */
export const cacheable = (db: EntityManager): boolean => !db.queryRunner;

export const roleKey = (workspaceId: string, userId: string) => `role:${workspaceId}:${userId}`;
export const sessionTag = (sid: string) => `session:${sid}`;
export const userTag = (userId: string) => `user:${userId}`;
export const workspaceTag = (workspaceId: string) => `workspace:${workspaceId}`;
export const tokenTag = (tokenId: string) => `token:${tokenId}`;

/** Sign-out of one session. */
export const forgetSession = (sid: string) => authCache.forget(sessionTag(sid));
/** Every session, token and membership of a user (sign-out everywhere, password, deletion). */
export const forgetUser = (userId: string) => authCache.forget(userTag(userId));
/** One member's role (role change, removal, joining). */
export const forgetMembership = (workspaceId: string, userId: string) =>
  authCache.forget(roleKey(workspaceId, userId));
/** Every member's role in a workspace (deletion). */
export const forgetWorkspace = (workspaceId: string) => authCache.forget(workspaceTag(workspaceId));
/** One API token (revocation). */
export const forgetToken = (tokenId: string) => authCache.forget(tokenTag(tokenId));
