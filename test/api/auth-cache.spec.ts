import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { authCache } from '../../apps/api/src/http/auth-cache';
import { pairBody } from './support/fixtures';
import { registerUser, sessionFrom, signIn, startTestApp, type TestApp } from './support/test-app';

/**
 * The in-process cache of sessions, API tokens and roles (apps/api/src/http/auth-cache.ts): each
 * test first shows the grant is answered from the cache (the hit counter moves), then takes the
 * access away through the API and shows the very next request is refused.
 */
const PASSWORD = 'correct horse battery';
let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => t?.close());

const me = (cookies: string[]) =>
  request(t.app).get('/api/auth/me').set('Cookie', cookies.join('; '));
const bearer = (token: string) =>
  request(t.app).get('/api/workspaces').set('Authorization', `Bearer ${token}`);

/**
 * Runs `call` twice and checks the second answer came from the cache: `hits` answers (1: the
 * session; 2: the session and the role in a workspace), nothing fetched.
 */
async function warm(call: () => request.Test, hits = 1): Promise<void> {
  await call().expect(200);
  const before = { hits: authCache.hits, misses: authCache.misses };
  await call().expect(200);
  expect(authCache.hits - before.hits).toBe(hits);
  expect(authCache.misses - before.misses).toBe(0);
}

async function workspaceWithMember(role: string) {
  const owner = await registerUser(t.app, 'owner');
  const wid = (await owner.post('/api/workspaces', { name: 'Cache lab' }).expect(201)).body
    .id as string;
  const member = await registerUser(t.app, role);
  await t.db.query('INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, $3)', [
    wid,
    member.userId,
    role,
  ]);
  return { owner, wid, member };
}

describe('session cache invalidation', () => {
  it('sign-out refuses the cached session at once', async () => {
    const s = await registerUser(t.app, 'out');
    await warm(() => me(s.cookies));
    await s.post('/api/auth/sign-out').expect(204);
    await me(s.cookies).expect(401);
  });

  it('sign-out everywhere refuses every cached session of the account', async () => {
    const a = await registerUser(t.app, 'everywhere');
    const b = await signIn(t.app, a.email, PASSWORD);
    await warm(() => me(a.cookies));
    await warm(() => me(b.cookies));
    await a.post('/api/auth/sign-out-everywhere').expect(200);
    await me(a.cookies).expect(401);
    await me(b.cookies).expect(401);
  });

  it('a password change refuses the other cached sessions and keeps this one', async () => {
    const a = await registerUser(t.app, 'change');
    const b = await signIn(t.app, a.email, PASSWORD);
    await warm(() => me(b.cookies));
    await a
      .post('/api/auth/password', { currentPassword: PASSWORD, newPassword: 'a new long phrase' })
      .expect(200);
    await me(b.cookies).expect(401);
    await me(a.cookies).expect(200);
  });

  it('a password reset refuses every cached session', async () => {
    const a = await registerUser(t.app, 'reset');
    await warm(() => me(a.cookies));
    await request(t.app).post('/api/auth/password-reset').send({ email: a.email }).expect(202);
    const message = await t.mail.waitFor(
      (m) => m.to.includes(a.email) && m.text.includes('/reset-password/'),
      20_000,
    );
    const token = /\/reset-password\/([\w-]+)/.exec(message.text)![1]!;
    const done = await request(t.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token, newPassword: 'reset long phrase' })
      .expect(200);
    await me(a.cookies).expect(401);
    await sessionFrom(t.app, done).get('/api/auth/me').expect(200);
  });

  it('a revoked API token is refused at once', async () => {
    const s = await registerUser(t.app, 'token');
    const created = (await s.post('/api/tokens', { name: 'script' }).expect(201)).body;
    await warm(() => bearer(created.token));
    await s.delete(`/api/tokens/${created.id}`).expect(204);
    await bearer(created.token).expect(401);
  });
});

describe('role cache invalidation', () => {
  it('a role change takes effect on the next request', async () => {
    const { owner, wid, member } = await workspaceWithMember('editor');
    await member.post(`/api/workspaces/${wid}/pairs`, pairBody({ name: 'Before' })).expect(201);
    await warm(() => member.get(`/api/workspaces/${wid}/pairs`), 2);
    await owner.patch(`/api/workspaces/${wid}/members/${member.userId}`, { role: 'viewer' });
    const refused = await member
      .post(`/api/workspaces/${wid}/pairs`, pairBody({ name: 'After' }))
      .expect(403);
    expect(refused.body.error.code).toBe('forbidden');
  });

  it('a removed member no longer sees the workspace', async () => {
    const { owner, wid, member } = await workspaceWithMember('viewer');
    await warm(() => member.get(`/api/workspaces/${wid}/pairs`), 2);
    await owner.delete(`/api/workspaces/${wid}/members/${member.userId}`).expect(204);
    await member.get(`/api/workspaces/${wid}/pairs`).expect(404);
  });

  it('a member removed directly in the database is refused once the cache is emptied', async () => {
    // Direct SQL bypasses the app, so only the time limit (or clear) ends a cached grant.
    const { wid, member } = await workspaceWithMember('viewer');
    await warm(() => member.get(`/api/workspaces/${wid}/pairs`), 2);
    await t.db.query('DELETE FROM memberships WHERE workspace_id = $1 AND user_id = $2', [
      wid,
      member.userId,
    ]);
    await member.get(`/api/workspaces/${wid}/pairs`).expect(200);
    authCache.clear();
    await member.get(`/api/workspaces/${wid}/pairs`).expect(404);
  });
});

describe('round trips', () => {
  it('a page of pairs costs at most two queries once the session and role are cached', async () => {
    const { wid, member } = await workspaceWithMember('editor');
    for (let i = 0; i < 3; i++)
      await member.post(`/api/workspaces/${wid}/pairs`, pairBody({ name: `P${i}` })).expect(201);
    await warm(() => member.get(`/api/workspaces/${wid}/pairs?limit=2`), 2);
    const spy = vi.spyOn(t.db.logger, 'logQuery');
    try {
      const page = await member.get(`/api/workspaces/${wid}/pairs?limit=2`).expect(200);
      expect(page.body.total).toBe(3);
      expect(page.body.items).toHaveLength(2);
      expect(spy.mock.calls.length).toBeLessThanOrEqual(2);
      expect(spy.mock.calls.length).toBeGreaterThanOrEqual(1);
      spy.mockClear();
      // Past the end: no row carries the total, so it is counted apart (still two).
      const past = await member.get(`/api/workspaces/${wid}/pairs?offset=10`).expect(200);
      expect(past.body).toMatchObject({ total: 3, items: [] });
      expect(spy.mock.calls.map((c) => c[0])).toHaveLength(2);
    } finally {
      spy.mockRestore();
    }
  });
});
