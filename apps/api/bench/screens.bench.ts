/**
 * Screens end to end: 100,000 pairs uploaded as a stream, chunked, computed by standalone worker
 * processes and stored with binary COPY — alternating one worker, two workers, one, two (so a
 * change in the machine's load shows as a spread, not as a scaling figure). Prints per run wall
 * time, pairs/s, peak memory (uploading process RSS, workers' VmHWM) and the CPU time each
 * process used (uploader, each worker, the rest of the machine: PostgreSQL and other users).
 * Targets: one worker ≥ 50,000 pairs/s end to end; two ≥ 1.6× one; memory flat.
 *
 *   GAPWISE_TEST_DATABASE_URL=… npx tsx apps/api/bench/screens.bench.ts [rows]
 * (npm run bench starts the test cluster first.) Worker start-up is not timed.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { cpus } from 'node:os';
import { Worker } from 'node:worker_threads';
import { Readable } from 'node:stream';
import { createDataSource } from '@gapwise/db';
import { createTestDatabase } from '../../../test/api/support/test-database';
import { screenCsv } from '../../../test/api/screens/screen-csv';
import { startScreenService } from '../src/screens/screen-queue';
import { uploadScreen } from '../src/screens/screen-use-case';

const rows = Number(process.argv[2] ?? 100_000);
const database = await createTestDatabase();
const db = createDataSource({ url: database.url });
await db.initialize();
await db.runMigrations({ transaction: 'each' });
const user = (
  await db.query(
    `INSERT INTO users (email, display_name, password_hash) VALUES ('bench@example.test', 'Bench', 'x') RETURNING id`,
  )
)[0].id;
const ws = (await db.query(`INSERT INTO workspaces (name) VALUES ('bench') RETURNING id`))[0].id;
await db.query(`INSERT INTO memberships (workspace_id, user_id, role) VALUES ($1, $2, 'owner')`, [
  ws,
  user,
]);
const service = await startScreenService(db, { connectionString: database.url, runWorker: false });

function peakKb(pid: number): number {
  try {
    const m = /VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) : 0;
  } catch {
    return 0;
  }
}

/** User + system CPU seconds of a process so far (/proc/<pid>/stat fields 14–15, USER_HZ = 100). */
function processCpuSeconds(pid: number): number {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return (Number(fields[11]) + Number(fields[12])) / 100;
  } catch {
    return Number.NaN;
  }
}

async function startWorker(): Promise<ChildProcess> {
  const child = spawn(
    process.execPath,
    ['docker-free-scripts/run-bundled.mjs', 'apps/api/src/worker.ts'],
    {
      env: { ...process.env, DATABASE_URL: database.url, GAPWISE_SCREEN_MAINTENANCE_SECONDS: '5' },
      stdio: ['ignore', 'pipe', 'inherit'],
    },
  );
  await new Promise<void>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      if (out.includes('started')) resolve();
    });
    child.once('exit', (c) => reject(new Error(`worker exited (${c})`)));
  });
  return child;
}

/** Busy and total CPU time of the whole machine so far, in seconds (/proc/stat, USER_HZ = 100). */
function machineCpuSeconds(): { busy: number; total: number } {
  try {
    const fields = readFileSync('/proc/stat', 'utf8').split('\n')[0]!.trim().split(/\s+/).slice(1);
    const [user, nice, system, idle, iowait, irq, softirq, steal] = fields.map(Number);
    const busy = user! + nice! + system! + irq! + softirq! + (steal ?? 0);
    return { busy: busy / 100, total: (busy + idle! + iowait!) / 100 };
  } catch {
    return { busy: Number.NaN, total: Number.NaN };
  }
}

/**
 * What two CPU-bound threads get done together compared with one alone on this machine: 2.0 on
 * two real cores; less when the virtual CPUs share a physical core or are throttled. Two
 * workers cannot scale beyond what the machine itself gives two busy threads.
 */
async function machineTwoThreadScaling(): Promise<number> {
  const spin = `const { parentPort } = require('node:worker_threads');
    let x = 0; const t = performance.now();
    for (let i = 0; i < 2e8; i++) x += Math.sqrt(i);
    parentPort.postMessage({ ms: performance.now() - t, x });`;
  const time = (count: number) =>
    Promise.all(
      Array.from(
        { length: count },
        () =>
          new Promise<number>((resolve, reject) => {
            const w = new Worker(spin, { eval: true });
            w.once('message', (m: { ms: number }) => resolve(m.ms));
            w.once('error', reject);
          }),
      ),
    );
  const [alone] = await time(1);
  const together = await time(2);
  return (2 * alone!) / Math.max(...together);
}

