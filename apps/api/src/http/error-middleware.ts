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
    log(`error on ${req.method} ${req.originalUrl}: ${(err as Error)?.stack ?? String(err)}`);
    send(500, { error: { code: 'internal-error', message: 'Something went wrong on our side.' } });
  };
}
