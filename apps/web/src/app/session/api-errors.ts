import { HttpContextToken, HttpErrorResponse } from '@angular/common/http';
import type { AbstractControl, FormGroup } from '@angular/forms';
import type { ApiErrorBody } from '@gapwise/contracts';

/** Set on a request whose caller shows the API error itself (forms, conflict dialogs). */
export const QUIET_ERRORS = new HttpContextToken<boolean>(() => false);
/** Set on a request that must not send the user to sign-in when the session is gone. */
export const NO_SIGN_IN_REDIRECT = new HttpContextToken<boolean>(() => false);
/** Marks the one retry after a token refresh. */
export const RETRIED_AFTER_REFRESH = new HttpContextToken<boolean>(() => false);

export type ApiError = ApiErrorBody['error'];

/** The `{ error: { code, message, fields } }` body of an API refusal, or a generic one. */
export function apiErrorOf(err: unknown): ApiError {
  if (err instanceof HttpErrorResponse) {
    const body = err.error as Partial<ApiErrorBody> | null;
    if (body && typeof body === 'object' && body.error && typeof body.error.message === 'string') {
      return body.error;
    }
    if (err.status === 0) {
      return { code: 'network', message: 'The Gapwise server cannot be reached.' };
    }
    return {
      code: `http-${err.status}`,
      message: err.statusText || `Request failed (${err.status}).`,
    };
  }
  return { code: 'unknown', message: err instanceof Error ? err.message : String(err) };
}

/**
 * Puts each `error.fields` entry on the matching control (dotted paths allowed) as an `api`
 * error; returns the messages that matched no control so the caller can show them elsewhere.
 */
export function applyFieldErrors(form: FormGroup, error: ApiError): string[] {
  const unmatched: string[] = [];
  for (const f of error.fields ?? []) {
    const control: AbstractControl | null = form.get(f.field);
    if (control) {
      control.setErrors({ ...(control.errors ?? {}), api: f.message });
      control.markAsTouched();
    } else {
      unmatched.push(`${f.field}: ${f.message}`);
    }
  }
  return unmatched;
}
