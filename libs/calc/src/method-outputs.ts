/**
 * The output type of every registered method, keyed by its CALC-API id, so that
 * `calculate({ method: 'reorg.gapSamples', … })` answers `outputs.lambdaFromMeans` as a number the
 * compiler checks. A method missing here still runs: `calculate` falls back to the untyped
 * `CalcOutputs` for any id it does not know (DEVELOPERS.md, "Adding a calculation method").
 * Type-only imports: no module is loaded through this file.
 */
import type { DistanceDecayOutputs } from './coupling/distance-decay/distance-decay';
import type { GmhOutputs } from './coupling/gmh/gmh';
import type { HushOutputs } from './coupling/hush/hush';
import type { RehmWellerOutputs } from './driving-force/rehm-weller/rehm-weller';
import type { ButlerVolmerOutputs } from './electrode/butler-volmer/butler-volmer';
import type { MhcOutputs } from './electrode/mhc/mhc';
import type { MultiStateOutputs } from './evb/multi-state/multi-state';
import type { TwoStateOutputs } from './evb/two-state/two-state';
import type { DrivingForceSeriesOutputs } from './fit/driving-force-series/driving-force-series';
import type { GapSamplesOutputs } from './gap/gap-samples/gap-samples';
import type { DiffusionOutputs } from './quench/diffusion/diffusion';
import type { CrossRelationOutputs } from './rates/cross-relation/cross-relation';
import type { CrossoverOutputs } from './rates/crossover/crossover';
import type { MarcusOutputs } from './rates/marcus/marcus';
import type { MljOutputs } from './rates/mlj/mlj';
import type { RulerOutputs } from './rates/ruler/ruler';
import type { NetworkOutputs } from './kinetics/network/network';
import type { FourPointOutputs } from './reorg/four-point/four-point';
import type { TwoSphereOutputs } from './reorg/two-sphere/two-sphere';
import type { HoppingOutputs } from './transport/hopping/hopping';
import type { MonteCarloOutputs } from './uncertainty/monte-carlo/monte-carlo';
import type { ConvertOutputs } from './units/convert/convert';

export interface MethodOutputs {
  'rate.marcus': MarcusOutputs;
  'rate.mlj': MljOutputs;
  'rate.crossover': CrossoverOutputs;
  'rate.ruler': RulerOutputs;
  'rate.crossRelation': CrossRelationOutputs;
  'drivingForce.rehmWeller': RehmWellerOutputs;
  'reorg.twoSphere': TwoSphereOutputs;
  'reorg.fourPoint': FourPointOutputs;
  'kinetics.network': NetworkOutputs;
  'reorg.gapSamples': GapSamplesOutputs;
  'coupling.gmh': GmhOutputs;
  'coupling.hush': HushOutputs;
  'coupling.distanceDecay': DistanceDecayOutputs;
  'evb.twoState': TwoStateOutputs;
  'evb.multiState': MultiStateOutputs;
  'electrode.mhc': MhcOutputs;
  'electrode.butlerVolmer': ButlerVolmerOutputs;
  'transport.hopping': HoppingOutputs;
  'quench.diffusion': DiffusionOutputs;
  'fit.drivingForceSeries': DrivingForceSeriesOutputs;
  'uncertainty.monteCarlo': MonteCarloOutputs;
  'units.convert': ConvertOutputs;
}

/** A method id with a declared output type. */
export type TypedMethodId = keyof MethodOutputs;
