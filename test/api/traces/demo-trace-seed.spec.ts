/**
 * The demo seed's traces against the real PostgreSQL and the S3 fake: both committed demo files
 * are ingested into object storage in the demo lab with a finished analysis whose λ and ΔG° are
 * the generator's known parameters (db/seed/traces/generate.ts: λ = 0.62 eV, ΔG° = −0.35 eV at
 * 300 K); a second run adds nothing; a store that lost the objects gets them back.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_LAB, DEMO_PASSWORD, seedDemo } from '../../../apps/api/src/seed/demo-data';
import type { TraceAnalysis } from '@gapwise/contracts';
import { startObjectStore, type ObjectStore } from '../../../docker-free-scripts/s3/object-store';
import { DEMO_TRACE_FILES, seedDemoTraces } from '../../../apps/api/src/traces/demo-trace-seed';
import { TraceObjectStore } from '../../../apps/api/src/traces/trace-object-store';
import { signIn, startTestApp, type TestApp } from '../support/test-app';

const LAMBDA = 0.62;
const DG0 = -0.35;

let t: TestApp;
let s3: ObjectStore;
let s3dir: string;
let store: TraceObjectStore;
const options = { labName: DEMO_LAB, editorEmail: 'editor@gapwise.test' };

beforeAll(async () => {
  s3dir = await mkdtemp(join(tmpdir(), 'gapwise-demo-traces-s3-'));
  s3 = await startObjectStore({ port: 0, directory: s3dir });
  process.env['S3_ENDPOINT'] = s3.endpoint;
  process.env['GAPWISE_TRACE_WORKER'] = 'false';
  t = await startTestApp();
  await seedDemo(t.db, { bcryptCost: 4 });
  store = new TraceObjectStore({
    endpoint: s3.endpoint,
    region: s3.region,
    bucket: s3.bucket,
    accessKeyId: 'S3RVER',
    secretAccessKey: 'S3RVER',
    forcePathStyle: true,
  });
});

afterAll(async () => {
  store?.destroy();
  await t?.close();
  await s3?.stop();
  await rm(s3dir, { recursive: true, force: true });
});

const count = async (table: string) =>
  Number((await t.db.query(`SELECT count(*)::int AS n FROM ${table}`))[0].n);

describe('demo trace seed', () => {
  it('ingests both demo files and finishes their analysis with the known λ and ΔG°', async () => {
    const report = await seedDemoTraces(t.db, store, options);
    expect(report.traces).toBe(2);
    expect(report.analysis).toBe(true);

    const viewer = await signIn(t.app, 'viewer@gapwise.test', DEMO_PASSWORD);
    const lab = (await viewer.get('/api/workspaces').expect(200)).body.find(
      (w: { name: string }) => w.name === DEMO_LAB,
    );
    const traces = (await viewer.get(`/api/workspaces/${lab.id}/traces`).expect(200))
      .body as Array<{
      state: string;
      fileName: string;
      sha256: string;
      sampleCount: number;
    }>;
    expect(traces.map((x) => x.fileName).sort()).toEqual([
      'demo-dyad-product.csv',
      'demo-dyad-reactant.csv',
    ]);
    for (const trace of traces) {
      const path = DEMO_TRACE_FILES[trace.state as 'reactant' | 'product'];
      expect(trace.sha256).toBe(createHash('sha256').update(readFileSync(path)).digest('hex'));
      expect(trace.sampleCount).toBe(6000);
      expect(await store.exists(`traces/sha256/${trace.sha256}`)).toBe(true);
    }

    const analysis = (await viewer.get(`/api/trace-analyses/${report.analysisId}`).expect(200))
      .body as TraceAnalysis;
    expect(analysis.status).toBe('done');
    const o = analysis.result!.outputs as {
      lambdaFromMeans: number;
      deltaG0FromMeans: number;
      standardErrors: { lambdaFromMeans: number };
    };
    const se = o.standardErrors.lambdaFromMeans;
    expect(se).toBeGreaterThan(0);
    expect(Math.abs(o.lambdaFromMeans - LAMBDA)).toBeLessThan(4 * se);
    expect(Math.abs(o.deltaG0FromMeans - DG0)).toBeLessThan(4 * se);
    expect(analysis.result!.sources.reactant.unit).toBe('kcal/mol');
  });

  it('adds nothing the second time', async () => {
    const before = { traces: await count('traces'), analyses: await count('trace_analyses') };
    expect(await seedDemoTraces(t.db, store, options)).toEqual({
      traces: 0,
      analysis: false,
      analysisId: null,
    });
    expect({ traces: await count('traces'), analyses: await count('trace_analyses') }).toEqual(
      before,
    );
  });

  it('puts the objects back when the store lost them, without new rows', async () => {
    const keys = (await t.db.query('SELECT object_key FROM traces')) as Array<{
      object_key: string;
    }>;
    for (const { object_key } of keys) await store.delete(object_key);
    for (const { object_key } of keys) expect(await store.exists(object_key)).toBe(false);
    const before = await count('traces');
    await seedDemoTraces(t.db, store, options);
    for (const { object_key } of keys) expect(await store.exists(object_key)).toBe(true);
    expect(await count('traces')).toBe(before);
  });
});
