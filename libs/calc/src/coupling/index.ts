/** Electronic-coupling methods of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { distanceDecayMethod } from './distance-decay/distance-decay';
import { gmhMethod } from './gmh/gmh';
import { hushMethod } from './hush/hush';

/** Every `coupling.*` method, for the registry. */
export const couplingMethods: MethodDefinition<any>[] = [
  gmhMethod,
  hushMethod,
  distanceDecayMethod,
];
