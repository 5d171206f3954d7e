import { calculate, findMethod, type CalcRequest } from '@gapwise/calc';
import {
  pairRateRequest,
  type PairParameter,
  type PairRateSource,
  type ParameterKind,
} from '@gapwise/contracts';

export interface MonteCarloSummary {
  readonly median: number;
  readonly p025: number;
  readonly p975: number;
  /** Histogram of log10 k when the core returns one (bin edges and counts). */
  readonly histogram: {
    readonly edges: readonly number[];
    readonly counts: readonly number[];
  } | null;
  readonly samples: number;
  readonly warnings: readonly string[];
}

export type MonteCarloState =
  | { readonly status: 'none' }
  | { readonly status: 'refused'; readonly message: string }
  | ({ readonly status: 'done' } & MonteCarloSummary);

type Sigmas = Partial<Record<ParameterKind, number>>;

/** Which request input each parameter's uncertainty goes to, per rate method. */
function withSigmas(request: CalcRequest, sigmas: Sigmas): Record<string, unknown> | null {
  const inputs = { ...(request.inputs as Record<string, number>) } as Record<string, unknown>;
  const put = (name: string, sigma: number | undefined) => {
    if (sigma && sigma > 0 && typeof inputs[name] === 'number') {
      inputs[name] = { value: inputs[name], sigma };
      return true;
    }
    return false;
  };
  let any = false;
  any = put('deltaG0', sigmas.deltaG0) || any;
  any = put('coupling', sigmas.coupling) || any;
  if (request.method === 'rate.mlj') {
    any = put('lambdaSolvent', sigmas.lambdaOuter) || any;
    any = put('lambdaVib', sigmas.lambdaInner) || any;
    any = put('hbarOmega', sigmas.hbarOmega) || any;
  } else {
    // Independent parts: σ(λᵢ + λₒ) = √(σᵢ² + σₒ²).
    const s = Math.hypot(sigmas.lambdaInner ?? 0, sigmas.lambdaOuter ?? 0);
    any = put('lambda', s) || any;
  }
  if (request.method === 'rate.crossover') any = put('tauL', sigmas.tauL) || any;
  return any ? inputs : null;
}

function histogramOf(out: Record<string, unknown>): MonteCarloSummary['histogram'] {
  const h = out['histogram'] as { edges?: unknown; counts?: unknown } | undefined;
  if (h && Array.isArray(h.edges) && Array.isArray(h.counts)) {
    return { edges: h.edges as number[], counts: h.counts as number[] };
  }
  const samples = out['samples'];
  if (Array.isArray(samples) && samples.length > 1) {
    const xs = (samples as number[]).filter(Number.isFinite);
    const lo = Math.min(...xs);
    const hi = Math.max(...xs);
    const bins = 24;
    const counts = new Array<number>(bins).fill(0);
    for (const x of xs)
      counts[Math.min(bins - 1, Math.floor(((x - lo) / (hi - lo || 1)) * bins))]++;
    return { edges: counts.map((_, i) => lo + ((hi - lo) * i) / bins).concat(hi), counts };
  }
  return null;
}

/**
 * Propagates the parameters' uncertainties to log10 k with `uncertainty.monteCarlo` (normal
 * distributions, fixed seed so the interval does not flicker while typing).
 */
export function monteCarloLog10k(
  source: PairRateSource,
  parameters: readonly PairParameter[],
  samples = 4000,
): MonteCarloState {
  const sigmas: Sigmas = {};
  for (const p of parameters)
    if (p.uncertainty && p.uncertainty > 0) sigmas[p.kind] = p.uncertainty;
  if (Object.keys(sigmas).length === 0) return { status: 'none' };
  if (!findMethod('uncertainty.monteCarlo')) {
    return {
      status: 'refused',
      message: 'Monte Carlo propagation is not available in this build.',
    };
  }
  const request = pairRateRequest(source);
  if ('missing' in request) return { status: 'none' };
  const inner = withSigmas(request, sigmas);
  if (!inner) return { status: 'none' };
  const answer = calculate({
    method: 'uncertainty.monteCarlo',
    inputs: { method: request.method, inputs: inner, samples, seed: 1 },
  });
  if (!answer.ok) {
    return {
      status: 'refused',
      message: answer.errors.map((e) => `${e.field}: ${e.message}`).join('; '),
    };
  }
  const log = answer.outputs['log10k'] as Record<string, unknown> | undefined;
  if (!log || typeof log['median'] !== 'number') {
    return { status: 'refused', message: 'The Monte Carlo answer carries no log10 k.' };
  }
  return {
    status: 'done',
    median: log['median'] as number,
    p025: log['p025'] as number,
    p975: log['p975'] as number,
    // The core returns the log10 k histogram under outputs.histograms.log10k.
    histogram:
      histogramOf({
        histogram: (answer.outputs['histograms'] as Record<string, unknown> | undefined)?.[
          'log10k'
        ],
      }) ??
      histogramOf(log) ??
      histogramOf(answer.outputs),
    samples,
    warnings: answer.warnings.map((w) => w.message),
  };
}
