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

const CONFIRM_LINK = /http:\/\/127\.0\.0\.1:4280\/confirm\/([\w-]+)/;
const ANSWER = {
  status: 'confirmation-sent',
  message: 'If this address can be registered, a confirmation link is on its way.',
};
const register = (body: Record<string, unknown>) =>
  request(t.app).post('/api/auth/register').send(body);
const confirm = (token: unknown) => request(t.app).post('/api/auth/confirm').send({ token });
const userCount = async (email: string) =>
  Number((await t.db.query('SELECT count(*) AS n FROM users WHERE email = $1', [email]))[0].n);
/** Every captured message to `email` whose text matches `pattern`, oldest first, once `count` have arrived. */
async function mailsTo(email: string, pattern: RegExp, count = 1) {
  const matching = () =>
    t.mail.messages().filter((m) => m.to.includes(email) && pattern.test(m.text));
  for (let i = 0; i < 300 && matching().length < count; i++)
    await new Promise((r) => setTimeout(r, 100));
  const found = matching();
  if (found.length < count)
    throw new Error(`expected ${count} message(s) to ${email}, got ${found.length}`);
  return found;
}

describe('auth', () => {
  it('registers through an e-mailed link: 202 and no account until the link is used; confirm signs in with httpOnly SameSite=Strict cookies', async () => {
    const res = await register({
      email: 'Ada@Example.test',
      password: 'a long enough pass',
      displayName: 'Ada',
    }).expect(202);
    expect(res.body).toEqual(ANSWER);
    expect(res.headers['set-cookie']).toBeUndefined();
    expect(await userCount('ada@example.test')).toBe(0);

    // The confirmation arrives as a real message with a working link; only its hash is stored.
    const [message] = await mailsTo('ada@example.test', CONFIRM_LINK);
    expect(message!.subject).toBe('Confirm your Gapwise account');
    const token = CONFIRM_LINK.exec(message!.text)![1]!;
    const [pending] = await t.db.query(
      'SELECT token_hash, password_hash FROM pending_registrations WHERE email = $1',
      ['ada@example.test'],
    );
    expect(pending.token_hash).not.toContain(token);
    expect(pending.password_hash).not.toContain('a long enough pass');
    // Once sent, the outbox row no longer holds the link (marked right after SMTP accepted it).
    let outbox: Array<{ status: string; text_body: string | null }> = [];
    for (let i = 0; i < 50; i++) {
      outbox = await t.db.query(
        `SELECT status, text_body FROM mail_outbox WHERE to_address = $1 AND kind = 'registration-confirm'`,
        ['ada@example.test'],
      );
      if (outbox[0]?.status === 'sent') break;
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(outbox).toEqual([{ status: 'sent', text_body: null }]);

    const confirmed = await confirm(token).expect(200);
    expect(confirmed.body.user).toMatchObject({ email: 'ada@example.test', displayName: 'Ada' });
    expect(confirmed.body.memberships).toEqual([]);
    expect(confirmed.body.csrfToken).toMatch(/^[\w-]{20,}$/);
    const cookies = confirmed.headers['set-cookie'] as unknown as string[];
    expect(cookies.some((c) => /^gw_access=.*HttpOnly.*SameSite=Strict/i.test(c))).toBe(true);
    expect(cookies.some((c) => /^gw_refresh=.*Path=\/api\/auth.*HttpOnly/i.test(c))).toBe(true);
    expect(JSON.stringify(confirmed.body)).not.toContain('password');
    const me = await request(t.app)
      .get('/api/auth/me')
      .set('Cookie', cookieHeader(confirmed))
      .expect(200);
    expect(me.body.user.id).toBe(confirmed.body.user.id);
    expect(await userCount('ada@example.test')).toBe(1);

    // The link works once.
    const again = await confirm(token).expect(400);
    expect(again.body.error.code).toBe('confirmation-invalid');
    expect(again.headers['set-cookie']).toBeUndefined();
    expect(
      await t.db.query('SELECT 1 FROM pending_registrations WHERE email = $1', [
        'ada@example.test',
      ]),
    ).toEqual([]);
  });

  it('answers byte for byte the same for a new and an existing address; the existing one gets a sign-in notice and keeps its password', async () => {
    const fresh = await register({
      email: 'fresh@example.test',
      password: 'another long pass',
      displayName: 'F',
    });
    const taken = await register({
      email: 'ADA@example.test',
      password: 'another long pass',
      displayName: 'Impostor',
    });
    expect(taken.status).toBe(202);
    expect(fresh.status).toBe(taken.status);
    expect(taken.text).toBe(fresh.text);
    expect(taken.headers['content-type']).toBe(fresh.headers['content-type']);
    expect(taken.headers['set-cookie']).toBeUndefined();
    expect(fresh.headers['set-cookie']).toBeUndefined();

    const [notice] = await mailsTo('ada@example.test', /already has one/);
    expect(notice!.subject).toBe('Someone tried to register your address on Gapwise');
    expect(notice!.text).toContain('http://127.0.0.1:4280/sign-in');
    expect(notice!.text).not.toMatch(CONFIRM_LINK);
    await mailsTo('fresh@example.test', CONFIRM_LINK);

    // Nothing changed for the existing account, and no pending registration was made for it.
    expect(await userCount('ada@example.test')).toBe(1);
    expect(
      await t.db.query('SELECT 1 FROM pending_registrations WHERE email = $1', [
        'ada@example.test',
      ]),
    ).toEqual([]);
    await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'ada@example.test', password: 'a long enough pass' })
      .expect(200);
    await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'ada@example.test', password: 'another long pass' })
      .expect(401);
  });

  it('refuses short passwords, bad e-mails and foreign return URLs listing each field', async () => {
    const res = await register({ email: 'nope', password: 'short', displayName: '' }).expect(400);
    expect(res.body.error.fields.map((f: { field: string }) => f.field).sort()).toEqual([
      'displayName',
      'email',
      'password',
    ]);
    const same = await register({
      email: 'b@example.test',
      password: 'aaaaaaaaaaaa',
      displayName: 'B',
    }).expect(400);
    expect(same.body.error.fields[0].field).toBe('password');
    for (const returnUrl of [
      'https://elsewhere.test/x',
      '//elsewhere.test/x',
      'invitations/x',
      '/a?b=c',
    ]) {
      const bad = await register({
        email: 'c@example.test',
        password: 'long enough pass',
        displayName: 'C',
        returnUrl,
      }).expect(400);
      expect(bad.body.error.fields.map((f: { field: string }) => f.field)).toEqual(['returnUrl']);
    }
    expect(
      await t.db.query('SELECT 1 FROM pending_registrations WHERE email IN ($1, $2)', [
        'b@example.test',
        'c@example.test',
      ]),
    ).toEqual([]);
  });

  it('carries a same-site return URL through the confirmation link', async () => {
    await register({
      email: 'invited@example.test',
      password: 'long enough pass',
      displayName: 'I',
      returnUrl: '/invitations/abc_DEF-123',
    }).expect(202);
    const [message] = await mailsTo('invited@example.test', CONFIRM_LINK);
    expect(message!.text).toMatch(/\/confirm\/[\w-]+\?returnUrl=%2Finvitations%2Fabc_DEF-123/);
  });

  it('a repeated registration of a pending address replaces it: only the newest link works, with the newest password', async () => {
    await register({
      email: 'twice@example.test',
      password: 'first long pass',
      displayName: 'First',
    }).expect(202);
    await mailsTo('twice@example.test', CONFIRM_LINK, 1);
    await register({
      email: 'twice@example.test',
      password: 'second long pass',
      displayName: 'Second',
    }).expect(202);
    const [first, second] = await mailsTo('twice@example.test', CONFIRM_LINK, 2);
    const oldToken = CONFIRM_LINK.exec(first!.text)![1]!;
    const newToken = CONFIRM_LINK.exec(second!.text)![1]!;
    expect(newToken).not.toBe(oldToken);
    expect(
      await t.db.query('SELECT display_name FROM pending_registrations WHERE email = $1', [
        'twice@example.test',
      ]),
    ).toEqual([{ display_name: 'Second' }]);
    expect((await confirm(oldToken).expect(400)).body.error.code).toBe('confirmation-invalid');
    expect(await userCount('twice@example.test')).toBe(0);
    const ok = await confirm(newToken).expect(200);
    expect(ok.body.user.displayName).toBe('Second');
    await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'twice@example.test', password: 'second long pass' })
      .expect(200);
    await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'twice@example.test', password: 'first long pass' })
      .expect(401);
  });

  it('refuses an expired link, a malformed token and a link whose address got an account meanwhile; nothing is created', async () => {
    await register({
      email: 'late@example.test',
      password: 'long enough pass',
      displayName: 'L',
    }).expect(202);
    const [message] = await mailsTo('late@example.test', CONFIRM_LINK);
    await t.db.query(
      `UPDATE pending_registrations SET expires_at = now() - interval '1 minute' WHERE email = $1`,
      ['late@example.test'],
    );
    const expired = await confirm(CONFIRM_LINK.exec(message!.text)![1]!).expect(400);
    expect(expired.body.error.code).toBe('confirmation-invalid');
    expect(await userCount('late@example.test')).toBe(0);

    expect((await confirm('not-a-token').expect(400)).body.error.code).toBe('confirmation-invalid');
    expect((await confirm('x'.repeat(43)).expect(400)).body.error.code).toBe(
      'confirmation-invalid',
    );
    expect((await confirm(42).expect(400)).body.error.code).toBe('validation-failed');

    await register({
      email: 'raced@example.test',
      password: 'long enough pass',
      displayName: 'R',
    }).expect(202);
    const [raced] = await mailsTo('raced@example.test', CONFIRM_LINK);
    await t.db.query(
      `INSERT INTO users (email, display_name, password_hash) VALUES ('raced@example.test', 'Other', 'x')`,
    );
    expect((await confirm(CONFIRM_LINK.exec(raced!.text)![1]!).expect(400)).body.error.code).toBe(
      'confirmation-invalid',
    );
    expect(
      await t.db.query('SELECT display_name FROM users WHERE email = $1', ['raced@example.test']),
    ).toEqual([{ display_name: 'Other' }]);
  });

  it('gives the same answer for an unknown e-mail and a wrong password (no enumeration)', async () => {
    const wrong = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'ada@example.test', password: 'wrong password!' })
      .expect(401);
    const unknown = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'nobody@example.test', password: 'wrong password!' })
      .expect(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('invalid-credentials');
  });

  it('me, refresh and sign-out work with cookies; anonymous me is 401 unauthenticated', async () => {
    const anon = await request(t.app).get('/api/auth/me').expect(401);
    expect(anon.body.error.code).toBe('unauthenticated');
    const signIn = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'ADA@example.test', password: 'a long enough pass' })
      .expect(200);
    const cookies = cookieHeader(signIn);
    const me = await request(t.app).get('/api/auth/me').set('Cookie', cookies).expect(200);
    expect(me.body.user.email).toBe('ada@example.test');
    expect(me.body.csrfToken).toBe(signIn.body.csrfToken);
    const refreshed = await request(t.app)
      .post('/api/auth/refresh')
      .set('Cookie', cookies)
      .expect(200);
    expect(refreshed.body.csrfToken).toBe(signIn.body.csrfToken);
    await request(t.app).post('/api/auth/refresh').expect(401);
    const out = await request(t.app)
      .post('/api/auth/sign-out')
      .set('Cookie', cookies)
      .set('X-CSRF-Token', signIn.body.csrfToken)
      .expect(204);
    expect(
      (out.headers['set-cookie'] as unknown as string[]).some((c) => /^gw_access=;/.test(c)),
    ).toBe(true);
  });

  it('requires X-CSRF-Token on cookie-authenticated writes, not on bearer requests', async () => {
    const s = await registerUser(t.app, 'csrf');
    const cookies = s.cookies.join('; ');
    const none = await request(t.app)
      .post('/api/workspaces')
      .set('Cookie', cookies)
      .send({ name: 'W' })
      .expect(403);
    expect(none.body.error.code).toBe('csrf-failed');
    await request(t.app)
      .post('/api/workspaces')
      .set('Cookie', cookies)
      .set('X-CSRF-Token', 'forged-token-value-000000000')
      .send({ name: 'W' })
      .expect(403);
    const list = await request(t.app).get('/api/workspaces').set('Cookie', cookies).expect(200);
    expect(list.body).toEqual([]);
    await s.post('/api/workspaces', { name: 'W' }).expect(201);
    // A script with an API token needs no CSRF token.
    const token = await s.post('/api/tokens', { name: 'pipeline' }).expect(201);
    expect(token.body.token).toMatch(/^gw_/);
    await request(t.app)
      .post('/api/workspaces')
      .set('Authorization', `Bearer ${token.body.token}`)
      .send({ name: 'From script' })
      .expect(201);
    const mine = await request(t.app)
      .get('/api/workspaces')
      .set('Authorization', `Bearer ${token.body.token}`)
      .expect(200);
    expect(mine.body.map((w: { name: string }) => w.name).sort()).toEqual(['From script', 'W']);
  });

  it('lists tokens without secrets, stores only hashes, and revokes', async () => {
    const s = await registerUser(t.app, 'tokens');
    const created = await s.post('/api/tokens', { name: 'ci' }).expect(201);
    const list = await s.get('/api/tokens').expect(200);
    expect(list.body).toHaveLength(1);
    expect(JSON.stringify(list.body)).not.toContain(created.body.token);
    const stored = await t.db.query('SELECT token_hash FROM api_tokens WHERE id = $1', [
      created.body.id,
    ]);
    expect(stored[0].token_hash).not.toContain(created.body.token);
    await request(t.app)
      .get('/api/auth/me')
      .set('Authorization', `Bearer ${created.body.token}`)
      .expect(200);
    await s.delete(`/api/tokens/${created.body.id}`).expect(204);
    await request(t.app)
      .get('/api/auth/me')
      .set('Authorization', `Bearer ${created.body.token}`)
      .expect(401);
    const other = await registerUser(t.app, 'other');
    await other.delete(`/api/tokens/${created.body.id}`).expect(404);
  });

  it('accepts the access JWT as a bearer token too', async () => {
    const signIn = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'ada@example.test', password: 'a long enough pass' })
      .expect(200);
    const access = cookieHeader(signIn)
      .split('; ')
      .find((c) => c.startsWith('gw_access='))!
      .slice('gw_access='.length);
    await request(t.app)
      .get('/api/workspaces')
      .set('Authorization', `Bearer ${access}`)
      .expect(200);
    await request(t.app)
      .get('/api/workspaces')
      .set('Authorization', 'Bearer not.a.jwt')
      .expect(401);
  });
});

