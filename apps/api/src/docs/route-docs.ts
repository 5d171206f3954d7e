import { REPORT_ROUTE_DOCS } from '../reports/report-route-docs';
import { TRACE_ROUTE_DOCS } from '../traces/trace-route-docs';
import { SCREEN_ROUTE_DOCS } from '../screens/screen-route-docs';
/** One documented route; `path` is written as Express mounts it (under /api). */
export interface RouteDoc {
  readonly method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  readonly path: string;
  readonly tag: string;
  readonly summary: string;
  /** Who may call it (shown in the description). */
  readonly access: string;
  readonly auth: boolean;
  readonly body?: string;
  readonly status: number;
  readonly response?: string;
  readonly query?: ReadonlyArray<{ name: string; description: string }>;
  readonly errors?: readonly number[];
}

const member = 'any member of the workspace (non-members get 404)';
const editor = 'owner or editor (reviewer, viewer: 403; non-members: 404)';
const owner = 'owner (other roles: 403; non-members: 404)';

/** Every route of the API. A test compares this list with the routes Express has mounted. */
export const ROUTE_DOCS: readonly RouteDoc[] = [
  { method: 'get', path: '/health', tag: 'system', summary: 'Version, database reachability and migration state', access: 'anyone', auth: false, status: 200, response: 'HealthInfo' },
  { method: 'get', path: '/docs', tag: 'system', summary: 'This description as a readable page', access: 'anyone', auth: false, status: 200 },
  { method: 'get', path: '/docs/openapi.json', tag: 'system', summary: 'This description (OpenAPI 3.1)', access: 'anyone', auth: false, status: 200 },
  { method: 'get', path: '/docs/swagger-init.js', tag: 'system', summary: 'Start-up script of the readable page', access: 'anyone', auth: false, status: 200 },

  { method: 'post', path: '/auth/register', tag: 'auth', summary: 'Ask for an account: the same 202 answer whether or not the address has one; a confirmation link (or, for a registered address, a sign-in notice) is e-mailed', access: 'anyone (throttled)', auth: false, body: 'RegisterRequest', status: 202, response: 'RegistrationAnswer', errors: [400, 429] },
  { method: 'post', path: '/auth/confirm', tag: 'auth', summary: 'Use the e-mailed confirmation token: creates the account and signs in (sets cookies); invalid, used or expired: 400 confirmation-invalid', access: 'anyone with the link (throttled)', auth: false, body: 'ConfirmRegistrationRequest', status: 200, response: 'SessionInfo', errors: [400, 429] },
  { method: 'post', path: '/auth/sign-in', tag: 'auth', summary: 'Sign in (sets the httpOnly access and refresh cookies)', access: 'anyone (throttled)', auth: false, body: 'SignInRequest', status: 200, response: 'SessionInfo', errors: [400, 401, 429] },
  { method: 'post', path: '/auth/sign-out', tag: 'auth', summary: 'Sign out (clears the cookies)', access: 'anyone', auth: false, status: 204, errors: [403] },
  { method: 'post', path: '/auth/refresh', tag: 'auth', summary: 'New access cookie from the refresh cookie', access: 'holder of a refresh cookie', auth: false, status: 200, response: 'SessionInfo', errors: [401] },
  { method: 'get', path: '/auth/me', tag: 'auth', summary: 'The signed-in user, memberships and CSRF token', access: 'signed in', auth: true, status: 200, response: 'SessionInfo' },

  { method: 'get', path: '/workspaces', tag: 'workspaces', summary: 'My workspaces with my role', access: 'signed in', auth: true, status: 200, response: 'WorkspaceSummary[]' },
  { method: 'post', path: '/workspaces', tag: 'workspaces', summary: 'Create a workspace (I become its owner)', access: 'signed in', auth: true, body: 'WorkspaceName', status: 201, response: 'WorkspaceSummary' },
  { method: 'patch', path: '/workspaces/:wid', tag: 'workspaces', summary: 'Rename a workspace', access: owner, auth: true, body: 'WorkspaceName', status: 200, response: 'WorkspaceSummary' },
  { method: 'delete', path: '/workspaces/:wid', tag: 'workspaces', summary: 'Delete a workspace and everything in it', access: owner, auth: true, status: 204 },
  { method: 'get', path: '/workspaces/:wid/members', tag: 'members', summary: 'Members and their roles', access: member, auth: true, status: 200, response: 'Member[]' },
  { method: 'patch', path: '/workspaces/:wid/members/:userId', tag: 'members', summary: "Change a member's role (the last owner stays owner: 409 last-owner)", access: owner, auth: true, body: 'RoleChange', status: 200, response: 'Member', errors: [409] },
  { method: 'delete', path: '/workspaces/:wid/members/:userId', tag: 'members', summary: 'Remove a member, or leave (the last owner cannot: 409 last-owner)', access: 'owner; any member for themselves', auth: true, status: 204, errors: [409] },

  { method: 'get', path: '/workspaces/:wid/invitations', tag: 'invitations', summary: 'Invitations of the workspace', access: owner, auth: true, status: 200, response: 'Invitation[]' },
  { method: 'post', path: '/workspaces/:wid/invitations', tag: 'invitations', summary: 'Invite by e-mail (a message with an accept link is queued)', access: owner, auth: true, body: 'InvitationRequest', status: 201, response: 'Invitation', errors: [409] },
  { method: 'delete', path: '/workspaces/:wid/invitations/:id', tag: 'invitations', summary: 'Revoke an invitation', access: owner, auth: true, status: 204 },
  { method: 'get', path: '/invitations/:token', tag: 'invitations', summary: 'Preview an invitation from its link', access: 'anyone with the link', auth: false, status: 200, response: 'InvitationPreview' },
  { method: 'post', path: '/invitations/:token/accept', tag: 'invitations', summary: 'Accept an invitation (the signed-in e-mail must match)', access: 'signed in as the invited address', auth: true, status: 200, response: 'MembershipSummary', errors: [403, 409, 410] },

  { method: 'get', path: '/workspaces/:wid/pairs', tag: 'pairs', summary: 'List pairs (sort, filter, page)', access: member, auth: true, status: 200, response: 'PairPage',
    query: [
      { name: 'offset', description: 'first row (default 0)' },
      { name: 'limit', description: 'rows per page, 1–500 (default 50)' },
      { name: 'sort', description: 'name | donor | acceptor | updatedAt | log10k | deltaG0 | lambda | coupling; prefix - for descending' },
      { name: 'q', description: 'text in name, donor, acceptor, medium or notes' },
      { name: 'regime', description: 'normal | activationless | inverted' },
      { name: 'tag', description: 'pairs carrying this tag' },
      { name: 'status', description: 'draft | active | archived | all (default: all but archived)' },
    ] },
  { method: 'post', path: '/workspaces/:wid/pairs', tag: 'pairs', summary: 'Create a pair (results computed on save)', access: editor, auth: true, body: 'PairInput', status: 201, response: 'Pair' },
  { method: 'get', path: '/pairs/:id', tag: 'pairs', summary: 'Read a pair', access: member, auth: true, status: 200, response: 'Pair' },
  { method: 'put', path: '/pairs/:id', tag: 'pairs', summary: 'Replace a pair from `version` (stale: 409 version-conflict with `error.current`)', access: editor, auth: true, body: 'PairUpdate', status: 200, response: 'Pair', errors: [409] },
  { method: 'patch', path: '/pairs/:id', tag: 'pairs', summary: 'Change some fields from `version` (parameters, when given, replace all)', access: editor, auth: true, body: 'PairPatch', status: 200, response: 'Pair', errors: [409] },
  { method: 'post', path: '/pairs/:id/archive', tag: 'pairs', summary: 'Archive a pair (a new version)', access: editor, auth: true, status: 200, response: 'Pair' },
  { method: 'delete', path: '/pairs/:id', tag: 'pairs', summary: 'Delete a pair and its history', access: editor, auth: true, status: 204 },
  { method: 'post', path: '/pairs/:id/duplicate', tag: 'pairs', summary: 'Copy a pair as a new draft', access: editor, auth: true, status: 201, response: 'Pair' },
  { method: 'get', path: '/pairs/:id/versions', tag: 'pairs', summary: 'Version history, newest first', access: member, auth: true, status: 200, response: 'PairVersionSummary[]' },
  { method: 'get', path: '/pairs/:id/versions/:version', tag: 'pairs', summary: 'One immutable snapshot', access: member, auth: true, status: 200, response: 'Pair' },
  { method: 'get', path: '/pairs/:id/compare', tag: 'pairs', summary: 'Field-by-field differences between two versions', access: member, auth: true, status: 200, response: 'PairComparison',
    query: [
      { name: 'from', description: 'older version' },
      { name: 'to', description: 'newer version (default: the current one)' },
    ] },
  { method: 'post', path: '/pairs/:id/compute', tag: 'pairs', summary: "Compute the pair's results with the shared calculation core (nothing saved)", access: member, auth: true, status: 200, response: 'PairResults' },

  { method: 'post', path: '/calc', tag: 'calculation', summary: 'One calculation (CALC-API.md); 200 ok / 400 refused, the same bytes as `gapwise calc`', access: 'signed in or API token', auth: true, body: 'CalcRequest', status: 200, response: 'CalcAnswer', errors: [400] },

  { method: 'get', path: '/workspaces/:wid/audit', tag: 'audit', summary: 'Audit trail, newest first', access: 'owner or reviewer (editor, viewer: 403; non-members: 404)', auth: true, status: 200, response: 'AuditPage',
    query: [
      { name: 'offset', description: 'first row' },
      { name: 'limit', description: 'rows per page, 1–200 (default 50)' },
      { name: 'action', description: 'e.g. pair.updated' },
      { name: 'entityType', description: 'pair | workspace | membership | invitation' },
      { name: 'entityId', description: 'one record' },
    ] },

  { method: 'get', path: '/tokens', tag: 'tokens', summary: 'My API tokens (never the secrets)', access: 'signed in', auth: true, status: 200, response: 'ApiToken[]' },
  { method: 'post', path: '/tokens', tag: 'tokens', summary: 'Create an API token; the secret `gw_…` is shown in this answer only', access: 'signed in', auth: true, body: 'TokenName', status: 201, response: 'CreatedApiToken' },
  { method: 'delete', path: '/tokens/:id', tag: 'tokens', summary: 'Revoke one of my API tokens', access: 'signed in (own tokens only)', auth: true, status: 204 },
  ...REPORT_ROUTE_DOCS,
  ...TRACE_ROUTE_DOCS,
  ...SCREEN_ROUTE_DOCS,
];
