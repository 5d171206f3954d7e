/**
 * Reports: creation (a frozen snapshot of pairs), review transitions, comments, revisions,
 * deletion and the PDF. Every change is one transaction with its audit event and its e-mails
 * (outbox rows plus queue jobs), so a notice exists exactly when the change does.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { DataSource, EntityManager } from 'typeorm';
import {
  canEdit,
  canReview,
  isReportFrozen,
  REPORT_TRANSITIONS,
  type Pair,
  type ReportAction,
  type ReportKind,
  type ReportListItem,
  type ReportReviewState,
  type ReportStatus,
  type ReportView,
  type Role,
} from '@gapwise/contracts';
import { REPO_ROOT } from '../config';
import type { ComputeRunner } from '../compute/compute-tasks';
import { AppError, forbidden, notFound, validationFailed } from '../http/app-error';
import type { AppDeps } from '../http/context';
import { isUuid } from '../http/validate';
import { recordAudit } from '../audit/audit-repository';
import { insertOutbox } from '../mail/outbox-repository';
import { findPair } from '../pairs/pair-repository';
import { CascadeEntity } from '@gapwise/db';
import type { CascadeForReport } from './cascade-report-snapshot';
import { requireRole } from '../workspaces/workspace-access';
import { reportPdfKey, type ReportPdfStore } from './report-pdf-store';
import * as repo from './report-repository';

export type ReportDeps = Pick<AppDeps, 'dataSource' | 'config' | 'queue'> & {
  /** Where snapshots and PDFs are computed: the server's pool (inline only for the demo seed). */
  readonly compute: ComputeRunner;
  readonly reportPdfStore?: ReportPdfStore | null;
};

const REPORT_ADVICE =
  'Report fewer pairs, or give the pairs a larger ħω or the classical or thermal form.';

let softwareVersionCache: string | null = null;
/** The product version printed on every report (root package.json). */
export function softwareVersion(): string {
  if (softwareVersionCache) return softwareVersionCache;
  try {
    const pkg = JSON.parse(readFileSync(join(REPO_ROOT, 'package.json'), 'utf8')) as {
      version?: string;
    };
    softwareVersionCache = pkg.version ?? 'unknown';
  } catch {
    softwareVersionCache = 'unknown';
  }
  return softwareVersionCache;
}

const conflict = (code: string, message: string) => new AppError(409, code, message);
const frozen = () =>
  conflict('report-frozen', 'This report is approved and frozen; it cannot change.');

/** Loads a report the caller may see (404 for non-members), checking the role rule (403). */
export async function reportForCaller(
  db: EntityManager,
  reportId: string,
  userId: string,
  allowed: (role: Role) => boolean = () => true,
): Promise<{ report: repo.ReportRow; role: Role }> {
  if (!isUuid(reportId)) throw notFound('report');
  const workspaceId = await repo.reportWorkspace(db, reportId);
  if (!workspaceId) throw notFound('report');
  const role = await requireRole(db, workspaceId, userId, allowed, 'report');
  const report = await repo.findReport(db, reportId);
  if (!report) throw notFound('report');
  return { report, role };
}

async function loadPairs(
  db: EntityManager,
  workspaceId: string,
  pairIds: readonly string[],
): Promise<Pair[]> {
  const pairs: Pair[] = [];
  const errors: Array<{ field: string; message: string }> = [];
  for (const [i, id] of pairIds.entries()) {
    const pair = isUuid(id) ? await findPair(db, id) : null;
    if (!pair || pair.workspaceId !== workspaceId) {
      errors.push({
        field: pairIds.length === 1 ? 'pairId' : `pairIds.${i}`,
        message: 'no such pair in this workspace',
      });
    } else pairs.push(pair);
  }
  if (errors.length) throw validationFailed(errors);
  return pairs;
}

/**
 * The report snapshot (every model's results, Monte Carlo intervals) and its content hash,
 * computed in the pool within the interactive budget. Called before any transaction opens.
 */
