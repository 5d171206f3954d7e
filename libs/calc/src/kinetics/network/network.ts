/**
 * `kinetics.network`: multi-step electron transfer as a network of states (SCIENCE.md §17) —
 * rates (reverse ET steps by detailed balance), populations on a log time grid, yields,
 * lifetimes, integrated fluxes and the dominant pathway, the energy landscape tree, the
 * sensitivity of a yield to each λ and |H_AB|, and the validity warnings of each step.
 */
import { BOLTZMANN_EV_PER_K } from '../../core/constants';
import type { InputReader, MethodDefinition, WarningSink } from '../../core/method';
import { WARNING_CODES } from '../../core/warnings';
import { adiabaticityMeasures, type CouplingRegime } from '../../rates/coupling-regime';
import { marcusActivationEv, marcusRateLog } from '../../rates/marcus/marcus';
import { mljRateLog } from '../../rates/mlj/mlj';
import {
  CLASS_III_MESSAGE,
  LAMBDA_MESSAGE,
  marcusRegime,
  readTemperature,
  type Regime,
} from '../../rates/rate-inputs';
import { disconnectivityTree, type DisconnectivityTree } from './landscape';
import {
  absorb,
  populationGrid,
  rateMatrix,
  rateTable,
  reachProbability,
  relaxationModes,
  TransientFactor,
  type RateLink,
} from './master-equation';

/** Work limits checked in `read()`: the solvers are O(n³) and the sensitivity O(links · n³). */
export const MAX_NETWORK_STATES = 40;
export const MAX_NETWORK_LINKS = 160;
/** Steps faster than this are faster than vibrational relaxation (SCIENCE.md §17). */
export const VIBRATIONAL_RELAXATION_PER_S = 1e13;
/** Relative step (in ln x) of the central differences of the sensitivity. */
const SENSITIVITY_STEP = 1e-3;

export const STATE_KINDS = ['ground', 'excited', 'chargeSeparated', 'product', 'other'] as const;
export type StateKind = (typeof STATE_KINDS)[number];
export const ET_MODELS = ['marcus', 'mlj'] as const;
export type EtModel = (typeof ET_MODELS)[number];

export interface NetworkState {
  readonly id: string;
  readonly label: string;
  readonly energyEv: number;
  readonly kind: StateKind;
}

/** A link as read: a fixed first-order rate (decay) or an electron-transfer step. */
export type NetworkLink =
  | { readonly type: 'fixed'; readonly from: number; readonly to: number; readonly kPerS: number }
  | {
      readonly type: 'electronTransfer';
      readonly from: number;
      readonly to: number;
      readonly model: EtModel;
      readonly lambdaEv: number;
      readonly couplingEv: number;
      /** MLJ only: λ_v and ħω of the single effective mode (λ is then the solvent λ_s). */
      readonly lambdaVibEv?: number;
      readonly hbarOmegaEv?: number;
    };

export interface NetworkInputs {
  readonly states: NetworkState[];
  readonly links: NetworkLink[];
  readonly initial: number[];
  readonly temperatureK: number;
  readonly timeStartS: number;
  readonly timeEndS: number;
  /** Index of the state whose formation yield the sensitivity follows (undefined: automatic). */
  readonly target?: number;
  /** 'yields' skips the population grid, the landscape and the sensitivity (Monte Carlo). */
  readonly report: 'full' | 'yields';
}

/** One directed rate of the network, as computed. */
export interface NetworkRate {
  /** Index of the input link it comes from. */
  readonly link: number;
  readonly from: string;
  readonly to: string;
  readonly k: number;
  readonly log10k: number;
  /** `fixed` (given), `electronTransfer` (computed), `detailedBalance` (reverse of a step). */
  readonly source: 'fixed' | 'electronTransfer' | 'detailedBalance';
  readonly deltaG0?: number;
  readonly activationFreeEnergy?: number;
  readonly regime?: Regime;
  readonly couplingRegime?: CouplingRegime;
  /**
   * false for a detailed-balance reverse step slower than 1e-10 of every given or forward rate
   * (see `NEGLIGIBLE_REVERSE`): listed, but left out of the master equation.
   */
  readonly included: boolean;
}

/**
 * A reverse (uphill) step slower than this fraction of the slowest given or forward rate is left
 * out of the master equation. Why: a final state (the ground state after recombination, say)
 * joined by an ET step would otherwise never be final — its thermal re-excitation, e.g. 1e-27 s⁻¹
 * over 1.8 eV, makes the whole network one closed class whose only limit is the Boltzmann
 * distribution, and yields and lifetimes lose their meaning. Such a step changes no population
 * by more than ~1e-10 within the life of the network.
 */
