/**
 * Trace routes. Uploads stream: a multer storage engine hands the file stream to the ingest
 * (hash + object store + parser in one pass), so a file is never held in memory or on local disk.
 * Parse settings come as form fields *before* the `file` field, or in the query string.
 */
import type { Request, Response, Router } from 'express';
import multer, { type StorageEngine } from 'multer';
import { canEdit } from '@gapwise/contracts';
import { AppError, notFound, validationFailed } from '../http/app-error';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { multipartError } from '../http/multipart';
import { isUuid } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import type { IngestedTrace } from './trace-ingest';
import { startTraceServices, traceServicesOptions, type TraceServices } from './trace-services';
import {
  attachAnalysis,
  cleanFileName,
  ingestUpload,
  listAnalysesFor,
  listTracesFor,
  readAnalysisFor,
  readAttachBody,
  readTraceFor,
  readUploadSettings,
  recordUploadedTrace,
  startAnalysis,
  type UploadSettings,
} from './trace-use-case';

/** Largest accepted upload (raw bytes). */
export const MAX_TRACE_UPLOAD_BYTES = 4 * 1024 ** 3;

type UploadedFile = Express.Multer.File & { ingested?: IngestedTrace; upload?: UploadSettings };

/** Streams each file into the ingest; multer calls `_removeFile` only for files it keeps. */
class TraceStorageEngine implements StorageEngine {
  constructor(
    private readonly services: TraceServices,
    private readonly limits: { maxDecompressedBytes: number; maxGzipRatio: number },
  ) {}

  _handleFile(
    req: Request,
    file: Express.Multer.File,
    callback: (error?: unknown, info?: Partial<UploadedFile>) => void,
  ): void {
    let upload: UploadSettings;
    try {
      upload = readUploadSettings({
        ...(req.query as Record<string, unknown>),
        ...(req.body as Record<string, unknown>),
      });
    } catch (error) {
      file.stream.resume();
      callback(error);
      return;
    }
    ingestUpload(this.services, file.stream, upload, this.limits).then(
      (ingested) => callback(null, { ingested, upload, size: ingested.sizeBytes }),
      (error: unknown) => {
        file.stream.resume();
        callback(error);
      },
    );
  }

  _removeFile(
    _req: Request,
    file: Express.Multer.File & { ingested?: IngestedTrace },
    callback: (error: Error | null) => void,
  ): void {
    // A second file in one request is refused by the limits; the stored object of the first stays
    // only if a row is written for it (recordUploadedTrace removes unreferenced objects).
    void file;
    callback(null);
  }
}

function multerErrorToAppError(error: unknown): unknown {
  if (error instanceof multer.MulterError) {
    if (error.code === 'LIMIT_FILE_SIZE') {
      return new AppError(
        413,
        'payload-too-large',
        `A trace file may be at most ${MAX_TRACE_UPLOAD_BYTES / 1024 ** 3} GiB.`,
      );
    }
    return validationFailed([
      {
        field: error.field ?? 'file',
        message: `Upload refused (${error.code}): send one file in the field 'file'.`,
      },
    ]);
  }
  return multipartError(error, 'file', `${MAX_TRACE_UPLOAD_BYTES / 1024 ** 3} GiB`);
}

const provided = new WeakMap<AppDeps, Promise<TraceServices>>();

/** Gives the routes of an app the process's trace services (the runtime does; tests may). */
export function provideTraceServices(deps: AppDeps, services: TraceServices): void {
  provided.set(deps, Promise.resolve(services));
}

/** The provided services, else (an app built without them) a queue-only instance from the configuration. */
function servicesFor(deps: AppDeps): Promise<TraceServices> {
  let services = provided.get(deps);
  if (!services) {
    services = startTraceServices(deps.dataSource, {
      ...traceServicesOptions(deps.config),
      runWorker: false,
      compute: deps.compute,
      log: deps.log,
    });
    services.catch(() => provided.delete(deps));
    provided.set(deps, services);
  }
  return services;
}

