/** OpenAPI descriptions of the cascade routes and their schemas (issue 17). */
import type { RouteDoc } from '../docs/route-docs';

type Schema = Record<string, unknown>;
const member = 'any member of the workspace (non-members get 404)';
const editor = 'owner or editor (reviewer, viewer: 403; non-members: 404)';
const str = { type: 'string' };
const num = { type: 'number' };
const int = { type: 'integer' };
const nullable = (s: Schema) => ({ anyOf: [s, { type: 'null' }] });
const obj = (properties: Record<string, Schema>, required = Object.keys(properties)): Schema => ({
  type: 'object',
  properties,
  required,
});
const network = {
  type: 'object',
  description:
    'The kinetics.network inputs (CALC-API.md): states [{ id, label?, energy, kind? }], links [{ from, to, k | lifetime | lambda + coupling (+ model) }], initial?, temperature?, timeStart?, timeEnd?, target?',
};

const design = {
  type: 'object',
  description:
    "The web editor's design stored beside the network (how each energy was derived, σ of the inputs, the pair a step was taken from); never computed from",
};

export const CASCADE_SCHEMAS: Record<string, Schema> = {
  CascadeInput: obj({ name: str, notes: str, network, design }, ['name', 'network']),
  CascadeUpdate: obj({ name: str, notes: str, network, design, version: int }, [
    'name',
    'network',
    'version',
  ]),
  CascadeListItem: obj({
    id: str,
    workspaceId: str,
    name: str,
    notes: str,
    longLivedYield: nullable(num),
    longLivedLifetimeS: nullable(num),
    version: int,
    createdAt: str,
    updatedAt: str,
  }),
  Cascade: obj({
    id: str,
    workspaceId: str,
    name: str,
    notes: str,
    network,
    design: nullable(design),
    results: nullable({ type: 'object', description: 'the kinetics.network outputs' }),
    warnings: { type: 'array', items: obj({ code: str, message: str }) },
    longLivedYield: nullable(num),
    longLivedLifetimeS: nullable(num),
    version: int,
    createdAt: str,
    updatedAt: str,
  }),
  CascadeVersion: obj({ version: int, summary: str, createdAt: str, snapshot: { type: 'object' } }),
  CascadeCompute: obj({ network }, []),
  CascadeResults: obj({
    outputs: { type: 'object', description: 'the kinetics.network outputs' },
    warnings: { type: 'array', items: obj({ code: str, message: str }) },
  }),
};

export const CASCADE_ROUTE_DOCS: readonly RouteDoc[] = [
  {
    method: 'get',
    path: '/workspaces/:wid/cascades',
    tag: 'cascades',
    summary:
      'Cascades of the workspace, last changed first, with the long-lived yield and lifetime',
    access: member,
    auth: true,
    status: 200,
    response: 'CascadeListItem[]',
  },
  {
    method: 'post',
    path: '/workspaces/:wid/cascades',
    tag: 'cascades',
    summary:
      'Create a cascade: computed first (a refused network is a 400 naming network.<field>), then saved as version 1 with an audit event',
    access: editor,
    auth: true,
    body: 'CascadeInput',
    status: 201,
    response: 'Cascade',
    errors: [400],
  },
  {
    method: 'get',
    path: '/cascades/:id',
    tag: 'cascades',
    summary: 'One cascade with its network and last computed results',
    access: member,
    auth: true,
    status: 200,
    response: 'Cascade',
  },
  {
    method: 'put',
    path: '/cascades/:id',
    tag: 'cascades',
    summary: 'Save a new version (from `version`; 409 when someone saved since)',
    access: editor,
    auth: true,
    body: 'CascadeUpdate',
    status: 200,
    response: 'Cascade',
    errors: [400, 409],
  },
  {
    method: 'delete',
    path: '/cascades/:id',
    tag: 'cascades',
    summary: 'Delete a cascade and its versions (audited)',
    access: editor,
    auth: true,
    status: 204,
  },
  {
    method: 'get',
    path: '/cascades/:id/versions',
    tag: 'cascades',
    summary: 'Saved versions, newest first, each with its snapshot',
    access: member,
    auth: true,
    status: 200,
    response: 'CascadeVersion[]',
  },
  {
    method: 'post',
    path: '/cascades/:id/compute',
    tag: 'cascades',
    summary:
      'Compute the stored network, or the draft `network` of the body, in the compute pool; nothing is saved',
    access: member,
    auth: true,
    body: 'CascadeCompute',
    status: 200,
    response: 'CascadeResults',
    errors: [400, 422, 503],
  },
];
