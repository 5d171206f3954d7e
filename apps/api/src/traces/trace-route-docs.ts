/** OpenAPI rows and schemas of the trace routes (spread into ROUTE_DOCS and the schemas). */
import { TRACE_ANALYSIS_STATUSES, TRACE_FILE_UNITS, TRACE_STATES } from '@gapwise/contracts';
import type { RouteDoc } from '../docs/route-docs';
import { bool, int, nullable, num, obj, str, type Schema } from '../docs/schema';

const member = 'any member of the workspace (non-members get 404)';
const editor = 'owner or editor (reviewer, viewer: 403; non-members: 404)';

export const TRACE_ROUTE_DOCS: readonly RouteDoc[] = [
  {
    method: 'post',
    path: '/workspaces/:wid/traces',
    tag: 'traces',
    summary:
      "Upload one energy-gap trace as multipart/form-data: fields state, unit, column (name or 1-based index; default the last), skipBadLines, delimiter (auto | comma | tab | whitespace) sent BEFORE the field 'file' (or in the query string); plain text or CSV, gzip accepted. Streamed: hashed, stored in object storage under its SHA-256 and parsed in one pass. A bad file answers 400 trace-refused with the first 20 bad lines and the total, and nothing is stored",
    access: editor,
    auth: true,
    body: 'TraceUpload',
    status: 201,
    response: 'Trace',
    errors: [413],
  },
  {
    method: 'get',
    path: '/workspaces/:wid/traces',
    tag: 'traces',
    summary: 'Traces of the workspace, newest first',
    access: member,
    auth: true,
    status: 200,
    response: 'Trace[]',
  },
  {
    method: 'get',
    path: '/traces/:id',
    tag: 'traces',
    summary: 'One trace: file, checksum, parse settings, counts, skipped lines',
    access: member,
    auth: true,
    status: 200,
    response: 'Trace',
  },
  {
    method: 'get',
    path: '/workspaces/:wid/trace-analyses',
    tag: 'traces',
    summary: 'Analyses of the workspace, newest first (without their results)',
    access: member,
    auth: true,
    status: 200,
    response: 'TraceAnalysis[]',
  },
  {
    method: 'post',
    path: '/workspaces/:wid/trace-analyses',
    tag: 'traces',
    summary:
      'Queue an analysis of a reactant-state and a product-state trace at a temperature (background job on the trace-analysis queue)',
    access: editor,
    auth: true,
    body: 'TraceAnalysisRequest',
    status: 202,
    response: 'TraceAnalysis',
  },
  {
    method: 'get',
    path: '/trace-analyses/:id',
    tag: 'traces',
    summary:
      'Status, progress (0…1) and, when done, the result (reorg.gapSamples outputs, histograms, curves, block analysis, warnings)',
    access: member,
    auth: true,
    status: 200,
    response: 'TraceAnalysis',
  },
  {
    method: 'get',
    path: '/trace-analyses/:id/events',
    tag: 'traces',
    summary:
      'Server-sent events: `progress` ({status, progress}) on every change, then `done` or `failed`, then the stream ends',
    access: member,
    auth: true,
    status: 200,
  },
  {
    method: 'post',
    path: '/trace-analyses/:id/attach',
    tag: 'traces',
    summary:
      "Write the analysis' λ (to lambdaOuter, or lambdaInner) and/or ΔG° on a pair as derived parameters (methodId reorg.gapSamples, sources: the analysis and both traces): a new pair version with an audit event",
    access: editor,
    auth: true,
    body: 'TraceAttachRequest',
    status: 200,
    response: 'Pair',
    errors: [409],
    compute: true,
  },
];

const badLine = obj({ line: int, message: str });

export const TRACE_SCHEMAS: Record<string, Schema> = {
  TraceUpload: obj(
    {
      state: { type: 'string', enum: [...TRACE_STATES] },
      unit: { type: 'string', enum: [...TRACE_FILE_UNITS] },
      column: {
        ...str,
        description: 'header name, or 1-based column number; default the last column',
      },
      skipBadLines: {
        ...bool,
        description:
          'skip bad lines (recorded and reported on every result) instead of refusing the file',
      },
      delimiter: { type: 'string', enum: ['auto', 'comma', 'tab', 'whitespace'] },
      file: { type: 'string', format: 'binary' },
    },
    ['state', 'unit', 'file'],
  ),
  Trace: obj({
    id: str,
    workspaceId: str,
    state: { type: 'string', enum: [...TRACE_STATES] },
    fileName: str,
    sizeBytes: int,
    sha256: str,
    gzip: bool,
    unit: str,
    columnSetting: nullable(str),
    columnIndex: int,
    columnName: nullable(str),
    delimiter: str,
    skipBadLines: bool,
    sampleCount: int,
    lineCount: int,
    skippedLineCount: int,
    skippedLines: { type: 'array', items: badLine },
    minEv: num,
    maxEv: num,
    meanEv: num,
    uploadedAt: str,
    uploadedBy: nullable(obj({ id: str, displayName: str })),
  }),
  TraceAnalysisRequest: obj({
    reactantTraceId: str,
    productTraceId: str,
    temperature: { ...num, description: 'K' },
  }),
  TraceAnalysis: obj({
    id: str,
    workspaceId: str,
    reactantTraceId: str,
    productTraceId: str,
    temperatureK: num,
    status: { type: 'string', enum: [...TRACE_ANALYSIS_STATUSES] },
    progress: num,
    result: nullable({
      type: 'object',
      description:
        'TraceAnalysisResult (libs/contracts/src/traces.ts): method, temperatureK, sources, outputs, warnings — the JSON `gapwise traces analyze` prints',
    }),
    error: nullable({ type: 'array', items: obj({ field: str, message: str }) }),
    attempts: int,
    createdAt: str,
    startedAt: nullable(str),
    finishedAt: nullable(str),
  }),
  TraceAttachRequest: obj(
    {
      pairId: str,
      parameters: { type: 'array', items: { type: 'string', enum: ['lambda', 'deltaG0'] } },
      lambdaKind: { type: 'string', enum: ['lambdaOuter', 'lambdaInner'] },
      version: { ...int, description: 'pair version the user saw (stale: 409 version-conflict)' },
    },
    ['pairId', 'parameters'],
  ),
};
