/// <reference types="vite/client" />
import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import request from 'supertest';
import type { Router } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashToken } from '../../apps/api/src/auth/session-tokens';
import { createPair } from '../../apps/api/src/pairs/pair-use-case';
import { normalisePairInput } from '../../apps/api/src/pairs/pair-rules';
import { mountedRoutes } from './support/routes';
import { pairBody } from './support/fixtures';
import {
  registerUser,
  sessionFrom,
  startTestApp,
  type Session,
  type TestApp,
} from './support/test-app';
import { CALLERS, type CaseContext, type Caller, type MatrixRow } from './matrix/matrix-types';

/** Rows of every area: `test/api/matrix/<area>.rows.ts`, each exporting `rows`. */
const modules = import.meta.glob<{ rows: MatrixRow[] }>('./matrix/*.rows.ts', { eager: true });
const ROWS: MatrixRow[] = Object.values(modules).flatMap((m) => m.rows);
const key = (method: string, route: string) => `${method.toUpperCase()} ${route}`;

let t: TestApp;
const sessions: Partial<Record<Caller, Session>> = {};
let extraUserId: string;
let counter = 0;
const PASSWORD = 'correct horse battery';
let passwordHash: Promise<string> | null = null;

/** A new account inserted directly (same password as the callers), not signed in. */
async function throwawayAccount(): Promise<{ id: string; email: string }> {
  passwordHash ??= bcrypt.hash(PASSWORD, 4);
  const email = `throwaway-${++counter}-${randomBytes(3).toString('hex')}@example.test`;
  const [row] = await t.db.query(
    `INSERT INTO users (email, display_name, password_hash) VALUES ($1, 'Throwaway', $2) RETURNING id`,
    [email, await passwordHash],
  );
  return { id: row.id, email };
}

async function throwawaySession(): Promise<Session> {
  const { email } = await throwawayAccount();
  const res = await request(t.app).post('/api/auth/sign-in').send({ email, password: PASSWORD });
  expect(res.status).toBe(200);
  return sessionFrom(t.app, res);
}

beforeAll(async () => {
  t = await startTestApp();
  for (const caller of CALLERS) {
    if (caller !== 'anonymous') sessions[caller] = await registerUser(t.app, caller);
  }
  // The outsider belongs to a workspace of their own.
  await sessions.outsider!.post('/api/workspaces', { name: 'Outsider lab' }).expect(201);
  extraUserId = (await registerUser(t.app, 'extra')).userId;
}, 120_000);
afterAll(async () => t?.close());

/** Fingerprint of every table in the public schema (a denied write must leave it unchanged). */
async function fingerprint(): Promise<Record<string, string>> {
  const tables: Array<{ table_name: string }> = await t.db.query(
    `SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY 1`,
  );
  const out: Record<string, string> = {};
  for (const { table_name } of tables) {
    // The mail sender marks earlier messages sent in the background: an outbox row counts by what
    // was queued (recipient, subject, cause), not by its delivery state.
    const source =
      table_name === 'mail_outbox'
        ? `(SELECT id, kind, to_address, subject, related_id, created_at FROM mail_outbox)`
        : `"${table_name}"`;
    const [row] = await t.db.query(
      `SELECT count(*)::text || ':' || coalesce(md5(string_agg(x::text, '|' ORDER BY x::text)), '') AS f FROM ${source} x`,
    );
    out[table_name] = row.f;
  }
  return out;
}

