/**
 * Benchmark: 10⁷ energy-gap samples through the streaming `GapSampleAccumulator`, fed in 64 k
 * chunks as a server job reading a file would (the chunks are generated outside the timed part;
 * only one chunk exists at a time, so the figure shows the accumulator's own bounded memory).
 * Then the second pass (`HistogramCounter`) with the Freedman–Diaconis edges from the first.
 * Prints wall time, throughput and peak resident memory (Node's maxRSS).
 */
import { pathToFileURL } from 'node:url';

import {
  equalWidthEdges,
  freedmanDiaconisBinCount,
  GapSampleAccumulator,
  HistogramCounter,
} from '../src/gap/index';

const SAMPLES = 10_000_000;
const CHUNK = 1 << 16;

/** Fills `chunk` with an AR(1) series (φ = 0.95) from a Park–Miller generator; returns the state. */
function fillChunk(chunk: Float64Array, state: { seed: number; x: number }): void {
  for (let i = 0; i < chunk.length; i++) {
    state.seed = (state.seed * 16807) % 2147483647;
    state.x = 0.95 * state.x + 0.3 * (state.seed / 2147483647 - 0.5);
    chunk[i] = 1.2 + state.x;
  }
}

function streamChunks(visit: (chunk: Float64Array) => void): number {
  const chunk = new Float64Array(CHUNK);
  const state = { seed: 12345, x: 0 };
  let elapsedMs = 0;
  for (let done = 0; done < SAMPLES; done += CHUNK) {
    const view = chunk.subarray(0, Math.min(CHUNK, SAMPLES - done));
    fillChunk(view, state);
    const start = performance.now();
    visit(view);
    elapsedMs += performance.now() - start;
  }
  return elapsedMs;
}

export async function runGapSamplesBench(): Promise<void> {
  const accumulator = new GapSampleAccumulator();
  const firstPassMs = streamChunks((chunk) => accumulator.pushMany(chunk));
  const startStats = performance.now();
  const stats = accumulator.statistics();
  const statsMs = performance.now() - startStats;
  const [q1, q3] = stats.quartileEstimates;
  const bins = freedmanDiaconisBinCount(q3 - q1, stats.count, stats.min, stats.max);
  const counter = new HistogramCounter(equalWidthEdges(stats.min, stats.max, bins));
  const secondPassMs = streamChunks((chunk) => counter.pushMany(chunk));
  const maxRssMb = process.resourceUsage().maxRSS / 1024;
  const perSampleNs = ((firstPassMs + statsMs) * 1e6) / SAMPLES;
  console.log(
    [
      `reorg.gapSamples streaming accumulator, ${SAMPLES.toExponential(0)} samples:`,
      `  first pass (moments, blocking, quartile subsample): ${(firstPassMs + statsMs).toFixed(0)} ms` +
        ` (${perSampleNs.toFixed(1)} ns/sample, ${(SAMPLES / ((firstPassMs + statsMs) / 1000) / 1e6).toFixed(1)} M samples/s)`,
      `  second pass (FD histogram, ${bins} bins): ${secondPassMs.toFixed(0)} ms`,
      `  plateau block size ${stats.plateau.blockSize}, statistical inefficiency ` +
        `${stats.statisticalInefficiency.toFixed(1)}`,
      `  peak RSS of the process: ${maxRssMb.toFixed(0)} MB (target: first pass < 1000 ms)`,
    ].join('\n'),
  );
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  await runGapSamplesBench();
}
