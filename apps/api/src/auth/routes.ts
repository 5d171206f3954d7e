import type { Request, Response, Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import type { AppDeps } from '../http/context';
import { AppError, unauthenticated } from '../http/app-error';
import { checkCsrf, requireAuth, requireSession, userIdOf } from '../http/authenticate';
import { parseBody } from '../http/validate';
import {
  ChangePasswordDto,
  ConfirmRegistrationDto,
  DeleteAccountDto,
  PasswordResetConfirmDto,
  PasswordResetRequestDto,
  RegisterDto,
  SignInDto,
  UpdateProfileDto,
} from './auth-dto';
import { confirmRegistration, register, sessionInfo, signIn } from './auth-use-case';
import {
  changePassword,
  confirmPasswordReset,
  deleteAccount,
  requestPasswordReset,
} from './account-use-case';
import {
  createSession,
  revokeSession,
  revokeUserSessions,
  rotateRefresh,
} from './session-repository';
import { setDisplayName } from './user-repository';
import {
  REFRESH_COOKIE,
  clearSessionCookies,
  setSessionCookies,
  verifyToken,
} from './session-tokens';

const tooMany = () =>
  new AppError(429, 'too-many-attempts', 'Too many attempts; try again in a few minutes.');

export function registerAuthRoutes(router: Router, deps: AppDeps): void {
  const { config, dataSource: db } = deps;
  const limiter = (keyOf?: (req: Request) => string, failedOnly = false) =>
    rateLimit({
      windowMs: 15 * 60 * 1000,
      limit: config.signInRateLimit,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      skipSuccessfulRequests: failedOnly,
      ...(keyOf ? { keyGenerator: keyOf } : {}),
      handler: (_req, _res, next) => next(tooMany()),
    });
  // Sign-in: failed attempts only, counted per client address and per account (an attack on one
  // account from many addresses, or on many accounts from one address, each stops). Separate
  // stores from registration, confirmation and reset links, so one does not use up the other.
  const signInPerAddress = limiter(undefined, true);
  const signInPerAccount = limiter((req) => {
    const email: unknown = (req.body as Record<string, unknown> | undefined)?.['email'];
    return `account:${typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : ''}`;
  }, true);
  const mailLinks = limiter();

  /** Opens a new server-side session and sets its cookies. */
  const startSession = async (res: Response, userId: string) => {
    const session = await createSession(db.manager, userId, config.refreshTokenSeconds);
    setSessionCookies(res, config, userId, session.id, session.generation);
    return sessionInfo(db, config, userId, session.id);
  };
  const refreshClaims = (req: Request) => {
    const token = (req.cookies as Record<string, unknown> | undefined)?.[REFRESH_COOKIE];
    return typeof token === 'string' ? verifyToken(config, token, 'refresh') : null;
  };

  /** Always 202 with the same body for valid input: whether the address has an account stays in its mailbox. */
  router.post('/auth/register', mailLinks, async (req, res) => {
    const input = parseBody(RegisterDto, req.body);
    res.status(202).json(await register(db, config, deps.queue, input));
  });

  /** The e-mailed link: creates the account, signs in like sign-in does. */
  router.post('/auth/confirm', mailLinks, async (req, res) => {
    const { token } = parseBody(ConfirmRegistrationDto, req.body);
    const user = await confirmRegistration(db, token);
    res.json(await startSession(res, user.id));
  });

  router.post('/auth/sign-in', signInPerAddress, signInPerAccount, async (req, res) => {
    const input = parseBody(SignInDto, req.body);
    const user = await signIn(db, config, input);
    res.json(await startSession(res, user.id));
  });

  /** Ends this session on the server (its access and refresh tokens are refused from now on). */
  router.post('/auth/sign-out', async (req, res) => {
    if (req.principal) checkCsrf(req, req.principal);
    if (req.principal?.sid) await revokeSession(db.manager, req.principal.sid, 'sign-out');
    const refresh = refreshClaims(req);
    if (refresh) await revokeSession(db.manager, refresh.sid, 'sign-out');
    clearSessionCookies(res, config);
    res.status(204).end();
  });

  /** Ends every session of the signed-in person, this one included. API tokens stay. */
  router.post('/auth/sign-out-everywhere', requireAuth, requireSession, async (req, res) => {
    const ended = await revokeUserSessions(db.manager, userIdOf(req), 'sign-out-everywhere');
    clearSessionCookies(res, config);
    res.json({ endedSessions: ended });
  });

  /**
   * New access and refresh cookies from a valid refresh cookie (rotation, same session id). A
   * refresh token that was already traded in (outside a short grace period) revokes the session.
   */
  router.post('/auth/refresh', async (req, res) => {
    const claims = refreshClaims(req);
    const outcome = claims
      ? await rotateRefresh(
          db.manager,
          claims.sid,
          claims.sub,
          claims.gen ?? 0,
          config.refreshTokenSeconds,
        )
      : ({ kind: 'invalid' } as const);
    if (!claims || outcome.kind !== 'rotated') {
      clearSessionCookies(res, config);
      if (outcome.kind === 'reused')
        throw new AppError(
          401,
          'session-revoked',
          'This sign-in was ended because its refresh token was used twice; sign in again.',
        );
      throw unauthenticated();
    }
    const info = await sessionInfo(db, config, claims.sub, claims.sid);
    setSessionCookies(res, config, claims.sub, claims.sid, outcome.generation);
    res.json(info);
  });

  router.get('/auth/me', requireAuth, async (req, res) => {
    // Bearer and API-token callers get a CSRF token too; they do not need it.
    res.json(
      await sessionInfo(db, config, userIdOf(req), req.principal?.sid ?? `token:${userIdOf(req)}`),
    );
  });

  /** Changes the display name. */
  router.patch('/auth/me', requireAuth, requireSession, async (req, res) => {
    const { displayName } = parseBody(UpdateProfileDto, req.body);
    await setDisplayName(db.manager, userIdOf(req), displayName.trim());
    res.json(await sessionInfo(db, config, userIdOf(req), req.principal!.sid!));
  });

  /** Needs the current password; every other session of the account ends. */
  router.post('/auth/password', requireAuth, requireSession, async (req, res) => {
    const input = parseBody(ChangePasswordDto, req.body);
    const info = await sessionInfo(db, config, userIdOf(req), req.principal!.sid!);
    res.json(await changePassword(db, config, info.user, req.principal!.sid!, input));
  });

  /** Always 202 with the same body: whether the address has an account stays in its mailbox. */
  router.post('/auth/password-reset', mailLinks, async (req, res) => {
    const { email } = parseBody(PasswordResetRequestDto, req.body);
    res.status(202).json(await requestPasswordReset(db, config, deps.queue, email));
  });

  /** The e-mailed link: sets the new password, ends every session, then signs in afresh. */
  router.post('/auth/password-reset/confirm', mailLinks, async (req, res) => {
    const input = parseBody(PasswordResetConfirmDto, req.body);
    const user = await confirmPasswordReset(db, config, input);
    res.json(await startSession(res, user.id));
  });

  /** Deletes the account (password again); see `deleteAccount` for the workspace rule. */
  router.delete('/auth/account', requireAuth, requireSession, async (req, res) => {
    const { password } = parseBody(DeleteAccountDto, req.body);
    const result = await deleteAccount(db, config, userIdOf(req), password);
    clearSessionCookies(res, config);
    res.json(result);
  });
}
