import { createMaterial } from '../../../apps/api/src/materials/material-use-case';
import { editors, members, type CaseContext, type MatrixRow } from './matrix-types';

/** A 1D chain: two neighbours at 5 Å, J = 5 meV, λ = 0.2 eV. */
function body(name = 'Matrix material') {
  return {
    name,
    lambdaEv: 0.2,
    temperatureK: 300,
    dimensions: 1 as const,
    neighbours: [
      { label: 'a', distanceAngstrom: 5, couplingEv: 0.005 },
      { label: '-a', distanceAngstrom: 5, couplingEv: 0.005 },
    ],
  };
}

/** A fresh material case of the case's workspace made by its owner. */
async function material(c: CaseContext): Promise<string> {
  const made = await createMaterial(
    c.t.db,
    c.t.runtime.compute,
    c.users.owner.id,
    c.workspaceId,
    body(c.unique('material')),
  );
  return made.id;
}

/** Matrix rows of the material API (the rules of pairs: members read and compute, editors write). */
export const rows: MatrixRow[] = [
  {
    method: 'get',
    route: '/workspaces/:wid/materials',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/materials` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/workspaces/:wid/materials',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/materials`, body: body() }),
    expect: editors(201),
  },
  {
    method: 'post',
    route: '/workspaces/:wid/materials/compute',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/materials/compute`, body: body() }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/materials/:id',
    request: async (c) => ({ path: `/materials/${await material(c)}` }),
    expect: members(200),
  },
  {
    method: 'put',
    route: '/materials/:id',
    request: async (c) => ({
      path: `/materials/${await material(c)}`,
      body: { ...body('Matrix put'), version: 1 },
    }),
    expect: editors(200),
  },
  {
    method: 'delete',
    route: '/materials/:id',
    request: async (c) => ({ path: `/materials/${await material(c)}` }),
    expect: editors(204),
  },
  {
    method: 'get',
    route: '/materials/:id/versions',
    request: async (c) => ({ path: `/materials/${await material(c)}/versions` }),
    expect: members(200),
  },
];
