import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import { MembershipEntity, PasswordResetEntity, UserEntity } from '@gapwise/db';
import type { RegistrationAnswer } from '@gapwise/contracts';
import { AppError, validationFailed } from '../http/app-error';
import { forgetUser } from '../http/auth-cache';
import type { Config } from '../config';
import type { MailQueue } from '../mail/mail-queue';
import { insertOutbox } from '../mail/outbox-repository';
import { deleteWorkspace } from '../workspaces/workspace-repository';
import { dummyHashFor, passwordProblems } from './auth-use-case';
import { hashToken, randomToken } from './session-tokens';
import { revokeUserSessions } from './session-repository';
import { findUserByEmail, passwordHashOf, setPasswordHash } from './user-repository';

/** How long an e-mailed password-reset link works. */
export const PASSWORD_RESET_MINUTES = 60;

/** The one answer of `POST /api/auth/password-reset`, whether or not the address has an account. */
export const PASSWORD_RESET_ANSWER: RegistrationAnswer = Object.freeze({
  status: 'confirmation-sent',
  message: 'If this address has an account, a link to choose a new password is on its way.',
});

const wrongPassword = (field: string) =>
  new AppError(400, 'validation-failed', 'Some fields are not valid.', {
    fields: [{ field, message: 'is not your current password' }],
  });

async function checkPassword(
  db: DataSource,
  config: Config,
  userId: string,
  password: string,
  field: string,
): Promise<void> {
  const hash = await passwordHashOf(db.manager, userId);
  const ok = await bcrypt.compare(password, hash ?? (await dummyHashFor(config.bcryptCost)));
  if (!hash || !ok) throw wrongPassword(field);
}

function checkNewPassword(password: string, email: string, field = 'newPassword'): void {
  const problems = passwordProblems(password, email);
  if (problems.length) throw validationFailed(problems.map((message) => ({ field, message })));
}

/**
 * Changes the password of a signed-in person who knows the current one, and ends every other
 * session of theirs (the asking session stays signed in). API tokens are kept: they are listed
 * on the account page and revoked there.
 */
export async function changePassword(
  db: DataSource,
  config: Config,
  user: { id: string; email: string },
  currentSid: string,
  input: { currentPassword: string; newPassword: string },
): Promise<{ endedSessions: number }> {
  await checkPassword(db, config, user.id, input.currentPassword, 'currentPassword');
  checkNewPassword(input.newPassword, user.email);
  const hash = await bcrypt.hash(input.newPassword, config.bcryptCost);
  return db.transaction(async (tx) => {
    await setPasswordHash(tx, user.id, hash);
    await tx.getRepository(PasswordResetEntity).delete({ userId: user.id });
    return { endedSessions: await revokeUserSessions(tx, user.id, 'password-changed', currentSid) };
  });
}

export function passwordResetMail(config: Config, token: string) {
  const link = `${config.publicUrl}/reset-password/${token}`;
  return {
    subject: 'Choose a new Gapwise password',
    text: [
      'Someone, hopefully you, asked to choose a new password for the Gapwise account of this address.',
      '',
      `Choose a new password: ${link}`,
      '',
      `The link works once and expires in ${PASSWORD_RESET_MINUTES} minutes. Choosing a new password signs you out everywhere. If you did not ask, ignore this message: your password is unchanged.`,
    ].join('\n'),
    link,
  };
}

/**
 * Sends a reset link when the address has an account (a new request replaces the previous
 * link); answers the same either way, after about the same time (a hash is computed either way).
 */
export async function requestPasswordReset(
  db: DataSource,
  config: Config,
  queue: MailQueue | null,
  emailInput: string,
): Promise<RegistrationAnswer> {
  const email = emailInput.trim().toLowerCase();
  const user = await findUserByEmail(db.manager, email);
  const token = randomToken();
  // Work comparable to a sign-in either way, so the answer time does not reveal accounts.
  await bcrypt.compare(token, await dummyHashFor(config.bcryptCost));
  if (!user) return PASSWORD_RESET_ANSWER;
  await db.transaction(async (tx) => {
    const resets = tx.getRepository(PasswordResetEntity);
    await resets.delete({ userId: user.id });
    const saved = await resets.save(
      resets.create({
        userId: user.id,
        tokenHash: hashToken(token),
        expiresAt: new Date(Date.now() + PASSWORD_RESET_MINUTES * 60 * 1000),
      }),
    );
    const mail = passwordResetMail(config, token);
    const outboxId = await insertOutbox(
      tx,
      'password-reset',
      { to: user.email, subject: mail.subject, text: mail.text },
      saved.id,
    );
    if (queue) await queue.enqueue(tx, outboxId);
  });
  return PASSWORD_RESET_ANSWER;
}

