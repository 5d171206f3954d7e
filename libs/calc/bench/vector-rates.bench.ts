/**
 * Benchmark: the vector paths `marcusLog10kInto` and `mljLog10kInto` over 10⁶ driving forces on
 * one core (the arrays are allocated once, outside the timed part). Best of several runs, to keep
 * the figure about the kernel rather than about whatever else the machine is doing.
 */
import { pathToFileURL } from 'node:url';
import { marcusLog10kInto, mljLog10kInto } from '../src/index';

export const PAIRS = 1_000_000;
const RUNS = 5;

export interface ThroughputFigure {
  readonly label: string;
  readonly bestMs: number;
  readonly perSecond: number;
  /** Evaluations per CPU second of this process (less sensitive to a loaded machine). */
  readonly perCpuSecond: number;
  readonly nsPerEvaluation: number;
  readonly target: number;
}

/** Driving forces spread over −2 … +0.5 eV (normal, activationless and inverted pairs). */
function drivingForces(): Float64Array {
  const values = new Float64Array(PAIRS);
  for (let i = 0; i < PAIRS; i++) values[i] = -2 + (2.5 * i) / (PAIRS - 1);
  return values;
}

interface Timing {
  readonly wallMs: number;
  readonly cpuMs: number;
}

/** Best wall time and best CPU time (user + system) of several runs. */
function bestOf(run: () => void): Timing {
  let wallMs = Number.POSITIVE_INFINITY;
  let cpuMs = Number.POSITIVE_INFINITY;
  for (let r = 0; r < RUNS; r++) {
    const cpuStart = process.cpuUsage();
    const start = performance.now();
    run();
    wallMs = Math.min(wallMs, performance.now() - start);
    const cpu = process.cpuUsage(cpuStart);
    cpuMs = Math.min(cpuMs, (cpu.user + cpu.system) / 1000);
  }
  return { wallMs, cpuMs };
}

function figure(label: string, timing: Timing, target: number): ThroughputFigure {
  return {
    label,
    bestMs: timing.wallMs,
    perSecond: PAIRS / (timing.wallMs / 1000),
    perCpuSecond: PAIRS / (Math.max(timing.cpuMs, 0.001) / 1000),
    nsPerEvaluation: (timing.wallMs * 1e6) / PAIRS,
    target,
  };
}

export function runVectorMarcusBench(): ThroughputFigure {
  const dG = drivingForces();
  const out = new Float64Array(PAIRS);
  marcusLog10kInto(out, dG, 0.8, 0.01, 298.15); // warm-up (JIT)
  const timing = bestOf(() => marcusLog10kInto(out, dG, 0.8, 0.01, 298.15));
  return figure('rate.marcus vector path (λ 0.8 eV, H 0.01 eV, 298.15 K)', timing, 2e7);
}

export function runVectorMljBench(): ThroughputFigure {
  const dG = drivingForces();
  const out = new Float64Array(PAIRS);
  const terms = new Float64Array(PAIRS);
  // ħω = 0.18 eV, S = 1 (λ_v = 0.18 eV), λ_s = 0.5 eV.
  const run = () => mljLog10kInto(out, dG, 0.5, 0.18, 0.18, 0.01, 298.15, terms);
  run();
  const timing = bestOf(run);
  let totalTerms = 0;
  for (let i = 0; i < PAIRS; i++) totalTerms += terms[i];
  return figure(
    `rate.mlj vector path (ħω 0.18 eV, S 1, λ_s 0.5 eV; mean ${(totalTerms / PAIRS).toFixed(1)} terms)`,
    timing,
    2e6,
  );
}

// Run directly (`npm run bench` runs every *.bench.ts): print both figures.
if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const { throughputSummary } = await import('./bench-report');
  console.log(throughputSummary(runVectorMarcusBench()));
  console.log(throughputSummary(runVectorMljBench()));
  console.log(
    `  peak RSS of the process: ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`,
  );
}
