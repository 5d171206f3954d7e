/**
 * The review workflow: every transition tried by every role (only the allowed ones succeed, the
 * author never approves their own report), an e-mail captured for each notice, audit events,
 * approved reports frozen (409 on comment, revise, delete, further transitions), report numbers
 * unchanged after the pair is edited, the waiting list, threaded anchored comments, and the PDF
 * stored once in S3-API object storage (s3rver) so the approved bytes are the downloaded bytes.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  reviewRevision,
  reviewRounds,
  reviewStatusText,
  transitionText,
  type ReportListItem,
  type ReportView,
  type Role,
} from '@gapwise/contracts';
import { startObjectStore, type ObjectStore } from '../../docker-free-scripts/s3/object-store';
import { S3ReportPdfStore, reportPdfKey } from '../../apps/api/src/reports/report-pdf-store';
import { pairBody } from './support/fixtures';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';

let t: TestApp;
let s3: ObjectStore;
let store: S3ReportPdfStore;
const users = {} as Record<Role | 'author' | 'reviewer2' | 'outsider', Session>;
let wid: string;
let pairId: string;

async function addMember(session: Session, role: Role): Promise<void> {
  await t.db.query('INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, $3)', [
    wid,
    session.userId,
    role,
  ]);
}

function pdfOf(session: Session, id: string) {
  return session
    .get(`/api/reports/${id}/pdf`)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
}

beforeAll(async () => {
  s3 = await startObjectStore({ port: 0, directory: mkdtempSync(join(tmpdir(), 'gapwise-s3-')) });
  t = await startTestApp();
  store = new S3ReportPdfStore({
    endpoint: s3.endpoint,
    region: s3.region,
    bucket: s3.bucket,
    accessKeyId: s3.credentials.accessKeyId,
    secretAccessKey: s3.credentials.secretAccessKey,
  });
  // The runtime is the app's dependency object: give it the object store, as S3_ENDPOINT would.
  (t.runtime as { reportPdfStore?: unknown }).reportPdfStore = store;
  users.owner = await registerUser(t.app, 'owner');
  wid = (await users.owner.post('/api/workspaces', { name: 'Review lab' }).expect(201)).body.id;
  users.author = await registerUser(t.app, 'author');
  users.editor = await registerUser(t.app, 'editor');
  users.reviewer = await registerUser(t.app, 'reviewer');
  users.reviewer2 = await registerUser(t.app, 'reviewer2');
  users.viewer = await registerUser(t.app, 'viewer');
  users.outsider = await registerUser(t.app, 'outsider');
  await addMember(users.author, 'editor');
  await addMember(users.editor, 'editor');
  await addMember(users.reviewer, 'reviewer');
  await addMember(users.reviewer2, 'reviewer');
  await addMember(users.viewer, 'viewer');
  pairId = (
    await users.author.post(`/api/workspaces/${wid}/pairs`, pairBody({ name: 'DA-3' })).expect(201)
  ).body.id;
});
afterAll(async () => {
  await t?.close();
  await s3?.stop();
});

async function newReport(): Promise<ReportView> {
  return (await users.author.post(`/api/workspaces/${wid}/reports`, { pairId }).expect(201)).body;
}

describe('report creation and access', () => {
  it('only owners and editors create; reviewers, viewers 403; outsiders 404; bad bodies 400', async () => {
    await users.owner.post(`/api/workspaces/${wid}/reports`, { pairId }).expect(201);
    await users.editor.post(`/api/workspaces/${wid}/reports`, { pairId }).expect(201);
    await users.reviewer.post(`/api/workspaces/${wid}/reports`, { pairId }).expect(403);
    await users.viewer.post(`/api/workspaces/${wid}/reports`, { pairId }).expect(403);
    await users.outsider.post(`/api/workspaces/${wid}/reports`, { pairId }).expect(404);
    const bad = await users.author
      .post(`/api/workspaces/${wid}/reports`, { pairId: 'nope', extra: 1 })
      .expect(400);
    expect(bad.body.error.fields.map((f: { field: string }) => f.field)).toEqual(
      expect.arrayContaining(['pairId', 'extra']),
    );
    await users.author.post(`/api/workspaces/${wid}/reports`, {}).expect(400);
  });

  it('every member reads a report, its PDF and exports; outsiders get 404', async () => {
    const r = await newReport();
    for (const role of ['owner', 'author', 'editor', 'reviewer', 'viewer'] as const) {
      await users[role].get(`/api/reports/${r.reportId}`).expect(200);
      await users[role].get(`/api/reports/${r.reportId}/export?format=csv`).expect(200);
    }
    await users.outsider.get(`/api/reports/${r.reportId}`).expect(404);
    await users.outsider.get(`/api/reports/${r.reportId}/pdf`).expect(404);
    const csv = await users.viewer.get(`/api/reports/${r.reportId}/export?format=csv`).expect(200);
    expect(csv.headers['content-type']).toContain('text/csv');
    const k = r.snapshot.pairs[0].results.find((x) => x.primary)!.k!;
    expect(csv.text).toContain(`result,${pairId},1,DA-3,marcus,k,${k},s-1`);
  });

  it('freezes the pair: editing the pair later changes no number of the report', async () => {
    const r = await newReport();
    const before = (await users.author.get(`/api/reports/${r.reportId}`).expect(200))
      .body as ReportView;
    const pdfBefore = (await pdfOf(users.author, r.reportId).expect(200)).body as Buffer;
    const pair = (await users.author.get(`/api/pairs/${pairId}`).expect(200)).body;
    const edited = pairBody({ name: 'DA-3' });
    (edited.parameters[0] as { value: number }).value = -0.9;
    await users.author
      .put(`/api/pairs/${pairId}`, { ...edited, version: pair.version })
      .expect(200);
    const after = (await users.author.get(`/api/reports/${r.reportId}`).expect(200))
      .body as ReportView;
    expect(after.snapshotId).toBe(before.snapshotId);
    expect(after.snapshot).toEqual(before.snapshot);
    expect(after.snapshot.pairs[0].inputs.find((i) => i.kind === 'deltaG0')!.value).toBe(-0.5);
    const pdfAfter = (await pdfOf(users.author, r.reportId).expect(200)).body as Buffer;
    expect(Buffer.compare(pdfAfter, pdfBefore)).toBe(0);
    // A revision takes the pair's current version.
    const revised = (await users.author.post(`/api/reports/${r.reportId}/revise`).expect(200))
      .body as ReportView;
    expect(revised.snapshotId).not.toBe(before.snapshotId);
    expect(revised.snapshot.pairs[0].inputs.find((i) => i.kind === 'deltaG0')!.value).toBe(-0.9);
    expect(revised.snapshot.pairs[0].pairVersion).toBe(pair.version + 1);
  });
});

describe('review transitions', () => {
  it('submit: only owners and editors (incl. the author); e-mails the reviewers and owner, not the submitter', async () => {
    const r = await newReport();
    await users.reviewer.post(`/api/reports/${r.reportId}/submit`).expect(403);
    await users.viewer.post(`/api/reports/${r.reportId}/submit`).expect(403);
    await users.outsider.post(`/api/reports/${r.reportId}/submit`).expect(404);
    // Not submitted yet: reviewers cannot decide.
    await users.reviewer.post(`/api/reports/${r.reportId}/approve`).expect(409);
    await users.reviewer.post(`/api/reports/${r.reportId}/request-changes`).expect(409);
    t.mail.clear();
    const submitted = (
      await users.author.post(`/api/reports/${r.reportId}/submit`, { note: 'Ready' }).expect(200)
    ).body;
    expect(submitted.status).toBe('submitted');
    for (const who of [users.reviewer, users.reviewer2, users.owner]) {
      const m = await t.mail.waitFor(
        (x) => x.to.includes(who.email.toLowerCase()) && x.subject.startsWith('Review requested'),
      );
      expect(m.text).toContain(`/w/${wid}/reports/${r.reportId}`);
      expect(m.text).toContain('Ready');
    }
    await new Promise((res) => setTimeout(res, 1500));
    expect(t.mail.messages().some((x) => x.to.includes(users.author.email.toLowerCase()))).toBe(
      false,
    );
    expect(t.mail.messages().some((x) => x.to.includes(users.viewer.email.toLowerCase()))).toBe(
      false,
    );
    // Submitting twice is a conflict.
    await users.editor.post(`/api/reports/${r.reportId}/submit`).expect(409);
    const audit = await users.owner
      .get(`/api/workspaces/${wid}/audit?entityId=${r.reportId}`)
      .expect(200);
    expect(audit.body.items.map((e: { action: string }) => e.action)).toEqual(
      expect.arrayContaining(['report.create', 'report.submit']),
    );
  });

  it('request-changes: only reviewers and owners; e-mails the author; the author revises and resubmits', async () => {
    const r = await newReport();
    await users.author.post(`/api/reports/${r.reportId}/submit`).expect(200);
    await users.editor.post(`/api/reports/${r.reportId}/request-changes`).expect(403);
    await users.viewer.post(`/api/reports/${r.reportId}/request-changes`).expect(403);
    await users.author.post(`/api/reports/${r.reportId}/revise`).expect(409);
    t.mail.clear();
    const back = (
      await users.reviewer
        .post(`/api/reports/${r.reportId}/request-changes`, { note: 'Source of λ?' })
        .expect(200)
    ).body;
    expect(back.status).toBe('changes-requested');
    const m = await t.mail.waitFor(
      (x) =>
        x.to.includes(users.author.email.toLowerCase()) &&
        x.subject.startsWith('Changes requested'),
    );
    expect(m.text).toContain('Source of λ?');
    await users.author.post(`/api/reports/${r.reportId}/revise`).expect(200);
    await users.author.post(`/api/reports/${r.reportId}/submit`).expect(200);
    // The owner may also ask for changes.
    await users.owner.post(`/api/reports/${r.reportId}/request-changes`).expect(200);
    const history = (
      (await users.viewer.get(`/api/reports/${r.reportId}`).expect(200)).body as ReportView
    ).history;
    expect(history.map((h) => h.to)).toEqual([
      'draft',
      'submitted',
      'changes-requested',
      'submitted',
      'changes-requested',
    ]);
  });

  it('approve: reviewers and owners but never the author; e-mails the author; the report is frozen and its stored PDF is the one downloaded', async () => {
    const own = (await users.owner.post(`/api/workspaces/${wid}/reports`, { pairId }).expect(201))
      .body as ReportView;
    await users.owner.post(`/api/reports/${own.reportId}/submit`).expect(200);
    const selfApproval = await users.owner.post(`/api/reports/${own.reportId}/approve`).expect(403);
    expect(selfApproval.body.error.message).toContain('author');
    await users.reviewer.post(`/api/reports/${own.reportId}/approve`).expect(200);

    const r = await newReport();
    await users.author.post(`/api/reports/${r.reportId}/submit`).expect(200);
    await users.author.post(`/api/reports/${r.reportId}/approve`).expect(403);
    await users.editor.post(`/api/reports/${r.reportId}/approve`).expect(403);
    await users.viewer.post(`/api/reports/${r.reportId}/approve`).expect(403);
    t.mail.clear();
    const approved = (
      await users.reviewer2.post(`/api/reports/${r.reportId}/approve`, { note: 'Fine' }).expect(200)
    ).body as ReportView;
    expect(approved.status).toBe('approved');
    const m = await t.mail.waitFor(
      (x) => x.to.includes(users.author.email.toLowerCase()) && x.subject.startsWith('Approved'),
    );
    expect(m.text).toContain(r.reportId);

    // Stored at approval under snapshot id + revision; downloads return exactly those bytes.
    const key = reportPdfKey(approved.snapshotId, approved.revision);
    const stored = await store.get(key);
    expect(stored).not.toBeNull();
    const downloaded = (await pdfOf(users.viewer, r.reportId).expect(200)).body as Buffer;
    expect(Buffer.compare(downloaded, stored!)).toBe(0);
    const row = await t.db.query('SELECT pdf_key FROM reports WHERE id = $1', [r.reportId]);
    expect(row[0].pdf_key).toBe(key);

    // Frozen: no comment, revision, deletion or further decision.
    for (const who of [users.author, users.owner]) {
      await who.post(`/api/reports/${r.reportId}/revise`).expect(409);
      await who.delete(`/api/reports/${r.reportId}`).expect(409);
      await who.post(`/api/reports/${r.reportId}/comments`, { body: 'late' }).expect(409);
      await who.post(`/api/reports/${r.reportId}/submit`).expect(409);
    }
    await users.reviewer.post(`/api/reports/${r.reportId}/request-changes`).expect(409);
    await users.reviewer.post(`/api/reports/${r.reportId}/approve`).expect(409);
    const still = (await pdfOf(users.author, r.reportId).expect(200)).body as Buffer;
    expect(Buffer.compare(still, stored!)).toBe(0);
  });

  it('numbers revisions by submissions, not by comments or status changes, and marks a changed snapshot', async () => {
    const r = await newReport();
    // Comments and decisions change the stored PDF, not the revision a reviewer knows.
    await users.author
      .post(`/api/reports/${r.reportId}/comments`, { body: 'Draft note' })
      .expect(201);
    await users.author.post(`/api/reports/${r.reportId}/submit`).expect(200);
    await users.reviewer.post(`/api/reports/${r.reportId}/comments`, { body: 'λ?' }).expect(201);
    await users.reviewer.post(`/api/reports/${r.reportId}/request-changes`).expect(200);
    const pair = (await users.author.get(`/api/pairs/${pairId}`).expect(200)).body;
    const edited = pairBody({ name: 'DA-3' });
    (edited.parameters[0] as { value: number }).value = -0.55;
    await users.author
      .put(`/api/pairs/${pairId}`, { ...edited, version: pair.version })
      .expect(200);
    await users.author.post(`/api/reports/${r.reportId}/revise`).expect(200);
    await users.author.post(`/api/reports/${r.reportId}/submit`).expect(200);
    const approved = (await users.reviewer.post(`/api/reports/${r.reportId}/approve`).expect(200))
      .body as ReportView;
    // Stored counter (keys the cached PDF) moved with every change; the reviewer saw 2 submissions.
    expect(approved.revision).toBeGreaterThan(2);
    expect(reviewRevision(approved.history)).toBe(2);
    expect(reviewStatusText(approved.status, approved.history)).toBe('Approved, revision 2');
    const submits = approved.history.filter((h) => h.to === 'submitted');
    expect(submits[0].snapshotId).toBe(r.snapshotId);
    expect(submits[1].snapshotId).toBe(approved.snapshotId);
    expect(submits[1].snapshotId).not.toBe(submits[0].snapshotId);
    const rounds = reviewRounds(approved.history);
    const decisions = approved.history.map((h, i) => transitionText(h, rounds[i]));
    expect(decisions).toEqual([
      'Created as Draft',
      'Draft → Submitted (revision 1)',
      'Submitted → Changes requested',
      'Changes requested → Submitted (revision 2; snapshot changed since revision 1)',
      'Submitted → Approved',
    ]);
    // The PDF says the same.
    const file = join(mkdtempSync(join(tmpdir(), 'gapwise-pdf-')), 'r.pdf');
    writeFileSync(file, (await pdfOf(users.viewer, r.reportId).expect(200)).body as Buffer);
    const text = execFileSync('pdftotext', ['-enc', 'UTF-8', file, '-'], {
      encoding: 'utf8',
    }).replace(/\s+/g, ' ');
    expect(text).toContain('Approved, revision 2');
    expect(text).toContain('snapshot changed since revision 1');
    expect(text).not.toMatch(/revision [3-9]/);
    const csv = await users.viewer.get(`/api/reports/${r.reportId}/export?format=csv`).expect(200);
    expect(csv.text).toContain('report,,,,,revision,2,');
  });

  it('delete: owners and editors, not reviewers or viewers, not once approved', async () => {
    const r = await newReport();
    await users.reviewer.delete(`/api/reports/${r.reportId}`).expect(403);
    await users.viewer.delete(`/api/reports/${r.reportId}`).expect(403);
    await users.editor.delete(`/api/reports/${r.reportId}`).expect(204);
    await users.author.get(`/api/reports/${r.reportId}`).expect(404);
  });
});

describe('comments and the waiting list', () => {
  it('threads comments, anchors them to a parameter, e-mails the author and the parent commenter; viewers may not comment', async () => {
    const r = await newReport();
    await users.author.post(`/api/reports/${r.reportId}/submit`).expect(200);
    t.mail.clear();
    const first = (
      await users.reviewer
        .post(`/api/reports/${r.reportId}/comments`, {
          body: 'Where does the coupling come from?',
          anchor: 'coupling',
        })
        .expect(201)
    ).body as ReportView;
    const parent = first.comments[0];
    expect(parent.anchor).toBe('coupling');
    const notice = await t.mail.waitFor(
      (x) =>
        x.to.includes(users.author.email.toLowerCase()) &&
        x.text.includes('Where does the coupling come from?'),
    );
    // The parameter by the label the report prints, not its code name.
    const label = r.snapshot.pairs[0].inputs.find((i) => i.kind === 'coupling')!.label;
    expect(label).toContain('coupling');
    expect(notice.text).toContain(`commented on ${label} in the report "${r.title}"`);
    expect(notice.text).not.toMatch(/commented on coupling\b/);
    const reply = (
      await users.author
        .post(`/api/reports/${r.reportId}/comments`, {
          body: 'GMH on the CT band.',
          parentId: parent.id,
        })
        .expect(201)
    ).body as ReportView;
    expect(reply.comments[1].parentId).toBe(parent.id);
    await t.mail.waitFor(
      (x) =>
        x.to.includes(users.reviewer.email.toLowerCase()) && x.text.includes('GMH on the CT band.'),
    );
    await users.viewer.post(`/api/reports/${r.reportId}/comments`, { body: 'hi' }).expect(403);
    const bad = await users.reviewer
      .post(`/api/reports/${r.reportId}/comments`, { body: 'x', anchor: 'colour' })
      .expect(400);
    expect(bad.body.error.fields[0].field).toBe('anchor');
    await users.reviewer.post(`/api/reports/${r.reportId}/comments`, { body: '  ' }).expect(400);
    // The PDF prints the thread with its anchor.
    const pdf = (await pdfOf(users.viewer, r.reportId).expect(200)).body as Buffer;
    expect(pdf.length).toBeGreaterThan(10_000);
  });

  it('lists submitted reports waiting for me: reviewers and owners, never my own; filters the workspace list', async () => {
    const r = await newReport();
    await users.author.post(`/api/reports/${r.reportId}/submit`).expect(200);
    const waiting = (await users.reviewer.get('/api/reviews/waiting').expect(200))
      .body as ReportListItem[];
    expect(waiting.map((x) => x.id)).toContain(r.reportId);
    expect(
      ((await users.owner.get('/api/reviews/waiting').expect(200)).body as ReportListItem[]).map(
        (x) => x.id,
      ),
    ).toContain(r.reportId);
    expect(
      ((await users.author.get('/api/reviews/waiting').expect(200)).body as ReportListItem[]).map(
        (x) => x.id,
      ),
    ).not.toContain(r.reportId);
    expect((await users.viewer.get('/api/reviews/waiting').expect(200)).body).toEqual([]);
    expect((await users.outsider.get('/api/reviews/waiting').expect(200)).body).toEqual([]);

    const submitted = (
      await users.viewer.get(`/api/workspaces/${wid}/reports?status=submitted`).expect(200)
    ).body as ReportListItem[];
    expect(submitted.every((x) => x.status === 'submitted')).toBe(true);
    expect(submitted.map((x) => x.id)).toContain(r.reportId);
    const mine = (
      await users.viewer
        .get(`/api/workspaces/${wid}/reports?author=${users.author.userId}&pairId=${pairId}`)
        .expect(200)
    ).body as ReportListItem[];
    expect(mine.length).toBeGreaterThan(0);
    expect(
      mine.every((x) => x.author.id === users.author.userId && x.pairIds.includes(pairId)),
    ).toBe(true);
    await users.viewer.get(`/api/workspaces/${wid}/reports?status=done`).expect(400);
    await users.outsider.get(`/api/workspaces/${wid}/reports`).expect(404);
  });

  it('comparison reports freeze several pairs', async () => {
    const other = (
      await users.author
        .post(`/api/workspaces/${wid}/pairs`, pairBody({ name: 'DA-4' }))
        .expect(201)
    ).body.id;
    const r = (
      await users.author
        .post(`/api/workspaces/${wid}/reports`, { pairIds: [pairId, other] })
        .expect(201)
    ).body as ReportView;
    expect(r.kind).toBe('comparison');
    expect(r.snapshot.pairs.map((p) => p.name)).toEqual(['DA-3', 'DA-4']);
    await pdfOf(users.viewer, r.reportId).expect(200);
    await users.author.post(`/api/workspaces/${wid}/reports`, { pairIds: [pairId] }).expect(400);
  });
});
