import type { Router } from 'express';
import { canManageMembers } from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { parseBody } from '../http/validate';
import { RoleDto, WorkspaceNameDto } from './workspace-dto';
import { listWorkspacesOf } from './workspace-repository';
import { requireRole } from './workspace-access';
import {
  changeRole,
  createWorkspace,
  deleteWorkspaceUseCase,
  membersOf,
  removeMember,
  renameWorkspaceUseCase,
} from './workspace-use-case';

export function registerWorkspaceRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  const wid = (p: Record<string, string | string[]>) => String(p['wid']);

  router.get('/workspaces', requireAuth, async (req, res) => {
    res.json(await listWorkspacesOf(db.manager, userIdOf(req)));
  });
  router.post('/workspaces', requireAuth, async (req, res) => {
    const { name } = parseBody(WorkspaceNameDto, req.body);
    res.status(201).json(await createWorkspace(db, userIdOf(req), name));
  });
  router.patch('/workspaces/:wid', requireAuth, async (req, res) => {
    // Role first, then the body: a denied caller learns nothing from validation messages.
    await requireRole(db.manager, wid(req.params), userIdOf(req), canManageMembers);
    const { name } = parseBody(WorkspaceNameDto, req.body);
    res.json(await renameWorkspaceUseCase(db, userIdOf(req), wid(req.params), name));
  });
  router.delete('/workspaces/:wid', requireAuth, async (req, res) => {
    await deleteWorkspaceUseCase(db, userIdOf(req), wid(req.params));
    res.status(204).end();
  });

  router.get('/workspaces/:wid/members', requireAuth, async (req, res) => {
    res.json(await membersOf(db, userIdOf(req), wid(req.params)));
  });
  router.patch('/workspaces/:wid/members/:userId', requireAuth, async (req, res) => {
    await requireRole(db.manager, wid(req.params), userIdOf(req), canManageMembers);
    const { role } = parseBody(RoleDto, req.body);
    res.json(
      await changeRole(db, userIdOf(req), wid(req.params), String(req.params['userId']), role),
    );
  });
  router.delete('/workspaces/:wid/members/:userId', requireAuth, async (req, res) => {
    await removeMember(db, userIdOf(req), wid(req.params), String(req.params['userId']));
    res.status(204).end();
  });
}
