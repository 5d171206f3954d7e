/**
 * The cascade computed in the browser: the same `kinetics.network` request the API stores, run by
 * the calculation core (`@gapwise/calc`), and the Monte Carlo request over every input with σ
 * (`uncertainty.monteCarlo` around `kinetics.network` with report 'yields'), run in a worker.
 */
import { calculate, type CalcWarning, type MethodOutputs } from '@gapwise/calc';

/** The full answer (report 'full'): populations, flux, pathway, landscape and sensitivity. */
export type NetworkOutputs = Extract<MethodOutputs['kinetics.network'], { landscape: unknown }>;

export type NetworkAnswer =
  | { ok: true; outputs: NetworkOutputs; warnings: CalcWarning[] }
  | { ok: false; errors: { field: string; message: string }[] };

export function computeNetwork(network: Record<string, unknown>): NetworkAnswer {
  const answer = calculate({ method: 'kinetics.network', inputs: network });
  if (!answer.ok) return { ok: false, errors: answer.errors };
  const outputs = answer.outputs;
  if (!('landscape' in outputs))
    return { ok: false, errors: [{ field: 'report', message: 'Expected the full report.' }] };
  return { ok: true, outputs, warnings: answer.warnings };
}

/** Samples of the Monte Carlo over the cascade's inputs (fixed seed: the same draws each time). */
export const CASCADE_MC_SAMPLES = 2000;

export function monteCarloRequest(networkWithSigma: Record<string, unknown>) {
  return {
    method: 'uncertainty.monteCarlo',
    inputs: {
      method: 'kinetics.network',
      inputs: networkWithSigma,
      samples: CASCADE_MC_SAMPLES,
      seed: 1,
    },
  };
}

export interface Interval {
  readonly median: number;
  readonly p025: number;
  readonly p975: number;
  readonly sd: number;
}

export type MonteCarloResult =
  | { ok: true; intervals: Record<string, Interval>; samplesUsed: number }
  | { ok: false; message: string };

/** Runs the Monte Carlo request (in the worker) and keeps the yield and lifetime intervals. */
export function runMonteCarlo(request: unknown): MonteCarloResult {
  const answer = calculate(request);
  if (!answer.ok) return { ok: false, message: answer.errors.map((e) => e.message).join(' ') };
  const intervals: Record<string, Interval> = {};
  for (const [name, value] of Object.entries(answer.outputs)) {
    if (!/^(yields|formationYields|lifetimes|longLived)\./.test(name)) continue;
    const v = value as Interval;
    intervals[name] = { median: v.median, p025: v.p025, p975: v.p975, sd: v.sd };
  }
  return { ok: true, intervals, samplesUsed: Number(answer.outputs['samplesUsed'] ?? 0) };
}
