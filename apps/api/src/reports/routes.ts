import type { Request, Router } from 'express';
import { REPORT_STATUSES, type ReportAction, type ReportStatus } from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { validationFailed } from '../http/app-error';
import { isUuid, parseBody, queryString } from '../http/validate';
import { ReportCommentDto, ReportCreateDto, ReportDecisionDto } from './report-dto';
import { reportCsv, reportJson } from './report-export';
import type { ReportPdfStore } from './report-pdf-store';
import type { ReportListQuery } from './report-repository';
import {
  commentOnReport,
  createCascadeReport,
  createReport,
  deleteReportUseCase,
  listWorkspaceReports,
  readReport,
  reportFileName,
  reportPdf,
  reviseReport,
  transitionReport,
  waitingReviews,
} from './report-use-case';

type FieldError = { field: string; message: string };

function listQuery(req: Request): ReportListQuery {
  const errors: FieldError[] = [];
  const status = queryString(req.query['status'], 'status', errors);
  const author = queryString(req.query['author'], 'author', errors);
  const pairId = queryString(req.query['pairId'], 'pairId', errors);
  if (status && !(REPORT_STATUSES as readonly string[]).includes(status)) {
    errors.push({ field: 'status', message: `must be one of ${REPORT_STATUSES.join(', ')}` });
  }
  if (author && !isUuid(author)) errors.push({ field: 'author', message: 'must be a user id' });
  if (pairId && !isUuid(pairId)) errors.push({ field: 'pairId', message: 'must be a pair id' });
  if (errors.length) throw validationFailed(errors);
  return { status: status as ReportStatus | undefined, authorId: author, pairId };
}

/** Report routes. `reportPdfStore` (S3 API) keeps each generated PDF; null regenerates. */
export function registerReportRoutes(
  router: Router,
  deps: AppDeps & { readonly reportPdfStore?: ReportPdfStore | null },
): void {
  const db = deps.dataSource;
  const id = (req: Request) => String(req.params['id']);

  router.get('/workspaces/:wid/reports', requireAuth, async (req, res) => {
    res.json(
      await listWorkspaceReports(db, userIdOf(req), String(req.params['wid']), listQuery(req)),
    );
  });

  router.post('/workspaces/:wid/reports', requireAuth, async (req, res) => {
    const dto = parseBody(ReportCreateDto, req.body);
    const subjects = [dto.pairId, dto.pairIds, dto.cascadeId].filter((x) => x !== undefined);
    if (subjects.length !== 1) {
      throw validationFailed([
        {
          field: 'pairId',
          message: 'give one of pairId (one pair), pairIds (a comparison) or cascadeId (a cascade)',
        },
      ]);
    }
    if (dto.cascadeId !== undefined) {
      res.status(201).json(
        await createCascadeReport(deps, userIdOf(req), String(req.params['wid']), {
          cascadeId: dto.cascadeId,
          title: dto.title,
        }),
      );
      return;
    }
    const pairIds = dto.pairId ? [dto.pairId] : [...new Set(dto.pairIds)];
    if (dto.pairIds && pairIds.length < 2) {
      throw validationFailed([
        { field: 'pairIds', message: 'must list at least 2 different pairs' },
      ]);
    }
    const kind = dto.pairId ? 'pair' : 'comparison';
    res.status(201).json(
      await createReport(deps, userIdOf(req), String(req.params['wid']), {
        pairIds,
        kind,
        title: dto.title,
      }),
    );
  });

  router.get('/reviews/waiting', requireAuth, async (req, res) => {
    res.json(await waitingReviews(db, userIdOf(req)));
  });

  router.get('/reports/:id', requireAuth, async (req, res) => {
    res.json(await readReport(db, userIdOf(req), id(req)));
  });

  router.get('/reports/:id/pdf', requireAuth, async (req, res) => {
    const { pdf, view } = await reportPdf(deps, userIdOf(req), id(req));
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `attachment; filename="${reportFileName(view, 'pdf')}"`);
    res.setHeader('X-Snapshot-Id', view.snapshotId);
    res.setHeader('X-Report-Revision', String(view.revision));
    res.send(pdf);
  });

  router.get('/reports/:id/export', requireAuth, async (req, res) => {
    const errors: FieldError[] = [];
    const format = queryString(req.query['format'], 'format', errors) ?? 'json';
    if (format !== 'csv' && format !== 'json')
      errors.push({ field: 'format', message: 'must be csv or json' });
    if (errors.length) throw validationFailed(errors);
    const view = await readReport(db, userIdOf(req), id(req));
    res.setHeader('Content-Disposition', `attachment; filename="${reportFileName(view, format)}"`);
    if (format === 'csv') {
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.send(reportCsv(view));
    } else {
      res.json(reportJson(view));
    }
  });

  const actions: ReportAction[] = ['submit', 'request-changes', 'approve'];
  for (const action of actions) {
    router.post(`/reports/:id/${action}`, requireAuth, async (req, res) => {
      const dto = parseBody(ReportDecisionDto, req.body ?? {});
      res.json(
        await transitionReport(deps, userIdOf(req), id(req), action, dto.note?.trim() || null),
      );
    });
  }

  router.post('/reports/:id/revise', requireAuth, async (req, res) => {
    res.json(await reviseReport(deps, userIdOf(req), id(req)));
  });

  router.post('/reports/:id/comments', requireAuth, async (req, res) => {
    const dto = parseBody(ReportCommentDto, req.body);
    res.status(201).json(
      await commentOnReport(deps, userIdOf(req), id(req), {
        body: dto.body.trim(),
        anchor: dto.anchor ?? null,
        parentId: dto.parentId ?? null,
      }),
    );
  });

  router.delete('/reports/:id', requireAuth, async (req, res) => {
    await deleteReportUseCase(deps, userIdOf(req), id(req));
    res.status(204).end();
  });
}
