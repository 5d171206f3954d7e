import type { Request, Router } from 'express';
import { canEdit, PAIR_STATUSES, type PairStatus } from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { validationFailed } from '../http/app-error';
import { parseBody, queryInt, queryString } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import { MAX_VERSION, PairInputDto, PairPatchDto, PairUpdateDto } from './pair-dto';
import {
  listPairs,
  listVersions,
  SORT_COLUMNS,
  type PairListQuery,
  type SortKey,
} from './pair-repository';
import {
  acceptPairInput,
  archivePair,
  comparePairVersions,
  computePair,
  createPair,
  deletePairUseCase,
  duplicatePair,
  inputOf,
  pairForCaller,
  readPair,
  readVersion,
  savePair,
} from './pair-use-case';

type FieldError = { field: string; message: string };

function listQuery(req: Request): PairListQuery {
  const errors: FieldError[] = [];
  const offset = queryInt(req.query['offset'], 'offset', 0, 0, 10_000_000, errors);
  const limit = queryInt(req.query['limit'], 'limit', 50, 1, 500, errors);
  const sortRaw = queryString(req.query['sort'], 'sort', errors) ?? 'name';
  const descending = sortRaw.startsWith('-');
  const sort = sortRaw.replace(/^-/, '');
  // Own keys only: `in` would accept inherited names such as constructor or __proto__.
  if (!Object.hasOwn(SORT_COLUMNS, sort))
    errors.push({
      field: 'sort',
      message: `must be one of ${Object.keys(SORT_COLUMNS).join(', ')} (prefix - for descending)`,
    });
  const q = queryString(req.query['q'], 'q', errors);
  const regime = queryString(req.query['regime'], 'regime', errors);
  const tag = queryString(req.query['tag'], 'tag', errors);
  const status = queryString(req.query['status'], 'status', errors);
  if (status && status !== 'all' && !(PAIR_STATUSES as readonly string[]).includes(status)) {
    errors.push({ field: 'status', message: `must be one of ${PAIR_STATUSES.join(', ')}, all` });
  }
  if (errors.length) throw validationFailed(errors);
  return {
    offset,
    limit,
    sort: sort as SortKey,
    descending,
    q,
    regime,
    tag,
    status: status as PairStatus | 'all' | undefined,
  };
}

function versionParam(
  value: unknown,
  field: string,
  errors: FieldError[],
  optional = false,
): number | undefined {
  if (optional && (value === undefined || value === '')) return undefined;
  const n = queryInt(value ?? 'x', field, 0, 1, MAX_VERSION, errors);
  return n;
}

export function registerPairRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  const id = (req: Request) => String(req.params['id']);

  router.get('/workspaces/:wid/pairs', requireAuth, async (req, res) => {
    const wid = String(req.params['wid']);
    await requireRole(db.manager, wid, userIdOf(req));
    res.json(await listPairs(db.manager, wid, listQuery(req)));
  });

  router.post('/workspaces/:wid/pairs', requireAuth, async (req, res) => {
    const wid = String(req.params['wid']);
    await requireRole(db.manager, wid, userIdOf(req), canEdit);
    const input = acceptPairInput(parseBody(PairInputDto, req.body));
    res.status(201).json(await createPair(db, deps.compute, userIdOf(req), wid, input));
  });

  router.get('/pairs/:id', requireAuth, async (req, res) => {
    res.json(await readPair(db, userIdOf(req), id(req)));
  });

  router.put('/pairs/:id', requireAuth, async (req, res) => {
    await pairForCaller(db.manager, id(req), userIdOf(req), canEdit);
    const dto = parseBody(PairUpdateDto, req.body);
    const input = acceptPairInput(dto);
    res.json(await savePair(db, deps.compute, userIdOf(req), id(req), dto.version, () => input));
  });

  router.patch('/pairs/:id', requireAuth, async (req, res) => {
    await pairForCaller(db.manager, id(req), userIdOf(req), canEdit);
    const patch = parseBody(PairPatchDto, req.body);
    const { version, ...changes } = patch;
    const pair = await savePair(db, deps.compute, userIdOf(req), id(req), version, (current) => {
      // Merge, then validate the whole result as a pair input (cross-field rules included).
      const merged = Object.assign(new PairInputDto(), inputOf(current), stripUndefined(changes));
      return acceptPairInput(parseBody(PairInputDto, JSON.parse(JSON.stringify(merged))));
    });
    res.json(pair);
  });

  router.post('/pairs/:id/archive', requireAuth, async (req, res) => {
    res.json(await archivePair(db, deps.compute, userIdOf(req), id(req)));
  });

  router.delete('/pairs/:id', requireAuth, async (req, res) => {
    await deletePairUseCase(db, userIdOf(req), id(req));
    res.status(204).end();
  });

  router.post('/pairs/:id/duplicate', requireAuth, async (req, res) => {
    res.status(201).json(await duplicatePair(db, deps.compute, userIdOf(req), id(req)));
  });

  router.get('/pairs/:id/versions', requireAuth, async (req, res) => {
    await pairForCaller(db.manager, id(req), userIdOf(req));
    res.json(await listVersions(db.manager, id(req)));
  });

  router.get('/pairs/:id/versions/:version', requireAuth, async (req, res) => {
    await pairForCaller(db.manager, id(req), userIdOf(req));
    const errors: FieldError[] = [];
    const version = versionParam(req.params['version'], 'version', errors)!;
    if (errors.length) throw validationFailed(errors);
    res.json(await readVersion(db, userIdOf(req), id(req), version));
  });

  router.get('/pairs/:id/compare', requireAuth, async (req, res) => {
    await pairForCaller(db.manager, id(req), userIdOf(req));
    const errors: FieldError[] = [];
    const from = versionParam(req.query['from'], 'from', errors)!;
    const to = versionParam(req.query['to'], 'to', errors, true);
    if (errors.length) throw validationFailed(errors);
    res.json(await comparePairVersions(db, userIdOf(req), id(req), from, to));
  });

  router.post('/pairs/:id/compute', requireAuth, async (req, res) => {
    res.json(await computePair(db, deps.compute, userIdOf(req), id(req)));
  });
}

function stripUndefined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}
