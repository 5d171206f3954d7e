import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import type { RegistrationAnswer, SessionInfo, UserSummary } from '@gapwise/contracts';
import { AppError, unauthenticated, validationFailed } from '../http/app-error';
import type { Config } from '../config';
import type { MailQueue } from '../mail/mail-queue';
import { insertOutbox } from '../mail/outbox-repository';
import { csrfTokenFor, hashToken, randomToken } from './session-tokens';
import {
  findUserByEmail,
  findUserById,
  insertUser,
  membershipsOf,
  setPasswordHash,
} from './user-repository';
import {
  deleteStalePendingRegistrations,
  takePendingRegistration,
  upsertPendingRegistration,
} from './pending-registration-repository';
import type { RegisterDto, SignInDto } from './auth-dto';

/** Password rules beyond the length: not all one character, not the e-mail itself. */
export function passwordProblems(password: string, email: string): string[] {
  const problems: string[] = [];
  if (new Set(password).size < 4) problems.push('must use at least 4 different characters');
  if (password.trim().toLowerCase() === email.trim().toLowerCase())
    problems.push('must not be your e-mail address');
  return problems;
}

export async function sessionInfo(
  db: DataSource,
  config: Config,
  userId: string,
  sid: string,
): Promise<SessionInfo> {
  const user = await findUserById(db.manager, userId);
  if (!user) throw unauthenticated();
  return {
    user,
    memberships: await membershipsOf(db.manager, userId),
    csrfToken: csrfTokenFor(config, sid),
  };
}

/** How long an e-mailed confirmation link works. */
export const REGISTRATION_LINK_HOURS = 24;

/** The one answer of `POST /api/auth/register`, whether or not the address has an account. */
export const REGISTRATION_ANSWER: RegistrationAnswer = Object.freeze({
  status: 'confirmation-sent',
  message: 'If this address can be registered, a confirmation link is on its way.',
});

const withReturn = (link: string, returnUrl: string | undefined) =>
  returnUrl ? `${link}?returnUrl=${encodeURIComponent(returnUrl)}` : link;

export function confirmationMail(config: Config, token: string, returnUrl?: string) {
  const link = withReturn(`${config.publicUrl}/confirm/${token}`, returnUrl);
  return {
    subject: 'Confirm your Gapwise account',
    text: [
      'Someone, hopefully you, asked to create a Gapwise account for this address.',
      '',
      `Confirm it and sign in: ${link}`,
      '',
      `The link works once and expires in ${REGISTRATION_LINK_HOURS} hours. If you did not ask for an account, ignore this message: nothing is created without the link.`,
    ].join('\n'),
    link,
  };
}

export function alreadyRegisteredMail(config: Config, returnUrl?: string) {
  const link = withReturn(`${config.publicUrl}/sign-in`, returnUrl);
  return {
    subject: 'Someone tried to register your address on Gapwise',
    text: [
      'Someone tried to create a Gapwise account for this address, which already has one.',
      'No new account was created and your password is unchanged.',
      '',
      `If it was you, sign in instead: ${link}`,
      '',
      'If it was not you, you can ignore this message.',
    ].join('\n'),
    link,
  };
}

/**
 * Registration without user enumeration: the answer is the same for every valid request. A free
 * address gets a pending registration and a confirmation link (the account is created only when
 * the link is used); an address with an account gets a notice to sign in instead. Both e-mails go
 * through the outbox in the same transaction, and the password is hashed either way so the two
 * paths take about as long.
 */
export async function register(
  db: DataSource,
  config: Config,
  queue: MailQueue | null,
  input: RegisterDto,
): Promise<RegistrationAnswer> {
  const problems = passwordProblems(input.password, input.email);
  if (problems.length)
    throw validationFailed(problems.map((message) => ({ field: 'password', message })));
  const email = input.email.trim().toLowerCase();
  const displayName = input.displayName.trim() || email;
  const passwordHash = await bcrypt.hash(input.password, config.bcryptCost);
  await db.transaction(async (tx) => {
    await deleteStalePendingRegistrations(tx);
    const existing = await findUserByEmail(tx, email);
    let outboxId: string;
    if (existing) {
      const mail = alreadyRegisteredMail(config, input.returnUrl);
      outboxId = await insertOutbox(
        tx,
        'registration-existing',
        { to: email, subject: mail.subject, text: mail.text },
        existing.id,
      );
    } else {
      const token = randomToken();
      const pendingId = await upsertPendingRegistration(tx, {
        email,
        displayName,
        passwordHash,
        tokenHash: hashToken(token),
        expiresAt: new Date(Date.now() + REGISTRATION_LINK_HOURS * 3600 * 1000),
      });
      const mail = confirmationMail(config, token, input.returnUrl);
      outboxId = await insertOutbox(
        tx,
        'registration-confirm',
        { to: email, subject: mail.subject, text: mail.text },
        pendingId,
      );
    }
    if (queue) await queue.enqueue(tx, outboxId);
  });
  return REGISTRATION_ANSWER;
}

const tokenOk = (token: string) =>
  token.length >= 20 && token.length <= 100 && /^[A-Za-z0-9_-]+$/.test(token);

/**
 * Uses a confirmation token (once: the pending registration is removed whatever happens) and
 * creates the account if the address is still free. Unknown, used or expired tokens and a taken
 * address all give the same 400 `confirmation-invalid`.
 */
export async function confirmRegistration(db: DataSource, token: string): Promise<UserSummary> {
  const user = await db.transaction(async (tx) => {
    const pending = tokenOk(token) ? await takePendingRegistration(tx, hashToken(token)) : null;
    if (!pending || pending.expiresAt.getTime() <= Date.now()) return null;
    return insertUser(tx, {
      email: pending.email,
      displayName: pending.displayName,
      passwordHash: pending.passwordHash,
    });
  });
  if (!user) {
    throw new AppError(
      400,
      'confirmation-invalid',
      'This confirmation link is invalid, expired or already used. Register again to get a new link, or sign in.',
    );
  }
  return user;
}

/**
 * Hashes to compare against when the e-mail is unknown, one per cost factor, so an unknown
 * address takes as long as a known one (same cost) and timing does not reveal accounts.
 */
const dummyHashes = new Map<number, Promise<string>>();
export function dummyHashFor(cost: number): Promise<string> {
  let hash = dummyHashes.get(cost);
  if (!hash) {
    hash = bcrypt.hash('not-a-password-at-all', cost);
    dummyHashes.set(cost, hash);
  }
  return hash;
}

export async function signIn(
  db: DataSource,
  config: Config,
  input: SignInDto,
): Promise<UserSummary> {
  const user = await findUserByEmail(db.manager, input.email.trim());
  const ok = await bcrypt.compare(
    input.password,
    user?.passwordHash ?? (await dummyHashFor(config.bcryptCost)),
  );
  if (!user || !ok) throw new AppError(401, 'invalid-credentials', 'E-mail or password is wrong.');
  // A hash made at a lower cost than configured (older accounts, a seed) is upgraded now, while
  // the password is at hand, so every account costs an attacker the same.
  if (bcrypt.getRounds(user.passwordHash) < config.bcryptCost)
    await setPasswordHash(
      db.manager,
      user.id,
      await bcrypt.hash(input.password, config.bcryptCost),
    );
  return { id: user.id, email: user.email, displayName: user.displayName };
}
