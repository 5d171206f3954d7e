/**
 * Trace uploads against the real PostgreSQL and the S3 fake: accepted files are stored under
 * their SHA-256 with a row; every bad-file kind is refused with its line numbers and leaves no
 * row and no object; roles decide who may upload and read. Expected checksums and counts come
 * from the test's own files, not from the code under test.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { S3Client } from '@aws-sdk/client-s3';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Trace } from '@gapwise/contracts';
import { startObjectStore, type ObjectStore } from '../../../docker-free-scripts/s3/object-store';
import { registerUser, startTestApp, type Session, type TestApp } from '../support/test-app';
import { gzip, objectKeys, sha256, traceCsv, uploadTrace } from './trace-files';

let t: TestApp;
let s3: ObjectStore;
let s3dir: string;
let client: S3Client;
let owner: Session;
let reviewer: Session;
let viewer: Session;
let stranger: Session;
let wid: string;

const spec = { count: 2000, meanEv: 0.3, sdEv: 0.16, seed: 'upload-1' };

async function traceRows(): Promise<number> {
  return Number((await t.db.query('SELECT count(*)::int AS n FROM traces'))[0].n);
}

beforeAll(async () => {
  s3dir = await mkdtemp(join(tmpdir(), 'gapwise-traces-s3-'));
  s3 = await startObjectStore({ port: 0, directory: s3dir });
  process.env['S3_ENDPOINT'] = s3.endpoint;
  process.env['GAPWISE_TRACE_WORKER'] = 'false';
  client = new S3Client({
    endpoint: s3.endpoint,
    region: s3.region,
    forcePathStyle: true,
    credentials: s3.credentials,
  });
  t = await startTestApp();
  owner = await registerUser(t.app, 'owner');
  reviewer = await registerUser(t.app, 'reviewer');
  viewer = await registerUser(t.app, 'viewer');
  stranger = await registerUser(t.app, 'stranger');
  wid = (await owner.post('/api/workspaces', { name: 'Trace lab' }).expect(201)).body.id;
  for (const [session, role] of [
    [reviewer, 'reviewer'],
    [viewer, 'viewer'],
  ] as const) {
    await t.db.query('INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, $3)', [
      wid,
      session.userId,
      role,
    ]);
  }
});

afterAll(async () => {
  await t?.close();
  client?.destroy();
  await s3?.stop();
  await rm(s3dir, { recursive: true, force: true });
});

describe('trace upload', () => {
  it('stores an accepted file under its SHA-256 and records its settings and counts', async () => {
    const text = traceCsv(spec);
    const res = await uploadTrace(
      owner,
      wid,
      text,
      { state: 'reactant', unit: 'eV', column: 'dE' },
      'run-R.csv',
    ).expect(201);
    const trace = res.body as Trace;
    expect(trace).toMatchObject({
      state: 'reactant',
      fileName: 'run-R.csv',
      sizeBytes: Buffer.byteLength(text),
      sha256: sha256(text),
      unit: 'eV',
      columnName: 'dE',
      columnIndex: 2,
      delimiter: 'comma',
      sampleCount: 2000,
      skippedLineCount: 0,
      gzip: false,
    });
    expect(trace.uploadedBy?.id).toBe(owner.userId);
    expect(await objectKeys(client, s3.bucket)).toEqual([`traces/sha256/${sha256(text)}`]);
    const list = await viewer.get(`/api/workspaces/${wid}/traces`).expect(200);
    expect(list.body.map((x: Trace) => x.id)).toContain(trace.id);
    await reviewer.get(`/api/traces/${trace.id}`).expect(200);
    expect(JSON.stringify(list.body)).not.toContain('objectKey');
  });

  it.each([
    ['a non-numeric value', 'frame,dE\n1,0.1\n2,abc\n3,0.2\n', ["Line 3: 'abc' is not a number."]],
    [
      'an empty value',
      'frame,dE\n1,0.1\n2,\n3,\n',
      ['Line 3: empty value in column 2.', 'Line 4: empty value in column 2.'],
    ],
    [
      'non-finite values',
      'frame,dE\n1,nan\n2,inf\n3,1e400\n4,0.1\n',
      ['Line 2: non-finite value.', 'Line 3: non-finite value.', 'Line 4: non-finite value.'],
    ],
    [
      'a wrong column count',
      'frame,dE\n1,0.1\n2,0.2,9\n',
      ['Line 3: expected 2 columns (frame,dE), found 3.'],
    ],
    [
      'a second header',
      'frame,dE\n1,0.1\nframe,dE\n2,0.2\n',
      ['Line 3: a second header row in the middle of the data.'],
    ],
    ['no data rows', 'frame,dE\n', ['No data rows found.']],
  ])('refuses %s with the line numbers and stores nothing', async (_kind, text, messages) => {
    const rowsBefore = await traceRows();
    const keysBefore = await objectKeys(client, s3.bucket);
    const res = await uploadTrace(owner, wid, text, { state: 'product', unit: 'eV' }).expect(400);
    expect(res.body.error.code).toBe('trace-refused');
    const got = (res.body.error.fields as Array<{ message: string }>).map((f) => f.message);
    expect(got.slice(0, messages.length)).toEqual(messages);
    expect(await traceRows()).toBe(rowsBefore);
    expect(await objectKeys(client, s3.bucket)).toEqual(keysBefore);
  });

  it('lists the first 20 bad lines and the total of a file with many', async () => {
    const rows = ['dE'];
    for (let i = 0; i < 60; i++) rows.push(i % 3 === 0 ? 'x' : '0.1');
    const res = await uploadTrace(owner, wid, rows.join('\n'), {
      state: 'product',
      unit: 'eV',
    }).expect(400);
    const fields = res.body.error.fields as Array<{ message: string; line?: number }>;
    expect(fields.filter((f) => f.line !== undefined).map((f) => f.line)).toEqual(
      Array.from({ length: 20 }, (_, k) => 2 + 3 * k),
    );
    expect(fields.at(-1)?.message).toBe('20 bad lines in total.');
    const many = ['dE', ...Array.from({ length: 100 }, () => 'y')].join('\n');
    const res2 = await uploadTrace(owner, wid, many, { state: 'product', unit: 'eV' }).expect(400);
    expect(res2.body.error.fields.at(-1).message).toBe(
      '100 bad lines in total (the first 20 are listed).',
    );
  });

  it('skips bad lines on request and records how many and which', async () => {
    const text = 'dE\n0.1\nabc\n0.2\nnan\n0.3\n';
    const res = await uploadTrace(owner, wid, text, {
      state: 'product',
      unit: 'eV',
      skipBadLines: true,
    }).expect(201);
    expect(res.body).toMatchObject({
      sampleCount: 3,
      skipBadLines: true,
      skippedLineCount: 2,
      skippedLines: [
        { line: 3, message: "Line 3: 'abc' is not a number." },
        { line: 5, message: 'Line 5: non-finite value.' },
      ],
    });
  });

  it('accepts a gzip-compressed file (checksum of the bytes as sent) and a CRLF file', async () => {
    const text = traceCsv({ ...spec, seed: 'gz' });
    const packed = gzip(text);
    const gz = await uploadTrace(
      owner,
      wid,
      packed,
      { state: 'product', unit: 'eV' },
      'p.csv.gz',
    ).expect(201);
    expect(gz.body).toMatchObject({
      gzip: true,
      sampleCount: 2000,
      sha256: sha256(packed),
      sizeBytes: packed.length,
    });
    const crlf = traceCsv({ ...spec, seed: 'crlf' }, { eol: '\r\n' });
    const res = await uploadTrace(owner, wid, crlf, { state: 'product', unit: 'eV' }).expect(201);
    expect(res.body.sampleCount).toBe(2000);
    expect(res.body.meanEv).toBeCloseTo(
      Number(
        crlf
          .trim()
          .split('\r\n')
          .slice(1)
          .reduce((s, l) => s + Number(l.split(',')[1]), 0),
      ) / 2000,
      12,
    );
  });

  it('refuses bad settings before reading the file', async () => {
    const res = await uploadTrace(owner, wid, 'dE\n1\n', {
      state: 'middle' as never,
      unit: 'kcal',
    }).expect(400);
    expect(res.body.error.fields.map((f: { field: string }) => f.field)).toEqual(['state', 'unit']);
    const col = await uploadTrace(owner, wid, 'a,b\n1,2\n', {
      state: 'reactant',
      unit: 'eV',
      column: 'dE',
    }).expect(400);
    expect(col.body.error.fields[0]).toEqual({
      field: 'column',
      message: "Column 'dE' is not in the header (a,b).",
    });
  });

  it('lets only editors upload; non-members get 404', async () => {
    const before = await traceRows();
    await uploadTrace(reviewer, wid, 'dE\n1\n2\n', { state: 'reactant', unit: 'eV' }).expect(403);
    await uploadTrace(viewer, wid, 'dE\n1\n2\n', { state: 'reactant', unit: 'eV' }).expect(403);
    await uploadTrace(stranger, wid, 'dE\n1\n2\n', { state: 'reactant', unit: 'eV' }).expect(404);
    await stranger.get(`/api/workspaces/${wid}/traces`).expect(404);
    await request(t.app).get(`/api/workspaces/${wid}/traces`).expect(401);
    expect(await traceRows()).toBe(before);
  });
});
