/**
 * Freezes a cascade (issue 17) into a report snapshot: its states with how each energy was
 * given, every directed step with its rate and its provenance as a sentence, the populations for
 * the plot, the landscape (transition states and disconnectivity tree), yields and lifetimes with
 * Monte Carlo intervals where the network states uncertainties, the warnings and the methods with
 * their published sources from the calculation core's catalog. Runs in the compute pool.
 */
import { calculate, methodCatalog } from '@gapwise/calc';
import {
  LIMITS_OF_ESTIMATE_NOTE,
  formatNumber,
  formatScientific,
  type ReportCascadeSnapshot,
  type ReportCascadeStep,
  type ReportCascadeValue,
  type ReportMethod,
  type ReportSnapshot,
} from '@gapwise/contracts';
import type { SnapshotContext } from './report-snapshot';

/** One sample count and seed for every cascade report (as the pair model's Monte Carlo). */
export const CASCADE_MONTE_CARLO_SAMPLES = 2000;
export const CASCADE_MONTE_CARLO_SEED = 1;

/** The cascade as stored, at the version the report freezes. */
export interface CascadeForReport {
  readonly id: string;
  readonly version: number;
  readonly name: string;
  readonly notes: string;
  readonly network: Record<string, unknown>;
}

const CASCADE_METHOD_TEXT: Readonly<Record<string, { name: string; equation: string }>> = {
  'kinetics.network': {
    name: 'Kinetic network of states (first-order master equation)',
    equation:
      'dp/dt = K p, K_{ji} = k_{ij} (i ≠ j), K_{ii} = −Σ_j k_{ij}; reverse of an ET step by detailed balance ' +
      'k_{ji} = k_{ij} exp((G_j − G_i)/k_{B}T)\n' +
      'Yields φ = lim p(t → ∞); lifetimes from the relaxation modes; landscape: transition state of ' +
      'an ET step at G_i + (λ + ΔG°)²/(4λ), minima joined into a disconnectivity tree',
  },
  'rate.marcus': {
    name: 'Classical nonadiabatic Marcus rate (each ET step)',
    equation:
      'k = (2π/ħ) |H_AB|² exp[−(ΔG° + λ)²/(4λk_{B}T)] / √(4πλk_{B}T), ΔG° = G_{to} − G_{from}',
  },
  'rate.mlj': {
    name: 'Marcus–Levich–Jortner rate (ET steps with one quantum mode)',
    equation:
      'k = (2π/ħ) |H_AB|² / √(4πλ_s k_{B}T) · Σₙ exp(−S) Sⁿ/n! · exp[−(ΔG° + λ_s + nħω)²/(4λ_s k_{B}T)]',
  },
  'uncertainty.monteCarlo': {
    name: 'Monte Carlo propagation of uncertainties',
    equation:
      'Each input with a stated 1σ is drawn from a normal distribution and the network solved per ' +
      'draw; the 2.5th and 97.5th percentiles of each yield and lifetime are reported (fixed seed).',
  },
};

type Raw = Record<string, unknown>;

const isObject = (v: unknown): v is Raw => typeof v === 'object' && v !== null && !Array.isArray(v);

/** A typed quantity as the user gave it: "590 nm", "0.55 eV", "30 cm⁻¹". */
function typed(value: unknown, defaultUnit: string): string {
  if (typeof value === 'number') return `${formatNumber(value, 4)} ${defaultUnit}`;
  if (isObject(value) && typeof value['value'] === 'number') {
    const unit = typeof value['unit'] === 'string' ? value['unit'] : defaultUnit;
    const sigma =
      typeof value['sigma'] === 'number' ? ` ± ${formatNumber(value['sigma'] as number, 3)}` : '';
    return `${formatNumber(value['value'] as number, 4)}${sigma} ${prettyUnit(unit)}`;
  }
  return 'as given';
}

function prettyUnit(unit: string): string {
  return unit.replace('cm-1', 'cm⁻¹').replace('s-1', 's⁻¹').replace('-1', '⁻¹');
}

function hasSigma(value: unknown): boolean {
  if (Array.isArray(value)) return value.some(hasSigma);
  if (!isObject(value)) return false;
  return 'sigma' in value || Object.values(value).some(hasSigma);
}

