/**
 * Computes one chunk of a screen. Per row, the driving forces of charge separation and of
 * recombination (Rehm–Weller), λ_outer when not given (two-sphere) and |H_AB| when not given
 * (distance decay) come from the core's exported kernels after a cheap domain check, with the
 * warnings of the core's methods; a row outside that domain goes through the core's `calculate`
 * (`drivingForce.rehmWeller`, `reorg.twoSphere`, `coupling.distanceDecay`) so its refusal and
 * warnings are the dispatcher's own. A test holds the two paths equal. Rates for the whole chunk
 * then go through the core's per-pair vector paths in one call each: classical Marcus for every
 * row, MLJ where ħω is given (λ_inner as the quantum mode's λ_v, λ_outer as the classical λ_s;
 * SCIENCE.md §2). The core's reference-electrode advice is not carried per row: the template asks
 * for both potentials against one reference.
 */
import {
  BOLTZMANN_EV_PER_K,
  calculate,
  distanceDecayCouplingEv,
  ionPairCoulombTermEv,
  marcusLog10kIntoArrays,
  mljLog10kIntoArrays,
  pekarFactor,
  rehmWellerChargeRecombinationEv,
  rehmWellerChargeSeparationEv,
  twoSphereLambdaEv,
  bornSolventCorrectionEv,
  type CalcAnswer,
} from '@gapwise/calc';
import { lambdaTotalOfPartsEv, regimeOf as regimeOfPair } from '@gapwise/contracts';
import type { InputChunk } from './screen-parser';
import {
  DEFAULT_ASSUMED_HBAR_OMEGA_EV,
  scoreRow,
  stepModel,
  type ScoreChoice,
} from './screen-score';

/** Regime codes stored per row (CALC-API.md "regime"). */
export const REGIMES = ['normal', 'activationless', 'inverted'] as const;
export type Regime = (typeof REGIMES)[number];

/**
 * Warning codes a row can carry, one bit each (bit i = 1 << i). Codes shared with the core keep
 * the core's names (VALIDATION.md part B numbers in comments).
 */
export const SCREEN_WARNINGS = [
  'inverted-region', // B1, charge separation classical rate in the inverted region
  'rate-underflow', // B2
  'lambda-below-kt', // B3
  'coupling-large', // B4 |H_AB| > k_BT
  'coupling-barrier-lowering', // B5 |H_AB| > λ/10
  'low-frequency-mode', // B6 ħω < 4 k_BT
  'temperature-range', // B8
  'value-unusually-large', // B9
  'nearly-nonpolar', // B12 (from reorg.twoSphere)
  'continuum-range', // B13 (from reorg.twoSphere)
  'born-correction-large', // B14 (from drivingForce.rehmWeller)
  'excitation-energy-suspect', // B16 (from drivingForce.rehmWeller)
  'coupling-zero', // H = 0 gives k = 0
  'coupling-delocalized', // A5 2|H_AB| ≥ λ: no diabatic rate, rates left empty
  'row-refused', // a derivation refused the row; rates left empty
  'other', // any other warning code of the core
  'assumed-hbar-omega', // the score ranked an inverted step with MLJ at an assumed ħω
] as const;
export type ScreenWarning = (typeof SCREEN_WARNINGS)[number];
/** Core warnings a screen does not carry (the template asks for one reference electrode). */
const IGNORED_WARNINGS = new Set(['reference-electrode']);
const BIT = new Map<string, number>(SCREEN_WARNINGS.map((code, i) => [code, 1 << i]));
const bit = (code: ScreenWarning) => BIT.get(code)!;

export function warningCodes(mask: number): ScreenWarning[] {
  return SCREEN_WARNINGS.filter((_, i) => (mask & (1 << i)) !== 0);
}
export function warningBit(code: string): number | undefined {
  return BIT.get(code);
}

