import type { Request, Router } from 'express';
import { canReadAudit, csvRow } from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { validationFailed } from '../http/app-error';
import { isUuid, queryInt, queryString } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import { listAudit, type AuditPageQuery } from './audit-repository';

const DAY = /^\d{4}-\d{2}-\d{2}$/;

/** A `YYYY-MM-DD` day that exists on the calendar (2026-02-30 is refused). */
function queryDay(
  value: unknown,
  field: string,
  errors: Array<{ field: string; message: string }>,
): string | undefined {
  const text = queryString(value, field, errors, 10);
  if (text === undefined) return undefined;
  const date = new Date(`${text}T00:00:00Z`);
  if (!DAY.test(text) || Number.isNaN(date.getTime()) || date.toISOString().slice(0, 10) !== text) {
    errors.push({ field, message: 'must be a date written YYYY-MM-DD' });
    return undefined;
  }
  return text;
}

/** The filters shared by the page and the CSV export (person, record, action, days). */
function auditFilters(req: Request, errors: Array<{ field: string; message: string }>) {
  const actorId = queryString(req.query['actorId'], 'actorId', errors);
  if (actorId !== undefined && !isUuid(actorId)) {
    errors.push({ field: 'actorId', message: 'must be the id of a member' });
  }
  const from = queryDay(req.query['from'], 'from', errors);
  const to = queryDay(req.query['to'], 'to', errors);
  if (from && to && from > to) errors.push({ field: 'to', message: 'must not be before from' });
  return {
    action: queryString(req.query['action'], 'action', errors),
    entityType: queryString(req.query['entityType'], 'entityType', errors),
    entityId: queryString(req.query['entityId'], 'entityId', errors),
    actorId,
    from,
    to,
  } satisfies Omit<AuditPageQuery, 'offset' | 'limit'>;
}

/** Rows of one CSV export at most (the trail of a busy year fits; the page says so). */
const EXPORT_LIMIT = 50_000;

export function registerAuditRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  /** The workspace's audit trail, newest first (owner and reviewer). */
  router.get('/workspaces/:wid/audit', requireAuth, async (req, res) => {
    const wid = String(req.params['wid']);
    await requireRole(db.manager, wid, userIdOf(req), canReadAudit);
    const errors: Array<{ field: string; message: string }> = [];
    const offset = queryInt(req.query['offset'], 'offset', 0, 0, 1_000_000, errors);
    const limit = queryInt(req.query['limit'], 'limit', 50, 1, 200, errors);
    const filters = auditFilters(req, errors);
    if (errors.length) throw validationFailed(errors);
    res.json(await listAudit(db.manager, wid, { offset, limit, ...filters }));
  });

  /**
   * The same trail as CSV (same filters, every matching row up to EXPORT_LIMIT), cells written
   * by the one CSV rule of the product (`csvRow`).
   */
  router.get('/workspaces/:wid/audit/export.csv', requireAuth, async (req, res) => {
    const wid = String(req.params['wid']);
    await requireRole(db.manager, wid, userIdOf(req), canReadAudit);
    const errors: Array<{ field: string; message: string }> = [];
    const filters = auditFilters(req, errors);
    if (errors.length) throw validationFailed(errors);
    const page = await listAudit(db.manager, wid, { offset: 0, limit: EXPORT_LIMIT, ...filters });
    const lines = [
      csvRow(['time (UTC)', 'person', 'action', 'record type', 'record id', 'summary']),
      ...page.items.map((e) =>
        csvRow([e.at, e.actor ?? '', e.action, e.entityType, e.entityId ?? '', e.summary]),
      ),
    ];
    res
      .type('text/csv; charset=utf-8')
      .attachment(`audit-${new Date().toISOString().slice(0, 10)}.csv`)
      .send(`${lines.join('\r\n')}\r\n`);
  });
}
