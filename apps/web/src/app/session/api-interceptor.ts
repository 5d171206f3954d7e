import { HttpErrorResponse, HttpInterceptorFn, HttpRequest } from '@angular/common/http';
import { inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { plainText } from '@gapwise/contracts';
import { catchError, switchMap, throwError } from 'rxjs';
import { NO_SIGN_IN_REDIRECT, QUIET_ERRORS, RETRIED_AFTER_REFRESH, apiErrorOf } from './api-errors';
import { Session } from './session';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

function withCsrf(req: HttpRequest<unknown>, token: string | null): HttpRequest<unknown> {
  if (!token || SAFE_METHODS.has(req.method) || !req.url.startsWith('/api/')) return req;
  return req.clone({ setHeaders: { 'X-CSRF-Token': token } });
}

/**
 * Echoes the CSRF token on writes; on a 401 refreshes the session once and retries, else sends the
 * user to sign-in with a return URL; shows API refusals in a snackbar unless the caller handles them.
 */
export const apiInterceptor: HttpInterceptorFn = (req, next) => {
  const session = inject(Session);
  const router = inject(Router);
  const snackBar = inject(MatSnackBar);
  const isAuthCall = /\/api\/auth\/(sign-in|register|confirm|refresh|sign-out)$/.test(req.url);

  return next(withCsrf(req, session.csrfToken())).pipe(
    catchError((err: unknown) => {
      if (!(err instanceof HttpErrorResponse)) return throwError(() => err);
      if (err.status === 401 && !isAuthCall && !req.context.get(RETRIED_AFTER_REFRESH)) {
        return session.refreshOnce().pipe(
          switchMap((ok) => {
            if (ok) {
              const retry = req.clone({ context: req.context.set(RETRIED_AFTER_REFRESH, true) });
              return next(withCsrf(retry, session.csrfToken()));
            }
            if (!req.context.get(NO_SIGN_IN_REDIRECT)) {
              session.clear();
              const returnUrl = router.url.startsWith('/sign-in') ? '/' : router.url;
              void router.navigate(['/sign-in'], { queryParams: { returnUrl, expired: 1 } });
            }
            return throwError(() => err);
          }),
        );
      }
      if (!req.context.get(QUIET_ERRORS) && err.status !== 401) {
        // A snackbar takes no markup: a calculation message reads `|HAB|`, not `|H_AB|`.
        snackBar.open(plainText(apiErrorOf(err).message), 'Dismiss');
      }
      return throwError(() => err);
    }),
  );
};
