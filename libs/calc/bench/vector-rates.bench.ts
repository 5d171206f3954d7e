/**
 * Benchmark: the vector paths over 10⁶ pairs on one core (arrays allocated once, outside the
 * timed part); best of 5 runs, to keep the figure about the kernel rather than about whatever
 * else the machine is doing. Three figures, labelled by what they compute:
 * - classical Marcus, `marcusLog10kInto`: ΔG° varied, λ, |H_DA| and T one value per call;
 * - classical Marcus, `marcusLog10kIntoArrays`: all four inputs varied per element (as a screen);
 * - MLJ, `mljLog10kIntoArrays`: all six inputs varied per element.
 * All output log10 k. Where python3 with numpy exists, the same per-element Marcus computation
 * runs in numpy (same inputs from the same formulas, best of 5) and the ratio is printed; the
 * sums of log10 k are compared so the two compute the same thing.
 */
import { spawnSync } from 'node:child_process';
import { pathToFileURL } from 'node:url';
import { marcusLog10kInto, marcusLog10kIntoArrays, mljLog10kIntoArrays } from '../src/index';

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
  /** Runs the best was taken of. */
  readonly runs: number;
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
    runs: RUNS,
  };
}

export function runVectorMarcusBench(): ThroughputFigure {
  const dG = drivingForces();
  const out = new Float64Array(PAIRS);
  marcusLog10kInto(out, dG, 0.8, 0.01, 298.15); // warm-up (JIT)
  const timing = bestOf(() => marcusLog10kInto(out, dG, 0.8, 0.01, 298.15));
  return figure(
    'classical Marcus, marcusLog10kInto: ΔG° varied; λ 0.8 eV, |H| 0.01 eV, T 298.15 K one value per call; log10 k',
    timing,
    2e7,
  );
}

/** Per-element inputs, from formulas the numpy peer repeats exactly (index i, n = PAIRS). */
function variedInputs() {
  const dG = drivingForces();
  const lambda = new Float64Array(PAIRS);
  const coupling = new Float64Array(PAIRS);
  const temperature = new Float64Array(PAIRS);
  for (let i = 0; i < PAIRS; i++) {
    lambda[i] = 0.3 + (i % 1000) * 1e-3;
    coupling[i] = 1e-3 + (i % 97) * 1e-4;
    temperature[i] = 250 + (i % 101);
  }
  return { dG, lambda, coupling, temperature };
}

export function runVectorMarcusVariedBench(): ThroughputFigure & { sum: number } {
  const { dG, lambda, coupling, temperature } = variedInputs();
  const out = new Float64Array(PAIRS);
  const run = () => marcusLog10kIntoArrays(out, dG, lambda, coupling, temperature);
  run();
  const timing = bestOf(run);
  let sum = 0;
  for (let i = 0; i < PAIRS; i++) sum += out[i]!;
  return {
    ...figure(
      'classical Marcus, marcusLog10kIntoArrays: all four inputs varied per element; log10 k',
      timing,
      2e7,
    ),
    sum,
  };
}

/**
 * The numpy peer of `runVectorMarcusVariedBench`: best of 5 wall ms and the sum of log10 k, or
 * undefined without python3 + numpy. CODATA 2018 ħ and k_B, as the core.
 */
export function runNumpyMarcusPeer(): { bestMs: number; sum: number } | undefined {
  const script = `
import time, math
import numpy as np
n = ${PAIRS}
i = np.arange(n, dtype=np.float64)
dg = -2 + 2.5 * i / (n - 1)
lam = 0.3 + (np.arange(n) % 1000) * 1e-3
h = 1e-3 + (np.arange(n) % 97) * 1e-4
t = 250.0 + (np.arange(n) % 101)
HBAR = 6.582119569e-16
KB = 8.617333262e-5
best = float('inf')
for _ in range(${RUNS}):
    t0 = time.perf_counter()
    w = 4 * lam * KB * t
    ln = math.log(2 * math.pi / HBAR) + 2 * np.log(np.abs(h)) - 0.5 * np.log(math.pi * w) - (dg + lam) ** 2 / w
    out = ln / math.log(10)
    best = min(best, (time.perf_counter() - t0) * 1000)
print(best, float(out.sum()))
`;
  const r = spawnSync('python3', ['-c', script], { encoding: 'utf8' });
  if (r.status !== 0) return undefined;
  const [ms, sum] = r.stdout.trim().split(/\s+/).map(Number);
  return ms === undefined || sum === undefined ? undefined : { bestMs: ms, sum };
}

export function runVectorMljBench(): ThroughputFigure {
  const { dG, coupling, temperature } = variedInputs();
  const lambdaSolvent = new Float64Array(PAIRS);
  const lambdaVib = new Float64Array(PAIRS);
  const hbarOmega = new Float64Array(PAIRS);
  for (let i = 0; i < PAIRS; i++) {
    lambdaSolvent[i] = 0.3 + (i % 400) * 1e-3;
    hbarOmega[i] = 0.12 + (i % 13) * 0.01;
    // S = λ_v/ħω between 0.5 and 1.5.
    lambdaVib[i] = hbarOmega[i]! * (0.5 + (i % 11) * 0.1);
  }
  const out = new Float64Array(PAIRS);
  const terms = new Float64Array(PAIRS);
  const run = () =>
    mljLog10kIntoArrays(out, dG, lambdaSolvent, lambdaVib, hbarOmega, coupling, temperature, terms);
  run();
  const timing = bestOf(run);
  let totalTerms = 0;
  for (let i = 0; i < PAIRS; i++) totalTerms += terms[i]!;
  return figure(
    `MLJ, mljLog10kIntoArrays: all six inputs varied per element (ħω 0.12–0.24 eV, S 0.5–1.5; mean ${(totalTerms / PAIRS).toFixed(1)} terms); log10 k`,
    timing,
    2e6,
  );
}

// Run directly (`npm run bench` runs every *.bench.ts): print both figures.
if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const { numpyComparison, throughputSummary } = await import('./bench-report');
  console.log(throughputSummary(runVectorMarcusBench()));
  const varied = runVectorMarcusVariedBench();
  console.log(throughputSummary(varied));
  console.log(numpyComparison(varied, runNumpyMarcusPeer()));
  console.log(throughputSummary(runVectorMljBench()));
  console.log(
    `  peak RSS of the process: ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`,
  );
}
