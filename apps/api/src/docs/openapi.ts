import {
  PAIR_STATUSES,
  PARAMETER_KINDS,
  PROVENANCE_KINDS,
  RATE_MODELS,
  ROLES,
} from '@gapwise/contracts';
import { ROUTE_DOCS } from './route-docs';
import { REPORT_SCHEMAS } from '../reports/report-route-docs';
import { TRACE_SCHEMAS } from '../traces/trace-route-docs';
import { SCREEN_SCHEMAS } from '../screens/screen-route-docs';
import { CASCADE_SCHEMAS } from '../cascades/cascade-route-docs';
import { ELECTRODE_SCHEMAS } from '../electrodes/electrode-route-docs';
import { MATERIAL_SCHEMAS } from '../materials/material-route-docs';
import { nullable, num, obj, ref, str, type Schema } from './schema';

const role = { type: 'string', enum: [...ROLES] };

const parameter = obj(
  {
    kind: { type: 'string', enum: Object.keys(PARAMETER_KINDS) },
    value: { ...num, description: 'canonical unit (eV, Å, V, s; dimensionless)' },
    unit: { ...str, description: "unit the user typed (CALC-API.md names, '' for dimensionless)" },
    uncertainty: nullable({ ...num, minimum: 0 }),
    provenance: obj(
      {
        kind: { type: 'string', enum: [...PROVENANCE_KINDS] },
        citation: nullable({ ...str, description: 'required for literature' }),
        methodId: nullable({ ...str, description: 'required for derived: the Gapwise method id' }),
        methodInputs: nullable({ type: 'object' }),
        sources: nullable({ type: 'array', items: obj({ type: str, id: str }) }),
        note: nullable(str),
      },
      ['kind'],
    ),
  },
  ['kind', 'value', 'unit', 'provenance'],
);

const pairFields = {
  name: str,
  donor: str,
  acceptor: str,
  medium: str,
  temperature: { ...num, description: 'kelvin' },
  temperatureUnit: { type: 'string', enum: ['K', 'degC'] },
  notes: str,
  status: { type: 'string', enum: [...PAIR_STATUSES] },
  tags: { type: 'array', items: str },
  model: { type: 'string', enum: [...RATE_MODELS] },
  parameters: { type: 'array', items: ref('PairParameter') },
};
const pairRequired = ['name', 'donor', 'acceptor', 'medium', 'temperature', 'parameters'];
const results = obj({
  model: str,
  k: nullable(num),
  log10k: nullable(num),
  activationFreeEnergy: nullable(num),
  regime: nullable(str),
  warnings: { type: 'array', items: obj({ code: str, message: str }) },
  errors: { type: 'array', items: obj({ field: str, message: str }) },
});
const page = (item: string) =>
  obj({ items: ref(`${item}[]`), total: num, offset: num, limit: num });

