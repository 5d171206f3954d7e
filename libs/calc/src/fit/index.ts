/** Public API of the fitting family of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { drivingForceSeriesMethod } from './driving-force-series/driving-force-series';
import { electrodeKineticsFitMethod } from './electrode-kinetics/electrode-kinetics';

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

export {
  butlerVolmerLog10k,
  ELECTRODE_FIT_MAX_POINTS,
  electrodeKineticsFitMethod,
  fitElectrodeKinetics,
  fitElectrodeModel,
  mhcLog10k,
} from './electrode-kinetics/electrode-kinetics';
export type {
  ElectrodeDirection,
  ElectrodeFit,
  ElectrodeFitInputs,
  ElectrodeModel,
  ElectrodeModelFit,
  ElectrodePoint,
  ElectrodeVerdict,
} from './electrode-kinetics/electrode-kinetics';

/** Every `fit.*` method, for the registry. */
export const fitMethods: MethodDefinition<any>[] = [
  drivingForceSeriesMethod,
  electrodeKineticsFitMethod,
];
