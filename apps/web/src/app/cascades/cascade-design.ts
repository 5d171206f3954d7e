/**
 * The cascade page's editor model ("design") and how it becomes a `kinetics.network` request
 * (CALC-API.md). The design keeps what the user typed and how each state energy was derived; the
 * network is what it resolves to, the request the API, the CLI and the report compute. Derived
 * quantities go through the calculation core (`drivingForce.rehmWeller`, `coupling.distanceDecay`,
 * its unit table), never re-derived here. Messages name fields by the labels the page shows.
 */
import { calculate, photonEnergyEvFromNm, toCanonical } from '@gapwise/calc';
import type { Provenance } from '@gapwise/contracts';

/** State kinds as the page names them; the core knows ground/excited/chargeSeparated/product. */
export const STATE_KINDS = {
  ground: { label: 'Ground state', core: 'ground' },
  singlet: { label: 'Locally excited singlet', core: 'excited' },
  triplet: { label: 'Locally excited triplet', core: 'excited' },
  csIntermediate: { label: 'Charge-separated intermediate', core: 'chargeSeparated' },
  csFinal: { label: 'Final charge-separated state', core: 'chargeSeparated' },
  product: { label: 'Product', core: 'product' },
} as const;
export type StateKind = keyof typeof STATE_KINDS;

export const ENERGY_MODES = {
  typed: 'Typed free energy',
  e00: 'Excited state from E₀₀',
  potentials: 'Charge-separated from potentials (Weller/Born)',
  pair: 'From a pair’s ΔG°',
  step: 'Another state plus a step ΔG°',
} as const;
export type EnergyMode = keyof typeof ENERGY_MODES;

export const ENERGY_UNITS = ['eV', 'meV', 'kJ/mol', 'kcal/mol', 'cm-1'] as const;
export const E00_UNITS = ['eV', 'nm'] as const;
export const COUPLING_UNITS = ['cm-1', 'meV', 'eV'] as const;
export const TIME_UNITS = ['s', 'ps', 'fs'] as const;

/** Everything a state row holds; the fields of the other modes stay as typed (switching back). */
export interface StateDesign {
  id: string;
  label: string;
  kind: StateKind;
  mode: EnergyMode;
  /** typed: free energy G on the common zero (ground state 0). */
  energy: number | null;
  energyUnit: string;
  /** σ of the typed G, E₀₀ or step ΔG°, in the same unit as the value. */
  sigma: number | null;
  /** e00 */
  e00: number | null;
  e00Unit: string;
  /** potentials: E_ox(D⁺/D), E_red(A/A⁻) in V vs the same reference; R and radii in Å. */
  donorOxidationV: number | null;
  acceptorReductionV: number | null;
  distanceA: number | null;
  epsilon: number | null;
  radiusDonorA: number | null;
  radiusAcceptorA: number | null;
  epsilonReference: number | null;
  chargeDonor: number | null;
  chargeAcceptor: number | null;
  /** pair and step: the state the step starts from (G = G_from + ΔG°). */
  fromState: string;
  /** step: ΔG° of the step from `fromState`. */
  stepDeltaG: number | null;
  stepUnit: string;
  /** pair: the pair whose driving force ΔG° (eV) is used, with its provenance. */
  pair: PairSource | null;
}

/** A value taken from a pair: which pair, which version, and the parameter's own provenance. */
export interface PairSource {
  readonly id: string;
  readonly name: string;
  readonly version: number;
  /** Canonical values (eV) and σ as stored on the pair. */
  readonly values: Readonly<Record<string, { value: number; sigma: number | null }>>;
  readonly provenance: Readonly<Record<string, Provenance>>;
}

export type LinkType = 'rate' | 'lifetime' | 'et';

export interface LinkDesign {
  from: string;
  to: string;
  type: LinkType;
  k: number | null;
  kSigma: number | null;
  lifetime: number | null;
  lifetimeUnit: string;
  lifetimeSigma: number | null;
  model: 'marcus' | 'mlj';
  lambda: number | null;
  lambdaUnit: string;
  lambdaSigma: number | null;
  couplingMode: 'direct' | 'decay';
  coupling: number | null;
  couplingUnit: string;
  couplingSigma: number | null;
  /** Distance decay H = H₀ exp(−β(R − R₀)/2): H₀ in `couplingUnit`, R₀ and R in Å, β in Å⁻¹. */
  coupling0: number | null;
  distance0A: number | null;
  betaPerA: number | null;
  distanceA: number | null;
  /** MLJ only: λ_v and ħω (eV). */
  lambdaVibEv: number | null;
  hbarOmegaEv: number | null;
  /** λ and |H_AB| taken from a pair (its values are then shown, not typed). */
  pair: PairSource | null;
}

