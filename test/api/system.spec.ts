import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import request from 'supertest';
import type { Router } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROUTE_DOCS } from '../../apps/api/src/docs/route-docs';
import { mountedRoutes } from './support/routes';
import { registerUser, startTestApp, type TestApp } from './support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => t?.close());

describe('system', () => {
  it('health reports version, database and migrations', async () => {
    const res = await request(t.app).get('/api/health').expect(200);
    expect(res.body).toMatchObject({
      status: 'ok',
      database: { reachable: true },
      migrations: { pending: [] },
    });
    expect(res.body.version).toMatch(/^\d+\.\d+\.\d+/);
    expect(res.body.migrations.applied).toBeGreaterThan(0);
  });

  it('unknown /api routes answer JSON 404; malformed JSON a 400; no stack traces', async () => {
    const res = await request(t.app).post('/api/nothing/here').send({}).expect(404);
    expect(res.headers['content-type']).toMatch(/json/);
    expect(res.body.error.code).toBe('not-found');
    const s = await registerUser(t.app);
    const bad = await s
      .post('/api/workspaces')
      .set('Content-Type', 'application/json')
      .send('{"name": ')
      .expect(400);
    expect(bad.body.error.code).toBe('invalid-json');
    expect(JSON.stringify(bad.body)).not.toMatch(/at .*\.ts:\d+/);
  });

  it('refuses bodies over the JSON limit with 413', async () => {
    const s = await registerUser(t.app);
    const res = await s.post('/api/workspaces', { name: 'x'.repeat(400_000) }).expect(413);
    expect(res.body.error.code).toBe('payload-too-large');
  });

  it('sends a strict Content-Security-Policy and other helmet headers', async () => {
    const res = await request(t.app).get('/api/health');
    const csp = res.headers['content-security-policy'] as string;
    expect(csp).toContain("default-src 'self'");
    expect(csp).toMatch(/script-src 'self' 'unsafe-hashes' 'sha256-[^']+'/);
    expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
    expect(csp).toContain("style-src 'self' 'unsafe-inline'");
    expect(csp).toContain("object-src 'none'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('says clearly that the web app is not built, with a 503 page for client routes', async () => {
    const res = await request(t.app).get('/pairs/some-id').expect(503);
    expect(res.text).toContain('has not been built');
  });

  it('serves the API description and a readable page from our own swagger-ui copy', async () => {
    const page = await request(t.app).get('/api/docs').expect(200);
    expect(page.text).toContain('/api/docs/assets/swagger-ui-bundle.js');
    expect(page.text).not.toMatch(/https?:\/\//);
    await request(t.app).get('/api/docs/assets/swagger-ui-bundle.js').expect(200);
    await request(t.app).get('/api/docs/swagger-init.js').expect(200);
    const spec = await request(t.app).get('/api/docs/openapi.json').expect(200);
    expect(spec.body.openapi).toBe('3.1.0');
  });

  it('the OpenAPI description lists exactly the mounted routes', async () => {
    const mounted = mountedRoutes(t.app.locals['apiRouter'] as Router)
      .map((r) => `${r.method} ${r.path}`)
      .sort();
    const documented = ROUTE_DOCS.map((r) => `${r.method} ${r.path}`).sort();
    expect(documented).toEqual(mounted);
    const spec = (await request(t.app).get('/api/docs/openapi.json')).body;
    const inSpec = Object.entries(spec.paths as Record<string, Record<string, unknown>>)
      .flatMap(([p, ops]) =>
        Object.keys(ops).map((m) => `${m} ${p.replace(/^\/api/, '').replace(/\{(\w+)\}/g, ':$1')}`),
      )
      .sort();
    expect(inSpec).toEqual(mounted);
  });
});

describe('POST /api/calc', () => {
  const cli = resolve(__dirname, '../../apps/cli/bin/gapwise.js');
  const runCli = (input: string, batch = false) =>
    spawnSync(process.execPath, [cli, 'calc', ...(batch ? ['--batch'] : [])], {
      input,
      encoding: 'utf8',
      timeout: 60_000,
    });

  it('needs a signed-in user or an API token', async () => {
    await request(t.app).post('/api/calc').send({ method: 'rate.marcus', inputs: {} }).expect(401);
  });

  it('answers byte for byte what `gapwise calc` prints, for a good and a refused request', async () => {
    const s = await registerUser(t.app, 'calc');
    const token = (await s.post('/api/tokens', { name: 'calc' }).expect(201)).body.token as string;
    const requests = [
      {
        method: 'rate.marcus',
        inputs: {
          deltaG0: -0.35,
          lambda: { value: 8.5, unit: 'kcal/mol' },
          coupling: { value: 50, unit: 'cm-1' },
          temperature: 298.15,
        },
      },
      {
        method: 'rate.marcus',
        inputs: { deltaG0: -0.35, lambda: -1, coupling: 0.01, temperature: 298.15 },
      },
      { method: 'no.such.method', inputs: {} },
    ];
    // One `gapwise calc` run for the single request (exit code too), one --batch run for all.
    const single = runCli(JSON.stringify(requests[0]));
    expect(single.status).toBe(0);
    const lines = runCli(
      requests.map((r) => JSON.stringify(r)).join('\n') + '\n',
      true,
    ).stdout.split('\n');
    expect(lines[0] + '\n').toBe(single.stdout);
    for (const [i, body] of requests.entries()) {
      const text = JSON.stringify(body);
      const api = await request(t.app)
        .post('/api/calc')
        .set('Authorization', `Bearer ${token}`)
        .set('Content-Type', 'application/json')
        .send(text);
      expect(api.status).toBe(JSON.parse(lines[i]!).ok ? 200 : 400);
      expect(api.text).toBe(lines[i]);
    }
    expect(JSON.parse(lines[1]!).ok).toBe(false);
  });

  it('answers the second-wave methods as the core does (reference electrodes, nm, refusal by field)', async () => {
    const s = await registerUser(t.app, 'calc2');
    const token = (await s.post('/api/tokens', { name: 'calc2' }).expect(201)).body.token as string;
    const post = (body: unknown) =>
      request(t.app)
        .post('/api/calc')
        .set('Authorization', `Bearer ${token}`)
        .set('Content-Type', 'application/json')
        .send(JSON.stringify(body));
    const converted = await post({
      method: 'drivingForce.reference',
      inputs: { potential: 0.35, from: 'Fc', fromSolvent: 'MeCN', to: 'SCE' },
    }).expect(200);
    // Pavlishchuk & Addison 2000 (from memory): Fc⁺/Fc is +0.380 V vs SCE in MeCN.
    expect(converted.body.outputs.potential).toBeCloseTo(0.73, 12);
    const mixed = await post({
      method: 'drivingForce.rehmWeller',
      inputs: {
        donorOxidation: { value: 1.2, unit: 'V', reference: 'SCE' },
        acceptorReduction: { value: -1.18, unit: 'V', reference: 'Fc', solvent: 'MeCN' },
        excitationEnergy: { value: 496, unit: 'nm' },
        distance: 7,
        epsilon: 35.94,
      },
    }).expect(200);
    expect(mixed.body.warnings.map((w: { code: string }) => w.code)).toContain(
      'reference-electrode',
    );
    const modes = await post({
      method: 'reorg.normalModes',
      inputs: {
        modes: [
          { hbarOmega: 0.2, huangRhys: 0.5 },
          { hbarOmega: 0.1, huangRhys: 1 },
        ],
      },
    }).expect(200);
    expect(modes.body.outputs.lambdaVib).toBeCloseTo(0.2, 14);
    const refused = await post({
      method: 'analysis.temperature',
      inputs: { points: [{ temperature: 300, k: 1 }] },
    }).expect(400);
    expect(refused.body.errors[0].field).toBe('points');
    const nmOnEnergy = await post({
      method: 'rate.marcus',
      inputs: {
        deltaG0: -0.3,
        lambda: { value: 500, unit: 'nm' },
        coupling: 0.01,
        temperature: 298,
      },
    }).expect(400);
    expect(nmOnEnergy.body.errors[0]).toMatchObject({ field: 'lambda' });
    expect(nmOnEnergy.body.errors[0].message).toContain('wavelength');
  });
});