export function registerTraceRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  const services = () => servicesFor(deps);
  const param = (req: Request, name: string) => String(req.params[name]);

  router.post('/workspaces/:wid/traces', requireAuth, async (req, res) => {
    const wid = param(req, 'wid');
    const userId = userIdOf(req);
    // Role first: a denied caller's body is never read into storage.
    await requireRole(db.manager, wid, userId, canEdit);
    const svc = await services();
    if (!(req.headers['content-type'] ?? '').startsWith('multipart/form-data')) {
      throw validationFailed([
        { field: 'file', message: "Send the file as multipart/form-data in the field 'file'." },
      ]);
    }
    const middleware = multer({
      storage: new TraceStorageEngine(svc, {
        maxDecompressedBytes: deps.config.traceMaxDecompressedBytes,
        maxGzipRatio: deps.config.traceMaxGzipRatio,
      }),
      limits: {
        files: 1,
        fileSize: MAX_TRACE_UPLOAD_BYTES,
        fields: 20,
        fieldSize: 1024,
        parts: 25,
      },
    }).single('file');
    await new Promise<void>((resolve, reject) => {
      middleware(req, res, (error?: unknown) =>
        error ? reject(multerErrorToAppError(error)) : resolve(),
      );
    });
    const file = req.file as UploadedFile | undefined;
    if (!file?.ingested || !file.upload)
      throw validationFailed([
        { field: 'file', message: "is required (a multipart field named 'file')" },
      ]);
    const trace = await recordUploadedTrace(
      db,
      svc,
      userId,
      wid,
      cleanFileName(file.originalname),
      file.upload,
      file.ingested,
    );
    res.status(201).json(trace);
  });

  router.get('/workspaces/:wid/traces', requireAuth, async (req, res) => {
    res.json(await listTracesFor(db, userIdOf(req), param(req, 'wid')));
  });

  router.get('/traces/:id', requireAuth, async (req, res) => {
    res.json(await readTraceFor(db, userIdOf(req), param(req, 'id')));
  });

  router.get('/workspaces/:wid/trace-analyses', requireAuth, async (req, res) => {
    res.json(await listAnalysesFor(db, userIdOf(req), param(req, 'wid')));
  });

  router.post('/workspaces/:wid/trace-analyses', requireAuth, async (req, res) => {
    const wid = param(req, 'wid');
    const userId = userIdOf(req);
    await requireRole(db.manager, wid, userId, canEdit);
    const body = req.body as Record<string, unknown> | undefined;
    const errors: Array<{ field: string; message: string }> = [];
    if (!body || typeof body !== 'object' || Array.isArray(body))
      throw validationFailed([{ field: '(body)', message: 'must be a JSON object' }]);
    for (const key of Object.keys(body)) {
      if (!['reactantTraceId', 'productTraceId', 'temperature'].includes(key))
        errors.push({ field: key, message: 'is not a known field' });
    }
    if (typeof body['reactantTraceId'] !== 'string')
      errors.push({ field: 'reactantTraceId', message: 'must be a trace id' });
    if (typeof body['productTraceId'] !== 'string')
      errors.push({ field: 'productTraceId', message: 'must be a trace id' });
    if (typeof body['temperature'] !== 'number')
      errors.push({ field: 'temperature', message: 'Temperature must be a number in K.' });
    if (errors.length) throw validationFailed(errors);
    const analysis = await startAnalysis(db, await services(), userId, wid, {
      reactantTraceId: body['reactantTraceId'] as string,
      productTraceId: body['productTraceId'] as string,
      temperature: body['temperature'] as number,
    });
    res.status(202).json(analysis);
  });

  router.get('/trace-analyses/:id', requireAuth, async (req, res) => {
    res.json(await readAnalysisFor(db, userIdOf(req), param(req, 'id')));
  });

  router.get('/trace-analyses/:id/events', requireAuth, async (req, res) => {
    await streamAnalysisEvents(deps, req, res);
  });

  router.post('/trace-analyses/:id/attach', requireAuth, async (req, res) => {
    const id = param(req, 'id');
    if (!isUuid(id)) throw notFound('trace analysis');
    const userId = userIdOf(req);
    await readAnalysisFor(db, userId, id, false).then((a) =>
      requireRole(db.manager, a.workspaceId, userId, canEdit, 'trace analysis'),
    );
    res.json(await attachAnalysis(db, deps.compute, userId, id, readAttachBody(req.body)));
  });
}

/**
 * Server-sent events with the analysis status and progress: one `progress` event whenever they
 * change (read from the row every 400 ms, so any worker process may be running the job), and a
 * final `done` or `failed` event, then the stream ends. Polling `GET /trace-analyses/:id` works too.
 */
async function streamAnalysisEvents(deps: AppDeps, req: Request, res: Response): Promise<void> {
  const userId = userIdOf(req);
  const id = String(req.params['id']);
  let analysis = await readAnalysisFor(deps.dataSource, userId, id, false);
  res.status(200);
  res.setHeader('Content-Type', 'text/event-stream');
  res.setHeader('Cache-Control', 'no-store');
  res.setHeader('Connection', 'keep-alive');
  res.setHeader('X-Accel-Buffering', 'no');
  res.flushHeaders();
  let closed = false;
  req.on('close', () => {
    closed = true;
  });
  let last = '';
  const send = (event: string) => {
    const data = JSON.stringify({
      id: analysis.id,
      status: analysis.status,
      progress: analysis.progress,
      error: analysis.error,
    });
    if (event === 'progress' && data === last) return;
    last = data;
    res.write(`event: ${event}\ndata: ${data}\n\n`);
  };
  const started = Date.now();
  while (!closed) {
    if (analysis.status === 'done' || analysis.status === 'failed') {
      send('progress');
      res.write(
        `event: ${analysis.status}\ndata: ${JSON.stringify({ id: analysis.id, status: analysis.status })}\n\n`,
      );
      break;
    }
    send('progress');
    if (Date.now() - started > 30 * 60 * 1000) break;
    await new Promise((resolve) => setTimeout(resolve, 400));
    if (closed) break;
    const next = await readAnalysisFor(deps.dataSource, userId, id, false).catch(() => null);
    if (!next) break;
    analysis = next;
  }
  res.end();
}
