/**
 * Material cases through the API: create (computed in the pool, version 1, audit), refusal by
 * field label with nothing saved, update with versions and conflict, compute of a draft, delete,
 * and the demo seed. The numbers expected are closed forms written out here: 1D chain D = a²k
 * (random walk, Coropceanu et al., Chem. Rev. 2007, 107, 926) and μ = D/(k_BT/e) (Einstein 1905),
 * with k the classical Marcus rate (Marcus 1956) computed in the test from its formula.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_LAB, seedDemo } from '../../apps/api/src/seed/demo-data';
import {
  DEMO_MATERIAL_NAME,
  seedDemoMaterials,
} from '../../apps/api/src/materials/demo-material-seed';
import { registerUser, signIn, startTestApp, type Session, type TestApp } from './support/test-app';

process.env['GAPWISE_SCREEN_WORKER'] = 'false';

let t: TestApp;
let editor: Session;
let wid: string;

beforeAll(async () => {
  t = await startTestApp();
  editor = await registerUser(t.app, 'materialist');
  wid = (await editor.post('/api/workspaces', { name: 'Crystals' })).body.id;
}, 120_000);
afterAll(async () => t?.close());

const KB = 8.617333262e-5; // eV/K, CODATA 2018
const HBAR = 6.582119569e-16; // eV s, CODATA 2018
/** Classical Marcus rate at ΔG° = 0 (SCIENCE.md §1). */
function marcus(J: number, lambda: number, T: number): number {
  const kT = KB * T;
  return (
    ((2 * Math.PI) / HBAR) *
    J *
    J *
    (1 / Math.sqrt(4 * Math.PI * lambda * kT)) *
    Math.exp(-lambda / (4 * kT))
  );
}

function chain(a = 5, J = 0.005) {
  return {
    name: 'Chain',
    lambdaEv: 0.2,
    temperatureK: 300,
    dimensions: 1,
    neighbours: [
      { label: 'a', vectorAngstrom: [a, 0, 0], couplingEv: J },
      { label: '−a', vectorAngstrom: [-a, 0, 0], couplingEv: J },
    ],
  };
}

async function count(table: string, column: string, id: string): Promise<number> {
  const rows = await t.db.query(`SELECT count(*)::int AS n FROM ${table} WHERE ${column} = $1`, [
    id,
  ]);
  return rows[0].n;
}

describe('materials API', () => {
  it('creates a chain with D = a²k and μ = eD/k_BT, versions, audits and deletes it', async () => {
    const created = await editor.post(`/api/workspaces/${wid}/materials`, chain());
    expect(created.status).toBe(201);
    const m = created.body;
    const k = marcus(0.005, 0.2, 300);
    expect(m.version).toBe(1);
    expect(m.results.rates[0] / k).toBeCloseTo(1, 6);
    expect(m.results.diffusion / (5e-8 ** 2 * k)).toBeCloseTo(1, 6);
    expect(m.results.mobility / (m.results.diffusion / (KB * 300))).toBeCloseTo(1, 10);
    expect(m.mobility).toBe(m.results.mobility);
    expect(m.results.diffusionTensor[0][0] / m.results.diffusion).toBeCloseTo(1, 10);
    expect(m.results.contributions).toEqual([0.5, 0.5]);
    expect(m.results.mobilityVsTemperature.length).toBeGreaterThan(5);
    expect(m.results.monteCarlo).toBeNull();
    expect(await count('audit_events', 'entity_id', m.id)).toBe(1);

    const list = await editor.get(`/api/workspaces/${wid}/materials`);
    expect(list.body.map((x: { id: string }) => x.id)).toContain(m.id);
    expect(list.body[0].neighbourCount).toBe(2);

    const updated = await editor.put(`/api/materials/${m.id}`, {
      ...chain(6),
      lambdaSigmaEv: 0.02,
      version: 1,
    });
    expect(updated.status).toBe(200);
    expect(updated.body.version).toBe(2);
    expect(updated.body.results.diffusion / m.results.diffusion).toBeCloseTo(36 / 25, 6);
    expect(updated.body.results.monteCarlo.mobility.p025).toBeLessThan(updated.body.mobility);
    expect(updated.body.results.monteCarlo.mobility.p975).toBeGreaterThan(updated.body.mobility);

    const stale = await editor.put(`/api/materials/${m.id}`, { ...chain(), version: 1 });
    expect(stale.status).toBe(409);
    const versions = await editor.get(`/api/materials/${m.id}/versions`);
    expect(versions.body.map((v: { version: number }) => v.version)).toEqual([2, 1]);

    const draft = await editor.post(`/api/workspaces/${wid}/materials/compute`, chain(4));
    expect(draft.status).toBe(200);
    expect(draft.body.diffusion / (4e-8 ** 2 * k)).toBeCloseTo(1, 6);

    expect((await editor.delete(`/api/materials/${m.id}`)).status).toBe(204);
    expect(await count('materials', 'id', m.id)).toBe(0);
    expect(await count('material_versions', 'material_id', m.id)).toBe(0);
  });

  it('refuses a class III coupling naming the neighbour by its label, saving nothing', async () => {
    const before = (await editor.get(`/api/workspaces/${wid}/materials`)).body.length;
    const bad = chain();
    bad.neighbours[1] = { ...bad.neighbours[1], couplingEv: 0.15 };
    const res = await editor.post(`/api/workspaces/${wid}/materials`, bad);
    expect(res.status).toBe(400);
    const errors = res.body.error.fields as { field: string; message: string }[];
    expect(errors.some((e) => e.message.startsWith('Neighbour 2 coupling J:'))).toBe(true);
    expect((await editor.get(`/api/workspaces/${wid}/materials`)).body.length).toBe(before);
  });

  it('refuses a wrong dimension with its label', async () => {
    const res = await editor.post(`/api/workspaces/${wid}/materials`, {
      ...chain(),
      dimensions: 4,
    });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body)).toContain('Dimensions n must be 1, 2 or 3.');
  });

  it('seeds the invented demo layer once, with its tensor and Monte Carlo', async () => {
    await seedDemo(t.db, { bcryptCost: 4 });
    const options = { labName: DEMO_LAB, editorEmail: 'editor@gapwise.test' };
    expect(await seedDemoMaterials(t.db, options)).toBe(1);
    expect(await seedDemoMaterials(t.db, options)).toBe(0);
    const viewer = await signIn(t.app, 'viewer@gapwise.test', 'gapwise-demo');
    const lab = (await viewer.get('/api/workspaces').expect(200)).body.find(
      (w: { name: string }) => w.name === DEMO_LAB,
    );
    const list = (await viewer.get(`/api/workspaces/${lab.id}/materials`).expect(200)).body;
    const item = list.find((x: { name: string }) => x.name === DEMO_MATERIAL_NAME);
    const full = (await viewer.get(`/api/materials/${item.id}`).expect(200)).body;
    const p = full.results.principalMobility;
    expect(p.largest).toBeGreaterThan(p.middle);
    expect(p.smallest).toBe(0);
    expect(full.results.monteCarlo.samples).toBe(1000);
  });
});
