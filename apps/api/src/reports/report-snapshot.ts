/**
 * Freezes pairs into a report snapshot: inputs with typed and canonical values, the results of
 * every rate model that applies (computed by the one dispatcher through `computePairResults`),
 * Monte Carlo intervals where uncertainties are given, and the methods used with their published
 * sources from the calculation core's catalog (the single source of citations).
 */
import { createHash } from 'node:crypto';
import {
  calculate,
  canonicalUnit,
  fromCanonical,
  methodCatalog,
  type Quantity,
} from '@gapwise/calc';
import {
  LIMITS_OF_ESTIMATE_NOTE,
  PARAMETER_KINDS,
  RATE_MODELS,
  computePairResults,
  computeSeparation,
  parameterValue,
  potentialFromShe,
  runPairMonteCarlo,
  splitPotentialUnit,
  totalLambdaEv,
  type Pair,
  type PairRateSource,
  type RateModel,
  type ParameterKind,
  type ReportInput,
  type ReportInterval,
  type ReportKind,
  type ReportMethod,
  type ReportModelResult,
  type ReportPairSnapshot,
  type ReportSnapshot,
} from '@gapwise/contracts';

/** Equations as printed in the Methods section (SCIENCE.md); citations come from the catalog. */
const METHOD_TEXT: Readonly<Record<string, { name: string; equation: string }>> = {
  'rate.marcus': {
    name: 'Classical nonadiabatic Marcus rate',
    equation:
      'k = (2π/ħ) |H_AB|² exp[−(ΔG° + λ)²/(4λk_{B}T)] / √(4πλk_{B}T)\n' +
      'ΔG‡ = (ΔG° + λ)²/(4λ), with λ = λᵢ + λₒ\n' +
      'Regime: normal if −ΔG° < λ, inverted if −ΔG° > λ, activationless if |ΔG° + λ| ≤ 0.01 λ',
  },
  'rate.mlj': {
    name: 'Marcus–Levich–Jortner rate (one quantum mode in its ground level)',
    equation:
      'k = (2π/ħ) |H_AB|² / √(4πλ_s k_{B}T) · Σₙ exp(−S) Sⁿ/n! · exp[−(ΔG° + λ_s + nħω)²/(4λ_s k_{B}T)]\n' +
      'S = λ_v/ħω; λ_s = outer (classical) part λₒ, λ_v = inner (quantum-mode) part λᵢ',
  },
  'rate.crossover': {
    name: 'Nonadiabatic–adiabatic crossover with solvent control',
    equation:
      'k = k_{NA}/(1 + κ_A), with κ_A = 4π|H_AB|²τ_L/(ħλ) and k_{NA} the Marcus rate\n' +
      'Adiabatic limit (large κ_A): k → (1/τ_L) √(λ/(16πk_{B}T)) exp(−ΔG‡/k_{B}T)',
  },
  'rate.ruler': {
    name: 'Empirical protein ruler',
    equation:
      'log10 k = 13 − 0.6 (R − 3.6) − 3.1 (ΔG° + λ)²/λ (R edge to edge in Å; ΔG°, λ in eV; k in s⁻¹)',
  },
  'uncertainty.monteCarlo': {
    name: 'Monte Carlo propagation of uncertainties',
    equation:
      'Each input with a stated 1σ is drawn from a normal distribution and the rate model evaluated ' +
      'per draw; the median and the 2.5th and 97.5th percentiles of log10 k are reported (fixed seed).',
  },
};

const MODEL_METHOD: Readonly<Record<string, string>> = {
  marcus: 'rate.marcus',
  mlj: 'rate.mlj',
  mljThermal: 'rate.mljThermal',
  crossover: 'rate.crossover',
  ruler: 'rate.ruler',
};

export interface SnapshotContext {
  readonly kind: ReportKind;
  readonly title: string;
  readonly workspace: { readonly id: string; readonly name: string };
  readonly author: { readonly id: string; readonly displayName: string };
  readonly createdAt: string;
  readonly softwareVersion: string;
}

function typedValue(value: number, unit: string, quantity: string): number {
  if (quantity === 'dimensionless' || !unit) return value;
  if (quantity === 'potential') {
    // "V vs SCE": the stored value is vs SHE; print it on the scale it was typed against.
    const split = splitPotentialUnit(unit);
    if (split.code) return typedValue(potentialFromShe(value, split.code), split.unit, quantity);
  }
  try {
    return fromCanonical(value, unit, quantity as Quantity);
  } catch {
    return value;
  }
}

