/**
 * Screen routes. Uploads stream: multipart (field `file`) through a multer storage engine that
 * pipes the file into the parser, a raw `text/csv` body, or a JSON paste `{ "csv": "…" }`.
 * Options travel in the query string (name, runGoodRows, badRowChoice, score, floorEv).
 */
import { Transform, type Readable } from 'node:stream';
import type { Request, Response, Router } from 'express';
import multer from 'multer';
import {
  canEdit,
  csvCell,
  SCREEN_NUMERIC_COLUMNS,
  type ScreenNumericColumn,
  type ScreenResultRow,
} from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { AppError, notFound, validationFailed } from '../http/app-error';
import { formatBytes, multipartError } from '../http/multipart';
import { isUuid, queryInt, queryString } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import { SCREEN_WARNINGS, warningBit } from './chunk-computer';
import { templateCsv } from './screen-columns';
import { screenServiceOptions, startScreenService, type ScreenService } from './screen-queue';
import {
  findScreen,
  listScreens,
  queryResults,
  streamResults,
  type CustomScoreTerm,
  type ResultQuery,
} from './screen-repository';
import { parseScoreChoice, SCORE_DESCRIPTIONS, type ScoreChoice } from './screen-score';
import {
  cancelScreen,
  DEFAULT_CHUNK_SIZE,
  openRowAsPair,
  rerunScreen,
  screenForCaller,
  uploadScreen,
  type UploadOptions,
} from './screen-use-case';
import { SOLVENTS } from '@gapwise/contracts';

type FieldError = { field: string; message: string };

/** Screen services by deps object: tests and the runtime may pass one; otherwise made lazily. */
const services = new WeakMap<AppDeps, Promise<ScreenService>>();

/** Attaches a started screen service to deps (the runtime does this). */
export function provideScreenService(deps: AppDeps, service: ScreenService): void {
  services.set(deps, Promise.resolve(service));
}

function serviceFor(deps: AppDeps): Promise<ScreenService> {
  let service = services.get(deps);
  if (!service) {
    // No worker here: only the queue for sending jobs (a worker runs elsewhere).
    service = startScreenService(deps.dataSource, {
      ...screenServiceOptions(deps.config.databaseUrl, deps.config.screens),
      runWorker: false,
      log: deps.log,
    });
    services.set(deps, service);
  }
  return service;
}

const truthy = (v: unknown) => v === 'true' || v === '1' || v === 'yes';

function uploadOptions(req: Request): UploadOptions {
  const errors: FieldError[] = [];
  const name =
    queryString(req.query['name'], 'name', errors) ??
    `Screen ${new Date().toISOString().slice(0, 16).replace('T', ' ')}`;
  const score = parseScoreChoice(
    req.query['score'],
    req.query['floorEv'],
    req.query['assumedHbarOmegaEv'],
  );
  if ('message' in score) errors.push(score);
  const choice = queryString(req.query['badRowChoice'], 'badRowChoice', errors);
  if (choice && choice !== 'fixed' && choice !== 'none')
    errors.push({ field: 'badRowChoice', message: 'must be fixed or none' });
  const chunkSize = queryInt(
    req.query['chunkSize'],
    'chunkSize',
    DEFAULT_CHUNK_SIZE,
    50,
    20_000,
    errors,
  );
  if (errors.length) throw validationFailed(errors);
  return {
    name,
    runGoodRows: truthy(req.query['runGoodRows']),
    badRowChoice: (choice as 'fixed' | 'none' | undefined) ?? 'none',
    score: score as ScoreChoice,
    chunkSize,
  };
}

/** Passes bytes through until more than `maxBytes` went by, then fails with `tooLarge()`. */
function byteCap(maxBytes: number, tooLarge: () => Error): Transform {
  let seen = 0;
  return new Transform({
    transform(chunk: Buffer, _encoding, done) {
      seen += chunk.length;
      if (seen > maxBytes) done(tooLarge());
      else done(null, chunk);
    },
  });
}

/** Runs `handle` on the uploaded file's stream as multer reads it (no temporary file). */
function streamingStorage(handle: (stream: Readable) => Promise<unknown>): multer.StorageEngine {
  return {
    _handleFile(req, file, cb) {
      handle(file.stream).then(
        (result) => {
          (req as Request & { screenUpload?: unknown }).screenUpload = result;
          cb(null, {});
        },
        (error: unknown) => {
          file.stream.resume();
          cb(error as Error);
        },
      );
    },
    _removeFile(_req, _file, cb) {
      cb(null);
    },
  };
}

