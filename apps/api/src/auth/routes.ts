import type { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import type { AppDeps } from '../http/context';
import { AppError, unauthenticated } from '../http/app-error';
import { checkCsrf, requireAuth, userIdOf } from '../http/authenticate';
import { parseBody } from '../http/validate';
import { ConfirmRegistrationDto, RegisterDto, SignInDto } from './auth-dto';
import { confirmRegistration, register, sessionInfo, signIn } from './auth-use-case';
import {
  REFRESH_COOKIE,
  clearSessionCookies,
  newSessionId,
  setSessionCookies,
  verifyToken,
} from './session-tokens';

export function registerAuthRoutes(router: Router, deps: AppDeps): void {
  const { config, dataSource: db } = deps;
  const throttle = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: config.signInRateLimit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) =>
      next(
        new AppError(429, 'too-many-attempts', 'Too many attempts; try again in a few minutes.'),
      ),
  });

  /** Always 202 with the same body for valid input: whether the address has an account stays in its mailbox. */
  router.post('/auth/register', throttle, async (req, res) => {
    const input = parseBody(RegisterDto, req.body);
    res.status(202).json(await register(db, config, deps.queue, input));
  });

  /** The e-mailed link: creates the account, signs in like sign-in does. */
  router.post('/auth/confirm', throttle, async (req, res) => {
    const { token } = parseBody(ConfirmRegistrationDto, req.body);
    const user = await confirmRegistration(db, token);
    const sid = newSessionId();
    setSessionCookies(res, config, user.id, sid);
    res.json(await sessionInfo(db, config, user.id, sid));
  });

  router.post('/auth/sign-in', throttle, async (req, res) => {
    const input = parseBody(SignInDto, req.body);
    const user = await signIn(db, config, input);
    const sid = newSessionId();
    setSessionCookies(res, config, user.id, sid);
    res.json(await sessionInfo(db, config, user.id, sid));
  });

  router.post('/auth/sign-out', (req, res) => {
    if (req.principal) checkCsrf(req, req.principal);
    clearSessionCookies(res, config);
    res.status(204).end();
  });

  /** New access and refresh cookies from a valid refresh cookie (rotation, same session id). */
  router.post('/auth/refresh', async (req, res) => {
    const token = (req.cookies as Record<string, unknown> | undefined)?.[REFRESH_COOKIE];
    const claims = typeof token === 'string' ? verifyToken(config, token, 'refresh') : null;
    if (!claims) {
      clearSessionCookies(res, config);
      throw unauthenticated();
    }
    const info = await sessionInfo(db, config, claims.sub, claims.sid);
    setSessionCookies(res, config, claims.sub, claims.sid);
    res.json(info);
  });

  router.get('/auth/me', requireAuth, async (req, res) => {
    // Bearer and API-token callers get a CSRF token too; they do not need it.
    res.json(
      await sessionInfo(db, config, userIdOf(req), req.principal?.sid ?? `token:${userIdOf(req)}`),
    );
  });
}
