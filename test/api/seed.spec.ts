import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  DEMO_ACCOUNTS,
  DEMO_LAB,
  DEMO_PASSWORD,
  seedDemo,
} from '../../apps/api/src/seed/demo-data';
import {
  DEMO_DYAD_NAME,
  DEMO_TRIAD_NAME,
  seedDemoCascades,
} from '../../apps/api/src/cascades/demo-cascade-seed';
import type { Pair, PairListItem } from '@gapwise/contracts';
import { registerUser, signIn, startTestApp, type TestApp } from './support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
  await seedDemo(t.db, { bcryptCost: 4 });
});
afterAll(async () => t?.close());

describe('demo seed', () => {
  it('is idempotent', async () => {
    expect(await seedDemo(t.db, { bcryptCost: 4 })).toEqual({ users: 0, workspaces: 0, pairs: 0 });
  });

  it('gives the four demo accounts their roles in the demo lab', async () => {
    for (const account of DEMO_ACCOUNTS) {
      const s = await signIn(t.app, account.email, DEMO_PASSWORD);
      const me = await s.get('/api/auth/me').expect(200);
      const lab = me.body.memberships.find(
        (m: { workspaceName: string }) => m.workspaceName === 'Halden Photoredox Lab',
      );
      expect(lab?.role).toBe(account.role);
    }
    const owner = await signIn(t.app, 'owner@gapwise.test', DEMO_PASSWORD);
    const spaces = (await owner.get('/api/workspaces').expect(200)).body.map(
      (w: { name: string }) => w.name,
    );
    expect(spaces).toHaveLength(2);
  });

  it('has DA-1…DA-6 with computed results and every kind of provenance; the mediator screen has Med- pairs', async () => {
    const viewer = await signIn(t.app, 'viewer@gapwise.test', DEMO_PASSWORD);
    const lab = (await viewer.get('/api/workspaces').expect(200)).body[0];
    const list = (await viewer.get(`/api/workspaces/${lab.id}/pairs?limit=100`).expect(200)).body
      .items as PairListItem[];
    expect(list.map((p) => p.name).sort()).toEqual([
      'DA-1',
      'DA-2',
      'DA-3',
      'DA-4',
      'DA-5',
      'DA-6',
    ]);
    const kinds = new Set<string>();
    for (const item of list) {
      const pair = (await viewer.get(`/api/pairs/${item.id}`).expect(200)).body as Pair;
      expect(pair.results?.errors).toEqual([]);
      expect(pair.results?.log10k).toBeTypeOf('number');
      for (const p of pair.parameters) {
        kinds.add(p.provenance.kind);
        if (p.provenance.kind === 'literature') expect(p.provenance.citation).toMatch(/notebook/i);
        if (p.provenance.kind === 'derived')
          expect(p.provenance.methodId).toMatch(/^[a-zA-Z]+\.[a-zA-Z]+$/);
      }
    }
    expect([...kinds].sort()).toEqual(['assumed', 'computed', 'derived', 'literature', 'measured']);
    expect(new Set(list.map((p) => p.regime))).toEqual(
      new Set(['normal', 'activationless', 'inverted']),
    );
    const owner = await signIn(t.app, 'owner@gapwise.test', DEMO_PASSWORD);
    const screen = (await owner.get('/api/workspaces').expect(200)).body.find(
      (w: { name: string }) => w.name !== lab.name,
    );
    const meds = (await owner.get(`/api/workspaces/${screen.id}/pairs`).expect(200)).body
      .items as PairListItem[];
    expect(meds.length).toBeGreaterThanOrEqual(3);
    expect(meds.every((p) => p.name.startsWith('Med-'))).toBe(true);
  });

  it('signed in as viewer@gapwise.test, PATCH of a pair is 403 and it is unchanged; another workspace’s user gets 404', async () => {
    const viewer = await signIn(t.app, 'viewer@gapwise.test', DEMO_PASSWORD);
    const lab = (await viewer.get('/api/workspaces').expect(200)).body[0];
    const item = (await viewer.get(`/api/workspaces/${lab.id}/pairs?q=DA-1`).expect(200)).body
      .items[0] as PairListItem;
    const before = (await viewer.get(`/api/pairs/${item.id}`).expect(200)).body;
    const res = await viewer
      .patch(`/api/pairs/${item.id}`, { version: before.version, name: 'renamed by viewer' })
      .expect(403);
    expect(res.body.error.code).toBe('forbidden');
    expect((await viewer.get(`/api/pairs/${item.id}`).expect(200)).body).toEqual(before);
    const other = await registerUser(t.app, 'elsewhere');
    await other.post('/api/workspaces', { name: 'Other lab' }).expect(201);
    await other.patch(`/api/pairs/${item.id}`, { version: before.version, name: 'x' }).expect(404);
    await other.get(`/api/pairs/${item.id}`).expect(404);
  });

  it('gives the lab a triad cascade whose bridge raises the long-lived yield over the dyad', async () => {
    const options = { labName: DEMO_LAB, editorEmail: 'editor@gapwise.test' };
    expect(await seedDemoCascades(t.db, options)).toBe(2);
    expect(await seedDemoCascades(t.db, options)).toBe(0);
    const viewer = await signIn(t.app, 'viewer@gapwise.test', DEMO_PASSWORD);
    const lab = (await viewer.get('/api/workspaces').expect(200)).body.find(
      (w: { name: string }) => w.name === DEMO_LAB,
    );
    const list = (await viewer.get(`/api/workspaces/${lab.id}/cascades`).expect(200)).body as {
      name: string;
      longLivedYield: number;
      longLivedLifetimeS: number;
    }[];
    const triad = list.find((c) => c.name === DEMO_TRIAD_NAME)!;
    const dyad = list.find((c) => c.name === DEMO_DYAD_NAME)!;
    expect(triad.longLivedYield).toBeGreaterThan(dyad.longLivedYield + 0.2);
    // Both end in the same S⁺…A⁻ recombination: lifetimes in the microsecond range.
    for (const c of [triad, dyad]) {
      expect(c.longLivedLifetimeS).toBeGreaterThan(1e-6);
      expect(c.longLivedLifetimeS).toBeLessThan(1e-4);
    }
  });
});
