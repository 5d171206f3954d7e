/**
 * Energy-gap traces end to end through the real server: two files of 10⁷ samples each
 * (≈ 170 MB of text, seeded synthetic Marcus samples) uploaded at the same time as streamed
 * multipart requests, then analysed by the server's worker (both files streamed back from the
 * S3 fake). Prints upload, analysis and total wall time and the server's peak resident set
 * (VmHWM). Targets: < 15 s end to end, peak RSS < 300 MB.
 *
 *   GAPWISE_TEST_DATABASE_URL=… npx tsx apps/api/bench/traces.bench.ts [samplesPerState]
 * (`npm run bench` starts the test cluster first.) File generation and server start-up are not
 * timed. The S3 fake runs in this process, not in the server's.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createReadStream, readFileSync } from 'node:fs';
import { mkdtemp, rm, stat } from 'node:fs/promises';
import { request as httpRequest } from 'node:http';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import pg from 'pg';
import { startObjectStore } from '../../../docker-free-scripts/s3/object-store';
import { createTestDatabase } from '../../../test/api/support/test-database';
import { marcusGapMoments, writeSyntheticTrace } from '@gapwise/traces';
import type { TraceAnalysisResult } from '@gapwise/contracts';

const samples = Number(process.argv[2] ?? 10_000_000);
const LAMBDA = 0.5;
const DG0 = -0.2;
const T = 300;
const TARGET_S = 15;
const TARGET_MB = 300;

const dir = await mkdtemp(join(tmpdir(), 'gapwise-trace-bench-'));
const database = await createTestDatabase();
const s3 = await startObjectStore({ port: 0, directory: join(dir, 's3') });
let server: ChildProcess | null = null;

/** CPU seconds (user + system) a process has used: a figure independent of machine load. */
function cpuSeconds(pid: number): number {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    return (Number(fields[11]) + Number(fields[12])) / 100;
  } catch {
    return 0;
  }
}

function status(pid: number): { hwmKb: number; rssKb: number } {
  try {
    const text = readFileSync(`/proc/${pid}/status`, 'utf8');
    return {
      hwmKb: Number(/VmHWM:\s+(\d+)/.exec(text)?.[1] ?? 0),
      rssKb: Number(/VmRSS:\s+(\d+)/.exec(text)?.[1] ?? 0),
    };
  } catch {
    return { hwmKb: 0, rssKb: 0 };
  }
}