export const NEGLIGIBLE_REVERSE = 1e-10;

/**
 * Reverse rate of an ET step by detailed balance: k_ji = k_ij exp((G_j − G_i)/k_BT), with i the
 * forward step's start (microscopic reversibility; e.g. P. Atkins, J. de Paula, Physical
 * Chemistry, 9th ed., OUP 2010, §21 — any physical chemistry text; SCIENCE.md §17). In ln k.
 */
export function detailedBalanceReverseLnK(
  forwardLnK: number,
  fromEnergyEv: number,
  toEnergyEv: number,
  temperatureK: number,
): number {
  return forwardLnK + (toEnergyEv - fromEnergyEv) / (BOLTZMANN_EV_PER_K * temperatureK);
}

/** ln k of one ET step i → j with ΔG° = G_j − G_i, by its model (Marcus or MLJ). */
export function electronTransferLnK(
  link: Extract<NetworkLink, { type: 'electronTransfer' }>,
  deltaG0Ev: number,
  temperatureK: number,
): number {
  if (link.model === 'mlj') {
    return mljRateLog(
      deltaG0Ev,
      link.lambdaEv,
      link.lambdaVibEv ?? 0,
      link.hbarOmegaEv ?? 0.2,
      link.couplingEv,
      temperatureK,
    ).lnK;
  }
  return marcusRateLog(deltaG0Ev, link.lambdaEv, link.couplingEv, temperatureK);
}

/**
 * The transition-state energy of an ET step on the landscape: G_i + ΔG‡ with the classical
 * ΔG‡ = (λ + ΔG°)²/(4λ) (Marcus 1956; SCIENCE.md §17), λ the total (λ_s + λ_v for MLJ). The same
 * energy is reached from either side: G_j + (λ − ΔG°)²/(4λ) = G_i + (λ + ΔG°)²/(4λ).
 */
export function transitionStateEnergyEv(
  fromEnergyEv: number,
  deltaG0Ev: number,
  lambdaTotalEv: number,
): number {
  return fromEnergyEv + marcusActivationEv(deltaG0Ev, lambdaTotalEv);
}

/** All directed rates of the network (forward steps, their reverses, fixed decays). */
export function networkRates(
  inputs: Pick<NetworkInputs, 'states' | 'links' | 'temperatureK'>,
): NetworkRate[] {
  const { states, temperatureK } = inputs;
  const rates: NetworkRate[] = [];
  const entry = (
    link: number,
    from: number,
    to: number,
    lnK: number,
    source: NetworkRate['source'],
    extra: Partial<NetworkRate> = {},
  ): NetworkRate => ({
    link,
    from: states[from].id,
    to: states[to].id,
    k: extra.k ?? Math.exp(lnK),
    log10k: lnK / Math.LN10,
    source,
    included: true,
    ...extra,
  });
  inputs.links.forEach((link, index) => {
    if (link.type === 'fixed') {
      rates.push(
        entry(index, link.from, link.to, Math.log(link.kPerS), 'fixed', { k: link.kPerS }),
      );
      return;
    }
    const gFrom = states[link.from].energyEv;
    const gTo = states[link.to].energyEv;
    const deltaG0 = gTo - gFrom;
    const lambdaTotal = link.lambdaEv + (link.model === 'mlj' ? (link.lambdaVibEv ?? 0) : 0);
    const lnK = electronTransferLnK(link, deltaG0, temperatureK);
    const couplingRegime = adiabaticityMeasures(link.couplingEv, lambdaTotal, temperatureK).regime;
    rates.push(
      entry(index, link.from, link.to, lnK, 'electronTransfer', {
        deltaG0,
        activationFreeEnergy: marcusActivationEv(deltaG0, lambdaTotal),
        regime: marcusRegime(deltaG0, lambdaTotal),
        couplingRegime,
      }),
    );
    const reverseLnK = detailedBalanceReverseLnK(lnK, gFrom, gTo, temperatureK);
    rates.push(
      entry(index, link.to, link.from, reverseLnK, 'detailedBalance', {
        deltaG0: -deltaG0,
        activationFreeEnergy: marcusActivationEv(-deltaG0, lambdaTotal),
        regime: marcusRegime(-deltaG0, lambdaTotal),
        couplingRegime,
      }),
    );
  });
  const slowest = Math.min(...rates.filter((r) => r.source !== 'detailedBalance').map((r) => r.k));
  return rates.map((r) =>
    r.source === 'detailedBalance' && r.k < NEGLIGIBLE_REVERSE * slowest
      ? { ...r, included: false }
      : r,
  );
}