async function makeContext(caller: Caller): Promise<CaseContext> {
  const owner = sessions.owner!;
  const [ws] = await t.db.query(`INSERT INTO workspaces (name) VALUES ('Matrix lab') RETURNING id`);
  const wid = ws.id as string;
  for (const role of ['owner', 'editor', 'reviewer', 'viewer'] as const) {
    await t.db.query('INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, $3)', [
      wid,
      sessions[role]!.userId,
      role,
    ]);
  }
  await t.db.query(
    `INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, 'editor')`,
    [wid, extraUserId],
  );
  const pair = await createPair(
    t.db,
    t.runtime.compute,
    owner.userId,
    wid,
    normalisePairInput(pairBody({ name: 'Matrix pair' }) as never),
  );
  const users = Object.fromEntries(
    (['owner', 'editor', 'reviewer', 'viewer', 'outsider'] as const).map((c) => [
      c,
      { id: sessions[c]!.userId, email: sessions[c]!.email },
    ]),
  ) as CaseContext['users'];
  return {
    t,
    caller,
    users,
    workspaceId: wid,
    pairId: pair.id,
    extraMemberId: extraUserId,
    unique: (prefix) => `${prefix}-${++counter}-${randomBytes(3).toString('hex')}`,
    async invitation(email) {
      const token = randomBytes(24).toString('base64url');
      const [row] = await t.db.query(
        `INSERT INTO invitations (workspace_id, email, role, token_hash, expires_at, created_by)
         VALUES ($1, $2, 'viewer', $3, now() + interval '1 day', $4) RETURNING id`,
        [wid, email.toLowerCase(), hashToken(token), owner.userId],
      );
      return { id: row.id, token };
    },
    async pendingRegistration(email) {
      const token = randomBytes(24).toString('base64url');
      await t.db.query(
        `INSERT INTO pending_registrations (email, display_name, password_hash, token_hash, expires_at)
         VALUES ($1, 'Pending', 'not-a-real-hash', $2, now() + interval '1 day')`,
        [email.toLowerCase(), hashToken(token)],
      );
      return token;
    },
    async passwordReset() {
      const { id } = await throwawayAccount();
      const token = randomBytes(24).toString('base64url');
      await t.db.query(
        `INSERT INTO password_resets (user_id, token_hash, expires_at) VALUES ($1, $2, now() + interval '1 hour')`,
        [id, hashToken(token)],
      );
      return token;
    },
    async apiToken(userId) {
      const [row] = await t.db.query(
        `INSERT INTO api_tokens (user_id, name, prefix, token_hash) VALUES ($1, 'matrix', 'gw_matrix', $2) RETURNING id`,
        [userId, hashToken(`gw_${randomBytes(16).toString('hex')}`)],
      );
      return row.id;
    },
  };
}

describe('authorization matrix', () => {
  it('has exactly one row for every mounted route', () => {
    const mounted = mountedRoutes(t.app.locals['apiRouter'] as Router).map((r) =>
      key(r.method, r.path),
    );
    const covered = ROWS.map((r) => key(r.method, r.route));
    const missing = mounted.filter((m) => !covered.includes(m));
    const stale = covered.filter((c) => !mounted.includes(c));
    const duplicated = covered.filter((c, i) => covered.indexOf(c) !== i);
    expect({ missing, stale, duplicated }).toEqual({ missing: [], stale: [], duplicated: [] });
  });

  for (const row of ROWS) {
    it(`${key(row.method, row.route)}`, async () => {
      const failures: string[] = [];
      for (const caller of CALLERS) {
        const ctx = await makeContext(caller);
        const { path, body } = await row.request(ctx);
        const session =
          caller === 'anonymous'
            ? undefined
            : row.as === 'throwaway'
              ? await throwawaySession()
              : sessions[caller];
        const before = row.method === 'get' ? null : await fingerprint();
        const anonymous = request(t.app);
        const res = session
          ? await session.call(row.method, `/api${path}`, body)
          : await anonymous[row.method](`/api${path}`).send(body as object);
        if (res.status !== row.expect[caller]) {
          failures.push(
            `${caller}: expected ${row.expect[caller]}, got ${res.status} ${JSON.stringify(res.body?.error ?? '')}`,
          );
        }
        if (before && res.status >= 400) {
          const after = await fingerprint();
          const changed = Object.keys(after).filter((k) => after[k] !== before[k]);
          if (changed.length)
            failures.push(`${caller}: denied (${res.status}) but changed ${changed.join(', ')}`);
        }
      }
      expect(failures).toEqual([]);
    });
  }
});
