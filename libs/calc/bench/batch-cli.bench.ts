/**
 * Benchmark: `gapwise calc --batch` over 10⁵ request lines, spawned as a user would run it, with
 * the child's peak resident memory from GNU time (`/usr/bin/time -f %M`) when available. A run
 * with one line measures start-up (tsx, module loading), reported apart from the streaming rate.
 */
import { spawn } from 'node:child_process';
import { createReadStream, existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const BIN = fileURLToPath(new URL('../../../apps/cli/bin/gapwise.js', import.meta.url));
const GNU_TIME = '/usr/bin/time';
export const BATCH_LINES = 100_000;

export interface BatchFigure {
  readonly lines: number;
  readonly wallMs: number;
  readonly startupMs: number;
  readonly linesPerSecond: number;
  readonly steadyLinesPerSecond: number;
  readonly peakRssMb: number | undefined;
  /** Lines per CPU second of the child (user + system, start-up subtracted), load-independent. */
  readonly linesPerCpuSecond: number | undefined;
  readonly answers: number;
}

/** A mix of methods, units and a few refusals, like a screening script would send. */
function requestLine(i: number): string {
  switch (i % 5) {
    case 0:
      return JSON.stringify({
        method: 'rate.marcus',
        inputs: {
          deltaG0: -0.3 - (i % 997) * 1e-3,
          lambda: 0.8,
          coupling: 0.01,
          temperature: 298.15,
        },
      });
    case 1:
      return JSON.stringify({
        method: 'rate.mlj',
        inputs: {
          deltaG0: -1 + (i % 89) * 1e-3,
          lambdaSolvent: 0.5,
          lambdaVib: 0.18,
          hbarOmega: 0.18,
          coupling: { value: 80, unit: 'cm-1' },
          temperature: 298.15,
        },
      });
    case 2:
      return JSON.stringify({
        method: 'reorg.twoSphere',
        inputs: {
          radiusDonor: 3.5,
          radiusAcceptor: 4,
          distance: 7.5 + (i % 7),
          epsilon: 35.94,
          refractiveIndex: 1.344,
        },
      });
    case 3:
      return JSON.stringify({
        method: 'drivingForce.rehmWeller',
        inputs: {
          donorOxidation: 1,
          acceptorReduction: -1.2,
          excitationEnergy: { value: 2.8, unit: 'eV' },
          distance: 7,
          epsilon: 35.94,
        },
      });
    default:
      return i % 50 === 4
        ? '{"method":"rate.marcus","inputs":{"lambda":-1}}'
        : JSON.stringify({
            method: 'units.convert',
            inputs: { value: i, from: 'kcal/mol', to: 'eV' },
          });
  }
}

function writeRequests(path: string, lines: number): void {
  const chunks: string[] = [];
  for (let i = 0; i < lines; i++) chunks.push(requestLine(i));
  writeFileSync(path, `${chunks.join('\n')}\n`);
}

/** Runs the command on a file, counting answer lines; GNU time's %M lands on stderr. */
interface OnceFigure {
  readonly ms: number;
  readonly answers: number;
  readonly peakKb?: number;
  readonly cpuSeconds?: number;
}

function runOnce(path: string): Promise<OnceFigure> {
  const useTime = existsSync(GNU_TIME);
  const command = useTime ? GNU_TIME : process.execPath;
  const args = useTime
    ? ['-f', '%U %S %M', process.execPath, BIN, 'calc', '--batch']
    : [BIN, 'calc', '--batch'];
  return new Promise((resolve, reject) => {
    const start = performance.now();
    const child = spawn(command, args, { stdio: ['pipe', 'pipe', 'pipe'] });
    let answers = 0;
    let stderr = '';
    child.stdout.on('data', (chunk: Buffer) => {
      for (let i = 0; i < chunk.length; i++) if (chunk[i] === 10) answers++;
    });
    child.stderr.setEncoding('utf8').on('data', (text: string) => (stderr += text));
    child.on('error', reject);
    child.on('close', () => {
      const lastLine = stderr.trim().split('\n').pop() ?? '';
      const match = useTime ? /^([\d.]+) ([\d.]+) (\d+)$/.exec(lastLine) : null;
      resolve({
        ms: performance.now() - start,
        answers,
        peakKb: match ? Number(match[3]) : undefined,
        cpuSeconds: match ? Number(match[1]) + Number(match[2]) : undefined,
      });
    });
    createReadStream(path).pipe(child.stdin);
  });
}

export async function runBatchCliBench(lines = BATCH_LINES): Promise<BatchFigure> {
  const dir = mkdtempSync(join(tmpdir(), 'gapwise-bench-'));
  try {
    const one = join(dir, 'one.jsonl');
    const many = join(dir, 'many.jsonl');
    writeRequests(one, 1);
    writeRequests(many, lines);
    await runOnce(one); // warm tsx's transform cache
    const startup = await runOnce(one);
    const batch = await runOnce(many);
    const steadyMs = Math.max(1, batch.ms - startup.ms);
    return {
      lines,
      wallMs: batch.ms,
      startupMs: startup.ms,
      linesPerSecond: lines / (batch.ms / 1000),
      steadyLinesPerSecond: lines / (steadyMs / 1000),
      peakRssMb: batch.peakKb === undefined ? undefined : batch.peakKb / 1024,
      linesPerCpuSecond:
        batch.cpuSeconds === undefined || startup.cpuSeconds === undefined
          ? undefined
          : lines / Math.max(0.01, batch.cpuSeconds - startup.cpuSeconds),
      answers: batch.answers,
    };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

// Run directly (`npm run bench` runs every *.bench.ts): print the figure.
if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const { batchSummary } = await import('./bench-report');
  console.log(batchSummary(await runBatchCliBench()));
}
