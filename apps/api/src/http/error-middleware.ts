import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ApiErrorBody } from '@gapwise/contracts';
import { AppError } from './app-error';

/** JSON 404 for every unknown route under /api. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError(404, 'not-found', `No route ${req.method} ${req.baseUrl}${req.path}.`));
};

/**
 * Answers every error as `ApiErrorBody`. Known errors keep their code; anything else becomes a
 * 500 `internal-error` whose details go to the log only (never stack traces or SQL in answers).
 */
export function errorMiddleware(log: (message: string) => void): ErrorRequestHandler {
  return (err, req, res, _next) => {
    const send = (status: number, body: ApiErrorBody) => {
      if (res.headersSent) return;
      res.status(status).json(body);
    };
    if (err instanceof AppError) {
      const error: Record<string, unknown> = { code: err.code, message: err.message };
      if (err.details.fields) error['fields'] = err.details.fields;
      if (err.details.current !== undefined) error['current'] = err.details.current;
      if (err.details.retryAfterSeconds !== undefined && !res.headersSent)
        res.set('Retry-After', String(err.details.retryAfterSeconds));
      send(err.status, { error } as unknown as ApiErrorBody);
      return;
    }
    const type = (err as { type?: string } | null)?.type;
    if (type === 'entity.parse.failed') {
      send(400, {
        error: { code: 'invalid-json', message: 'The request body is not valid JSON.' },
      });
      return;
    }
    if (type === 'entity.too.large') {
      send(413, {
        error: { code: 'payload-too-large', message: 'The request body is too large.' },
      });
      return;
    }
    const status = (err as { status?: number } | null)?.status;
    if (typeof status === 'number' && status >= 400 && status < 500) {
      send(status, { error: { code: 'bad-request', message: 'The request could not be read.' } });
      return;
    }
    if (isDatabaseUnavailable(err)) {
      res.setHeader('Retry-After', '5');
      send(503, {
        error: {
          code: 'database-unavailable',
          message: 'The database is unavailable; try again shortly.',
        },
      });
      return;
    }
    log(`error on ${req.method} ${req.originalUrl}: ${(err as Error)?.stack ?? String(err)}`);
    send(500, { error: { code: 'internal-error', message: 'Something went wrong on our side.' } });
  };
}

/** Node socket errors of a connection that could not be opened or was cut. */
const SOCKET_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EHOSTUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
  'EPIPE',
]);
/** SQLSTATEs of a server that is down or refusing connections (class 08, 57P01–57P03, 53300). */
const UNAVAILABLE_STATES = new Set(['57P01', '57P02', '57P03', '53300']);
/** node-postgres and pool messages of a lost or impossible connection (they carry no code). */
const UNAVAILABLE_MESSAGE =
  /Connection terminated|timeout exceeded when trying to connect|not currently accepting connections|Client has encountered a connection error|Connection is not established|Driver not Connected/i;

/**
 * True for errors saying the database cannot be reached (down, restarting, refusing
 * connections), so every route answers 503 like health instead of a 500. TypeORM wraps driver
 * errors (`driverError`); both levels are checked.
 */
export function isDatabaseUnavailable(err: unknown): boolean {
  for (
    let e = err as { code?: unknown; message?: unknown; driverError?: unknown } | null, i = 0;
    e && i < 3;
    i++
  ) {
    const code = typeof e.code === 'string' ? e.code : '';
    if (SOCKET_CODES.has(code) || UNAVAILABLE_STATES.has(code) || code.startsWith('08'))
      return true;
    if (typeof e.message === 'string' && UNAVAILABLE_MESSAGE.test(e.message)) return true;
    e = (e.driverError ?? null) as typeof e;
  }
  return false;
}
