import type { EntityManager } from 'typeorm';
import type { MembershipSummary, UserSummary } from '@gapwise/contracts';
import { MembershipEntity, UserEntity } from '@gapwise/db';
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
  const email = input.email.toLowerCase();
  const result = await db
    .createQueryBuilder()
    .insert()
    .into(UserEntity)
    .values({ email, displayName: input.displayName, passwordHash: input.passwordHash })
    .orIgnore()
    .returning(['id'])
    .execute();
  const id = (result.raw as Array<{ id: string }>)[0]?.id;
  return id ? { id, email, displayName: input.displayName } : null;
}

export async function membershipsOf(
  db: EntityManager,
  userId: string,
): Promise<MembershipSummary[]> {
  const memberships = await db
    .getRepository(MembershipEntity)
    .createQueryBuilder('m')
    .innerJoinAndSelect('m.workspace', 'w')
    .where('m.userId = :userId', { userId })
    .orderBy('lower(w.name)')
    .addOrderBy('w.id')
    .getMany();
  return memberships.map((m) => ({
    workspaceId: m.workspaceId,
    workspaceName: m.workspace.name,
    role: m.role,
  }));
}
