/**
 * Electrode cases through the API: create (version 1, audit), refusal by field with nothing
 * saved, update with versions and conflict, fit in the compute pool (numbers equal to the core's
 * `fitElectrodeKinetics` on the same points), apply-fit as a new version with provenance, delete.
 */
import { fitElectrodeKinetics, mhcLog10k } from '@gapwise/calc';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';

process.env['GAPWISE_SCREEN_WORKER'] = 'false';

let t: TestApp;
let editor: Session;
let wid: string;

beforeAll(async () => {
  t = await startTestApp();
  editor = await registerUser(t.app, 'electrochemist');
  wid = (await editor.post('/api/workspaces', { name: 'Electrodes' })).body.id;
}, 120_000);
afterAll(async () => t?.close());

const T = 298.15;
/** Noise-free MHC rates with λ = 0.7 eV and k⁰ = 20 s⁻¹ from −0.5 to 0.5 V. */
const points = Array.from({ length: 11 }, (_, i) => {
  const overpotentialV = -0.5 + 0.1 * i;
  const direction = overpotentialV <= 0 ? ('reduction' as const) : ('oxidation' as const);
  return {
    overpotentialV,
    direction,
    k: 10 ** mhcLog10k({ overpotentialV, direction }, 0.7, Math.log10(20), T),
  };
});

function body(overrides: Record<string, unknown> = {}) {
  return {
    name: 'Ferrocene SAM',
    redoxCouple: 'Fc⁺/Fc',
    electrode: 'Au(111), C11 thiol',
    lambdaEv: 0.85,
    temperatureK: T,
    rateSource: 'k0',
    k0: 1.25,
    provenance: 'Typed in',
    points,
    dataNote: 'k from the Laviron analysis of the voltammogram',
    ...overrides,
  };
}

async function count(sql: string, id: string): Promise<number> {
  return (await t.db.query(sql, [id]))[0].n;
}

describe('electrode cases API', () => {
  it('creates, versions, fits in the pool, applies a fit with provenance and deletes', async () => {
    const created = await editor.post(`/api/workspaces/${wid}/electrode-cases`, body());
    expect(created.status).toBe(201);
    const id = created.body.id;
    expect(created.body.version).toBe(1);
    expect(created.body.points).toHaveLength(11);
    const list = await editor.get(`/api/workspaces/${wid}/electrode-cases`);
    expect(list.body.find((c: { id: string }) => c.id === id).pointCount).toBe(11);

    const fit = await editor.post(`/api/electrode-cases/${id}/fit`, {});
    expect(fit.status).toBe(200);
    const core = fitElectrodeKinetics({ points, temperatureK: T });
    expect(fit.body.outputs.mhc.lambda).toBe(core.mhc.shape);
    expect(fit.body.outputs.mhc.lambda).toBeCloseTo(0.7, 7);
    expect(fit.body.outputs.mhc.k0).toBeCloseTo(20, 4);
    expect(fit.body.outputs.butlerVolmer.alpha).toBe(core.butlerVolmer.shape);
    expect(fit.body.outputs.verdict).toBe('mhc');

    // A draft fit (fewer points) saves nothing.
    const draft = await editor.post(`/api/electrode-cases/${id}/fit`, {
      points: points.slice(0, 6),
    });
    expect(draft.body.pointCount).toBe(6);
    expect((await editor.get(`/api/electrode-cases/${id}`)).body.version).toBe(1);

    const applied = await editor.post(`/api/electrode-cases/${id}/apply-fit`, { version: 1 });
    expect(applied.status).toBe(200);
    expect(applied.body.version).toBe(2);
    expect(applied.body.lambdaEv).toBeCloseTo(0.7, 7);
    expect(applied.body.k0).toBeCloseTo(20, 4);
    expect(applied.body.provenance).toMatch(/Fit of 11 measured k\(η\).*λ = 0\.7000 ± .* eV/);
    const stale = await editor.post(`/api/electrode-cases/${id}/apply-fit`, { version: 1 });
    expect(stale.status).toBe(409);

    const updated = await editor.put(`/api/electrode-cases/${id}`, {
      ...body({ rateSource: 'coupling', couplingEv: 0.001, densityOfStatesPerEv: 0.3 }),
      version: 2,
    });
    expect(updated.status).toBe(200);
    expect(updated.body.version).toBe(3);
    expect(updated.body.k0).toBeNull();
    const versions = await editor.get(`/api/electrode-cases/${id}/versions`);
    expect(versions.body.map((v: { version: number }) => v.version)).toEqual([3, 2, 1]);
    expect(versions.body[1].snapshot.provenance).toMatch(/^Fit of 11/);
    expect(versions.body[2].snapshot.lambdaEv).toBe(0.85);
    expect(
      await count('SELECT count(*)::int AS n FROM audit_events WHERE entity_id = $1', id),
    ).toBe(3);

    expect((await editor.delete(`/api/electrode-cases/${id}`)).status).toBe(204);
    expect((await editor.get(`/api/electrode-cases/${id}`)).status).toBe(404);
    expect(
      await count('SELECT count(*)::int AS n FROM electrode_case_versions WHERE case_id = $1', id),
    ).toBe(0);
  });

  it('refuses bad input naming the field, and saves nothing', async () => {
    const before = await t.db.query('SELECT count(*)::int AS n FROM electrode_cases');
    const noK0 = await editor.post(`/api/workspaces/${wid}/electrode-cases`, body({ k0: null }));
    expect(noK0.status).toBe(400);
    expect(noK0.body.error.fields[0].field).toBe('k0');
    expect(noK0.body.error.fields[0].message).toMatch(/Standard rate constant k⁰/);
    const noDos = await editor.post(
      `/api/workspaces/${wid}/electrode-cases`,
      body({ rateSource: 'coupling', couplingEv: 0.01 }),
    );
    expect(noDos.body.error.fields.map((f: { field: string }) => f.field)).toEqual([
      'densityOfStatesPerEv',
    ]);
    const badPoint = await editor.post(
      `/api/workspaces/${wid}/electrode-cases`,
      body({ points: [{ overpotentialV: -0.1, k: -3, direction: 'reduction' }] }),
    );
    expect(badPoint.status).toBe(400);
    expect(badPoint.body.error.fields[0].field).toMatch(/points.*0.*k/);
    expect(badPoint.body.error.fields[0].message).toMatch(/Rate constant k must be > 0/);
    const cold = await editor.post(
      `/api/workspaces/${wid}/electrode-cases`,
      body({ temperatureK: -20 }),
    );
    expect(cold.body.error.fields[0].field).toBe('temperatureK');
    const after = await t.db.query('SELECT count(*)::int AS n FROM electrode_cases');
    expect(after[0].n).toBe(before[0].n);
  });

  it('refuses a fit of too few distinct points with the field named', async () => {
    const created = await editor.post(
      `/api/workspaces/${wid}/electrode-cases`,
      body({ points: points.slice(0, 2) }),
    );
    const fit = await editor.post(`/api/electrode-cases/${created.body.id}/fit`, {});
    expect(fit.status).toBe(400);
    expect(fit.body.error.fields[0].field).toBe('points');
  });
});