function indexRates(states: readonly NetworkState[], rates: readonly NetworkRate[]): RateLink[] {
  const position = new Map(states.map((s, i) => [s.id, i]));
  return rates
    .filter((r) => r.included)
    .map((r) => ({ from: position.get(r.from)!, to: position.get(r.to)!, kPerS: r.k }));
}

/** ln k of a link forward and (ET steps) in reverse by detailed balance, as `networkRates`. */
function linkLnK(
  states: readonly NetworkState[],
  link: NetworkLink,
  temperatureK: number,
): { forward: number; reverse?: number } {
  if (link.type === 'fixed') return { forward: Math.log(link.kPerS) };
  const gFrom = states[link.from].energyEv;
  const gTo = states[link.to].energyEv;
  const forward = electronTransferLnK(link, gTo - gFrom, temperatureK);
  return { forward, reverse: detailedBalanceReverseLnK(forward, gFrom, gTo, temperatureK) };
}

/** Yields only: the part Monte Carlo and the sensitivity repeat. */
export interface NetworkYields {
  readonly rates: NetworkRate[];
  readonly table: number[][];
  readonly finalPopulations: number[];
  readonly formationYields: number[];
  readonly occupationS: number[];
  readonly transient: boolean[];
  /** The GTH factor of −K_TT, reused for the relaxation modes. */
  readonly factor: TransientFactor;
}

export function networkYields(inputs: NetworkInputs): NetworkYields {
  const rates = networkRates(inputs);
  const table = rateTable(inputs.states.length, indexRates(inputs.states, rates));
  const factor = new TransientFactor(table);
  const absorption = absorb(table, inputs.initial, factor);
  const formationYields = absorption.reached;
  return {
    rates,
    table,
    finalPopulations: absorption.finalPopulations,
    formationYields,
    occupationS: absorption.occupationS,
    transient: absorption.transient,
    factor,
  };
}

/**
 * The dominant pathway by integrated flux (SCIENCE.md §17): from the most populated initial state,
 * follow at each state the link with the largest net integrated flux ∫(k_ij p_i − k_ji p_j) dt out
 * of it, never revisiting a state, until a state with no net outflow (a final state).
 */
export function dominantPathway(
  states: readonly NetworkState[],
  table: readonly (readonly number[])[],
  occupationS: readonly number[],
  initial: readonly number[],
): {
  states: string[];
  steps: { from: string; to: string; netFlux: number }[];
  bottleneckFlux: number;
} {
  const n = states.length;
  const net = (i: number, j: number) => table[i][j] * occupationS[i] - table[j][i] * occupationS[j];
  let current = initial.indexOf(Math.max(...initial));
  const visited = new Set([current]);
  const steps: { from: string; to: string; netFlux: number }[] = [];
  for (;;) {
    let best = -1;
    let bestFlux = 0;
    for (let j = 0; j < n; j++) {
      if (visited.has(j) || j === current) continue;
      const flux = net(current, j);
      if (flux > bestFlux) {
        bestFlux = flux;
        best = j;
      }
    }
    if (best < 0) break;
    steps.push({ from: states[current].id, to: states[best].id, netFlux: bestFlux });
    visited.add(best);
    current = best;
  }
  return {
    states: [steps[0]?.from ?? states[current].id, ...steps.map((s) => s.to)],
    steps,
    bottleneckFlux: steps.length > 0 ? Math.min(...steps.map((s) => s.netFlux)) : 0,
  };
}

function warnSteps(inputs: NetworkInputs, rates: readonly NetworkRate[], sink: WarningSink): void {
  const thermalEv = BOLTZMANN_EV_PER_K * inputs.temperatureK;
  inputs.links.forEach((link, index) => {
    if (link.type !== 'electronTransfer') return;
    const gap = Math.abs(inputs.states[link.to].energyEv - inputs.states[link.from].energyEv);
    // Within k_BT and 2|H| ≥ k_BT: the adiabatic splitting exceeds the thermal energy and the
    // diabatic gap, so the two are one mixed state, not two states exchanging by a rate.
    if (gap < thermalEv && 2 * Math.abs(link.couplingEv) >= thermalEv) {
      sink.warn(
        WARNING_CODES.mixedStates,
        `links[${index}] (${inputs.states[link.from].label} → ${inputs.states[link.to].label}): ` +
          `the states are within k_BT (${gap.toFixed(3)} eV) and |H_AB| = ` +
          `${Math.abs(link.couplingEv).toPrecision(3)} eV is large: they are mixed, not separate states.`,
      );
    }
  });
  const fast = rates.filter((r) => r.k > VIBRATIONAL_RELAXATION_PER_S);
  for (const r of fast) {
    const from = inputs.states.find((s) => s.id === r.from)!;
    const to = inputs.states.find((s) => s.id === r.to)!;
    sink.warn(
      WARNING_CODES.stepTooFast,
      `links[${r.link}] ${from.label} → ${to.label}: k = ${r.k.toExponential(2)} s⁻¹ is faster ` +
        'than vibrational relaxation (~1e13 s⁻¹): the rate picture fails for this step.',
    );
  }
}