export interface CascadeDesign {
  states: StateDesign[];
  links: LinkDesign[];
  temperatureK: number;
  /** The state all population starts in ('' = the first excited state, the core's default). */
  initial: string;
}

export interface DesignError {
  /** Where on the page: `states[1].energy`, `links[0].lambda`, … */
  readonly field: string;
  readonly message: string;
}

export function newState(id: string, kind: StateKind = 'csIntermediate'): StateDesign {
  return {
    id,
    label: '',
    kind,
    mode: kind === 'singlet' || kind === 'triplet' ? 'e00' : 'typed',
    energy: kind === 'ground' ? 0 : null,
    energyUnit: 'eV',
    sigma: null,
    e00: null,
    e00Unit: 'eV',
    donorOxidationV: null,
    acceptorReductionV: null,
    distanceA: null,
    epsilon: null,
    radiusDonorA: null,
    radiusAcceptorA: null,
    epsilonReference: null,
    chargeDonor: 0,
    chargeAcceptor: 0,
    fromState: '',
    stepDeltaG: null,
    stepUnit: 'eV',
    pair: null,
  };
}

export function newLink(from = '', to = '', type: LinkType = 'et'): LinkDesign {
  return {
    from,
    to,
    type,
    k: null,
    kSigma: null,
    lifetime: null,
    lifetimeUnit: 'ps',
    lifetimeSigma: null,
    model: 'marcus',
    lambda: null,
    lambdaUnit: 'eV',
    lambdaSigma: null,
    couplingMode: 'direct',
    coupling: null,
    couplingUnit: 'cm-1',
    couplingSigma: null,
    coupling0: null,
    distance0A: 3.5,
    betaPerA: 1.0,
    distanceA: null,
    lambdaVibEv: null,
    hbarOmegaEv: 0.18,
    pair: null,
  };
}

export function emptyDesign(): CascadeDesign {
  const ground = newState('S0', 'ground');
  ground.label = 'Ground state';
  return { states: [ground], links: [], temperatureK: 298.15, initial: '' };
}

/** The name a state goes by in messages: its label, else its id. */
export function stateName(s: Pick<StateDesign, 'id' | 'label'>): string {
  return s.label.trim() || s.id;
}

/** A value in eV from any energy unit, by the core's unit table. */
export function toEv(value: number, unit: string): number {
  return toCanonical(value, unit, 'energy');
}

const has = (x: number | null | undefined): x is number =>
  x !== null && x !== undefined && Number.isFinite(x);
const sigmaOf = (x: number | null) => (has(x) && x > 0 ? x : null);

/** A quantity as the network takes it, with σ when `withSigma` (the Monte Carlo request). */
function quantity(value: number, unit: string, sigma: number | null, withSigma: boolean) {
  if (withSigma && sigma !== null) return { value, sigma, unit };
  return unit === '' ? value : { value, unit };
}

export interface ResolvedState {
  /** Energy as the network carries it (a number in eV, or { value, unit } as typed). */
  readonly energy: unknown;
  readonly energyEv: number;
  /** σ of the energy in eV (null: exact). */
  readonly sigmaEv: number | null;
  /** How the energy came about, in words (for the states table and the report). */
  readonly how: string;
}

/**
 * Resolves every state energy (a state may build on another: pair and step modes), in eV.
 * Errors name the state's label and the field label; a cycle of references is refused.
 */
