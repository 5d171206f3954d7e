/**
 * SQL for reports, their comments and transitions. Returns plain objects (contracts shapes),
 * never entities.
 */
import type { EntityManager } from 'typeorm';
import type {
  ReportCommentView,
  ReportKind,
  ReportListItem,
  ReportSnapshot,
  ReportStatus,
  ReportTransitionView,
} from '@gapwise/contracts';

export interface ReportRow {
  readonly id: string;
  readonly workspaceId: string;
  readonly kind: ReportKind;
  readonly title: string;
  readonly status: ReportStatus;
  readonly authorId: string | null;
  readonly authorName: string;
  readonly pairIds: string[];
  /** A cascade report's cascade (null otherwise, or once the cascade is deleted). */
  readonly cascadeId: string | null;
  readonly snapshot: ReportSnapshot;
  readonly snapshotId: string;
  readonly revision: number;
  readonly pdfKey: string | null;
  readonly createdAt: string;
  readonly updatedAt: string;
}

const iso = (v: unknown) => (v instanceof Date ? v.toISOString() : String(v));

const SELECT_REPORT = `
  SELECT r.id, r.workspace_id, r.kind, r.title, r.status, r.author_id, r.pair_ids, r.cascade_id, r.snapshot,
         r.snapshot_id, r.revision, r.pdf_key, r.created_at, r.updated_at,
         COALESCE(u.display_name, 'former member') AS author_name, w.name AS workspace_name
    FROM reports r
    JOIN workspaces w ON w.id = r.workspace_id
    LEFT JOIN users u ON u.id = r.author_id`;

function toRow(r: any): ReportRow {
  return {
    id: r.id,
    workspaceId: r.workspace_id,
    kind: r.kind,
    title: r.title,
    status: r.status,
    authorId: r.author_id,
    authorName: r.author_name,
    pairIds: r.pair_ids ?? [],
    cascadeId: r.cascade_id ?? null,
    snapshot: r.snapshot,
    snapshotId: r.snapshot_id,
    revision: r.revision,
    pdfKey: r.pdf_key,
    createdAt: iso(r.created_at),
    updatedAt: iso(r.updated_at),
  };
}

function toListItem(r: any): ReportListItem {
  return {
    id: r.id,
    workspaceId: r.workspace_id,
    workspaceName: r.workspace_name,
    kind: r.kind,
    title: r.title,
    status: r.status,
    author: { id: r.author_id ?? '', displayName: r.author_name },
    pairIds: r.pair_ids ?? [],
    snapshotId: r.snapshot_id,
    createdAt: iso(r.created_at),
    updatedAt: iso(r.updated_at),
  };
}

export async function reportWorkspace(db: EntityManager, reportId: string): Promise<string | null> {
  const rows = await db.query('SELECT workspace_id FROM reports WHERE id = $1', [reportId]);
  return rows[0]?.workspace_id ?? null;
}

export async function findReport(
  db: EntityManager,
  reportId: string,
  lock = false,
): Promise<ReportRow | null> {
  if (lock) await db.query('SELECT id FROM reports WHERE id = $1 FOR UPDATE', [reportId]);
  const rows = await db.query(`${SELECT_REPORT} WHERE r.id = $1`, [reportId]);
  return rows[0] ? toRow(rows[0]) : null;
}

export interface NewReport {
  readonly workspaceId: string;
  readonly kind: ReportKind;
  readonly title: string;
  readonly authorId: string;
  readonly pairIds: readonly string[];
  /** A cascade report's cascade and the version frozen. */
  readonly cascade?: { readonly id: string; readonly version: number };
  readonly snapshot: ReportSnapshot;
  readonly snapshotId: string;
}