function energySource(raw: unknown, kind: string): string {
  if (isObject(raw) && raw['unit'] === 'nm') {
    return `Photon energy E₀₀ typed as ${typed(raw, 'nm')} (E = hc/λ).`;
  }
  if (kind === 'ground' && (raw === 0 || raw === undefined)) return 'Zero of energy.';
  return `Free energy typed as ${typed(raw, 'eV')} above the ground state.`;
}

function stepSource(
  link: Raw,
  type: ReportCascadeStep['type'],
  label: (id: string) => string,
): string {
  const from = label(String(link['from']));
  const to = label(String(link['to']));
  if (type === 'detailedBalance') {
    return (
      `Reverse of the ${from} → ${to} electron-transfer step by detailed balance, ` +
      'k_{ji} = k_{ij} exp((G_j − G_i)/k_{B}T).'
    );
  }
  if (type === 'fixed') {
    if (link['lifetime'] !== undefined) {
      return `Fixed rate from the lifetime τ = ${typed(link['lifetime'], 's')} as typed (k = 1/τ).`;
    }
    return `Fixed first-order rate k = ${typed(link['k'], 's⁻¹')} as typed.`;
  }
  const model = link['model'] === 'mlj' ? 'Marcus–Levich–Jortner' : 'Marcus';
  const mode =
    link['model'] === 'mlj'
      ? `, λ_v = ${typed(link['lambdaVib'], 'eV')}, ħω = ${typed(link['hbarOmega'], 'eV')}`
      : '';
  return (
    `${model} rate from λ = ${typed(link['lambda'], 'eV')} and |H_AB| = ` +
    `${typed(link['coupling'], 'eV')}${mode} as typed; ΔG° from the two states' energies.`
  );
}

function cascadeMethods(links: readonly Raw[], withMonteCarlo: boolean): ReportMethod[] {
  const catalog = new Map(methodCatalog().map((m) => [m.id, m]));
  const ids = ['kinetics.network'];
  if (links.some((l) => l['lambda'] !== undefined && l['model'] !== 'mlj')) ids.push('rate.marcus');
  if (links.some((l) => l['model'] === 'mlj')) ids.push('rate.mlj');
  if (withMonteCarlo) ids.push('uncertainty.monteCarlo');
  return ids.map((id) => ({
    id,
    name: CASCADE_METHOD_TEXT[id]?.name ?? catalog.get(id)?.summary ?? id,
    equation: CASCADE_METHOD_TEXT[id]?.equation ?? '',
    references: [...(catalog.get(id)?.references ?? [])],
  }));
}

