import bcrypt from 'bcryptjs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dummyHashFor } from '../../apps/api/src/auth/auth-use-case';
import { ConfigError, loadConfig } from '../../apps/api/src/config';
import { authCache } from '../../apps/api/src/http/auth-cache';
import { registerUser, sessionFrom, signIn, startTestApp, type TestApp } from './support/test-app';

const PASSWORD = 'correct horse battery';
let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => t?.close());

const cookieValue = (res: request.Response, name: string) =>
  ((res.headers['set-cookie'] as unknown as string[]) ?? [])
    .map((c) => c.split(';')[0]!)
    .find((c) => c.startsWith(`${name}=`))
    ?.slice(name.length + 1);
const refresh = (refreshToken: string) =>
  request(t.app).post('/api/auth/refresh').set('Cookie', `gw_refresh=${refreshToken}`);
const me = (cookies: string[]) =>
  request(t.app).get('/api/auth/me').set('Cookie', cookies.join('; '));
const bearer = (token: string) =>
  request(t.app).get('/api/workspaces').set('Authorization', `Bearer ${token}`);
const accessOf = (cookies: string[]) =>
  cookies.find((c) => c.startsWith('gw_access='))!.slice('gw_access='.length);
const refreshOf = (cookies: string[]) =>
  cookies.find((c) => c.startsWith('gw_refresh='))!.slice('gw_refresh='.length);

const RESET_LINK = /http:\/\/127\.0\.0\.1:4280\/reset-password\/([\w-]+)/;
async function resetToken(email: string, count = 1): Promise<string> {
  const matching = () =>
    t.mail.messages().filter((m) => m.to.includes(email) && RESET_LINK.test(m.text));
  for (let i = 0; i < 300 && matching().length < count; i++)
    await new Promise((r) => setTimeout(r, 100));
  const found = matching();
  if (found.length < count) throw new Error(`expected ${count} reset mail(s) to ${email}`);
  return RESET_LINK.exec(found.at(-1)!.text)![1]!;
}

