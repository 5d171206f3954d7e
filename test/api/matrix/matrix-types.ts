import type { TestApp } from '../support/test-app';

export const CALLERS = ['owner', 'editor', 'reviewer', 'viewer', 'outsider', 'anonymous'] as const;
export type Caller = (typeof CALLERS)[number];

/** Fresh records made for one case: a workspace with the four roles, a pair, an extra member. */
export interface CaseContext {
  readonly t: TestApp;
  readonly caller: Caller;
  readonly users: Record<Exclude<Caller, 'anonymous'>, { id: string; email: string }>;
  readonly workspaceId: string;
  readonly pairId: string;
  /** A member (editor) of the fresh workspace who is none of the callers. */
  readonly extraMemberId: string;
  /** Helpers that create more fresh records directly in the database. */
  invitation(email: string): Promise<{ id: string; token: string }>;
  apiToken(userId: string): Promise<string>;
  /** A pending registration of this address; resolves with its confirmation token. */
  pendingRegistration(email: string): Promise<string>;
  /** A fresh account with a password-reset link waiting; resolves with the link's token. */
  passwordReset(): Promise<string>;
  unique(prefix: string): string;
}

export interface MatrixRow {
  readonly method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  /** The Express path as mounted (`/pairs/:id`), without /api. */
  readonly route: string;
  /** The concrete request for this case. */
  request(
    ctx: CaseContext,
  ): Promise<{ path: string; body?: unknown }> | { path: string; body?: unknown };
  /** Exact status for each caller. */
  readonly expect: Record<Caller, number>;
  /**
   * `throwaway`: signed-in callers call as a fresh account of their own, signed in for this case
   * only (for routes that end the caller's sessions or delete the account).
   */
  readonly as?: 'throwaway';
}

/** Status shorthands. */
export const everyone = (status: number): Record<Caller, number> => ({
  owner: status,
  editor: status,
  reviewer: status,
  viewer: status,
  outsider: status,
  anonymous: status,
});
export const signedIn = (status: number): Record<Caller, number> => ({
  ...everyone(status),
  anonymous: 401,
});
export const members = (status: number): Record<Caller, number> => ({
  ...signedIn(status),
  outsider: 404,
});
export const editors = (status: number): Record<Caller, number> => ({
  ...members(status),
  reviewer: 403,
  viewer: 403,
});
export const owners = (status: number): Record<Caller, number> => ({
  ...editors(status),
  editor: 403,
});
export const auditors = (status: number): Record<Caller, number> => ({
  ...members(status),
  editor: 403,
  viewer: 403,
});
