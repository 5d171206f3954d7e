import { calculate, type CalcRequest } from '@gapwise/calc';
import type { PairParameter, PairResults, ParameterKind, RateModel } from './pairs';

/** The part of a pair that decides its rate. */
export interface PairRateSource {
  readonly temperature: number;
  readonly model: RateModel;
  readonly parameters: ReadonlyArray<Pick<PairParameter, 'kind' | 'value'>>;
}

function valueOf(source: PairRateSource, kind: ParameterKind): number | undefined {
  return source.parameters.find((p) => p.kind === kind)?.value;
}

/**
 * Builds the calculation request for a pair's chosen rate model. The web page and the API both
 * call this, then the one dispatcher, so browser and server answers can only differ if their
 * inputs differ. Total λ is λ_inner + λ_outer (either may be absent); for Marcus–Levich–Jortner
 * the inner part is the quantum mode's λ_vib and the outer part the classical λ_s (SCIENCE.md §2).
 */
export function pairRateRequest(source: PairRateSource): CalcRequest | { missing: string[] } {
  const deltaG0 = valueOf(source, 'deltaG0');
  const inner = valueOf(source, 'lambdaInner');
  const outer = valueOf(source, 'lambdaOuter');
  const coupling = valueOf(source, 'coupling');
  const missing: string[] = [];
  if (deltaG0 === undefined) missing.push('deltaG0');
  if (coupling === undefined) missing.push('coupling');
  const temperature = source.temperature;
  if (source.model === 'mlj' || source.model === 'mljThermal') {
    const hbarOmega = valueOf(source, 'hbarOmega');
    if (outer === undefined) missing.push('lambdaOuter');
    if (inner === undefined) missing.push('lambdaInner');
    if (hbarOmega === undefined) missing.push('hbarOmega');
    if (missing.length > 0) return { missing };
    return {
      // Thermal MLJ (finite-temperature Bessel form) takes the same inputs (SCIENCE.md §2).
      method: source.model === 'mlj' ? 'rate.mlj' : 'rate.mljThermal',
      inputs: { deltaG0, lambdaSolvent: outer, lambdaVib: inner, hbarOmega, coupling, temperature },
    };
  }
  if (inner === undefined && outer === undefined) missing.push('lambdaOuter');
  const lambda = (inner ?? 0) + (outer ?? 0);
  if (source.model === 'crossover') {
    const tauL = valueOf(source, 'tauL');
    if (tauL === undefined) missing.push('tauL');
    if (missing.length > 0) return { missing };
    return { method: 'rate.crossover', inputs: { deltaG0, lambda, coupling, temperature, tauL } };
  }
  if (missing.length > 0) return { missing };
  return { method: 'rate.marcus', inputs: { deltaG0, lambda, coupling, temperature } };
}

/** Computes a pair's results with the shared dispatcher. Never throws. */
export function computePairResults(source: PairRateSource): PairResults {
  const request = pairRateRequest(source);
  const empty = {
    model: source.model,
    k: null,
    log10k: null,
    activationFreeEnergy: null,
    regime: null,
  };
  if ('missing' in request) {
    return {
      ...empty,
      warnings: [],
      errors: request.missing.map((field) => ({ field, message: 'is needed for this rate model' })),
    };
  }
  const answer = calculate(request);
  if (!answer.ok) return { ...empty, warnings: [], errors: answer.errors };
  const out = answer.outputs;
  const num = (v: unknown): number | null => (typeof v === 'number' ? v : null);
  const deltaG0 = valueOf(source, 'deltaG0') ?? 0;
  const lambda = (valueOf(source, 'lambdaInner') ?? 0) + (valueOf(source, 'lambdaOuter') ?? 0);
  // Classical activation free energy (ΔG° + λ)²/(4λ) (Marcus 1956) for models that do not report it.
  const activation =
    num(out['activationFreeEnergy']) ??
    (lambda > 0 ? (deltaG0 + lambda) ** 2 / (4 * lambda) : null);
  const log10k =
    num(out['log10k']) ??
    (num(out['k']) && (out['k'] as number) > 0 ? Math.log10(out['k'] as number) : null);
  return {
    model: source.model,
    k: num(out['k']),
    log10k,
    activationFreeEnergy: activation,
    regime:
      typeof out['regime'] === 'string' ? (out['regime'] as string) : regimeOf(deltaG0, lambda),
    couplingRegime:
      typeof out['couplingRegime'] === 'string' ? (out['couplingRegime'] as string) : null,
    warnings: answer.warnings,
    errors: [],
  };
}

/** Regime rule of CALC-API.md: activationless when |ΔG° + λ| ≤ 0.01 λ, else normal or inverted. */
export function regimeOf(deltaG0Ev: number, lambdaEv: number): string | null {
  if (!(lambdaEv > 0)) return null;
  if (Math.abs(deltaG0Ev + lambdaEv) <= 0.01 * lambdaEv) return 'activationless';
  return -deltaG0Ev < lambdaEv ? 'normal' : 'inverted';
}
