/**
 * Screens end to end against the real PostgreSQL: uploads, bad rows, two standalone worker
 * processes (`apps/api/src/worker.ts`), a worker killed mid-chunk, cancellation, reuse, and the
 * results table, CSV export and "open as pair". Expected counts come from the generated file
 * (10,000 data rows), not from the code under test.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { registerUser, startTestApp, type Session, type TestApp } from '../support/test-app';
import { screenCsv } from './screen-csv';

// The server process of this test runs no worker: the standalone processes do the work.
process.env['GAPWISE_SCREEN_WORKER'] = 'false';
process.env['GAPWISE_SCREEN_JOB_EXPIRE_SECONDS'] = '3';
process.env['GAPWISE_SCREEN_MAINTENANCE_SECONDS'] = '1';

let t: TestApp;
let owner: Session;
let wid: string;
const workers: ChildProcess[] = [];
let victim: ChildProcess;
let survivor: ChildProcess;

/** Spawns `apps/api/src/worker.ts` and resolves once it reports that it started. */
async function startWorker(extraEnv: Record<string, string> = {}): Promise<ChildProcess> {
  const child = spawn(
    process.execPath,
    ['docker-free-scripts/run-bundled.mjs', 'apps/api/src/worker.ts'],
    {
      env: {
        ...process.env,
        DATABASE_URL: t.config.databaseUrl,
        GAPWISE_SCREEN_MAINTENANCE_SECONDS: '1',
        ...extraEnv,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    },
  );
  child.stderr!.on('data', (d: Buffer) => {
    const text = d.toString();
    if (!text.includes('unexpected operator'))
      process.stderr.write(`[worker ${child.pid}] ${text}`);
  });
  workers.push(child);
  await new Promise<void>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      if (out.includes('started')) resolve();
    });
    child.once('exit', (code) => reject(new Error(`worker exited early (${code})`)));
  });
  return child;
}

async function stopWorker(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise((r) => child.once('exit', r));
  child.kill('SIGTERM');
  await exited;
}

