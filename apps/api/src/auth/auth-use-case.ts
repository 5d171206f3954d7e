import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import type { SessionInfo, UserSummary } from '@gapwise/contracts';
import { AppError, unauthenticated, validationFailed } from '../http/app-error';
import type { Config } from '../config';
import { csrfTokenFor } from './session-tokens';
import { findUserByEmail, findUserById, insertUser, membershipsOf } from './user-repository';
import type { RegisterDto, SignInDto } from './auth-dto';

/** Password rules beyond the length: not all one character, not the e-mail itself. */
export function passwordProblems(password: string, email: string): string[] {
  const problems: string[] = [];
  if (new Set(password).size < 4) problems.push('must use at least 4 different characters');
  if (password.trim().toLowerCase() === email.trim().toLowerCase()) problems.push('must not be your e-mail address');
  return problems;
}

export async function sessionInfo(db: DataSource, config: Config, userId: string, sid: string): Promise<SessionInfo> {
  const user = await findUserById(db.manager, userId);
  if (!user) throw unauthenticated();
  return { user, memberships: await membershipsOf(db.manager, userId), csrfToken: csrfTokenFor(config, sid) };
}

export async function register(db: DataSource, config: Config, input: RegisterDto): Promise<UserSummary> {
  const problems = passwordProblems(input.password, input.email);
  if (problems.length) throw validationFailed(problems.map((message) => ({ field: 'password', message })));
  const passwordHash = await bcrypt.hash(input.password, config.bcryptCost);
  const user = await insertUser(db.manager, {
    email: input.email.trim(),
    displayName: input.displayName.trim() || input.email,
    passwordHash,
  });
  // A taken e-mail is reported as such on registration (the form needs to say so); sign-in and
  // invitations never reveal whether an address has an account.
  if (!user) throw new AppError(409, 'email-taken', 'An account with this e-mail already exists.');
  return user;
}

/** A hash to compare against when the e-mail is unknown, so timing does not reveal accounts. */
let dummyHash: string | null = null;

export async function signIn(db: DataSource, config: Config, input: SignInDto): Promise<UserSummary> {
  const user = await findUserByEmail(db.manager, input.email.trim());
  dummyHash ??= await bcrypt.hash('not-a-password-at-all', config.bcryptCost);
  const ok = await bcrypt.compare(input.password, user?.passwordHash ?? dummyHash);
  if (!user || !ok) throw new AppError(401, 'invalid-credentials', 'E-mail or password is wrong.');
  return { id: user.id, email: user.email, displayName: user.displayName };
}
