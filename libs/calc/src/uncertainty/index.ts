/** Public API of the uncertainty family of the calculation core. */
import type { MethodDefinition } from '../core/method';
import { createMonteCarloMethod, type MethodLookup } from './monte-carlo/monte-carlo';

export {
  extractDistributions,
  createMonteCarloMethod,
  numericOutputs,
  runMonteCarlo,
  SeededSampler,
  summarise,
} from './monte-carlo/monte-carlo';
export type {
  Distribution,
  MethodLookup,
  MonteCarloInputs,
  OutputSummary,
  UncertainInput,
} from './monte-carlo/monte-carlo';

/** Every `uncertainty.*` method, for the registry, which passes its lookup of the sampled methods. */
export const uncertaintyMethods = (findMethod: MethodLookup): MethodDefinition<any>[] => [
  createMonteCarloMethod(findMethod),
];
