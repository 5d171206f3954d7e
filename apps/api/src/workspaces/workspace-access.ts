import type { EntityManager } from 'typeorm';
import type { Role } from '@gapwise/contracts';
import { MembershipEntity } from '@gapwise/db';
import { forbidden, notFound } from '../http/app-error';
import { isUuid } from '../http/validate';
import { authCache, cacheable, roleKey, userTag, workspaceTag } from '../http/auth-cache';

/**
 * The caller's role in a workspace, or null when not a member (or no such workspace). Outside a
 * transaction a membership is cached (see auth-cache.ts); inside one the row is read afresh.
 */
export async function roleIn(
  db: EntityManager,
  workspaceId: string,
  userId: string,
): Promise<Role | null> {
  if (!isUuid(workspaceId)) return null;
  const fetch = async (): Promise<Role | null> => {
    const membership = await db
      .getRepository(MembershipEntity)
      .findOne({ where: { workspaceId, userId }, select: { role: true } });
    return membership?.role ?? null;
  };
  if (!cacheable(db)) return fetch();
  return authCache.get(
    roleKey(workspaceId, userId),
    [workspaceTag(workspaceId), userTag(userId)],
    fetch,
    (role) => role !== null,
  );
}

/**
 * Requires membership (else 404, so a workspace's existence never leaks) and a role the rule
 * allows (else 403). Returns the role.
 */
export async function requireRole(
  db: EntityManager,
  workspaceId: string,
  userId: string,
  allowed: (role: Role) => boolean = () => true,
  what = 'workspace',
): Promise<Role> {
  const role = await roleIn(db, workspaceId, userId);
  if (!role) throw notFound(what);
  if (!allowed(role)) throw forbidden();
  return role;
}
