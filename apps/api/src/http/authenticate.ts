import { Passport } from 'passport';
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { AppDeps, Principal } from './context';
import { AppError, unauthenticated } from './app-error';
import { ACCESS_COOKIE, CSRF_HEADER, JWT_OPTIONS, csrfMatches } from '../auth/session-tokens';
import { findApiTokenGrant } from '../tokens/token-repository';
import { sessionIsLive } from '../auth/session-repository';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Works out who is calling, without refusing anybody: `Authorization: Bearer gw_…` (API token),
 * `Authorization: Bearer <jwt>` (scripts), or the httpOnly access cookie (browser). A JWT counts
 * only while its server-side session is live (not signed out, revoked or expired). Invalid
 * credentials leave the request anonymous; `requireAuth` answers 401 where it matters.
 * Uses its own Passport instance so several apps in one process never share strategies.
 */
export function identify(deps: AppDeps): RequestHandler {
  const passport = new Passport();
  const verify =
    (via: Principal['via']) =>
    (
      payload: { sub?: unknown; sid?: unknown; typ?: unknown },
      done: (e: unknown, u?: unknown) => void,
    ) => {
      if (
        payload.typ !== 'access' ||
        typeof payload.sub !== 'string' ||
        typeof payload.sid !== 'string'
      ) {
        done(null, false);
        return;
      }
      sessionIsLive(deps.dataSource.manager, payload.sid, payload.sub).then(
        (live) =>
          done(null, live ? ({ userId: payload.sub, via, sid: payload.sid } as Principal) : false),
        (error) => done(error),
      );
    };
  const common = { secretOrKey: deps.config.jwtSecret, ...JWT_OPTIONS };
  passport.use(
    'jwt-bearer',
    new JwtStrategy(
      { ...common, jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken() },
      verify('bearer'),
    ),
  );
  passport.use(
    'jwt-cookie',
    new JwtStrategy(
      {
        ...common,
        jwtFromRequest: (req: Request) => {
          const value = (req.cookies as Record<string, unknown> | undefined)?.[ACCESS_COOKIE];
          return typeof value === 'string' ? value : null;
        },
      },
      verify('cookie'),
    ),
  );

  const run = (name: string, req: Request, res: Response) =>
    new Promise<Principal | null>((resolve, reject) => {
      passport.authenticate(name, { session: false }, (error: unknown, user: Principal | false) => {
        if (error) reject(error);
        else resolve(user || null);
      })(req, res, (error?: unknown) => (error ? reject(error) : resolve(null)));
    });

  return async (req, res, next) => {
    const header = req.headers.authorization;
    if (typeof header === 'string' && /^bearer\s+/i.test(header)) {
      const token = header.replace(/^bearer\s+/i, '').trim();
      if (token.startsWith('gw_')) {
        const grant = await findApiTokenGrant(deps.dataSource.manager, token);
        if (grant) req.principal = { userId: grant.userId, via: 'api-token', scope: grant.scope };
      } else {
        req.principal = (await run('jwt-bearer', req, res)) ?? undefined;
      }
      next();
      return;
    }
    const cookies = req.cookies as Record<string, unknown> | undefined;
    if (cookies?.[ACCESS_COOKIE]) req.principal = (await run('jwt-cookie', req, res)) ?? undefined;
    next();
  };
}

/**
 * 401 for anonymous callers; for cookie-authenticated writes, 403 `csrf-failed` unless the
 * `X-CSRF-Token` header carries the session's CSRF token (double submit); for writes with a
 * read-only API token, 403 `token-read-only`.
 */
export const requireAuth: RequestHandler = (req: Request, _res: Response, next: NextFunction) => {
  const principal = req.principal;
  if (!principal) throw unauthenticated();
  checkCsrf(req, principal);
  if (principal.via === 'api-token' && principal.scope === 'read' && !SAFE_METHODS.has(req.method))
    throw new AppError(
      403,
      'token-read-only',
      'This API token is read-only; create a read-write token on your account page to make changes.',
    );
  next();
};

/**
 * After `requireAuth`: refuses API tokens (403 `session-required`) where only a signed-in person
 * may act — creating tokens, password, sessions and account deletion.
 */
export const requireSession: RequestHandler = (
  req: Request,
  _res: Response,
  next: NextFunction,
) => {
  if (!req.principal) throw unauthenticated();
  if (req.principal.via === 'api-token' || !req.principal.sid)
    throw new AppError(
      403,
      'session-required',
      'Only a signed-in person can do this, not an API token: sign in on the web page.',
    );
  next();
};

export function checkCsrf(req: Request, principal: Principal): void {
  if (principal.via !== 'cookie' || SAFE_METHODS.has(req.method)) return;
  const config = req.app.locals['config'] as AppDeps['config'];
  if (!principal.sid || !csrfMatches(config, principal.sid, req.headers[CSRF_HEADER])) {
    throw new AppError(403, 'csrf-failed', 'The request lacks a valid X-CSRF-Token header.');
  }
}

/** The signed-in user's id (after `requireAuth`). */
export function userIdOf(req: Request): string {
  if (!req.principal) throw unauthenticated();
  return req.principal.userId;
}
