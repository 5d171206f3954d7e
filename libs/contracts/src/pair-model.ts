import { calculate, marcusRegime, type CalcRequest } from '@gapwise/calc';
import { PARAMETER_KINDS } from './pairs';
import type { PairResults, ParameterKind, Provenance, RateModel } from './pairs';
import { pekarFactor, SOLVENTS, type Solvent } from './solvents';
import type { ReportPairSnapshot } from './reports';
import {
  displayUnit,
  formatFixed,
  formatLog10,
  formatNumber,
  formatRate,
  formatScientific,
  modelName,
  powerOfTen,
} from './report-format';

/**
 * The pair model: the one place that turns a stored pair (canonical values, uncertainties, chosen
 * model) into calculation requests — charge separation, charge recombination, Monte Carlo, plot
 * inputs — and derived totals such as λ = λᵢ + λₒ, and turns the answers back into what the pair
 * page, the pairs table, the report, the PDF, the CSV export and the screens show. Nothing else
 * re-derives these: a rule changed here changes every view of a pair at once.
 */

/** One parameter as the model needs it (the report snapshot's inputs fit this shape too). */
export interface PairModelParameter {
  readonly kind: ParameterKind | string;
  readonly value: number;
  readonly uncertainty?: number | null;
}

/** The part of a pair that decides its rates. */
export interface PairRateSource {
  readonly temperature: number;
  readonly model: RateModel;
  readonly parameters: ReadonlyArray<PairModelParameter>;
}

/** Canonical value of one parameter kind, or undefined when the pair does not carry it. */
export function parameterValue(
  parameters: ReadonlyArray<PairModelParameter>,
  kind: ParameterKind,
): number | undefined {
  return parameters.find((p) => p.kind === kind)?.value;
}

/** One standard deviation of a parameter kind, or null when none is stated. */
export function parameterSigma(
  parameters: ReadonlyArray<PairModelParameter>,
  kind: ParameterKind,
): number | null {
  const s = parameters.find((p) => p.kind === kind)?.uncertainty;
  return s !== undefined && s !== null && s > 0 ? s : null;
}

/** How λ is known: as a total (a fit, the literature) or as inner and outer parts. */
export interface LambdaParts {
  /** Total λ in eV, or null when neither the total nor a part is given. */
  readonly total: number | null;
  /** σ of the total: stated for an entered total, √(σᵢ² + σₒ²) for independent parts. */
  readonly sigmaTotal: number | null;
  /** Inner (quantum-mode) part, eV: entered, or total − outer. */
  readonly inner: number | null;
  /** Outer (solvent) part, eV: entered, or total − inner. */
  readonly outer: number | null;
  /** Which was entered: `total` when the pair carries λ total, `parts` for λᵢ/λₒ, else null. */
  readonly entered: 'total' | 'parts' | null;
}

/**
 * Total reorganization energy λ = λᵢ + λₒ (Marcus 1956; SCIENCE.md §2): the one place the parts
 * are summed (screens call it per row, `lambdaParts` per pair).
 */
export function lambdaTotalOfPartsEv(innerEv: number, outerEv: number): number {
  return innerEv + outerEv;
}

/**
 * How a pair's λ is known. An entered total (kind `lambdaTotal`) wins over the parts; with a total and one part the
 * other part is their difference (the split the MLJ rate needs).
 */
export function lambdaParts(parameters: ReadonlyArray<PairModelParameter>): LambdaParts {
  const total = parameterValue(parameters, 'lambdaTotal');
  const inner = parameterValue(parameters, 'lambdaInner');
  const outer = parameterValue(parameters, 'lambdaOuter');
  if (total !== undefined) {
    return {
      total,
      sigmaTotal: parameterSigma(parameters, 'lambdaTotal'),
      inner: inner ?? (outer !== undefined ? total - outer : null),
      outer: outer ?? (inner !== undefined ? total - inner : null),
      entered: 'total',
    };
  }
  if (inner === undefined && outer === undefined) {
    return { total: null, sigmaTotal: null, inner: null, outer: null, entered: null };
  }
  const si = parameterSigma(parameters, 'lambdaInner');
  const so = parameterSigma(parameters, 'lambdaOuter');
  return {
    total: lambdaTotalOfPartsEv(inner ?? 0, outer ?? 0),
    // Independent parts: σ(λᵢ + λₒ) = √(σᵢ² + σₒ²).
    sigmaTotal: si === null && so === null ? null : Math.hypot(si ?? 0, so ?? 0),
    inner: inner ?? null,
    outer: outer ?? null,
    entered: 'parts',
  };
}

/** Total λ in eV, or null (see `lambdaParts`). */
export function totalLambdaEv(parameters: ReadonlyArray<PairModelParameter>): number | null {
  return lambdaParts(parameters).total;
}

/**
 * Physical lower bounds of parameter values (canonical units), checked by the API on save and by
 * the pair form while typing: λ ≥ 0 (a reorganization energy is a free-energy cost), ħω, τ_L,
 * radii and R > 0, ε and n ≥ 1. Anything else is only warned about.
 */
export const PARAMETER_LOWER_BOUNDS: Partial<
  Record<ParameterKind, { readonly min: number; readonly strict: boolean }>