/** Results of one chunk, columnar; NaN = empty. */
export interface ChunkResult {
  readonly size: number;
  readonly lines: number[];
  readonly donor: string[];
  readonly acceptor: string[];
  readonly solvent: string[];
  readonly deltaGCs: Float64Array;
  readonly deltaGCr: Float64Array;
  readonly lambdaInner: Float64Array;
  readonly lambdaOuter: Float64Array;
  readonly lambdaTotal: Float64Array;
  readonly coupling: Float64Array;
  readonly temperature: Float64Array;
  readonly log10kCsMarcus: Float64Array;
  readonly log10kCrMarcus: Float64Array;
  readonly log10kCsMlj: Float64Array;
  readonly log10kCrMlj: Float64Array;
  readonly regimeCs: Uint8Array;
  readonly regimeCr: Uint8Array;
  readonly warningMask: Int32Array;
  readonly score: Float64Array;
}

function collectWarnings(answer: CalcAnswer): number {
  if (!answer.ok) return 0;
  let mask = 0;
  for (const w of answer.warnings) {
    if (!IGNORED_WARNINGS.has(w.code)) mask |= BIT.get(w.code) ?? bit('other');
  }
  return mask;
}

/** Index in REGIMES of the pair model's regime rule (the core's `marcusRegime`); λ > 0 here. */
function regimeOf(deltaG: number, lambda: number): number {
  return REGIMES.indexOf(regimeOfPair(deltaG, lambda) as (typeof REGIMES)[number]);
}

/**
 * Derivations of one row through the core's `calculate` (validation with the full list of
 * problems, warnings by code): the reference path, used for rows outside the fast path's domain.
 */
export function deriveThroughCalculate(
  v: InputChunk['values'],
  i: number,
): {
  dCs: number;
  dCr: number;
  lambdaOuter: number;
  coupling: number;
  mask: number;
  refused: boolean;
} {
  let mask = 0;
  // The Weller solvent correction takes the radii and ε_ref together (only when ε_ref is given).
  const weller = !Number.isNaN(v.epsilonReference[i]);
  const rw = calculate({
    method: 'drivingForce.rehmWeller',
    inputs: {
      donorOxidation: v.donorOxidation[i],
      acceptorReduction: v.acceptorReduction[i],
      excitationEnergy: v.excitationEnergy[i],
      distance: v.distance[i],
      epsilon: v.epsilon[i],
      radiusDonor: weller ? v.radiusDonor[i] : undefined,
      radiusAcceptor: weller ? v.radiusAcceptor[i] : undefined,
      epsilonReference: weller ? v.epsilonReference[i] : undefined,
      chargeDonor: Number.isNaN(v.chargeDonor[i]) ? undefined : v.chargeDonor[i],
      chargeAcceptor: Number.isNaN(v.chargeAcceptor[i]) ? undefined : v.chargeAcceptor[i],
    },
  });
  mask |= collectWarnings(rw);
  let lambdaOuter = v.lambdaOuter[i];
  let refused = !rw.ok;
  if (Number.isNaN(lambdaOuter)) {
    const ts = calculate({
      method: 'reorg.twoSphere',
      inputs: {
        radiusDonor: v.radiusDonor[i],
        radiusAcceptor: v.radiusAcceptor[i],
        distance: v.distance[i],
        epsilon: v.epsilon[i],
        refractiveIndex: v.refractiveIndex[i],
      },
    });
    mask |= collectWarnings(ts);
    if (ts.ok) lambdaOuter = ts.outputs.lambdaOuter;
    else refused = true;
  }
  let coupling = v.coupling[i];
  if (Number.isNaN(coupling)) {
    const dd = calculate({
      method: 'coupling.distanceDecay',
      inputs: {
        coupling0: v.coupling0[i],
        distance0: v.distance0[i],
        beta: v.beta[i],
        distance: v.distance[i],
      },
    });
    mask |= collectWarnings(dd);
    if (dd.ok) coupling = dd.outputs.coupling;
    else refused = true;
  }
  return {
    dCs: rw.ok ? rw.outputs.deltaG0CS : Number.NaN,
    dCr: rw.ok ? rw.outputs.deltaG0CR : Number.NaN,
    lambdaOuter,
    coupling,
    mask,
    refused,
  };
}

const finite = Number.isFinite;