function resultQuery(req: Request): ResultQuery {
  const errors: FieldError[] = [];
  const offset = queryInt(req.query['offset'], 'offset', 0, 0, 10_000_000, errors);
  const limit = queryInt(req.query['limit'], 'limit', 50, 1, 1000, errors);
  const sortRaw = queryString(req.query['sort'], 'sort', errors) ?? '-score';
  const descending = sortRaw.startsWith('-');
  const sort = sortRaw.replace(/^-/, '');
  const custom = customTerms(req.query['custom'], errors);
  const sortable = [
    ...SCREEN_NUMERIC_COLUMNS,
    'donor',
    'acceptor',
    ...(custom.length ? ['custom'] : []),
  ] as string[];
  if (!sortable.includes(sort))
    errors.push({
      field: 'sort',
      message: `must be one of ${sortable.join(', ')} (prefix - for descending)`,
    });
  const ranges: Array<{ column: ScreenNumericColumn; min?: number; max?: number }> = [];
  for (const column of SCREEN_NUMERIC_COLUMNS) {
    const read = (suffix: 'Min' | 'Max') => {
      const raw = req.query[`${column}${suffix}`];
      if (raw === undefined || raw === '') return undefined;
      const n = typeof raw === 'string' ? Number(raw) : NaN;
      if (!Number.isFinite(n))
        errors.push({ field: `${column}${suffix}`, message: 'must be a finite number' });
      return n;
    };
    const min = read('Min');
    const max = read('Max');
    if (min !== undefined || max !== undefined) ranges.push({ column, min, max });
  }
  const regime = (field: string) => {
    const value = queryString(req.query[field], field, errors);
    if (value && !['normal', 'activationless', 'inverted'].includes(value))
      errors.push({ field, message: 'must be normal, activationless or inverted' });
    return value;
  };
  const regimeCs = regime('regimeCs');
  const regimeCr = regime('regimeCr');
  let warningMask = 0;
  const warning = queryString(req.query['warning'], 'warning', errors, 2000);
  for (const code of warning ? warning.split(',') : []) {
    const bit = warningBit(code.trim());
    if (bit === undefined)
      errors.push({
        field: 'warning',
        message: `unknown warning '${code}'; use ${SCREEN_WARNINGS.join(', ')}`,
      });
    else warningMask |= bit;
  }
  const q = queryString(req.query['q'], 'q', errors);
  if (errors.length) throw validationFailed(errors);
  return {
    sort: sort as ResultQuery['sort'],
    descending,
    offset,
    limit,
    ranges,
    regimeCs,
    regimeCr,
    warningMask: warningMask || undefined,
    noWarnings: truthy(req.query['noWarnings']),
    q,
    custom,
  };
}

/** Columns a custom score may weigh: the numeric results (not the line number or the score). */
const CUSTOM_COLUMNS = SCREEN_NUMERIC_COLUMNS.filter((c) => c !== 'rowNumber' && c !== 'score');
const MAX_CUSTOM_TERMS = 6;

/** `custom=log10kCsMlj:1,log10kCrMlj:-1`: a weighted sum of result columns (at most six terms). */
function customTerms(raw: unknown, errors: FieldError[]): CustomScoreTerm[] {
  const text = queryString(raw, 'custom', errors, 500);
  if (!text) return [];
  const terms: CustomScoreTerm[] = [];
  const parts = text.split(',');
  if (parts.length > MAX_CUSTOM_TERMS) {
    errors.push({ field: 'custom', message: `has at most ${MAX_CUSTOM_TERMS} terms` });
    return [];
  }
  for (const part of parts) {
    const [column, weightText] = part.split(':').map((s) => s.trim());
    const weight = Number(weightText);
    if (!(CUSTOM_COLUMNS as readonly string[]).includes(column ?? '')) {
      errors.push({
        field: 'custom',
        message: `unknown column '${column}'; use ${CUSTOM_COLUMNS.join(', ')}`,
      });
    } else if (weightText === undefined || weightText === '' || !Number.isFinite(weight)) {
      errors.push({ field: 'custom', message: `the weight of ${column} is not a finite number` });
    } else {
      terms.push({ column: column as ScreenNumericColumn, weight });
    }
  }
  return terms;
}

const CSV_COLUMNS: Array<[keyof ScreenResultRow, string]> = [
  ['rowNumber', 'line'],
  ['donor', 'donor'],
  ['acceptor', 'acceptor'],
  ['solvent', 'solvent'],
  ['deltaGCs', 'deltaG0CS [eV]'],
  ['deltaGCr', 'deltaG0CR [eV]'],
  ['lambdaInner', 'lambdaInner [eV]'],
  ['lambdaOuter', 'lambdaOuter [eV]'],
  ['lambdaTotal', 'lambda [eV]'],
  ['coupling', 'coupling [eV]'],
  ['temperature', 'temperature [K]'],
  ['log10kCsMarcus', 'log10 kCS Marcus [s-1]'],
  ['log10kCrMarcus', 'log10 kCR Marcus [s-1]'],
  ['log10kCsMlj', 'log10 kCS MLJ [s-1]'],
  ['log10kCrMlj', 'log10 kCR MLJ [s-1]'],
  ['regimeCs', 'regime CS'],
  ['regimeCr', 'regime CR'],
  ['couplingRegime', 'coupling regime'],
  ['warnings', 'warnings'],
  ['score', 'score'],
];

