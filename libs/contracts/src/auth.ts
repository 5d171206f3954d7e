import type { Role } from './roles';

export interface RegisterRequest {
  readonly email: string;
  readonly password: string;
  readonly displayName: string;
  /** Same-site path to open after the confirmation (e.g. an invitation page), carried in the e-mailed link. */
  readonly returnUrl?: string;
}

/**
 * Answer of `POST /api/auth/register` (202), identical whether or not the address already has an
 * account: the next step is always in the mailbox (a confirmation link, or a notice to sign in).
 */
export interface RegistrationAnswer {
  readonly status: 'confirmation-sent';
  readonly message: string;
}

/** Body of `POST /api/auth/confirm`: the token of the e-mailed `/confirm/<token>` link. */
export interface ConfirmRegistrationRequest {
  readonly token: string;
}

export interface SignInRequest {
  readonly email: string;
  readonly password: string;
}

export interface UserSummary {
  readonly id: string;
  readonly email: string;
  readonly displayName: string;
}

export interface MembershipSummary {
  readonly workspaceId: string;
  readonly workspaceName: string;
  readonly role: Role;
}

/** `GET /api/auth/me` and the body of a successful sign-in. */
export interface SessionInfo {
  readonly user: UserSummary;
  readonly memberships: MembershipSummary[];
  /** Value to echo in the `X-CSRF-Token` header on cookie-authenticated writes. */
  readonly csrfToken: string;
}

/** Password rule shared by the registration form and the API. */
export const PASSWORD_MIN_LENGTH = 10;
/** bcrypt reads only the first 72 bytes (UTF-8) of a password, so longer ones are refused. */
export const PASSWORD_MAX_BYTES = 72;

/** UTF-8 length of a password, as bcrypt counts it (no Node built-in: the web app uses it too). */
export function passwordBytes(password: string): number {
  return new TextEncoder().encode(password).length;
}

/** Body of `POST /api/auth/password`. */
export interface ChangePasswordRequest {
  readonly currentPassword: string;
  readonly newPassword: string;
}

/** Body of `POST /api/auth/password-reset` (always answered 202 with the same body). */
export interface PasswordResetRequest {
  readonly email: string;
}

/** Body of `POST /api/auth/password-reset/confirm`: the token of the e-mailed `/reset-password/<token>` link. */
export interface PasswordResetConfirmRequest {
  readonly token: string;
  readonly newPassword: string;
}

/** Body of `PATCH /api/auth/me`. */
export interface UpdateProfileRequest {
  readonly displayName: string;
}

/** Body of `DELETE /api/auth/account`: the password again, so a left-open browser cannot do it. */
export interface DeleteAccountRequest {
  readonly password: string;
}

/** What an API token may do: `read` allows GET/HEAD only; `read-write` all its owner may do. */
export type ApiTokenScope = 'read' | 'read-write';
export const API_TOKEN_SCOPES: readonly ApiTokenScope[] = ['read', 'read-write'];

/** Body of `POST /api/tokens`. */
export interface CreateApiTokenRequest {
  readonly name: string;
  /** Defaults to `read-write`. */
  readonly scope?: ApiTokenScope;
  /** ISO instant after which the token is refused; absent or null = until revoked. */
  readonly expiresAt?: string | null;
}

/** A personal API token for scripts (`GET /api/tokens`); the secret itself is never listed. */
export interface ApiToken {
  readonly id: string;
  readonly name: string;
  /** First characters of the token (`gw_…`), to recognise it. */
  readonly prefix: string;
  readonly createdAt: string;
  readonly lastUsedAt: string | null;
  readonly revokedAt: string | null;
  readonly scope: ApiTokenScope;
  readonly expiresAt: string | null;
}

/** Answer of `POST /api/tokens`: the only time the secret is shown. Send it as `Authorization: Bearer <token>`. */
export interface CreatedApiToken extends ApiToken {
  readonly token: string;
}