describe('server-side sessions', () => {
  it('sign-out ends the session: the old access cookie, the same JWT as bearer and the refresh token are refused', async () => {
    const s = await registerUser(t.app, 'signout');
    const access = accessOf(s.cookies);
    const refreshToken = refreshOf(s.cookies);
    await me(s.cookies).expect(200);
    await bearer(access).expect(200);
    await s.post('/api/auth/sign-out').expect(204);
    await me(s.cookies).expect(401);
    await bearer(access).expect(401);
    await refresh(refreshToken).expect(401);
    const [row] = await t.db.query('SELECT revoked_reason FROM sessions WHERE user_id = $1', [
      s.userId,
    ]);
    expect(row.revoked_reason).toBe('sign-out');
  });

  it('refresh rotates; the replaced token within the grace period is a concurrent refresh; reused later it revokes the whole session', async () => {
    const s = await signIn(t.app, (await registerUser(t.app, 'rotate')).email, PASSWORD);
    const first = refreshOf(s.cookies);
    const r1 = await refresh(first).expect(200);
    const second = cookieValue(r1, 'gw_refresh')!;
    expect(second).not.toBe(first);
    // Two tabs refreshing together: the just-replaced token still answers (same generation).
    await refresh(first).expect(200);
    const r2 = await refresh(second).expect(200);
    const third = cookieValue(r2, 'gw_refresh')!;
    const newAccess = cookieValue(r2, 'gw_access')!;
    await bearer(newAccess).expect(200);
    // An old token presented again, outside the grace period: the session ends for everybody.
    await t.db.query(
      `UPDATE sessions SET refreshed_at = now() - interval '1 minute' WHERE user_id = $1`,
      [s.userId],
    );
    const reused = await refresh(first).expect(401);
    expect(reused.body.error.code).toBe('session-revoked');
    await refresh(third).expect(401);
    await bearer(newAccess).expect(401);
    await me(s.cookies).expect(401);
  });

  it('sign out everywhere ends every session of the account; API tokens stay; a token cannot call it', async () => {
    const a = await registerUser(t.app, 'everywhere');
    const b = await signIn(t.app, a.email, PASSWORD);
    const other = await registerUser(t.app, 'bystander');
    const token = (await a.post('/api/tokens', { name: 'ci' }).expect(201)).body.token as string;
    await request(t.app)
      .post('/api/auth/sign-out-everywhere')
      .set('Authorization', `Bearer ${token}`)
      .expect(403)
      .expect((r) => expect(r.body.error.code).toBe('session-required'));
    const res = await b.post('/api/auth/sign-out-everywhere').expect(200);
    expect(res.body.endedSessions).toBe(2);
    await me(a.cookies).expect(401);
    await me(b.cookies).expect(401);
    await me(other.cookies).expect(200);
    await bearer(token).expect(200);
  });

  it('changing the password needs the current one, ends every other session and keeps this one', async () => {
    const a = await registerUser(t.app, 'change');
    const b = await signIn(t.app, a.email, PASSWORD);
    const wrong = await a
      .post('/api/auth/password', {
        currentPassword: 'not my password',
        newPassword: 'a new long phrase',
      })
      .expect(400);
    expect(wrong.body.error.fields).toEqual([
      { field: 'currentPassword', message: 'is not your current password' },
    ]);
    await me(b.cookies).expect(200);
    const ok = await a
      .post('/api/auth/password', { currentPassword: PASSWORD, newPassword: 'a new long phrase' })
      .expect(200);
    expect(ok.body.endedSessions).toBe(1);
    await me(a.cookies).expect(200);
    await me(b.cookies).expect(401);
    await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: a.email, password: PASSWORD })
      .expect(401);
    await signIn(t.app, a.email, 'a new long phrase');
  });

  it('resets a password by e-mail: same answer for unknown addresses, a hashed single-use link, every session ends', async () => {
    const a = await registerUser(t.app, 'reset');
    const unknown = await request(t.app)
      .post('/api/auth/password-reset')
      .send({ email: 'nobody-here@example.test' })
      .expect(202);
    const known = await request(t.app)
      .post('/api/auth/password-reset')
      .send({ email: a.email.toUpperCase() })
      .expect(202);
    expect(known.text).toBe(unknown.text);
    const token = await resetToken(a.email);
    const [row] = await t.db.query('SELECT token_hash FROM password_resets WHERE user_id = $1', [
      a.userId,
    ]);
    expect(row.token_hash).not.toContain(token);
    expect(t.mail.messages().some((m) => m.to.includes('nobody-here@example.test'))).toBe(false);

    // A refused new password leaves the link usable.
    const short = await request(t.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token, newPassword: 'short' })
      .expect(400);
    expect(short.body.error.fields[0].field).toBe('newPassword');
    const done = await request(t.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token, newPassword: 'reset long phrase' })
      .expect(200);
    expect(done.body.user.id).toBe(a.userId);
    await me(a.cookies).expect(401);
    await sessionFrom(t.app, done).get('/api/auth/me').expect(200);
    const again = await request(t.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token, newPassword: 'another long phrase' })
      .expect(400);
    expect(again.body.error.code).toBe('reset-invalid');
    await signIn(t.app, a.email, 'reset long phrase');

    // Expired links are refused.
    await request(t.app).post('/api/auth/password-reset').send({ email: a.email }).expect(202);
    const late = await resetToken(a.email, 2);
    await t.db.query(
      `UPDATE password_resets SET expires_at = now() - interval '1 minute' WHERE user_id = $1`,
      [a.userId],
    );
    const expired = await request(t.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token: late, newPassword: 'too late phrase' })
      .expect(400);
    expect(expired.body.error.code).toBe('reset-invalid');
  });

  it('refuses passwords over 72 UTF-8 bytes (register, change, reset), naming the field', async () => {
    // 37 × "é" is 37 characters but 74 bytes: bcrypt would ignore the last two bytes.
    const long = 'é'.repeat(37);
    const reg = await request(t.app)
      .post('/api/auth/register')
      .send({ email: 'bytes@example.test', password: long, displayName: 'B' })
      .expect(400);
    expect(reg.body.error.fields).toEqual([
      { field: 'password', message: expect.stringContaining('at most 72 bytes') },
    ]);
    const s = await registerUser(t.app, 'bytes');
    const change = await s
      .post('/api/auth/password', { currentPassword: PASSWORD, newPassword: 'a'.repeat(73) })
      .expect(400);
    expect(change.body.error.fields[0]).toMatchObject({ field: 'newPassword' });
    // Exactly 72 bytes is fine.
    await s
      .post('/api/auth/password', { currentPassword: PASSWORD, newPassword: 'éèàü'.repeat(9) })
      .expect(200);
  });

  it('deletes an account by its rule: refused while sole owner of a shared workspace; solo workspaces go with it', async () => {
    const a = await registerUser(t.app, 'leaver');
    const b = await registerUser(t.app, 'stayer');
    const solo = (await a.post('/api/workspaces', { name: 'Only mine' }).expect(201)).body.id;
    const shared = (await a.post('/api/workspaces', { name: 'Shared lab' }).expect(201)).body.id;
    await t.db.query(
      `INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, 'editor')`,
      [shared, b.userId],
    );
    const wrong = await a
      .call('delete', '/api/auth/account', { password: 'nope nope nope' })
      .expect(400);
    expect(wrong.body.error.fields[0].field).toBe('password');
    const refused = await a.call('delete', '/api/auth/account', { password: PASSWORD }).expect(409);
    expect(refused.body.error.code).toBe('sole-owner');
    expect(refused.body.error.message).toContain('"Shared lab"');
    expect(await t.db.query('SELECT id FROM workspaces WHERE id = $1', [solo])).toHaveLength(1);

    await a.patch(`/api/workspaces/${shared}/members/${b.userId}`, { role: 'owner' }).expect(200);
    const done = await a.call('delete', '/api/auth/account', { password: PASSWORD }).expect(200);
    expect(done.body.deletedWorkspaces).toEqual([solo]);
    expect(done.body.deletedWorkspaceNames).toEqual(['Only mine']);
    expect(await t.db.query('SELECT id FROM users WHERE id = $1', [a.userId])).toEqual([]);
    expect(await t.db.query('SELECT id FROM workspaces WHERE id = $1', [solo])).toEqual([]);
    expect(await t.db.query('SELECT id FROM workspaces WHERE id = $1', [shared])).toHaveLength(1);
    await me(a.cookies).expect(401);
    await b.get(`/api/workspaces/${shared}/members`).expect(200);
  });
});