function canonicalOf(quantity: string): string {
  if (quantity === 'dimensionless') return '';
  try {
    return canonicalUnit(quantity as Quantity);
  } catch {
    return '';
  }
}

function snapshotInputs(pair: Pair): ReportInput[] {
  const temperatureUnit = pair.temperatureUnit ?? 'K';
  const inputs: ReportInput[] = [
    {
      kind: 'temperature',
      label: 'Temperature T',
      value: pair.temperature,
      canonicalUnit: 'K',
      typedValue: typedValue(pair.temperature, temperatureUnit, 'temperature'),
      typedUnit: temperatureUnit,
      uncertainty: null,
      provenance: { kind: 'assumed', note: 'temperature of the pair' },
    },
  ];
  const order = Object.keys(PARAMETER_KINDS) as ParameterKind[];
  const parameters = [...pair.parameters].sort(
    (a, b) => order.indexOf(a.kind) - order.indexOf(b.kind),
  );
  for (const p of parameters) {
    const def = PARAMETER_KINDS[p.kind];
    const quantity = def?.quantity ?? 'dimensionless';
    const unit = canonicalOf(quantity);
    inputs.push({
      kind: p.kind,
      label: def?.label ?? p.kind,
      value: p.value,
      canonicalUnit:
        quantity === 'potential' && splitPotentialUnit(p.unit).code ? `${unit} vs SHE` : unit,
      typedValue: typedValue(p.value, p.unit, quantity),
      typedUnit: p.unit || unit,
      uncertainty: p.uncertainty,
      provenance: p.provenance,
    });
  }
  return inputs;
}

/** The Monte Carlo interval of one model, from the pair model's one request (as on the page). */
function monteCarlo(source: PairRateSource, model: RateModel): ReportInterval | null {
  const run = runPairMonteCarlo(source, model);
  if (run.status !== 'done') return null;
  return {
    log10kMedian: run.median,
    log10kLow: run.p025,
    log10kHigh: run.p975,
    percentiles: [2.5, 97.5],
    samples: run.samples,
    seed: run.seed,
    ...(run.histogram ? { histogram: run.histogram } : {}),
  };
}

function rulerResult(pair: Pair): ReportModelResult | null {
  const edge = pair.parameters.find((p) => p.kind === 'edgeDistance');
  if (!edge) return null;
  const deltaG0 = parameterValue(pair.parameters, 'deltaG0');
  const lambda = totalLambdaEv(pair.parameters) ?? 0;
  const base = { model: 'ruler' as const, methodId: 'rate.ruler', primary: false, interval: null };
  if (deltaG0 === undefined || !(lambda > 0)) {
    return {
      ...base,
      applies: false,
      reason: 'needs ΔG° and λ',
      k: null,
      log10k: null,
      activationFreeEnergy: null,
      regime: null,
      warnings: [],
    };
  }
  const answer = calculate({
    method: 'rate.ruler',
    inputs: { distance: edge.value, deltaG0, lambda },
  });
  if (!answer.ok) {
    return {
      ...base,
      applies: false,
      reason: missingText(answer.errors),
      k: null,
      log10k: null,
      activationFreeEnergy: null,
      regime: null,
      warnings: [],
    };
  }
  const out = answer.outputs;
  return {
    ...base,
    applies: true,
    reason: null,
    k: typeof out['k'] === 'number' ? out['k'] : null,
    log10k: typeof out['log10k'] === 'number' ? out['log10k'] : null,
    activationFreeEnergy: null,
    regime: typeof out['regime'] === 'string' ? out['regime'] : null,
    warnings: answer.warnings,
  };
}

/** Calculation-request fields that are not pair parameter kinds, by the labels the user sees. */
const REQUEST_FIELD_LABELS: Readonly<Record<string, string>> = {
  lambda: 'Total reorganization energy λ',
  temperature: 'Temperature',
};

/**
 * Why a model was not computed, with the labels the user sees; each clause without its own full
 * stop, since the clauses are joined with "; " and the sentence is closed by whoever prints it.
 */