const SCHEMAS: Record<string, Schema> = {
  ApiErrorBody: obj({
    error: obj(
      {
        code: str,
        message: str,
        fields: { type: 'array', items: obj({ field: str, message: str }) },
        current: {},
      },
      ['code', 'message'],
    ),
  }),
  HealthInfo: obj({
    status: str,
    version: str,
    database: obj({ reachable: { type: 'boolean' } }),
    migrations: nullable(obj({ applied: num, pending: { type: 'array', items: str } })),
  }),
  RegisterRequest: obj(
    {
      email: str,
      password: { ...str, minLength: 10, description: 'at most 72 bytes in UTF-8' },
      displayName: str,
      returnUrl: { ...str, description: 'same-site path opened after the confirmation' },
    },
    ['email', 'password', 'displayName'],
  ),
  RegistrationAnswer: obj({
    status: { type: 'string', enum: ['confirmation-sent'] },
    message: str,
  }),
  ConfirmRegistrationRequest: obj({ token: str }),
  SignInRequest: obj({ email: str, password: str }),
  ChangePasswordRequest: obj({
    currentPassword: str,
    newPassword: { ...str, minLength: 10, description: 'at most 72 bytes in UTF-8' },
  }),
  PasswordResetRequest: obj({ email: str }),
  PasswordResetConfirmRequest: obj({
    token: str,
    newPassword: { ...str, minLength: 10, description: 'at most 72 bytes in UTF-8' },
  }),
  UpdateProfileRequest: obj({ displayName: str }),
  DeleteAccountRequest: obj({ password: str }),
  DeletedAccount: obj({
    deletedWorkspaces: {
      type: 'array',
      items: str,
      description: 'ids of workspaces deleted with it',
    },
    deletedWorkspaceNames: {
      type: 'array',
      items: str,
      description: 'their names, in the same order',
    },
  }),
  EndedSessions: obj({ endedSessions: num }),
  UserSummary: obj({ id: str, email: str, displayName: str }),
  MembershipSummary: obj({ workspaceId: str, workspaceName: str, role }),
  SessionInfo: obj({
    user: ref('UserSummary'),
    memberships: ref('MembershipSummary[]'),
    csrfToken: str,
  }),
  WorkspaceName: obj({ name: str }),
  WorkspaceSummary: obj({ id: str, name: str, role }),
  Member: obj({ userId: str, email: str, displayName: str, role }),
  RoleChange: obj({ role }),
  InvitationRequest: obj({ email: str, role }),
  Invitation: obj({
    id: str,
    email: str,
    role,
    status: { type: 'string', enum: ['pending', 'accepted', 'revoked', 'expired'] },
    expiresAt: str,
    createdAt: str,
  }),
  InvitationPreview: obj({ workspaceName: str, role, email: str, status: str }),
  PairParameter: parameter,
  PairInput: obj(pairFields, pairRequired),
  PairUpdate: obj({ ...pairFields, version: { type: 'integer', minimum: 1 } }, [
    ...pairRequired,
    'version',
  ]),
  PairPatch: obj({ ...pairFields, version: { type: 'integer', minimum: 1 } }, ['version']),
  PairResults: results,
  Pair: obj(
    {
      id: str,
      workspaceId: str,
      version: { type: 'integer' },
      ...pairFields,
      results: nullable(ref('PairResults')),
      createdAt: str,
      updatedAt: str,
      updatedBy: nullable(obj({ id: str, displayName: str })),
    },
    [
      ...pairRequired,
      'id',
      'workspaceId',
      'version',
      'status',
      'tags',
      'model',
      'results',
      'createdAt',
      'updatedAt',
      'updatedBy',
    ],
  ),
  PairListItem: obj({
    id: str,
    name: str,
    donor: str,
    acceptor: str,
    status: str,
    tags: { type: 'array', items: str },
    deltaG0: nullable(num),
    lambda: nullable(num),
    coupling: nullable(num),
    log10k: nullable(num),
    regime: nullable(str),
    version: num,
    updatedAt: str,
    updatedBy: nullable(str),
  }),
  PairPage: page('PairListItem'),
  PairVersionSummary: obj({ version: num, createdAt: str, createdBy: nullable(str), summary: str }),
  PairComparison: obj({
    from: num,
    to: num,
    differences: { type: 'array', items: obj({ field: str, from: {}, to: {} }) },
  }),
  CalcRequest: obj({ method: str, inputs: { type: 'object' } }),
  CalcAnswer: {
    oneOf: [
      obj({
        ok: { const: true },
        method: str,
        outputs: { type: 'object' },
        warnings: { type: 'array', items: obj({ code: str, message: str }) },
      }),
      obj({
        ok: { const: false },
        errors: { type: 'array', items: obj({ field: str, message: str }) },
      }),
    ],
  },
  AuditEvent: obj({
    id: str,
    at: str,
    actor: nullable(str),
    action: str,
    entityType: str,
    entityId: nullable(str),
    summary: str,
    before: {},
    after: {},
  }),
  AuditPage: page('AuditEvent'),
  CreateApiTokenRequest: obj(
    {
      name: str,
      scope: { type: 'string', enum: ['read', 'read-write'], description: 'default read-write' },
      expiresAt: nullable({ ...str, description: 'ISO date, at most 366 days ahead' }),
    },
    ['name'],
  ),
  ApiToken: obj({
    id: str,
    name: str,
    prefix: str,
    createdAt: str,
    lastUsedAt: nullable(str),
    revokedAt: nullable(str),
    scope: { type: 'string', enum: ['read', 'read-write'] },
    expiresAt: nullable(str),
  }),
  CreatedApiToken: obj({
    id: str,
    name: str,
    prefix: str,
    createdAt: str,
    lastUsedAt: nullable(str),
    revokedAt: nullable(str),
    scope: { type: 'string', enum: ['read', 'read-write'] },
    expiresAt: nullable(str),
    token: str,
  }),
  ...REPORT_SCHEMAS,
  ...TRACE_SCHEMAS,
  ...SCREEN_SCHEMAS,
  ...CASCADE_SCHEMAS,
  ...ELECTRODE_SCHEMAS,
  ...MATERIAL_SCHEMAS,
};

