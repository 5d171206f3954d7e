import { createCascade } from '../../../apps/api/src/cascades/cascade-use-case';
import { editors, members, type CaseContext, type MatrixRow } from './matrix-types';

/** A three-state network: excited state, charge-separated state by ET, ground by decays. */
function network() {
  return {
    states: [
      { id: 'X', energy: 2, kind: 'excited' },
      { id: 'CS', energy: 1.5, kind: 'chargeSeparated' },
      { id: 'G', energy: 0, kind: 'ground' },
    ],
    links: [
      { from: 'X', to: 'CS', lambda: 0.6, coupling: 0.001 },
      { from: 'X', to: 'G', k: 1e8 },
      { from: 'CS', to: 'G', k: 2e5 },
    ],
  };
}

/** A fresh cascade of the case's workspace made by its owner. */
async function cascade(c: CaseContext): Promise<string> {
  const made = await createCascade(c.t.db, c.t.runtime.compute, c.users.owner.id, c.workspaceId, {
    name: c.unique('cascade'),
    network: network(),
  });
  return made.id;
}

/** Matrix rows of the cascade API (the rules of pairs: members read and compute, editors write). */
export const rows: MatrixRow[] = [
  {
    method: 'get',
    route: '/workspaces/:wid/cascades',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/cascades` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/workspaces/:wid/cascades',
    request: (c) => ({
      path: `/workspaces/${c.workspaceId}/cascades`,
      body: { name: 'Matrix cascade', network: network() },
    }),
    expect: editors(201),
  },
  {
    method: 'get',
    route: '/cascades/:id',
    request: async (c) => ({ path: `/cascades/${await cascade(c)}` }),
    expect: members(200),
  },
  {
    method: 'put',
    route: '/cascades/:id',
    request: async (c) => ({
      path: `/cascades/${await cascade(c)}`,
      body: { name: 'Matrix put', network: network(), version: 1 },
    }),
    expect: editors(200),
  },
  {
    method: 'delete',
    route: '/cascades/:id',
    request: async (c) => ({ path: `/cascades/${await cascade(c)}` }),
    expect: editors(204),
  },
  {
    method: 'get',
    route: '/cascades/:id/versions',
    request: async (c) => ({ path: `/cascades/${await cascade(c)}/versions` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/cascades/:id/compute',
    request: async (c) => ({ path: `/cascades/${await cascade(c)}/compute`, body: {} }),
    expect: members(200),
  },
];