async function freeze(
  deps: ReportDeps,
  kind: ReportKind,
  title: string,
  workspaceId: string,
  authorId: string,
  pairs: Pair[],
  authorName: string,
) {
  const context = {
    kind,
    title,
    workspace: {
      id: workspaceId,
      name: await repo.workspaceName(deps.dataSource.manager, workspaceId),
    },
    author: { id: authorId, displayName: authorName },
    createdAt: new Date().toISOString(),
    softwareVersion: softwareVersion(),
  };
  return deps.compute.run('reportSnapshot', [context, pairs], {
    budget: 'interactive',
    advice: REPORT_ADVICE,
  });
}

/**
 * Inside the writing transaction: the pairs are locked and must still be at the versions the
 * snapshot was computed from (a save meanwhile answers 409 and nothing is written).
 */
async function requireSamePairs(tx: EntityManager, pairs: readonly Pair[]): Promise<void> {
  // Locked in id order, so two reports sharing pairs never wait on each other in a cycle.
  for (const pair of [...pairs].sort((a, b) => (a.id < b.id ? -1 : 1))) {
    const now = await findPair(tx, pair.id, true);
    if (!now || now.version !== pair.version) {
      throw conflict(
        'pair-changed',
        `Pair "${pair.name}" changed while the report was being computed; try again.`,
      );
    }
  }
}

function reportLink(deps: ReportDeps, report: { id: string; workspaceId: string }): string {
  return `${deps.config.publicUrl}/w/${report.workspaceId}/reports/${report.id}`;
}

async function notify(
  tx: EntityManager,
  deps: ReportDeps,
  kind: string,
  reportId: string,
  recipients: ReadonlyArray<{ email: string }>,
  subject: string,
  text: string,
): Promise<void> {
  const seen = new Set<string>();
  for (const r of recipients) {
    if (seen.has(r.email)) continue;
    seen.add(r.email);
    const outboxId = await insertOutbox(tx, kind, { to: r.email, subject, text }, reportId);
    if (deps.queue) await deps.queue.enqueue(tx, outboxId);
  }
}

export interface CreateReportInput {
  readonly pairIds: readonly string[];
  readonly kind: ReportKind;
  readonly title?: string;
}

export async function createReport(
  deps: ReportDeps,
  userId: string,
  workspaceId: string,
  input: CreateReportInput,
): Promise<ReportView> {
  const db = deps.dataSource;
  await requireRole(db.manager, workspaceId, userId, canEdit);
  // Read and computed before the transaction opens: no transaction waits on the calculation.
  const pairs = await loadPairs(db.manager, workspaceId, input.pairIds);
  const me = await repo.userContact(db.manager, userId);
  const title =
    input.title?.trim() ||
    (input.kind === 'pair'
      ? `${pairs[0].name}: electron-transfer rate estimate`
      : `Comparison of ${pairs.length} pairs`);
  const { snapshot, snapshotId } = await freeze(
    deps,
    input.kind,
    title,
    workspaceId,
    userId,
    pairs,
    me?.displayName ?? '',
  );
  const id = await db.transaction(async (tx) => {
    await requireSamePairs(tx, pairs);
    const reportId = await repo.insertReport(tx, {
      workspaceId,
      kind: input.kind,
      title,
      authorId: userId,
      pairIds: pairs.map((p) => p.id),
      snapshot,
      snapshotId,
    });
    await repo.insertTransition(tx, reportId, null, 'draft', userId, null, snapshotId);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'report.create',
      entityType: 'report',
      entityId: reportId,
      summary: `Report "${title}" created from ${pairs.map((p) => `${p.name} v${p.version}`).join(', ')}`,
      after: { snapshotId, pairs: pairs.map((p) => ({ id: p.id, version: p.version })) },
    });
    return reportId;
  });
  return readReport(db, userId, id);
}

export interface CreateCascadeReportInput {
  readonly cascadeId: string;
  readonly title?: string;
}

const CASCADE_REPORT_ADVICE =
  'Make the cascade smaller (fewer states or links), or state fewer uncertainties.';

