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
