/**
 * Calculations of background work, reports, pair saves and trace analyses run in the
 * worker-thread pool, never on the thread that answers HTTP, and never inside an open database
 * transaction (issue 12):
 * - the in-server screen worker computes a deliberately expensive chunk while health and a pair
 *   read are answered (an ordering assertion: both answer while the chunk is still computing);
 * - while a report's snapshot (Monte Carlo of a soft-mode MLJ rate) computes, and while a pair
 *   update waits for its calculation, no connection is "idle in transaction";
 * - over its budget, report creation answers 422 naming the budget and writes nothing, and a trace
 *   analysis is recorded as failed naming BACKGROUND_CALC_BUDGET_MS;
 * - the core's work limits (Monte Carlo samples × terms, the terms of a whole MLJ fit, series size)
 *   are refused before any work with the field named;
 * - the API description lists 422 and 503 (with Retry-After) on every route that computes.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PairInput, TraceAnalysis } from '@gapwise/contracts';
import { marcusGapMoments } from '@gapwise/traces';
import { startObjectStore, type ObjectStore } from '../../docker-free-scripts/s3/object-store';
import { buildOpenApi, toOpenApiPath } from '../../apps/api/src/docs/openapi';
import { ROUTE_DOCS } from '../../apps/api/src/docs/route-docs';
import { pairBody } from './support/fixtures';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';
import { SCREEN_HEADER } from './screens/screen-csv';
import { traceCsv, uploadTrace } from './traces/trace-files';

async function waitFor(condition: () => boolean | Promise<boolean>, what: string): Promise<void> {
  for (let i = 0; i < 2400; i++) {
    if (await condition()) return;
    await new Promise((r) => setTimeout(r, 25));
  }
  throw new Error(`timed out waiting for ${what}`);
}

/**
 * A pair whose Monte Carlo interval is expensive: MLJ with S = λ_v/ħω = 0.3 eV / 5e-5 eV = 6000
 * (several thousand vibronic terms per rate), ΔG° with a stated 1σ, so the report's 2000 Monte
 * Carlo draws evaluate over 1e7 terms — seconds of one CPU, within the core's work limit of 2e7.
 */
function softModePair(name: string): PairInput {
  const base = pairBody({ name, model: 'mlj' });
  return {
    ...base,
    parameters: [
      ...base.parameters.filter((p) => p.kind !== 'lambdaInner'),
      {
        kind: 'lambdaInner',
        value: 0.3,
        unit: 'eV',
        uncertainty: null,
        provenance: { kind: 'assumed' },
      },
      {
        kind: 'hbarOmega',
        value: 5e-5,
        unit: 'eV',
        uncertainty: null,
        provenance: { kind: 'assumed' },
      },
    ],
  };
}

/** Connections of this database with a transaction open and waiting (none may be). */
async function idleInTransaction(t: TestApp): Promise<number> {
  const rows = await t.db.query(
    `SELECT count(*)::int AS n FROM pg_stat_activity
      WHERE datname = current_database() AND state LIKE 'idle in transaction%'`,
  );
  return rows[0].n as number;
}

/**
 * A screen chunk of `rows` rows whose MLJ rates each need about 5e4 vibronic terms
 * (λ_inner = 0.15 eV, ħω = 3e-6 eV): seconds of computing for the in-server worker.
 */
function softModeScreen(rows: number): string {
  const lines = [SCREEN_HEADER];
  for (let i = 0; i < rows; i++) {
    lines.push(
      `Soft-${i + 1},Soft-${i + 2},0.9,-1.1,2.45,${(7.2 + (i % 40) / 10).toFixed(1)},3.5,3.6,acetonitrile,0.15,50,3e-6,298.15`,
    );
  }
  return `${lines.join('\n')}\n`;
}

