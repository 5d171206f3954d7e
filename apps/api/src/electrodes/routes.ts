import type { Request, Router } from 'express';
import { canEdit } from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { parseBody } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import {
  ElectrodeApplyFitDto,
  ElectrodeCaseInputDto,
  ElectrodeCaseUpdateDto,
  ElectrodeFitDto,
} from './electrode-dto';
import {
  applyElectrodeFit,
  createElectrodeCase,
  deleteElectrodeCase,
  electrodeCaseForCaller,
  fitElectrodeCase,
  listElectrodeCases,
  listElectrodeCaseVersions,
  readElectrodeCase,
  updateElectrodeCase,
} from './electrode-use-case';

/** Electrode cases (issue 18). Thin: parse, call a use-case, answer. */
export function registerElectrodeRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  const id = (req: Request) => String(req.params['id']);

  router.get('/workspaces/:wid/electrode-cases', requireAuth, async (req, res) => {
    res.json(await listElectrodeCases(db, userIdOf(req), String(req.params['wid'])));
  });

  router.post('/workspaces/:wid/electrode-cases', requireAuth, async (req, res) => {
    const wid = String(req.params['wid']);
    await requireRole(db.manager, wid, userIdOf(req), canEdit);
    const dto = parseBody(ElectrodeCaseInputDto, req.body);
    res.status(201).json(await createElectrodeCase(db, userIdOf(req), wid, dto));
  });

  router.get('/electrode-cases/:id', requireAuth, async (req, res) => {
    res.json(await readElectrodeCase(db, userIdOf(req), id(req)));
  });

  router.put('/electrode-cases/:id', requireAuth, async (req, res) => {
    await electrodeCaseForCaller(db.manager, id(req), userIdOf(req), canEdit);
    const dto = parseBody(ElectrodeCaseUpdateDto, req.body);
    res.json(await updateElectrodeCase(db, userIdOf(req), id(req), dto));
  });

  router.delete('/electrode-cases/:id', requireAuth, async (req, res) => {
    await deleteElectrodeCase(db, userIdOf(req), id(req));
    res.status(204).end();
  });

  router.get('/electrode-cases/:id/versions', requireAuth, async (req, res) => {
    res.json(await listElectrodeCaseVersions(db, userIdOf(req), id(req)));
  });

  router.post('/electrode-cases/:id/fit', requireAuth, async (req, res) => {
    await electrodeCaseForCaller(db.manager, id(req), userIdOf(req));
    const dto = parseBody(ElectrodeFitDto, req.body ?? {});
    res.json(await fitElectrodeCase(db, deps.compute, userIdOf(req), id(req), dto));
  });

  router.post('/electrode-cases/:id/apply-fit', requireAuth, async (req, res) => {
    await electrodeCaseForCaller(db.manager, id(req), userIdOf(req), canEdit);
    const dto = parseBody(ElectrodeApplyFitDto, req.body);
    res.json(await applyElectrodeFit(db, deps.compute, userIdOf(req), id(req), dto));
  });
}