export async function insertReport(db: EntityManager, r: NewReport): Promise<string> {
  const rows = await db.query(
    `INSERT INTO reports (workspace_id, kind, title, status, author_id, pair_ids, snapshot, snapshot_id,
                          cascade_id, cascade_version)
     VALUES ($1, $2, $3, 'draft', $4, $5, $6, $7, $8, $9) RETURNING id`,
    [
      r.workspaceId,
      r.kind,
      r.title,
      r.authorId,
      r.pairIds,
      JSON.stringify(r.snapshot),
      r.snapshotId,
      r.cascade?.id ?? null,
      r.cascade?.version ?? null,
    ],
  );
  return rows[0].id;
}

/** Replaces the snapshot (revision of a draft) and bumps the revision. */
export async function replaceSnapshot(
  db: EntityManager,
  id: string,
  snapshot: ReportSnapshot,
  snapshotId: string,
): Promise<void> {
  await db.query(
    `UPDATE reports SET snapshot = $2, snapshot_id = $3, revision = revision + 1, pdf_key = NULL, updated_at = now()
      WHERE id = $1`,
    [id, JSON.stringify(snapshot), snapshotId],
  );
}

export async function setStatus(
  db: EntityManager,
  id: string,
  status: ReportStatus,
): Promise<void> {
  await db.query(
    'UPDATE reports SET status = $2, revision = revision + 1, pdf_key = NULL, updated_at = now() WHERE id = $1',
    [id, status],
  );
}

/** A comment changes the review history printed in the PDF: new revision. */
export async function bumpRevision(db: EntityManager, id: string): Promise<void> {
  await db.query(
    'UPDATE reports SET revision = revision + 1, pdf_key = NULL, updated_at = now() WHERE id = $1',
    [id],
  );
}

/** Records the stored PDF's key, only if the report is still at that revision. */
export async function setPdfKey(
  db: EntityManager,
  id: string,
  revision: number,
  key: string,
): Promise<void> {
  await db.query('UPDATE reports SET pdf_key = $3 WHERE id = $1 AND revision = $2', [
    id,
    revision,
    key,
  ]);
}

export async function deleteReport(db: EntityManager, id: string): Promise<void> {
  await db.query('DELETE FROM reports WHERE id = $1', [id]);
}

export async function insertTransition(
  db: EntityManager,
  reportId: string,
  from: ReportStatus | null,
  to: ReportStatus,
  byId: string,
  note: string | null,
  snapshotId: string,
): Promise<void> {
  await db.query(
    `INSERT INTO report_transitions (report_id, from_status, to_status, by_id, note, snapshot_id, at)
     VALUES ($1, $2, $3, $4, $5, $6, clock_timestamp())`,
    [reportId, from, to, byId, note, snapshotId],
  );
}

export async function listTransitions(
  db: EntityManager,
  reportId: string,
): Promise<ReportTransitionView[]> {
  const rows = await db.query(
    `SELECT t.from_status, t.to_status, t.by_id, t.at, t.note, t.snapshot_id, COALESCE(u.display_name, 'former member') AS name
       FROM report_transitions t LEFT JOIN users u ON u.id = t.by_id
      WHERE t.report_id = $1 ORDER BY t.at, t.id`,
    [reportId],
  );
  return rows.map((r: any) => ({
    from: r.from_status,
    to: r.to_status,
    by: { id: r.by_id ?? '', displayName: r.name },
    at: iso(r.at),
    note: r.note,
    snapshotId: r.snapshot_id ?? null,
  }));
}

export async function insertComment(
  db: EntityManager,
  c: {
    reportId: string;
    authorId: string;
    body: string;
    anchor: string | null;
    parentId: string | null;
  },
): Promise<string> {
  const rows = await db.query(
    `INSERT INTO report_comments (report_id, author_id, body, anchor, parent_id, created_at)
     VALUES ($1, $2, $3, $4, $5, clock_timestamp()) RETURNING id`,
    [c.reportId, c.authorId, c.body, c.anchor, c.parentId],
  );
  return rows[0].id;
}