describe('with the default pool and the in-server screen worker', () => {
  let t: TestApp;
  let user: Session;
  let wid: string;
  let pairId: string;

  beforeAll(async () => {
    process.env['GAPWISE_SCREEN_WORKER'] = 'true';
    process.env['GAPWISE_TRACE_WORKER'] = 'false';
    t = await startTestApp();
    user = await registerUser(t.app, 'offload');
    wid = (await user.post('/api/workspaces', { name: 'Offload' })).body.id;
    pairId = (await user.post(`/api/workspaces/${wid}/pairs`, softModePair('Soft mode'))).body.id;
  }, 120_000);
  afterAll(async () => t?.close());

  it('answers health and a pair read while the screen worker computes an expensive chunk', async () => {
    const uploaded = await user
      .call('post', `/api/workspaces/${wid}/screens?name=soft-modes&chunkSize=100`)
      .set('Content-Type', 'text/csv')
      .send(softModeScreen(60));
    expect(uploaded.status, JSON.stringify(uploaded.body).slice(0, 600)).toBe(201);
    const screenId = uploaded.body.id as string;
    await waitFor(() => t.runtime.compute.running > 0, 'the screen chunk to start computing');
    const order: string[] = [];
    const health = request(t.app)
      .get('/api/health')
      .then((res) => (order.push('health'), res));
    const pair = user.get(`/api/pairs/${pairId}`).then((res) => (order.push('pair'), res));
    const [h, p] = await Promise.all([health, pair]);
    expect(h.status).toBe(200);
    expect(p.status).toBe(200);
    expect(order.sort()).toEqual(['health', 'pair']);
    // Both answered while the chunk was still computing in its worker thread: no row stored yet.
    expect(t.runtime.compute.running).toBe(1);
    const stored = await t.db.query(
      'SELECT count(*)::int AS n FROM screen_results WHERE screen_id = $1',
      [screenId],
    );
    expect(stored[0].n).toBe(0);
    await waitFor(
      async () => (await user.get(`/api/screens/${screenId}`)).body.status === 'done',
      'the screen to finish',
    );
    const done = await t.db.query(
      'SELECT count(*)::int AS n FROM screen_results WHERE screen_id = $1',
      [screenId],
    );
    expect(done[0].n).toBe(60);
  }, 120_000);

  it('holds no transaction open while a report snapshot computes its Monte Carlo intervals', async () => {
    const created = user.post(`/api/workspaces/${wid}/reports`, { pairId }).then((res) => res);
    await waitFor(() => t.runtime.compute.running > 0, 'the snapshot to start computing');
    expect(await idleInTransaction(t)).toBe(0);
    expect(t.runtime.compute.running).toBe(1);
    const res = await created;
    expect(res.status).toBe(201);
    const mlj = res.body.snapshot.pairs[0].results.find(
      (r: { model: string }) => r.model === 'mlj',
    );
    expect(mlj.interval.samples).toBe(2000);
  }, 120_000);
});

