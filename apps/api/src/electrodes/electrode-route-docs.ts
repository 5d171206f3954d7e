/** OpenAPI descriptions of the electrode-case routes and their schemas (issue 18). */
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
const point = obj({
  overpotentialV: { ...num, description: 'η = E − E°′ in V (reduction favoured when < 0)' },
  k: { ...num, description: 'rate constant (> 0) in the case’s rateUnit' },
  direction: { type: 'string', enum: ['reduction', 'oxidation'] },
});
const points = { type: 'array', items: point, maxItems: 100 };
const caseFields = {
  name: str,
  redoxCouple: str,
  electrode: str,
  lambdaEv: num,
  temperatureK: num,
  rateSource: { type: 'string', enum: ['k0', 'coupling'] },
  k0: nullable(num),
  rateUnit: { type: 'string', enum: ['s-1', 'cm s-1'] },
  couplingEv: nullable(num),
  densityOfStatesPerEv: nullable(num),
  provenance: str,
  points,
  dataNote: { ...str, description: 'how k was obtained, e.g. the current → k conversion' },
  notes: str,
};
/** The list item has no points or notes. */
const { points: _points, notes: _notes, ...listFields } = caseFields;
const required = ['name', 'redoxCouple', 'electrode', 'lambdaEv', 'temperatureK', 'rateSource'];
const stamp = { id: str, workspaceId: str, version: int, createdAt: str, updatedAt: str };

export const ELECTRODE_SCHEMAS: Record<string, Schema> = {
  ElectrodeCaseInput: obj(caseFields, required),
  ElectrodeCaseUpdate: obj({ ...caseFields, version: int }, [...required, 'version']),
  ElectrodeCase: obj({ ...stamp, ...caseFields }),
  ElectrodeCaseListItem: obj({ ...stamp, ...listFields, pointCount: int }),
  ElectrodeCaseVersion: obj({
    version: int,
    summary: str,
    createdAt: str,
    snapshot: { type: 'object' },
  }),
  ElectrodeFitRequest: obj({ points }, []),
  ElectrodeApplyFit: obj({ points, version: int, model: { type: 'string', enum: ['mhc'] } }, [
    'version',
  ]),
  ElectrodeFit: obj({
    outputs: { type: 'object', description: 'the fit.electrodeKinetics outputs (README)' },
    warnings: { type: 'array', items: obj({ code: str, message: str }) },
    pointCount: int,
  }),
};
export const ELECTRODE_ROUTE_DOCS: readonly RouteDoc[] = [
  {
    method: 'get',
    path: '/workspaces/:wid/electrode-cases',
    tag: 'electrodes',
    summary: 'Electrode cases of the workspace, last changed first, with their point counts',
    access: member,
    auth: true,
    status: 200,
    response: 'ElectrodeCaseListItem[]',
  },
  {
    method: 'post',
    path: '/workspaces/:wid/electrode-cases',
    tag: 'electrodes',
    summary:
      'Create an electrode case (λ, T, k⁰ or |H| with ρ_M, measured k(η)) as version 1 with an audit event',
    access: editor,
    auth: true,
    body: 'ElectrodeCaseInput',
    status: 201,
    response: 'ElectrodeCase',
    errors: [400],
  },
  {
    method: 'get',
    path: '/electrode-cases/:id',
    tag: 'electrodes',
    summary: 'One electrode case with its measured points',
    access: member,
    auth: true,
    status: 200,
    response: 'ElectrodeCase',
  },
  {
    method: 'put',
    path: '/electrode-cases/:id',
    tag: 'electrodes',
    summary: 'Save a new version (from `version`; 409 when someone saved since)',
    access: editor,
    auth: true,
    body: 'ElectrodeCaseUpdate',
    status: 200,
    response: 'ElectrodeCase',
    errors: [400, 409],
  },
  {
    method: 'delete',
    path: '/electrode-cases/:id',
    tag: 'electrodes',
    summary: 'Delete an electrode case and its versions (audited)',
    access: editor,
    auth: true,
    status: 204,
  },
  {
    method: 'get',
    path: '/electrode-cases/:id/versions',
    tag: 'electrodes',
    summary: 'Saved versions, newest first, each with its snapshot',
    access: member,
    auth: true,
    status: 200,
    response: 'ElectrodeCaseVersion[]',
  },
  {
    method: 'post',
    path: '/electrode-cases/:id/fit',
    tag: 'electrodes',
    summary:
      'Fit MHC (λ, k⁰) and Butler–Volmer (α, k⁰) to the stored points or the draft `points` in the compute pool, with standard errors, residuals, AIC/BIC and a verdict; nothing is saved',
    access: member,
    auth: true,
    body: 'ElectrodeFitRequest',
    status: 200,
    response: 'ElectrodeFit',
    errors: [400],
    compute: true,
  },
  {
    method: 'post',
    path: '/electrode-cases/:id/apply-fit',
    tag: 'electrodes',
    summary:
      'Fit (pool first), then store the points and the MHC λ and k⁰ as a new version whose provenance names the fit (409 when someone saved since)',
    access: editor,
    auth: true,
    body: 'ElectrodeApplyFit',
    status: 200,
    response: 'ElectrodeCase',
    errors: [400, 409],
    compute: true,
  },
];
