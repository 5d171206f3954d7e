/** Public API of the uncertainty family of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { monteCarloMethod } from './monte-carlo/monte-carlo';

export {
  extractDistributions,
  monteCarloMethod,
  numericOutputs,
  runMonteCarlo,
  SeededSampler,
  summarise,
} from './monte-carlo/monte-carlo';
export type {
  Distribution,
  MonteCarloInputs,
  OutputSummary,
  UncertainInput,
} from './monte-carlo/monte-carlo';

/** Every `uncertainty.*` method, for the registry. */
export const uncertaintyMethods: MethodDefinition<any>[] = [monteCarloMethod];
