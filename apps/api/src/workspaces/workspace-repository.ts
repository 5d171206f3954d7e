import type { EntityManager } from 'typeorm';
import type { Member, Role, WorkspaceSummary } from '@gapwise/contracts';
import { forgetMembership, forgetWorkspace } from '../http/auth-cache';

export async function listWorkspacesOf(
  db: EntityManager,
  userId: string,
): Promise<WorkspaceSummary[]> {
  const rows: Array<{ id: string; name: string; role: Role }> = await db.query(
    `SELECT w.id, w.name, m.role FROM workspaces w JOIN memberships m ON m.workspace_id = w.id
      WHERE m.user_id = $1 ORDER BY lower(w.name), w.id`,
    [userId],
  );
  return rows.map((r) => ({ id: r.id, name: r.name, role: r.role }));
}

export async function insertWorkspace(
  db: EntityManager,
  name: string,
): Promise<{ id: string; name: string }> {
  const rows = await db.query('INSERT INTO workspaces (name) VALUES ($1) RETURNING id, name', [
    name,
  ]);
  return rows[0];
}

export async function workspaceName(db: EntityManager, id: string): Promise<string | null> {
  const rows = await db.query('SELECT name FROM workspaces WHERE id = $1', [id]);
  return rows[0]?.name ?? null;
}

export async function renameWorkspace(db: EntityManager, id: string, name: string): Promise<void> {
  await db.query('UPDATE workspaces SET name = $2 WHERE id = $1', [id, name]);
}

export async function deleteWorkspace(db: EntityManager, id: string): Promise<void> {
  forgetWorkspace(id);
  await db.query('DELETE FROM workspaces WHERE id = $1', [id]);
}

export async function upsertMembership(
  db: EntityManager,
  workspaceId: string,
  userId: string,
  role: Role,
): Promise<void> {
  forgetMembership(workspaceId, userId);
  await db.query(
    `INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, $3)
     ON CONFLICT (workspace_id, user_id) DO UPDATE SET role = EXCLUDED.role`,
    [workspaceId, userId, role],
  );
}

export async function listMembers(db: EntityManager, workspaceId: string): Promise<Member[]> {
  const rows: Array<{ user_id: string; email: string; display_name: string; role: Role }> =
    await db.query(
      `SELECT m.user_id, u.email, u.display_name, m.role FROM memberships m JOIN users u ON u.id = m.user_id
      WHERE m.workspace_id = $1
      ORDER BY array_position(ARRAY['owner','editor','reviewer','viewer'], m.role), lower(u.display_name), u.id`,
      [workspaceId],
    );
  return rows.map((r) => ({
    userId: r.user_id,
    email: r.email,
    displayName: r.display_name,
    role: r.role,
  }));
}

/** Locks the workspace's memberships (for last-owner checks) and returns them. */
export async function lockMemberships(
  db: EntityManager,
  workspaceId: string,
): Promise<Array<{ userId: string; role: Role }>> {
  const rows: Array<{ user_id: string; role: Role }> = await db.query(
    'SELECT user_id, role FROM memberships WHERE workspace_id = $1 FOR UPDATE',
    [workspaceId],
  );
  return rows.map((r) => ({ userId: r.user_id, role: r.role }));
}

export async function setRole(
  db: EntityManager,
  workspaceId: string,
  userId: string,
  role: Role,
): Promise<void> {
  forgetMembership(workspaceId, userId);
  await db.query('UPDATE memberships SET role = $3 WHERE workspace_id = $1 AND user_id = $2', [
    workspaceId,
    userId,
    role,
  ]);
}

export async function removeMembership(
  db: EntityManager,
  workspaceId: string,
  userId: string,
): Promise<void> {
  forgetMembership(workspaceId, userId);
  await db.query('DELETE FROM memberships WHERE workspace_id = $1 AND user_id = $2', [
    workspaceId,
    userId,
  ]);
}