/**
 * The same derivations through the core's exported kernels (Rehm–Weller with the ion-pair
 * Coulomb term and Weller's correction, two-sphere λ_outer, distance decay), with the warnings of
 * the dispatcher's `compute`, for a row whose inputs pass a cheap domain check (the conditions
 * under which the dispatcher's validation accepts them). Returns false, writing nothing, for any
 * other row: that row takes `deriveThroughCalculate`, so refusals keep their messages.
 */
export function deriveFast(v: InputChunk['values'], i: number, into: Float64Array): boolean {
  const eox = v.donorOxidation[i];
  const ered = v.acceptorReduction[i];
  const e00 = v.excitationEnergy[i];
  const r = v.distance[i];
  const eps = v.epsilon[i];
  const epsRef = v.epsilonReference[i];
  const rD = v.radiusDonor[i];
  const rA = v.radiusAcceptor[i];
  if (!(finite(eox) && finite(ered) && Math.abs(eox) <= 100 && Math.abs(ered) <= 100)) return false;
  if (!(e00 > 0 && e00 <= 1e3 && r > 0 && finite(r) && eps >= 1 && finite(eps))) return false;
  // Charges default to 0 (neutral D and A); a non-integer charge takes the core's refusal.
  const zD = Number.isNaN(v.chargeDonor[i]) ? 0 : v.chargeDonor[i];
  const zA = Number.isNaN(v.chargeAcceptor[i]) ? 0 : v.chargeAcceptor[i];
  if (!(Number.isInteger(zD) && Number.isInteger(zA) && Math.abs(zD) <= 10 && Math.abs(zA) <= 10))
    return false;
  const weller = !Number.isNaN(epsRef);
  if (weller && !(rD > 0 && rA > 0 && finite(rD) && finite(rA) && epsRef >= 1 && finite(epsRef)))
    return false;
  let lambdaOuter = v.lambdaOuter[i];
  let mask = 0;
  if (Number.isNaN(lambdaOuter)) {
    const n = v.refractiveIndex[i];
    if (!(rD > 0 && rA > 0 && finite(rD) && finite(rA) && n >= 1 && finite(n) && r >= rD + rA))
      return false;
    const pekar = pekarFactor(n, eps);
    if (!(pekar >= 0)) return false;
    if (pekar < 0.05) mask |= bit('nearly-nonpolar');
    if (r > 30 || rD < 1.5 || rA < 1.5) mask |= bit('continuum-range');
    lambdaOuter = twoSphereLambdaEv(rD, rA, r, eps, n);
  }
  let coupling = v.coupling[i];
  if (Number.isNaN(coupling)) {
    const h0 = v.coupling0[i];
    const r0 = v.distance0[i];
    const beta = v.beta[i];
    if (!(finite(h0) && Math.abs(h0) <= 1e5 && r0 > 0 && r0 <= 1e4 && beta >= 0 && beta <= 100))
      return false;
    if (!(r <= 1e4 && (beta * (r - r0)) / 2 >= -600)) return false;
    if (Math.abs(h0) > 0.5) mask |= bit('value-unusually-large');
    if (Math.abs(h0) > 10) mask |= bit('other'); // the core's coupling-unit-suspect
    coupling = distanceDecayCouplingEv(h0, r0, beta, r);
  }
  const correction = weller ? bornSolventCorrectionEv(rD, rA, epsRef, eps, zD, zA) : 0;
  const dCs = rehmWellerChargeSeparationEv(
    eox,
    ered,
    e00,
    ionPairCoulombTermEv(eps, r, zD, zA),
    correction,
  );
  if (Math.abs(correction) > 0.5) mask |= bit('born-correction-large');
  if (e00 < Math.abs(eox - ered) - 1 || e00 > 5) mask |= bit('excitation-energy-suspect');
  into[0] = dCs;
  into[1] = rehmWellerChargeRecombinationEv(dCs, e00);
  into[2] = lambdaOuter;
  into[3] = coupling;
  into[4] = mask;
  return true;
}