/** The cascade section of a report snapshot (pure; throws when the network is refused). */
export function buildCascadeSection(cascade: CascadeForReport): {
  section: ReportCascadeSnapshot;
  methods: ReportMethod[];
} {
  const answer = calculate({
    method: 'kinetics.network',
    inputs: { ...cascade.network, report: 'full' },
  });
  if (!answer.ok) {
    throw new Error(
      `The cascade's network is refused: ${answer.errors.map((e) => `${e.field}: ${e.message}`).join('; ')}`,
    );
  }
  const out = answer.outputs;
  if (out.report !== 'full') throw new Error('kinetics.network answered without the full report');
  const rawStates = (cascade.network['states'] as Raw[]) ?? [];
  const rawLinks = (cascade.network['links'] as Raw[]) ?? [];
  const labels = new Map(out.landscape.minima.map((m) => [m.id, m.label || m.id]));
  const label = (id: string) => labels.get(id) ?? id;

  const uncertain = hasSigma(cascade.network);
  let summaries: Record<string, { p025: number; p975: number }> = {};
  let mcWarnings: { code: string; message: string }[] = [];
  if (uncertain) {
    const mc = calculate({
      method: 'uncertainty.monteCarlo',
      inputs: {
        method: 'kinetics.network',
        samples: CASCADE_MONTE_CARLO_SAMPLES,
        seed: CASCADE_MONTE_CARLO_SEED,
        inputs: { ...cascade.network, report: 'yields' },
      },
    });
    if (mc.ok) {
      summaries = mc.outputs as unknown as typeof summaries;
      mcWarnings = mc.warnings.filter((w) => w.code.startsWith('monte-carlo'));
    }
  }
  const interval = (key: string) => {
    const s = summaries[key];
    return s && typeof s.p025 === 'number' ? { low: s.p025, high: s.p975 } : null;
  };
  const value = (key: string, text: string, v: number, unit: string): ReportCascadeValue => {
    const i = interval(key);
    return { label: text, value: v, unit, low: i?.low ?? null, high: i?.high ?? null };
  };

  const minima = new Map(out.landscape.minima.map((m) => [m.id, m]));
  const states = out.landscape.minima.map((m, i) => ({
    id: m.id,
    label: m.label || m.id,
    kind: m.kind,
    energyEv: m.energy,
    source: energySource(rawStates[i]?.['energy'], m.kind),
  }));
  const steps: ReportCascadeStep[] = out.rates
    .filter((r) => r.included)
    .map((r) => {
      const type = r.source;
      const flux = out.flux.find((f) => f.from === r.from && f.to === r.to && f.link === r.link);
      return {
        from: r.from,
        to: r.to,
        type,
        k: r.k,
        deltaG0Ev: r.deltaG0 ?? null,
        regime: r.regime ?? null,
        couplingRegime: r.couplingRegime ?? null,
        flux: flux?.flux ?? 0,
        source: stepSource(rawLinks[r.link] ?? {}, type, label),
      };
    });
  const yields: ReportCascadeValue[] = [
    ...Object.entries(out.yields).map(([id, y]) =>
      value(`yields.${id}`, `Final yield of ${label(id)}`, y, ''),
    ),
    ...Object.entries(out.formationYields)
      .filter(([id]) => minima.get(id)?.kind === 'chargeSeparated')
      .map(([id, y]) => value(`formationYields.${id}`, `Formation yield of ${label(id)}`, y, '')),
  ];
  const lifetimes = Object.entries(out.lifetimes).map(([id, t]) =>
    value(`lifetimes.${id}`, `Lifetime of ${label(id)}`, t, 's'),
  );
  const section: ReportCascadeSnapshot = {
    cascadeId: cascade.id,
    cascadeVersion: cascade.version,
    name: cascade.name,
    notes: cascade.notes,
    temperatureK:
      typeof cascade.network['temperature'] === 'number'
        ? (cascade.network['temperature'] as number)
        : 298.15,
    states,
    steps,
    yields,
    lifetimes,
    dominantPathway: out.dominantPathway.states.map(label),
    times: out.times,
    populations: out.populations,
    transitionStates: out.landscape.transitionStates.map((t) => ({
      from: t.from,
      to: t.to,
      energyEv: t.energy,
    })),
    tree: {
      nodes: out.landscape.tree.nodes.map((n) => ({
        id: n.id,
        kind: n.kind,
        energy: n.energy,
        children: [...n.children],
      })),
      roots: [...out.landscape.tree.roots],
    },
    monteCarlo: uncertain
      ? { samples: CASCADE_MONTE_CARLO_SAMPLES, seed: CASCADE_MONTE_CARLO_SEED }
      : null,
    monteCarloNote: uncertain
      ? `Intervals: 2.5th to 97.5th percentile over ${CASCADE_MONTE_CARLO_SAMPLES} Monte Carlo ` +
        `samples of the inputs with a stated 1σ (seed ${CASCADE_MONTE_CARLO_SEED}).`
      : 'No input of this cascade states an uncertainty (1σ), so yields and lifetimes are given ' +
        'without an interval.',
    warnings: [...answer.warnings, ...mcWarnings].map((w) => ({
      code: w.code,
      message: w.message,
    })),
  };
  return { section, methods: cascadeMethods(rawLinks, uncertain) };
}

/** The report snapshot of a cascade at one version (kind `cascade`, no pairs). */
export function buildCascadeReportSnapshot(
  context: SnapshotContext,
  cascade: CascadeForReport,
): ReportSnapshot {
  const { section, methods } = buildCascadeSection(cascade);
  return {
    schema: 1,
    kind: 'cascade',
    title: context.title,
    workspace: context.workspace,
    author: context.author,
    createdAt: context.createdAt,
    softwareVersion: context.softwareVersion,
    constants: 'CODATA 2018',
    pairs: [],
    cascade: section,
    methods,
    limitsNote:
      `${LIMITS_OF_ESTIMATE_NOTE} A kinetic network assumes every step is a first-order rate ` +
      'between thermally relaxed states: steps faster than vibrational relaxation (~10¹³ s⁻¹) ' +
      'or between states within k_{B}T that are strongly coupled are outside that picture, and ' +
      'each step must be in the regime its rate model assumes.',
  };
}

/** Rate as printed: 1.23 × 10⁸ s⁻¹. */
export function formatRate(k: number): string {
  return `${formatScientific(k, 3)} s⁻¹`;
}
