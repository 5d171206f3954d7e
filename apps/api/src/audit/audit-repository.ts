import type { EntityManager } from 'typeorm';
import type { AuditEvent, Page } from '@gapwise/contracts';

export interface AuditInput {
  readonly workspaceId: string | null;
  readonly actorId: string | null;
  readonly action: string;
  readonly entityType: string;
  readonly entityId: string | null;
  readonly summary: string;
  readonly before?: unknown;
  readonly after?: unknown;
}

/** Appends one audit event (call inside the transaction of the change it records). */
export async function recordAudit(db: EntityManager, e: AuditInput): Promise<void> {
  await db.query(
    `INSERT INTO audit_events (workspace_id, actor_id, action, entity_type, entity_id, summary, before, after)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8)`,
    [
      e.workspaceId,
      e.actorId,
      e.action,
      e.entityType,
      e.entityId,
      e.summary,
      e.before === undefined ? null : JSON.stringify(e.before),
      e.after === undefined ? null : JSON.stringify(e.after),
    ],
  );
}

export interface AuditPageQuery {
  readonly offset: number;
  readonly limit: number;
  readonly action?: string;
  readonly entityType?: string;
  readonly entityId?: string;
  /** Only events by this user. */
  readonly actorId?: string;
  /** First day (UTC, inclusive), `YYYY-MM-DD`. */
  readonly from?: string;
  /** Last day (UTC, inclusive), `YYYY-MM-DD`. */
  readonly to?: string;
}

export async function listAudit(
  db: EntityManager,
  workspaceId: string,
  q: AuditPageQuery,
): Promise<Page<AuditEvent & { before: unknown; after: unknown }>> {
  const where = ['a.workspace_id = $1'];
  const params: unknown[] = [workspaceId];
  if (q.action) where.push(`a.action = $${params.push(q.action)}`);
  if (q.entityType) where.push(`a.entity_type = $${params.push(q.entityType)}`);
  if (q.entityId) where.push(`a.entity_id = $${params.push(q.entityId)}`);
  if (q.actorId) where.push(`a.actor_id = $${params.push(q.actorId)}`);
  // Days are UTC days whatever the session's time zone; the last day counts whole.
  if (q.from) where.push(`a.at >= ($${params.push(q.from)}::date::timestamp AT TIME ZONE 'UTC')`);
  if (q.to) where.push(`a.at < (($${params.push(q.to)}::date + 1)::timestamp AT TIME ZONE 'UTC')`);
  const sqlWhere = where.join(' AND ');
  const [{ total }] = await db.query(
    `SELECT count(*)::int AS total FROM audit_events a WHERE ${sqlWhere}`,
    params,
  );
  const rows: Array<Record<string, unknown>> = await db.query(
    `SELECT a.id, a.at, a.action, a.entity_type, a.entity_id, a.summary, a.before, a.after,
            u.display_name AS actor
       FROM audit_events a LEFT JOIN users u ON u.id = a.actor_id
      WHERE ${sqlWhere}
      ORDER BY a.at DESC, a.id DESC
      OFFSET $${params.length + 1} LIMIT $${params.length + 2}`,
    [...params, q.offset, q.limit],
  );
  return {
    items: rows.map((r) => ({
      id: r['id'] as string,
      at: (r['at'] as Date).toISOString(),
      actor: (r['actor'] as string | null) ?? null,
      action: r['action'] as string,
      entityType: r['entity_type'] as string,
      entityId: (r['entity_id'] as string | null) ?? null,
      summary: r['summary'] as string,
      before: r['before'] ?? null,
      after: r['after'] ?? null,
    })),
    total,
    offset: q.offset,
    limit: q.limit,
  };
}
