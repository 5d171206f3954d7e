import type { EntityManager } from 'typeorm';
import type { Invitation, Role } from '@gapwise/contracts';
import { isUuid } from '../http/validate';

type Row = Record<string, unknown>;

export interface InvitationRecord extends Invitation {
  readonly workspaceId: string;
  readonly workspaceName: string;
}

function statusOf(r: Row): Invitation['status'] {
  if (r['revoked_at']) return 'revoked';
  if (r['accepted_at']) return 'accepted';
  if ((r['expires_at'] as Date).getTime() <= Date.now()) return 'expired';
  return 'pending';
}

const toInvitation = (r: Row): InvitationRecord => ({
  id: r['id'] as string,
  email: r['email'] as string,
  role: r['role'] as Role,
  status: statusOf(r),
  expiresAt: (r['expires_at'] as Date).toISOString(),
  createdAt: (r['created_at'] as Date).toISOString(),
  workspaceId: r['workspace_id'] as string,
  workspaceName: (r['workspace_name'] as string) ?? '',
});

const SELECT = `SELECT i.*, w.name AS workspace_name FROM invitations i JOIN workspaces w ON w.id = i.workspace_id`;

export async function insertInvitation(
  db: EntityManager,
  v: {
    workspaceId: string;
    email: string;
    role: Role;
    tokenHash: string;
    expiresAt: Date;
    createdBy: string;
  },
): Promise<InvitationRecord> {
  const rows: Row[] = await db.query(
    `INSERT INTO invitations (workspace_id, email, role, token_hash, expires_at, created_by)
     VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
    [v.workspaceId, v.email, v.role, v.tokenHash, v.expiresAt, v.createdBy],
  );
  return (await findInvitationById(db, rows[0]!['id'] as string))!;
}

export async function findInvitationById(
  db: EntityManager,
  id: string,
): Promise<InvitationRecord | null> {
  if (!isUuid(id)) return null;
  const rows: Row[] = await db.query(`${SELECT} WHERE i.id = $1`, [id]);
  return rows[0] ? toInvitation(rows[0]) : null;
}

export async function findInvitationByTokenHash(
  db: EntityManager,
  tokenHash: string,
  lock = false,
): Promise<InvitationRecord | null> {
  const rows: Row[] = await db.query(
    `${SELECT} WHERE i.token_hash = $1 ${lock ? 'FOR UPDATE OF i' : ''}`,
    [tokenHash],
  );
  return rows[0] ? toInvitation(rows[0]) : null;
}

export async function listInvitations(
  db: EntityManager,
  workspaceId: string,
): Promise<Invitation[]> {
  const rows: Row[] = await db.query(
    `${SELECT} WHERE i.workspace_id = $1 ORDER BY i.created_at DESC, i.id`,
    [workspaceId],
  );
  return rows.map((r) => {
    const { workspaceId: _w, workspaceName: _n, ...invitation } = toInvitation(r);
    return invitation;
  });
}

/** Revokes pending invitations of this address in this workspace (a new one replaces them). */
export async function revokePendingFor(
  db: EntityManager,
  workspaceId: string,
  email: string,
): Promise<void> {
  await db.query(
    `UPDATE invitations SET revoked_at = now()
      WHERE workspace_id = $1 AND lower(email) = lower($2) AND revoked_at IS NULL AND accepted_at IS NULL`,
    [workspaceId, email],
  );
}

export async function revokeInvitation(db: EntityManager, id: string): Promise<void> {
  await db.query(
    'UPDATE invitations SET revoked_at = coalesce(revoked_at, now()) WHERE id = $1 AND accepted_at IS NULL',
    [id],
  );
}

export async function markAccepted(db: EntityManager, id: string, userId: string): Promise<void> {
  await db.query('UPDATE invitations SET accepted_at = now(), accepted_by = $2 WHERE id = $1', [
    id,
    userId,
  ]);
}

export async function isMemberByEmail(
  db: EntityManager,
  workspaceId: string,
  email: string,
): Promise<boolean> {
  const rows = await db.query(
    `SELECT 1 FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.workspace_id = $1 AND u.email = lower($2)`,
    [workspaceId, email],
  );
  return rows.length > 0;
}
