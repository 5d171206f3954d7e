/**
 * API reads and small calculations against the bundled server as it runs in production (spawned
 * with docker-free-scripts/run-bundled.mjs, default pool settings); the load generator runs on
 * the same machine (its CPU is part of what is measured).
 *
 * 1. Reads: `GET /api/workspaces/:wid/pairs` (a page of 50 of 200 pairs, browser cookie session)
 *    with 32 requests in flight, 4,000 requests after 400 for warm-up: reads/s over the wall time,
 *    p50 and p99 latency. Target ≥ 1,000 reads/s, p99 < 100 ms.
 * 2. `POST /api/calc` one at a time (`rate.marcus`, ΔG° varied per request, API token): p50 and
 *    p99 of 1,000 requests after 100 for warm-up. Target p50 < 1 ms. Printed beside it, for what
 *    bounds it: `GET /api/health` one at a time (HTTP plus two database round trips, a floor for
 *    any request of this server and client, not a pure HTTP one) and
 *    the pool's own hand-off (ComputePool.run of the same request in this process minus calling
 *    the calculation directly), medians.
 *
 *   GAPWISE_TEST_DATABASE_URL=… npx tsx apps/api/bench/api-reads.bench.ts
 * (npm run bench starts the test cluster first.) Server start-up is not timed.
 */
import { spawn } from 'node:child_process';
import { calculate, serializeAnswer } from '@gapwise/calc';
import { pairBody } from '../../../test/api/support/fixtures';
import { registerUser, startTestApp } from '../../../test/api/support/test-app';
import { ComputePool } from '../src/compute/compute-pool';

process.env['GAPWISE_SCREEN_WORKER'] = 'false';
process.env['GAPWISE_TRACE_WORKER'] = 'false';

const t = await startTestApp();
const user = await registerUser(t.app, 'bench');
const token = (await user.post('/api/tokens', { name: 'bench' })).body.token as string;
const wid = (await user.post('/api/workspaces', { name: 'Bench lab' })).body.id as string;
for (let i = 0; i < 200; i++) {
  const res = await user.post(
    `/api/workspaces/${wid}/pairs`,
    pairBody({ name: `Pair ${String(i).padStart(3, '0')}` }),
  );
  if (res.status !== 201) throw new Error(`pair ${i}: ${res.status} ${JSON.stringify(res.body)}`);
}

const server = spawn(
  process.execPath,
  ['docker-free-scripts/run-bundled.mjs', 'apps/api/src/main.ts'],
  {
    env: {
      ...process.env,
      DATABASE_URL: t.config.databaseUrl,
      JWT_SECRET: t.config.jwtSecret,
      PORT: '0',
      SMTP_PORT: String(t.config.smtpPort),
      WEB_DIST: 'test-output/no-web-build',
      MIGRATE_ON_START: 'false',
    },
    stdio: ['ignore', 'pipe', 'ignore'],
  },
);
const base = await new Promise<string>((resolve, reject) => {
  let out = '';
  server.stdout!.on('data', (d: Buffer) => {
    out += d.toString();
    const m = /running at (http:\/\/[^\s]+?)\/?\s/.exec(out);
    if (m) resolve(m[1]!);
  });
  server.once('exit', (code) => reject(new Error(`server exited (${code})`)));
});
await new Promise((r) => setTimeout(r, 2000));

function percentile(sorted: number[], p: number): number {
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[i]!;
}
const median = (values: number[]) =>
  percentile(
    [...values].sort((a, b) => a - b),
    50,
  );

// 1. Reads at concurrency 32.
const cookie = user.cookies.join('; ');
async function read(): Promise<number> {
  const t0 = performance.now();
  const res = await fetch(`${base}/api/workspaces/${wid}/pairs?limit=50`, { headers: { cookie } });
  await res.arrayBuffer();
  if (res.status !== 200) throw new Error(`read: ${res.status}`);
  return performance.now() - t0;
}
async function readLoad(total: number, concurrency: number) {
  const latencies: number[] = [];
  let next = 0;
  const t0 = performance.now();
  await Promise.all(
    Array.from({ length: concurrency }, async () => {
      while (next++ < total) latencies.push(await read());
    }),
  );
  const seconds = (performance.now() - t0) / 1000;
  latencies.sort((a, b) => a - b);
  return {
    perSecond: total / seconds,
    p50: percentile(latencies, 50),
    p99: percentile(latencies, 99),
  };
}
await readLoad(400, 32);
const reads = await readLoad(4000, 32);
console.log(
  `reads: GET pairs page (50 of 200, cookie session), 32 in flight, 4000 requests: ` +
    `${reads.perSecond.toFixed(0)} reads/s, p50 ${reads.p50.toFixed(1)} ms, p99 ${reads.p99.toFixed(1)} ms ` +
    `(target ≥ 1000 reads/s, p99 < 100 ms)`,
);

// 2. POST /api/calc one at a time.
const headers = { authorization: `Bearer ${token}`, 'content-type': 'application/json' };
const small = (i: number) => ({
  method: 'rate.marcus',
  inputs: { deltaG0: -0.1 - (i % 997) / 1000, lambda: 0.8, coupling: 0.01, temperature: 298.15 },
});
async function timed(call: () => Promise<Response>): Promise<number> {
  const t0 = performance.now();
  const res = await call();
  await res.arrayBuffer();
  if (res.status !== 200) throw new Error(`status ${res.status}`);
  return performance.now() - t0;
}
const calcOnce = (i: number) =>
  timed(() =>
    fetch(`${base}/api/calc`, { method: 'POST', headers, body: JSON.stringify(small(i)) }),
  );
const healthOnce = () => timed(() => fetch(`${base}/api/health`));
for (let i = 0; i < 100; i++) await calcOnce(i);
const calcMs: number[] = [];
const healthMs: number[] = [];
// Alternating, so a change in the machine's load hits both alike.
for (let i = 0; i < 1000; i++) {
  calcMs.push(await calcOnce(i));
  healthMs.push(await healthOnce());
}
calcMs.sort((a, b) => a - b);
console.log(
  `POST /api/calc rate.marcus (ΔG° varied), 1 in flight, 1000 requests: p50 ${percentile(calcMs, 50).toFixed(2)} ms, ` +
    `p99 ${percentile(calcMs, 99).toFixed(2)} ms (target p50 < 1 ms, computed in the pool); ` +
    `GET /api/health alternating with it: median ${median(healthMs).toFixed(2)} ms (HTTP + 2 database round trips)`,
);

// 3. The pool's hand-off, in this process: same requests through ComputePool.run vs inline.
const pool = await ComputePool.start({
  threads: 1,
  queue: 10,
  interactiveBudgetMs: 10_000,
  backgroundBudgetMs: 10_000,
});
const viaPool: number[] = [];
const inline: number[] = [];
for (let i = 0; i < 1100; i++) {
  const body = small(i);
  let t0 = performance.now();
  await pool.run('calc', [body]);
  const p = performance.now() - t0;
  t0 = performance.now();
  serializeAnswer(calculate(body));
  const d = performance.now() - t0;
  if (i >= 100) {
    viaPool.push(p);
    inline.push(d);
  }
}
await pool.destroy();
console.log(
  `compute pool hand-off: ComputePool.run('calc') median ${(median(viaPool) * 1000).toFixed(0)} µs vs ` +
    `the same calculation inline ${(median(inline) * 1000).toFixed(1)} µs (1000 requests each, alternating; every POST /api/calc goes through the pool)`,
);

server.kill('SIGTERM');
await new Promise((r) => server.once('exit', r));
await t.close();
process.exit(0);