describe('API tokens', () => {
  it('a read-only token reads but cannot write; a token cannot create tokens; expiry is checked', async () => {
    const s = await registerUser(t.app, 'scoped');
    const ro = await s.post('/api/tokens', { name: 'reader', scope: 'read' }).expect(201);
    expect(ro.body).toMatchObject({ scope: 'read', expiresAt: null });
    await bearer(ro.body.token).expect(200);
    const write = await request(t.app)
      .post('/api/workspaces')
      .set('Authorization', `Bearer ${ro.body.token}`)
      .send({ name: 'Nope' })
      .expect(403);
    expect(write.body.error.code).toBe('token-read-only');

    const rw = await s.post('/api/tokens', { name: 'writer' }).expect(201);
    expect(rw.body.scope).toBe('read-write');
    const minted = await request(t.app)
      .post('/api/tokens')
      .set('Authorization', `Bearer ${rw.body.token}`)
      .send({ name: 'child' })
      .expect(403);
    expect(minted.body.error.code).toBe('session-required');
    expect((await s.get('/api/tokens').expect(200)).body).toHaveLength(2);

    const past = await s.post('/api/tokens', { name: 'x', expiresAt: '2020-01-01' }).expect(400);
    expect(past.body.error.fields).toEqual([
      { field: 'expiresAt', message: 'must be in the future' },
    ]);
    const far = await s.post('/api/tokens', { name: 'x', expiresAt: '2100-01-01' }).expect(400);
    expect(far.body.error.fields[0].field).toBe('expiresAt');
    const bad = await s.post('/api/tokens', { name: 'x', scope: 'admin' }).expect(400);
    expect(bad.body.error.fields[0].field).toBe('scope');

    const soon = new Date(Date.now() + 7 * 86_400_000).toISOString();
    const dated = await s.post('/api/tokens', { name: 'week', expiresAt: soon }).expect(201);
    expect(dated.body.expiresAt).toBe(soon);
    await bearer(dated.body.token).expect(200);
    await t.db.query(
      `UPDATE api_tokens SET expires_at = now() - interval '1 second' WHERE id = $1`,
      [dated.body.id],
    );
    // The expiry was changed by direct SQL, behind the app's back: the in-process grant cache
    // (apps/api/src/http/auth-cache.ts) cannot know, so it is emptied as its time limit would.
    authCache.clear();
    await bearer(dated.body.token).expect(401);
    // Revoking ends a token at once.
    await s.delete(`/api/tokens/${rw.body.id}`).expect(204);
    await bearer(rw.body.token).expect(401);
  });
});