describe('work limits of the core, refused before any work with the field named', () => {
  let t: TestApp;
  let user: Session;
  let wid: string;

  beforeAll(async () => {
    process.env['GAPWISE_SCREEN_WORKER'] = 'false';
    process.env['GAPWISE_TRACE_WORKER'] = 'false';
    // A larger body limit, so the fit's own limit on points is what answers.
    t = await startTestApp({}, { JSON_BODY_LIMIT: '4mb' });
    user = await registerUser(t.app, 'limits');
    wid = (await user.post('/api/workspaces', { name: 'Limits' })).body.id;
  }, 120_000);
  afterAll(async () => t?.close());

  const fields = (res: request.Response) =>
    (res.body.errors ?? res.body.error?.fields ?? []) as Array<{ field: string; message: string }>;

  it('Monte Carlo: samples × vibronic terms over the limit answers 400 naming samples', async () => {
    // S = λ_v/ħω = 5e4: some 5e4 terms a draw, so 2000 draws need about 1e8 > 2e7 terms.
    const res = await user.post('/api/calc', {
      method: 'uncertainty.monteCarlo',
      inputs: {
        method: 'rate.mlj',
        inputs: {
          deltaG0: { value: -0.5, sigma: 0.05 },
          lambdaSolvent: 0.3,
          lambdaVib: 0.5,
          hbarOmega: 1e-5,
          coupling: 0.01,
          temperature: 298.15,
        },
        samples: 2000,
        seed: 1,
      },
    });
    expect(res.status).toBe(400);
    const samples = fields(res).find((f) => f.field === 'samples');
    expect(samples?.message).toMatch(/work limit/);
    expect(t.runtime.compute.running).toBe(0);
  });

  it('MLJ fit: a mode whose terms per rate fit one rate but not a whole fit answers 400 naming ħω', async () => {
    // S = 1 eV / 2e-4 eV = 5000 terms per rate (under the 1e5 of one rate), but a 4-point fit
    // evaluates 3 starts × 300 iterations × 5 × 4 rates: 1.8e4 × 5000 = 9e7 > 2e7 terms.
    const series = await user.post(`/api/workspaces/${wid}/series`, {
      name: 'soft whole fit',
      temperature: 298.15,
      points: [-0.2, -0.5, -0.8, -1.1].map((deltaG0, i) => ({
        label: `P${i}`,
        deltaG0,
        log10k: 8 + i * 0.5,
      })),
    });
    expect(series.status).toBe(201);
    const fit = await user.post(`/api/series/${series.body.id}/fit`, {
      model: 'mlj',
      hbarOmega: 2e-4,
      lambdaVib: 1,
    });
    expect(fit.status).toBe(400);
    expect(fields(fit).map((f) => f.field)).toContain('mlj.hbarOmega');
  });

  it('series size: more points than a fit takes answers 400 naming points', async () => {
    const points = Array.from({ length: 10_001 }, (_, i) => ({
      deltaG0: { value: -0.1 - i * 1e-4, unit: 'eV' },
      k: 1e8,
    }));
    const res = await user.post('/api/calc', {
      method: 'fit.drivingForceSeries',
      inputs: { points, temperature: 298.15 },
    });
    expect(res.status).toBe(400);
    expect(fields(res).map((f) => f.field)).toContain('points');
    const stored = await user.post(`/api/workspaces/${wid}/series`, {
      name: 'too many',
      temperature: 298.15,
      points: Array.from({ length: 2001 }, (_, i) => ({
        label: `P${i}`,
        deltaG0: -0.1 - i * 1e-4,
        log10k: 8,
      })),
    });
    expect(stored.status).toBe(400);
    expect(fields(stored).map((f) => f.field)).toContain('points');
  });
});

