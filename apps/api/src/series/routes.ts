/** Series routes: measured driving-force series, their fits, and applying a fit to pairs. */
import type { Request, Router } from 'express';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { notFound } from '../http/app-error';
import { isUuid, parseBody } from '../http/validate';
import { SeriesApplyDto, SeriesFitDto, SeriesInputDto, SeriesUpdateDto } from './series-dto';
import {
  applySeries,
  createSeries,
  fitSeriesUseCase,
  listSeries,
  readSeries,
  seriesPointsOfPair,
  updateSeries,
} from './series-use-case';

export function registerSeriesRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  const id = (req: Request) => {
    const value = String(req.params['id']);
    if (!isUuid(value)) throw notFound('series');
    return value;
  };

  router.post('/workspaces/:wid/series', requireAuth, async (req, res) => {
    const wid = String(req.params['wid']);
    res
      .status(201)
      .json(await createSeries(db, userIdOf(req), wid, parseBody(SeriesInputDto, req.body)));
  });

  router.get('/workspaces/:wid/series', requireAuth, async (req, res) => {
    res.json(await listSeries(db, userIdOf(req), String(req.params['wid'])));
  });

  router.get('/series/:id', requireAuth, async (req, res) => {
    res.json(await readSeries(db, userIdOf(req), id(req)));
  });

  router.get('/pairs/:id/series-points', requireAuth, async (req, res) => {
    const pairId = String(req.params['id']);
    if (!isUuid(pairId)) throw notFound('pair');
    res.json(await seriesPointsOfPair(db, userIdOf(req), pairId));
  });

  router.put('/series/:id', requireAuth, async (req, res) => {
    const seriesId = id(req);
    res.json(await updateSeries(db, userIdOf(req), seriesId, parseBody(SeriesUpdateDto, req.body)));
  });

  router.post('/series/:id/fit', requireAuth, async (req, res) => {
    const seriesId = id(req);
    res.json(
      await fitSeriesUseCase(
        db,
        deps.compute,
        userIdOf(req),
        seriesId,
        parseBody(SeriesFitDto, req.body),
      ),
    );
  });

  router.post('/series/:id/apply', requireAuth, async (req, res) => {
    const seriesId = id(req);
    res.json({
      pairs: await applySeries(
        db,
        deps.compute,
        userIdOf(req),
        seriesId,
        parseBody(SeriesApplyDto, req.body),
      ),
    });
  });
}
