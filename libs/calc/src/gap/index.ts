/** Public API of the energy-gap sampling family of the calculation core (`reorg.gapSamples`). */
import type { MethodDefinition } from '../core/method';
import { gapSamplesMethod } from './gap-samples/gap-samples';

export {
  findPlateau,
  GapSampleAccumulator,
  HistogramCounter,
  MIN_BLOCKS,
} from './gap-accumulator/gap-accumulator';
export type { BlockLevel, BlockPlateau, GapStatistics } from './gap-accumulator/gap-accumulator';
export { SystematicSample } from './gap-accumulator/systematic-sample';
export {
  analyseGapSamples,
  fitParabola,
  gapOutputsFromCounts,
  gapSamplesMethod,
  planGapHistograms,
} from './gap-samples/gap-samples';
export type {
  GapHistogramCounts,
  GapOutputs,
  GapHistogramPlan,
  GapSampleInputs,
  GapStateSummary,
  Parabola,
} from './gap-samples/gap-samples';
export {
  countInBins,
  equalWidthEdges,
  freedmanDiaconisBinCount,
  freedmanDiaconisHistogram,
  MAX_HISTOGRAM_BINS,
  percentileSorted,
} from './histogram/histogram';
export type { Histogram } from './histogram/histogram';
export { mergeDiabaticCurves } from './merged-curve/merged-curve';
export type { MergedFreeEnergyCurve } from './merged-curve/merged-curve';

/** The gap-sampling methods, for the registry. */
export const gapMethods: MethodDefinition<any>[] = [gapSamplesMethod];
