/**
 * One cascade, three paths: the demo triad saved through the API (computed in the worker pool, the
 * numbers the cascade page and the report show — test/e2e/cascades.e2e.ts checks the page against
 * the stored results) and the same `kinetics.network` request given to `gapwise calc` must give
 * the same yields and lifetimes, to the last digit.
 */
import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_TRIAD_NETWORK } from '../../apps/api/src/cascades/demo-cascade-seed';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';

process.env['GAPWISE_SCREEN_WORKER'] = 'false';

const BIN = fileURLToPath(new URL('../../apps/cli/bin/gapwise.js', import.meta.url));

let t: TestApp;
let editor: Session;
let wid: string;

beforeAll(async () => {
  t = await startTestApp();
  editor = await registerUser(t.app, 'cli-parity');
  wid = (await editor.post('/api/workspaces', { name: 'Parity' })).body.id;
}, 120_000);
afterAll(async () => t?.close());

function gapwiseCalc(request: unknown): Promise<{ code: number | null; stdout: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [BIN, 'calc'], { stdio: ['pipe', 'pipe', 'inherit'] });
    let stdout = '';
    child.stdout.setEncoding('utf8').on('data', (chunk: string) => (stdout += chunk));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout }));
    child.stdin.end(JSON.stringify(request));
  });
}

describe('gapwise calc and the cascade API', () => {
  it('give the demo triad the same yields and lifetimes', async () => {
    const saved = await editor.post(`/api/workspaces/${wid}/cascades`, {
      name: 'Triad',
      network: DEMO_TRIAD_NETWORK,
    });
    expect(saved.status).toBe(201);
    const stored = saved.body.results;

    const run = await gapwiseCalc({ method: 'kinetics.network', inputs: DEMO_TRIAD_NETWORK });
    expect(run.code).toBe(0);
    const cli = JSON.parse(run.stdout);
    expect(cli.ok).toBe(true);

    const yieldIds = Object.keys(stored.yields);
    expect(yieldIds.length).toBeGreaterThan(0);
    for (const id of yieldIds) expect(cli.outputs.yields[id]).toBe(stored.yields[id]);
    const formationIds = Object.keys(stored.formationYields);
    expect(formationIds.length).toBeGreaterThan(2);
    for (const id of formationIds)
      expect(cli.outputs.formationYields[id]).toBe(stored.formationYields[id]);
    expect(cli.outputs.lifetimes).toEqual(stored.lifetimes);
    // The bridge's point: some charge separation survives to the far acceptor.
    expect(stored.formationYields.CS2).toBeGreaterThan(0);
  }, 120_000);
});
