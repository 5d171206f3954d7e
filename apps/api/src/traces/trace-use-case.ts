/**
 * Use-cases of traces and trace analyses: upload, read, analyse, attach to a pair. Routes stay
 * thin; rows come and go through trace-repository.ts; errors are `AppError`s.
 */
import type { DataSource } from 'typeorm';
import {
  ATTACHABLE_TRACE_PARAMETERS,
  TRACE_FILE_UNITS,
  TRACE_STATES,
  canEdit,
  type Pair,
  type PairParameter,
  type Trace,
  type TraceAnalysis,
  type TraceAttachRequest,
  type TraceFileUnit,
  type TraceState,
} from '@gapwise/contracts';
import { recordAudit } from '../audit/audit-repository';
import { AppError, notFound, validationFailed } from '../http/app-error';
import { formatBytes } from '../http/multipart';
import { TraceTooLargeError } from '@gapwise/traces';
import { isUuid } from '../http/validate';
import type { ComputeRunner } from '../compute/compute-tasks';
import { inputOf, pairForCaller, savePair } from '../pairs/pair-use-case';
import { requireRole } from '../workspaces/workspace-access';
import { TraceRefusedError, ingestTrace, type IngestedTrace } from './trace-ingest';
import {
  TRACE_DELIMITERS,
  TraceSettingsError,
  readColumnSetting,
  type TraceDelimiter,
  type TraceParseSettings,
} from '@gapwise/traces';
import {
  countObjectReferences,
  findAnalysis,
  findTrace,
  insertAnalysis,
  insertTrace,
  listAnalyses,
  listTraces,
  publicTrace,
} from './trace-repository';
import type { TraceServices } from './trace-services';

type FieldError = { field: string; message: string };

/** What an upload asks for, from form fields (sent before the file) or the query string. */
export interface UploadSettings {
  readonly state: TraceState;
  readonly settings: TraceParseSettings;
  readonly columnSetting: string | null;
}

const truthy = (v: unknown) => ['1', 'true', 'yes', 'on'].includes(String(v ?? '').toLowerCase());

/** Reads and checks the upload parameters; every problem at once (400 before anything is stored). */
export function readUploadSettings(raw: Record<string, unknown>): UploadSettings {
  const errors: FieldError[] = [];
  const text = (name: string): string | undefined => {
    const v = raw[name];
    if (v === undefined || v === null || v === '') return undefined;
    if (typeof v !== 'string' || v.length > 200) {
      errors.push({ field: name, message: 'must be one text value of at most 200 characters' });
      return undefined;
    }
    return v.trim();
  };
  const state = text('state');
  if (!state || !(TRACE_STATES as readonly string[]).includes(state)) {
    errors.push({ field: 'state', message: `must be one of ${TRACE_STATES.join(', ')}` });
  }
  const unit = text('unit');
  if (!unit || !(TRACE_FILE_UNITS as readonly string[]).includes(unit)) {
    errors.push({
      field: 'unit',
      message: unit
        ? `Unrecognised unit '${unit}' for an energy; use one of ${TRACE_FILE_UNITS.join(', ')}.`
        : `is required: one of ${TRACE_FILE_UNITS.join(', ')}`,
    });
  }
  const delimiter = text('delimiter') ?? 'auto';
  if (!(TRACE_DELIMITERS as readonly string[]).includes(delimiter)) {
    errors.push({ field: 'delimiter', message: `must be one of ${TRACE_DELIMITERS.join(', ')}` });
  }
  const columnText = text('column');
  const column = readColumnSetting(columnText);
  if (typeof column === 'number' && !(Number.isSafeInteger(column) && column >= 1)) {
    errors.push({
      field: 'column',
      message: 'Column index must be a whole number ≥ 1 (the first column is 1).',
    });
  }
  const skip = raw['skipBadLines'];
  if (
    skip !== undefined &&
    skip !== '' &&
    !['0', '1', 'true', 'false', 'yes', 'no', 'on', 'off'].includes(String(skip).toLowerCase())
  ) {
    errors.push({ field: 'skipBadLines', message: 'must be true or false' });
  }
  if (errors.length) throw validationFailed(errors);
  return {
    state: state as TraceState,
    columnSetting: columnText ?? null,
    settings: {
      unit: unit as TraceFileUnit,
      column,
      skipBadLines: truthy(skip),
      delimiter: delimiter as TraceDelimiter,
    },
  };
}

/** Cleans a client file name for display (path parts dropped, control characters removed). */
export function cleanFileName(name: string | undefined): string {
  const base = (name ?? '').split(/[\\/]/).pop() ?? '';
  const clean = Array.from(base)
    .filter((ch) => ch.charCodeAt(0) > 0x1f && ch.charCodeAt(0) !== 0x7f)
    .join('')
    .trim()
    .slice(0, 200);
  return clean || 'trace';
}

