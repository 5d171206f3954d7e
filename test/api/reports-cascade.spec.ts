/**
 * Cascade reports (issue 17): a report of the demo triad cascade is frozen from the cascade at its
 * current version (computed in the worker pool), reviewed as pair reports are (submit, comment,
 * approve; the author never approves), and printed: the PDF text (pdftotext) carries the states,
 * the yields as the network computes them, provenance sentences with no raw JSON and no record
 * ids. The expected yields are recomputed in the test by the calculation core from the same
 * network (independent of the report code), and the final populations must sum to 1.
 * With stated uncertainties the yields get Monte Carlo intervals that bracket the nominal value.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { calculate } from '@gapwise/calc';
import type { ReportView, Role } from '@gapwise/contracts';
import { DEMO_TRIAD_NAME, DEMO_TRIAD_NETWORK } from '../../apps/api/src/cascades/demo-cascade-seed';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';

process.env['GAPWISE_SCREEN_WORKER'] = 'false';

const OUT = join(process.cwd(), 'test-output', 'reports');
const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i;

let t: TestApp;
let owner: Session;
let reviewer: Session;
let viewer: Session;
let outsider: Session;
let wid: string;
let cascadeId: string;

async function addMember(session: Session, role: Role): Promise<void> {
  await t.db.query('INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, $3)', [
    wid,
    session.userId,
    role,
  ]);
}

async function pdfText(session: Session, id: string, slug: string): Promise<string> {
  const res = await session
    .get(`/api/reports/${id}/pdf`)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    })
    .expect(200);
  expect(res.headers['content-type']).toBe('application/pdf');
  const file = join(OUT, `${slug}.pdf`);
  writeFileSync(file, res.body as Buffer);
  return execFileSync('pdftotext', ['-layout', '-enc', 'UTF-8', file, '-'], {
    encoding: 'utf8',
  }).replace(/\s+/g, ' ');
}

beforeAll(async () => {
  execFileSync('bash', ['docker-free-scripts/poppler-ensure.sh'], { stdio: 'inherit' });
  mkdirSync(OUT, { recursive: true });
  t = await startTestApp();
  owner = await registerUser(t.app, 'owner');
  wid = (await owner.post('/api/workspaces', { name: 'Photoredox' }).expect(201)).body.id;
  reviewer = await registerUser(t.app, 'reviewer');
  viewer = await registerUser(t.app, 'viewer');
  outsider = await registerUser(t.app, 'outsider');
  await addMember(reviewer, 'reviewer');
  await addMember(viewer, 'viewer');
  cascadeId = (
    await owner
      .post(`/api/workspaces/${wid}/cascades`, {
        name: DEMO_TRIAD_NAME,
        network: DEMO_TRIAD_NETWORK,
      })
      .expect(201)
  ).body.id;
}, 120_000);
afterAll(async () => t?.close());

describe('cascade reports', () => {
  it('freezes the demo triad, prints states, yields and sources, and goes through review', async () => {
    await viewer.post(`/api/workspaces/${wid}/reports`, { cascadeId }).expect(403);
    await reviewer.post(`/api/workspaces/${wid}/reports`, { cascadeId }).expect(403);
    await outsider.post(`/api/workspaces/${wid}/reports`, { cascadeId }).expect(404);
    const bad = await owner
      .post(`/api/workspaces/${wid}/reports`, { cascadeId, pairId: cascadeId })
      .expect(400);
    expect(bad.body.error.fields[0].field).toBe('pairId');
    const missing = await owner
      .post(`/api/workspaces/${wid}/reports`, { cascadeId: '00000000-0000-4000-8000-000000000000' })
      .expect(400);
    expect(missing.body.error.fields[0].field).toBe('cascadeId');

    const view = (await owner.post(`/api/workspaces/${wid}/reports`, { cascadeId }).expect(201))
      .body as ReportView;
    expect(view.kind).toBe('cascade');
    const c = view.snapshot.cascade!;
    expect(c.cascadeVersion).toBe(1);
    expect(c.states.map((s) => s.id)).toEqual(['S0', 'S1', 'T1', 'CS1', 'CS2']);

    // The yields, recomputed here by the core from the same network.
    const direct = calculate({ method: 'kinetics.network', inputs: DEMO_TRIAD_NETWORK });
    if (!direct.ok || direct.outputs.report !== 'full') throw new Error('refused');
    const finals = c.yields.filter((y) => y.label.startsWith('Final'));
    expect(finals.length).toBeGreaterThan(0);
    for (const [id, y] of Object.entries(direct.outputs.yields)) {
      const label = c.states.find((s) => s.id === id)!.label;
      const row = finals.find((f) => f.label === `Final yield of ${label}`)!;
      expect(row.value).toBeCloseTo(y, 12);
    }
    expect(finals.reduce((s, y) => s + y.value, 0)).toBeCloseTo(1, 10);
    const cs2 = c.yields.find((y) => y.label === 'Formation yield of S⁺–B–A⁻')!;
    expect(cs2.value).toBeCloseTo(direct.outputs.formationYields['CS2'], 12);
    expect(c.monteCarlo).toBeNull();

    // A cascade report's listing and audit.
    const list = (await owner.get(`/api/workspaces/${wid}/reports`).expect(200)).body;
    expect(list.some((r: { id: string; kind: string }) => r.id === view.reportId)).toBe(true);
    const audit = await t.db.query(
      `SELECT summary FROM audit_events WHERE entity_id = $1 AND action = 'report.create'`,
      [view.reportId],
    );
    expect(audit[0].summary).toContain(`cascade ${DEMO_TRIAD_NAME} v1`);

    const text = await pdfText(owner, view.reportId, 'cascade-demo-triad');
    expect(text).toContain('CASCADE REPORT');
    for (const s of c.states) expect(text).toContain(s.label);
    expect(text).toContain('Yields and lifetimes');
    expect(text).toContain('State-energy diagram');
    expect(text).toContain('Energy landscape tree');
    expect(text).toContain('Populations against time');
    expect(text).toContain(`Formation yield of S⁺–B–A⁻ ${cs2.value.toPrecision(3)}`);
    expect(text).toContain('Marcus rate from λ = 0.55 eV and |HAB| = 30 cm⁻¹ as typed');
    expect(text).toContain('Photon energy E₀₀ typed as 590 nm');
    expect(text).toContain('by detailed balance');
    expect(text).toContain('Limits of this estimate');
    expect(text).not.toContain('{"');
    const provenance = [...c.states.map((s) => s.source), ...c.steps.map((s) => s.source)];
    for (const p of provenance) {
      expect(p).not.toMatch(UUID);
      expect(p).not.toContain('{"');
    }

    // Review: submit, comment, the author cannot approve, a reviewer approves; frozen after.
    await owner.post(`/api/reports/${view.reportId}/submit`).expect(200);
    await reviewer
      .post(`/api/reports/${view.reportId}/comments`, { body: 'The bridge step looks right.' })
      .expect(201);
    await owner.post(`/api/reports/${view.reportId}/approve`).expect(403);
    const approved = (await reviewer.post(`/api/reports/${view.reportId}/approve`).expect(200))
      .body as ReportView;
    expect(approved.status).toBe('approved');
    await owner.post(`/api/reports/${view.reportId}/revise`).expect(409);
    const approvedText = await pdfText(reviewer, view.reportId, 'cascade-demo-triad-approved');
    expect(approvedText).toContain('APPROVED');
    expect(approvedText).toContain('The bridge step looks right.');
  }, 120_000);

  it("revises a draft from the cascade's new version; a σ in a saved network is refused", async () => {
    const created = await owner
      .post(`/api/workspaces/${wid}/cascades`, { name: 'Triad v2', network: DEMO_TRIAD_NETWORK })
      .expect(201);
    const view = (
      await owner.post(`/api/workspaces/${wid}/reports`, { cascadeId: created.body.id }).expect(201)
    ).body as ReportView;
    expect(view.snapshot.cascade!.monteCarlo).toBeNull();
    // The kinetics.network reader takes no { value, sigma } yet: the save names the field.
    const withSigma = JSON.parse(JSON.stringify(DEMO_TRIAD_NETWORK));
    withSigma.links[3].lambda = { value: 0.55, sigma: 0.05, unit: 'eV' };
    const refused = await owner
      .put(`/api/cascades/${created.body.id}`, { name: 'Triad v2', network: withSigma, version: 1 })
      .expect(400);
    expect(refused.body.error.fields[0].field).toBe('network.links[3].lambda');
    const changed = JSON.parse(JSON.stringify(DEMO_TRIAD_NETWORK));
    changed.links[4].lambda = 0.9;
    await owner
      .put(`/api/cascades/${created.body.id}`, { name: 'Triad v2', network: changed, version: 1 })
      .expect(200);
    const revised = (await owner.post(`/api/reports/${view.reportId}/revise`).expect(200))
      .body as ReportView;
    expect(revised.snapshot.cascade!.cascadeVersion).toBe(2);
    expect(revised.snapshotId).not.toBe(view.snapshotId);
  }, 120_000);
});