try {
  // 1. Files (not timed).
  const m = marcusGapMoments(LAMBDA, DG0, T);
  const files = { reactant: join(dir, 'R.csv'), product: join(dir, 'P.csv') };
  const format = { header: 'frame,dE_eV', frameColumn: true, digits: 6 };
  let t0 = performance.now();
  await Promise.all([
    writeSyntheticTrace(
      files.reactant,
      { count: samples, meanEv: m.reactantMeanEv, sdEv: m.sdEv, phi: 0.5, seed: 'bench-R' },
      format,
    ),
    writeSyntheticTrace(
      files.product,
      { count: samples, meanEv: m.productMeanEv, sdEv: m.sdEv, phi: 0.5, seed: 'bench-P' },
      format,
    ),
  ]);
  const sizes = {
    reactant: (await stat(files.reactant)).size,
    product: (await stat(files.product)).size,
  };
  console.log(
    `generated 2 × ${samples.toExponential(0)} samples (${(sizes.reactant / 1e6).toFixed(0)} + ${(sizes.product / 1e6).toFixed(0)} MB) in ${((performance.now() - t0) / 1000).toFixed(1)} s`,
  );

  // 2. The real server (not timed).
  // GAPWISE_BENCH_CPU_PROF=<folder>: write a V8 CPU profile of the server there.
  const profile = process.env['GAPWISE_BENCH_CPU_PROF'];
  server = spawn(
    process.execPath,
    [
      ...(profile ? ['--cpu-prof', `--cpu-prof-dir=${profile}`] : []),
      'docker-free-scripts/run-bundled.mjs',
      'apps/api/src/main.ts',
    ],
    {
      env: {
        ...process.env,
        PORT: '0',
        DATABASE_URL: database.url,
        S3_ENDPOINT: s3.endpoint,
        JWT_SECRET: 'bench-secret-bench-secret-bench-secret-0123',
        BCRYPT_COST: '4',
        SMTP_PORT: '2599',
        WEB_DIST: join(dir, 'no-web'),
        GAPWISE_SCREEN_WORKER: 'false',
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    },
  );
  server.stderr!.on('data', (d: Buffer) => {
    const text = d.toString();
    if (
      !/NodeVersionSupportWarning|node >=22|a\.co\/|upgrade to node|trace-warnings|^\s*$/m.test(
        text,
      )
    )
      process.stderr.write(`[server] ${text}`);
  });
  const base = await new Promise<string>((resolve, reject) => {
    let out = '';
    server!.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      const found = /running at (http:\/\/[^/\s]+)\//.exec(out);
      if (found) resolve(found[1]);
    });
    server!.once('exit', (code) => reject(new Error(`server exited (${code})`)));
  });
  const pid = server.pid!;
  const idle = status(pid);

  // 3. A user (registered, then confirmed with the token of the queued e-mail) and a workspace.
  const register = await fetch(`${base}/api/auth/register`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({
      email: 'bench@example.test',
      password: 'correct horse battery',
      displayName: 'Bench',
    }),
  });
  if (register.status !== 202)
    throw new Error(`register: ${register.status} ${await register.text()}`);
  const outbox = new pg.Client({ connectionString: database.url });
  await outbox.connect();
  const mailed = await outbox.query<{ text_body: string }>(
    `SELECT text_body FROM mail_outbox WHERE kind = 'registration-confirm' AND to_address = 'bench@example.test'`,
  );
  await outbox.end();
  const token = /\/confirm\/([\w-]+)/.exec(mailed.rows[0]?.text_body ?? '')?.[1];
  if (!token) throw new Error('register: no confirmation link in the outbox');
  const confirmed = await fetch(`${base}/api/auth/confirm`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ token }),
  });
  if (confirmed.status !== 200)
    throw new Error(`confirm: ${confirmed.status} ${await confirmed.text()}`);
  const cookie = confirmed.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const csrf = ((await confirmed.json()) as { csrfToken: string }).csrfToken;
  const headers = { Cookie: cookie, 'X-CSRF-Token': csrf };
  const ws = (await (
    await fetch(`${base}/api/workspaces`, {
      method: 'POST',
      headers: { ...headers, 'Content-Type': 'application/json' },
      body: JSON.stringify({ name: 'bench' }),
    })
  ).json()) as { id: string };

  let peak = status(pid);
  const sampler = setInterval(() => {
    const now = status(pid);
    if (now.rssKb > peak.rssKb) peak = now;
  }, 50);

  /** Streams one file as multipart/form-data (fields first, then the file). */
  const upload = (state: 'reactant' | 'product') =>
    new Promise<{ id: string; sampleCount: number }>((resolve, reject) => {
      const boundary = `----gapwise-bench-${state}`;
      const head =
        `--${boundary}\r\nContent-Disposition: form-data; name="state"\r\n\r\n${state}\r\n` +
        `--${boundary}\r\nContent-Disposition: form-data; name="unit"\r\n\r\neV\r\n` +
        `--${boundary}\r\nContent-Disposition: form-data; name="column"\r\n\r\ndE_eV\r\n` +
        `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${state}.csv"\r\nContent-Type: text/csv\r\n\r\n`;
      const tail = `\r\n--${boundary}--\r\n`;
      const url = new URL(`${base}/api/workspaces/${ws.id}/traces`);
      const req = httpRequest(
        {
          host: url.hostname,
          port: url.port,
          path: url.pathname,
          method: 'POST',
          headers: {
            ...headers,
            'Content-Type': `multipart/form-data; boundary=${boundary}`,
            'Content-Length': Buffer.byteLength(head) + sizes[state] + Buffer.byteLength(tail),
          },
        },
        (res) => {
          let body = '';
          res.on('data', (c: Buffer) => (body += c.toString()));
          res.on('end', () =>
            res.statusCode === 201
              ? resolve(JSON.parse(body))
              : reject(new Error(`upload ${state}: ${res.statusCode} ${body.slice(0, 300)}`)),
          );
        },
      );
      req.on('error', reject);
      req.write(head);
      pipeline(createReadStream(files[state], { highWaterMark: 1 << 20 }), req, {
        end: false,
      }).then(() => req.end(tail), reject);
    });

  // 4. Timed: both uploads at once, then the analysis.
  const cpu0 = cpuSeconds(pid);
  t0 = performance.now();
  const [r, p] = await Promise.all([upload('reactant'), upload('product')]);
  const uploadedMs = performance.now() - t0;
  const cpuUpload = cpuSeconds(pid) - cpu0;
  const afterUpload = status(pid);
  const started = (await (
    await fetch(`${base}/api/workspaces/${ws.id}/trace-analyses`, {
      method: 'POST',
      headers: { ...headers, 'Content-Type': 'application/json' },
      body: JSON.stringify({ reactantTraceId: r.id, productTraceId: p.id, temperature: T }),
    })
  ).json()) as { id: string };
  let analysis: {
    status: string;
    result: Pick<TraceAnalysisResult, 'outputs' | 'warnings'> | null;
    error: unknown;
  };
  for (;;) {
    analysis = (await (
      await fetch(`${base}/api/trace-analyses/${started.id}`, { headers })
    ).json()) as typeof analysis;
    if (analysis.status === 'done' || analysis.status === 'failed') break;
    await new Promise((res) => setTimeout(res, 100));
  }
  const totalMs = performance.now() - t0;
  const cpuTotal = cpuSeconds(pid) - cpu0;
  clearInterval(sampler);
  const end = status(pid);
  if (analysis.status !== 'done')
    throw new Error(`analysis failed: ${JSON.stringify(analysis.error)}`);
  const out = analysis.result!.outputs;
  const mb = (kb: number) => (kb / 1024).toFixed(0);
  const totalS = totalMs / 1000;
  const peakMb = end.hwmKb / 1024;
  console.log(
    [
      `traces end to end, 2 × ${samples.toExponential(0)} samples (${((sizes.reactant + sizes.product) / 1e6).toFixed(0)} MB of text):`,
      `  upload (both files at once, streamed, hashed, stored, parsed): ${(uploadedMs / 1000).toFixed(2)} s (${r.sampleCount + p.sampleCount} samples accepted)`,
      `  analysis job (both files streamed back from object storage, two passes): ${((totalMs - uploadedMs) / 1000).toFixed(2)} s`,
      `  total ${totalS.toFixed(2)} s — ${totalS < TARGET_S ? 'meets' : 'MISSES'} target < ${TARGET_S} s (load average now ${loadavg()[0].toFixed(1)} on ${cpus().length} cores)`,
      `  server CPU time (independent of other load): uploads ${cpuUpload.toFixed(2)} s, analysis ${(cpuTotal - cpuUpload).toFixed(2)} s, total ${cpuTotal.toFixed(2)} s`,
      `  server resident set: idle ${mb(idle.rssKb)} MB, after uploads ${mb(afterUpload.rssKb)} MB, largest sampled ${mb(peak.rssKb)} MB, peak (VmHWM) ${peakMb.toFixed(0)} MB — ${peakMb < TARGET_MB ? 'meets' : 'MISSES'} target < ${TARGET_MB} MB`,
      `  result: λ = ${out.lambdaFromMeans.toFixed(4)} ± ${out.standardErrors.lambdaFromMeans.toExponential(1)} eV (seeded λ = ${LAMBDA}), ΔG° = ${out.deltaG0FromMeans.toFixed(4)} eV (seeded ${DG0}), statistical inefficiency ${out.statisticalInefficiency.reactant.toFixed(2)} (AR(1) φ = 0.5: expected 3); warnings: ${analysis.result!.warnings.map((w) => w.code).join(', ') || 'none'}`,
    ].join('\n'),
  );
} finally {
  if (server && server.exitCode === null) {
    const exited = new Promise((res) => server!.once('exit', res));
    server.kill('SIGTERM');
    await exited;
  }
  await s3.stop();
  await database.drop();
  await rm(dir, { recursive: true, force: true });
}
