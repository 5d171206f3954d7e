import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import type {
  ChangePasswordRequest,
  PasswordResetConfirmRequest,
  RegisterRequest,
  RegistrationAnswer,
  SessionInfo,
  SignInRequest,
} from '@gapwise/contracts';
import { Observable, catchError, finalize, map, of, shareReplay, tap } from 'rxjs';
import { NO_SIGN_IN_REDIRECT, QUIET_ERRORS } from './api-errors';

/** The signed-in user, memberships and CSRF token, as signals. */
@Injectable({ providedIn: 'root' })
export class Session {
  private readonly http = inject(HttpClient);
  private readonly info = signal<SessionInfo | null>(null);
  private loaded = false;
  private loading$: Observable<SessionInfo | null> | null = null;
  private refreshing$: Observable<boolean> | null = null;

  readonly current = this.info.asReadonly();
  readonly user = computed(() => this.info()?.user ?? null);
  readonly memberships = computed(() => this.info()?.memberships ?? []);
  readonly csrfToken = computed(() => this.info()?.csrfToken ?? null);

  /** Loads `GET /api/auth/me` once; null when signed out. */
  ensureLoaded(): Observable<SessionInfo | null> {
    if (this.loaded) return of(this.info());
    this.loading$ ??= this.http
      .get<SessionInfo>('/api/auth/me', {
        context: new HttpContext().set(QUIET_ERRORS, true).set(NO_SIGN_IN_REDIRECT, true),
      })
      .pipe(
        catchError(() => of(null)),
        tap((info) => {
          this.info.set(info);
          this.loaded = true;
        }),
        finalize(() => (this.loading$ = null)),
        shareReplay(1),
      );
    return this.loading$;
  }

  /** Re-reads memberships (after creating a workspace or accepting an invitation). */
  reload(): Observable<SessionInfo | null> {
    this.loaded = false;
    return this.ensureLoaded();
  }

  signIn(body: SignInRequest): Observable<SessionInfo> {
    return this.http
      .post<SessionInfo>('/api/auth/sign-in', body, { context: quiet() })
      .pipe(tap((info) => this.accept(info)));
  }

  /** Asks for an account; nothing is signed in until the e-mailed link is confirmed. */
  register(body: RegisterRequest): Observable<RegistrationAnswer> {
    return this.http.post<RegistrationAnswer>('/api/auth/register', body, { context: quiet() });
  }

  /** Uses the token of the e-mailed link: creates the account and signs in. */
  confirm(token: string): Observable<SessionInfo> {
    return this.http
      .post<SessionInfo>('/api/auth/confirm', { token }, { context: quiet() })
      .pipe(tap((info) => this.accept(info)));
  }

  signOut(): Observable<void> {
    return this.http.post<void>('/api/auth/sign-out', {}, { context: quiet() }).pipe(
      catchError(() => of(undefined)),
      map(() => undefined),
      tap(() => this.clear()),
    );
  }

  /** Ends every session of the account on the server, this one included. */
  signOutEverywhere(): Observable<void> {
    return this.http
      .post<{ endedSessions: number }>('/api/auth/sign-out-everywhere', {}, { context: quiet() })
      .pipe(
        map(() => undefined),
        tap(() => this.clear()),
      );
  }

  /** Changes the display name; the answer is the refreshed session. */
  updateDisplayName(displayName: string): Observable<SessionInfo> {
    return this.http
      .patch<SessionInfo>('/api/auth/me', { displayName }, { context: quiet() })
      .pipe(tap((info) => this.accept(info)));
  }

  /** Needs the current password; every other session of the account ends. */
  changePassword(body: ChangePasswordRequest): Observable<{ endedSessions: number }> {
    return this.http.post<{ endedSessions: number }>('/api/auth/password', body, {
      context: quiet(),
    });
  }

  /** E-mails a reset link if the address has an account (the answer is the same either way). */
  requestPasswordReset(email: string): Observable<RegistrationAnswer> {
    return this.http.post<RegistrationAnswer>(
      '/api/auth/password-reset',
      { email },
      { context: quiet() },
    );
  }

  /** Uses the e-mailed reset token: sets the password, ends every session, signs in afresh. */
  confirmPasswordReset(body: PasswordResetConfirmRequest): Observable<SessionInfo> {
    return this.http
      .post<SessionInfo>('/api/auth/password-reset/confirm', body, { context: quiet() })
      .pipe(tap((info) => this.accept(info)));
  }

  /** Deletes the account (password again); see the account page for the workspace rule. */
  deleteAccount(
    password: string,
  ): Observable<{ deletedWorkspaces: string[]; deletedWorkspaceNames: string[] }> {
    return this.http
      .delete<{ deletedWorkspaces: string[]; deletedWorkspaceNames: string[] }>(
        '/api/auth/account',
        {
          body: { password },
          context: quiet(),
        },
      )
      .pipe(tap(() => this.clear()));
  }

  /** Trades the refresh cookie for a new session once, however many requests ask at the same time. */
  refreshOnce(): Observable<boolean> {
    this.refreshing$ ??= this.http
      .post<Partial<SessionInfo> | null>('/api/auth/refresh', {}, { context: quiet() })
      .pipe(
        map((body) => {
          if (body && body.user && body.csrfToken) this.accept(body as SessionInfo);
          else if (body?.csrfToken && this.info()) {
            this.info.update((i) => (i ? { ...i, csrfToken: body.csrfToken as string } : i));
          }
          return true;
        }),
        catchError(() => of(false)),
        finalize(() => (this.refreshing$ = null)),
        shareReplay(1),
      );
    return this.refreshing$;
  }

  clear(): void {
    this.info.set(null);
    this.loaded = true;
  }

  private accept(info: SessionInfo): void {
    this.info.set(info);
    this.loaded = true;
  }
}

function quiet(): HttpContext {
  return new HttpContext().set(QUIET_ERRORS, true).set(NO_SIGN_IN_REDIRECT, true);
}