/** The cascade of a workspace at its current version; 400 naming `cascadeId` otherwise. */
async function loadCascade(
  db: EntityManager,
  workspaceId: string,
  cascadeId: string | null,
  lock = false,
): Promise<CascadeForReport> {
  const row =
    cascadeId && isUuid(cascadeId)
      ? await db.getRepository(CascadeEntity).findOne({
          where: { id: cascadeId },
          ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}),
        })
      : null;
  if (!row || row.workspaceId !== workspaceId) {
    throw validationFailed([{ field: 'cascadeId', message: 'no such cascade in this workspace' }]);
  }
  return {
    id: row.id,
    version: row.version,
    name: row.name,
    notes: row.notes,
    network: row.network,
  };
}

/** Inside the writing transaction: the cascade must still be at the version frozen (else 409). */
async function requireSameCascade(tx: EntityManager, cascade: CascadeForReport): Promise<void> {
  const now = await tx
    .getRepository(CascadeEntity)
    .findOne({ where: { id: cascade.id }, lock: { mode: 'pessimistic_write' } });
  if (!now || now.version !== cascade.version) {
    throw conflict(
      'cascade-changed',
      `Cascade "${cascade.name}" changed while the report was being computed; try again.`,
    );
  }
}

/** The cascade snapshot computed in the pool (full network, Monte Carlo), before any transaction. */
async function freezeCascade(
  deps: ReportDeps,
  title: string,
  workspaceId: string,
  authorId: string,
  authorName: string,
  cascade: CascadeForReport,
) {
  const context = {
    kind: 'cascade' as const,
    title,
    workspace: {
      id: workspaceId,
      name: await repo.workspaceName(deps.dataSource.manager, workspaceId),
    },
    author: { id: authorId, displayName: authorName },
    createdAt: new Date().toISOString(),
    softwareVersion: softwareVersion(),
  };
  return deps.compute.run('cascadeReportSnapshot', [context, cascade], {
    budget: 'interactive',
    advice: CASCADE_REPORT_ADVICE,
  });
}

/** A report of a cascade at its current version (kind `cascade`); same review as pair reports. */
export async function createCascadeReport(
  deps: ReportDeps,
  userId: string,
  workspaceId: string,
  input: CreateCascadeReportInput,
): Promise<ReportView> {
  const db = deps.dataSource;
  await requireRole(db.manager, workspaceId, userId, canEdit);
  const cascade = await loadCascade(db.manager, workspaceId, input.cascadeId);
  const me = await repo.userContact(db.manager, userId);
  const title = input.title?.trim() || `${cascade.name}: yields and lifetimes of the cascade`;
  const { snapshot, snapshotId } = await freezeCascade(
    deps,
    title,
    workspaceId,
    userId,
    me?.displayName ?? '',
    cascade,
  );
  const id = await db.transaction(async (tx) => {
    await requireSameCascade(tx, cascade);
    const reportId = await repo.insertReport(tx, {
      workspaceId,
      kind: 'cascade',
      title,
      authorId: userId,
      pairIds: [],
      cascade: { id: cascade.id, version: cascade.version },
      snapshot,
      snapshotId,
    });
    await repo.insertTransition(tx, reportId, null, 'draft', userId, null, snapshotId);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'report.create',
      entityType: 'report',
      entityId: reportId,
      summary: `Report "${title}" created from cascade ${cascade.name} v${cascade.version}`,
      after: { snapshotId, cascade: { id: cascade.id, version: cascade.version } },
    });
    return reportId;
  });
  return readReport(db, userId, id);
}

export async function readReport(
  db: DataSource,
  userId: string,
  reportId: string,
): Promise<ReportView> {
  const { report } = await reportForCaller(db.manager, reportId, userId);
  return viewOf(db.manager, report);
}

async function viewOf(db: EntityManager, report: repo.ReportRow): Promise<ReportView> {
  const [history, comments] = await Promise.all([
    repo.listTransitions(db, report.id),
    repo.listComments(db, report.id),
  ]);
  return {
    reportId: report.id,
    workspaceId: report.workspaceId,
    kind: report.kind,
    title: report.title,
    author: { id: report.authorId ?? '', displayName: report.authorName },
    pairIds: report.pairIds,
    snapshot: report.snapshot,
    snapshotId: report.snapshotId,
    revision: report.revision,
    status: report.status,
    history,
    comments,
    createdAt: report.createdAt,
    updatedAt: report.updatedAt,
  };
}