/** Streams the upload through hash, object store and parser; a refusal becomes a 400. */
export async function ingestUpload(
  services: TraceServices,
  source: AsyncIterable<Uint8Array>,
  upload: UploadSettings,
  limits: { readonly maxDecompressedBytes?: number; readonly maxGzipRatio?: number } = {},
): Promise<IngestedTrace> {
  try {
    return await ingestTrace(services.store, source, upload.settings, limits);
  } catch (error) {
    if (error instanceof TraceTooLargeError) {
      const limit =
        error.ratio !== null
          ? `${error.ratio} times its compressed size (TRACE_MAX_GZIP_RATIO)`
          : `${formatBytes(error.limitBytes)} (TRACE_MAX_DECOMPRESSED_BYTES)`;
      throw new AppError(
        413,
        'payload-too-large',
        `The gzip file decompresses to more than ${limit}; nothing was stored.`,
        { fields: [{ field: 'file', message: `decompresses to more than ${limit}` }] },
      );
    }
    if (error instanceof TraceRefusedError) {
      throw new AppError(400, 'trace-refused', refusalMessage(error), { fields: error.problems });
    }
    if (error instanceof TraceSettingsError)
      throw validationFailed([{ field: error.field, message: error.message }]);
    throw error;
  }
}

function refusalMessage(error: TraceRefusedError): string {
  const bad = error.summary?.badLines.count ?? 0;
  if (bad > 0)
    return `The file was refused: ${bad} bad line${bad === 1 ? '' : 's'} (nothing was stored).`;
  return `The file was refused: ${error.problems[0]?.message ?? 'unreadable'} (nothing was stored).`;
}

/** Records an ingested file as a trace row (and an audit event) in one transaction. */
export async function recordUploadedTrace(
  db: DataSource,
  services: TraceServices,
  userId: string,
  workspaceId: string,
  fileName: string,
  upload: UploadSettings,
  ingested: IngestedTrace,
): Promise<Trace> {
  const s = ingested.summary;
  try {
    const id = await db.transaction(async (tx) => {
      await requireRole(tx, workspaceId, userId, canEdit);
      const traceId = await insertTrace(tx, {
        workspaceId,
        state: upload.state,
        fileName,
        sizeBytes: ingested.sizeBytes,
        sha256: ingested.sha256,
        objectKey: ingested.objectKey,
        gzip: ingested.gzip,
        unit: upload.settings.unit,
        columnSetting: upload.columnSetting,
        columnIndex: s.columnIndex,
        columnName: s.columnName,
        delimiter: s.delimiter ?? 'whitespace',
        skipBadLines: upload.settings.skipBadLines === true,
        sampleCount: s.sampleCount,
        lineCount: s.lineCount,
        skippedLineCount: upload.settings.skipBadLines ? s.badLines.count : 0,
        skippedLines: upload.settings.skipBadLines ? s.badLines.first : [],
        minEv: s.minEv ?? 0,
        maxEv: s.maxEv ?? 0,
        meanEv: s.meanEv ?? 0,
        uploadedBy: userId,
      });
      await recordAudit(tx, {
        workspaceId,
        actorId: userId,
        action: 'trace.uploaded',
        entityType: 'trace',
        entityId: traceId,
        summary: `Uploaded ${upload.state} trace ${fileName} (${s.sampleCount} samples${s.badLines.count ? `, ${s.badLines.count} bad lines skipped` : ''})`,
        after: { sha256: ingested.sha256, unit: upload.settings.unit, column: s.columnIndex },
      });
      return traceId;
    });
    const trace = await findTrace(db.manager, id);
    return publicTrace(trace!);
  } catch (error) {
    // No row: the object must not stay behind unless another row shares it.
    if ((await countObjectReferences(db.manager, ingested.objectKey).catch(() => 1)) === 0) {
      await services.store.delete(ingested.objectKey).catch(() => undefined);
    }
    throw error;
  }
}

export async function listTracesFor(
  db: DataSource,
  userId: string,
  workspaceId: string,
): Promise<Trace[]> {
  await requireRole(db.manager, workspaceId, userId);
  return (await listTraces(db.manager, workspaceId)).map(publicTrace);
}

export async function readTraceFor(
  db: DataSource,
  userId: string,
  traceId: string,
): Promise<Trace> {
  if (!isUuid(traceId)) throw notFound('trace');
  const trace = await findTrace(db.manager, traceId);
  if (!trace) throw notFound('trace');
  await requireRole(db.manager, trace.workspaceId, userId, () => true, 'trace');
  return publicTrace(trace);
}