export function resolveStates(
  design: CascadeDesign,
  errors: DesignError[],
): (ResolvedState | null)[] {
  const byId = new Map(design.states.map((s, i) => [s.id, i]));
  const done = new Map<number, ResolvedState | null>();
  const visiting = new Set<number>();
  const resolve = (i: number): ResolvedState | null => {
    if (done.has(i)) return done.get(i)!;
    if (visiting.has(i)) {
      errors.push({
        field: `states[${i}].fromState`,
        message: `State ${stateName(design.states[i])}: the states build on each other in a circle.`,
      });
      return null;
    }
    visiting.add(i);
    const r = resolveOne(design.states[i], i);
    visiting.delete(i);
    done.set(i, r);
    return r;
  };
  const fail = (i: number, field: string, label: string, what: string): null => {
    errors.push({
      field: `states[${i}].${field}`,
      message: `State ${stateName(design.states[i])}: ${label} ${what}`,
    });
    return null;
  };
  const resolveOne = (s: StateDesign, i: number): ResolvedState | null => {
    switch (s.mode) {
      case 'typed': {
        if (!has(s.energy)) return fail(i, 'energy', 'Free energy G', 'is required.');
        const ev = toEv(s.energy, s.energyUnit);
        const sigma = sigmaOf(s.sigma);
        return {
          energy: s.energyUnit === 'eV' ? s.energy : { value: s.energy, unit: s.energyUnit },
          energyEv: ev,
          sigmaEv: sigma === null ? null : Math.abs(toEv(sigma, s.energyUnit)),
          how: 'typed',
        };
      }
      case 'e00': {
        if (!has(s.e00) || s.e00 <= 0) return fail(i, 'e00', 'E₀₀', 'must be > 0.');
        if (s.e00Unit === 'nm') {
          const energyEv = photonEnergyEvFromNm(s.e00);
          const sigma = sigmaOf(s.sigma);
          return {
            energy: { value: s.e00, unit: 'nm' },
            energyEv,
            // dE = E dλ/λ for E = hc/λ
            sigmaEv: sigma === null ? null : (energyEv * sigma) / s.e00,
            how: `E₀₀ from ${s.e00} nm`,
          };
        }
        return {
          energy: s.e00,
          energyEv: s.e00,
          sigmaEv: sigmaOf(s.sigma),
          how: `E₀₀ = ${s.e00} eV`,
        };
      }
      case 'potentials': {
        if (!has(s.donorOxidationV))
          return fail(i, 'donorOxidationV', 'Donor oxidation potential E_ox', 'is required.');
        if (!has(s.acceptorReductionV))
          return fail(
            i,
            'acceptorReductionV',
            'Acceptor reduction potential E_red',
            'is required.',
          );
        if (!has(s.distanceA)) return fail(i, 'distanceA', 'Ion-pair distance R', 'is required.');
        if (!has(s.epsilon)) return fail(i, 'epsilon', 'Solvent ε_s', 'is required.');
        const inputs: Record<string, unknown> = {
          donorOxidation: { value: s.donorOxidationV, unit: 'V' },
          acceptorReduction: { value: s.acceptorReductionV, unit: 'V' },
          // Only ΔG°_CR = −G_CS is used; E₀₀ enters ΔG°_CS alone, so any positive value serves.
          excitationEnergy: 2,
          distance: { value: s.distanceA, unit: 'A' },
          epsilon: s.epsilon,
          chargeDonor: s.chargeDonor ?? 0,
          chargeAcceptor: s.chargeAcceptor ?? 0,
        };
        if (has(s.radiusDonorA) && has(s.radiusAcceptorA) && has(s.epsilonReference)) {
          inputs['radiusDonor'] = { value: s.radiusDonorA, unit: 'A' };
          inputs['radiusAcceptor'] = { value: s.radiusAcceptorA, unit: 'A' };
          inputs['epsilonReference'] = s.epsilonReference;
        }
        const answer = calculate({ method: 'drivingForce.rehmWeller', inputs });
        if (!answer.ok) {
          const labels: Record<string, string> = {
            distance: 'Ion-pair distance R',
            epsilon: 'Solvent ε_s',
            epsilonReference: 'ε of the potentials’ solvent',
            radiusDonor: 'Donor radius',
            radiusAcceptor: 'Acceptor radius',
            chargeDonor: 'Donor charge z_D',
            chargeAcceptor: 'Acceptor charge z_A',
          };
          const e = answer.errors[0];
          return fail(i, e.field, labels[e.field] ?? e.field, `— ${e.message}`);
        }
        const g = -answer.outputs.deltaG0CR;
        return {
          energy: g,
          energyEv: g,
          sigmaEv: null,
          how:
            `G = e(E_ox − E_red) + Coulomb ${answer.outputs.coulombTerm.toFixed(3)} eV` +
            ` + Born ${answer.outputs.solventCorrection.toFixed(3)} eV (Rehm–Weller with the real charges)`,
        };
      }
      case 'pair':
      case 'step': {
        const from = byId.get(s.fromState);
        if (from === undefined || from === i)
          return fail(i, 'fromState', 'Starting state', 'must name another state.');
        const base = resolve(from);
        if (!base) return null;
        let deltaEv: number;
        let sigmaEv: number | null;
        let how: string;
        if (s.mode === 'pair') {
          const dg = s.pair?.values['deltaG0'];
          if (!s.pair || !dg)
            return fail(i, 'pair', 'Pair', 'must be chosen and carry a driving force ΔG°.');
          deltaEv = dg.value;
          sigmaEv = dg.sigma;
          how = `${stateName(design.states[from])} + ΔG° of pair ${s.pair.name} (v${s.pair.version})`;
        } else {
          if (!has(s.stepDeltaG)) return fail(i, 'stepDeltaG', 'Step ΔG°', 'is required.');
          deltaEv = toEv(s.stepDeltaG, s.stepUnit);
          const sg = sigmaOf(s.sigma);
          sigmaEv = sg === null ? null : Math.abs(toEv(sg, s.stepUnit));
          how = `${stateName(design.states[from])} + step ΔG°`;
        }
        const g = base.energyEv + deltaEv;
        const combined =
          base.sigmaEv === null && sigmaEv === null
            ? null
            : Math.hypot(base.sigmaEv ?? 0, sigmaEv ?? 0);
        return { energy: g, energyEv: g, sigmaEv: combined, how };
      }
    }
  };
  return design.states.map((_, i) => resolve(i));
}

