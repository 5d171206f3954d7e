/** OpenAPI rows and schemas of the report routes (spread into ROUTE_DOCS and the schemas). */
import { REPORT_STATUSES } from '@gapwise/contracts';
import type { RouteDoc } from '../docs/route-docs';
import { nullable, num, obj, str, type Schema } from '../docs/schema';

const member = 'any member of the workspace (non-members get 404)';
const editor = 'owner or editor (reviewer, viewer: 403; non-members: 404)';
const reviewer = 'owner or reviewer (editor, viewer: 403; non-members: 404)';

export const REPORT_ROUTE_DOCS: readonly RouteDoc[] = [
  {
    method: 'get',
    path: '/workspaces/:wid/reports',
    tag: 'reports',
    summary: 'Reports of the workspace, newest change first',
    access: member,
    auth: true,
    status: 200,
    response: 'ReportListItem[]',
    query: [
      { name: 'status', description: REPORT_STATUSES.join(' | ') },
      { name: 'author', description: 'user id of the author' },
      { name: 'pairId', description: 'reports that include this pair' },
    ],
  },
  {
    method: 'post',
    path: '/workspaces/:wid/reports',
    tag: 'reports',
    summary:
      'Create a draft report: the pair (pairId) or pairs (pairIds, a comparison) frozen at their current versions with computed results, methods and software version (409 pair-changed when a pair was saved while the snapshot computed)',
    access: editor,
    auth: true,
    body: 'ReportCreate',
    status: 201,
    response: 'ReportView',
    errors: [409],
    compute: true,
  },
  {
    method: 'get',
    path: '/reviews/waiting',
    tag: 'reports',
    summary:
      'Submitted reports waiting for my review (workspaces where I am owner or reviewer; not my own)',
    access: 'signed in',
    auth: true,
    status: 200,
    response: 'ReportListItem[]',
  },
  {
    method: 'get',
    path: '/reports/:id',
    tag: 'reports',
    summary: 'A report: frozen snapshot, status, comments and review history',
    access: member,
    auth: true,
    status: 200,
    response: 'ReportView',
  },
  {
    method: 'get',
    path: '/reports/:id/pdf',
    tag: 'reports',
    summary:
      'The PDF of the current revision (stored once in object storage; the approved PDF never changes)',
    access: member,
    auth: true,
    status: 200,
    compute: true,
  },
  {
    method: 'get',
    path: '/reports/:id/export',
    tag: 'reports',
    summary: 'The snapshot for machines',
    access: member,
    auth: true,
    status: 200,
    query: [{ name: 'format', description: 'json (default) | csv' }],
  },
  {
    method: 'post',
    path: '/reports/:id/submit',
    tag: 'reports',
    summary: 'Submit for review (from draft or changes-requested); reviewers are e-mailed',
    access: editor,
    auth: true,
    body: 'ReportDecision',
    status: 200,
    response: 'ReportView',
    errors: [409],
  },
  {
    method: 'post',
    path: '/reports/:id/request-changes',
    tag: 'reports',
    summary: 'Send a submitted report back to its author (e-mailed)',
    access: reviewer,
    auth: true,
    body: 'ReportDecision',
    status: 200,
    response: 'ReportView',
    errors: [409],
  },
  {
    method: 'post',
    path: '/reports/:id/approve',
    tag: 'reports',
    summary:
      'Approve a submitted report (not your own: 403); it is frozen and its PDF stored; the author is e-mailed',
    access: reviewer,
    auth: true,
    body: 'ReportDecision',
    status: 200,
    response: 'ReportView',
    errors: [409],
  },
  {
    method: 'post',
    path: '/reports/:id/revise',
    tag: 'reports',
    summary:
      "New snapshot from the pairs' current versions (draft or changes-requested only: 409; 409 pair-changed when a pair was saved while the snapshot computed)",
    access: editor,
    auth: true,
    status: 200,
    response: 'ReportView',
    errors: [409],
    compute: true,
  },
  {
    method: 'post',
    path: '/reports/:id/comments',
    tag: 'reports',
    summary:
      'Comment, optionally anchored to a parameter and threaded under parentId (approved: 409)',
    access: 'owner, editor or reviewer (viewer: 403; non-members: 404)',
    auth: true,
    body: 'ReportCommentCreate',
    status: 201,
    response: 'ReportView',
    errors: [409],
  },
  {
    method: 'delete',
    path: '/reports/:id',
    tag: 'reports',
    summary: 'Delete a report that is not approved (approved: 409)',
    access: editor,
    auth: true,
    status: 204,
    errors: [409],
  },
];

const who = obj({ id: str, displayName: str });
const status = { type: 'string', enum: [...REPORT_STATUSES] };

export const REPORT_SCHEMAS: Record<string, Schema> = {
  ReportCreate: obj(
    {
      pairId: { ...str, description: 'one pair (a pair report)' },
      pairIds: {
        type: 'array',
        items: str,
        description: 'two or more pairs (a comparison report)',
      },
      title: str,
    },
    [],
  ),
  ReportDecision: obj({ note: str }, []),
  ReportCommentCreate: obj(
    {
      body: str,
      anchor: nullable({ ...str, description: 'parameter kind' }),
      parentId: nullable(str),
    },
    ['body'],
  ),
  ReportListItem: obj({
    id: str,
    workspaceId: str,
    kind: { type: 'string', enum: ['pair', 'comparison'] },
    title: str,
    status,
    author: who,
    pairIds: { type: 'array', items: str },
    snapshotId: str,
    createdAt: str,
    updatedAt: str,
  }),
  ReportView: obj({
    reportId: str,
    workspaceId: str,
    kind: str,
    title: str,
    author: who,
    pairIds: { type: 'array', items: str },
    snapshotId: { ...str, description: 'SHA-256 of the canonical snapshot JSON' },
    revision: {
      ...num,
      description:
        'Stored counter, grows with every change the PDF shows (keys the stored PDF); readers see revisions numbered by submissions (reviewRevision of the history)',
    },
    status,
    snapshot: {
      type: 'object',
      description:
        'ReportSnapshot (libs/contracts/src/reports.ts): pairs with inputs (typed and canonical values, uncertainty, provenance), results per model, methods with citations, software version',
    },
    history: {
      type: 'array',
      items: obj({
        from: nullable(status),
        to: status,
        by: who,
        at: str,
        note: nullable(str),
        snapshotId: {
          ...nullable(str),
          description:
            'the snapshot the transition acted on; null for transitions recorded before it was kept',
        },
      }),
    },
    comments: {
      type: 'array',
      items: obj({
        id: str,
        author: who,
        body: str,
        anchor: nullable(str),
        parentId: nullable(str),
        createdAt: str,
      }),
    },
    createdAt: str,
    updatedAt: str,
  }),
};