const ERROR_TEXT: Record<number, string> = {
  400: 'validation-failed (every refused field listed) or invalid-json',
  401: 'unauthenticated',
  403: 'forbidden, or csrf-failed for a cookie-authenticated write without X-CSRF-Token',
  404: 'not-found (also for records of workspaces you are not a member of)',
  409: 'conflict (see summary)',
  410: 'gone (expired or revoked)',
  413: 'payload-too-large (the message names the limit and its setting)',
  429: 'too-many-attempts',
};

/** Answers of a route that runs a calculation in the worker-thread pool (RouteDoc `compute`). */
const COMPUTE_ERROR_TEXT: Record<number, string> = {
  422: 'calculation-over-budget: the calculation ran past its budget (CALC_BUDGET_MS, default 10 s) and was stopped; the message says what to change',
  503: 'calculation-pool-busy: every calculation thread is busy and the queue is full (CALC_THREADS, CALC_QUEUE); retry after the seconds in Retry-After',
};

/** `/workspaces/:wid` → `/workspaces/{wid}` */
export const toOpenApiPath = (path: string) => '/api' + path.replace(/:(\w+)/g, '{$1}');

/** The OpenAPI 3.1 description of every route in ROUTE_DOCS. */
export function buildOpenApi(version: string): Record<string, unknown> {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const r of ROUTE_DOCS) {
    const p = toOpenApiPath(r.path);
    const params = [...r.path.matchAll(/:(\w+)/g)].map((m) => ({
      name: m[1],
      in: 'path',
      required: true,
      schema: str,
    }));
    const query = (r.query ?? []).map((q) => ({
      name: q.name,
      in: 'query',
      required: false,
      description: q.description,
      schema: str,
    }));
    const responses: Record<string, unknown> = {
      [String(r.status)]: r.response
        ? { description: 'success', content: { 'application/json': { schema: ref(r.response) } } }
        : { description: 'success' },
    };
    const errorCodes = new Set<number>([
      ...(r.body ? [400] : []),
      ...(r.auth ? [401] : []),
      ...(r.path.includes(':') ? [404] : []),
      ...(r.errors ?? []),
      ...(r.compute ? [422, 503] : []),
    ]);
    if (r.access.includes('403')) errorCodes.add(403);
    for (const code of [...errorCodes].sort()) {
      const computeText = r.compute ? COMPUTE_ERROR_TEXT[code] : undefined;
      const text = [ERROR_TEXT[code], computeText].filter(Boolean).join('; or ');
      responses[String(code)] = {
        description: text || 'error',
        ...(computeText && code === 503
          ? {
              headers: {
                'Retry-After': {
                  description: 'Seconds to wait before trying again',
                  schema: { type: 'integer', minimum: 1 },
                },
              },
            }
          : {}),
        content: { 'application/json': { schema: ref('ApiErrorBody') } },
      };
    }
    paths[p] ??= {};
    paths[p][r.method] = {
      tags: [r.tag],
      summary: r.summary,
      description: `Who may call: ${r.access}.`,
      operationId: `${r.method}${r.path.replace(/[:/.-](\w)/g, (_m, c: string) => c.toUpperCase())}`,
      parameters: [...params, ...query],
      ...(r.body
        ? {
            requestBody: {
              required: true,
              content: { 'application/json': { schema: ref(r.body) } },
            },
          }
        : {}),
      responses,
      security: r.auth ? [{ cookie: [] }, { bearer: [] }] : [],
    };
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Gapwise API',
      version,
      description:
        'Team workspaces, donor–acceptor pairs with provenance and history, and the calculation core. ' +
        'Browsers use the httpOnly cookies set by sign-in and send `X-CSRF-Token` (from SessionInfo) on writes; ' +
        'scripts send `Authorization: Bearer gw_…` (an API token) and need no CSRF token. ' +
        'Values are canonical (eV, Å, K, V, s) with the typed unit kept beside them.',
    },
    servers: [{ url: '/' }],
    components: {
      securitySchemes: {
        cookie: { type: 'apiKey', in: 'cookie', name: 'gw_access' },
        bearer: { type: 'http', scheme: 'bearer', description: 'API token gw_… or an access JWT' },
      },
      schemas: SCHEMAS,
    },
    paths,
  };
}