export async function listWorkspaceReports(
  db: DataSource,
  userId: string,
  workspaceId: string,
  query: repo.ReportListQuery,
): Promise<ReportListItem[]> {
  await requireRole(db.manager, workspaceId, userId);
  return repo.listReports(db.manager, workspaceId, query);
}

export async function waitingReviews(db: DataSource, userId: string): Promise<ReportListItem[]> {
  return repo.listWaitingReviews(db.manager, userId);
}

const ACTION_RULES: Record<ReportAction, (role: Role) => boolean> = {
  submit: canEdit,
  'request-changes': canReview,
  approve: canReview,
};

const ACTION_VERBS: Record<ReportAction, string> = {
  submit: 'submitted for review',
  'request-changes': 'returned with changes requested',
  approve: 'approved',
};

/** Applies a review action: checks role, status and the author rule; audits and e-mails. */
export async function transitionReport(
  deps: ReportDeps,
  userId: string,
  reportId: string,
  action: ReportAction,
  note: string | null,
): Promise<ReportView> {
  const db = deps.dataSource;
  await reportForCaller(db.manager, reportId, userId, ACTION_RULES[action]);
  await db.transaction(async (tx) => {
    const report = await repo.findReport(tx, reportId, true);
    if (!report) throw notFound('report');
    const rule = REPORT_TRANSITIONS[action];
    if (isReportFrozen(report.status)) throw frozen();
    if (!(rule.from as readonly ReportStatus[]).includes(report.status)) {
      throw conflict(
        'invalid-transition',
        `A ${report.status} report cannot be ${ACTION_VERBS[action]}.`,
      );
    }
    if (action === 'approve' && report.authorId === userId) {
      throw forbidden('The author of a report cannot approve it; another reviewer must.');
    }
    await repo.setStatus(tx, reportId, rule.to);
    await repo.insertTransition(
      tx,
      reportId,
      report.status,
      rule.to,
      userId,
      note,
      report.snapshotId,
    );
    const actor = await repo.userContact(tx, userId);
    await recordAudit(tx, {
      workspaceId: report.workspaceId,
      actorId: userId,
      action: `report.${action}`,
      entityType: 'report',
      entityId: reportId,
      summary: `Report "${report.title}" ${ACTION_VERBS[action]}${note ? `: ${note}` : ''}`,
      before: { status: report.status },
      after: { status: rule.to, snapshotId: report.snapshotId },
    });
    const link = reportLink(deps, report);
    const who = actor?.displayName ?? 'A member';
    const noteLine = note ? `\n\nNote: ${note}` : '';
    if (action === 'submit') {
      const reviewers = await repo.memberAddresses(
        tx,
        report.workspaceId,
        ['owner', 'reviewer'],
        report.authorId,
      );
      await notify(
        tx,
        deps,
        'report-submitted',
        reportId,
        reviewers.filter((r) => r.id !== userId),
        `Review requested: ${report.title}`,
        `${who} submitted the report "${report.title}" for review.${noteLine}\n\nOpen it: ${link}\n`,
      );
    } else {
      const author = report.authorId ? await repo.userContact(tx, report.authorId) : null;
      const subject =
        action === 'approve' ? `Approved: ${report.title}` : `Changes requested: ${report.title}`;
      const text =
        action === 'approve'
          ? `${who} approved your report "${report.title}". It is now frozen; the approved PDF is the one ` +
            `downloaded from now on.${noteLine}\n\nOpen it: ${link}\n`
          : `${who} asked for changes to your report "${report.title}".${noteLine}\n\nOpen it: ${link}\n`;
      await notify(
        tx,
        deps,
        `report-${action}`,
        reportId,
        author && author.id !== userId ? [author] : [],
        subject,
        text,
      );
    }
  });
  if (action === 'approve') {
    // Store the approved document now, so the bytes a reviewer signed off exist from this moment.
    await reportPdf(deps, userId, reportId).catch(() => undefined);
  }
  return readReport(db, userId, reportId);
}