async function run(workerCount: number, seed: number) {
  const workers = await Promise.all(Array.from({ length: workerCount }, startWorker));
  const csv = screenCsv(rows, seed); // different seed: no reuse between runs
  let peakRss = process.memoryUsage().rss;
  const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 50);
  const workerPeaks = new Map<number, number>();
  const cpuBefore = machineCpuSeconds();
  const workerCpuBefore = workers.map((w) => processCpuSeconds(w.pid!));
  const uploaderCpuBefore = process.cpuUsage();
  const started = performance.now();
  // Stream the file in 64 kB pieces, as an HTTP upload would arrive.
  const pieces = function* () {
    for (let i = 0; i < csv.length; i += 65_536) yield csv.slice(i, i + 65_536);
  };
  const screen = await uploadScreen(db, service, user, ws, Readable.from(pieces()), {
    name: `bench ${workerCount}`,
    runGoodRows: false,
    score: { kind: 'cs-fast-cr-inverted' },
  });
  const uploadedMs = performance.now() - started;
  for (;;) {
    for (const w of workers)
      workerPeaks.set(w.pid!, Math.max(workerPeaks.get(w.pid!) ?? 0, peakKb(w.pid!)));
    const s = (
      await db.query('SELECT status, rows_done FROM screens WHERE id = $1', [screen.id])
    )[0];
    if (s.status === 'done') break;
    await new Promise((r) => setTimeout(r, 100));
  }
  const wallMs = performance.now() - started;
  const cpuAfter = machineCpuSeconds();
  const uploaderCpu = process.cpuUsage(uploaderCpuBefore);
  const workerCpu = workers.map((w, i) => processCpuSeconds(w.pid!) - workerCpuBefore[i]!);
  clearInterval(sampler);
  const count = (
    await db.query('SELECT count(*)::int AS n FROM screen_results WHERE screen_id = $1', [
      screen.id,
    ])
  )[0].n;
  await Promise.all(workers.map((w) => new Promise((r) => (w.once('exit', r), w.kill('SIGTERM')))));
  return {
    workerCount,
    wallMs,
    uploadedMs,
    count,
    rowsPerSecond: rows / (wallMs / 1000),
    peakRssMb: peakRss / 2 ** 20,
    workerPeakMb: [...workerPeaks.values()].map((kb) => kb / 1024),
    machineBusySeconds: cpuAfter.busy - cpuBefore.busy,
    uploaderCpuSeconds: (uploaderCpu.user + uploaderCpu.system) / 1e6,
    workerCpuSeconds: workerCpu,
  };
}

try {
  type Run = Awaited<ReturnType<typeof run>>;
  const runs: Run[] = [];
  let seed = 100;
  for (const workerCount of [1, 2, 1, 2]) {
    const r = await run(workerCount, ++seed); // a new seed each run: no reuse between runs
    runs.push(r);
    const others =
      r.machineBusySeconds - r.uploaderCpuSeconds - r.workerCpuSeconds.reduce((a, b) => a + b, 0);
    console.log(
      `screens ${rows} pairs, ${r.workerCount} worker(s): wall ${(r.wallMs / 1000).toFixed(2)} s ` +
        `(upload+chunking ${(r.uploadedMs / 1000).toFixed(2)} s), ${Math.round(r.rowsPerSecond)} pairs/s, ` +
        `${r.count} rows stored; peak RSS uploader ${r.peakRssMb.toFixed(0)} MB, ` +
        `workers ${r.workerPeakMb.map((m) => m.toFixed(0)).join(' / ')} MB; CPU: uploader ` +
        `${r.uploaderCpuSeconds.toFixed(1)} s, worker(s) ${r.workerCpuSeconds.map((c) => c.toFixed(1)).join(' / ')} s, ` +
        `rest of machine (PostgreSQL, other users) ${others.toFixed(1)} s; machine ` +
        `${(r.machineBusySeconds / (r.wallMs / 1000)).toFixed(2)} of ${cpus().length} CPUs busy on average`,
    );
  }
  const ones = runs.filter((r) => r.workerCount === 1).map((r) => r.rowsPerSecond);
  const twos = runs.filter((r) => r.workerCount === 2).map((r) => r.rowsPerSecond);
  const best = (xs: number[]) => Math.max(...xs);
  const ratios = ones.map((o, i) => twos[i]! / o);
  const hardware = await machineTwoThreadScaling();
  console.log(
    `target one worker ≥ 50000 pairs/s end to end (10⁵ pairs): runs ${ones.map(Math.round).join(', ')}, ` +
      `best of ${ones.length} ${Math.round(best(ones))} ${best(ones) >= 50_000 ? 'met' : 'NOT met'}; ` +
      `two workers / one in each alternating pair: ${ratios.map((x) => x.toFixed(2) + '×').join(', ')} ` +
      `(target ≥ 1.6×: ${Math.min(...ratios) >= 1.6 ? 'met' : 'NOT met'})`,
  );
  console.log(
    `this machine: two CPU-bound threads together do ${hardware.toFixed(2)}× the work of one ` +
      `(2.00 on two real cores), so two workers here can reach at most about that.`,
  );
} finally {
  await service.stop();
  await db.destroy();
  await database.drop();
}
