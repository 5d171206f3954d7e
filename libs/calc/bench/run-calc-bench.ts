/**
 * Prints the calculation-core benchmarks (never a timed test): vector Marcus and MLJ over 10⁶
 * pairs, `gapwise calc --batch` over 10⁵ lines with its peak memory, and, when present, the
 * gap-samples bench. Run: `npx tsx libs/calc/bench/run-calc-bench.ts`.
 */
import { existsSync } from 'node:fs';
import { batchSummary, numpyComparison, throughputSummary } from './bench-report';
import { runBatchCliBench } from './batch-cli.bench';
import {
  runNumpyMarcusPeer,
  runVectorMarcusBench,
  runVectorMarcusVariedBench,
  runVectorMljBench,
} from './vector-rates.bench';

const mb = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(0)} MB`;

console.log(`Node ${process.version}, ${process.platform}/${process.arch}; one core per kernel.\n`);
console.log(throughputSummary(runVectorMarcusBench()));
const varied = runVectorMarcusVariedBench();
console.log(throughputSummary(varied));
console.log(numpyComparison(varied, runNumpyMarcusPeer()));
console.log(throughputSummary(runVectorMljBench()));
console.log(
  `  peak RSS of this process after the vector runs: ${mb(process.resourceUsage().maxRSS * 1024)}\n`,
);

console.log(batchSummary(await runBatchCliBench()));

const gapBench = new URL('./gap-samples.bench.ts', import.meta.url);
if (existsSync(gapBench)) {
  const module = (await import(gapBench.href)) as { runGapSamplesBench?: () => Promise<void> };
  if (module.runGapSamplesBench) {
    console.log('');
    await module.runGapSamplesBench();
  }
} else {
  console.log('\n(gap-samples bench not present; skipped)');
}
