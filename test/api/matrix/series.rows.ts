import { createSeries, fitSeriesUseCase } from '../../../apps/api/src/series/series-use-case';
import { editors, members, type CaseContext, type MatrixRow } from './matrix-types';

/** Six invented points from classical Marcus (λ = 0.9 eV, |H_AB| = 5 meV, 298.15 K), in kJ/mol. */
function seriesBody(name: string) {
  const kT = 8.617333262e-5 * 298.15;
  const pre = Math.log10((9.545838906e15 * 0.005 ** 2) / Math.sqrt(4 * Math.PI * 0.9 * kT));
  const points = [-0.2, -0.45, -0.7, -0.95, -1.2, -1.5].map((dg, i) => ({
    label: `DA-${i + 1}`,
    deltaG0: dg * 96.48533212,
    log10k: pre - (dg + 0.9) ** 2 / (4 * 0.9 * kT * Math.LN10) + (i % 2 ? 0.05 : -0.05),
    sigmaLog10k: 0.1,
  }));
  return { name, temperature: 298.15, energyUnit: 'kJ/mol', points };
}

/** A fresh series of the case's workspace made by its owner, fitted when asked. */
async function series(c: CaseContext, fitted: boolean): Promise<string> {
  const s = await createSeries(
    c.t.db,
    c.users.owner.id,
    c.workspaceId,
    seriesBody(c.unique('series')) as never,
  );
  if (fitted)
    await fitSeriesUseCase(c.t.db, c.t.runtime.compute, c.users.owner.id, s.id, {
      model: 'marcus',
    });
  return s.id;
}

/** Matrix rows of the driving-force series API. */
export const rows: MatrixRow[] = [
  {
    method: 'post',
    route: '/workspaces/:wid/series',
    request: (c) => ({
      path: `/workspaces/${c.workspaceId}/series`,
      body: seriesBody('Matrix series'),
    }),
    expect: editors(201),
  },
  {
    method: 'get',
    route: '/workspaces/:wid/series',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/series` }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/series/:id',
    request: async (c) => ({ path: `/series/${await series(c, true)}` }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/pairs/:id/series-points',
    request: async (c) => {
      await createSeries(c.t.db, c.users.owner.id, c.workspaceId, {
        ...seriesBody(c.unique('linked')),
        pairIds: [c.pairId],
      } as never);
      return { path: `/pairs/${c.pairId}/series-points` };
    },
    expect: members(200),
  },
  {
    method: 'put',
    route: '/series/:id',
    request: async (c) => ({
      path: `/series/${await series(c, false)}`,
      body: { ...seriesBody('Matrix put'), version: 1 },
    }),
    expect: editors(200),
  },
  {
    method: 'post',
    route: '/series/:id/fit',
    request: async (c) => ({
      path: `/series/${await series(c, false)}/fit`,
      body: { model: 'marcus' },
    }),
    expect: editors(200),
  },
  {
    method: 'post',
    route: '/series/:id/apply',
    request: async (c) => ({
      path: `/series/${await series(c, true)}/apply`,
      body: { pairIds: [c.pairId] },
    }),
    expect: editors(200),
  },
];