describe('password hashing cost', () => {
  it('the dummy hash for unknown addresses has the configured cost', async () => {
    expect(bcrypt.getRounds(await dummyHashFor(t.config.bcryptCost))).toBe(t.config.bcryptCost);
    expect(bcrypt.getRounds(await dummyHashFor(6))).toBe(6);
  });

  it('a hash of a lower cost than configured is upgraded at the next sign-in', async () => {
    const stronger = await startTestApp({ bcryptCost: 6 });
    try {
      const email = 'weak@example.test';
      await stronger.db.query(
        `INSERT INTO users (email, display_name, password_hash) VALUES ($1, 'W', $2)`,
        [email, await bcrypt.hash(PASSWORD, 4)],
      );
      await request(stronger.app)
        .post('/api/auth/sign-in')
        .send({ email, password: PASSWORD })
        .expect(200);
      const [row] = await stronger.db.query('SELECT password_hash FROM users WHERE email = $1', [
        email,
      ]);
      expect(bcrypt.getRounds(row.password_hash)).toBe(6);
      expect(await bcrypt.compare(PASSWORD, row.password_hash)).toBe(true);
    } finally {
      await stronger.close();
    }
  });
});

describe('sign-in limiter and TRUST_PROXY', () => {
  it('validates TRUST_PROXY', () => {
    expect(loadConfig({ JWT_SECRET: 'x'.repeat(40) }).trustProxy).toBe(false);
    expect(loadConfig({ JWT_SECRET: 'x'.repeat(40), TRUST_PROXY: '1' }).trustProxy).toBe(1);
    expect(
      loadConfig({ JWT_SECRET: 'x'.repeat(40), TRUST_PROXY: '10.0.0.0/8, loopback' }).trustProxy,
    ).toEqual(['10.0.0.0/8', 'loopback']);
    for (const bad of ['true', '99', '10.0.0.0/40', 'proxy.example']) {
      expect(() => loadConfig({ JWT_SECRET: 'x'.repeat(40), TRUST_PROXY: bad })).toThrow(
        ConfigError,
      );
    }
  });

  it('counts failed sign-ins per account and per address; successes use nothing up; behind a proxy the forwarded address counts', async () => {
    const limited = await startTestApp({ signInRateLimit: 3 }, { TRUST_PROXY: '1' });
    try {
      const email = 'limited@example.test';
      await limited.db.query(
        `INSERT INTO users (email, display_name, password_hash) VALUES ($1, 'L', $2)`,
        [email, await bcrypt.hash(PASSWORD, 4)],
      );
      const attempt = (from: string, body: object) =>
        request(limited.app).post('/api/auth/sign-in').set('X-Forwarded-For', from).send(body);
      // Five successful sign-ins from one address: none is counted.
      for (let i = 0; i < 5; i++)
        await attempt('203.0.113.1', { email, password: PASSWORD }).expect(200);
      // One account attacked from many addresses: stopped after 3 failures.
      const perAccount: number[] = [];
      for (let i = 0; i < 5; i++)
        perAccount.push(
          (await attempt(`198.51.100.${i}`, { email, password: 'wrong guess!' })).status,
        );
      expect(perAccount).toEqual([401, 401, 401, 429, 429]);
      // Many accounts from one address: stopped after 3 failures, other addresses unaffected.
      const perAddress: number[] = [];
      for (let i = 0; i < 5; i++)
        perAddress.push(
          (await attempt('192.0.2.7', { email: `x${i}@example.test`, password: 'wrong guess!' }))
            .status,
        );
      expect(perAddress).toEqual([401, 401, 401, 429, 429]);
      await attempt('192.0.2.8', { email: 'fresh@example.test', password: 'wrong guess!' }).expect(
        401,
      );
    } finally {
      await limited.close();
    }
  });

  it('without TRUST_PROXY a forwarded address is ignored (the connection address counts)', async () => {
    const limited = await startTestApp({ signInRateLimit: 2 });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 3; i++)
        statuses.push(
          (
            await request(limited.app)
              .post('/api/auth/sign-in')
              .set('X-Forwarded-For', `198.51.100.${i}`)
              .send({ email: `y${i}@example.test`, password: 'wrong guess!' })
          ).status,
        );
      expect(statuses).toEqual([401, 401, 429]);
    } finally {
      await limited.close();
    }
  });
});