/** New snapshot from the pairs' current versions, while the report is a draft or sent back. */
export async function reviseReport(
  deps: ReportDeps,
  userId: string,
  reportId: string,
): Promise<ReportView> {
  const db = deps.dataSource;
  const { report: seen } = await reportForCaller(db.manager, reportId, userId, canEdit);
  const revisable = (report: repo.ReportRow) => {
    if (isReportFrozen(report.status)) throw frozen();
    if (report.status !== 'draft' && report.status !== 'changes-requested') {
      throw conflict(
        'invalid-transition',
        `A ${report.status} report cannot be revised; ask the reviewer to request changes.`,
      );
    }
  };
  revisable(seen);
  if (seen.kind === 'cascade') {
    // The cascade at its current version, frozen in the pool before the transaction.
    const cascade = await loadCascade(db.manager, seen.workspaceId, seen.cascadeId);
    const frozenCascade = await freezeCascade(
      deps,
      seen.title,
      seen.workspaceId,
      seen.authorId ?? userId,
      seen.authorName,
      cascade,
    );
    await db.transaction(async (tx) => {
      const report = await repo.findReport(tx, reportId, true);
      if (!report) throw notFound('report');
      revisable(report);
      await requireSameCascade(tx, cascade);
      await repo.replaceSnapshot(tx, reportId, frozenCascade.snapshot, frozenCascade.snapshotId);
      await recordAudit(tx, {
        workspaceId: report.workspaceId,
        actorId: userId,
        action: 'report.revise',
        entityType: 'report',
        entityId: reportId,
        summary: `Report "${report.title}" revised from cascade ${cascade.name} v${cascade.version}`,
        before: { snapshotId: report.snapshotId },
        after: {
          snapshotId: frozenCascade.snapshotId,
          cascade: { id: cascade.id, version: cascade.version },
        },
      });
    });
    return readReport(db, userId, reportId);
  }
  // Read and computed before the transaction opens: no transaction waits on the calculation.
  const pairs = await loadPairs(db.manager, seen.workspaceId, seen.pairIds);
  const { snapshot, snapshotId } = await freeze(
    deps,
    seen.kind,
    seen.title,
    seen.workspaceId,
    seen.authorId ?? userId,
    pairs,
    seen.authorName,
  );
  await db.transaction(async (tx) => {
    const report = await repo.findReport(tx, reportId, true);
    if (!report) throw notFound('report');
    revisable(report);
    await requireSamePairs(tx, pairs);
    await repo.replaceSnapshot(tx, reportId, snapshot, snapshotId);
    await recordAudit(tx, {
      workspaceId: report.workspaceId,
      actorId: userId,
      action: 'report.revise',
      entityType: 'report',
      entityId: reportId,
      summary: `Report "${report.title}" revised from ${pairs.map((p) => `${p.name} v${p.version}`).join(', ')}`,
      before: { snapshotId: report.snapshotId },
      after: { snapshotId, pairs: pairs.map((p) => ({ id: p.id, version: p.version })) },
    });
  });
  return readReport(db, userId, reportId);
}

export interface CommentInput {
  readonly body: string;
  readonly anchor: string | null;
  readonly parentId: string | null;
}