/** The state whose formation yield the sensitivity follows, when none is named. */
function defaultTarget(
  inputs: NetworkInputs,
  lifetimes: (number | undefined)[],
  finals: readonly number[],
): number | undefined {
  const cs = inputs.states
    .map((s, i) => ({ s, i }))
    .filter(({ s, i }) => s.kind === 'chargeSeparated' && lifetimes[i] !== undefined);
  if (cs.length > 0) return cs.reduce((a, b) => (lifetimes[b.i]! > lifetimes[a.i]! ? b : a)).i;
  let best: number | undefined;
  finals.forEach((p, i) => {
    if (inputs.initial[i] === 0 && p > 0 && (best === undefined || p > finals[best])) best = i;
  });
  return best;
}

/**
 * d φ_target / d ln x for every λ and |H_AB| of the ET steps (central differences in ln x, step
 * 1e-3): the change of the target's formation yield per relative change of the input.
 */
export function yieldSensitivity(inputs: NetworkInputs, target: number) {
  // Only the varied link's two rates change: the other links' ln k are computed once, and each
  // varied request rebuilds the table from numbers (the rule of `networkRates` for negligible
  // reverses applied again, since the slowest forward rate may move).
  const { states, temperatureK } = inputs;
  const n = states.length;
  const perLink = inputs.links.map((link) => linkLnK(states, link, temperatureK));
  const yieldOf = (index: number, varied: { forward: number; reverse?: number }) => {
    let slowest = Infinity;
    perLink.forEach(
      (k, i) => (slowest = Math.min(slowest, i === index ? varied.forward : k.forward)),
    );
    const table = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    inputs.links.forEach((link, i) => {
      const k = i === index ? varied : perLink[i];
      if (link.from !== link.to) table[link.from][link.to] += Math.exp(k.forward);
      if (k.reverse !== undefined && link.from !== link.to) {
        const reverse = Math.exp(k.reverse);
        if (!(reverse < NEGLIGIBLE_REVERSE * Math.exp(slowest)))
          table[link.to][link.from] += reverse;
      }
    });
    return reachProbability(table, inputs.initial, target);
  };
  const entries: {
    link: number;
    from: string;
    to: string;
    parameter: 'lambda' | 'coupling';
    value: number;
    dYieldDLn: number;
  }[] = [];
  inputs.links.forEach((link, index) => {
    if (link.type !== 'electronTransfer') return;
    for (const parameter of ['lambda', 'coupling'] as const) {
      const key = parameter === 'lambda' ? 'lambdaEv' : 'couplingEv';
      const at = (factor: number) =>
        yieldOf(index, linkLnK(states, { ...link, [key]: link[key] * factor }, temperatureK));
      const up = at(Math.exp(SENSITIVITY_STEP));
      const down = at(Math.exp(-SENSITIVITY_STEP));
      entries.push({
        link: index,
        from: inputs.states[link.from].id,
        to: inputs.states[link.to].id,
        parameter,
        value: Math.abs(link[key]),
        dYieldDLn: (up - down) / (2 * SENSITIVITY_STEP),
      });
    }
  });
  entries.sort((a, b) => Math.abs(b.dYieldDLn) - Math.abs(a.dYieldDLn));
  return entries;
}