export interface ResolvedLink {
  /** The link as the network takes it. */
  readonly link: Record<string, unknown>;
  /** λ (eV) and |H_AB| (eV) as used; null for decays. */
  readonly lambdaEv: number | null;
  readonly couplingEv: number | null;
}

function linkName(design: CascadeDesign, l: LinkDesign): string {
  const name = (id: string) => {
    const s = design.states.find((x) => x.id === id);
    return s ? stateName(s) : id || '?';
  };
  return `${name(l.from)} → ${name(l.to)}`;
}

function resolveLink(
  design: CascadeDesign,
  l: LinkDesign,
  i: number,
  errors: DesignError[],
  withSigma: boolean,
): ResolvedLink | null {
  const fail = (field: string, label: string, what: string): null => {
    errors.push({
      field: `links[${i}].${field}`,
      message: `Step ${linkName(design, l)}: ${label} ${what}`,
    });
    return null;
  };
  const ids = new Set(design.states.map((s) => s.id));
  if (!ids.has(l.from)) return fail('from', 'From', 'must name a state.');
  if (!ids.has(l.to)) return fail('to', 'To', 'must name a state.');
  if (l.from === l.to) return fail('to', 'To', 'must differ from From.');
  const base = { from: l.from, to: l.to };
  if (l.type === 'rate') {
    if (!has(l.k) || l.k <= 0) return fail('k', 'Rate k', 'must be > 0 s⁻¹.');
    return {
      link: { ...base, k: quantity(l.k, 's-1', sigmaOf(l.kSigma), withSigma) },
      lambdaEv: null,
      couplingEv: null,
    };
  }
  if (l.type === 'lifetime') {
    if (!has(l.lifetime) || l.lifetime <= 0) return fail('lifetime', 'Lifetime τ', 'must be > 0.');
    return {
      link: {
        ...base,
        lifetime: quantity(l.lifetime, l.lifetimeUnit, sigmaOf(l.lifetimeSigma), withSigma),
      },
      lambdaEv: null,
      couplingEv: null,
    };
  }
  // Electron transfer: λ and |H_AB| typed, from distance decay, or from a pair.
  let lambda: unknown;
  let lambdaEv: number;
  if (l.pair?.values['lambdaTotal']) {
    const v = l.pair.values['lambdaTotal'];
    lambda = quantity(v.value, 'eV', v.sigma, withSigma);
    lambdaEv = v.value;
  } else {
    if (!has(l.lambda) || l.lambda <= 0) return fail('lambda', 'λ', 'must be > 0.');
    lambda = quantity(l.lambda, l.lambdaUnit, sigmaOf(l.lambdaSigma), withSigma);
    lambdaEv = toEv(l.lambda, l.lambdaUnit);
  }
  let coupling: unknown;
  let couplingEv: number;
  if (l.pair?.values['coupling']) {
    const v = l.pair.values['coupling'];
    coupling = quantity(v.value, 'eV', v.sigma, withSigma);
    couplingEv = v.value;
  } else if (l.couplingMode === 'decay') {
    if (!has(l.coupling0) || l.coupling0 <= 0) return fail('coupling0', '|H₀|', 'must be > 0.');
    if (!has(l.distance0A) || l.distance0A <= 0) return fail('distance0A', 'R₀', 'must be > 0 Å.');
    if (!has(l.betaPerA) || l.betaPerA < 0) return fail('betaPerA', 'β', 'must be ≥ 0 Å⁻¹.');
    if (!has(l.distanceA) || l.distanceA <= 0) return fail('distanceA', 'R', 'must be > 0 Å.');
    const answer = calculate({
      method: 'coupling.distanceDecay',
      inputs: {
        coupling0: { value: l.coupling0, unit: l.couplingUnit },
        distance0: { value: l.distance0A, unit: 'A' },
        beta: { value: l.betaPerA, unit: 'A-1' },
        distance: { value: l.distanceA, unit: 'A' },
      },
    });
    if (!answer.ok) return fail('distanceA', 'Distance decay', `— ${answer.errors[0].message}`);
    couplingEv = Math.abs(answer.outputs.coupling);
    coupling = quantity(couplingEv, 'eV', null, withSigma);
  } else {
    if (!has(l.coupling) || l.coupling === 0) return fail('coupling', '|H_AB|', 'must be > 0.');
    coupling = quantity(Math.abs(l.coupling), l.couplingUnit, sigmaOf(l.couplingSigma), withSigma);
    couplingEv = Math.abs(toEv(l.coupling, l.couplingUnit));
  }
  const link: Record<string, unknown> = { ...base, lambda, coupling };
  if (l.model === 'mlj') {
    link['model'] = 'mlj';
    link['lambdaVib'] = l.lambdaVibEv ?? 0;
    if (!has(l.hbarOmegaEv) || l.hbarOmegaEv <= 0)
      return fail('hbarOmegaEv', 'ħω', 'must be > 0 eV.');
    link['hbarOmega'] = l.hbarOmegaEv;
  }
  return { link, lambdaEv, couplingEv };
}