describe('with one calculation thread', () => {
  let t: TestApp;
  let user: Session;
  let wid: string;

  beforeAll(async () => {
    process.env['GAPWISE_SCREEN_WORKER'] = 'false';
    process.env['GAPWISE_TRACE_WORKER'] = 'false';
    t = await startTestApp({}, { CALC_THREADS: '1', CALC_QUEUE: '4' });
    user = await registerUser(t.app, 'one-thread');
    wid = (await user.post('/api/workspaces', { name: 'One thread' })).body.id;
  }, 120_000);
  afterAll(async () => t?.close());

  it('computes a pair update before its transaction: none is open while the update waits for the pool', async () => {
    const pair = (await user.post(`/api/workspaces/${wid}/pairs`, pairBody())).body;
    // The one thread computes a report snapshot; the update waits for its calculation.
    const soft = (await user.post(`/api/workspaces/${wid}/pairs`, softModePair('Busy'))).body;
    const report = user
      .post(`/api/workspaces/${wid}/reports`, { pairId: soft.id })
      .then((res) => res);
    await waitFor(() => t.runtime.compute.running > 0, 'the snapshot to start computing');
    const update = user
      .put(`/api/pairs/${pair.id}`, { ...pairBody({ name: 'Renamed' }), version: pair.version })
      .then((res) => res);
    await waitFor(() => t.runtime.compute.queued > 0, 'the update to wait for the pool');
    expect(await idleInTransaction(t)).toBe(0);
    expect((await user.get(`/api/pairs/${pair.id}`)).body.version).toBe(pair.version);
    const [r, u] = await Promise.all([report, update]);
    expect(r.status).toBe(201);
    expect(u.status).toBe(200);
    expect(u.body.name).toBe('Renamed');
    expect(u.body.version).toBe(pair.version + 1);
  }, 120_000);

  it('refuses a stale pair update with 409 after computing, and writes nothing', async () => {
    const pair = (await user.post(`/api/workspaces/${wid}/pairs`, pairBody())).body;
    const first = await user.put(`/api/pairs/${pair.id}`, {
      ...pairBody({ name: 'First' }),
      version: pair.version,
    });
    expect(first.status).toBe(200);
    const stale = await user.put(`/api/pairs/${pair.id}`, {
      ...pairBody({ name: 'Stale' }),
      version: pair.version,
    });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version-conflict');
    expect((await user.get(`/api/pairs/${pair.id}`)).body.name).toBe('First');
  });
});

describe('with two calculation threads', () => {
  let t: TestApp;
  let user: Session;
  let wid: string;

  beforeAll(async () => {
    process.env['GAPWISE_SCREEN_WORKER'] = 'false';
    process.env['GAPWISE_TRACE_WORKER'] = 'false';
    t = await startTestApp({}, { CALC_THREADS: '2' });
    user = await registerUser(t.app, 'two-threads');
    wid = (await user.post('/api/workspaces', { name: 'Two threads' })).body.id;
  }, 120_000);
  afterAll(async () => t?.close());

  it('refuses a report with 409 when its pair was saved while the snapshot computed, writing nothing', async () => {
    const soft = (await user.post(`/api/workspaces/${wid}/pairs`, softModePair('Moving'))).body;
    const report = user
      .post(`/api/workspaces/${wid}/reports`, { pairId: soft.id })
      .then((res) => res);
    await waitFor(() => t.runtime.compute.running > 0, 'the snapshot to start computing');
    // The other thread computes the save at once; the snapshot is still computing.
    const saved = await user.patch(`/api/pairs/${soft.id}`, { notes: 'moved on', version: 1 });
    expect(saved.status).toBe(200);
    expect(saved.body.version).toBe(2);
    const res = await report;
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('pair-changed');
    expect(res.body.error.message).toMatch(/Moving/);
    const reports = await t.db.query(
      'SELECT count(*)::int AS n FROM reports WHERE workspace_id = $1',
      [wid],
    );
    expect(reports[0].n).toBe(0);
  }, 120_000);
});

