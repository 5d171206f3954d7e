import { createHash, createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import jwt from 'jsonwebtoken';
import type { Response } from 'express';
import type { Config } from '../config';

export const ACCESS_COOKIE = 'gw_access';
export const REFRESH_COOKIE = 'gw_refresh';
export const CSRF_HEADER = 'x-csrf-token';
const ISSUER = 'gapwise';

export interface SessionClaims {
  readonly sub: string;
  /** Id of the server-side session (a `sessions` row). */
  readonly sid: string;
  readonly typ: 'access' | 'refresh';
  /** Refresh tokens only: the session generation it was issued for (rotation, reuse detection). */
  readonly gen?: number;
}

export function signToken(config: Config, claims: SessionClaims): string {
  const seconds = claims.typ === 'access' ? config.accessTokenSeconds : config.refreshTokenSeconds;
  const payload =
    claims.typ === 'refresh'
      ? { sid: claims.sid, typ: claims.typ, gen: claims.gen ?? 0 }
      : { sid: claims.sid, typ: claims.typ };
  return jwt.sign(payload, config.jwtSecret, {
    algorithm: 'HS256',
    subject: claims.sub,
    issuer: ISSUER,
    expiresIn: seconds,
  });
}

/** Verifies a token of the given type; `null` when invalid, expired or of the other type. */
export function verifyToken(
  config: Config,
  token: string,
  typ: SessionClaims['typ'],
): SessionClaims | null {
  try {
    const payload = jwt.verify(token, config.jwtSecret, { algorithms: ['HS256'], issuer: ISSUER });
    if (typeof payload !== 'object' || payload['typ'] !== typ) return null;
    if (typeof payload.sub !== 'string' || typeof payload['sid'] !== 'string') return null;
    if (typ === 'refresh') {
      const gen: unknown = payload['gen'];
      if (typeof gen !== 'number' || !Number.isInteger(gen) || gen < 0) return null;
      return { sub: payload.sub, sid: payload['sid'], typ, gen };
    }
    return { sub: payload.sub, sid: payload['sid'], typ };
  } catch {
    return null;
  }
}

export const JWT_OPTIONS = { issuer: ISSUER, algorithms: ['HS256' as const] };

/** The CSRF token of a session: an HMAC of its id, so nothing needs storing (double submit). */
export function csrfTokenFor(config: Config, sid: string): string {
  return createHmac('sha256', config.jwtSecret).update(`csrf:${sid}`).digest('base64url');
}

export function csrfMatches(config: Config, sid: string, given: unknown): boolean {
  if (typeof given !== 'string' || given.length === 0 || given.length > 200) return false;
  const expected = Buffer.from(csrfTokenFor(config, sid));
  const actual = Buffer.from(given);
  return expected.length === actual.length && timingSafeEqual(expected, actual);
}

/** Sets the access and refresh cookies (httpOnly, SameSite=Strict) of a session generation. */
export function setSessionCookies(
  res: Response,
  config: Config,
  userId: string,
  sid: string,
  generation: number,
): void {
  const base = { httpOnly: true, sameSite: 'strict' as const, secure: config.cookieSecure };
  res.cookie(ACCESS_COOKIE, signToken(config, { sub: userId, sid, typ: 'access' }), {
    ...base,
    path: '/',
    maxAge: config.accessTokenSeconds * 1000,
  });
  res.cookie(
    REFRESH_COOKIE,
    signToken(config, { sub: userId, sid, typ: 'refresh', gen: generation }),
    {
      ...base,
      path: '/api/auth',
      maxAge: config.refreshTokenSeconds * 1000,
    },
  );
}

export function clearSessionCookies(res: Response, config: Config): void {
  const base = { httpOnly: true, sameSite: 'strict' as const, secure: config.cookieSecure };
  res.clearCookie(ACCESS_COOKIE, { ...base, path: '/' });
  res.clearCookie(REFRESH_COOKIE, { ...base, path: '/api/auth' });
}

/** SHA-256 hex of a secret token (API tokens, invitation tokens). */
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export function randomToken(prefix = ''): string {
  return prefix + randomBytes(32).toString('base64url');
}
