/** Public API of the quenching family of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { diffusionMethod } from './diffusion/diffusion';
import { sternVolmerMethod } from './stern-volmer/stern-volmer';

export {
  debyeFactor,
  diffusionMethod,
  diffusionQuenching,
  encounterQuenchingRate,
  smoluchowskiRateM1S1,
} from './diffusion/diffusion';
export type { QuenchInputs, QuenchResult } from './diffusion/diffusion';
export {
  rehmWellerActivationEv,
  rehmWellerQuenchingRate,
  sternVolmerConstantFromRatio,
  sternVolmerIntensityRatio,
  sternVolmerMethod,
} from './stern-volmer/stern-volmer';

/** Every `quench.*` method, for the registry. */
export const quenchMethods: MethodDefinition<any>[] = [diffusionMethod, sternVolmerMethod];