async function waitFor<T>(
  read: () => Promise<T>,
  done: (v: T) => boolean,
  timeoutMs = 45_000,
): Promise<T> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const v = await read();
    if (done(v)) return v;
    if (Date.now() > end)
      throw new Error(`timed out; last value ${JSON.stringify(v).slice(0, 400)}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

const screenOf = async (id: string) => (await owner.get(`/api/screens/${id}`)).body;
const resultCount = async (id: string) =>
  Number(
    (
      await t.db.query('SELECT count(*)::int AS n FROM screen_results WHERE screen_id = $1', [id])
    )[0].n,
  );

async function upload(csv: string, query: string) {
  return owner
    .call('post', `/api/workspaces/${wid}/screens?${query}`)
    .set('Content-Type', 'text/csv')
    .send(csv);
}

beforeAll(async () => {
  t = await startTestApp();
  owner = await registerUser(t.app, 'screener');
  const ws = await owner.post('/api/workspaces', { name: 'Flow battery mediators' });
  expect(ws.status).toBe(201);
  wid = ws.body.id;
  // Two standalone worker processes for the whole file. Each holds a chunk's transaction open
  // 100 ms before commit, so the kill test's SIGKILL lands inside a chunk.
  [victim, survivor] = await Promise.all([
    startWorker({ GAPWISE_SCREEN_TEST_CHUNK_DELAY_MS: '100' }),
    startWorker({ GAPWISE_SCREEN_TEST_CHUNK_DELAY_MS: '100' }),
  ]);
}, 180_000);

afterAll(async () => {
  await Promise.all(workers.map(stopWorker));
  await t?.close();
});

describe('screens API', () => {
  it('serves the template with units in the header', async () => {
    const res = await request(t.app).get('/api/screens/template.csv');
    expect(res.status).toBe(200);
    expect(res.text.split('\n')[0]).toContain('donorOxidation [V]');
    expect(res.text.split('\n')[0]).toContain('coupling [cm-1]');
  });

  it('answers 400 listing bad rows by line number, saves nothing; runGoodRows records the choice', async () => {
    const lines = screenCsv(5).trim().split('\n');
    lines[2] = lines[2]!.replace('acetonitrile', 'unobtainium'); // line 3
    lines[4] = lines[4]!.replace(/,298\.15$/, ',abc'); // line 5
    const csv = `${lines.join('\n')}\n`;
    const bad = await upload(csv, 'name=bad');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('screen-bad-rows');
    expect(bad.body.error.fields.map((f: { field: string }) => f.field)).toEqual([
      'line 3',
      'line 5',
    ]);
    expect(bad.body.error.fields[1].message).toMatch(
      /^Line 5: 'temperature': 'abc' is not a number/,
    );
    const list = await owner.get(`/api/workspaces/${wid}/screens`);
    expect(list.body).toHaveLength(0);

    const good = await upload(csv, 'name=good-rows&runGoodRows=true&chunkSize=50');
    expect(good.status).toBe(201);
    expect(good.body.rowCount).toBe(3);
    expect(good.body.badRowCount).toBe(2);
    expect(good.body.badRowChoice).toBe('run-good');
    expect(good.body.badRows.map((b: { line: number }) => b.line)).toEqual([3, 5]);
    await owner.post(`/api/screens/${good.body.id}/cancel`);
  });

  let doneId = '';
  it('computes a 10,000-row upload with two worker processes into exactly 10,000 rows', async () => {
    const res = await upload(screenCsv(10_000, 7), 'name=ten-thousand&chunkSize=250');
    expect(res.status).toBe(201);
    expect(res.body.rowCount).toBe(10_000);
    expect(res.body.progress.chunkCount).toBe(40);
    const done = await waitFor(
      () => screenOf(res.body.id),
      (s) => s.status === 'done',
    );
    expect(done.progress.rowsDone).toBe(10_000);
    expect(done.progress.rowsPerSecond).toBeGreaterThan(0);
    expect(await resultCount(res.body.id)).toBe(10_000);
    const byWorker = await t.db.query(
      'SELECT count(DISTINCT worker)::int AS n FROM screen_chunks WHERE screen_id = $1',
      [res.body.id],
    );
    expect(byWorker[0].n).toBe(2);
    doneId = res.body.id;
  }, 90_000);

  // Results are written with binary COPY (screen-results-writer.ts), which has no ON CONFLICT:
  // the killed worker's rows, sent but not committed, must vanish with its transaction.
  it('still ends with exactly 10,000 rows when a worker is killed mid-chunk', async () => {
    const res = await upload(screenCsv(10_000, 8), 'name=kill-test&chunkSize=250');
    expect(res.status).toBe(201);
    await waitFor(
      () => screenOf(res.body.id),
      (s) => s.progress.chunksDone >= 6,
    );
    // Kill the victim while it holds an unfinished chunk (worker ids carry the process id).
    const heldByVictim = async () =>
      (
        await t.db.query(
          `SELECT count(*)::int AS n FROM screen_chunks
            WHERE screen_id = $1 AND status <> 'done' AND worker LIKE '%:' || $2 || ':%'`,
          [res.body.id, String(victim.pid)],
        )
      )[0].n as number;
    const held = await waitFor(heldByVictim, (n) => n > 0, 20_000).catch(() => 0);
    victim.kill('SIGKILL');
    await new Promise((r) =>
      victim.exitCode !== null || victim.signalCode !== null ? r(null) : victim.once('exit', r),
    );
    const done = await waitFor(
      () => screenOf(res.body.id),
      (s) => s.status === 'done',
      60_000,
    );
    expect(done.progress.rowsDone).toBe(10_000);
    expect(await resultCount(res.body.id)).toBe(10_000);
    const distinctRows = await t.db.query(
      'SELECT count(DISTINCT row_number)::int AS n FROM screen_results WHERE screen_id = $1',
      [res.body.id],
    );
    expect(distinctRows[0].n).toBe(10_000);
    // One row per pair: exactly the data lines 2…10,001 of the upload.
    const span = await t.db.query(
      'SELECT min(row_number)::int AS lo, max(row_number)::int AS hi FROM screen_results WHERE screen_id = $1',
      [res.body.id],
    );
    expect(span[0]).toEqual({ lo: 2, hi: 10_001 });
    // The killed worker's chunk was attempted again by the survivor.
    const retried = await t.db.query(
      'SELECT count(*)::int AS n FROM screen_chunks WHERE screen_id = $1 AND attempts > 1',
      [res.body.id],
    );
    if (held > 0) expect(retried[0].n).toBeGreaterThanOrEqual(1);
  }, 120_000);

  it('cancellation stops work and keeps the finished chunks', async () => {
    // Only the survivor is left: one chunk at a time, 100 ms each at least.
    const res = await upload(screenCsv(4_000, 9), 'name=cancel-me&chunkSize=200');
    await waitFor(
      () => screenOf(res.body.id),
      (s) => s.progress.chunksDone >= 2,
    );
    const cancelled = await owner.post(`/api/screens/${res.body.id}/cancel`);
    expect(cancelled.status).toBe(200);
    expect(cancelled.body.status).toBe('cancelled');
    await new Promise((r) => setTimeout(r, 1200));
    const after = await screenOf(res.body.id);
    const rows = await resultCount(res.body.id);
    expect(after.status).toBe('cancelled');
    expect(rows).toBe(after.progress.rowsDone);
    expect(rows).toBeGreaterThan(0);
    expect(rows).toBeLessThan(4_000);
    expect(rows % 200).toBe(0); // whole chunks only
    await new Promise((r) => setTimeout(r, 800));
    expect(await resultCount(res.body.id)).toBe(rows); // no work after the cancel settled
    await stopWorker(survivor);
  }, 60_000);

  it('reuses the results of a finished screen with the same inputs and software version', async () => {
    const res = await upload(screenCsv(10_000, 7), 'name=again&chunkSize=250');
    expect(res.status).toBe(201);
    expect(res.body.status).toBe('done');
    expect(res.body.reusedFrom).toBe(doneId);
    expect(await resultCount(res.body.id)).toBe(10_000);
    const rerun = await owner.post(`/api/screens/${doneId}/run`);
    expect(rerun.body.reused).toBe(true);
  });

  it('sorts, filters, pages and exports the results server-side', async () => {
    const page = await owner.get(
      `/api/screens/${doneId}/results?sort=-log10kCsMarcus&limit=20&offset=0&deltaGCsMax=-0.3&regimeCr=inverted`,
    );
    expect(page.status).toBe(200);
    expect(page.body.items).toHaveLength(20);
    const ks = page.body.items.map((r: { log10kCsMarcus: number }) => r.log10kCsMarcus);
    expect([...ks].sort((x: number, y: number) => y - x)).toEqual(ks);
    for (const r of page.body.items) {
      expect(r.deltaGCs).toBeLessThanOrEqual(-0.3);
      expect(r.regimeCr).toBe('inverted');
    }
    const sql = await t.db.query(
      `SELECT count(*)::int AS n FROM screen_results WHERE screen_id = $1 AND delta_g_cs <= -0.3 AND regime_cr = 'inverted'`,
      [doneId],
    );
    expect(page.body.total).toBe(sql[0].n);

    const csv = await owner.get(
      `/api/screens/${doneId}/results.csv?deltaGCsMax=-0.3&regimeCr=inverted&sort=rowNumber`,
    );
    expect(csv.status).toBe(200);
    const lines = csv.text.trim().split('\n');
    expect(lines).toHaveLength(sql[0].n + 1);
    expect(lines[0]).toMatch(/^line,donor,acceptor/);

    // The coupling regime column (CALC-API.md couplingRegime): γ = π^(3/2)H²/(hν_n(λk_BT)^½)
    // with ν_n = 1e13 s⁻¹ (Newton & Sutin 1984, from memory), computed here independently with
    // CODATA 2018 h and k_B; nonadiabatic γ < 0.1, adiabatic γ > 10.
    const header = lines[0]!.split(',');
    const at = (name: string) => header.indexOf(name);
    expect(at('coupling regime')).toBeGreaterThan(at('regime CR'));
    const regimes = new Set<string>();
    for (const line of lines.slice(1)) {
      const cells = line.split(',');
      const h = Math.abs(Number(cells[at('coupling [eV]')]));
      const lambda = Number(cells[at('lambda [eV]')]);
      const tK = Number(cells[at('temperature [K]')]);
      const gamma =
        (Math.PI ** 1.5 * h * h) /
        (4.135667696e-15 * 1e13 * Math.sqrt(lambda * 8.617333262e-5 * tK));
      if (Math.abs(gamma - 0.1) < 1e-9) continue;
      const expected = gamma < 0.1 ? 'nonadiabatic' : gamma > 10 ? 'adiabatic' : 'intermediate';
      expect(cells[at('coupling regime')]).toBe(expected);
      regimes.add(expected);
    }
    // The invented pairs (10–160 cm⁻¹, λ ≈ 0.6–1 eV) fall on both sides of γ = 0.1.
    expect([...regimes].sort()).toEqual(['intermediate', 'nonadiabatic']);
    for (const r of page.body.items)
      expect(r.couplingRegime).toMatch(/^(non)?adiabatic$|^intermediate$/);

    const bad = await owner.get(`/api/screens/${doneId}/results?sort=colour`);
    expect(bad.status).toBe(400);
  });

  it('ranks by a custom score of result columns; the score records its assumed ħω', async () => {
    expect((await screenOf(doneId)).score.assumedHbarOmegaEv).toBe(0.186);
    const page = await owner.get(
      `/api/screens/${doneId}/results?custom=log10kCsMarcus:1,log10kCrMarcus:-0.5&sort=-custom&limit=30`,
    );
    expect(page.status).toBe(200);
    type Row = {
      rowNumber: number;
      customScore: number;
      log10kCsMarcus: number;
      log10kCrMarcus: number;
    };
    const items = page.body.items as Row[];
    for (const r of items) {
      expect(r.customScore).toBeCloseTo(r.log10kCsMarcus - 0.5 * r.log10kCrMarcus, 9);
    }
    const scores = items.map((r) => r.customScore);
    expect([...scores].sort((x, y) => y - x)).toEqual(scores);
    const best = await t.db.query(
      `SELECT row_number FROM screen_results WHERE screen_id = $1
        ORDER BY log10k_cs_marcus - 0.5 * log10k_cr_marcus DESC NULLS LAST, row_number DESC LIMIT 1`,
      [doneId],
    );
    expect(items[0]!.rowNumber).toBe(best[0].row_number);
    // Without a custom score the rows carry none; bad terms name the field.
    const plain = await owner.get(`/api/screens/${doneId}/results?limit=1`);
    expect(plain.body.items[0]).not.toHaveProperty('customScore');
    for (const bad of ['custom=score:1', 'custom=colour:1', 'custom=deltaGCs:x', 'sort=custom']) {
      const res = await owner.get(`/api/screens/${doneId}/results?${bad}`);
      expect(res.status).toBe(400);
      expect(res.body.error.fields[0].field).toMatch(/^(custom|sort)$/);
    }
    // Rows ranked with the assumed ħω are exactly rows without their own ħω (no MLJ columns).
    const marked = await owner.get(
      `/api/screens/${doneId}/results?warning=assumed-hbar-omega&limit=20`,
    );
    expect(marked.body.total).toBeGreaterThan(0);
    for (const r of marked.body.items) expect(r.log10kCrMlj).toBeNull();
  });

  it('keeps the header units when a row opens as a pair (coupling written in cm⁻¹)', async () => {
    const res = await owner.post(`/api/screens/${doneId}/results/3/open-as-pair`);
    expect(res.status).toBe(201);
    const coupling = res.body.parameters.find((p: { kind: string }) => p.kind === 'coupling');
    expect(coupling.unit).toBe('cm-1');
    const row = (await owner.get(`/api/screens/${doneId}/results?rowNumberMin=3&rowNumberMax=3`))
      .body.items[0];
    expect(coupling.value).toBeCloseTo(row.coupling, 12);
    const distance = res.body.parameters.find((p: { kind: string }) => p.kind === 'distance');
    expect(distance.unit).toBe('A');
  });

  it('opens a result row as a pair with derived, sourced parameters', async () => {
    const res = await owner.post(`/api/screens/${doneId}/results/2/open-as-pair`);
    expect(res.status).toBe(201);
    expect(res.body.donor).toBe('Med-1');
    const dg = res.body.parameters.find((p: { kind: string }) => p.kind === 'deltaG0');
    expect(dg.provenance.kind).toBe('derived');
    expect(dg.provenance.methodId).toBe('drivingForce.rehmWeller');
    expect(dg.provenance.sources).toEqual([{ type: 'screen', id: doneId }]);
    const row = (await owner.get(`/api/screens/${doneId}/results?rowNumberMin=2&rowNumberMax=2`))
      .body.items[0];
    expect(dg.value).toBeCloseTo(row.deltaGCs, 12);
  });

  it('lets viewers read but not write, and hides screens from non-members', async () => {
    const viewer = await registerUser(t.app, 'viewer');
    const stranger = await registerUser(t.app, 'stranger');
    await t.db.query(
      `INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, 'viewer')`,
      [wid, viewer.userId],
    );
    expect((await viewer.get(`/api/screens/${doneId}`)).status).toBe(200);
    expect((await viewer.get(`/api/screens/${doneId}/results`)).status).toBe(200);
    expect((await viewer.post(`/api/screens/${doneId}/cancel`)).status).toBe(403);
    expect((await viewer.post(`/api/screens/${doneId}/results/2/open-as-pair`)).status).toBe(403);
    expect(
      (await viewer.call('post', `/api/workspaces/${wid}/screens`).send({ csv: screenCsv(2) }))
        .status,
    ).toBe(403);
    expect((await stranger.get(`/api/screens/${doneId}`)).status).toBe(404);
    expect((await stranger.get(`/api/screens/${doneId}/results.csv`)).status).toBe(404);
  });
});
