/**
 * The one error type of the API: a stable kebab-case `code`, an HTTP status and a message safe
 * to show. Domain code throws it; the error middleware answers it.
 */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details: {
      fields?: ReadonlyArray<{ field: string; message: string }>;
      current?: unknown;
      /** Sent as the Retry-After header (seconds), with 503 answers. */
      retryAfterSeconds?: number;
    } = {},
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const notFound = (what = 'record') => new AppError(404, 'not-found', `No such ${what}.`);
export const forbidden = (message = 'Your role does not allow this.') =>
  new AppError(403, 'forbidden', message);
export const unauthenticated = () => new AppError(401, 'unauthenticated', 'Sign in to continue.');
export const validationFailed = (fields: ReadonlyArray<{ field: string; message: string }>) =>
  new AppError(400, 'validation-failed', 'Some fields are not valid.', { fields });