export async function commentOnReport(
  deps: ReportDeps,
  userId: string,
  reportId: string,
  input: CommentInput,
): Promise<ReportView> {
  const db = deps.dataSource;
  const { report: seen } = await reportForCaller(
    db.manager,
    reportId,
    userId,
    (r) => canEdit(r) || canReview(r),
  );
  const anchors = new Set(
    seen.snapshot.pairs.flatMap((p) => p.inputs.map((i) => i.kind as string)),
  );
  const errors: Array<{ field: string; message: string }> = [];
  if (input.anchor !== null && !anchors.has(input.anchor)) {
    errors.push({
      field: 'anchor',
      message: `must be one of the report's parameters: ${[...anchors].join(', ')}`,
    });
  }
  // The parameter as the report labels it ("Electronic coupling |H_AB|", subscripts written
  // with _ in plain-text mail), never its code name.
  const anchorLabel = input.anchor
    ? (seen.snapshot.pairs.flatMap((p) => p.inputs).find((i) => i.kind === input.anchor)?.label ??
      input.anchor)
    : null;
  await db.transaction(async (tx) => {
    const report = await repo.findReport(tx, reportId, true);
    if (!report) throw notFound('report');
    if (isReportFrozen(report.status)) throw frozen();
    if (input.parentId !== null) {
      const parent = isUuid(input.parentId) ? await repo.findComment(tx, input.parentId) : null;
      if (!parent || parent.reportId !== reportId)
        errors.push({ field: 'parentId', message: 'no such comment on this report' });
    }
    if (errors.length) throw validationFailed(errors);
    const commentId = await repo.insertComment(tx, { reportId, authorId: userId, ...input });
    await repo.bumpRevision(tx, reportId);
    await recordAudit(tx, {
      workspaceId: report.workspaceId,
      actorId: userId,
      action: 'report.comment',
      entityType: 'report',
      entityId: reportId,
      summary: `Comment on report "${report.title}"${anchorLabel ? ` (on ${anchorLabel})` : ''}`,
      after: { commentId, anchor: input.anchor, parentId: input.parentId },
    });
    // Tell the author, and the author of the comment replied to.
    const actor = await repo.userContact(tx, userId);
    const recipients: Array<{ id: string; email: string }> = [];
    if (report.authorId && report.authorId !== userId) {
      const a = await repo.userContact(tx, report.authorId);
      if (a) recipients.push(a);
    }
    if (input.parentId) {
      const parent = await repo.findComment(tx, input.parentId);
      if (parent?.authorId && parent.authorId !== userId) {
        const p = await repo.userContact(tx, parent.authorId);
        if (p) recipients.push(p);
      }
    }
    const on = anchorLabel ? ` on ${anchorLabel} in` : ' on';
    await notify(
      tx,
      deps,
      'report-comment',
      reportId,
      recipients,
      `New comment: ${report.title}`,
      `${actor?.displayName ?? 'A member'} commented${on} the report "${report.title}":\n\n${input.body}\n\n` +
        `Open it: ${reportLink(deps, report)}\n`,
    );
  });
  return readReport(db, userId, reportId);
}

export async function deleteReportUseCase(
  deps: ReportDeps,
  userId: string,
  reportId: string,
): Promise<void> {
  const db = deps.dataSource;
  await reportForCaller(db.manager, reportId, userId, canEdit);
  await db.transaction(async (tx) => {
    const report = await repo.findReport(tx, reportId, true);
    if (!report) throw notFound('report');
    if (isReportFrozen(report.status)) throw frozen();
    await repo.deleteReport(tx, reportId);
    await recordAudit(tx, {
      workspaceId: report.workspaceId,
      actorId: userId,
      action: 'report.delete',
      entityType: 'report',
      entityId: reportId,
      summary: `Report "${report.title}" deleted (was ${report.status})`,
      before: { status: report.status, snapshotId: report.snapshotId },
    });
  });
}

function reviewState(view: ReportView): ReportReviewState {
  return {
    reportId: view.reportId,
    snapshotId: view.snapshotId,
    revision: view.revision,
    status: view.status,
    history: view.history,
    comments: view.comments,
  };
}

/**
 * The PDF of the report's current revision: the stored object when there is one, else rendered,
 * stored once, and returned.
 */
export async function reportPdf(
  deps: ReportDeps,
  userId: string,
  reportId: string,
): Promise<{ pdf: Buffer; view: ReportView }> {
  const view = await readReport(deps.dataSource, userId, reportId);
  const store = deps.reportPdfStore ?? null;
  const key = reportPdfKey(view.snapshotId, view.revision);
  if (store) {
    const stored = await store.get(key);
    if (stored) return { pdf: stored, view };
  }
  // Layout and plots are computed in the pool; the bytes come back as a Uint8Array.
  const bytes = await deps.compute.run('reportPdf', [view.snapshot, reviewState(view)], {
    budget: 'interactive',
    advice: REPORT_ADVICE,
  });
  const pdf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (store) {
    await store.put(key, pdf);
    await repo.setPdfKey(deps.dataSource.manager, reportId, view.revision, key);
  }
  return { pdf, view };
}

/** A file name for downloads: letters, digits and dashes. */
export function reportFileName(view: ReportView, extension: string): string {
  const base =
    view.title
      .normalize('NFKD')
      .replace(/[^A-Za-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')
      .slice(0, 60) || 'report';
  return `${base}-${view.snapshotId.slice(0, 12)}-r${view.revision}.${extension}`;
}
