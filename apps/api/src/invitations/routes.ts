import type { Router } from 'express';
import { IsEmail, IsIn, IsString, MaxLength } from 'class-validator';
import { canManageMembers, ROLES, type Role } from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { parseBody } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import { listInvitations } from './invitation-repository';
import {
  acceptInvitation,
  createInvitation,
  previewInvitation,
  revokeInvitationUseCase,
} from './invitation-use-case';

export class InvitationDto {
  @IsString()
  @MaxLength(254)
  @IsEmail({}, { message: 'must be an e-mail address' })
  email: string;

  @IsIn(ROLES, { message: `must be one of ${ROLES.join(', ')}` })
  role: Role;
}

export function registerInvitationRoutes(router: Router, deps: AppDeps): void {
  const { dataSource: db, config, queue } = deps;
  const wid = (p: Record<string, string | string[]>) => String(p['wid']);

  router.get('/workspaces/:wid/invitations', requireAuth, async (req, res) => {
    await requireRole(db.manager, wid(req.params), userIdOf(req), canManageMembers);
    res.json(await listInvitations(db.manager, wid(req.params)));
  });
  router.post('/workspaces/:wid/invitations', requireAuth, async (req, res) => {
    await requireRole(db.manager, wid(req.params), userIdOf(req), canManageMembers);
    const { email, role } = parseBody(InvitationDto, req.body);
    res
      .status(201)
      .json(await createInvitation(db, config, queue, userIdOf(req), wid(req.params), email, role));
  });
  router.delete('/workspaces/:wid/invitations/:id', requireAuth, async (req, res) => {
    await revokeInvitationUseCase(db, userIdOf(req), wid(req.params), String(req.params['id']));
    res.status(204).end();
  });
  /** Public: what the accept page shows before sign-in. */
  router.get('/invitations/:token', async (req, res) => {
    res.json(await previewInvitation(db, String(req.params['token'])));
  });
  router.post('/invitations/:token/accept', requireAuth, async (req, res) => {
    res.json(await acceptInvitation(db, userIdOf(req), String(req.params['token'])));
  });
}
