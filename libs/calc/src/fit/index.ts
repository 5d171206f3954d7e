/** Public API of the fitting family of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { drivingForceSeriesMethod } from './driving-force-series/driving-force-series';

export {
  confidenceBandLog10k,
  drivingForceSeriesMethod,
  fitDrivingForceSeries,
  modelLog10k,
} from './driving-force-series/driving-force-series';
export type {
  ConfidenceBand,
  DrivingForceFit,
  DrivingForceInputs,
  FitModel,
  SeriesPoint,
} from './driving-force-series/driving-force-series';

/** Every `fit.*` method, for the registry. */
export const fitMethods: MethodDefinition<any>[] = [drivingForceSeriesMethod];
