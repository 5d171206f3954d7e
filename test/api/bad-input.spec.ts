/**
 * Bad input against the real server and PostgreSQL: every malformed or hostile request answers a
 * 4xx naming the problem (never 500), and nothing is written half way. One `it` per finding of
 * the security review (issue 12, "Bad input").
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import pg from 'pg';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startObjectStore, type ObjectStore } from '../../docker-free-scripts/s3/object-store';
import { pairBody } from './support/fixtures';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';
import { screenCsv } from './screens/screen-csv';

process.env['GAPWISE_SCREEN_WORKER'] = 'false';
process.env['GAPWISE_TRACE_WORKER'] = 'false';

let t: TestApp;
let s3: ObjectStore;
let s3dir: string;
let owner: Session;
let stranger: Session;
let wid: string;
let foreignWid: string;

const INJECTION = "-2+3+cmd|' /C calc'!A0";

beforeAll(async () => {
  s3dir = await mkdtemp(join(tmpdir(), 'gapwise-bad-input-s3-'));
  s3 = await startObjectStore({ port: 0, directory: s3dir });
  process.env['S3_ENDPOINT'] = s3.endpoint;
  // Small screen caps so the test files stay small; trace caps keep their defaults.
  t = await startTestApp({ screenMaxRows: 50, screenMaxBytes: 64 * 1024 });
  owner = await registerUser(t.app, 'owner');
  stranger = await registerUser(t.app, 'stranger');
  wid = (await owner.post('/api/workspaces', { name: 'Hostile input' }).expect(201)).body.id;
  foreignWid = (await stranger.post('/api/workspaces', { name: 'Elsewhere' }).expect(201)).body.id;
}, 120_000);

afterAll(async () => {
  await t?.close();
  await s3?.stop();
  await rm(s3dir, { recursive: true, force: true });
});

const newPair = async (session: Session, workspace: string, name = 'P') =>
  (await session.post(`/api/workspaces/${workspace}/pairs`, pairBody({ name })).expect(201)).body;

/** A multipart body written by hand, so it can be malformed on purpose. */
function rawMultipart(session: Session, path: string, contentType: string, body: Buffer | string) {
  return session.call('post', path).set('Content-Type', contentType).send(Buffer.from(body));
}

