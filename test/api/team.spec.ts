import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Pair } from '@gapwise/contracts';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';
import { pairBody } from './support/fixtures';

let t: TestApp;
let owner: Session;
let wid: string;

beforeAll(async () => {
  t = await startTestApp();
  owner = await registerUser(t.app, 'owner');
  wid = (await owner.post('/api/workspaces', { name: 'Team Lab' }).expect(201)).body.id;
});
afterAll(async () => t?.close());

async function invite(email: string, role: string): Promise<string> {
  await owner.post(`/api/workspaces/${wid}/invitations`, { email, role }).expect(201);
  const message = await t.mail.waitFor(
    (m) => m.to.includes(email.toLowerCase()) && m.text.includes('/invitations/'),
    20_000,
  );
  const link = message.text.match(/http:\/\/127\.0\.0\.1:4280\/invitations\/([\w-]+)/);
  if (!link) throw new Error(`no accept link in: ${message.text}`);
  return link[1]!;
}

async function join(role: string): Promise<Session> {
  const s = await registerUser(t.app, role);
  const token = await invite(s.email, role);
  await s.post(`/api/invitations/${token}/accept`).expect(200);
  return s;
}

describe('invitations end to end', () => {
  it('invite → e-mail with a link → preview → accept → member with the invited role', async () => {
    const invitee = await registerUser(t.app, 'invitee');
    await owner
      .post(`/api/workspaces/${wid}/invitations`, {
        email: invitee.email.toUpperCase(),
        role: 'reviewer',
      })
      .expect(201);
    const message = await t.mail.waitFor(
      (m) => m.to.includes(invitee.email) && m.text.includes('/invitations/'),
      20_000,
    );
    expect(message.subject).toContain('Team Lab');
    const token = message.text.match(/http:\/\/127\.0\.0\.1:4280\/invitations\/([\w-]+)/)![1]!;
    const stored = await t.db.query('SELECT token_hash FROM invitations WHERE email = $1', [
      invitee.email,
    ]);
    expect(stored[0].token_hash).not.toBe(token);
    // The send is marked (and the body cleared) right after SMTP accepted the message.
    let outbox: Array<{ status: string; text_body: string | null }> = [];
    for (let i = 0; i < 50; i++) {
      outbox = await t.db.query(
        `SELECT status, text_body FROM mail_outbox WHERE to_address = $1 AND kind = 'invitation'`,
        [invitee.email],
      );
      if (outbox[0]?.status === 'sent') break;
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(outbox).toEqual([{ status: 'sent', text_body: null }]);

    const preview = await request(t.app).get(`/api/invitations/${token}`).expect(200);
    expect(preview.body).toEqual({
      workspaceName: 'Team Lab',
      role: 'reviewer',
      email: invitee.email,
      status: 'pending',
    });

    const stranger = await registerUser(t.app, 'stranger');
    const wrong = await stranger.post(`/api/invitations/${token}/accept`).expect(403);
    expect(wrong.body.error.code).toBe('invitation-email-mismatch');

    const accepted = await invitee.post(`/api/invitations/${token}/accept`).expect(200);
    expect(accepted.body).toEqual({
      workspaceId: wid,
      workspaceName: 'Team Lab',
      role: 'reviewer',
    });
    const members = await owner.get(`/api/workspaces/${wid}/members`).expect(200);
    expect(members.body.find((m: { userId: string }) => m.userId === invitee.userId).role).toBe(
      'reviewer',
    );
    await invitee.post(`/api/invitations/${token}/accept`).expect(409);
    const listed = await owner.get(`/api/workspaces/${wid}/invitations`).expect(200);
    expect(listed.body.find((i: { email: string }) => i.email === invitee.email).status).toBe(
      'accepted',
    );
  });

  it('a revoked invitation cannot be accepted', async () => {
    const s = await registerUser(t.app, 'revoked');
    const created = await owner
      .post(`/api/workspaces/${wid}/invitations`, { email: s.email, role: 'viewer' })
      .expect(201);
    const message = await t.mail.waitFor(
      (m) => m.to.includes(s.email) && m.text.includes('/invitations/'),
      20_000,
    );
    const token = message.text.match(/invitations\/([\w-]+)/)![1]!;
    await owner.delete(`/api/workspaces/${wid}/invitations/${created.body.id}`).expect(204);
    const res = await s.post(`/api/invitations/${token}/accept`).expect(410);
    expect(res.body.error.code).toBe('invitation-revoked');
  });

  it('keeps the invitation when the mail server is down, and sends it once it is back', async () => {
    // Registered (and confirmed by e-mail) while the mail server still works.
    const s = await registerUser(t.app, 'later');
    // Point the mailer at a closed port: the send fails, the invitation and outbox row stay.
    const { startMailCapture } = await import('../../docker-free-scripts/mail/mail-capture-server');
    const { createSmtpMailer } = await import('../../apps/api/src/mail/mailer');
    const { startMailQueue } = await import('../../apps/api/src/mail/mail-queue');
    const late = await startMailCapture({ smtpPort: 0 });
    const port = late.smtpPort;
    await late.stop();
    const broken = await startMailQueue(t.db, createSmtpMailer({ ...t.config, smtpPort: port }), {
      connectionString: t.config.databaseUrl,
      retryDelay: 1,
    });
    await t.runtime.queue.stop();
    const { createInvitation } = await import('../../apps/api/src/invitations/invitation-use-case');
    await createInvitation(t.db, t.config, broken, owner.userId, wid, s.email, 'viewer');
    let row: { status: string; attempts: number } | undefined;
    for (let i = 0; i < 100; i++) {
      [row] = await t.db.query(
        `SELECT status, attempts FROM mail_outbox WHERE to_address = $1 AND kind = 'invitation'`,
        [s.email],
      );
      if (row && row.attempts > 0) break;
      await new Promise((r) => setTimeout(r, 200));
    }
    expect(row).toMatchObject({ status: 'pending' });
    expect(row!.attempts).toBeGreaterThan(0);
    await broken.stop();
    // The mail server comes back on the same port; the retry delivers.
    const back = await startMailCapture({ smtpPort: port });
    const healed = await startMailQueue(t.db, createSmtpMailer({ ...t.config, smtpPort: port }), {
      connectionString: t.config.databaseUrl,
      retryDelay: 1,
    });
    try {
      const message = await back.waitFor((m) => m.to.includes(s.email), 30_000);
      expect(message.text).toMatch(/\/invitations\/[\w-]+/);
    } finally {
      await healed.stop();
      await back.stop();
    }
  });
});

describe('roles, members and version conflicts', () => {
  let editorA: Session;
  let editorB: Session;
  let viewer: Session;
  let outsider: Session;
  let pair: Pair;

  beforeAll(async () => {
    // The mail queue of the app was stopped by the previous test: restart one for these invites.
    const { startMailQueue } = await import('../../apps/api/src/mail/mail-queue');
    const queue = await startMailQueue(t.db, t.runtime.mailer, {
      connectionString: t.config.databaseUrl,
      retryDelay: 1,
    });
    (t.runtime as { queue: unknown }).queue = queue;
    editorA = await join('editor');
    editorB = await join('editor');
    viewer = await join('viewer');
    outsider = await registerUser(t.app, 'outsider');
    await outsider.post('/api/workspaces', { name: 'Elsewhere' }).expect(201);
    pair = (
      await editorA.post(`/api/workspaces/${wid}/pairs`, pairBody({ name: 'Shared' })).expect(201)
    ).body;
  });
  afterAll(async () => {
    await t.runtime.queue.stop();
  });

  it('two editors save from the same version: one wins, the other gets 409 and history shows only the winner', async () => {
    const [a, b] = await Promise.all([
      editorA.patch(`/api/pairs/${pair.id}`, { version: 1, notes: 'edit by A' }),
      editorB.patch(`/api/pairs/${pair.id}`, { version: 1, notes: 'edit by B' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const loser = a.status === 409 ? a : b;
    const winner = a.status === 200 ? a : b;
    expect(loser.body.error.code).toBe('version-conflict');
    expect(loser.body.error.current).toMatchObject({ version: 2, notes: winner.body.notes });
    const versions = await editorA.get(`/api/pairs/${pair.id}/versions`).expect(200);
    expect(versions.body.map((v: { version: number }) => v.version)).toEqual([2, 1]);
    const v2 = await editorA.get(`/api/pairs/${pair.id}/versions/2`).expect(200);
    expect(v2.body.notes).toBe(winner.body.notes);
    // The loser re-applies on top of the current version: both edits now in history, in order.
    const retry = await (loser === a ? editorA : editorB)
      .patch(`/api/pairs/${pair.id}`, {
        version: 2,
        notes: `${winner.body.notes}; ${loser === a ? 'edit by A' : 'edit by B'}`,
      })
      .expect(200);
    expect(retry.body.version).toBe(3);
    pair = retry.body;
  });

  it('a viewer PATCH is 403 and changes nothing; a user of another workspace gets 404', async () => {
    const before = await t.db.query('SELECT version, notes, updated_at FROM pairs WHERE id = $1', [
      pair.id,
    ]);
    const denied = await viewer
      .patch(`/api/pairs/${pair.id}`, { version: pair.version, notes: 'viewer was here' })
      .expect(403);
    expect(denied.body.error.code).toBe('forbidden');
    const hidden = await outsider
      .patch(`/api/pairs/${pair.id}`, { version: pair.version, notes: 'outsider' })
      .expect(404);
    expect(hidden.body.error.code).toBe('not-found');
    await outsider.get(`/api/pairs/${pair.id}`).expect(404);
    const after = await t.db.query('SELECT version, notes, updated_at FROM pairs WHERE id = $1', [
      pair.id,
    ]);
    expect(after).toEqual(before);
  });

  it('owners change roles; the last owner can neither be demoted nor leave', async () => {
    await owner
      .patch(`/api/workspaces/${wid}/members/${viewer.userId}`, { role: 'reviewer' })
      .expect(200);
    const demote = await owner
      .patch(`/api/workspaces/${wid}/members/${owner.userId}`, { role: 'editor' })
      .expect(409);
    expect(demote.body.error.code).toBe('last-owner');
    await owner.delete(`/api/workspaces/${wid}/members/${owner.userId}`).expect(409);
    await editorA
      .patch(`/api/workspaces/${wid}/members/${viewer.userId}`, { role: 'owner' })
      .expect(403);
    await owner
      .patch(`/api/workspaces/${wid}/members/${editorA.userId}`, { role: 'owner' })
      .expect(200);
    await owner.delete(`/api/workspaces/${wid}/members/${owner.userId}`).expect(204);
    await owner.get(`/api/workspaces/${wid}/members`).expect(404);
    const audit = await editorA.get(`/api/workspaces/${wid}/audit?limit=200`).expect(200);
    const actions = audit.body.items.map((e: { action: string }) => e.action);
    expect(actions).toEqual(
      expect.arrayContaining([
        'member.role-changed',
        'member.left',
        'invitation.accepted',
        'pair.updated',
      ]),
    );
  });
});
