/**
 * The bundled server as it runs in production (docker-free-scripts/run-bundled.mjs): its
 * calculations run in the compute pool's own bundle, so health is answered while an expensive
 * calculation computes, and SIGTERM stops the server cleanly (exit code 0, not the 10 s force
 * timer's 1) within 10 s even while the calculation runs.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { registerUser, startTestApp, type TestApp } from './support/test-app';

process.env['GAPWISE_SCREEN_WORKER'] = 'false';
process.env['GAPWISE_TRACE_WORKER'] = 'false';

const root = fileURLToPath(new URL('../..', import.meta.url));
const workerBundle = join(root, '.cache', 'bundles', 'apps-api-src-compute-compute-worker.mjs');

/** 350 Monte Carlo samples of an MLJ rate with S = 5e4: about 1.8e7 vibronic terms, seconds. */
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
    samples: 350,
    seed: 3,
  },
};

let t: TestApp;
let token: string;
let server: ChildProcess | undefined;

beforeAll(async () => {
  // The in-process app migrates the database and makes a user with an API token; the spawned
  // server then serves the same database.
  t = await startTestApp();
  const user = await registerUser(t.app, 'process');
  token = (await user.post('/api/tokens', { name: 'process' })).body.token;
}, 120_000);
afterAll(async () => {
  server?.kill('SIGKILL');
  await t?.close();
});

function startServer(): Promise<string> {
  const child = spawn(
    process.execPath,
    ['docker-free-scripts/run-bundled.mjs', 'apps/api/src/main.ts'],
    {
      cwd: root,
      env: {
        ...process.env,
        DATABASE_URL: t.config.databaseUrl,
        JWT_SECRET: t.config.jwtSecret,
        PORT: '0',
        SMTP_PORT: String(t.config.smtpPort),
        WEB_DIST: 'test-output/no-web-build',
        MIGRATE_ON_START: 'false',
        CALC_THREADS: '1',
        CALC_BUDGET_MS: '60000',
        GAPWISE_SCREEN_WORKER: 'false',
        GAPWISE_TRACE_WORKER: 'false',
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    },
  );
  server = child;
  child.stderr!.on('data', (d: Buffer) => process.stderr.write(`[server] ${d}`));
  return new Promise((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      const m = /running at (http:\/\/[^\s]+?)\/?\s/.exec(out);
      if (m) resolve(m[1]!);
    });
    child.once('exit', (code) => reject(new Error(`server exited early (${code})`)));
  });
}

describe('the bundled server', () => {
  it('answers health while a calculation computes in the pool bundle, and stops on SIGTERM within 10 s', async () => {
    const base = await startServer();
    expect(existsSync(workerBundle)).toBe(true);
    expect(statSync(workerBundle).mtimeMs).toBeGreaterThanOrEqual(
      statSync(join(root, 'apps/api/src/compute/compute-worker.ts')).mtimeMs,
    );
    const order: string[] = [];
    const calc = fetch(`${base}/api/calc`, {
      method: 'POST',
      headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
      body: JSON.stringify(EXPENSIVE),
    }).then(
      (res) => (order.push('calc'), res.status),
      () => (order.push('calc'), 0),
    );
    await new Promise((r) => setTimeout(r, 300));
    const health = await fetch(`${base}/api/health`);
    order.push('health');
    expect(health.status).toBe(200);
    expect(order).toEqual(['health']);

    // SIGTERM while the calculation still runs.
    const exited = new Promise<{ code: number | null; ms: number }>((resolve) => {
      const sentAt = Date.now();
      server!.once('exit', (code) => resolve({ code, ms: Date.now() - sentAt }));
    });
    expect(order).toEqual(['health']);
    server!.kill('SIGTERM');
    const { code, ms } = await exited;
    expect(code).toBe(0);
    expect(ms).toBeLessThan(10_000);
    await calc;
  }, 120_000);
});