export function computeNetwork(inputs: NetworkInputs, sink: WarningSink) {
  const { states } = inputs;
  const ids = states.map((s) => s.id);
  const byId = <T>(values: readonly T[], keep: (i: number) => boolean = () => true) =>
    Object.fromEntries(ids.map((id, i) => [id, values[i]]).filter((_, i) => keep(i))) as Record<
      string,
      T
    >;
  const solved = networkYields(inputs);
  const { rates, table, occupationS, transient } = solved;
  warnSteps(inputs, rates, sink);
  const { modes, order } = relaxationModes(table, transient, solved.factor);
  // A state's lifetime: the slowest relaxation mode in which it takes part (|shape| ≥ 0.05).
  const lifetimes: (number | undefined)[] = states.map((_, i) => {
    const row = order.indexOf(i);
    if (row < 0) return undefined;
    const mode = modes.find((m) => Math.abs(m.shape[row]) >= 0.05);
    return mode?.timeS;
  });
  const target = inputs.target ?? defaultTarget(inputs, lifetimes, solved.finalPopulations);
  const closed = (i: number) => !transient[i];
  const longLivedIndex = states
    .map((s, i) => ({ s, i }))
    .filter(({ s, i }) => s.kind === 'chargeSeparated' && lifetimes[i] !== undefined)
    .reduce<number | undefined>(
      (best, { i }) => (best === undefined || lifetimes[i]! > lifetimes[best]! ? i : best),
      undefined,
    );
  const base = {
    rates,
    yields: byId(solved.finalPopulations, closed),
    formationYields: byId(solved.formationYields),
    occupationTimes: byId(occupationS, (i) => transient[i]),
    lifetimes: byId(
      lifetimes.map((x) => x ?? 0),
      (i) => lifetimes[i] !== undefined,
    ),
    relaxationTimes: modes.map((m) => m.timeS),
    longLived:
      longLivedIndex === undefined
        ? null
        : {
            state: ids[longLivedIndex],
            lifetime: lifetimes[longLivedIndex]!,
            formationYield: solved.formationYields[longLivedIndex],
          },
  };
  if (inputs.report === 'yields') return { ...base, report: inputs.report };
  const grid = populationGrid(table, inputs.initial, inputs.timeStartS, inputs.timeEndS);
  const populationSumError = Math.max(
    ...grid.populations.map((p) => Math.abs(p.reduce((s, x) => s + x, 0) - 1)),
  );
  const populations = byId(states.map((_, i) => grid.populations.map((p) => p[i])));
  const peak = (i: number) => {
    let t = 0;
    grid.populations.forEach((p, k) => {
      if (p[i] > grid.populations[t][i]) t = k;
    });
    return { peakPopulation: grid.populations[t][i], peakTime: grid.timesS[t] };
  };
  const flux = rates.map((r) => ({
    from: r.from,
    to: r.to,
    link: r.link,
    flux: r.included ? r.k * occupationS[ids.indexOf(r.from)] : 0,
  }));
  const barriers = inputs.links.flatMap((link, index) => {
    if (link.type !== 'electronTransfer') return [];
    const g = states[link.from].energyEv;
    const deltaG0 = states[link.to].energyEv - g;
    const lambdaTotal = link.lambdaEv + (link.model === 'mlj' ? (link.lambdaVibEv ?? 0) : 0);
    const energyEv = transitionStateEnergyEv(g, deltaG0, lambdaTotal);
    return [
      {
        link: index,
        from: ids[link.from],
        to: ids[link.to],
        energy: energyEv,
        barrierForward: energyEv - g,
        barrierReverse: energyEv - states[link.to].energyEv,
      },
    ];
  });
  const tree: DisconnectivityTree = disconnectivityTree(
    states.map((s) => ({ id: s.id, energyEv: s.energyEv })),
    barriers.map((b) => ({ from: b.from, to: b.to, energyEv: b.energy })),
  );
  return {
    ...base,
    longLived: base.longLived === null ? null : { ...base.longLived, ...peak(longLivedIndex!) },
    report: inputs.report,
    rateMatrix: rateMatrix(table),
    times: grid.timesS,
    populations,
    populationSumError,
    flux,
    dominantPathway: dominantPathway(states, table, occupationS, inputs.initial),
    landscape: {
      minima: states.map((s) => ({ id: s.id, label: s.label, energy: s.energyEv, kind: s.kind })),
      transitionStates: barriers,
      tree: {
        nodes: tree.nodes.map((n) => ({
          id: n.id,
          kind: n.kind,
          energy: n.energyEv,
          children: n.children,
          minima: n.minima,
        })),
        roots: tree.roots,
        thresholds: tree.thresholds.map((t) => ({ energy: t.energyEv, basins: t.basins })),
      },
      decays: inputs.links.flatMap((l, index) =>
        l.type === 'fixed' ? [{ link: index, from: ids[l.from], to: ids[l.to], k: l.kPerS }] : [],
      ),
    },
    sensitivity:
      target === undefined
        ? null
        : {
            target: ids[target],
            formationYield: solved.formationYields[target],
            entries: yieldSensitivity(inputs, target),
          },
  };
}

