import { runPairMonteCarlo, type PairMonteCarlo, type PairRateSource } from '@gapwise/contracts';

export type MonteCarloSummary = PairMonteCarlo;

export type MonteCarloState =
  | { readonly status: 'none' }
  | { readonly status: 'refused'; readonly message: string }
  | ({ readonly status: 'done' } & MonteCarloSummary);

/**
 * Propagates the parameters' uncertainties to log10 k: the pair model's one Monte Carlo request
 * (same samples and seed as the report, so page and PDF print the same interval).
 */
export function monteCarloLog10k(source: PairRateSource): MonteCarloState {
  return runPairMonteCarlo(source);
}