describe('bad input', () => {
  it('refuses inherited names as a pairs sort column with a 400 naming sort', async () => {
    for (const sort of ['constructor', 'toString', '__proto__', '-constructor', 'hasOwnProperty']) {
      const res = await owner.get(`/api/workspaces/${wid}/pairs?sort=${encodeURIComponent(sort)}`);
      expect(res.status, sort).toBe(400);
      expect(res.body.error.fields[0].field).toBe('sort');
    }
    for (const sort of ['constructor', '__proto__', 'toString']) {
      const res = await owner.get(
        `/api/workspaces/${wid}/screens/00000000-0000-4000-8000-000000000000/results?sort=${sort}`,
      );
      expect(res.status).toBeLessThan(500);
    }
    await owner.get(`/api/workspaces/${wid}/pairs?sort=-name`).expect(200);
  });

  it('answers malformed multipart on trace and screen uploads with a 400, not a 500', async () => {
    const boundary = 'gw-boundary';
    const part = (name: string) =>
      `--${boundary}\r\nContent-Disposition: form-data; name="state"\r\n\r\nreactant\r\n` +
      `--${boundary}\r\nContent-Disposition: form-data; name="unit"\r\n\r\neV\r\n` +
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${name}"\r\n` +
      `Content-Type: text/csv\r\n\r\nframe,dE\n0,0.1\n1,0.2\n`;
    const cases: Array<[string, string, string]> = [
      ['no boundary', 'multipart/form-data', part('a.csv') + `\r\n--${boundary}--\r\n`],
      ['unterminated form', `multipart/form-data; boundary=${boundary}`, part('a.csv')],
      [
        'NUL in the file name',
        `multipart/form-data; boundary=${boundary}`,
        part('a\u0000b.csv') + `\r\n--${boundary}--\r\n`,
      ],
    ];
    for (const path of [`/api/workspaces/${wid}/traces`, `/api/workspaces/${wid}/screens`]) {
      for (const [label, type, body] of cases) {
        const res = await rawMultipart(owner, path, type, body);
        expect(res.status, `${path}: ${label}: ${JSON.stringify(res.body)}`).toBeGreaterThanOrEqual(
          400,
        );
        expect(res.status, `${path}: ${label}`).toBeLessThan(500);
        expect(res.body.error.message.length).toBeGreaterThan(0);
      }
    }
    expect(Number((await t.db.query('SELECT count(*)::int AS n FROM traces'))[0].n)).toBe(0);
  });

  it('answers 409 to cancelling a finished screen and writes no audit event', async () => {
    const up = await owner
      .call('post', `/api/workspaces/${wid}/screens?name=finished`)
      .set('Content-Type', 'text/csv')
      .send(screenCsv(3));
    expect(up.status).toBe(201);
    const id = up.body.id as string;
    // A finished screen, set directly (this server runs no screen worker).
    await t.db.query(`UPDATE screens SET status = 'done', finished_at = now() WHERE id = $1`, [id]);
    const audits = async () =>
      Number(
        (
          await t.db.query(
            `SELECT count(*)::int AS n FROM audit_events WHERE entity_id = $1 AND action = 'screen.cancelled'`,
            [id],
          )
        )[0].n,
      );
    const res = await owner.post(`/api/screens/${id}/cancel`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('screen-not-running');
    expect(await audits()).toBe(0);
    expect((await owner.get(`/api/screens/${id}`)).body.status).toBe('done');
  });

  it('neutralises formula text in the report CSV export with the shared rule', async () => {
    const pair = await newPair(owner, wid, INJECTION);
    const report = (
      await owner.post(`/api/workspaces/${wid}/reports`, { pairId: pair.id }).expect(201)
    ).body;
    const csv = await owner.get(`/api/reports/${report.reportId}/export?format=csv`).expect(200);
    expect(csv.text).not.toMatch(/(^|,)-2\+3\+cmd/m);
    expect(csv.text).toContain(`'${INJECTION}`);
    // A real negative number in the value column stays a number.
    expect(csv.text).toMatch(/,deltaG0,-0\.5,eV,/);
  });

  it('neutralises formula text in the screen results CSV with the shared rule', async () => {
    const csv = screenCsv(2).replace('Med-1,', `"${INJECTION}",`);
    const up = await owner
      .call('post', `/api/workspaces/${wid}/screens?name=formula`)
      .set('Content-Type', 'text/csv')
      .send(csv);
    expect(up.status).toBe(201);
    // Results written directly (this server runs no screen worker): one row per input line.
    await t.db.query(
      `INSERT INTO screen_results (screen_id, row_number, donor, acceptor, solvent, delta_g_cs)
       SELECT $1, 1, $2, 'Med-2', 'acetonitrile', -0.75`,
      [up.body.id, INJECTION],
    );
    const res = await owner.get(`/api/screens/${up.body.id}/results.csv`).expect(200);
    const line = res.text.split(/\r?\n/)[1]!;
    expect(line.startsWith(`1,'${INJECTION},Med-2,acetonitrile,-0.75,`)).toBe(true);
  });

  it('answers 503 database-unavailable on every route while the database refuses connections', async () => {
    const down = await startTestApp();
    const admin = new pg.Client({ connectionString: process.env['GAPWISE_TEST_DATABASE_URL'] });
    await admin.connect();
    try {
      const member = await registerUser(down.app, 'member');
      // The database goes away: no new connections, and every open one is cut.
      await admin.query(`ALTER DATABASE "${down.database.name}" ALLOW_CONNECTIONS false`);
      await admin.query(
        'SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = $1',
        [down.database.name],
      );
      for (const res of [
        await member.get('/api/workspaces'),
        await member.post('/api/workspaces', { name: 'never' }),
        await request(down.app)
          .post('/api/auth/sign-in')
          .send({ email: member.email, password: 'correct horse battery' }),
      ]) {
        expect(res.status, JSON.stringify(res.body)).toBe(503);
        expect(res.body.error.code).toBe('database-unavailable');
        expect(res.body.error.message).toMatch(/database is unavailable/);
      }
      expect((await request(down.app).get('/api/health')).status).toBe(503);
      // Back up: the same routes answer normally again.
      await admin.query(`ALTER DATABASE "${down.database.name}" ALLOW_CONNECTIONS true`);
      await member.get('/api/workspaces').expect(200);
    } finally {
      await admin
        .query(`ALTER DATABASE "${down.database.name}" ALLOW_CONNECTIONS true`)
        .catch(() => undefined);
      await admin.end();
      await down.close();
    }
  }, 60_000);

  it('refuses __proto__ and constructor keys naming the key, and names a wrong JSON type', async () => {
    for (const [raw, field] of [
      ['{"name":"x","__proto__":{"isAdmin":true}}', '__proto__'],
      ['{"name":"x","constructor":{"prototype":{"polluted":1}}}', 'constructor'],
    ] as const) {
      const res = await owner
        .call('post', '/api/workspaces')
        .set('Content-Type', 'application/json')
        .send(raw);
      expect(res.status).toBe(400);
      expect(res.body.error.fields[0].field).toBe(field);
      expect(res.body.error.fields[0].message).toContain(`'${field}'`);
    }
    const nested = await owner
      .call('post', `/api/workspaces/${wid}/pairs`)
      .set('Content-Type', 'application/json')
      .send(JSON.stringify(pairBody()).replace('"status":', '"__proto__":{"x":1},"status":'));
    expect(nested.status).toBe(400);
    expect(nested.body.error.fields).toEqual([
      { field: '__proto__', message: "'__proto__' is not allowed as a field name" },
    ]);
    const names = (await t.db.query('SELECT name FROM workspaces')).map(
      (r: { name: string }) => r.name,
    );
    expect(names).not.toContain('x');

    const typed = await owner.post(`/api/workspaces/${wid}/pairs`, {
      ...pairBody(),
      temperature: '300',
    });
    expect(typed.status).toBe(400);
    expect(typed.body.error.fields).toEqual([
      { field: 'temperature', message: 'must be a number (got a string)' },
    ]);
  });

  it('applies a series fit to several pairs all or nothing, and refuses links to other workspaces', async () => {
    const own = await newPair(owner, wid, 'own');
    const foreign = await newPair(stranger, foreignWid, 'foreign');
    const points = [-0.3, -0.6, -0.9, -1.2].map((dg, i) => ({
      deltaG0: dg,
      log10k: 8 + i * 0.5 - i * i * 0.2,
    }));
    const series = await owner.post(`/api/workspaces/${wid}/series`, {
      name: 'atomic',
      temperature: 298.15,
      points,
    });
    expect(series.status).toBe(201);
    await owner.post(`/api/series/${series.body.id}/fit`, { model: 'marcus' }).expect(200);
    const unknown = '00000000-0000-4000-8000-000000000000';
    for (const bad of [foreign.id, unknown]) {
      const res = await owner.post(`/api/series/${series.body.id}/apply`, {
        pairIds: [own.id, bad],
      });
      expect(res.status).toBeGreaterThanOrEqual(400);
      expect(res.status).toBeLessThan(500);
      expect(res.body.error.fields).toEqual([
        { field: 'pairIds.1', message: 'is not a pair of this workspace' },
      ]);
      // Nothing half-written: the own pair keeps its version and has no new audit event.
      expect((await owner.get(`/api/pairs/${own.id}`)).body.version).toBe(own.version);
    }
    const applied = await owner.post(`/api/series/${series.body.id}/apply`, { pairIds: [own.id] });
    expect(applied.status).toBe(200);
    expect(applied.body.pairs[0].version).toBe(own.version + 1);

    // Series pairIds, point pairId and provenance sources refuse ids of other workspaces.
    const linked = await owner.post(`/api/workspaces/${wid}/series`, {
      name: 'foreign links',
      temperature: 298.15,
      pairIds: [own.id, foreign.id],
      points: points.map((p, i) => ({ ...p, pairId: i === 2 ? foreign.id : own.id })),
    });
    expect(linked.status).toBe(400);
    expect(linked.body.error.fields).toEqual([
      { field: 'pairIds.1', message: 'is not a pair of this workspace' },
      { field: 'points.2.pairId', message: 'is not a pair of this workspace' },
    ]);
    const foreignSeries = await stranger.post(`/api/workspaces/${foreignWid}/series`, {
      name: 'theirs',
      temperature: 298.15,
      points,
    });
    const body = pairBody({ name: 'borrowed' });
    body.parameters[0] = {
      ...body.parameters[0]!,
      provenance: {
        kind: 'derived',
        methodId: 'fit.drivingForceSeries',
        sources: [{ type: 'series', id: foreignSeries.body.id }],
      },
    };
    const borrowed = await owner.post(`/api/workspaces/${wid}/pairs`, body);
    expect(borrowed.status).toBe(400);
    expect(borrowed.body.error.fields).toEqual([
      {
        field: 'parameters.0.provenance.sources.0.id',
        message: 'is not a series of this workspace',
      },
    ]);
    const edited = await owner.put(`/api/pairs/${own.id}`, {
      ...body,
      name: 'own',
      version: own.version + 1,
    });
    expect(edited.status).toBe(400);
    expect(edited.body.error.fields[0].field).toBe('parameters.0.provenance.sources.0.id');
  });

  it('refuses physically absurd magnitudes at input, naming the field', async () => {
    const body = pairBody({ name: 'absurd' });
    body.parameters[0] = { ...body.parameters[0]!, value: -1e155 };
    body.parameters[2] = { ...body.parameters[2]!, value: 2000 };
    const res = await owner.post(`/api/workspaces/${wid}/pairs`, body);
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { field: string }) => f.field)).toEqual([
      'parameters.0.value',
      'parameters.2.value',
    ]);
    expect(res.body.error.fields[0].message).toMatch(/between −1000 eV and 1000 eV/);
    // The largest warned value (VALIDATION.md B10: up to 1000 "eV") is still accepted.
    const edge = pairBody({ name: 'edge' });
    edge.parameters[2] = { ...edge.parameters[2]!, value: 999 };
    expect((await owner.post(`/api/workspaces/${wid}/pairs`, edge)).status).toBe(201);
    const series = await owner.post(`/api/workspaces/${wid}/series`, {
      name: 'absurd',
      temperature: 298.15,
      points: [
        { deltaG0: -0.2, log10k: 9 },
        { deltaG0: -1e155, log10k: 9 },
        { deltaG0: -0.6, log10k: 9 },
      ],
    });
    expect(series.status).toBe(400);
    expect(series.body.error.fields[0].field).toBe('points.1.deltaG0');
  });

  it('renders a report PDF and CSV for any number already stored, 1e155 eV included', async () => {
    for (const [kind, value] of [
      ['deltaG0', -1e155],
      ['lambdaOuter', 1e155],
      ['deltaG0', 1e300],
    ] as const) {
      const pair = await newPair(owner, wid, `stored ${kind} ${value}`);
      // Stored directly: rows written before input limits existed, or by another tool.
      await t.db.query(
        'UPDATE pair_parameters SET value = $3, uncertainty = $3 WHERE pair_id = $1 AND kind = $2',
        [pair.id, kind, value],
      );
      const report = await owner.post(`/api/workspaces/${wid}/reports`, { pairId: pair.id });
      expect(report.status, JSON.stringify(report.body)).toBe(201);
      const pdf = await owner
        .get(`/api/reports/${report.body.reportId}/pdf`)
        .buffer(true)
        .parse((res, done) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => done(null, Buffer.concat(chunks)));
        });
      expect(pdf.status, `${kind} ${value}`).toBe(200);
      expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
      const csv = await owner.get(`/api/reports/${report.body.reportId}/export?format=csv`);
      expect(csv.status).toBe(200);
      expect(csv.text).not.toMatch(/NaN|Infinity/);
      expect(csv.text).toContain(`,${kind},${value},eV,`);
    }
  });

  it('refuses a gzip trace that inflates far beyond its size with 413 naming the limit', async () => {
    // 6 bytes a line, about 105 MB inflated, about 100 kB compressed (the review's decompression bomb).
    const bomb = gzipSync(Buffer.from(`frame,dE\n${'1,0.1\n'.repeat(17_500_000)}`));
    expect(bomb.length).toBeLessThan(1024 * 1024);
    const res = await owner
      .call('post', `/api/workspaces/${wid}/traces`)
      .field('state', 'reactant')
      .field('unit', 'eV')
      .attach('file', bomb, 'bomb.csv.gz');
    expect(res.status).toBe(413);
    expect(res.body.error.message).toContain('TRACE_MAX_GZIP_RATIO');
    expect(Number((await t.db.query('SELECT count(*)::int AS n FROM traces'))[0].n)).toBe(0);
  }, 60_000);

  it('refuses screens over the row and byte caps with 413 naming the limit, storing nothing', async () => {
    const screens = async () =>
      Number((await t.db.query('SELECT count(*)::int AS n FROM screens'))[0].n);
    const before = await screens();
    const rows = await owner
      .call('post', `/api/workspaces/${wid}/screens?name=rows`)
      .set('Content-Type', 'text/csv')
      .send(screenCsv(51));
    expect(rows.status).toBe(413);
    expect(rows.body.error.message).toContain('at most 50 data rows (SCREEN_MAX_ROWS)');
    const atCap = await owner
      .call('post', `/api/workspaces/${wid}/screens?name=at-cap`)
      .set('Content-Type', 'text/csv')
      .send(screenCsv(50));
    expect(atCap.status).toBe(201);
    const big = `${screenCsv(40)}${'#'.repeat(70 * 1024)}\n`;
    for (const send of [
      () =>
        owner
          .call('post', `/api/workspaces/${wid}/screens?name=bytes`)
          .set('Content-Type', 'text/csv')
          .send(big),
      () =>
        owner
          .call('post', `/api/workspaces/${wid}/screens?name=bytes`)
          .attach('file', Buffer.from(big), 'big.csv'),
    ]) {
      const res = await send();
      expect(res.status).toBe(413);
      expect(res.body.error.message).toContain('at most 64 KiB (SCREEN_MAX_BYTES)');
    }
    expect(await screens()).toBe(before + 1);
  });

  it('keeps a record of a deleted workspace (who, when, what it held) that survives the cascade', async () => {
    const doomed = (await owner.post('/api/workspaces', { name: 'Doomed' }).expect(201)).body.id;
    const a = await newPair(owner, doomed, 'A');
    await newPair(owner, doomed, 'B');
    await owner.post(`/api/workspaces/${doomed}/reports`, { pairId: a.id }).expect(201);
    await owner
      .call('post', `/api/workspaces/${doomed}/screens?name=s`)
      .set('Content-Type', 'text/csv')
      .send(screenCsv(2))
      .expect(201);
    await t.db.query('INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, $3)', [
      doomed,
      stranger.userId,
      'viewer',
    ]);
    const before = Date.now();
    await owner.delete(`/api/workspaces/${doomed}`).expect(204);
    expect(
      Number(
        (
          await t.db.query('SELECT count(*)::int AS n FROM pairs WHERE workspace_id = $1', [doomed])
        )[0].n,
      ),
    ).toBe(0);
    const rows = await t.db.query('SELECT * FROM workspace_deletions WHERE workspace_id = $1', [
      doomed,
    ]);
    expect(rows).toHaveLength(1);
    const r = rows[0];
    expect(r.workspace_name).toBe('Doomed');
    expect(r.deleted_by).toBe(owner.userId);
    expect(r.deleted_by_email).toBe(owner.email.toLowerCase());
    expect(new Date(r.deleted_at).getTime()).toBeGreaterThanOrEqual(before - 5000);
    expect([
      r.pair_count,
      r.report_count,
      r.screen_count,
      r.trace_count,
      r.series_count,
      r.member_count,
    ]).toEqual([2, 1, 1, 0, 0, 2]);
  });
});