function readStateId(
  child: InputReader,
  field: 'from' | 'to',
  position: ReadonlyMap<string, number>,
): number {
  const raw = child.raw(field);
  if (typeof raw !== 'string' || !position.has(raw)) {
    child.fail(
      field,
      `Field ${field} must name a state id (one of ${[...position.keys()].join(', ')}).`,
    );
    return -1;
  }
  return position.get(raw)!;
}

function readLink(
  child: InputReader,
  position: ReadonlyMap<string, number>,
): NetworkLink | undefined {
  const from = readStateId(child, 'from', position);
  const to = readStateId(child, 'to', position);
  if (from >= 0 && from === to) child.fail('to', 'A link joins two different states.');
  const hasK = child.raw('k') !== undefined;
  const hasLifetime = child.raw('lifetime') !== undefined;
  const hasEt = child.raw('lambda') !== undefined || child.raw('coupling') !== undefined;
  const kinds = [hasK, hasLifetime, hasEt].filter(Boolean).length;
  if (kinds !== 1) {
    child.fail(
      'k',
      kinds === 0
        ? 'Give a rate k (s⁻¹), a lifetime, or an electron-transfer step (lambda and coupling).'
        : 'Give only one of k, lifetime, or lambda and coupling for a link.',
    );
    return undefined;
  }
  if (hasK) {
    const kPerS = child.quantity('k', 'rateFirstOrder', {
      greaterThan: 0,
      message: 'Rate constant must be > 0 s⁻¹.',
    });
    if (kPerS > 1e20) child.fail('k', 'Rate constant is outside the supported range (≤ 1e20 s⁻¹).');
    return { type: 'fixed', from, to, kPerS };
  }
  if (hasLifetime) {
    const lifetimeS = child.quantity('lifetime', 'time', {
      greaterThan: 0,
      message: 'Lifetime must be > 0 s.',
    });
    if (lifetimeS < 1e-20)
      child.fail('lifetime', 'Lifetime is outside the supported range (≥ 1e-20 s).');
    return { type: 'fixed', from, to, kPerS: 1 / lifetimeS };
  }
  const model = child.choice('model', ET_MODELS, 'marcus');
  const lambdaEv = child.quantity('lambda', 'energy', { greaterThan: 0, message: LAMBDA_MESSAGE });
  if (lambdaEv > 10)
    child.fail('lambda', 'Reorganization energy is outside the supported range (≤ 10 eV).');
  const couplingEv = Math.abs(child.quantity('coupling', 'energy'));
  if (!(couplingEv > 0) && Number.isFinite(couplingEv))
    child.fail(
      'coupling',
      'Electronic coupling |H_AB| must be > 0 for a step (a zero coupling is no link).',
    );
  if (Number.isFinite(couplingEv) && Number.isFinite(lambdaEv) && 2 * couplingEv >= lambdaEv)
    child.fail('coupling', CLASS_III_MESSAGE);
  if (model === 'mlj') {
    const lambdaVibEv = child.quantity('lambdaVib', 'energy', {
      atLeast: 0,
      message: 'Vibrational reorganization energy must be ≥ 0 eV.',
    });
    const hbarOmegaEv = child.quantity('hbarOmega', 'energy', {
      greaterThan: 0,
      message: 'Mode energy must be > 0.',
    });
    if (lambdaVibEv / hbarOmegaEv > 200)
      child.fail('lambdaVib', 'λ_v/ħω is outside the supported range (S ≤ 200).');
    return {
      type: 'electronTransfer',
      from,
      to,
      model,
      lambdaEv,
      couplingEv,
      lambdaVibEv,
      hbarOmegaEv,
    };
  }
  return { type: 'electronTransfer', from, to, model, lambdaEv, couplingEv };
}

function readInitial(reader: InputReader, states: readonly NetworkState[]): number[] {
  const position = new Map(states.map((s, i) => [s.id, i]));
  const raw = reader.raw('initial');
  const initial = new Array<number>(states.length).fill(0);
  if (raw === undefined) {
    const excited = states.findIndex((s) => s.kind === 'excited');
    if (excited < 0) {
      reader.fail('initial', 'Field initial is required (no state of kind excited to start from).');
      return initial;
    }
    initial[excited] = 1;
    return initial;
  }
  if (typeof raw === 'string') {
    if (!position.has(raw))
      reader.fail('initial', `Field initial must name a state id (got '${raw}').`);
    else initial[position.get(raw)!] = 1;
    return initial;
  }
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) {
    reader.fail('initial', 'Field initial must be a state id or { stateId: population, … }.');
    return initial;
  }
  for (const [id, value] of Object.entries(raw)) {
    if (!position.has(id)) reader.fail('initial', `Field initial names an unknown state '${id}'.`);
    else if (typeof value !== 'number' || !Number.isFinite(value) || value < 0)
      reader.fail('initial', `Initial population of '${id}' must be a number ≥ 0.`);
    else initial[position.get(id)!] = value;
  }
  const total = initial.reduce((s, x) => s + x, 0);
  if (!(total > 0)) {
    reader.fail('initial', 'Initial populations must not all be 0.');
    return initial;
  }
  return initial.map((x) => x / total);
}