export function registerScreenRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  const screenId = (req: Request) => {
    const id = String(req.params['id']);
    if (!isUuid(id)) throw notFound('screen');
    return id;
  };

  router.get('/screens/template.csv', (_req, res) => {
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', 'attachment; filename="screen-template.csv"');
    res.send(templateCsv());
  });

  router.get('/screens/options', (_req, res) => {
    res.json({ solvents: SOLVENTS, scores: SCORE_DESCRIPTIONS, warnings: SCREEN_WARNINGS });
  });

  router.post('/workspaces/:wid/screens', requireAuth, async (req: Request, res: Response) => {
    const wid = String(req.params['wid']);
    await requireRole(db.manager, wid, userIdOf(req), canEdit);
    const options = { ...uploadOptions(req), maxRows: deps.config.screenMaxRows };
    const maxBytes = deps.config.screenMaxBytes;
    const tooLarge = () =>
      new AppError(
        413,
        'payload-too-large',
        `A screen file may be at most ${formatBytes(maxBytes)} (SCREEN_MAX_BYTES); nothing was stored.`,
        { fields: [{ field: 'file', message: `is larger than ${formatBytes(maxBytes)}` }] },
      );
    const service = await serviceFor(deps);
    const run = (source: Readable | string) =>
      uploadScreen(db, service, userIdOf(req), wid, source, options);
    const type = req.headers['content-type'] ?? '';
    if (type.startsWith('multipart/form-data')) {
      const upload = multer({
        storage: streamingStorage(run),
        limits: { files: 1, fileSize: maxBytes },
      }).single('file');
      await new Promise<void>((resolve, reject) =>
        upload(req, res, (err: unknown) =>
          err
            ? reject(
                err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE'
                  ? tooLarge()
                  : multipartError(err, 'file', formatBytes(maxBytes)),
              )
            : resolve(),
        ),
      );
      const result = (req as Request & { screenUpload?: unknown }).screenUpload;
      if (!result)
        throw validationFailed([
          { field: 'file', message: 'attach the CSV as the multipart field "file"' },
        ]);
      res.status(201).json(result);
      return;
    }
    if (type.startsWith('text/csv') || type.startsWith('text/plain')) {
      if (Number(req.headers['content-length'] ?? 0) > maxBytes) throw tooLarge();
      res.status(201).json(await run(req.pipe(byteCap(maxBytes, tooLarge))));
      return;
    }
    const csv = (req.body as { csv?: unknown } | undefined)?.csv;
    if (typeof csv === 'string' && Buffer.byteLength(csv) > maxBytes) throw tooLarge();
    if (typeof csv !== 'string' || csv.trim() === '') {
      throw validationFailed([
        { field: 'csv', message: 'paste the CSV text as "csv", or upload a file' },
      ]);
    }
    res.status(201).json(await run(csv));
  });

  router.get('/workspaces/:wid/screens', requireAuth, async (req, res) => {
    const wid = String(req.params['wid']);
    await requireRole(db.manager, wid, userIdOf(req));
    res.json(await listScreens(db.manager, wid));
  });

  router.get('/screens/:id', requireAuth, async (req, res) => {
    const id = screenId(req);
    await screenForCaller(db.manager, id, userIdOf(req));
    res.json(await findScreen(db.manager, id));
  });

  router.post('/screens/:id/cancel', requireAuth, async (req, res) => {
    res.json(await cancelScreen(db, userIdOf(req), screenId(req)));
  });

  router.post('/screens/:id/run', requireAuth, async (req, res) => {
    const id = screenId(req);
    await screenForCaller(db.manager, id, userIdOf(req), canEdit);
    res.json(await rerunScreen(db, await serviceFor(deps), userIdOf(req), id));
  });

  router.get('/screens/:id/results', requireAuth, async (req, res) => {
    const id = screenId(req);
    await screenForCaller(db.manager, id, userIdOf(req));
    res.json(await queryResults(db.manager, id, resultQuery(req)));
  });

  router.get('/screens/:id/results.csv', requireAuth, async (req, res) => {
    const id = screenId(req);
    await screenForCaller(db.manager, id, userIdOf(req));
    const query = resultQuery(req);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="screen-${id.slice(0, 8)}-results.csv"`,
    );
    res.write(`${CSV_COLUMNS.map(([, label]) => label).join(',')}\n`);
    for await (const batch of streamResults(db.manager, id, query)) {
      const text = batch
        .map((row) => CSV_COLUMNS.map(([key]) => csvCell(row[key])).join(','))
        .join('\n');
      if (!res.write(`${text}\n`)) await new Promise((resolve) => res.once('drain', resolve));
    }
    res.end();
  });

  router.post('/screens/:id/results/:row/open-as-pair', requireAuth, async (req, res) => {
    const id = screenId(req);
    const row = Number(req.params['row']);
    if (!Number.isSafeInteger(row) || row < 1) throw notFound('screen row');
    await screenForCaller(db.manager, id, userIdOf(req), canEdit);
    res.status(201).json(await openRowAsPair(db, deps.compute, userIdOf(req), id, row));
  });
}
