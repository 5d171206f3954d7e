/** Public API of the quenching family of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { diffusionMethod } from './diffusion/diffusion';

export {
  debyeFactor,
  diffusionMethod,
  diffusionQuenching,
  encounterQuenchingRate,
  smoluchowskiRateM1S1,
} from './diffusion/diffusion';
export type { QuenchInputs, QuenchResult } from './diffusion/diffusion';

/** Every `quench.*` method, for the registry. */
export const quenchMethods: MethodDefinition<any>[] = [diffusionMethod];
