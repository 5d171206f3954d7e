/** Public API of the transport family of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { hoppingMethod } from './hopping/hopping';

export {
  einsteinMobilityCm2PerVS,
  hoppingMethod,
  hoppingTransport,
  piWeightedDiffusionCm2PerS,
  randomWalkDiffusionCm2PerS,
} from './hopping/hopping';
export type {
  DiffusionForm,
  HoppingInputs,
  HoppingNeighbour,
  HoppingResult,
} from './hopping/hopping';

/** Every `transport.*` method, for the registry. */
export const transportMethods: MethodDefinition<any>[] = [hoppingMethod];