export async function listAnalysesFor(
  db: DataSource,
  userId: string,
  workspaceId: string,
): Promise<TraceAnalysis[]> {
  await requireRole(db.manager, workspaceId, userId);
  return listAnalyses(db.manager, workspaceId);
}

/** The analysis if the caller is a member of its workspace (404 otherwise). */
export async function readAnalysisFor(
  db: DataSource,
  userId: string,
  analysisId: string,
  withResult = true,
): Promise<TraceAnalysis> {
  if (!isUuid(analysisId)) throw notFound('trace analysis');
  const analysis = await findAnalysis(db.manager, analysisId, withResult);
  if (!analysis) throw notFound('trace analysis');
  await requireRole(db.manager, analysis.workspaceId, userId, () => true, 'trace analysis');
  return analysis;
}

export interface AnalysisRequestBody {
  readonly reactantTraceId: string;
  readonly productTraceId: string;
  readonly temperature: number;
}

/** Creates a queued analysis and its job in one transaction. */
export async function startAnalysis(
  db: DataSource,
  services: TraceServices,
  userId: string,
  workspaceId: string,
  body: AnalysisRequestBody,
): Promise<TraceAnalysis> {
  const errors: FieldError[] = [];
  const [reactant, product] = await Promise.all([
    isUuid(body.reactantTraceId) ? findTrace(db.manager, body.reactantTraceId) : null,
    isUuid(body.productTraceId) ? findTrace(db.manager, body.productTraceId) : null,
  ]);
  if (!reactant || reactant.workspaceId !== workspaceId)
    errors.push({ field: 'reactantTraceId', message: 'is not a trace of this workspace' });
  else if (reactant.state !== 'reactant')
    errors.push({ field: 'reactantTraceId', message: 'is a product-state trace' });
  if (!product || product.workspaceId !== workspaceId)
    errors.push({ field: 'productTraceId', message: 'is not a trace of this workspace' });
  else if (product.state !== 'product')
    errors.push({ field: 'productTraceId', message: 'is a reactant-state trace' });
  if (!(body.temperature > 0) || !Number.isFinite(body.temperature)) {
    errors.push({
      field: 'temperature',
      message: 'Temperature must be > 0 K (absolute). Did you enter °C?',
    });
  }
  if (errors.length) throw validationFailed(errors);
  const id = await db.transaction(async (tx) => {
    await requireRole(tx, workspaceId, userId, canEdit);
    const analysisId = await insertAnalysis(tx, {
      workspaceId,
      reactantTraceId: body.reactantTraceId,
      productTraceId: body.productTraceId,
      temperatureK: body.temperature,
      createdBy: userId,
    });
    await services.enqueue(tx, analysisId);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'trace-analysis.created',
      entityType: 'trace-analysis',
      entityId: analysisId,
      summary: `Analysis of ${reactant!.fileName} and ${product!.fileName} at ${body.temperature} K queued`,
    });
    return analysisId;
  });
  return (await findAnalysis(db.manager, id))!;
}

const LAMBDA_KINDS = ['lambdaOuter', 'lambdaInner'] as const;

/** Checks the attach body; every problem at once. */
export function readAttachBody(body: unknown): TraceAttachRequest {
  const errors: FieldError[] = [];
  if (!body || typeof body !== 'object' || Array.isArray(body))
    throw validationFailed([{ field: '(body)', message: 'must be a JSON object' }]);
  const b = body as Record<string, unknown>;
  for (const key of Object.keys(b)) {
    if (!['pairId', 'parameters', 'lambdaKind', 'version'].includes(key))
      errors.push({ field: key, message: 'is not a known field' });
  }
  if (!isUuid(b['pairId'])) errors.push({ field: 'pairId', message: 'must be a pair id' });
  const parameters = b['parameters'];
  if (
    !Array.isArray(parameters) ||
    parameters.length === 0 ||
    parameters.some((p) => !(ATTACHABLE_TRACE_PARAMETERS as readonly unknown[]).includes(p)) ||
    new Set(parameters).size !== parameters.length
  ) {
    errors.push({
      field: 'parameters',
      message: `must list one or more of ${ATTACHABLE_TRACE_PARAMETERS.join(', ')}`,
    });
  }
  const lambdaKind = b['lambdaKind'] ?? 'lambdaOuter';
  if (!(LAMBDA_KINDS as readonly unknown[]).includes(lambdaKind))
    errors.push({ field: 'lambdaKind', message: `must be one of ${LAMBDA_KINDS.join(', ')}` });
  const version = b['version'];
  if (version !== undefined && !(Number.isSafeInteger(version) && (version as number) >= 1)) {
    errors.push({ field: 'version', message: 'must be a whole number ≥ 1' });
  }
  if (errors.length) throw validationFailed(errors);
  return {
    pairId: b['pairId'] as string,
    parameters: parameters as TraceAttachRequest['parameters'],
    lambdaKind: lambdaKind as 'lambdaOuter' | 'lambdaInner',
    version: version as number | undefined,
  };
}