const tokenShapeOk = (token: string) =>
  token.length >= 20 && token.length <= 100 && /^[A-Za-z0-9_-]+$/.test(token);

const resetInvalid = () =>
  new AppError(
    400,
    'reset-invalid',
    'This password link is invalid, expired or already used. Ask for a new one from the sign-in page.',
  );

/**
 * Uses a reset link (once: the row is removed whatever the outcome after a match), sets the new
 * password and ends every session of the account. Returns the user, to be signed in afresh.
 */
export async function confirmPasswordReset(
  db: DataSource,
  config: Config,
  input: { token: string; newPassword: string },
): Promise<{ id: string; email: string; displayName: string }> {
  if (!tokenShapeOk(input.token)) throw resetInvalid();
  const tokenHash = hashToken(input.token);
  const pending = await db
    .getRepository(PasswordResetEntity)
    .findOne({ where: { tokenHash }, relations: { user: true } });
  if (!pending || pending.expiresAt.getTime() <= Date.now()) throw resetInvalid();
  // Checked before the link is used up, so a refused password can be corrected with the same link.
  checkNewPassword(input.newPassword, pending.user.email);
  const hash = await bcrypt.hash(input.newPassword, config.bcryptCost);
  return db.transaction(async (tx) => {
    const taken = await tx.getRepository(PasswordResetEntity).delete({ id: pending.id, tokenHash });
    if (!taken.affected) throw resetInvalid(); // used meanwhile by a concurrent request
    await setPasswordHash(tx, pending.userId, hash);
    await revokeUserSessions(tx, pending.userId, 'password-reset');
    const u = pending.user;
    return { id: u.id, email: u.email, displayName: u.displayName };
  });
}

/**
 * Deletes the account of a person who confirms with their password. The rule for workspaces:
 * while they are the only owner of a workspace that has other members, the deletion is refused
 * (409 `sole-owner`, naming the workspaces: make another member an owner first, or remove the
 * members); workspaces where they are the only member are deleted with everything in them; in
 * other workspaces their membership ends and what they wrote stays, without an author.
 */
export async function deleteAccount(
  db: DataSource,
  config: Config,
  userId: string,
  password: string,
): Promise<{ deletedWorkspaces: string[]; deletedWorkspaceNames: string[] }> {
  await checkPassword(db, config, userId, password, 'password');
  return db.transaction(async (tx) => {
    const memberships = tx.getRepository(MembershipEntity);
    const mine = await memberships.find({ where: { userId } });
    const workspaceIds = mine.map((m) => m.workspaceId);
    // Locks every membership of those workspaces, so no role change or join slips in between
    // the check and the delete.
    const all = workspaceIds.length
      ? await memberships
          .createQueryBuilder('m')
          .setLock('pessimistic_write')
          .innerJoinAndSelect('m.workspace', 'w')
          .where('m.workspace_id IN (:...ids)', { ids: workspaceIds })
          .getMany()
      : [];
    const blocking: string[] = [];
    const solo: string[] = [];
    for (const id of workspaceIds) {
      const members = all.filter((m) => m.workspaceId === id);
      const others = members.filter((m) => m.userId !== userId);
      const otherOwners = others.filter((m) => m.role === 'owner');
      const me = members.find((m) => m.userId === userId);
      if (others.length === 0) solo.push(id);
      else if (me?.role === 'owner' && otherOwners.length === 0)
        blocking.push(members[0]!.workspace.name);
    }
    if (blocking.length) {
      throw new AppError(
        409,
        'sole-owner',
        `You are the only owner of ${blocking.map((n) => `"${n}"`).join(', ')}, which other people use. Make another member an owner (or remove the other members) first, then delete your account.`,
      );
    }
    // Names read before the delete, for the page to say what went with the account.
    const names = solo.map((id) => all.find((m) => m.workspaceId === id)!.workspace.name);
    for (const id of solo) await deleteWorkspace(tx, id);
    forgetUser(userId);
    await tx.getRepository(UserEntity).delete({ id: userId });
    return { deletedWorkspaces: solo, deletedWorkspaceNames: names };
  });
}