describe('with budgets of 0.3 s (interactive) and 10 ms (background)', () => {
  let t: TestApp;
  let user: Session;
  let wid: string;
  let s3: ObjectStore;
  let s3dir: string;

  beforeAll(async () => {
    s3dir = await mkdtemp(join(tmpdir(), 'gapwise-offload-s3-'));
    s3 = await startObjectStore({ port: 0, directory: s3dir });
    process.env['S3_ENDPOINT'] = s3.endpoint;
    process.env['GAPWISE_SCREEN_WORKER'] = 'false';
    // The runtime's own trace worker, running each analysis in the pool.
    process.env['GAPWISE_TRACE_WORKER'] = 'true';
    t = await startTestApp({}, { CALC_BUDGET_MS: '300', BACKGROUND_CALC_BUDGET_MS: '10' });
    user = await registerUser(t.app, 'budgets');
    wid = (await user.post('/api/workspaces', { name: 'Budgets' })).body.id;
  }, 120_000);
  afterAll(async () => {
    await t?.close();
    await s3?.stop();
    await rm(s3dir, { recursive: true, force: true });
  });

  it('refuses a report whose snapshot runs over budget with 422 naming it, and writes nothing', async () => {
    const pair = await user.post(`/api/workspaces/${wid}/pairs`, softModePair('Over budget'));
    expect(pair.status).toBe(201);
    const res = await user.post(`/api/workspaces/${wid}/reports`, { pairId: pair.body.id });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('calculation-over-budget');
    expect(res.body.error.message).toMatch(/budget of 0\.3 s/);
    expect(res.body.error.message).toMatch(/fewer pairs/);
    expect(res.body.error.message).toMatch(/CALC_BUDGET_MS/);
    const reports = await t.db.query(
      'SELECT count(*)::int AS n FROM reports WHERE workspace_id = $1',
      [wid],
    );
    expect(reports[0].n).toBe(0);
  }, 60_000);

  it('records a trace analysis over its background budget as failed, naming the budget', async () => {
    const m = marcusGapMoments(0.5, -0.2, 300);
    const csv = (meanEv: number, seed: string) =>
      traceCsv({ count: 200_000, meanEv, sdEv: m.sdEv, seed });
    const r = await uploadTrace(user, wid, csv(m.reactantMeanEv, 'budget-R'), {
      state: 'reactant',
      unit: 'eV',
    }).expect(201);
    const p = await uploadTrace(user, wid, csv(m.productMeanEv, 'budget-P'), {
      state: 'product',
      unit: 'eV',
    }).expect(201);
    const queued = await user
      .post(`/api/workspaces/${wid}/trace-analyses`, {
        reactantTraceId: r.body.id,
        productTraceId: p.body.id,
        temperature: 300,
      })
      .expect(202);
    let analysis: TraceAnalysis = queued.body;
    await waitFor(async () => {
      analysis = (await user.get(`/api/trace-analyses/${queued.body.id}`)).body;
      return analysis.status === 'failed' || analysis.status === 'done';
    }, 'the analysis to finish');
    expect(analysis.status).toBe('failed');
    const message = JSON.stringify(analysis);
    expect(message).toMatch(/budget of 0\.01 s/);
    expect(message).toMatch(/BACKGROUND_CALC_BUDGET_MS/);
  }, 120_000);
});

describe('the API description', () => {
  /** Every route whose handler runs a calculation in the pool (deps.compute in its routes file). */
  const COMPUTING = [
    'post /calc',
    'post /pairs/:id/compute',
    'post /workspaces/:wid/pairs',
    'put /pairs/:id',
    'patch /pairs/:id',
    'post /pairs/:id/archive',
    'post /pairs/:id/duplicate',
    'post /series/:id/fit',
    'post /series/:id/apply',
    'post /electrode-cases/:id/fit',
    'post /electrode-cases/:id/apply-fit',
    'post /screens/:id/results/:row/open-as-pair',
    'post /trace-analyses/:id/attach',
    'post /workspaces/:wid/reports',
    'post /reports/:id/revise',
    'get /reports/:id/pdf',
  ].sort();

  it('documents 422 calculation-over-budget and 503 calculation-pool-busy with Retry-After on every computing route', () => {
    const flagged = ROUTE_DOCS.filter((r) => r.compute)
      .map((r) => `${r.method} ${r.path}`)
      .sort();
    expect(flagged).toEqual(COMPUTING);
    const spec = buildOpenApi('test') as {
      paths: Record<string, Record<string, { responses: Record<string, any> }>>;
    };
    for (const route of COMPUTING) {
      const [method, path] = route.split(' ');
      const responses = spec.paths[toOpenApiPath(path)][method].responses;
      expect(responses['422']?.description, route).toMatch(/calculation-over-budget/);
      expect(responses['503']?.description, route).toMatch(/calculation-pool-busy/);
      expect(responses['503'].headers['Retry-After'].schema.type, route).toBe('integer');
    }
  });
});
