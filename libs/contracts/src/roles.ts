/** Workspace roles (PRODUCT.md): what each may do is decided by the API; the web mirrors it. */
export const ROLES = ['owner', 'editor', 'reviewer', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

/** Whether a role may create or change pairs, traces, series, screens and draft reports. */
export function canEdit(role: Role | null | undefined): boolean {
  return role === 'owner' || role === 'editor';
}

/** Whether a role may manage members, invitations and the workspace itself. */
export function canManageMembers(role: Role | null | undefined): boolean {
  return role === 'owner';
}

/** Whether a role may read the audit trail. */
export function canReadAudit(role: Role | null | undefined): boolean {
  return role === 'owner' || role === 'reviewer';
}

/** Whether a role may comment on and decide submitted reports. */
export function canReview(role: Role | null | undefined): boolean {
  return role === 'owner' || role === 'reviewer';
}
