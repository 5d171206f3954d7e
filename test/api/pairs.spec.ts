import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Pair } from '@gapwise/contracts';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';
import { pairBody } from './support/fixtures';

let t: TestApp;
let owner: Session;
let wid: string;

beforeAll(async () => {
  t = await startTestApp();
  owner = await registerUser(t.app, 'owner');
  const ws = await owner.post('/api/workspaces', { name: 'Lab' }).expect(201);
  wid = ws.body.id;
});
afterAll(async () => t?.close());

describe('pairs', () => {
  it('creates a pair, computes results server-side, stores version 1 and an audit event', async () => {
    const res = await owner.post(`/api/workspaces/${wid}/pairs`, pairBody()).expect(201);
    const pair = res.body as Pair;
    expect(pair.version).toBe(1);
    expect(pair.parameters).toHaveLength(4);
    expect(pair.parameters[1]).toMatchObject({ kind: 'lambdaOuter', value: 0.8, unit: 'kcal/mol' });
    expect(pair.results?.log10k).toBeTypeOf('number');
    expect(pair.results?.regime).toBe('normal');
    const versions = await owner.get(`/api/pairs/${pair.id}/versions`).expect(200);
    expect(versions.body).toHaveLength(1);
    const audit = await owner.get(`/api/workspaces/${wid}/audit`).expect(200);
    expect(audit.body.items.some((e: { action: string }) => e.action === 'pair.created')).toBe(
      true,
    );
  });

  it('lists every bad field in one 400 and saves nothing', async () => {
    const before = await owner.get(`/api/workspaces/${wid}/pairs`).expect(200);
    const bad = pairBody({ name: '', temperature: -3 });
    (bad.parameters[0] as { unit: string }).unit = 'parsec';
    (bad.parameters[1] as { provenance: unknown }).provenance = { kind: 'literature' };
    const res = await owner.post(`/api/workspaces/${wid}/pairs`, { ...bad, extra: 1 }).expect(400);
    expect(res.body.error.code).toBe('validation-failed');
    const fields = res.body.error.fields.map((f: { field: string }) => f.field);
    expect(fields).toEqual(expect.arrayContaining(['name', 'temperature', 'extra']));
    const after = await owner.get(`/api/workspaces/${wid}/pairs`).expect(200);
    expect(after.body.total).toBe(before.body.total);
  });

  it('refuses a unit of the wrong quantity and a missing literature citation', async () => {
    const bad = pairBody();
    (bad.parameters[0] as { unit: string }).unit = 'A';
    (bad.parameters[1] as { provenance: unknown }).provenance = { kind: 'literature' };
    const res = await owner.post(`/api/workspaces/${wid}/pairs`, bad).expect(400);
    const fields = res.body.error.fields.map((f: { field: string }) => f.field);
    expect(fields).toEqual(
      expect.arrayContaining(['parameters.0.unit', 'parameters.1.provenance.citation']),
    );
  });

  it('updates with the version, answers 409 with the current pair on a stale version', async () => {
    const created = (
      await owner.post(`/api/workspaces/${wid}/pairs`, pairBody({ name: 'T-upd' })).expect(201)
    ).body as Pair;
    const v2 = await owner
      .put(`/api/pairs/${created.id}`, { ...pairBody({ name: 'T-upd2' }), version: 1 })
      .expect(200);
    expect(v2.body.version).toBe(2);
    const stale = await owner
      .patch(`/api/pairs/${created.id}`, { version: 1, notes: 'late' })
      .expect(409);
    expect(stale.body.error.code).toBe('version-conflict');
    expect(stale.body.error.current.version).toBe(2);
    const patched = await owner
      .patch(`/api/pairs/${created.id}`, { version: 2, notes: 'on time' })
      .expect(200);
    expect(patched.body).toMatchObject({ version: 3, notes: 'on time', name: 'T-upd2' });
    const cmp = await owner.get(`/api/pairs/${created.id}/compare?from=1&to=3`).expect(200);
    const fields = cmp.body.differences.map((d: { field: string }) => d.field);
    expect(fields).toEqual(expect.arrayContaining(['name', 'notes']));
    const v1 = await owner.get(`/api/pairs/${created.id}/versions/1`).expect(200);
    expect(v1.body.name).toBe('T-upd');
  });

  it('sorts, filters and pages the list', async () => {
    for (const [name, dg] of [
      ['S-a', -0.2],
      ['S-b', -0.9],
      ['S-c', -0.5],
    ] as const) {
      const body = pairBody({ name, tags: ['sorted'] });
      (body.parameters[0] as { value: number }).value = dg;
      await owner.post(`/api/workspaces/${wid}/pairs`, body).expect(201);
    }
    const res = await owner
      .get(`/api/workspaces/${wid}/pairs?tag=sorted&sort=-deltaG0&limit=2`)
      .expect(200);
    expect(res.body.total).toBe(3);
    expect(res.body.items.map((i: { name: string }) => i.name)).toEqual(['S-a', 'S-c']);
    const bad = await owner.get(`/api/workspaces/${wid}/pairs?sort=colour&limit=0`).expect(400);
    expect(bad.body.error.fields.map((f: { field: string }) => f.field).sort()).toEqual([
      'limit',
      'sort',
    ]);
  });

  it('archives, duplicates, computes and deletes', async () => {
    const created = (
      await owner.post(`/api/workspaces/${wid}/pairs`, pairBody({ name: 'T-life' })).expect(201)
    ).body as Pair;
    const archived = await owner.post(`/api/pairs/${created.id}/archive`).expect(200);
    expect(archived.body.status).toBe('archived');
    const dup = await owner.post(`/api/pairs/${created.id}/duplicate`).expect(201);
    expect(dup.body).toMatchObject({ name: 'T-life (copy)', status: 'draft', version: 1 });
    const computed = await owner.post(`/api/pairs/${created.id}/compute`).expect(200);
    expect(computed.body.log10k).toBeCloseTo(archived.body.results.log10k, 10);
    await owner.delete(`/api/pairs/${created.id}`).expect(204);
    await owner.get(`/api/pairs/${created.id}`).expect(404);
  });

  it('answers JSON 404 for unknown routes and non-uuid ids', async () => {
    const res = await request(t.app).get('/api/no-such-thing').expect(404);
    expect(res.body.error.code).toBe('not-found');
    await owner.get('/api/pairs/not-a-uuid').expect(404);
  });
});
