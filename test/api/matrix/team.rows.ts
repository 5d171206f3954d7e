import { pairBody } from '../support/fixtures';
import {
  auditors,
  editors,
  everyone,
  members,
  owners,
  signedIn,
  type MatrixRow,
} from './matrix-types';

/** Matrix rows of the team-workspace API. Other areas add `<area>.rows.ts` beside this file. */
export const rows: MatrixRow[] = [
  { method: 'get', route: '/health', request: () => ({ path: '/health' }), expect: everyone(200) },
  { method: 'get', route: '/docs', request: () => ({ path: '/docs' }), expect: everyone(200) },
  {
    method: 'get',
    route: '/docs/openapi.json',
    request: () => ({ path: '/docs/openapi.json' }),
    expect: everyone(200),
  },
  {
    method: 'get',
    route: '/docs/swagger-init.js',
    request: () => ({ path: '/docs/swagger-init.js' }),
    expect: everyone(200),
  },

  {
    method: 'post',
    route: '/auth/register',
    request: (c) => ({
      path: '/auth/register',
      body: {
        email: `${c.unique('reg')}@example.test`,
        password: 'long enough pass',
        displayName: 'New',
      },
    }),
    expect: everyone(202),
  },
  // Each caller uses a fresh confirmation token (signed-in callers are signed in as the new account).
  {
    method: 'post',
    route: '/auth/confirm',
    request: async (c) => ({
      path: '/auth/confirm',
      body: { token: await c.pendingRegistration(`${c.unique('conf')}@example.test`) },
    }),
    expect: everyone(200),
  },
  {
    method: 'post',
    route: '/auth/sign-in',
    request: (c) => ({
      path: '/auth/sign-in',
      body: {
        email: c.users[c.caller === 'anonymous' ? 'owner' : c.caller].email,
        password: 'correct horse battery',
      },
    }),
    expect: everyone(200),
  },
  // Routes that end the caller's sessions run as a throwaway account (see matrix-types.ts).
  {
    method: 'post',
    route: '/auth/sign-out',
    request: () => ({ path: '/auth/sign-out' }),
    expect: everyone(204),
    as: 'throwaway',
  },
  {
    method: 'post',
    route: '/auth/sign-out-everywhere',
    request: () => ({ path: '/auth/sign-out-everywhere' }),
    expect: signedIn(200),
    as: 'throwaway',
  },
  {
    method: 'delete',
    route: '/auth/account',
    request: () => ({ path: '/auth/account', body: { password: 'correct horse battery' } }),
    expect: signedIn(200),
    as: 'throwaway',
  },
  {
    method: 'patch',
    route: '/auth/me',
    request: (c) => ({ path: '/auth/me', body: { displayName: c.caller } }),
    expect: signedIn(200),
  },
  // Same password again: ends the caller's other sessions (none) and keeps this one.
  {
    method: 'post',
    route: '/auth/password',
    request: () => ({
      path: '/auth/password',
      body: { currentPassword: 'correct horse battery', newPassword: 'correct horse battery' },
    }),
    expect: signedIn(200),
  },
  {
    method: 'post',
    route: '/auth/password-reset',
    request: (c) => ({
      path: '/auth/password-reset',
      body: { email: c.users[c.caller === 'anonymous' ? 'owner' : c.caller].email },
    }),
    expect: everyone(202),
  },
  {
    method: 'post',
    route: '/auth/password-reset/confirm',
    request: async (c) => ({
      path: '/auth/password-reset/confirm',
      body: { token: await c.passwordReset(), newPassword: 'a brand new passphrase' },
    }),
    expect: everyone(200),
  },
  {
    method: 'post',
    route: '/auth/refresh',
    request: () => ({ path: '/auth/refresh' }),
    expect: signedIn(200),
  },
  {
    method: 'get',
    route: '/auth/me',
    request: () => ({ path: '/auth/me' }),
    expect: signedIn(200),
  },

  {
    method: 'get',
    route: '/workspaces',
    request: () => ({ path: '/workspaces' }),
    expect: signedIn(200),
  },
  {
    method: 'post',
    route: '/workspaces',
    request: () => ({ path: '/workspaces', body: { name: 'New workspace' } }),
    expect: signedIn(201),
  },
  {
    method: 'patch',
    route: '/workspaces/:wid',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}`, body: { name: 'Renamed' } }),
    expect: owners(200),
  },
  {
    method: 'delete',
    route: '/workspaces/:wid',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}` }),
    expect: owners(204),
  },
  {
    method: 'get',
    route: '/workspaces/:wid/members',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/members` }),
    expect: members(200),
  },
  {
    method: 'patch',
    route: '/workspaces/:wid/members/:userId',
    request: (c) => ({
      path: `/workspaces/${c.workspaceId}/members/${c.extraMemberId}`,
      body: { role: 'viewer' },
    }),
    expect: owners(200),
  },
  {
    method: 'delete',
    route: '/workspaces/:wid/members/:userId',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/members/${c.extraMemberId}` }),
    expect: owners(204),
  },

  {
    method: 'get',
    route: '/workspaces/:wid/invitations',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/invitations` }),
    expect: owners(200),
  },
  {
    method: 'post',
    route: '/workspaces/:wid/invitations',
    request: (c) => ({
      path: `/workspaces/${c.workspaceId}/invitations`,
      body: { email: `${c.unique('inv')}@example.test`, role: 'viewer' },
    }),
    expect: owners(201),
  },
  {
    method: 'delete',
    route: '/workspaces/:wid/invitations/:id',
    request: async (c) => ({
      path: `/workspaces/${c.workspaceId}/invitations/${(await c.invitation(`${c.unique('rev')}@example.test`)).id}`,
    }),
    expect: owners(204),
  },
  {
    method: 'get',
    route: '/invitations/:token',
    request: async (c) => ({
      path: `/invitations/${(await c.invitation(`${c.unique('pre')}@example.test`)).token}`,
    }),
    expect: everyone(200),
  },
  // Each caller accepts an invitation addressed to them (members keep their role; the outsider joins).
  {
    method: 'post',
    route: '/invitations/:token/accept',
    request: async (c) => ({
      path: `/invitations/${(await c.invitation(c.caller === 'anonymous' ? 'nobody@example.test' : c.users[c.caller].email)).token}/accept`,
    }),
    expect: signedIn(200),
  },

  {
    method: 'get',
    route: '/workspaces/:wid/pairs',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/pairs` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/workspaces/:wid/pairs',
    request: (c) => ({
      path: `/workspaces/${c.workspaceId}/pairs`,
      body: pairBody({ name: 'Matrix new' }),
    }),
    expect: editors(201),
  },
  {
    method: 'get',
    route: '/pairs/:id',
    request: (c) => ({ path: `/pairs/${c.pairId}` }),
    expect: members(200),
  },
  {
    method: 'put',
    route: '/pairs/:id',
    request: (c) => ({
      path: `/pairs/${c.pairId}`,
      body: { ...pairBody({ name: 'Matrix put' }), version: 1 },
    }),
    expect: editors(200),
  },
  {
    method: 'patch',
    route: '/pairs/:id',
    request: (c) => ({ path: `/pairs/${c.pairId}`, body: { version: 1, notes: 'matrix patch' } }),
    expect: editors(200),
  },
  {
    method: 'post',
    route: '/pairs/:id/archive',
    request: (c) => ({ path: `/pairs/${c.pairId}/archive` }),
    expect: editors(200),
  },
  {
    method: 'delete',
    route: '/pairs/:id',
    request: (c) => ({ path: `/pairs/${c.pairId}` }),
    expect: editors(204),
  },
  {
    method: 'post',
    route: '/pairs/:id/duplicate',
    request: (c) => ({ path: `/pairs/${c.pairId}/duplicate` }),
    expect: editors(201),
  },
  {
    method: 'get',
    route: '/pairs/:id/versions',
    request: (c) => ({ path: `/pairs/${c.pairId}/versions` }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/pairs/:id/versions/:version',
    request: (c) => ({ path: `/pairs/${c.pairId}/versions/1` }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/pairs/:id/compare',
    request: (c) => ({ path: `/pairs/${c.pairId}/compare?from=1` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/pairs/:id/compute',
    request: (c) => ({ path: `/pairs/${c.pairId}/compute` }),
    expect: members(200),
  },

  {
    method: 'post',
    route: '/calc',
    request: () => ({
      path: '/calc',
      body: {
        method: 'rate.marcus',
        inputs: { deltaG0: -0.3, lambda: 0.8, coupling: 0.005, temperature: 298.15 },
      },
    }),
    expect: signedIn(200),
  },
  {
    method: 'get',
    route: '/workspaces/:wid/audit',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/audit` }),
    expect: auditors(200),
  },
  {
    method: 'get',
    route: '/workspaces/:wid/audit/export.csv',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/audit/export.csv` }),
    expect: auditors(200),
  },

  { method: 'get', route: '/tokens', request: () => ({ path: '/tokens' }), expect: signedIn(200) },
  {
    method: 'post',
    route: '/tokens',
    request: () => ({ path: '/tokens', body: { name: 'matrix' } }),
    expect: signedIn(201),
  },
  // Each caller revokes a token of their own (anonymous: the owner's token, refused).
  {
    method: 'delete',
    route: '/tokens/:id',
    request: async (c) => {
      const token = await c.apiToken(c.users[c.caller === 'anonymous' ? 'owner' : c.caller].id);
      return { path: `/tokens/${token}` };
    },
    expect: signedIn(204),
  },
];