/** Computes a chunk. Pure: same input, same output. */
export function computeChunk(input: InputChunk, score: ScoreChoice): ChunkResult {
  const n = input.lines.length;
  const v = input.values;
  const f = () => new Float64Array(n).fill(Number.NaN);
  const out: ChunkResult = {
    size: n,
    lines: input.lines,
    donor: input.donor,
    acceptor: input.acceptor,
    solvent: input.solvent,
    deltaGCs: f(),
    deltaGCr: f(),
    lambdaInner: f(),
    lambdaOuter: f(),
    lambdaTotal: f(),
    coupling: f(),
    temperature: f(),
    log10kCsMarcus: f(),
    log10kCrMarcus: f(),
    log10kCsMlj: f(),
    log10kCrMlj: f(),
    regimeCs: new Uint8Array(n),
    regimeCr: new Uint8Array(n),
    warningMask: new Int32Array(n),
    score: f(),
  };
  // Rows whose rates can be computed; refused ones keep NaN rates.
  const valid = new Uint8Array(n);
  const derived = new Float64Array(5);

  for (let i = 0; i < n; i++) {
    let mask: number;
    let refused = false;
    let dCs: number;
    let dCr: number;
    let lambdaOuter: number;
    let coupling: number;
    if (deriveFast(v, i, derived)) {
      [dCs, dCr, lambdaOuter, coupling, mask] = derived;
    } else {
      const slow = deriveThroughCalculate(v, i);
      ({ dCs, dCr, lambdaOuter, coupling, mask, refused } = slow);
    }
    coupling = Math.abs(coupling);
    const lambdaInner = v.lambdaInner[i];
    const lambda = lambdaTotalOfPartsEv(lambdaInner, lambdaOuter);
    const temperature = v.temperature[i];
    out.lambdaInner[i] = lambdaInner;
    out.lambdaOuter[i] = lambdaOuter;
    out.lambdaTotal[i] = lambda;
    out.coupling[i] = coupling;
    out.temperature[i] = temperature;
    out.deltaGCs[i] = dCs;
    out.deltaGCr[i] = dCr;
    if (refused) {
      mask |= bit('row-refused');
    } else if (!(lambda > 0) || 2 * coupling >= lambda) {
      mask |= bit('coupling-delocalized');
    } else {
      valid[i] = 1;
      const kT = BOLTZMANN_EV_PER_K * temperature;
      out.regimeCs[i] = regimeOf(dCs, lambda);
      out.regimeCr[i] = regimeOf(dCr, lambda);
      if (out.regimeCs[i] === 2) mask |= bit('inverted-region');
      if (lambda < kT) mask |= bit('lambda-below-kt');
      if (coupling > kT) mask |= bit('coupling-large');
      if (coupling > lambda / 10) mask |= bit('coupling-barrier-lowering');
      if (coupling === 0) mask |= bit('coupling-zero');
      if (v.hbarOmega[i] < 4 * kT) mask |= bit('low-frequency-mode');
      if (temperature < 150 || temperature > 500) mask |= bit('temperature-range');
      if (lambda > 3 || Math.abs(dCs) > 4 || Math.abs(dCr) > 4 || coupling > 0.5) {
        mask |= bit('value-unusually-large');
      }
    }
    out.warningMask[i] = mask;
  }

  // Rates of the whole chunk through the core's per-pair vector paths: one call each for
  // classical Marcus CS and CR over every row, then MLJ over the rows with ħω and λ_outer > 0
  // (λ_inner as the mode's λ_v, λ_outer as the classical λ_s; VALIDATION.md A1, A6).
  marcusLog10kIntoArrays(
    out.log10kCsMarcus,
    out.deltaGCs,
    out.lambdaTotal,
    out.coupling,
    out.temperature,
  );
  marcusLog10kIntoArrays(
    out.log10kCrMarcus,
    out.deltaGCr,
    out.lambdaTotal,
    out.coupling,
    out.temperature,
  );
  const mljRows: number[] = [];
  for (let i = 0; i < n; i++) {
    if (!valid[i]) {
      out.log10kCsMarcus[i] = Number.NaN;
      out.log10kCrMarcus[i] = Number.NaN;
    } else if (!Number.isNaN(v.hbarOmega[i]) && out.lambdaOuter[i] > 0) {
      mljRows.push(i);
    }
  }
  if (mljRows.length) {
    const m = mljRows.length;
    const pick = (a: Float64Array) => Float64Array.from(mljRows, (i) => a[i]);
    const lamS = pick(out.lambdaOuter);
    const lamV = pick(out.lambdaInner);
    const hw = pick(v.hbarOmega);
    const h = pick(out.coupling);
    const t = pick(out.temperature);
    const cs = new Float64Array(m);
    const cr = new Float64Array(m);
    mljLog10kIntoArrays(cs, pick(out.deltaGCs), lamS, lamV, hw, h, t);
    mljLog10kIntoArrays(cr, pick(out.deltaGCr), lamS, lamV, hw, h, t);
    const mljNotConverged = bit('other');
    for (let j = 0; j < m; j++) {
      const i = mljRows[j];
      out.log10kCsMlj[i] = cs[j];
      out.log10kCrMlj[i] = cr[j];
      if (!Number.isFinite(cs[j]) || !Number.isFinite(cr[j])) out.warningMask[i] |= mljNotConverged;
    }
  }

  // Steps in the inverted region of rows without ħω: MLJ at the assumed ħω, for the score only
  // (the MLJ columns keep what the row's own inputs give). See screen-score.ts for why.
  const assumedHbarOmega = score.assumedHbarOmegaEv ?? DEFAULT_ASSUMED_HBAR_OMEGA_EV;
  const assumedCs = new Float64Array(n).fill(Number.NaN);
  const assumedCr = new Float64Array(n).fill(Number.NaN);
  const assumedRows: number[] = [];
  for (let i = 0; i < n; i++) {
    if (!valid[i] || !Number.isNaN(v.hbarOmega[i]) || !(out.lambdaOuter[i] > 0)) continue;
    const lambda = out.lambdaTotal[i];
    if (
      stepModel(false, out.deltaGCs[i], lambda) === 'mlj-assumed-hbar-omega' ||
      stepModel(false, out.deltaGCr[i], lambda) === 'mlj-assumed-hbar-omega'
    ) {
      assumedRows.push(i);
    }
  }
  if (assumedRows.length) {
    const m = assumedRows.length;
    const pick = (a: Float64Array) => Float64Array.from(assumedRows, (i) => a[i]);
    const lamS = pick(out.lambdaOuter);
    const lamV = pick(out.lambdaInner);
    const hw = new Float64Array(m).fill(assumedHbarOmega);
    const h = pick(out.coupling);
    const t = pick(out.temperature);
    const cs = new Float64Array(m);
    const cr = new Float64Array(m);
    mljLog10kIntoArrays(cs, pick(out.deltaGCs), lamS, lamV, hw, h, t);
    mljLog10kIntoArrays(cr, pick(out.deltaGCr), lamS, lamV, hw, h, t);
    for (let j = 0; j < m; j++) {
      assumedCs[assumedRows[j]] = cs[j];
      assumedCr[assumedRows[j]] = cr[j];
    }
  }

  const under = bit('rate-underflow');
  const assumed = bit('assumed-hbar-omega');
  for (let i = 0; i < n; i++) {
    if (!valid[i]) continue;
    const given = !Number.isNaN(out.log10kCsMlj[i]);
    const rate = (deltaG: number, mlj: number, marcus: number, assumedMlj: number): number => {
      const model = stepModel(given, deltaG, out.lambdaTotal[i]);
      if (model === 'mlj') return mlj;
      if (model === 'mlj-assumed-hbar-omega' && Number.isFinite(assumedMlj)) {
        out.warningMask[i] |= assumed;
        return assumedMlj;
      }
      return marcus;
    };
    const cs = rate(out.deltaGCs[i], out.log10kCsMlj[i], out.log10kCsMarcus[i], assumedCs[i]);
    const cr = rate(out.deltaGCr[i], out.log10kCrMlj[i], out.log10kCrMarcus[i], assumedCr[i]);
    if (out.log10kCsMarcus[i] < -300 || out.log10kCrMarcus[i] < -300) out.warningMask[i] |= under;
    if (Number.isFinite(cs) && Number.isFinite(cr)) {
      out.score[i] = scoreRow(score, out.deltaGCs[i], out.deltaGCr[i], out.lambdaTotal[i], cs, cr);
    }
  }
  return out;
}
