/**
 * The output type of every registered method, keyed by its CALC-API id, so that
 * `calculate({ method: 'reorg.gapSamples', … })` answers `outputs.lambdaFromMeans` as a number the
 * compiler checks. Every registered method has its row (`registry.spec.ts` fails on a missing
 * one); an id the compiler cannot see as a literal answers the untyped `CalcOutputs`.
 * Type-only imports: no module is loaded through this file.
 */
import type { TemperatureOutputs } from '../analysis/temperature/temperature';
import type { ReferenceOutputs } from '../driving-force/reference/reference';
import type { MhcAbsoluteOutputs } from '../electrode/mhc-absolute/mhc-absolute';
import type { AdiabaticBarrierOutputs } from '../evb/adiabatic-barrier/adiabatic-barrier';
import type { SternVolmerOutputs } from '../quench/stern-volmer/stern-volmer';
import type { CrossRelationWorkOutputs } from '../rates/cross-relation-work/cross-relation-work';
import type { LandauZenerOutputs } from '../rates/landau-zener/landau-zener';
import type { MljThermalOutputs } from '../rates/mlj-thermal/mlj-thermal';
import type { NormalModesOutputs } from '../reorg/normal-modes/normal-modes';
import type { DistanceDecayOutputs } from '../coupling/distance-decay/distance-decay';
import type { GmhOutputs } from '../coupling/gmh/gmh';
import type { HushOutputs } from '../coupling/hush/hush';
import type { RehmWellerOutputs } from '../driving-force/rehm-weller/rehm-weller';
import type { ButlerVolmerOutputs } from '../electrode/butler-volmer/butler-volmer';
import type { MhcOutputs } from '../electrode/mhc/mhc';
import type { MultiStateOutputs } from '../evb/multi-state/multi-state';
import type { TwoStateOutputs } from '../evb/two-state/two-state';
import type { DrivingForceSeriesOutputs } from '../fit/driving-force-series/driving-force-series';
import type { ElectrodeKineticsFitOutputs } from '../fit/electrode-kinetics/electrode-kinetics';
import type { GapSamplesOutputs } from '../gap/gap-samples/gap-samples';
import type { DiffusionOutputs } from '../quench/diffusion/diffusion';
import type { CrossRelationOutputs } from '../rates/cross-relation/cross-relation';
import type { CrossoverOutputs } from '../rates/crossover/crossover';
import type { NetworkOutputs } from '../kinetics/network/network';
import type { MarcusOutputs } from '../rates/marcus/marcus';
import type { MljOutputs } from '../rates/mlj/mlj';
import type { RulerOutputs } from '../rates/ruler/ruler';
import type { FourPointOutputs } from '../reorg/four-point/four-point';
import type { TwoSphereOutputs } from '../reorg/two-sphere/two-sphere';
import type { HoppingOutputs } from '../transport/hopping/hopping';
import type { MonteCarloOutputs } from '../uncertainty/monte-carlo/monte-carlo';
import type { ConvertOutputs } from '../units/convert/convert';

export interface MethodOutputs {
  'rate.marcus': MarcusOutputs;
  'rate.mlj': MljOutputs;
  'rate.crossover': CrossoverOutputs;
  'rate.ruler': RulerOutputs;
  'rate.crossRelation': CrossRelationOutputs;
  'rate.crossRelationWork': CrossRelationWorkOutputs;
  'rate.landauZener': LandauZenerOutputs;
  'rate.mljThermal': MljThermalOutputs;
  'drivingForce.rehmWeller': RehmWellerOutputs;
  'drivingForce.reference': ReferenceOutputs;
  'reorg.twoSphere': TwoSphereOutputs;
  'reorg.fourPoint': FourPointOutputs;
  'kinetics.network': NetworkOutputs;
  'reorg.gapSamples': GapSamplesOutputs;
  'reorg.normalModes': NormalModesOutputs;
  'coupling.gmh': GmhOutputs;
  'coupling.hush': HushOutputs;
  'coupling.distanceDecay': DistanceDecayOutputs;
  'evb.twoState': TwoStateOutputs;
  'evb.multiState': MultiStateOutputs;
  'evb.adiabaticBarrier': AdiabaticBarrierOutputs;
  'electrode.mhc': MhcOutputs;
  'electrode.butlerVolmer': ButlerVolmerOutputs;
  'electrode.mhcAbsolute': MhcAbsoluteOutputs;
  'transport.hopping': HoppingOutputs;
  'quench.diffusion': DiffusionOutputs;
  'quench.sternVolmer': SternVolmerOutputs;
  'analysis.temperature': TemperatureOutputs;
  'fit.drivingForceSeries': DrivingForceSeriesOutputs;
  'fit.electrodeKinetics': ElectrodeKineticsFitOutputs;
  'uncertainty.monteCarlo': MonteCarloOutputs;
  'units.convert': ConvertOutputs;
}

/** A method id with a declared output type. */
export type TypedMethodId = keyof MethodOutputs;