const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/**
 * Writes λ (and/or ΔG°) of a finished analysis on a pair as derived parameters whose provenance
 * names the method and points at the analysis and both traces — through the pair use-case, so
 * the pair gets a new version and an audit event.
 */
export async function attachAnalysis(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  analysisId: string,
  request: TraceAttachRequest,
): Promise<Pair> {
  const analysis = await readAnalysisFor(db, userId, analysisId);
  await requireRole(db.manager, analysis.workspaceId, userId, canEdit, 'trace analysis');
  const { workspaceId } = await pairForCaller(db.manager, request.pairId, userId);
  if (workspaceId !== analysis.workspaceId) throw notFound('pair');
  if (analysis.status !== 'done' || !analysis.result) {
    throw new AppError(
      409,
      'analysis-not-done',
      'The analysis has no result yet (status ' + analysis.status + ').',
    );
  }
  const result = analysis.result;
  const out = result.outputs;
  // Stored JSON: still checked, since a value may be missing from a result written long ago.
  const lambda = num(out.lambdaFromMeans);
  const deltaG0 = num(out.deltaG0FromMeans);
  const se = out.standardErrors;
  if (lambda === null || deltaG0 === null)
    throw new AppError(409, 'analysis-incomplete', 'The analysis result lacks λ or ΔG°.');
  const skipped =
    result.sources.reactant.skippedLineCount + result.sources.product.skippedLineCount;
  const provenance = (estimator: string): PairParameter['provenance'] => ({
    kind: 'derived',
    citation: null,
    methodId: 'reorg.gapSamples',
    methodInputs: {
      estimator,
      temperature: result.temperatureK,
      reactantTraceId: analysis.reactantTraceId,
      productTraceId: analysis.productTraceId,
      // The provenance sentence names the traces by their files (ids and hashes stay for audits).
      reactantFileName: result.sources.reactant.fileName,
      productFileName: result.sources.product.fileName,
      reactantSha256: result.sources.reactant.sha256,
      productSha256: result.sources.product.sha256,
      reactantSamples: result.sources.reactant.sampleCount,
      productSamples: result.sources.product.sampleCount,
      skippedLines: skipped,
    },
    sources: [
      { type: 'trace-analysis', id: analysis.id },
      { type: 'trace', id: analysis.reactantTraceId },
      { type: 'trace', id: analysis.productTraceId },
    ],
    note:
      `From energy-gap samples (${result.sources.reactant.fileName}, ${result.sources.product.fileName}) at ${result.temperatureK} K` +
      (skipped > 0 ? `; ${skipped} bad line${skipped === 1 ? ' was' : 's were'} skipped` : '') +
      (result.warnings.length
        ? `; warnings: ${result.warnings.map((w) => w.code).join(', ')}`
        : ''),
  });
  const additions: PairParameter[] = [];
  const kinds: string[] = [];
  if (request.parameters.includes('lambda')) {
    const kind = request.lambdaKind ?? 'lambdaOuter';
    kinds.push(kind);
    additions.push({
      kind,
      value: lambda,
      unit: 'eV',
      uncertainty: num(se?.lambdaFromMeans),
      provenance: provenance('lambdaFromMeans'),
    });
  }
  if (request.parameters.includes('deltaG0')) {
    kinds.push('deltaG0');
    additions.push({
      kind: 'deltaG0',
      value: deltaG0,
      unit: 'eV',
      uncertainty: num(se?.deltaG0FromMeans),
      provenance: provenance('deltaG0FromMeans'),
    });
  }
  const rows: Array<{ version: number }> = await db.query(
    'SELECT version FROM pairs WHERE id = $1',
    [request.pairId],
  );
  const version = request.version ?? Number(rows[0]?.version);
  return savePair(
    db,
    compute,
    userId,
    request.pairId,
    version,
    (pair) => {
      const input = inputOf(pair);
      const kept = input.parameters.filter((p) => !kinds.includes(p.kind));
      return { ...input, parameters: [...kept, ...additions] };
    },
    'pair.updated',
    `${kinds.join(' and ')} from trace analysis ${analysis.id.slice(0, 8)}`,
  );
}
