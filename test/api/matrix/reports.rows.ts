import { createReport, transitionReport } from '../../../apps/api/src/reports/report-use-case';
import {
  editors,
  members,
  signedIn,
  type Caller,
  type CaseContext,
  type MatrixRow,
} from './matrix-types';

type ReportSetup = 'draft' | 'submitted';

/**
 * Waits until every queued e-mail has been sent, so no mail job (from an earlier caller's submit,
 * decision or comment) changes `mail_outbox` while a denied caller's request is fingerprinted.
 */
async function mailSettled(c: CaseContext): Promise<void> {
  for (let i = 0; i < 300; i++) {
    const [{ n }] = await c.t.db.query(
      `SELECT count(*)::int AS n FROM mail_outbox WHERE status = 'pending'`,
    );
    if (n === 0) return;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error('e-mails still pending after 15 s');
}

/**
 * A fresh report of the case's pair, written by `author` (the extra editor unless said), taken
 * to `state` through the use-cases (with the real mail queue), once all e-mail has gone out.
 */
async function report(
  c: CaseContext,
  state: ReportSetup,
  author: 'extra' | 'owner' = 'extra',
): Promise<string> {
  const deps = c.t.runtime;
  const authorId = author === 'owner' ? c.users.owner.id : c.extraMemberId;
  const view = await createReport(deps, authorId, c.workspaceId, {
    pairIds: [c.pairId],
    kind: 'pair',
    title: c.unique('Matrix report'),
  });
  if (state === 'submitted') await transitionReport(deps, authorId, view.reportId, 'submit', null);
  await mailSettled(c);
  return view.reportId;
}

/** Owner or reviewer decides; editor and viewer 403; outsider 404; anonymous 401. */
const reviewers = (status: number): Record<Caller, number> => ({
  ...members(status),
  editor: 403,
  viewer: 403,
});
/** Owner, editor or reviewer comments; the viewer only reads. */
const commenters = (status: number): Record<Caller, number> => ({
  ...members(status),
  viewer: 403,
});

/** Matrix rows of the report and review API (apps/api/src/reports/routes.ts). */
export const rows: MatrixRow[] = [
  {
    method: 'get',
    route: '/workspaces/:wid/reports',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/reports?status=submitted` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/workspaces/:wid/reports',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/reports`, body: { pairId: c.pairId } }),
    expect: editors(201),
  },
  {
    method: 'get',
    route: '/reviews/waiting',
    request: () => ({ path: '/reviews/waiting' }),
    expect: signedIn(200),
  },
  {
    method: 'get',
    route: '/reports/:id',
    request: async (c) => ({ path: `/reports/${await report(c, 'submitted')}` }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/reports/:id/pdf',
    request: async (c) => ({ path: `/reports/${await report(c, 'draft')}/pdf` }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/reports/:id/export',
    request: async (c) => ({ path: `/reports/${await report(c, 'draft')}/export?format=csv` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/reports/:id/submit',
    request: async (c) => ({
      path: `/reports/${await report(c, 'draft')}/submit`,
      body: { note: 'ready' },
    }),
    expect: editors(200),
  },
  {
    method: 'post',
    route: '/reports/:id/request-changes',
    request: async (c) => ({
      path: `/reports/${await report(c, 'submitted')}/request-changes`,
      body: { note: 'cite the coupling' },
    }),
    expect: reviewers(200),
  },
  // The owner wrote this report: the owner may review others' reports but never approves their own.
  {
    method: 'post',
    route: '/reports/:id/approve',
    request: async (c) => ({
      path: `/reports/${await report(c, 'submitted', 'owner')}/approve`,
      body: {},
    }),
    expect: { ...reviewers(200), owner: 403 },
  },
  {
    method: 'post',
    route: '/reports/:id/revise',
    request: async (c) => ({ path: `/reports/${await report(c, 'draft')}/revise` }),
    expect: editors(200),
  },
  {
    method: 'post',
    route: '/reports/:id/comments',
    request: async (c) => ({
      path: `/reports/${await report(c, 'submitted')}/comments`,
      body: { body: 'Which spectrum gave |H_AB|?', anchor: 'coupling' },
    }),
    expect: commenters(201),
  },
  {
    method: 'delete',
    route: '/reports/:id',
    request: async (c) => ({ path: `/reports/${await report(c, 'draft')}` }),
    expect: editors(204),
  },
];
