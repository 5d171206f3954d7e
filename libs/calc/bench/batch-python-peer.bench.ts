/**
 * Benchmark: `gapwise calc --batch` against a plain Python script on the same input — 2·10⁵
 * `rate.marcus` request lines, all four inputs (ΔG°, λ, |H_DA|, T) varied per line. The Python
 * peer reads each line with `json.loads`, computes the classical Marcus rate with `math`, and
 * writes one JSON answer per line (the same work, minus validation, units and warnings). Runs
 * alternate (gapwise, python, gapwise, python) and the best of the two of each is compared; the
 * outputs are checked to agree (k and log10k to a relative 1e-9, line by line). Then gapwise runs
 * once on 10⁶ lines: peak RSS (GNU time) beside the 2·10⁵ run's shows whether memory stays flat.
 * Start-up: `node apps/cli/bin/gapwise.js` (the installed `gapwise` command, a prebuilt bundle).
 * Target: gapwise ≥ 2× the Python peer at 2·10⁵ lines; memory flat at 10⁶.
 */
import { spawn, spawnSync } from 'node:child_process';
import {
  createReadStream,
  existsSync,
  mkdtempSync,
  readFileSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const BIN = fileURLToPath(new URL('../../../apps/cli/bin/gapwise.js', import.meta.url));
const GNU_TIME = '/usr/bin/time';
const LINES = 200_000;
const LARGE = 1_000_000;

/**
 * The peer: CODATA 2018 ħ = 6.582119569e-16 eV s and k_B = 8.617333262e-5 eV/K; nonadiabatic
 * Marcus rate k = (2π/ħ)|H|² (4πλk_BT)^(−1/2) exp(−(ΔG° + λ)²/(4λk_BT)) (Marcus, Annu. Rev.
 * Phys. Chem. 15, 155 (1964); Marcus & Sutin, BBA 811, 265 (1985)).
 */
const PYTHON_PEER = String.raw`
import sys, json, math
HBAR = 6.582119569e-16
KB = 8.617333262e-5
out = sys.stdout
write = out.write
for line in sys.stdin:
    r = json.loads(line)
    i = r["inputs"]
    dg = i["deltaG0"]; lam = i["lambda"]; h = i["coupling"]; t = i["temperature"]
    kt = KB * t
    ga = (dg + lam) ** 2 / (4 * lam)
    k = (2 * math.pi / HBAR) * h * h / math.sqrt(4 * math.pi * lam * kt) * math.exp(-ga / kt)
    write(json.dumps({"ok": True, "method": "rate.marcus", "outputs": {"k": k, "log10k": math.log10(k), "activationFreeEnergy": ga}}) + "\n")
`;

function requestLine(i: number): string {
  return JSON.stringify({
    method: 'rate.marcus',
    inputs: {
      deltaG0: -0.05 - (i % 1009) * 1e-3,
      lambda: 0.4 + (i % 613) * 1e-3,
      coupling: 0.001 + (i % 97) * 1e-4,
      temperature: 250 + (i % 101),
    },
  });
}

function writeRequests(path: string, lines: number): void {
  const parts: string[] = [];
  for (let i = 0; i < lines; i++) parts.push(requestLine(i));
  writeFileSync(path, `${parts.join('\n')}\n`);
}

interface Run {
  readonly ms: number;
  readonly peakKb?: number;
  readonly cpuSeconds?: number;
}

function run(command: string, args: string[], input: string, output: string | null): Promise<Run> {
  const useTime = existsSync(GNU_TIME);
  const cmd = useTime ? GNU_TIME : command;
  const all = useTime ? ['-f', '%U %S %M', command, ...args] : args;
  return new Promise((resolve, reject) => {
    const start = performance.now();
    const child = spawn(cmd, all, { stdio: ['pipe', 'pipe', 'pipe'] });
    const chunks: Buffer[] = [];
    child.stdout.on('data', (c: Buffer) => {
      if (output) chunks.push(c);
    });
    let stderr = '';
    child.stderr.setEncoding('utf8').on('data', (s: string) => (stderr += s));
    child.on('error', reject);
    child.on('close', (code) => {
      const ms = performance.now() - start;
      if (code !== 0) return reject(new Error(`${command} exited ${code}: ${stderr.slice(-500)}`));
      if (output) writeFileSync(output, Buffer.concat(chunks));
      const m = useTime ? /([\d.]+) ([\d.]+) (\d+)\s*$/.exec(stderr) : null;
      resolve({
        ms,
        peakKb: m ? Number(m[3]) : undefined,
        cpuSeconds: m ? Number(m[1]) + Number(m[2]) : undefined,
      });
    });
    createReadStream(input).pipe(child.stdin);
  });
}

function compare(a: string, b: string): number {
  const x = readFileSync(a, 'utf8').trimEnd().split('\n');
  const y = readFileSync(b, 'utf8').trimEnd().split('\n');
  if (x.length !== y.length) throw new Error(`answer counts differ: ${x.length} vs ${y.length}`);
  let worst = 0;
  for (let i = 0; i < x.length; i++) {
    const p = JSON.parse(x[i]!).outputs;
    const q = JSON.parse(y[i]!).outputs;
    for (const key of ['k', 'log10k', 'activationFreeEnergy']) {
      const rel = Math.abs(p[key] - q[key]) / Math.max(Math.abs(q[key]), 1e-300);
      worst = Math.max(worst, rel);
    }
  }
  if (worst > 1e-9) throw new Error(`outputs disagree: worst relative difference ${worst}`);
  return worst;
}

const python = spawnSync('python3', ['--version']).status === 0 ? 'python3' : null;
const dir = mkdtempSync(join(tmpdir(), 'gapwise-peer-'));
try {
  const input = join(dir, 'marcus.jsonl');
  const script = join(dir, 'peer.py');
  writeFileSync(script, PYTHON_PEER);
  writeRequests(input, LINES);
  const gw = () => run(process.execPath, [BIN, 'calc', '--batch'], input, join(dir, 'gw.jsonl'));
  const py = () => run(python!, [script], input, join(dir, 'py.jsonl'));
  await run(process.execPath, [BIN, 'calc', '--batch'], input, null); // bundle built, cache warm
  const gwRuns: Run[] = [];
  const pyRuns: Run[] = [];
  for (let r = 0; r < 2; r++) {
    gwRuns.push(await gw());
    if (python) pyRuns.push(await py());
  }
  const best = (runs: Run[]) => runs.reduce((a, b) => (b.ms < a.ms ? b : a));
  // CPU seconds (user + system, GNU time) of the best-CPU run: what a busy machine distorts least.
  const bestCpu = (runs: Run[]) => Math.min(...runs.map((r) => r.cpuSeconds ?? Infinity));
  const g = best(gwRuns);
  const rate = (ms: number) => `${(((LINES / ms) * 1000) / 1000).toFixed(0)} k lines/s`;
  console.log(
    `gapwise calc --batch, ${LINES} rate.marcus lines (all four inputs varied), best of 2 ` +
      `(start-up included): ${(g.ms / 1000).toFixed(2)} s = ${rate(g.ms)}` +
      (g.peakKb ? `, peak RSS ${(g.peakKb / 1024).toFixed(0)} MB` : '') +
      `, ${bestCpu(gwRuns).toFixed(2)} CPU s`,
  );
  if (python) {
    const p = best(pyRuns);
    const worst = compare(join(dir, 'gw.jsonl'), join(dir, 'py.jsonl'));
    console.log(
      `plain Python peer (json + math), same input, best of 2, alternating: ${(p.ms / 1000).toFixed(2)} s = ${rate(p.ms)}; ` +
        `${bestCpu(pyRuns).toFixed(2)} CPU s; gapwise / Python = ${(p.ms / g.ms).toFixed(2)}× wall, ` +
        `${(bestCpu(pyRuns) / bestCpu(gwRuns)).toFixed(2)}× CPU (target ≥ 2×); outputs agree (worst relative difference ${worst.toExponential(1)})`,
    );
  } else console.log('python3 not found: no peer figure');
  writeRequests(input, LARGE);
  const large = await run(process.execPath, [BIN, 'calc', '--batch'], input, null);
  console.log(
    `gapwise calc --batch, ${LARGE} rate.marcus lines, one run: ${(large.ms / 1000).toFixed(2)} s` +
      (large.peakKb
        ? `, peak RSS ${(large.peakKb / 1024).toFixed(0)} MB (vs ${((g.peakKb ?? 0) / 1024).toFixed(0)} MB at ${LINES}: memory flat when about equal)`
        : ''),
  );
} finally {
  rmSync(dir, { recursive: true, force: true });
}
