import type { Role } from './roles';

export interface WorkspaceSummary {
  readonly id: string;
  readonly name: string;
  readonly role: Role;
}

export interface Member {
  readonly userId: string;
  readonly email: string;
  readonly displayName: string;
  readonly role: Role;
}

export interface Invitation {
  readonly id: string;
  readonly email: string;
  readonly role: Role;
  readonly status: 'pending' | 'accepted' | 'revoked' | 'expired';
  readonly expiresAt: string;
  readonly createdAt: string;
}

export interface AuditEvent {
  readonly id: string;
  readonly at: string;
  readonly actor: string | null;
  readonly action: string;
  readonly entityType: string;
  readonly entityId: string | null;
  readonly summary: string;
}

/** Public preview of an invitation (`GET /api/invitations/:token`). */
export interface InvitationPreview {
  readonly workspaceName: string;
  readonly role: Role;
  readonly email: string;
  readonly status: Invitation['status'];
}

/** Body of `POST /api/workspaces/:wid/invitations`. */
export interface InvitationRequest {
  readonly email: string;
  readonly role: Role;
}

/** `GET /api/health`. */
export interface HealthInfo {
  readonly status: 'ok' | 'degraded';
  readonly version: string;
  readonly database: { readonly reachable: boolean };
  readonly migrations: { readonly applied: number; readonly pending: string[] } | null;
}
