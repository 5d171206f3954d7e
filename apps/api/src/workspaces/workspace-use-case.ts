import type { DataSource, EntityManager } from 'typeorm';
import {
  MembershipEntity,
  PairEntity,
  ReportEntity,
  ScreenEntity,
  SeriesEntity,
  TraceEntity,
  UserEntity,
  WorkspaceDeletionEntity,
  WorkspaceEntity,
} from '@gapwise/db';
import {
  canManageMembers,
  type Member,
  type Role,
  type WorkspaceSummary,
} from '@gapwise/contracts';
import { AppError, forbidden, notFound } from '../http/app-error';
import { isUuid } from '../http/validate';
import { recordAudit } from '../audit/audit-repository';
import { requireRole } from './workspace-access';
import {
  deleteWorkspace,
  insertWorkspace,
  listMembers,
  lockMemberships,
  removeMembership,
  renameWorkspace,
  setRole,
  upsertMembership,
  workspaceName,
} from './workspace-repository';

export async function createWorkspace(
  db: DataSource,
  userId: string,
  name: string,
): Promise<WorkspaceSummary> {
  return db.transaction((tx) => createWorkspaceIn(tx, userId, name));
}

/** Creates a workspace owned by the user inside the caller's transaction (the demo seed's). */
export async function createWorkspaceIn(
  tx: EntityManager,
  userId: string,
  name: string,
): Promise<WorkspaceSummary> {
  const ws = await insertWorkspace(tx, name.trim());
  await upsertMembership(tx, ws.id, userId, 'owner');
  await recordAudit(tx, {
    workspaceId: ws.id,
    actorId: userId,
    action: 'workspace.created',
    entityType: 'workspace',
    entityId: ws.id,
    summary: `created workspace "${ws.name}"`,
    after: { name: ws.name },
  });
  return { id: ws.id, name: ws.name, role: 'owner' };
}

export async function renameWorkspaceUseCase(
  db: DataSource,
  userId: string,
  workspaceId: string,
  name: string,
): Promise<WorkspaceSummary> {
  return db.transaction(async (tx) => {
    const role = await requireRole(tx, workspaceId, userId, canManageMembers);
    const before = await workspaceName(tx, workspaceId);
    await renameWorkspace(tx, workspaceId, name.trim());
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'workspace.renamed',
      entityType: 'workspace',
      entityId: workspaceId,
      summary: `renamed workspace "${before}" to "${name.trim()}"`,
      before: { name: before },
      after: { name: name.trim() },
    });
    return { id: workspaceId, name: name.trim(), role };
  });
}

export async function deleteWorkspaceUseCase(
  db: DataSource,
  userId: string,
  workspaceId: string,
): Promise<void> {
  await db.transaction(async (tx) => {
    await requireRole(tx, workspaceId, userId, canManageMembers);
    await recordWorkspaceDeletion(tx, workspaceId, userId);
    await deleteWorkspace(tx, workspaceId);
  });
}

export async function membersOf(
  db: DataSource,
  userId: string,
  workspaceId: string,
): Promise<Member[]> {
  await requireRole(db.manager, workspaceId, userId);
  return listMembers(db.manager, workspaceId);
}

const lastOwner = () =>
  new AppError(
    409,
    'last-owner',
    'A workspace needs at least one owner; make someone else owner first.',
  );

export async function changeRole(
  db: DataSource,
  userId: string,
  workspaceId: string,
  targetId: string,
  role: Role,
): Promise<Member> {
  return db.transaction(async (tx) => {
    await requireRole(tx, workspaceId, userId, canManageMembers);
    const members = await lockMemberships(tx, workspaceId);
    const target = isUuid(targetId) ? members.find((m) => m.userId === targetId) : undefined;
    if (!target) throw notFound('member');
    const owners = members.filter((m) => m.role === 'owner');
    if (target.role === 'owner' && role !== 'owner' && owners.length === 1) throw lastOwner();
    if (target.role !== role) {
      await setRole(tx, workspaceId, targetId, role);
      await recordAudit(tx, {
        workspaceId,
        actorId: userId,
        action: 'member.role-changed',
        entityType: 'membership',
        entityId: targetId,
        summary: `changed a member's role from ${target.role} to ${role}`,
        before: { role: target.role },
        after: { role },
      });
    }
    const member = (await listMembers(tx, workspaceId)).find((m) => m.userId === targetId);
    if (!member) throw notFound('member');
    return member;
  });
}

/** Owners remove anyone; any member may remove themselves (leave). The last owner cannot go. */
export async function removeMember(
  db: DataSource,
  userId: string,
  workspaceId: string,
  targetId: string,
): Promise<void> {
  await db.transaction(async (tx) => {
    const role = await requireRole(tx, workspaceId, userId);
    if (targetId !== userId && !canManageMembers(role)) throw forbidden();
    const members = await lockMemberships(tx, workspaceId);
    const target = isUuid(targetId) ? members.find((m) => m.userId === targetId) : undefined;
    if (!target) throw notFound('member');
    if (target.role === 'owner' && members.filter((m) => m.role === 'owner').length === 1)
      throw lastOwner();
    await removeMembership(tx, workspaceId, targetId);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: targetId === userId ? 'member.left' : 'member.removed',
      entityType: 'membership',
      entityId: targetId,
      summary:
        targetId === userId
          ? `left the workspace (${target.role})`
          : `removed a member (${target.role})`,
      before: { role: target.role },
    });
  });
}

/**
 * Keeps a record of a workspace about to be deleted (who, when, what it held) in
 * `workspace_deletions`, which has no foreign keys and so survives the cascade. Same
 * transaction as the deletion: no record without a deletion, no deletion without a record.
 */
async function recordWorkspaceDeletion(
  tx: EntityManager,
  workspaceId: string,
  userId: string,
): Promise<void> {
  const where = { workspaceId };
  const [
    workspace,
    user,
    pairCount,
    reportCount,
    screenCount,
    traceCount,
    seriesCount,
    memberCount,
  ] = await Promise.all([
    tx.findOneByOrFail(WorkspaceEntity, { id: workspaceId }),
    tx.findOneBy(UserEntity, { id: userId }),
    tx.countBy(PairEntity, where),
    tx.countBy(ReportEntity, where),
    tx.countBy(ScreenEntity, where),
    tx.countBy(TraceEntity, where),
    tx.countBy(SeriesEntity, where),
    tx.countBy(MembershipEntity, where),
  ]);
  await tx.insert(WorkspaceDeletionEntity, {
    workspaceId,
    workspaceName: workspace.name,
    deletedBy: userId,
    deletedByEmail: user?.email ?? '',
    pairCount,
    reportCount,
    screenCount,
    traceCount,
    seriesCount,
    memberCount,
  });
}