export interface NetworkBuild {
  /** The `kinetics.network` inputs, or null when a field is missing or wrong. */
  readonly network: Record<string, unknown> | null;
  readonly errors: DesignError[];
  readonly states: (ResolvedState | null)[];
  readonly links: (ResolvedLink | null)[];
  /** How many inputs carry a σ (Monte Carlo has something to sample). */
  readonly uncertainInputs: number;
}

/**
 * The design as a `kinetics.network` request. `withSigma` writes σ as `{ value, sigma, unit }`
 * (the inner request of `uncertainty.monteCarlo`, report 'yields'); otherwise the plain request.
 */
export function buildNetwork(design: CascadeDesign, withSigma = false): NetworkBuild {
  const errors: DesignError[] = [];
  const seen = new Set<string>();
  design.states.forEach((s, i) => {
    if (!s.id.trim())
      errors.push({ field: `states[${i}].id`, message: `State ${i + 1}: Id is required.` });
    else if (seen.has(s.id))
      errors.push({
        field: `states[${i}].id`,
        message: `State ${stateName(s)}: Id ${s.id} is used twice.`,
      });
    seen.add(s.id);
  });
  const states = resolveStates(design, errors);
  const links = design.links.map((l, i) => resolveLink(design, l, i, errors, withSigma));
  if (design.states.length < 2)
    errors.push({ field: 'states', message: 'A cascade needs at least two states.' });
  if (design.links.length < 1)
    errors.push({ field: 'links', message: 'A cascade needs at least one step.' });
  if (!(design.temperatureK > 0))
    errors.push({ field: 'temperature', message: 'Temperature must be > 0 K.' });
  let uncertain = 0;
  const networkStates = design.states.map((s, i) => {
    const r = states[i];
    let energy = r?.energy ?? 0;
    if (withSigma && r && r.sigmaEv !== null) {
      energy = { value: r.energyEv, sigma: r.sigmaEv, unit: 'eV' };
      uncertain++;
    }
    return { id: s.id, label: stateName(s), energy, kind: STATE_KINDS[s.kind].core };
  });
  for (const l of design.links) {
    for (const sg of [l.kSigma, l.lifetimeSigma, l.lambdaSigma, l.couplingSigma])
      if (sigmaOf(sg) !== null) uncertain++;
  }
  if (errors.length > 0)
    return { network: null, errors, states, links, uncertainInputs: uncertain };
  const network: Record<string, unknown> = {
    states: networkStates,
    links: links.map((l) => l!.link),
    temperature: design.temperatureK,
  };
  if (design.initial) network['initial'] = design.initial;
  if (withSigma) network['report'] = 'yields';
  return { network, errors, states, links, uncertainInputs: uncertain };
}

