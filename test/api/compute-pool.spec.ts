/**
 * Calculations run in the worker-thread pool, never on the thread that answers HTTP (issue 12):
 * health and a pair read are answered while an expensive calculation runs (an ordering, not a
 * timing assertion); over its budget a calculation is stopped with 422 naming the budget; with
 * every thread busy and the queue full a request gets 503 with Retry-After; a fit with a mode so
 * soft that its MLJ sum would need ~1e15 terms is refused at once, naming ħω; and no transaction
 * stays open while a fit computes.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { calculate, serializeAnswer } from '@gapwise/calc';
import { pairBody } from './support/fixtures';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';

process.env['GAPWISE_SCREEN_WORKER'] = 'false';
process.env['GAPWISE_TRACE_WORKER'] = 'false';

/**
 * A deliberately expensive calculation within the core's work limits: 900 Monte Carlo samples of
 * an MLJ rate with S = λ_v/ħω = 5e4 (about 5e4 vibronic terms each, 1.5e7 terms in all), one to a
 * few seconds of one CPU.
 */
const EXPENSIVE = {
  method: 'uncertainty.monteCarlo',
  inputs: {
    method: 'rate.mlj',
    inputs: {
      deltaG0: { value: -0.5, sigma: 0.05 },
      lambdaSolvent: 0.3,
      lambdaVib: 0.5,
      hbarOmega: 1e-5,
      coupling: 0.01,
      temperature: 298.15,
    },
    samples: 300,
    seed: 7,
  },
};

async function waitFor(condition: () => boolean, what: string): Promise<void> {
  for (let i = 0; i < 600 && !condition(); i++) await new Promise((r) => setTimeout(r, 25));
  if (!condition()) throw new Error(`timed out waiting for ${what}`);
}

describe('with the default pool', () => {
  let t: TestApp;
  let user: Session;
  let wid: string;
  let pairId: string;

  beforeAll(async () => {
    t = await startTestApp();
    user = await registerUser(t.app, 'pool');
    wid = (await user.post('/api/workspaces', { name: 'Pool' })).body.id;
    pairId = (await user.post(`/api/workspaces/${wid}/pairs`, pairBody())).body.id;
  }, 120_000);
  afterAll(async () => t?.close());

  it('answers health and a pair read before an expensive calculation finishes', async () => {
    const order: string[] = [];
    const calc = user.post('/api/calc', EXPENSIVE).then((res) => (order.push('calc'), res));
    await waitFor(() => t.runtime.compute.running > 0, 'the calculation to start');
    const health = request(t.app)
      .get('/api/health')
      .then((res) => (order.push('health'), res));
    const pair = user.get(`/api/pairs/${pairId}`).then((res) => (order.push('pair'), res));
    const [h, p] = await Promise.all([health, pair]);
    expect(h.status).toBe(200);
    expect(p.status).toBe(200);
    // Both answered while the calculation was still computing in its worker thread.
    expect(order).not.toContain('calc');
    expect(t.runtime.compute.running).toBe(1);
    const c = await calc;
    expect(order).toEqual([expect.any(String), expect.any(String), 'calc']);
    expect(c.status).toBe(200);
    expect(c.body.ok).toBe(true);
    expect(c.body.outputs.samplesUsed).toBe(300);
  }, 60_000);

  it('computes a plain rate.marcus request in a worker thread, not on the HTTP thread', async () => {
    const marcus = {
      method: 'rate.marcus',
      inputs: { deltaG0: -0.5, lambda: 0.8, coupling: 0.01, temperature: 298.15 },
    };
    const before = t.runtime.compute.completed;
    const res = await user.post('/api/calc', marcus);
    expect(res.status).toBe(200);
    expect(res.text).toBe(serializeAnswer(calculate(marcus)));
    // piscina's count of tasks its worker threads finished went up by this one request.
    expect(t.runtime.compute.completed).toBe(before + 1);
  });

  it('keeps the CALC-API answer shape: a refusal is 400 with the field named', async () => {
    const res = await user.post('/api/calc', {
      method: 'rate.mlj',
      inputs: { ...EXPENSIVE.inputs.inputs, deltaG0: -0.5, lambdaVib: 1000, hbarOmega: 1e-12 },
    });
    expect(res.status).toBe(400);
    expect(res.body.ok).toBe(false);
    expect(res.body.errors.map((e: { field: string }) => e.field)).toContain('hbarOmega');
  });

  it('refuses the MLJ fit of a 4-point series with ħω = 1e-12 eV and λ_v = 1000 eV at once, naming ħω', async () => {
    const series = await user.post(`/api/workspaces/${wid}/series`, {
      name: 'soft mode',
      temperature: 298.15,
      points: [-0.2, -0.5, -0.8, -1.1].map((deltaG0, i) => ({
        label: `P${i}`,
        deltaG0,
        log10k: 8 + i,
      })),
    });
    expect(series.status).toBe(201);
    const fit = await user.post(`/api/series/${series.body.id}/fit`, {
      model: 'mlj',
      hbarOmega: 1e-12,
      lambdaVib: 1000,
    });
    expect(fit.status).toBe(400);
    const field = fit.body.error.fields.find((f: { field: string }) => f.field === 'mlj.hbarOmega');
    expect(field.message).toMatch(/vibronic terms.*larger ħω/);
    expect((await user.get(`/api/series/${series.body.id}`)).body.fit).toBeNull();
    // Nothing was left computing.
    expect(t.runtime.compute.running).toBe(0);
  });

  it('holds no database transaction open while a series fit computes', async () => {
    // An MLJ fit with S = λ_v/ħω = 200 (hundreds of terms per rate): seconds of computing.
    const series = await user.post(`/api/workspaces/${wid}/series`, {
      name: 'slow fit',
      temperature: 298.15,
      points: [-0.2, -0.5, -0.8, -1.1].map((deltaG0, i) => ({
        label: `Q${i}`,
        deltaG0,
        log10k: 8 + i * 0.7 + (i % 2) * 0.3,
      })),
    });
    const fit = user.post(`/api/series/${series.body.id}/fit`, {
      model: 'mlj',
      hbarOmega: 5e-3,
      lambdaVib: 1,
    });
    const done = fit.then((res) => res);
    await waitFor(() => t.runtime.compute.running > 0, 'the fit to start');
    const open = await t.db.query(
      `SELECT count(*)::int AS n FROM pg_stat_activity
        WHERE datname = current_database() AND state LIKE 'idle in transaction%'`,
    );
    expect(t.runtime.compute.running).toBe(1);
    expect(open[0].n).toBe(0);
    expect((await done).status).toBe(200);
  }, 60_000);
});

