import { randomBytes } from 'node:crypto';
import { editors, members, type CaseContext, type MatrixRow } from './matrix-types';

// The matrix compares table fingerprints around denied writes: no trace worker may change
// `trace_analyses` in the background meanwhile (this module is loaded before the app starts).
process.env['GAPWISE_TRACE_WORKER'] = 'false';

/** A trace row of the case's workspace (its object need not exist for these requests). */
async function trace(c: CaseContext, state: 'reactant' | 'product'): Promise<string> {
  const sha = randomBytes(32).toString('hex');
  const [row] = await c.t.db.query(
    `INSERT INTO traces (workspace_id, state, file_name, size_bytes, sha256, object_key, gzip, unit, column_index,
       delimiter, skip_bad_lines, sample_count, line_count, skipped_line_count, min_ev, max_ev, mean_ev, uploaded_by)
     VALUES ($1, $2, $3, 100, $4, $5, false, 'eV', 1, 'whitespace', false, 20, 20, 0, 0.1, 0.9, 0.5, $6) RETURNING id`,
    [c.workspaceId, state, `${c.unique(state)}.csv`, sha, `traces/sha256/${sha}`, c.users.owner.id],
  );
  return row.id;
}

/** A finished analysis of two fresh traces, with a minimal result (λ = 0.6, ΔG° = −0.3 eV). */
async function doneAnalysis(c: CaseContext): Promise<string> {
  const r = await trace(c, 'reactant');
  const p = await trace(c, 'product');
  const source = (id: string) => ({
    traceId: id,
    fileName: 'x.csv',
    sha256: '0'.repeat(64),
    sizeBytes: 100,
    unit: 'eV',
    columnIndex: 1,
    columnName: null,
    sampleCount: 20,
    skippedLineCount: 0,
  });
  const result = {
    method: 'reorg.gapSamples',
    temperatureK: 300,
    sources: { reactant: source(r), product: source(p) },
    outputs: {
      lambdaFromMeans: 0.6,
      deltaG0FromMeans: -0.3,
      standardErrors: { lambdaFromMeans: 0.01, deltaG0FromMeans: 0.01 },
    },
    warnings: [],
  };
  const [row] = await c.t.db.query(
    `INSERT INTO trace_analyses (workspace_id, reactant_trace_id, product_trace_id, temperature_k, status, progress, result, attempts, created_by, finished_at)
     VALUES ($1, $2, $3, 300, 'done', 1, $4, 1, $5, now()) RETURNING id`,
    [c.workspaceId, r, p, JSON.stringify(result), c.users.owner.id],
  );
  return row.id;
}

/** Matrix rows of the energy-gap trace API. */
export const rows: MatrixRow[] = [
  {
    // The role is checked before the body is read: editors get 400 for a JSON (not multipart) body.
    method: 'post',
    route: '/workspaces/:wid/traces',
    request: (c) => ({
      path: `/workspaces/${c.workspaceId}/traces`,
      body: { state: 'reactant', unit: 'eV' },
    }),
    expect: editors(400),
  },
  {
    method: 'get',
    route: '/workspaces/:wid/traces',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/traces` }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/traces/:id',
    request: async (c) => ({ path: `/traces/${await trace(c, 'reactant')}` }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/workspaces/:wid/trace-analyses',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/trace-analyses` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/workspaces/:wid/trace-analyses',
    request: async (c) => ({
      path: `/workspaces/${c.workspaceId}/trace-analyses`,
      body: {
        reactantTraceId: await trace(c, 'reactant'),
        productTraceId: await trace(c, 'product'),
        temperature: 300,
      },
    }),
    expect: editors(202),
  },
  {
    method: 'get',
    route: '/trace-analyses/:id',
    request: async (c) => ({ path: `/trace-analyses/${await doneAnalysis(c)}` }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/trace-analyses/:id/events',
    request: async (c) => ({ path: `/trace-analyses/${await doneAnalysis(c)}/events` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/trace-analyses/:id/attach',
    request: async (c) => ({
      path: `/trace-analyses/${await doneAnalysis(c)}/attach`,
      body: { pairId: c.pairId, parameters: ['lambda', 'deltaG0'] },
    }),
    expect: editors(200),
  },
];