export async function findComment(
  db: EntityManager,
  id: string,
): Promise<{ reportId: string; authorId: string | null } | null> {
  const rows = await db.query('SELECT report_id, author_id FROM report_comments WHERE id = $1', [
    id,
  ]);
  return rows[0] ? { reportId: rows[0].report_id, authorId: rows[0].author_id } : null;
}

export async function listComments(
  db: EntityManager,
  reportId: string,
): Promise<ReportCommentView[]> {
  const rows = await db.query(
    `SELECT c.id, c.author_id, c.body, c.anchor, c.parent_id, c.created_at,
            COALESCE(u.display_name, 'former member') AS name
       FROM report_comments c LEFT JOIN users u ON u.id = c.author_id
      WHERE c.report_id = $1 ORDER BY c.created_at, c.id`,
    [reportId],
  );
  return rows.map((r: any) => ({
    id: r.id,
    author: { id: r.author_id ?? '', displayName: r.name },
    body: r.body,
    anchor: r.anchor,
    parentId: r.parent_id,
    createdAt: iso(r.created_at),
  }));
}

export interface ReportListQuery {
  readonly status?: ReportStatus;
  readonly authorId?: string;
  readonly pairId?: string;
}

export async function listReports(
  db: EntityManager,
  workspaceId: string,
  q: ReportListQuery,
): Promise<ReportListItem[]> {
  const where = ['r.workspace_id = $1'];
  const params: unknown[] = [workspaceId];
  if (q.status) {
    params.push(q.status);
    where.push(`r.status = $${params.length}`);
  }
  if (q.authorId) {
    params.push(q.authorId);
    where.push(`r.author_id = $${params.length}`);
  }
  if (q.pairId) {
    params.push(q.pairId);
    where.push(`$${params.length} = ANY(r.pair_ids)`);
  }
  const rows = await db.query(
    `${SELECT_REPORT} WHERE ${where.join(' AND ')} ORDER BY r.updated_at DESC, r.id LIMIT 500`,
    params,
  );
  return rows.map(toListItem);
}

/** Submitted reports in workspaces where the user reviews (owner or reviewer) and is not the author. */
export async function listWaitingReviews(
  db: EntityManager,
  userId: string,
): Promise<ReportListItem[]> {
  const rows = await db.query(
    `${SELECT_REPORT}
      JOIN memberships m ON m.workspace_id = r.workspace_id AND m.user_id = $1 AND m.role IN ('owner', 'reviewer')
     WHERE r.status = 'submitted' AND r.author_id IS DISTINCT FROM $1
     ORDER BY r.updated_at ASC, r.id`,
    [userId],
  );
  return rows.map(toListItem);
}

/** E-mail addresses of members with the given roles, except `exceptUserId`. */
export async function memberAddresses(
  db: EntityManager,
  workspaceId: string,
  roles: readonly string[],
  exceptUserId: string | null,
): Promise<Array<{ id: string; email: string; displayName: string }>> {
  const rows = await db.query(
    `SELECT u.id, u.email, u.display_name FROM memberships m JOIN users u ON u.id = m.user_id
      WHERE m.workspace_id = $1 AND m.role = ANY($2) AND u.id IS DISTINCT FROM $3 ORDER BY u.email`,
    [workspaceId, roles, exceptUserId],
  );
  return rows.map((r: any) => ({ id: r.id, email: r.email, displayName: r.display_name }));
}

export async function userContact(
  db: EntityManager,
  userId: string,
): Promise<{ id: string; email: string; displayName: string } | null> {
  const rows = await db.query('SELECT id, email, display_name FROM users WHERE id = $1', [userId]);
  return rows[0]
    ? { id: rows[0].id, email: rows[0].email, displayName: rows[0].display_name }
    : null;
}

export async function workspaceName(db: EntityManager, workspaceId: string): Promise<string> {
  const rows = await db.query('SELECT name FROM workspaces WHERE id = $1', [workspaceId]);
  return rows[0]?.name ?? '';
}