export function readNetwork(reader: InputReader): NetworkInputs {
  const stateReaders = reader.objectArray('states', {
    minLength: 2,
    message: 'Field states needs at least two states.',
  });
  if (stateReaders.length > MAX_NETWORK_STATES)
    reader.fail('states', `At most ${MAX_NETWORK_STATES} states per network.`);
  const seen = new Set<string>();
  const states: NetworkState[] = stateReaders.map((child, i) => {
    const rawId = child.raw('id');
    let id = `#${i}`;
    if (typeof rawId !== 'string' || rawId.trim() === '')
      child.fail('id', 'Field id must be a non-empty string.');
    else if (seen.has(rawId)) child.fail('id', `State id '${rawId}' is used twice.`);
    else id = rawId;
    seen.add(id);
    const rawLabel = child.raw('label');
    if (rawLabel !== undefined && typeof rawLabel !== 'string')
      child.fail('label', 'Field label must be a string.');
    // An energy of light is accepted too (E₀₀ of an excited state typed in nm).
    const energyEv = child.quantity('energy', 'photonEnergy');
    if (Math.abs(energyEv) > 100)
      child.fail('energy', 'State energy is outside the supported range (|G| ≤ 100 eV).');
    const kind = child.choice('kind', STATE_KINDS, 'other');
    return {
      id,
      label: typeof rawLabel === 'string' && rawLabel !== '' ? rawLabel : id,
      energyEv,
      kind,
    };
  });
  const position = new Map(states.map((s, i) => [s.id, i]));
  const linkReaders = reader.objectArray('links', {
    minLength: 1,
    message: 'Field links needs at least one link.',
  });
  if (linkReaders.length > MAX_NETWORK_LINKS)
    reader.fail('links', `At most ${MAX_NETWORK_LINKS} links per network.`);
  const links = linkReaders.map((child) => readLink(child, position));
  const pairs = new Map<string, number>();
  links.forEach((link, i) => {
    if (link?.type !== 'electronTransfer') return;
    const key = [link.from, link.to].sort((a, b) => a - b).join('-');
    if (pairs.has(key))
      reader.fail(
        `links[${i}]`,
        `links[${pairs.get(key)}] already joins these states by electron transfer; the reverse step follows by detailed balance.`,
      );
    pairs.set(key, i);
  });
  const temperatureK = reader.raw('temperature') === undefined ? 298.15 : readTemperature(reader);
  const timeStartS =
    reader.optionalQuantity('timeStart', 'time', {
      greaterThan: 0,
      message: 'Start time must be > 0 s.',
    }) ?? 1e-15;
  const timeEndS =
    reader.optionalQuantity('timeEnd', 'time', {
      greaterThan: 0,
      message: 'End time must be > 0 s.',
    }) ?? 10;
  if (timeEndS <= timeStartS) reader.fail('timeEnd', 'End time must be after the start time.');
  else if (timeEndS / timeStartS > 1e24)
    reader.fail('timeEnd', 'The time grid may span at most 24 decades.');
  const initial = readInitial(reader, states);
  const rawTarget = reader.raw('target');
  let target: number | undefined;
  if (rawTarget !== undefined) {
    if (typeof rawTarget !== 'string' || !position.has(rawTarget))
      reader.fail('target', 'Field target must name a state id.');
    else target = position.get(rawTarget);
  }
  const report = reader.choice('report', ['full', 'yields'] as const, 'full');
  return {
    states,
    links: links.filter((l): l is NetworkLink => l !== undefined),
    initial,
    temperatureK,
    timeStartS,
    timeEndS,
    target,
    report,
  };
}

