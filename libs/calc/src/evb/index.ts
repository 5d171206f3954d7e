/** Two-state and multi-state mixing methods of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { adiabaticBarrierMethod } from './adiabatic-barrier/adiabatic-barrier';
import { multiStateMethod } from './multi-state/multi-state';
import { twoStateMethod } from './two-state/two-state';

/** Every `evb.*` method, for the registry. */
export const evbMethods: MethodDefinition<any>[] = [
  twoStateMethod,
  multiStateMethod,
  adiabaticBarrierMethod,
];
