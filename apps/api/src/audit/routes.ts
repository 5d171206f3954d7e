import type { Router } from 'express';
import { canReadAudit } from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { validationFailed } from '../http/app-error';
import { queryInt, queryString } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import { listAudit } from './audit-repository';

export function registerAuditRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  /** The workspace's audit trail, newest first (owner and reviewer). */
  router.get('/workspaces/:wid/audit', requireAuth, async (req, res) => {
    const wid = String(req.params['wid']);
    await requireRole(db.manager, wid, userIdOf(req), canReadAudit);
    const errors: Array<{ field: string; message: string }> = [];
    const offset = queryInt(req.query['offset'], 'offset', 0, 0, 1_000_000, errors);
    const limit = queryInt(req.query['limit'], 'limit', 50, 1, 200, errors);
    const action = queryString(req.query['action'], 'action', errors);
    const entityType = queryString(req.query['entityType'], 'entityType', errors);
    const entityId = queryString(req.query['entityId'], 'entityId', errors);
    if (errors.length) throw validationFailed(errors);
    res.json(await listAudit(db.manager, wid, { offset, limit, action, entityType, entityId }));
  });
}