> = {
  lambdaTotal: { min: 0, strict: false },
  lambdaInner: { min: 0, strict: false },
  lambdaOuter: { min: 0, strict: false },
  hbarOmega: { min: 0, strict: true },
  tauL: { min: 0, strict: true },
  distance: { min: 0, strict: true },
  edgeDistance: { min: 0, strict: false },
  radiusDonor: { min: 0, strict: true },
  radiusAcceptor: { min: 0, strict: true },
  excitationEnergy: { min: 0, strict: true },
  epsilonStatic: { min: 1, strict: false },
  epsilonMeasurement: { min: 1, strict: false },
  refractiveIndex: { min: 1, strict: false },
};

/** Whether a value respects its kind's lower bound (true for kinds without one). */
export function withinLowerBound(kind: ParameterKind, value: number): boolean {
  const bound = PARAMETER_LOWER_BOUNDS[kind];
  if (!bound) return true;
  return bound.strict ? value > bound.min : value >= bound.min;
}

/** Regime rule of CALC-API.md, from the calculation core (`marcusRegime`); null without λ > 0. */
export function regimeOf(deltaG0Ev: number, lambdaEv: number): string | null {
  if (!(lambdaEv > 0)) return null;
  return marcusRegime(deltaG0Ev, lambdaEv);
}

type RequestOrMissing = CalcRequest | { missing: string[] };

/**
 * The rate request of one step for a given model. `deltaG0Kind` selects the step: `deltaG0` for
 * charge separation, `deltaG0Recombination` for charge recombination. For Marcus–Levich–Jortner
 * the inner part is the quantum mode's λ_vib and the outer part the classical λ_s (SCIENCE.md §2).
 */
function stepRequest(
  source: PairRateSource,
  model: RateModel,
  deltaG0Kind: 'deltaG0' | 'deltaG0Recombination',
): RequestOrMissing {
  const p = source.parameters;
  const deltaG0 = parameterValue(p, deltaG0Kind);
  const coupling = parameterValue(p, 'coupling');
  const lambda = lambdaParts(p);
  const missing: string[] = [];
  if (deltaG0 === undefined) missing.push(deltaG0Kind);
  if (coupling === undefined) missing.push('coupling');
  const temperature = source.temperature;
  if (model === 'mlj' || model === 'mljThermal') {
    const hbarOmega = parameterValue(p, 'hbarOmega');
    if (lambda.outer === null) missing.push('lambdaOuter');
    if (lambda.inner === null) missing.push('lambdaInner');
    if (hbarOmega === undefined) missing.push('hbarOmega');
    if (missing.length > 0) return { missing };
    return {
      // Thermal MLJ (finite-temperature Bessel form) takes the same inputs (SCIENCE.md §2).
      method: model === 'mlj' ? 'rate.mlj' : 'rate.mljThermal',
      inputs: {
        deltaG0,
        lambdaSolvent: lambda.outer,
        lambdaVib: lambda.inner,
        hbarOmega,
        coupling,
        temperature,
      },
    };
  }
  if (lambda.total === null) missing.push('lambdaOuter');
  if (model === 'crossover') {
    const tauL = parameterValue(p, 'tauL');
    if (tauL === undefined) missing.push('tauL');
    if (missing.length > 0) return { missing };
    return {
      method: 'rate.crossover',
      inputs: { deltaG0, lambda: lambda.total, coupling, temperature, tauL },
    };
  }
  if (missing.length > 0) return { missing };
  return {
    method: 'rate.marcus',
    inputs: { deltaG0, lambda: lambda.total, coupling, temperature },
  };
}

/**
 * The charge-separation request for a pair's chosen rate model (`model` overrides it, as the
 * report does to show every model). Browser, API and CLI all call this, then the one dispatcher.
 */
export function pairRateRequest(source: PairRateSource, model = source.model): RequestOrMissing {
  return stepRequest(source, model, 'deltaG0');
}

/**
 * Which model charge recombination uses, and the sentence that says why. Recombination usually
 * lies deep in the inverted region, where the classical rate underestimates by orders of magnitude
 * and the quantum mode opens the faster channels (Jortner 1976, J. Chem. Phys. 64, 4860): with ħω
 * given it is Marcus–Levich–Jortner, else the classical Marcus rate (said as a caveat).
 */
export function recombinationModel(source: PairRateSource): { model: RateModel; note: string } {
  const hbarOmega = parameterValue(source.parameters, 'hbarOmega');
  if (hbarOmega !== undefined) {
    return {
      model: 'mlj',
      note: 'Recombination uses Marcus–Levich–Jortner because ħω is given (recombination usually lies in the inverted region, where the quantum mode matters).',
    };
  }
  return {
    model: 'marcus',
    note: 'Recombination uses classical Marcus because no ħω is given; deep in the inverted region this underestimates k_CR.',
  };
}

/** The charge-recombination request (ΔG°_CR, same λ and |H_AB|), with its model. */
export function pairRecombinationRequest(source: PairRateSource): {
  readonly model: RateModel;
  readonly note: string;
  readonly request: RequestOrMissing;
} {
  const { model, note } = recombinationModel(source);
  return { model, note, request: stepRequest(source, model, 'deltaG0Recombination') };
}

