/**
 * Trace analyses as background jobs against the real PostgreSQL, pg-boss and the S3 fake:
 * progress over server-sent events, a job whose worker is stopped (or abandons it, as a killed
 * process would) completes after a restart with exactly one result, and attaching λ/ΔG° to a pair
 * writes derived provenance pointing at the analysis and both traces. Expected λ and ΔG° are the
 * known parameters of the seeded synthetic samples.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Pair, Trace, TraceAnalysis } from '@gapwise/contracts';
import { startObjectStore, type ObjectStore } from '../../../docker-free-scripts/s3/object-store';
import { provideTraceServices } from '../../../apps/api/src/traces/routes';
import { marcusGapMoments } from '@gapwise/traces';
import type { TraceServices } from '../../../apps/api/src/traces/trace-services';
import { startTraceServices } from '../../../apps/api/src/traces/trace-services';
import { pairBody } from '../support/fixtures';
import { registerUser, startTestApp, type Session, type TestApp } from '../support/test-app';
import { traceCsv, uploadTrace } from './trace-files';

const T = 300;
const LAMBDA = 0.5;
const DG0 = -0.2;
const m = marcusGapMoments(LAMBDA, DG0, T);

let t: TestApp;
let s3: ObjectStore;
let s3dir: string;
let services: TraceServices;
let owner: Session;
let viewer: Session;
let wid: string;
let reactant: Trace;
let product: Trace;

async function waitFor<V>(
  read: () => Promise<V>,
  done: (v: V) => boolean,
  timeoutMs = 60_000,
): Promise<V> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const v = await read();
    if (done(v)) return v;
    if (Date.now() > end)
      throw new Error(`timed out; last value ${JSON.stringify(v).slice(0, 300)}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

const analysisOf = async (id: string) =>
  (await owner.get(`/api/trace-analyses/${id}`).expect(200)).body as TraceAnalysis;

beforeAll(async () => {
  s3dir = await mkdtemp(join(tmpdir(), 'gapwise-trace-jobs-s3-'));
  s3 = await startObjectStore({ port: 0, directory: s3dir });
  process.env['S3_ENDPOINT'] = s3.endpoint;
  // The runtime's own trace services run no worker: this file starts and stops workers itself.
  process.env['GAPWISE_TRACE_WORKER'] = 'false';
  t = await startTestApp();
  services = await startTraceServices(t.db, {
    connectionString: t.config.databaseUrl,
    store: {
      endpoint: s3.endpoint,
      region: s3.region,
      bucket: s3.bucket,
      accessKeyId: 'S3RVER',
      secretAccessKey: 'S3RVER',
    },
    runWorker: false,
    // The server's pool: each analysis runs in a worker thread, its files streamed to it.
    compute: t.runtime.compute,
    queueOptions: { expireInSeconds: 3, retryLimit: 4, retryDelaySeconds: 1 },
    maintenanceIntervalSeconds: 1,
  });
  provideTraceServices(t.runtime, services);
  owner = await registerUser(t.app, 'owner');
  viewer = await registerUser(t.app, 'viewer');
  wid = (await owner.post('/api/workspaces', { name: 'Jobs lab' }).expect(201)).body.id;
  await t.db.query('INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, $3)', [
    wid,
    viewer.userId,
    'viewer',
  ]);
  const r = traceCsv({ count: 60_000, meanEv: m.reactantMeanEv, sdEv: m.sdEv, seed: 'jobs-R' });
  const p = traceCsv({ count: 60_000, meanEv: m.productMeanEv, sdEv: m.sdEv, seed: 'jobs-P' });
  reactant = (
    await uploadTrace(owner, wid, r, { state: 'reactant', unit: 'eV' }, 'R.csv').expect(201)
  ).body;
  product = (
    await uploadTrace(owner, wid, p, { state: 'product', unit: 'eV' }, 'P.csv').expect(201)
  ).body;
});

afterAll(async () => {
  await services?.stop();
  await t?.close();
  await s3?.stop();
  await rm(s3dir, { recursive: true, force: true });
});

const start = (temperature = T) =>
  owner.post(`/api/workspaces/${wid}/trace-analyses`, {
    reactantTraceId: reactant.id,
    productTraceId: product.id,
    temperature,
  });

describe('trace analysis jobs', () => {
  it('runs a queued analysis, streams progress as server-sent events, and stores the result', async () => {
    const queued = (await start().expect(202)).body as TraceAnalysis;
    expect(queued.status).toBe('queued');
    const worker = services.startWorker({ progressEveryMs: 20, chunkDelayMs: 5 });
    try {
      const events = await owner
        .get(`/api/trace-analyses/${queued.id}/events`)
        .buffer(true)
        .parse((res, cb) => {
          let text = '';
          res.on('data', (c: Buffer) => (text += c.toString()));
          res.on('end', () => cb(null, text));
        });
      expect(events.headers['content-type']).toMatch(/text\/event-stream/);
      const body = events.body as string;
      // A fast worker may finish between two progress polls, so "running" need not be seen.
      expect(body).toMatch(/event: progress\ndata: \{[^\n]*"status":"(running|done)"/);
      expect(body.trim().split('\n\n').at(-1)).toMatch(/^event: done/);
      const done = await analysisOf(queued.id);
      expect(done).toMatchObject({ status: 'done', progress: 1, attempts: 1 });
      const out = done.result!.outputs;
      expect(Math.abs(out.lambdaFromMeans - LAMBDA)).toBeLessThan(
        4 * out.standardErrors.lambdaFromMeans,
      );
      expect(Math.abs(out.deltaG0FromMeans - DG0)).toBeLessThan(
        4 * out.standardErrors.deltaG0FromMeans,
      );
      expect(done.result!.sources.reactant).toMatchObject({
        traceId: reactant.id,
        sha256: reactant.sha256,
        sampleCount: 60_000,
      });
      // Readers see it too; the list carries no results.
      await viewer.get(`/api/trace-analyses/${queued.id}`).expect(200);
      const list = await viewer.get(`/api/workspaces/${wid}/trace-analyses`).expect(200);
      expect(list.body[0]).toMatchObject({ id: queued.id, status: 'done', result: null });
    } finally {
      await worker.stop();
      services.worker = null;
    }
  });

  it.each(['handBack', 'abandon'] as const)(
    'completes a job interrupted by stopping the worker (%s) after a restart, with exactly one result',
    async (mode) => {
      const queued = (await start().expect(202)).body as TraceAnalysis;
      let first = services.startWorker({ progressEveryMs: 20, chunkDelayMs: 40 });
      await waitFor(
        () => analysisOf(queued.id),
        (a) => a.status === 'running' && a.progress > 0.05,
      );
      await first.stop(mode);
      services.worker = null;
      const interrupted = await analysisOf(queued.id);
      expect(interrupted.status).toBe('running');
      expect(interrupted.result).toBeNull();
      first = services.startWorker({ progressEveryMs: 50 });
      try {
        const done = await waitFor(
          () => analysisOf(queued.id),
          (a) => a.status === 'done',
        );
        expect(done.attempts).toBe(2);
        expect(done.result!.sources.reactant.sampleCount).toBe(60_000);
        expect(done.result!.sources.product.sampleCount).toBe(60_000);
        const rows = await t.db.query(
          'SELECT count(*)::int AS n FROM trace_analyses WHERE id = $1 AND result IS NOT NULL',
          [queued.id],
        );
        expect(rows[0].n).toBe(1);
        // The job is finished in pg-boss and not run again.
        await new Promise((r) => setTimeout(r, 1500));
        expect((await analysisOf(queued.id)).attempts).toBe(2);
      } finally {
        await first.stop();
        services.worker = null;
      }
    },
  );

  it('marks an analysis failed, with the message, when the estimator refuses (files swapped: λ ≤ 0)', async () => {
    const low = traceCsv({ count: 500, meanEv: m.productMeanEv, sdEv: m.sdEv, seed: 'sw-R' });
    const high = traceCsv({ count: 500, meanEv: m.reactantMeanEv, sdEv: m.sdEv, seed: 'sw-P' });
    const r = (await uploadTrace(owner, wid, low, { state: 'reactant', unit: 'eV' }).expect(201))
      .body as Trace;
    const p = (await uploadTrace(owner, wid, high, { state: 'product', unit: 'eV' }).expect(201))
      .body as Trace;
    const queued = (
      await owner
        .post(`/api/workspaces/${wid}/trace-analyses`, {
          reactantTraceId: r.id,
          productTraceId: p.id,
          temperature: T,
        })
        .expect(202)
    ).body;
    const worker = services.startWorker();
    try {
      const failed = await waitFor(
        () => analysisOf(queued.id),
        (a) => a.status === 'failed',
      );
      expect(failed.result).toBeNull();
      expect(failed.error![0].message).toMatch(/^Negative λ from means: check the sign convention/);
      expect(failed.attempts).toBe(1);
    } finally {
      await worker.stop();
      services.worker = null;
    }
  });

  it('checks the analysis request: states, temperature, role', async () => {
    const swapped = (
      await owner
        .post(`/api/workspaces/${wid}/trace-analyses`, {
          reactantTraceId: product.id,
          productTraceId: reactant.id,
          temperature: T,
        })
        .expect(400)
    ).body;
    expect(swapped.error.fields.map((f: { field: string }) => f.field)).toEqual([
      'reactantTraceId',
      'productTraceId',
    ]);
    const bad = await owner
      .post(`/api/workspaces/${wid}/trace-analyses`, {
        reactantTraceId: reactant.id,
        productTraceId: product.id,
        temperature: -5,
      })
      .expect(400);
    expect(bad.body.error.fields[0].message).toMatch(/Temperature must be > 0 K/);
    await viewer
      .post(`/api/workspaces/${wid}/trace-analyses`, {
        reactantTraceId: reactant.id,
        productTraceId: product.id,
        temperature: T,
      })
      .expect(403);
  });

  it('attaches λ and ΔG° to a pair as derived parameters pointing at the analysis (new version, audit event)', async () => {
    const [analysis] = (
      (await owner.get(`/api/workspaces/${wid}/trace-analyses`).expect(200)).body as TraceAnalysis[]
    ).filter((a) => a.status === 'done');
    const full = await analysisOf(analysis.id);
    const pair = (
      await owner.post(`/api/workspaces/${wid}/pairs`, pairBody({ name: 'Gap pair' })).expect(201)
    ).body as Pair;
    await viewer
      .post(`/api/trace-analyses/${analysis.id}/attach`, {
        pairId: pair.id,
        parameters: ['lambda'],
      })
      .expect(403);
    const bad = await owner
      .post(`/api/trace-analyses/${analysis.id}/attach`, { pairId: pair.id, parameters: ['kappa'] })
      .expect(400);
    expect(bad.body.error.fields[0].field).toBe('parameters');
    const res = await owner
      .post(`/api/trace-analyses/${analysis.id}/attach`, {
        pairId: pair.id,
        parameters: ['lambda', 'deltaG0'],
        version: pair.version,
      })
      .expect(200);
    const updated = res.body as Pair;
    expect(updated.version).toBe(pair.version + 1);
    const out = full.result!.outputs;
    const lambda = updated.parameters.find((p) => p.kind === 'lambdaOuter')!;
    expect(lambda).toMatchObject({
      value: out.lambdaFromMeans,
      unit: 'eV',
      uncertainty: out.standardErrors.lambdaFromMeans,
    });
    expect(lambda.provenance).toMatchObject({
      kind: 'derived',
      methodId: 'reorg.gapSamples',
      sources: [
        { type: 'trace-analysis', id: analysis.id },
        { type: 'trace', id: reactant.id },
        { type: 'trace', id: product.id },
      ],
    });
    expect(lambda.provenance.methodInputs).toMatchObject({
      temperature: T,
      reactantSha256: reactant.sha256,
      productSha256: product.sha256,
    });
    const dg = updated.parameters.find((p) => p.kind === 'deltaG0')!;
    expect(dg.value).toBe(out.deltaG0FromMeans);
    expect(dg.provenance.sources?.[0]).toEqual({ type: 'trace-analysis', id: analysis.id });
    // The stored pair, its history and the audit trail say the same.
    const stored = (await viewer.get(`/api/pairs/${pair.id}`).expect(200)).body as Pair;
    expect(
      stored.parameters.find((p) => p.kind === 'lambdaOuter')!.provenance.sources?.[0].id,
    ).toBe(analysis.id);
    const versions = (await owner.get(`/api/pairs/${pair.id}/versions`).expect(200)).body;
    expect(versions[0].summary).toMatch(/from trace analysis/);
    const audit = (await owner.get(`/api/workspaces/${wid}/audit`).expect(200)).body
      .items as Array<{ action: string; entityId: string }>;
    expect(audit.some((e) => e.action === 'pair.updated' && e.entityId === pair.id)).toBe(true);
    // A stale version is refused with 409 and changes nothing.
    await owner
      .post(`/api/trace-analyses/${analysis.id}/attach`, {
        pairId: pair.id,
        parameters: ['lambda'],
        version: pair.version,
      })
      .expect(409);
  });

  it('hides analyses and traces from non-members (404) and needs sign-in', async () => {
    const stranger = await registerUser(t.app, 'stranger');
    const [analysis] = (await owner.get(`/api/workspaces/${wid}/trace-analyses`).expect(200))
      .body as TraceAnalysis[];
    await stranger.get(`/api/trace-analyses/${analysis.id}`).expect(404);
    await stranger.get(`/api/trace-analyses/${analysis.id}/events`).expect(404);
    await stranger.get(`/api/traces/${reactant.id}`).expect(404);
    await stranger
      .post(`/api/trace-analyses/${analysis.id}/attach`, {
        pairId: reactant.id,
        parameters: ['lambda'],
      })
      .expect(404);
    await request(t.app).get(`/api/trace-analyses/${analysis.id}`).expect(401);
  });
});