/**
 * A design from a bare network (a cascade written through the API or seeded): energies typed as
 * stored (nm → E₀₀), decays as rates or lifetimes, ET steps with their λ and |H_AB|. Kinds: an
 * excited state whose id or label says triplet is a triplet; a charge-separated state that passes
 * its electron on to another charge-separated state is an intermediate, else final.
 */
export function designFromNetwork(network: Record<string, unknown>): CascadeDesign {
  type Q = number | { value: number; unit?: string };
  const num = (q: Q | undefined): [number | null, string | null] =>
    q === undefined ? [null, null] : typeof q === 'number' ? [q, null] : [q.value, q.unit ?? null];
  const rawStates = (network['states'] ?? []) as {
    id: string;
    label?: string;
    energy: Q;
    kind?: string;
  }[];
  const rawLinks = (network['links'] ?? []) as Record<string, unknown>[];
  const kindOf = new Map(rawStates.map((s) => [s.id, s.kind ?? 'other']));
  const states = rawStates.map((s) => {
    let kind: StateKind = 'product';
    if (s.kind === 'ground') kind = 'ground';
    else if (s.kind === 'excited')
      kind = /triplet|^T\d|³/i.test(`${s.id} ${s.label ?? ''}`) ? 'triplet' : 'singlet';
    else if (s.kind === 'chargeSeparated')
      kind = rawLinks.some(
        (l) =>
          l['from'] === s.id && 'lambda' in l && kindOf.get(String(l['to'])) === 'chargeSeparated',
      )
        ? 'csIntermediate'
        : 'csFinal';
    const d = newState(s.id, kind);
    d.label = s.label ?? '';
    const [value, unit] = num(s.energy);
    if (kind === 'singlet' || kind === 'triplet') {
      d.mode = 'e00';
      d.e00 = value;
      d.e00Unit = unit === 'nm' ? 'nm' : 'eV';
      if (unit && unit !== 'nm' && unit !== 'eV') {
        d.mode = 'typed';
        d.energy = value;
        d.energyUnit = unit;
      }
    } else {
      d.mode = 'typed';
      d.energy = value;
      d.energyUnit = unit ?? 'eV';
    }
    return d;
  });
  const links = rawLinks.map((l) => {
    const from = String(l['from'] ?? '');
    const to = String(l['to'] ?? '');
    if ('k' in l) {
      const d = newLink(from, to, 'rate');
      d.k = num(l['k'] as Q)[0];
      return d;
    }
    if ('lifetime' in l) {
      const d = newLink(from, to, 'lifetime');
      const [v, u] = num(l['lifetime'] as Q);
      d.lifetime = v;
      d.lifetimeUnit = u ?? 's';
      return d;
    }
    const d = newLink(from, to, 'et');
    const [lv, lu] = num(l['lambda'] as Q);
    d.lambda = lv;
    d.lambdaUnit = lu ?? 'eV';
    const [cv, cu] = num(l['coupling'] as Q);
    d.coupling = cv;
    d.couplingUnit = cu ?? 'eV';
    if (l['model'] === 'mlj') {
      d.model = 'mlj';
      d.lambdaVibEv = num(l['lambdaVib'] as Q)[0];
      d.hbarOmegaEv = num(l['hbarOmega'] as Q)[0];
    }
    return d;
  });
  const t = network['temperature'];
  return {
    states,
    links,
    temperatureK: typeof t === 'number' ? t : 298.15,
    initial: typeof network['initial'] === 'string' ? network['initial'] : '',
  };
}

/** A stored design read back (missing fields filled from the defaults, so old designs load). */
export function readDesign(stored: unknown, network: Record<string, unknown>): CascadeDesign {
  const d = stored as Partial<CascadeDesign> | null;
  if (!d || !Array.isArray(d.states) || !Array.isArray(d.links)) return designFromNetwork(network);
  return {
    states: d.states.map((s) => ({ ...newState(s.id ?? '', s.kind ?? 'product'), ...s })),
    links: d.links.map((l) => ({ ...newLink(), ...l })),
    temperatureK: typeof d.temperatureK === 'number' ? d.temperatureK : 298.15,
    initial: typeof d.initial === 'string' ? d.initial : '',
  };
}