/** Results of one step (separation or recombination). */
export interface StepResults {
  readonly model: RateModel;
  readonly k: number | null;
  readonly log10k: number | null;
  readonly activationFreeEnergy: number | null;
  readonly regime: string | null;
  readonly couplingRegime: string | null;
  readonly warnings: ReadonlyArray<{ readonly code: string; readonly message: string }>;
  readonly errors: ReadonlyArray<{ readonly field: string; readonly message: string }>;
}

function num(v: unknown): number | null {
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

function runStep(
  source: PairRateSource,
  model: RateModel,
  request: RequestOrMissing,
  deltaG0Kind: 'deltaG0' | 'deltaG0Recombination',
): StepResults {
  const empty = {
    model,
    k: null,
    log10k: null,
    activationFreeEnergy: null,
    regime: null,
    couplingRegime: null,
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
  const out = answer.outputs as Record<string, unknown>;
  const deltaG0 = parameterValue(source.parameters, deltaG0Kind) ?? 0;
  const lambda = lambdaParts(source.parameters).total ?? 0;
  const k = num(out['k']);
  // Classical activation free energy (ΔG° + λ)²/(4λ) (Marcus 1956) for models that do not report it.
  const activation =
    num(out['activationFreeEnergy']) ??
    (lambda > 0 ? (deltaG0 + lambda) ** 2 / (4 * lambda) : null);
  return {
    model,
    k,
    log10k: num(out['log10k']) ?? (k !== null && k > 0 ? Math.log10(k) : null),
    activationFreeEnergy: activation,
    regime: typeof out['regime'] === 'string' ? out['regime'] : regimeOf(deltaG0, lambda),
    couplingRegime: typeof out['couplingRegime'] === 'string' ? out['couplingRegime'] : null,
    warnings: answer.warnings,
    errors: [],
  };
}

/** Charge-separation results of one model (the report runs every model through this). */
export function computeSeparation(source: PairRateSource, model = source.model): StepResults {
  return runStep(source, model, pairRateRequest(source, model), 'deltaG0');
}

/**
 * Charge-recombination results, or null when the pair states no recombination ΔG° (then there is
 * nothing to compare and nothing is shown).
 */
export function computeRecombination(
  source: PairRateSource,
): (StepResults & { readonly note: string }) | null {
  if (parameterValue(source.parameters, 'deltaG0Recombination') === undefined) return null;
  const { model, note, request } = pairRecombinationRequest(source);
  return { ...runStep(source, model, request, 'deltaG0Recombination'), note };
}

/** log10(k_CS / k_CR), or null unless both rates are known. */
export function log10RatioOf(
  separationLog10k: number | null | undefined,
  recombinationLog10k: number | null | undefined,
): number | null {
  if (separationLog10k == null || recombinationLog10k == null) return null;
  return separationLog10k - recombinationLog10k;
}

/** Computes a pair's results (separation, and recombination when ΔG°_CR is given). Never throws. */
export function computePairResults(source: PairRateSource): PairResults {
  const cs = computeSeparation(source);
  const cr = computeRecombination(source);
  return {
    model: cs.model,
    k: cs.k,
    log10k: cs.log10k,
    activationFreeEnergy: cs.activationFreeEnergy,
    regime: cs.regime,
    couplingRegime: cs.couplingRegime,
    warnings: cs.warnings,
    errors: cs.errors,
    recombination: cr,
    log10Ratio: log10RatioOf(cs.log10k, cr?.log10k),
  };
}

/** Monte Carlo sample count and seed: one pair, one interval, on the page and in the report. */
export const PAIR_MONTE_CARLO_SAMPLES = 2000;
export const PAIR_MONTE_CARLO_SEED = 20251202;

/**
 * The `uncertainty.monteCarlo` request for a pair's rate (charge separation, `model` defaulting to
 * the chosen one): every stated 1σ goes onto the request input it belongs to (λ parts onto
 * λ_s/λ_vib for MLJ, onto the total λ otherwise). Null when the rate cannot be computed or no
 * input of the request carries an uncertainty.
 */
export function pairMonteCarloRequest(
  source: PairRateSource,
  model = source.model,
): { method: 'uncertainty.monteCarlo'; inputs: Record<string, unknown> } | null {
  const request = pairRateRequest(source, model);
  if ('missing' in request) return null;
  const p = source.parameters;
  const lambda = lambdaParts(p);
  const sigmas: Record<string, number | null> = {
    deltaG0: parameterSigma(p, 'deltaG0'),
    coupling: parameterSigma(p, 'coupling'),
    hbarOmega: parameterSigma(p, 'hbarOmega'),
    tauL: parameterSigma(p, 'tauL'),
    lambda: lambda.sigmaTotal,
    lambdaSolvent: parameterSigma(p, 'lambdaOuter'),
    lambdaVib: parameterSigma(p, 'lambdaInner'),
  };
  const inputs: Record<string, unknown> = { ...(request.inputs as Record<string, unknown>) };
  let any = false;
  for (const [name, sigma] of Object.entries(sigmas)) {
    if (sigma !== null && typeof inputs[name] === 'number') {
      inputs[name] = { value: inputs[name], sigma };
      any = true;
    }
  }
  if (!any) return null;
  return {
    method: 'uncertainty.monteCarlo',
    inputs: {
      method: request.method,
      inputs,
      samples: PAIR_MONTE_CARLO_SAMPLES,
      seed: PAIR_MONTE_CARLO_SEED,
    },
  };
}

/** What a Monte Carlo run gives a view: the log10 k interval and its histogram. */
export interface PairMonteCarlo {
  readonly median: number;
  readonly p025: number;
  readonly p975: number;
  readonly samples: number;
  readonly seed: number;
  readonly histogram: {
    readonly edges: readonly number[];
    readonly counts: readonly number[];
  } | null;
  readonly warnings: readonly string[];
}

/**
 * Runs a pair's Monte Carlo propagation. `none` when no uncertainty applies; `refused` with the
 * core's message when the core refuses.
 */
export function runPairMonteCarlo(
  source: PairRateSource,
  model = source.model,
):
  | { readonly status: 'none' }
  | { readonly status: 'refused'; readonly message: string }
  | ({ readonly status: 'done' } & PairMonteCarlo) {
  const request = pairMonteCarloRequest(source, model);
  if (!request) return { status: 'none' };
  const answer = calculate(request);
  if (!answer.ok) {
    return {
      status: 'refused',
      message: answer.errors.map((e) => `${e.field}: ${e.message}`).join('; '),
    };
  }
  const out = answer.outputs as Record<string, unknown>;
  const log = out['log10k'] as Record<string, unknown> | undefined;
  const median = num(log?.['median']);
  const p025 = num(log?.['p025']);
  const p975 = num(log?.['p975']);
  if (median === null || p025 === null || p975 === null) {
    return { status: 'refused', message: 'The Monte Carlo answer carries no log10 k.' };
  }
  const h = (out['histograms'] as Record<string, unknown> | undefined)?.['log10k'] as
    { edges?: unknown; counts?: unknown } | undefined;
  const histogram =
    h && Array.isArray(h.edges) && Array.isArray(h.counts)
      ? { edges: h.edges as number[], counts: h.counts as number[] }
      : null;
  return {
    status: 'done',
    median,
    p025,
    p975,
    samples: PAIR_MONTE_CARLO_SAMPLES,
    seed: PAIR_MONTE_CARLO_SEED,
    histogram,
    warnings: answer.warnings.map((w) => w.message),
  };
}

/** Inputs of the log k against −ΔG° plot (the shape `@gapwise/plots` draws). */
export interface PairPlotInputs {
  readonly lambda: number;
  readonly coupling: number;
  readonly temperature: number;
  readonly lambdaSolvent: number | null;
  readonly lambdaVib: number | null;
  readonly hbarOmega: number | null;
  readonly pair: { readonly deltaG0: number; readonly log10k: number } | null;
}

/**
 * The driving-force plot's inputs for a pair: the classical curve from total λ, the MLJ curve
 * whenever ħω and both λ parts are known (page and report draw the same curves), the pair's
 * own point from its chosen model's log10 k. Null when λ ≤ 0, |H_AB| or T is missing.
 */
export function pairPlotInputs(
  source: PairRateSource,
  log10k: number | null,
): PairPlotInputs | null {
  const p = source.parameters;
  const lambda = lambdaParts(p);
  const coupling = parameterValue(p, 'coupling');
  const t = source.temperature;
  if (lambda.total === null || !(lambda.total > 0) || coupling === undefined) return null;
  if (!(t > 0)) return null;
  const hbarOmega = parameterValue(p, 'hbarOmega') ?? null;
  const mlj = hbarOmega !== null && lambda.inner !== null && lambda.outer !== null;
  const deltaG0 = parameterValue(p, 'deltaG0');
  return {
    lambda: lambda.total,
    coupling,
    temperature: t,
    lambdaSolvent: mlj ? lambda.outer : null,
    lambdaVib: mlj ? lambda.inner : null,
    hbarOmega: mlj ? hbarOmega : null,
    pair: deltaG0 !== undefined && log10k !== null ? { deltaG0, log10k } : null,
  };
}

// ——— What views show ———————————————————————————————————————————————————————————————

/**
 * A derived value with the digits its uncertainty supports: σ rounded to 2 significant digits and
 * the value to the same decimal place ("−0.683 ± 0.050"); without σ, 4 significant figures
 * ("−0.6834"). Storage and exports keep full precision; this is for reading only.
 */
export function formatMeasured(value: number | null, sigma?: number | null, unit = ''): string {
  if (value === null || !Number.isFinite(value)) return '—';
  const u = unit ? ` ${displayUnit(unit)}` : '';
  if (!(sigma !== null && sigma !== undefined && sigma > 0 && Number.isFinite(sigma))) {
    return `${formatNumber(value, 4)}${u}`;
  }
  // The decimal place of σ's second significant digit.
  const place = Math.floor(Math.log10(sigma)) - 1;
  const abs = Math.abs(value);
  if (place < 0 && place >= -8 && abs >= 1e-3 && abs < 1e5) {
    return `${formatFixed(value, -place)} ± ${formatFixed(sigma, -place)}${u}`;
  }
  const magnitude = abs > 0 ? Math.floor(Math.log10(abs)) : place + 1;
  const sig = Math.min(15, Math.max(1, magnitude - place + 1));
  return `${formatNumber(value, sig, true)} ± ${formatNumber(sigma, 2, true)}${u}`;
}

/**
 * The number `formatMeasured` prints, for a field that must hold plain editable text: rounded at
 * the decimal place of σ's second significant digit, or to 4 significant figures without σ
 * (−0.683425360906 → −0.6834). For display only; storage and exports keep full precision.
 */
export function roundMeasured(value: number, sigma?: number | null): number {
  if (!Number.isFinite(value)) return value;
  if (!(sigma !== null && sigma !== undefined && sigma > 0 && Number.isFinite(sigma))) {
    return Number(value.toPrecision(4));
  }
  const place = Math.floor(Math.log10(sigma)) - 1;
  if (place < 0) return Number(value.toFixed(Math.min(100, -place)));
  const step = 10 ** place;
  return Math.round(value / step) * step;
}

/** "Normal", "Inverted", "Activationless", or an em dash. */
export function regimeLabel(regime: string | null | undefined): string {
  return regime ? regime.charAt(0).toUpperCase() + regime.slice(1) : '—';
}

/**
 * The comparison of the two steps in words: "Separation outpaces recombination by 2.3 orders of
 * magnitude (k_CS/k_CR = 2.0 × 10²)", or the reverse; null unless both rates are known.
 */
export function ratioText(log10Ratio: number | null | undefined): string | null {
  if (log10Ratio === null || log10Ratio === undefined || !Number.isFinite(log10Ratio)) return null;
  const orders = Math.abs(log10Ratio);
  const factor = orders < 300 ? ` (k_CS/k_CR = ${formatScientific(10 ** log10Ratio, 2)})` : '';
  if (orders < 0.05) return `Separation and recombination are about equally fast${factor}`;
  const who =
    log10Ratio > 0 ? 'Separation outpaces recombination' : 'Recombination outpaces separation';
  return `${who} by ${formatFixed(orders, 1)} orders of magnitude${factor}`;
}

/** One step of a pair as every view prints it. */
export interface PairStepView {
  /** "8.98 × 10¹⁰ s⁻¹", or a bound from log10 k below the double range, or "—". */
  readonly rate: string;
  /** "10.95" or "—". */
  readonly log10k: string;
  readonly regime: string;
  readonly couplingRegime: string;
  readonly model: string;
}

/** The step's rate, log k, regimes and model as the page, table, PDF and CSV print them. */
export function stepView(
  step:
    Pick<StepResults, 'k' | 'log10k' | 'regime' | 'couplingRegime' | 'model'> | null | undefined,
): PairStepView {
  if (!step) return { rate: '—', log10k: '—', regime: '—', couplingRegime: '—', model: '—' };
  return {
    // Below the double range the rate is only known through log10 k (VALIDATION.md B2).
    rate:
      (step.k === null || step.k <= 0) && step.log10k !== null
        ? `${powerOfTen(Math.floor(step.log10k))}… s⁻¹`
        : formatRate(step.k),
    log10k: formatLog10(step.log10k),
    regime: regimeLabel(step.regime),
    couplingRegime: regimeLabel(step.couplingRegime),
    model: modelName(step.model),
  };
}

/** Both steps and their ratio, as the pair page, the pairs table and the PDF show them. */
export interface PairRatesView {
  readonly separation: PairStepView;
  /** Null when the pair states no recombination ΔG°. */
  readonly recombination: (PairStepView & { readonly note: string }) | null;
  readonly ratio: string | null;
}

export function pairRatesView(results: PairResults | null | undefined): PairRatesView {
  if (!results) return { separation: stepView(null), recombination: null, ratio: null };
  const cr = results.recombination;
  return {
    separation: stepView({ ...results, couplingRegime: results.couplingRegime ?? null }),
    recombination: cr ? { ...stepView(cr), note: cr.note } : null,
    ratio: ratioText(results.log10Ratio),
  };
}

/** The pair model's source for a pair frozen in a report snapshot (canonical inputs with σ). */
export function snapshotSource(pair: ReportPairSnapshot): PairRateSource {
  return {
    temperature: pair.temperatureK,
    model: pair.model,
    parameters: pair.inputs.filter((i) => i.kind !== 'temperature'),
  };
}

/**
 * Both steps of a frozen pair as the report page and the PDF print them (the chosen model's
 * separation result and the stored recombination); null when the snapshot has no recombination.
 */
export function snapshotRatesView(pair: ReportPairSnapshot): PairRatesView | null {
  if (!pair.recombination) return null;
  const r = pair.results.find((x) => x.primary) ?? null;
  return pairRatesView({
    model: pair.model,
    k: r?.k ?? null,
    log10k: r?.log10k ?? null,
    activationFreeEnergy: r?.activationFreeEnergy ?? null,
    regime: r?.regime ?? null,
    warnings: [],
    errors: [],
    recombination: pair.recombination,
    log10Ratio: pair.log10Ratio ?? null,
  });
}

// ——— What a change did ——————————————————————————————————————————————————————————————

/** One row of "what the change did": a result before and after, and the shift when numeric. */
export interface PairEffectRow {
  readonly field: string;
  readonly left: string;
  readonly right: string;
  /** "+1.23" for log k rows; empty when not numeric or not computable on both sides. */
  readonly shift: string;
  readonly changed: boolean;
}

function signedFixed(x: number, decimals: number): string {
  const text = formatFixed(x, decimals);
  return x > 0 && Number(x.toFixed(decimals)) !== 0 ? `+${text}` : text;
}

function warningList(step: Pick<StepResults, 'warnings' | 'errors'> | null | undefined): string {
  if (!step) return '—';
  const lines = [
    ...step.errors.map((e) => {
      const label = PARAMETER_KINDS[e.field as ParameterKind]?.label ?? e.field;
      return `Cannot compute: ${label} ${e.message}`;
    }),
    ...step.warnings.map((w) => w.message),
  ];
  return lines.length > 0 ? lines.join('\n') : 'None';
}

/**
 * The effect of going from one state of a pair to another, computed through this model (the same
 * results the pair page shows): log k and regime of charge separation and recombination, the
 * k_CS/k_CR ratio, the recombination model, and the warnings. `onlyChanged` drops equal rows.
 */
export function pairEffectDifferences(
  left: PairRateSource,
  right: PairRateSource,
  onlyChanged = false,
): PairEffectRow[] {
  const a = computePairResults(left);
  const b = computePairResults(right);
  const rows: PairEffectRow[] = [];
  const add = (field: string, l: string, r: string, shift = '') =>
    rows.push({ field, left: l, right: r, shift, changed: l !== r });
  const logShift = (x: number | null | undefined, y: number | null | undefined) =>
    x != null && y != null ? signedFixed(y - x, 2) : '';
  add('log₁₀ k_CS', formatLog10(a.log10k), formatLog10(b.log10k), logShift(a.log10k, b.log10k));
  add('Regime (separation)', regimeLabel(a.regime), regimeLabel(b.regime));
  add('Coupling regime', regimeLabel(a.couplingRegime), regimeLabel(b.couplingRegime));
  add('Warnings (separation)', warningList(a), warningList(b));
  const ra = a.recombination;
  const rb = b.recombination;
  if (ra || rb) {
    add(
      'log₁₀ k_CR',
      formatLog10(ra?.log10k ?? null),
      formatLog10(rb?.log10k ?? null),
      logShift(ra?.log10k, rb?.log10k),
    );
    add('Regime (recombination)', regimeLabel(ra?.regime), regimeLabel(rb?.regime));
    add('Recombination model', ra ? modelName(ra.model) : '—', rb ? modelName(rb.model) : '—');
    add(
      'log₁₀ (k_CS/k_CR)',
      formatLog10(a.log10Ratio ?? null),
      formatLog10(b.log10Ratio ?? null),
      logShift(a.log10Ratio, b.log10Ratio),
    );
    add('Warnings (recombination)', warningList(ra), warningList(rb));
  }
  return onlyChanged ? rows.filter((r) => r.changed) : rows;
}

/** A parameter with its provenance (what the solvent choice reads the derivations from). */
export interface PairModelParameterWithProvenance extends PairModelParameter {
  readonly provenance?: Provenance | null;
}

/** One solvent of a pair's solvent choice. */
export interface SolventScanRow {
  readonly solvent: Solvent;
  /** 1/n² − 1/ε_s. */
  readonly pekar: number;
  readonly deltaG0CS: number | null;
  readonly deltaG0CR: number | null;
  /** Born/Weller correction of ΔG° for this solvent against the measurement solvent (eV). */
  readonly solventCorrection: number | null;
  readonly lambdaOuter: number | null;
  readonly log10kCS: number | null;
  readonly log10kCR: number | null;
  /** The pair's parameters with ΔG°, ΔG°_CR, λₒ, ε_s and n of this solvent (for a new version). */
  readonly parameters: PairModelParameterWithProvenance[] | null;
  readonly errors: string[];
  /** Said with the row (e.g. λₒ set to 0 in a non-polar solvent), or null. */
  readonly note: string | null;
}

export interface SolventScan {
  /** Why the scan cannot run (no derived ΔG° or λₒ), or null. */
  readonly unavailable: string | null;
  /** Assumptions the scan made (e.g. the measurement solvent), shown with the table. */
  readonly notes: string[];
  readonly rows: SolventScanRow[];
}

function derivedInputs(
  parameters: ReadonlyArray<PairModelParameterWithProvenance>,
  kind: ParameterKind,
  methodId: string,
): Record<string, unknown> | null {
  const prov = parameters.find((p) => p.kind === kind)?.provenance;
  if (!prov || prov.kind !== 'derived' || prov.methodId !== methodId || !prov.methodInputs) {
    return null;
  }
  return { ...prov.methodInputs };
}

/** Labels of the core's input names that are not pair parameter kinds (solvent choice). */
const SCAN_FIELD_LABELS: Record<string, string> = {
  lambdaSolvent: PARAMETER_KINDS.lambdaOuter.label,
  lambdaVib: PARAMETER_KINDS.lambdaInner.label,
  lambda: PARAMETER_KINDS.lambdaTotal.label,
  temperature: 'Temperature',
  epsilon: PARAMETER_KINDS.epsilonStatic.label,
  epsilonReference: PARAMETER_KINDS.epsilonMeasurement.label,
  chargeDonor: 'Donor charge',
  chargeAcceptor: 'Acceptor charge',
};

/** The label the user sees for a core field (`inputs.` prefix dropped), else the field itself. */
export function scanFieldLabel(field: string): string {
  const plain = field.replace(/^inputs\./, '');
  if (plain in SCAN_FIELD_LABELS) return SCAN_FIELD_LABELS[plain]!;
  const kind = PARAMETER_KINDS[plain as ParameterKind] as { label: string } | undefined;
  return kind?.label ?? plain;
}

/**
 * The label of a field the API names when it refuses a pair save (`parameters.3.value`, `name`,
 * `version`), given the parameters sent, so the solvent choice shows no field codes.
 */
export function pairSaveFieldLabel(
  field: string,
  parameters: ReadonlyArray<{ readonly kind: string }>,
): string {
  const m = /^parameters\.(\d+)(?:\.(\w+))?$/.exec(field);
  if (m) {
    const kind = parameters[Number(m[1])]?.kind;
    const label = kind ? scanFieldLabel(kind) : 'A parameter';
    const part: Record<string, string> = {
      value: '',
      unit: ' (unit)',
      uncertainty: ' (uncertainty)',
    };
    return `${label}${m[2] ? (part[m[2]] ?? ` (${m[2]})`) : ''}`;
  }
  const top: Record<string, string> = {
    name: 'Name',
    medium: 'Medium',
    temperature: 'Temperature',
    model: 'Rate model',
    version: 'Version',
  };
  return top[field] ?? scanFieldLabel(field);
}

/** The sentence for a rate refused because λₒ is 0 in a non-polar solvent (rate needs λ > 0). */
export const NON_POLAR_NO_RATE =
  'No rate: the outer reorganization energy λₒ is zero in this non-polar solvent (1/n² − 1/ε_s ≤ 0), and the rate formula needs λ > 0.';

/**
 * The solvent-choice row's messages in the user's labels: a refused rate because λₒ was set to 0
 * becomes one plain sentence; other core messages name the field by its label.
 */
function scanMessages(
  errors: ReadonlyArray<{ readonly field: string; readonly message: string }>,
  lambdaOuterZero: boolean,
  prefix = '',
): string[] {
  const out: string[] = [];
  for (const e of errors) {
    const field = e.field.replace(/^inputs\./, '');
    const text =
      lambdaOuterZero && (field === 'lambdaSolvent' || field === 'lambda')
        ? NON_POLAR_NO_RATE
        : `${prefix}${scanFieldLabel(field)} ${e.message.startsWith('is ') ? e.message : `— ${e.message}`}`;
    if (!out.includes(text)) out.push(text);
  }
  return out;
}

/**
 * Charge separation and recombination of a pair across solvents (issue 18). Needs ΔG° derived by
 * `drivingForce.rehmWeller` and λₒ by `reorg.twoSphere` (their stored inputs, SCIENCE.md §4–§5):
 * for each solvent both are recomputed with its ε_s (and n for λₒ) — the Born/Weller correction
 * with the charges the derivation used (never the neutral form for charged reactants, §4) — then
 * the rates go through `computePairResults`, the one rate path of every pair view.
 *
 * The potentials' measurement solvent is the `epsilonReference` of the stored derivation, else the
 * pair's `epsilonMeasurement`, else the ε of the stored derivation (said in `notes`). Radii missing
 * from the stored ΔG° derivation come from the pair's radii or the λₒ derivation.
 */
export function pairSolventScan(
  source: PairRateSource & { readonly parameters: ReadonlyArray<PairModelParameterWithProvenance> },
  solvents: readonly Solvent[] = SOLVENTS,
): SolventScan {
  const p = source.parameters;
  const dg = derivedInputs(p, 'deltaG0', 'drivingForce.rehmWeller');
  const lo = derivedInputs(p, 'lambdaOuter', 'reorg.twoSphere');
  const missing: string[] = [];
  if (!dg) missing.push('ΔG° derived from redox potentials (Rehm–Weller)');
  if (!lo) missing.push('λₒ derived from the two-sphere model');
  if (!dg || !lo) {
    return {
      unavailable: `Solvent choice needs ${missing.join(' and ')}; derive them on the pair page first.`,
      notes: [],
      rows: [],
    };
  }
  const notes: string[] = [];
  const rw: Record<string, unknown> = { ...dg };
  rw['radiusDonor'] ??= lo['radiusDonor'] ?? parameterValue(p, 'radiusDonor');
  rw['radiusAcceptor'] ??= lo['radiusAcceptor'] ?? parameterValue(p, 'radiusAcceptor');
  if (rw['epsilonReference'] === undefined) {
    const measured = parameterValue(p, 'epsilonMeasurement');
    rw['epsilonReference'] = measured ?? dg['epsilon'];
    notes.push(
      measured !== undefined
        ? `Potentials measured in a solvent of ε = ${measured} (the pair's measurement-solvent ε).`
        : `No measurement-solvent ε given: the potentials are taken as measured in the solvent of the stored ΔG° derivation (ε = ${String(typeof dg['epsilon'] === 'object' ? JSON.stringify(dg['epsilon']) : dg['epsilon'])}).`,
    );
  }
  const rows = solvents.map((solvent): SolventScanRow => {
    const errors: string[] = [];
    const a = calculate({
      method: 'drivingForce.rehmWeller',
      inputs: { ...rw, epsilon: solvent.epsilon },
    });
    // A non-polar solvent whose tabulated n² exceeds ε_s (1/n² − 1/ε_s < 0) has λₒ = 0, set
    // explicitly as the two-sphere method asks (SCIENCE.md §5 rejects a negative Pekar factor).
    const nonPolar = pekarFactor(solvent) < 0;
    const b = nonPolar
      ? ({ ok: true, outputs: { lambdaOuter: 0 }, warnings: [] } as const)
      : calculate({
          method: 'reorg.twoSphere',
          inputs: { ...lo, epsilon: solvent.epsilon, refractiveIndex: solvent.refractiveIndex },
        });
    const rowNote = nonPolar
      ? 'Non-polar: 1/n² − 1/ε_s < 0 with the tabulated values, so λₒ is set to 0.'
      : null;
    if (!a.ok) errors.push(...scanMessages(a.errors, false, 'ΔG° (Rehm–Weller): '));
    if (!b.ok) errors.push(...scanMessages(b.errors, false, 'λₒ (two-sphere): '));
    const base = { solvent, pekar: pekarFactor(solvent) };
    if (!a.ok || !b.ok) {
      return {
        ...base,
        deltaG0CS: null,
        deltaG0CR: null,
        solventCorrection: null,
        lambdaOuter: null,
        log10kCS: null,
        log10kCR: null,
        parameters: null,
        errors,
        note: rowNote,
      };
    }
    const deltaG0CS = a.outputs['deltaG0CS'] as number;
    const deltaG0CR = a.outputs['deltaG0CR'] as number;
    const lambdaOuter = b.outputs['lambdaOuter'] as number;
    const note = `Solvent choice: ${solvent.name} (ε_s = ${solvent.epsilon}, n = ${solvent.refractiveIndex}; ${solvent.source})`;
    const rwInputs = { ...rw, epsilon: solvent.epsilon };
    const loInputs = { ...lo, epsilon: solvent.epsilon, refractiveIndex: solvent.refractiveIndex };
    const replaced: Partial<Record<ParameterKind, { value: number; provenance: Provenance }>> = {
      deltaG0: {
        value: deltaG0CS,
        provenance: {
          kind: 'derived',
          methodId: 'drivingForce.rehmWeller',
          methodInputs: rwInputs,
          note,
        },
      },
      deltaG0Recombination: {
        value: deltaG0CR,
        provenance: {
          kind: 'derived',
          methodId: 'drivingForce.rehmWeller',
          methodInputs: rwInputs,
          note: `Charge recombination to the ground state. ${note}`,
        },
      },
      lambdaOuter: {
        value: lambdaOuter,
        provenance: nonPolar
          ? { kind: 'assumed', note: `${rowNote} ${note}` }
          : { kind: 'derived', methodId: 'reorg.twoSphere', methodInputs: loInputs, note },
      },
      epsilonStatic: {
        value: solvent.epsilon,
        provenance: { kind: 'literature', citation: solvent.sources.epsilon.citation, note },
      },
      refractiveIndex: {
        value: solvent.refractiveIndex,
        provenance: {
          kind: 'literature',
          citation: solvent.sources.refractiveIndex.citation,
          note,
        },
      },
    };
    const parameters: PairModelParameterWithProvenance[] = p.map((q) => {
      const r = replaced[q.kind as ParameterKind];
      return r ? { ...q, value: r.value, provenance: r.provenance } : q;
    });
    for (const kind of ['epsilonStatic', 'refractiveIndex', 'deltaG0Recombination'] as const) {
      const r = replaced[kind]!;
      if (!p.some((q) => q.kind === kind)) {
        parameters.push({ kind, value: r.value, uncertainty: null, provenance: r.provenance });
      }
    }
    const results = computePairResults({ ...source, parameters });
    const zero = lambdaOuter <= 0;
    errors.push(...scanMessages(results.errors, zero));
    // Recombination refused for the same reason is said once, with the same sentence.
    for (const m of scanMessages(results.recombination?.errors ?? [], zero, 'Recombination: ')) {
      if (!errors.includes(m)) errors.push(m);
    }
    return {
      ...base,
      deltaG0CS,
      deltaG0CR,
      solventCorrection: (a.outputs['solventCorrection'] as number | undefined) ?? null,
      lambdaOuter,
      log10kCS: results.log10k,
      log10kCR: results.recombination?.log10k ?? null,
      parameters,
      errors,
      note: rowNote,
    };
  });
  return { unavailable: null, notes, rows };
}
