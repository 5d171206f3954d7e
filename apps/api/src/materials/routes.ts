import type { Request, Router } from 'express';
import { canEdit } from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { parseBody } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import { MaterialInputDto, MaterialUpdateDto } from './material-dto';
import {
  computeDraftMaterial,
  createMaterial,
  deleteMaterial,
  listMaterials,
  listMaterialVersions,
  materialForCaller,
  readMaterial,
  updateMaterial,
} from './material-use-case';

/** Material cases (charge transport, issue 18). Thin: parse, call, answer. */
export function registerMaterialRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  const id = (req: Request) => String(req.params['id']);

  router.get('/workspaces/:wid/materials', requireAuth, async (req, res) => {
    res.json(await listMaterials(db, userIdOf(req), String(req.params['wid'])));
  });

  router.post('/workspaces/:wid/materials', requireAuth, async (req, res) => {
    const wid = String(req.params['wid']);
    await requireRole(db.manager, wid, userIdOf(req), canEdit);
    const dto = parseBody(MaterialInputDto, req.body);
    res.status(201).json(await createMaterial(db, deps.compute, userIdOf(req), wid, dto));
  });

  router.post('/workspaces/:wid/materials/compute', requireAuth, async (req, res) => {
    const wid = String(req.params['wid']);
    await requireRole(db.manager, wid, userIdOf(req));
    const dto = parseBody(MaterialInputDto, req.body);
    res.json(await computeDraftMaterial(db, deps.compute, userIdOf(req), wid, dto));
  });

  router.get('/materials/:id', requireAuth, async (req, res) => {
    res.json(await readMaterial(db, userIdOf(req), id(req)));
  });

  router.put('/materials/:id', requireAuth, async (req, res) => {
    await materialForCaller(db.manager, id(req), userIdOf(req), canEdit);
    const dto = parseBody(MaterialUpdateDto, req.body);
    res.json(await updateMaterial(db, deps.compute, userIdOf(req), id(req), dto));
  });

  router.delete('/materials/:id', requireAuth, async (req, res) => {
    await deleteMaterial(db, userIdOf(req), id(req));
    res.status(204).end();
  });

  router.get('/materials/:id/versions', requireAuth, async (req, res) => {
    res.json(await listMaterialVersions(db, userIdOf(req), id(req)));
  });
}