export const networkMethod = {
  id: 'kinetics.network',
  summary:
    'Multi-step electron transfer as a network of states: rates (reverse steps by detailed balance), populations on a log time grid, yields, lifetimes, dominant pathway, energy landscape tree and yield sensitivity.',
  references: [
    'R. A. Marcus, J. Chem. Phys. 1956, 24, 966; doi 10.1063/1.1742723',
    'J. Jortner, J. Chem. Phys. 1976, 64, 4860; doi 10.1063/1.432142 (from memory)',
    'N. G. van Kampen, Stochastic Processes in Physics and Chemistry, 3rd ed., Elsevier 2007 (master equation; from memory)',
    'W. K. Grassmann, M. I. Taksar, D. P. Heyman, Oper. Res. 1985, 33, 1107 (GTH elimination; from memory)',
    'O. M. Becker, M. Karplus, J. Chem. Phys. 1997, 106, 1495; doi 10.1063/1.473299 (from memory)',
    'D. J. Wales, M. A. Miller, T. R. Walsh, Nature 1998, 394, 758; doi 10.1038/29487 (from memory)',
  ],
  inputs: [
    {
      name: 'states',
      quantity: 'array',
      required: true,
      label: 'States',
      description:
        'Array of { id, label?, energy (free energy on one common zero, e.g. eV; nm for an energy of light), kind? (ground, excited, chargeSeparated, product, other) }.',
    },
    {
      name: 'links',
      quantity: 'array',
      required: true,
      label: 'Links',
      description:
        'Array of { from, to, k (s-1) } or { from, to, lifetime } (decays, one-way), or { from, to, lambda, coupling, model? (marcus, mlj; mlj also lambdaVib, hbarOmega) } (ET steps; ΔG° = G_to − G_from, the reverse by detailed balance).',
    },
    {
      name: 'initial',
      quantity: 'object',
      required: false,
      label: 'Initial populations',
      description:
        'A state id (all population there) or { stateId: population } (normalised); default the first excited state.',
    },
    {
      name: 'temperature',
      quantity: 'temperature',
      required: false,
      defaultValue: 298.15,
      description: 'Absolute temperature.',
    },
    {
      name: 'timeStart',
      quantity: 'time',
      required: false,
      defaultValue: 1e-15,
      description: 'First time of the population grid.',
    },
    {
      name: 'timeEnd',
      quantity: 'time',
      required: false,
      defaultValue: 10,
      description: 'Last time of the population grid.',
    },
    {
      name: 'target',
      quantity: 'string',
      required: false,
      label: 'Target state',
      description:
        'State whose formation yield the sensitivity follows (default: the longest-lived charge-separated state).',
    },
    {
      name: 'report',
      quantity: 'string',
      required: false,
      defaultValue: 'full',
      description: "'full', or 'yields' for rates, yields and lifetimes only (for Monte Carlo).",
    },
  ],
  outputs: [
    {
      name: 'rates',
      unit: 's-1',
      description:
        'Every directed rate: forward ET steps, their reverses by detailed balance, fixed decays.',
    },
    {
      name: 'yields',
      unit: '',
      description: 'lim p(t→∞) of the final states (absorbing states and closed sets).',
    },
    {
      name: 'formationYields',
      unit: '',
      description: 'Probability that each state is ever reached.',
    },
    {
      name: 'occupationTimes',
      unit: 's',
      description: 'Expected time spent in each transient state.',
    },
    {
      name: 'lifetimes',
      unit: 's',
      description:
        'Slowest relaxation time in which each transient state takes part (from the eigenvalues).',
    },
    {
      name: 'relaxationTimes',
      unit: 's',
      description: '−1/λ for the eigenvalues λ of the transient block, slowest first.',
    },
    {
      name: 'longLived',
      unit: '',
      description:
        'The longest-lived charge-separated state: lifetime (s), formation yield, peak population and time.',
    },
    {
      name: 'rateMatrix',
      unit: 's-1',
      description: 'K of dp/dt = K p (K_ji = k_ij, columns sum to 0).',
    },
    { name: 'times', unit: 's', description: 'Log time grid (10 points per decade).' },
    { name: 'populations', unit: '', description: 'Population of each state at each time.' },
    { name: 'populationSumError', unit: '', description: 'max |Σp − 1| over the grid (a check).' },
    {
      name: 'flux',
      unit: '',
      description: 'Integrated flux ∫ k_ij p_i dt of every directed rate.',
    },
    {
      name: 'dominantPathway',
      unit: '',
      description: 'States and steps of largest net integrated flux.',
    },
    {
      name: 'landscape',
      unit: 'eV',
      description: 'Minima, transition states (G_i + ΔG‡), disconnectivity tree, decays.',
    },
    {
      name: 'sensitivity',
      unit: '',
      description: 'd φ/d ln x of the target formation yield for every λ and |H_AB|.',
    },
  ],
  read: readNetwork,
  compute: computeNetwork,
} satisfies MethodDefinition<NetworkInputs>;

export type NetworkOutputs = ReturnType<(typeof networkMethod)['compute']>;
