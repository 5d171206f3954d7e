/**
 * Cascades through the API: create (computed in the pool, version 1, audit), refusal by field
 * with nothing saved, update with versions and conflict, compute of a draft, delete.
 * The yields expected here are closed forms (competing first-order channels, any physical
 * chemistry text), written out in the test.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';

process.env['GAPWISE_SCREEN_WORKER'] = 'false';

let t: TestApp;
let editor: Session;
let wid: string;

beforeAll(async () => {
  t = await startTestApp();
  editor = await registerUser(t.app, 'cascader');
  wid = (await editor.post('/api/workspaces', { name: 'Triads' })).body.id;
}, 120_000);
afterAll(async () => t?.close());

/** X* → CS (fixed k_cs), X* → G (k_d), CS → G (k_r): φ_CS = k_cs/(k_cs + k_d). */
function network(kcs: number) {
  return {
    states: [
      { id: 'X', energy: 2, kind: 'excited' },
      { id: 'CS', energy: 1.5, kind: 'chargeSeparated' },
      { id: 'G', energy: 0, kind: 'ground' },
    ],
    links: [
      { from: 'X', to: 'CS', k: kcs },
      { from: 'X', to: 'G', k: 1e8 },
      { from: 'CS', to: 'G', lifetime: { value: 5000, unit: 'ps' } },
    ],
  };
}

async function count(table: string, id: string, column = 'id'): Promise<number> {
  const rows = await t.db.query(`SELECT count(*)::int AS n FROM ${table} WHERE ${column} = $1`, [
    id,
  ]);
  return rows[0].n;
}

describe('cascades API', () => {
  it('creates, reads, versions, audits, computes a draft and deletes a cascade', async () => {
    const created = await editor.post(`/api/workspaces/${wid}/cascades`, {
      name: 'Dyad',
      network: network(3e8),
    });
    expect(created.status).toBe(201);
    const id = created.body.id;
    expect(created.body.version).toBe(1);
    expect(created.body.results.formationYields.CS).toBeCloseTo(3e8 / (3e8 + 1e8), 12);
    expect(created.body.longLivedYield).toBeCloseTo(0.75, 12);
    expect(created.body.longLivedLifetimeS).toBeCloseTo(5e-9, 18);
    expect(created.body.results.yields.G).toBeCloseTo(1, 12);

    const list = await editor.get(`/api/workspaces/${wid}/cascades`);
    expect(list.body.map((c: { id: string }) => c.id)).toContain(id);

    expect(created.body.design).toBeNull();
    const design = { states: [{ id: 'X', derivation: { mode: 'e00', value: 620, unit: 'nm' } }] };
    const updated = await editor.put(`/api/cascades/${id}`, {
      name: 'Dyad',
      network: network(1e8),
      design,
      version: 1,
    });
    expect(updated.status).toBe(200);
    // The editor's design is stored beside the network and kept in the version snapshot.
    expect(updated.body.design).toEqual(design);
    expect(updated.body.version).toBe(2);
    expect(updated.body.longLivedYield).toBeCloseTo(0.5, 12);
    const stale = await editor.put(`/api/cascades/${id}`, {
      name: 'Dyad',
      network: network(2e8),
      version: 1,
    });
    expect(stale.status).toBe(409);
    const versions = await editor.get(`/api/cascades/${id}/versions`);
    expect(versions.body.map((v: { version: number }) => v.version)).toEqual([2, 1]);
    expect(versions.body[1].snapshot.network.links[0].k).toBe(3e8);
    expect(versions.body[0].snapshot.design).toEqual(design);
    expect(await count('audit_events', id, 'entity_id')).toBe(2);

    // A draft computes without saving.
    const draft = await editor.post(`/api/cascades/${id}/compute`, { network: network(9e8) });
    expect(draft.status).toBe(200);
    expect(draft.body.outputs.formationYields.CS).toBeCloseTo(0.9, 12);
    expect((await editor.get(`/api/cascades/${id}`)).body.version).toBe(2);

    expect((await editor.delete(`/api/cascades/${id}`)).status).toBe(204);
    expect((await editor.get(`/api/cascades/${id}`)).status).toBe(404);
    expect(await count('cascade_versions', id, 'cascade_id')).toBe(0);
  });

  it('refuses a bad network naming the field, and saves nothing', async () => {
    const before = await t.db.query('SELECT count(*)::int AS n FROM cascades');
    const bad = network(1e8);
    bad.links[0] = { from: 'X', to: 'Nowhere', k: 1e8 };
    const refused = await editor.post(`/api/workspaces/${wid}/cascades`, {
      name: 'Broken',
      network: bad,
    });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.map((f: { field: string }) => f.field)).toContain(
      'network.links[0].to',
    );
    const missing = await editor.post(`/api/workspaces/${wid}/cascades`, { name: 'No network' });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields[0].field).toBe('network');
    const after = await t.db.query('SELECT count(*)::int AS n FROM cascades');
    expect(after[0].n).toBe(before[0].n);
  });
});
