/** OpenAPI descriptions of the material-case routes and their schemas (issue 18). */
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
const neighbour = obj(
  {
    label: str,
    distanceAngstrom: nullable(num),
    vectorAngstrom: nullable({ type: 'array', items: num, maxItems: 3 }),
    couplingEv: num,
    couplingSigmaEv: nullable(num),
    deltaG0Ev: nullable(num),
  },
  ['label', 'couplingEv'],
);
const inputProps = {
  name: str,
  notes: str,
  lambdaEv: num,
  lambdaSigmaEv: nullable(num),
  temperatureK: num,
  dimensions: { type: 'integer', enum: [1, 2, 3] },
  neighbours: { type: 'array', items: neighbour, minItems: 1 },
};
const inputRequired = ['name', 'lambdaEv', 'temperatureK', 'dimensions', 'neighbours'];
const results = {
  type: 'object',
  description:
    'transport.hopping outputs (rates, log10Rates, diffusion cm² s⁻¹, mobility cm² V⁻¹ s⁻¹, contributions, diffusionTensor, mobilityTensor, principalMobility, principalAxes, validity), warnings, mobilityVsTemperature [{ temperatureK, mobility }] and monteCarlo { samples, seed, diffusion, mobility } or null',
};
const meta = { id: str, workspaceId: str, version: int, createdAt: str, updatedAt: str };

export const MATERIAL_SCHEMAS: Record<string, Schema> = {
  MaterialInput: obj(inputProps, inputRequired),
  MaterialUpdate: obj({ ...inputProps, version: int }, [...inputRequired, 'version']),
  MaterialListItem: obj({
    ...meta,
    name: str,
    notes: str,
    lambdaEv: num,
    lambdaSigmaEv: nullable(num),
    temperatureK: num,
    dimensions: int,
    mobility: nullable(num),
    neighbourCount: int,
  }),
  Material: obj({ ...meta, ...inputProps, results: nullable(results), mobility: nullable(num) }),
  MaterialVersion: obj({
    version: int,
    summary: str,
    createdAt: str,
    snapshot: { type: 'object' },
  }),
  MaterialResults: results,
};

export const MATERIAL_ROUTE_DOCS: readonly RouteDoc[] = [
  {
    method: 'get',
    path: '/workspaces/:wid/materials',
    tag: 'materials',
    summary: 'Material cases of the workspace, last changed first, with their mobility',
    access: member,
    auth: true,
    status: 200,
    response: 'MaterialListItem[]',
  },
  {
    method: 'post',
    path: '/workspaces/:wid/materials',
    tag: 'materials',
    summary:
      'Create a material case: computed first in the compute pool (a refused case is a 400 naming the field), then saved as version 1 with an audit event',
    access: editor,
    auth: true,
    body: 'MaterialInput',
    status: 201,
    response: 'Material',
    errors: [400],
  },
  {
    method: 'post',
    path: '/workspaces/:wid/materials/compute',
    tag: 'materials',
    summary: 'Compute a draft material case in the compute pool; nothing is saved',
    access: member,
    auth: true,
    body: 'MaterialInput',
    status: 200,
    response: 'MaterialResults',
    errors: [400, 422, 503],
  },
  {
    method: 'get',
    path: '/materials/:id',
    tag: 'materials',
    summary: 'One material case with its neighbours and last computed results',
    access: member,
    auth: true,
    status: 200,
    response: 'Material',
  },
  {
    method: 'put',
    path: '/materials/:id',
    tag: 'materials',
    summary: 'Save a new version (from `version`; 409 when someone saved since)',
    access: editor,
    auth: true,
    body: 'MaterialUpdate',
    status: 200,
    response: 'Material',
    errors: [400, 409],
  },
  {
    method: 'delete',
    path: '/materials/:id',
    tag: 'materials',
    summary: 'Delete a material case and its versions (audited)',
    access: editor,
    auth: true,
    status: 204,
  },
  {
    method: 'get',
    path: '/materials/:id/versions',
    tag: 'materials',
    summary: 'Saved versions, newest first, each with its snapshot',
    access: member,
    auth: true,
    status: 200,
    response: 'MaterialVersion[]',
  },
];
