import type { EntityManager } from 'typeorm';
import type { MembershipSummary, Role, UserSummary } from '@gapwise/contracts';
import { UserEntity } from '@gapwise/db';
import { isUuid } from '../http/validate';

export interface UserWithHash extends UserSummary {
  readonly passwordHash: string;
}

const toSummary = (u: UserEntity): UserSummary => ({
  id: u.id,
  email: u.email,
  displayName: u.displayName,
});

export async function setPasswordHash(
  db: EntityManager,
  userId: string,
  passwordHash: string,
): Promise<void> {
  await db.getRepository(UserEntity).update({ id: userId }, { passwordHash });
}

export async function passwordHashOf(db: EntityManager, userId: string): Promise<string | null> {
  if (!isUuid(userId)) return null;
  const user = await db
    .getRepository(UserEntity)
    .findOne({ where: { id: userId }, select: { id: true, passwordHash: true } });
  return user?.passwordHash ?? null;
}

export async function setDisplayName(
  db: EntityManager,
  userId: string,
  displayName: string,
): Promise<void> {
  await db.getRepository(UserEntity).update({ id: userId }, { displayName });
}

export async function findUserById(db: EntityManager, id: string): Promise<UserSummary | null> {
  if (!isUuid(id)) return null;
  const user = await db.getRepository(UserEntity).findOne({ where: { id } });
  return user ? toSummary(user) : null;
}

export async function findUserByEmail(
  db: EntityManager,
  email: string,
): Promise<UserWithHash | null> {
  const user = await db
    .getRepository(UserEntity)
    .findOne({ where: { email: email.toLowerCase() } });
  return user ? { ...toSummary(user), passwordHash: user.passwordHash } : null;
}

/** Inserts a user; `null` when the e-mail is taken (checked by the unique index, race-free). */
export async function insertUser(
  db: EntityManager,
  input: { email: string; displayName: string; passwordHash: string },
): Promise<UserSummary | null> {
  const rows: Array<{ id: string; email: string; display_name: string }> = await db.query(
    `INSERT INTO users (email, display_name, password_hash) VALUES ($1, $2, $3)
     ON CONFLICT (email) DO NOTHING RETURNING id, email, display_name`,
    [input.email.toLowerCase(), input.displayName, input.passwordHash],
  );
  const row = rows[0];
  return row ? { id: row.id, email: row.email, displayName: row.display_name } : null;
}

export async function membershipsOf(
  db: EntityManager,
  userId: string,
): Promise<MembershipSummary[]> {
  const rows: Array<{ workspace_id: string; name: string; role: Role }> = await db.query(
    `SELECT m.workspace_id, w.name, m.role FROM memberships m
       JOIN workspaces w ON w.id = m.workspace_id
      WHERE m.user_id = $1 ORDER BY lower(w.name), w.id`,
    [userId],
  );
  return rows.map((r) => ({ workspaceId: r.workspace_id, workspaceName: r.name, role: r.role }));
}
