/** Public API of the electrode-kinetics family of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { butlerVolmerMethod } from './butler-volmer/butler-volmer';
import { mhcMethod } from './mhc/mhc';
import { mhcAbsoluteMethod } from './mhc-absolute/mhc-absolute';

export { butlerVolmerMethod, butlerVolmerRates } from './butler-volmer/butler-volmer';
export type { ButlerVolmerInputs, ButlerVolmerRates } from './butler-volmer/butler-volmer';
export { integrateAdaptive } from './mhc/adaptive-gauss-kronrod';
export { logErfc, logMhcClosedForm, logMhcIntegral, mhcMethod, mhcRates } from './mhc/mhc';
export type { MhcInputs, MhcRates } from './mhc/mhc';
export {
  mhcAbsoluteMethod,
  mhcAbsoluteRateLog,
  mhcTafelSlopeMvPerDecade,
} from './mhc-absolute/mhc-absolute';

/** Every `electrode.*` method, for the registry. */
export const electrodeMethods: MethodDefinition<any>[] = [
  mhcMethod,
  mhcAbsoluteMethod,
  butlerVolmerMethod,
];