describe('sign-in throttling', () => {
  let limited: TestApp;
  beforeAll(async () => {
    limited = await startTestApp({ signInRateLimit: 3 });
  });
  afterAll(async () => limited?.close());

  it('answers 429 too-many-attempts after the configured number of failed attempts', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) {
      const res = await request(limited.app)
        .post('/api/auth/sign-in')
        .send({ email: 'x@example.test', password: 'whatever pass' });
      statuses.push(res.status);
      if (res.status === 429) expect(res.body.error.code).toBe('too-many-attempts');
    }
    expect(statuses).toEqual([401, 401, 401, 429, 429]);
    void sessionFrom;
  });

  it('throttles registration and confirmation with their own limiter, not used up by failed sign-ins', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) {
      const res = await request(limited.app)
        .post('/api/auth/register')
        .send({ email: `y${i}@example.test`, password: 'long enough pass', displayName: 'Y' });
      statuses.push(res.status);
      if (res.status === 429) expect(res.body.error.code).toBe('too-many-attempts');
    }
    // The three failed sign-ins above did not count here: three registrations went through.
    expect(statuses).toEqual([202, 202, 202, 429, 429]);
    const pending = await limited.db.query('SELECT count(*)::int AS n FROM pending_registrations');
    expect(pending[0].n).toBe(3);
    await request(limited.app)
      .post('/api/auth/confirm')
      .send({ token: 'x'.repeat(43) })
      .expect(429);
  });
});
