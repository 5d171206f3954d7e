/** Public API of the transport family of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { hoppingMethod } from './hopping/hopping';

export {
  diffusionTensorCm2PerS,
  einsteinMobilityCm2PerVS,
  hopValidity,
  hoppingMethod,
  hoppingTransport,
  piWeightedDiffusionCm2PerS,
  principalAxes,
  randomWalkDiffusionCm2PerS,
} from './hopping/hopping';
export type {
  DiffusionForm,
  HoppingInputs,
  HoppingNeighbour,
  HoppingResult,
  HopValidity,
  PrincipalAxes,
  Tensor3,
} from './hopping/hopping';

/** Every `transport.*` method, for the registry. */
export const transportMethods: MethodDefinition<any>[] = [hoppingMethod];
