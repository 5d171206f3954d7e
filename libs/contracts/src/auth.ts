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
