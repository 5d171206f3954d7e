import type { DataSource } from 'typeorm';
import {
  canManageMembers,
  type Invitation,
  type InvitationPreview,
  type MembershipSummary,
  type Role,
} from '@gapwise/contracts';
import type { Config } from '../config';
import { AppError, notFound } from '../http/app-error';
import type { MailQueue } from '../mail/mail-queue';
import { insertOutbox } from '../mail/outbox-repository';
import { recordAudit } from '../audit/audit-repository';
import { hashToken, randomToken } from '../auth/session-tokens';
import { findUserById } from '../auth/user-repository';
import { requireRole, roleIn } from '../workspaces/workspace-access';
import { upsertMembership, workspaceName } from '../workspaces/workspace-repository';
import {
  findInvitationById,
  findInvitationByTokenHash,
  insertInvitation,
  isMemberByEmail,
  markAccepted,
  revokeInvitation,
  revokePendingFor,
} from './invitation-repository';

export function invitationMail(
  config: Config,
  v: { workspace: string; role: Role; inviter: string; token: string; days: number },
) {
  const link = `${config.publicUrl}/invitations/${v.token}`;
  return {
    subject: `You are invited to ${v.workspace} on Gapwise`,
    text: [
      `${v.inviter} invited you to join the workspace "${v.workspace}" on Gapwise as ${v.role}.`,
      '',
      `Accept the invitation: ${link}`,
      '',
      `The link works once and expires in ${v.days} days. If you did not expect this message, ignore it.`,
    ].join('\n'),
    link,
  };
}

/**
 * Creates an invitation and its e-mail in one transaction: the outbox row and the queue job
 * commit together with the invitation, so a failing mail server never loses it.
 */
export async function createInvitation(
  db: DataSource,
  config: Config,
  queue: MailQueue | null,
  userId: string,
  workspaceId: string,
  email: string,
  role: Role,
): Promise<Invitation> {
  return db.transaction(async (tx) => {
    await requireRole(tx, workspaceId, userId, canManageMembers);
    const address = email.trim().toLowerCase();
    if (await isMemberByEmail(tx, workspaceId, address)) {
      throw new AppError(
        409,
        'already-member',
        'This address already belongs to a member of the workspace.',
      );
    }
    await revokePendingFor(tx, workspaceId, address);
    const token = randomToken();
    const expiresAt = new Date(Date.now() + config.invitationDays * 24 * 3600 * 1000);
    const invitation = await insertInvitation(tx, {
      workspaceId,
      email: address,
      role,
      tokenHash: hashToken(token),
      expiresAt,
      createdBy: userId,
    });
    const inviter = (await findUserById(tx, userId))?.displayName ?? 'A colleague';
    const mail = invitationMail(config, {
      workspace: invitation.workspaceName,
      role,
      inviter,
      token,
      days: config.invitationDays,
    });
    const outboxId = await insertOutbox(
      tx,
      'invitation',
      { to: address, subject: mail.subject, text: mail.text },
      invitation.id,
    );
    if (queue) await queue.enqueue(tx, outboxId);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'invitation.created',
      entityType: 'invitation',
      entityId: invitation.id,
      summary: `invited ${address} as ${role}`,
      after: { email: address, role },
    });
    const { workspaceId: _w, workspaceName: _n, ...out } = invitation;
    return out;
  });
}

export async function revokeInvitationUseCase(
  db: DataSource,
  userId: string,
  workspaceId: string,
  id: string,
): Promise<void> {
  await db.transaction(async (tx) => {
    await requireRole(tx, workspaceId, userId, canManageMembers);
    const invitation = await findInvitationById(tx, id);
    if (!invitation || invitation.workspaceId !== workspaceId) throw notFound('invitation');
    if (invitation.status === 'accepted')
      throw new AppError(409, 'invitation-used', 'This invitation was already accepted.');
    await revokeInvitation(tx, id);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'invitation.revoked',
      entityType: 'invitation',
      entityId: id,
      summary: `revoked the invitation of ${invitation.email}`,
    });
  });
}

const tokenOk = (token: string) =>
  token.length >= 20 && token.length <= 100 && /^[A-Za-z0-9_-]+$/.test(token);

export async function previewInvitation(db: DataSource, token: string): Promise<InvitationPreview> {
  const invitation = tokenOk(token)
    ? await findInvitationByTokenHash(db.manager, hashToken(token))
    : null;
  if (!invitation) throw notFound('invitation');
  return {
    workspaceName: invitation.workspaceName,
    role: invitation.role,
    email: invitation.email,
    status: invitation.status,
  };
}

export async function acceptInvitation(
  db: DataSource,
  userId: string,
  token: string,
): Promise<MembershipSummary> {
  return db.transaction(async (tx) => {
    const invitation = tokenOk(token)
      ? await findInvitationByTokenHash(tx, hashToken(token), true)
      : null;
    if (!invitation) throw notFound('invitation');
    const user = await findUserById(tx, userId);
    if (!user) throw notFound('invitation');
    if (user.email.toLowerCase() !== invitation.email.toLowerCase()) {
      throw new AppError(
        403,
        'invitation-email-mismatch',
        'This invitation was sent to another e-mail address; sign in with that address.',
      );
    }
    if (invitation.status === 'revoked')
      throw new AppError(410, 'invitation-revoked', 'This invitation was revoked.');
    if (invitation.status === 'expired')
      throw new AppError(
        410,
        'invitation-expired',
        'This invitation has expired; ask for a new one.',
      );
    if (invitation.status === 'accepted')
      throw new AppError(409, 'invitation-used', 'This invitation was already accepted.');
    const existing = await roleIn(tx, invitation.workspaceId, userId);
    const role = existing ?? invitation.role;
    if (!existing) await upsertMembership(tx, invitation.workspaceId, userId, role);
    await markAccepted(tx, invitation.id, userId);
    await recordAudit(tx, {
      workspaceId: invitation.workspaceId,
      actorId: userId,
      action: 'invitation.accepted',
      entityType: 'invitation',
      entityId: invitation.id,
      summary: existing ? `accepted an invitation (already ${existing})` : `joined as ${role}`,
      after: { role },
    });
    return {
      workspaceId: invitation.workspaceId,
      workspaceName: (await workspaceName(tx, invitation.workspaceId)) ?? invitation.workspaceName,
      role,
    };
  });
}
