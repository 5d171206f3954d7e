/**
 * Benchmark: `kinetics.network` on a 20-state network (a chain of 19 ET steps from an excited
 * state with a decay from every state to the ground state and a few cross links). Figures:
 * (1) one keystroke: a full recompute (rates, populations on the default 1 fs – 10 s grid,
 *     yields, lifetimes, pathway, landscape, sensitivity) through `calculate`, the λ of one step
 *     varied each run, plus the plot geometry the page and PDF draw from it (`populationPaths`,
 *     `energyLevels`, `disconnectivityLayout` of `@gapwise/plots`); median and best of 50 after
 *     5 warm-up runs, wall time and this process's CPU time (target < 16 ms);
 * (2) `uncertainty.monteCarlo` with 2000 samples of the same network in `report: 'yields'`
 *     (σ on every λ and |H_AB|), median and best of 3 after one warm-up, wall and CPU time
 *     (target < 1 s; the API runs it in the worker pool, the page in a web worker).
 * CPU time (process.cpuUsage) is printed beside wall time because the benchmark machine is often
 * shared: wall time then includes time waiting for a core.
 */
import { pathToFileURL } from 'node:url';

import { disconnectivityLayout, energyLevels, populationPaths } from '@gapwise/plots';

import { calculate } from '../src/index';

function network(lambdaShift: number, withSigma: boolean) {
  const n = 20;
  const states = Array.from({ length: n }, (_, i) => ({
    id: i === 0 ? 'G' : `S${i}`,
    energy: i === 0 ? 0 : 2.4 - 0.09 * i,
    kind: i === 0 ? 'ground' : i === 1 ? 'excited' : 'chargeSeparated',
  }));
  const spread = (value: number, sigma: number) => (withSigma ? { value, sigma } : value);
  const links: Record<string, unknown>[] = [];
  for (let i = 1; i < n - 1; i++) {
    links.push({
      from: states[i].id,
      to: states[i + 1].id,
      lambda: spread(0.5 + 0.01 * i + (i === 5 ? lambdaShift : 0), 0.05),
      coupling: spread(0.003, 0.0005),
    });
  }
  for (let i = 1; i < n; i++) links.push({ from: states[i].id, to: 'G', k: 10 ** (9 - 0.4 * i) });
  links.push({ from: 'S3', to: 'S8', lambda: spread(0.8, 0.05), coupling: spread(0.0005, 0.0001) });
  links.push({
    from: 'S10',
    to: 'S15',
    lambda: spread(0.9, 0.05),
    coupling: spread(0.0003, 0.0001),
  });
  return { states, links };
}

const BOX = { width: 640, height: 360, left: 56, right: 16, top: 16, bottom: 40 };

/** One keystroke: recompute, then the geometry of the three pictures. */
function keystroke(lambdaShift: number): void {
  const answer = calculate({ method: 'kinetics.network', inputs: network(lambdaShift, false) });
  if (!answer.ok) throw new Error(JSON.stringify(answer.errors));
  const out = answer.outputs;
  if (out.report !== 'full') throw new Error('expected the full report');
  populationPaths(out.times, out.populations, BOX);
  energyLevels(
    out.landscape.minima.map((m) => ({ id: m.id, energy: m.energy })),
    BOX,
  );
  disconnectivityLayout(out.landscape.tree.nodes, out.landscape.tree.roots, BOX);
}

/** Runs `f` warm-up + runs times; median and best of the timed runs, wall and CPU, ms. */
function measure(f: (run: number) => void, warmUp: number, runs: number) {
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let run = 0; run < warmUp + runs; run++) {
    const cpuStart = process.cpuUsage();
    const start = performance.now();
    f(run);
    const elapsed = performance.now() - start;
    const used = process.cpuUsage(cpuStart);
    if (run >= warmUp) {
      wall.push(elapsed);
      cpu.push((used.user + used.system) / 1000);
    }
  }
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
  return {
    wallMedian: median(wall),
    wallBest: Math.min(...wall),
    cpuMedian: median(cpu),
    cpuBest: Math.min(...cpu),
  };
}

export function runKineticsNetworkBench(): void {
  const key = measure((run) => keystroke(0.001 * run), 5, 50);
  const mc = measure(
    () => {
      const answer = calculate({
        method: 'uncertainty.monteCarlo',
        inputs: {
          method: 'kinetics.network',
          samples: 2000,
          seed: 3,
          inputs: { ...network(0, true), report: 'yields' },
        },
      });
      if (!answer.ok) throw new Error(JSON.stringify(answer.errors));
    },
    1,
    3,
  );
  const verdict = (x: number, target: number) => (x < target ? 'meets' : 'MISSES');
  console.log(
    [
      'kinetics.network, 20 states, 39 links (λ of one step varied per run):',
      `  keystroke (full recompute + plot geometry), 50 runs after 5 warm-ups: ` +
        `median ${key.wallMedian.toFixed(1)} ms wall / ${key.cpuMedian.toFixed(1)} ms CPU, ` +
        `best ${key.wallBest.toFixed(1)} ms wall / ${key.cpuBest.toFixed(1)} ms CPU ` +
        `(target < 16 ms: median ${verdict(key.wallMedian, 16)}, best ${verdict(key.wallBest, 16)})`,
      `  uncertainty.monteCarlo, 2000 samples, report 'yields', σ on every λ and |H_AB|, ` +
        `3 runs after a warm-up: median ${mc.wallMedian.toFixed(0)} ms wall / ` +
        `${mc.cpuMedian.toFixed(0)} ms CPU, best ${mc.wallBest.toFixed(0)} ms wall / ` +
        `${mc.cpuBest.toFixed(0)} ms CPU ` +
        `(target < 1000 ms: median ${verdict(mc.wallMedian, 1000)}, best ${verdict(mc.wallBest, 1000)})`,
    ].join('\n'),
  );
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runKineticsNetworkBench();
}
