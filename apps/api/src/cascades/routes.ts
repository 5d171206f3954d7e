import type { Request, Router } from 'express';
import { canEdit } from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { validationFailed } from '../http/app-error';
import { parseBody } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import { CascadeUpdateDto, CascadeInputDto } from './cascade-dto';
import {
  cascadeForCaller,
  computeCascade,
  createCascade,
  deleteCascade,
  listCascades,
  listCascadeVersions,
  readCascade,
  updateCascade,
} from './cascade-use-case';

/** Cascades: multi-step ET networks of a workspace (issue 17). Thin: parse, call, answer. */
export function registerCascadeRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  const id = (req: Request) => String(req.params['id']);

  router.get('/workspaces/:wid/cascades', requireAuth, async (req, res) => {
    res.json(await listCascades(db, userIdOf(req), String(req.params['wid'])));
  });

  router.post('/workspaces/:wid/cascades', requireAuth, async (req, res) => {
    const wid = String(req.params['wid']);
    await requireRole(db.manager, wid, userIdOf(req), canEdit);
    const dto = parseBody(CascadeInputDto, req.body);
    res.status(201).json(await createCascade(db, deps.compute, userIdOf(req), wid, dto));
  });

  router.get('/cascades/:id', requireAuth, async (req, res) => {
    res.json(await readCascade(db, userIdOf(req), id(req)));
  });

  router.put('/cascades/:id', requireAuth, async (req, res) => {
    await cascadeForCaller(db.manager, id(req), userIdOf(req), canEdit);
    const dto = parseBody(CascadeUpdateDto, req.body);
    res.json(await updateCascade(db, deps.compute, userIdOf(req), id(req), dto));
  });

  router.delete('/cascades/:id', requireAuth, async (req, res) => {
    await deleteCascade(db, userIdOf(req), id(req));
    res.status(204).end();
  });

  router.get('/cascades/:id/versions', requireAuth, async (req, res) => {
    res.json(await listCascadeVersions(db, userIdOf(req), id(req)));
  });

  router.post('/cascades/:id/compute', requireAuth, async (req, res) => {
    const body = (req.body ?? {}) as Record<string, unknown>;
    const extra = Object.keys(body).filter((k) => k !== 'network');
    const draft = body['network'];
    if (
      extra.length > 0 ||
      (draft !== undefined && (typeof draft !== 'object' || draft === null || Array.isArray(draft)))
    )
      throw validationFailed([
        {
          field: extra[0] ?? 'network',
          message:
            extra.length > 0
              ? `Unknown field '${extra[0]}'; only network is accepted.`
              : 'Field network must be an object.',
        },
      ]);
    res.json(
      await computeCascade(
        db,
        deps.compute,
        userIdOf(req),
        id(req),
        draft as Record<string, unknown> | undefined,
      ),
    );
  });
}
