import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { registerUser, sessionFrom, startTestApp, type TestApp } from './support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => t?.close());

const cookieHeader = (res: request.Response) =>
  ((res.headers['set-cookie'] as unknown as string[]) ?? []).map((c) => c.split(';')[0]).join('; ');

describe('auth', () => {
  it('registers, sets httpOnly SameSite=Strict cookies and answers SessionInfo with a CSRF token', async () => {
    const res = await request(t.app)
      .post('/api/auth/register')
      .send({ email: 'Ada@Example.test', password: 'a long enough pass', displayName: 'Ada' })
      .expect(201);
    expect(res.body.user).toMatchObject({ email: 'ada@example.test', displayName: 'Ada' });
    expect(res.body.memberships).toEqual([]);
    expect(res.body.csrfToken).toMatch(/^[\w-]{20,}$/);
    const cookies = res.headers['set-cookie'] as unknown as string[];
    expect(cookies.some((c) => /^gw_access=.*HttpOnly.*SameSite=Strict/i.test(c))).toBe(true);
    expect(cookies.some((c) => /^gw_refresh=.*Path=\/api\/auth.*HttpOnly/i.test(c))).toBe(true);
    expect(JSON.stringify(res.body)).not.toContain('password');
  });

  it('refuses short passwords and bad e-mails listing each field; a taken e-mail is 409', async () => {
    const res = await request(t.app).post('/api/auth/register').send({ email: 'nope', password: 'short', displayName: '' }).expect(400);
    expect(res.body.error.fields.map((f: { field: string }) => f.field).sort()).toEqual(['displayName', 'email', 'password']);
    await request(t.app).post('/api/auth/register').send({ email: 'ada@example.test', password: 'another long pass', displayName: 'A' }).expect(409);
    await request(t.app).post('/api/auth/register').send({ email: 'b@example.test', password: 'aaaaaaaaaaaa', displayName: 'B' }).expect(400);
  });

  it('gives the same answer for an unknown e-mail and a wrong password (no enumeration)', async () => {
    const wrong = await request(t.app).post('/api/auth/sign-in').send({ email: 'ada@example.test', password: 'wrong password!' }).expect(401);
    const unknown = await request(t.app).post('/api/auth/sign-in').send({ email: 'nobody@example.test', password: 'wrong password!' }).expect(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('invalid-credentials');
  });

  it('me, refresh and sign-out work with cookies; anonymous me is 401 unauthenticated', async () => {
    const anon = await request(t.app).get('/api/auth/me').expect(401);
    expect(anon.body.error.code).toBe('unauthenticated');
    const signIn = await request(t.app).post('/api/auth/sign-in').send({ email: 'ADA@example.test', password: 'a long enough pass' }).expect(200);
    const cookies = cookieHeader(signIn);
    const me = await request(t.app).get('/api/auth/me').set('Cookie', cookies).expect(200);
    expect(me.body.user.email).toBe('ada@example.test');
    expect(me.body.csrfToken).toBe(signIn.body.csrfToken);
    const refreshed = await request(t.app).post('/api/auth/refresh').set('Cookie', cookies).expect(200);
    expect(refreshed.body.csrfToken).toBe(signIn.body.csrfToken);
    await request(t.app).post('/api/auth/refresh').expect(401);
    const out = await request(t.app).post('/api/auth/sign-out').set('Cookie', cookies).set('X-CSRF-Token', signIn.body.csrfToken).expect(204);
    expect((out.headers['set-cookie'] as unknown as string[]).some((c) => /^gw_access=;/.test(c))).toBe(true);
  });

  it('requires X-CSRF-Token on cookie-authenticated writes, not on bearer requests', async () => {
    const s = await registerUser(t.app, 'csrf');
    const cookies = s.cookies.join('; ');
    const none = await request(t.app).post('/api/workspaces').set('Cookie', cookies).send({ name: 'W' }).expect(403);
    expect(none.body.error.code).toBe('csrf-failed');
    await request(t.app).post('/api/workspaces').set('Cookie', cookies).set('X-CSRF-Token', 'forged-token-value-000000000').send({ name: 'W' }).expect(403);
    const list = await request(t.app).get('/api/workspaces').set('Cookie', cookies).expect(200);
    expect(list.body).toEqual([]);
    await s.post('/api/workspaces', { name: 'W' }).expect(201);
    // A script with an API token needs no CSRF token.
    const token = await s.post('/api/tokens', { name: 'pipeline' }).expect(201);
    expect(token.body.token).toMatch(/^gw_/);
    await request(t.app).post('/api/workspaces').set('Authorization', `Bearer ${token.body.token}`).send({ name: 'From script' }).expect(201);
    const mine = await request(t.app).get('/api/workspaces').set('Authorization', `Bearer ${token.body.token}`).expect(200);
    expect(mine.body.map((w: { name: string }) => w.name).sort()).toEqual(['From script', 'W']);
  });

  it('lists tokens without secrets, stores only hashes, and revokes', async () => {
    const s = await registerUser(t.app, 'tokens');
    const created = await s.post('/api/tokens', { name: 'ci' }).expect(201);
    const list = await s.get('/api/tokens').expect(200);
    expect(list.body).toHaveLength(1);
    expect(JSON.stringify(list.body)).not.toContain(created.body.token);
    const stored = await t.db.query('SELECT token_hash FROM api_tokens WHERE id = $1', [created.body.id]);
    expect(stored[0].token_hash).not.toContain(created.body.token);
    await request(t.app).get('/api/auth/me').set('Authorization', `Bearer ${created.body.token}`).expect(200);
    await s.delete(`/api/tokens/${created.body.id}`).expect(204);
    await request(t.app).get('/api/auth/me').set('Authorization', `Bearer ${created.body.token}`).expect(401);
    const other = await registerUser(t.app, 'other');
    await other.delete(`/api/tokens/${created.body.id}`).expect(404);
  });

  it('accepts the access JWT as a bearer token too', async () => {
    const signIn = await request(t.app).post('/api/auth/sign-in').send({ email: 'ada@example.test', password: 'a long enough pass' }).expect(200);
    const access = cookieHeader(signIn).split('; ').find((c) => c.startsWith('gw_access='))!.slice('gw_access='.length);
    await request(t.app).get('/api/workspaces').set('Authorization', `Bearer ${access}`).expect(200);
    await request(t.app).get('/api/workspaces').set('Authorization', 'Bearer not.a.jwt').expect(401);
  });
});

describe('sign-in throttling', () => {
  let limited: TestApp;
  beforeAll(async () => {
    limited = await startTestApp({ signInRateLimit: 3 });
  });
  afterAll(async () => limited?.close());

  it('answers 429 too-many-attempts after the configured number of attempts', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) {
      const res = await request(limited.app).post('/api/auth/sign-in').send({ email: 'x@example.test', password: 'whatever pass' });
      statuses.push(res.status);
      if (res.status === 429) expect(res.body.error.code).toBe('too-many-attempts');
    }
    expect(statuses).toEqual([401, 401, 401, 429, 429]);
    void sessionFrom;
  });
});
