import type { Role } from './roles';

export interface RegisterRequest {
  readonly email: string;
  readonly password: string;
  readonly displayName: string;
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

/** A personal API token for scripts (`GET /api/tokens`); the secret itself is never listed. */
export interface ApiToken {
  readonly id: string;
  readonly name: string;
  /** First characters of the token (`gw_…`), to recognise it. */
  readonly prefix: string;
  readonly createdAt: string;
  readonly lastUsedAt: string | null;
  readonly revokedAt: string | null;
}

/** Answer of `POST /api/tokens`: the only time the secret is shown. Send it as `Authorization: Bearer <token>`. */
export interface CreatedApiToken extends ApiToken {
  readonly token: string;
}
