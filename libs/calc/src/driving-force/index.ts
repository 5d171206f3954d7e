/** Driving-force methods of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { referenceMethod } from './reference/reference';
import { rehmWellerMethod } from './rehm-weller/rehm-weller';

/** Every `drivingForce.*` method, for the registry. */
export const drivingForceMethods: MethodDefinition<any>[] = [rehmWellerMethod, referenceMethod];
