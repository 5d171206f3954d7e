/**
 * Benchmark: `kinetics.network` on a 20-state network (a chain of 19 ET steps from an excited
 * state with a decay from every state to the ground state and a few cross links). Figures:
 * (1) one full recompute (rates, populations on the default 1 fs – 10 s grid, yields, lifetimes,
 *     pathway, landscape, sensitivity) through `calculate`, the λ of one step varied each run as a
 *     keystroke would; median and best of 50 after 5 warm-up runs (target < 16 ms);
 * (2) `uncertainty.monteCarlo` with 2000 samples of the same network in `report: 'yields'`
 *     (σ on every λ and |H_AB|), one run after one warm-up (target < 1 s).
 */
import { pathToFileURL } from 'node:url';

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

export function runKineticsNetworkBench(): void {
  const times: number[] = [];
  for (let run = 0; run < 55; run++) {
    const request = { method: 'kinetics.network', inputs: network(0.001 * run, false) };
    const start = performance.now();
    const answer = calculate(request);
    const elapsed = performance.now() - start;
    if (!answer.ok) throw new Error(JSON.stringify(answer.errors));
    if (run >= 5) times.push(elapsed);
  }
  times.sort((a, b) => a - b);
  const median = times[Math.floor(times.length / 2)];
  const mc = () =>
    calculate({
      method: 'uncertainty.monteCarlo',
      inputs: {
        method: 'kinetics.network',
        samples: 2000,
        seed: 3,
        inputs: { ...network(0, true), report: 'yields' },
      },
    });
  mc();
  const start = performance.now();
  const answer = mc();
  const mcMs = performance.now() - start;
  if (!answer.ok) throw new Error(JSON.stringify(answer.errors));
  console.log(
    [
      'kinetics.network, 20 states, 39 links (λ of one step varied per run):',
      `  full recompute: median ${median.toFixed(1)} ms, best ${times[0].toFixed(1)} ms of 50 ` +
        `(target < 16 ms: ${median < 16 ? 'meets' : 'BELOW'})`,
      `  uncertainty.monteCarlo, 2000 samples, report 'yields', σ on every λ and |H_AB|: ` +
        `${mcMs.toFixed(0)} ms, one run after a warm-up (target < 1000 ms: ${mcMs < 1000 ? 'meets' : 'BELOW'})`,
    ].join('\n'),
  );
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runKineticsNetworkBench();
}
