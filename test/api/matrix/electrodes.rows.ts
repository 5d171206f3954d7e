import { createElectrodeCase } from '../../../apps/api/src/electrodes/electrode-use-case';
import { editors, members, type CaseContext, type MatrixRow } from './matrix-types';

/** Butler–Volmer-like points (α = ½, k⁰ = 10 s⁻¹) at five overpotentials. */
const points = [-0.2, -0.1, 0, 0.1, 0.2].map((eta) => ({
  overpotentialV: eta,
  direction: eta <= 0 ? ('reduction' as const) : ('oxidation' as const),
  k: 10 * Math.exp((0.5 * Math.abs(eta)) / 0.025693),
}));

function body(name: string) {
  return {
    name,
    redoxCouple: 'Fc⁺/Fc',
    electrode: 'Au',
    lambdaEv: 0.8,
    temperatureK: 298.15,
    rateSource: 'k0',
    k0: 10,
    points,
  };
}

/** A fresh electrode case of the case's workspace made by its owner. */
async function electrodeCase(c: CaseContext): Promise<string> {
  const made = await createElectrodeCase(
    c.t.db,
    c.users.owner.id,
    c.workspaceId,
    body(c.unique('electrode')) as Parameters<typeof createElectrodeCase>[3],
  );
  return made.id;
}

/** Matrix rows of the electrode-case API (the rules of pairs: members read and fit, editors write). */
export const rows: MatrixRow[] = [
  {
    method: 'get',
    route: '/workspaces/:wid/electrode-cases',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/electrode-cases` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/workspaces/:wid/electrode-cases',
    request: (c) => ({
      path: `/workspaces/${c.workspaceId}/electrode-cases`,
      body: body('Matrix electrode'),
    }),
    expect: editors(201),
  },
  {
    method: 'get',
    route: '/electrode-cases/:id',
    request: async (c) => ({ path: `/electrode-cases/${await electrodeCase(c)}` }),
    expect: members(200),
  },
  {
    method: 'put',
    route: '/electrode-cases/:id',
    request: async (c) => ({
      path: `/electrode-cases/${await electrodeCase(c)}`,
      body: { ...body('Matrix put'), version: 1 },
    }),
    expect: editors(200),
  },
  {
    method: 'delete',
    route: '/electrode-cases/:id',
    request: async (c) => ({ path: `/electrode-cases/${await electrodeCase(c)}` }),
    expect: editors(204),
  },
  {
    method: 'get',
    route: '/electrode-cases/:id/versions',
    request: async (c) => ({ path: `/electrode-cases/${await electrodeCase(c)}/versions` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/electrode-cases/:id/fit',
    request: async (c) => ({ path: `/electrode-cases/${await electrodeCase(c)}/fit`, body: {} }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/electrode-cases/:id/apply-fit',
    request: async (c) => ({
      path: `/electrode-cases/${await electrodeCase(c)}/apply-fit`,
      body: { version: 1 },
    }),
    expect: editors(200),
  },
];