describe('with a budget of 0.3 s, one thread and a queue of one', () => {
  let t: TestApp;
  let user: Session;

  beforeAll(async () => {
    t = await startTestApp({}, { CALC_THREADS: '1', CALC_QUEUE: '1', CALC_BUDGET_MS: '300' });
    user = await registerUser(t.app, 'budget');
  }, 120_000);
  afterAll(async () => t?.close());

  it('stops a calculation over its budget with 422 naming the budget and what to change', async () => {
    const res = await user.post('/api/calc', EXPENSIVE);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('calculation-over-budget');
    expect(res.body.error.message).toMatch(/budget of 0\.3 s/);
    expect(res.body.error.message).toMatch(/fewer Monte Carlo samples/);
    expect(res.body.error.message).toMatch(/larger ħω/);
    expect(res.body.error.message).toMatch(/CALC_BUDGET_MS/);
    // The pool is usable again: a small calculation is answered.
    const small = await user.post('/api/calc', {
      method: 'rate.mlj',
      inputs: {
        deltaG0: -0.5,
        lambdaSolvent: 0.3,
        lambdaVib: 0.2,
        hbarOmega: 0.18,
        coupling: 0.01,
        temperature: 298.15,
      },
    });
    expect(small.status).toBe(200);
  }, 60_000);

  it('answers 503 with Retry-After when every thread is busy and the queue is full', async () => {
    const first = user.post('/api/calc', EXPENSIVE).then((r) => r);
    await waitFor(() => t.runtime.compute.running > 0, 'the first calculation to start');
    const second = user.post('/api/calc', EXPENSIVE).then((r) => r);
    // The second waits in the queue (one place); the third finds it full.
    await new Promise((r) => setTimeout(r, 20));
    const third = await user.post('/api/calc', EXPENSIVE);
    expect(third.status).toBe(503);
    expect(third.body.error.code).toBe('calculation-pool-busy');
    expect(Number(third.headers['retry-after'])).toBeGreaterThan(0);
    // Even the cheapest closed form goes through the pool: with the only thread busy and the
    // queue full, a plain rate.marcus request is refused too.
    const marcus = {
      method: 'rate.marcus',
      inputs: {
        deltaG0: -0.5,
        lambda: { value: 0.8, unit: 'eV' },
        coupling: 0.01,
        temperature: 298.15,
      },
    };
    const refused = await user.post('/api/calc', marcus);
    expect(refused.status).toBe(503);
    expect(refused.body.error.code).toBe('calculation-pool-busy');
    expect((await first).status).toBe(422);
    expect((await second).status).toBe(422);
    const answered = await user.post('/api/calc', marcus);
    expect(answered.status).toBe(200);
    expect(answered.text).toBe(serializeAnswer(calculate(marcus)));
  }, 60_000);

  it('answers a plain rate.marcus request only after the calculation ahead of it in the pool', async () => {
    const order: string[] = [];
    const expensive = user.post('/api/calc', EXPENSIVE).then((r) => (order.push('expensive'), r));
    await waitFor(() => t.runtime.compute.running > 0, 'the expensive calculation to start');
    const marcus = {
      method: 'rate.marcus',
      inputs: { deltaG0: -0.5, lambda: 0.8, coupling: 0.01, temperature: 298.15 },
    };
    const small = user.post('/api/calc', marcus).then((r) => (order.push('marcus'), r));
    await waitFor(() => t.runtime.compute.queued > 0, 'the marcus request to wait for the thread');
    // Computed on the HTTP thread it would have been answered at once; in the pool it waits for
    // the one thread, which the expensive calculation holds until its budget stops it.
    expect((await expensive).status).toBe(422);
    expect((await small).status).toBe(200);
    expect(order).toEqual(['expensive', 'marcus']);
  }, 60_000);
});