function missingText(errors: ReadonlyArray<{ field: string; message: string }>): string {
  const labels = errors.map((e) => {
    const label = PARAMETER_KINDS[e.field as ParameterKind]?.label ?? REQUEST_FIELD_LABELS[e.field];
    const message = e.message.trim().replace(/\.$/, '');
    return label ? `${label} ${message}` : `${e.field}: ${message}`;
  });
  return labels.join('; ');
}

/** Results of every rate model for one pair (the chosen one first). */
export function pairResults(pair: Pair): ReportModelResult[] {
  const source: PairRateSource = pair;
  const models = [pair.model, ...RATE_MODELS.filter((m) => m !== pair.model)];
  const results: ReportModelResult[] = models.map((model) => {
    const r = computeSeparation(source, model);
    const applies = r.errors.length === 0 && (r.k !== null || r.log10k !== null);
    return {
      model,
      methodId: MODEL_METHOD[model],
      primary: model === pair.model,
      applies,
      reason: applies ? null : missingText(r.errors) || 'no rate for these inputs',
      k: applies ? r.k : null,
      log10k: applies ? r.log10k : null,
      activationFreeEnergy: applies ? r.activationFreeEnergy : null,
      regime: applies ? r.regime : null,
      couplingRegime: applies ? (r.couplingRegime ?? null) : null,
      interval: applies ? monteCarlo(source, model) : null,
      warnings: applies ? r.warnings : [],
    };
  });
  const ruler = rulerResult(pair);
  if (ruler) results.push(ruler);
  return results;
}

function snapshotPair(pair: Pair): ReportPairSnapshot {
  const results = pairResults(pair);
  // The same call the pair page and the stored results make: k_CR and the ratio agree by construction.
  const both = computePairResults(pair);
  const seen = new Set<string>();
  const warnings: Array<{ code: string; message: string }> = [];
  for (const r of results) {
    for (const w of r.warnings) {
      if (seen.has(w.code)) continue;
      seen.add(w.code);
      warnings.push({ code: w.code, message: w.message });
    }
  }
  return {
    pairId: pair.id,
    pairVersion: pair.version,
    name: pair.name,
    donor: pair.donor,
    acceptor: pair.acceptor,
    medium: pair.medium,
    temperatureK: pair.temperature,
    model: pair.model,
    inputs: snapshotInputs(pair),
    results,
    warnings,
    recombination: both.recombination ?? null,
    log10Ratio: both.log10Ratio ?? null,
  };
}

function snapshotMethods(pairs: readonly ReportPairSnapshot[]): ReportMethod[] {
  const catalog = new Map(methodCatalog().map((m) => [m.id, m]));
  const ids: string[] = [];
  const add = (id: string | null | undefined) => {
    if (id && !ids.includes(id)) ids.push(id);
  };
  for (const pair of pairs) {
    for (const r of pair.results) if (r.applies) add(r.methodId);
    for (const input of pair.inputs) add(input.provenance.methodId);
  }
  if (pairs.some((p) => p.results.some((r) => r.interval !== null))) add('uncertainty.monteCarlo');
  return ids.map((id) => {
    const entry = catalog.get(id);
    const text = METHOD_TEXT[id];
    return {
      id,
      name: text?.name ?? entry?.summary ?? id,
      equation: text?.equation ?? '',
      references: entry ? [...entry.references] : [],
    };
  });
}

/** Builds the immutable snapshot of a report from pairs at their current versions. */
export function buildReportSnapshot(
  context: SnapshotContext,
  pairs: readonly Pair[],
): ReportSnapshot {
  const snapshotPairs = pairs.map(snapshotPair);
  return {
    schema: 1,
    kind: context.kind,
    title: context.title,
    workspace: context.workspace,
    author: context.author,
    createdAt: context.createdAt,
    softwareVersion: context.softwareVersion,
    constants: 'CODATA 2018',
    pairs: snapshotPairs,
    methods: snapshotMethods(snapshotPairs),
    limitsNote: LIMITS_OF_ESTIMATE_NOTE,
  };
}

/** JSON with object keys sorted, so equal content always hashes the same. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value) ?? 'null';
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

/** Content hash of a snapshot: SHA-256 of its canonical JSON, hex. */
export function snapshotIdOf(snapshot: ReportSnapshot): string {
  return createHash('sha256').update(canonicalJson(snapshot)).digest('hex');
}
