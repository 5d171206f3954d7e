/**
 * Computes one chunk of a screen. Per row, the driving forces of charge separation and of
 * recombination come from `drivingForce.rehmWeller`, λ_outer (when not given) from
 * `reorg.twoSphere` and |H_AB| (when not given) from `coupling.distanceDecay`, all through the
 * core's `calculate` so the numbers equal those of the pair page and the command line. Rates for
 * the whole chunk then go through the core's vector paths over Float64Arrays (no per-pair
 * allocation): classical Marcus for every row, MLJ where ħω is given (λ_inner as the quantum
 * mode's λ_v, λ_outer as the classical λ_s; SCIENCE.md §2).
 */
import {
  BOLTZMANN_EV_PER_K,
  calculate,
  marcusLog10kInto,
  mljLog10kInto,
  type CalcAnswer,
} from '@gapwise/calc';
import type { InputChunk } from './screen-parser';
import { scoreRow, type ScoreChoice } from './screen-score';

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
] as const;
export type ScreenWarning = (typeof SCREEN_WARNINGS)[number];
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
  for (const w of answer.warnings) mask |= BIT.get(w.code) ?? bit('other');
  return mask;
}

function regimeOf(deltaG: number, lambda: number): number {
  if (Math.abs(deltaG + lambda) <= 0.01 * lambda) return 1;
  return -deltaG < lambda ? 0 : 2;
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

  for (let i = 0; i < n; i++) {
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
      if (ts.ok) lambdaOuter = ts.outputs.lambdaOuter as number;
      else refused = true;
    }
    let coupling = v.coupling[i];
    if (Number.isNaN(coupling)) {
      const dd = calculate({
        method: 'coupling.distanceDecay',
        inputs: { coupling0: v.coupling0[i], distance0: v.distance0[i], beta: v.beta[i], distance: v.distance[i] },
      });
      mask |= collectWarnings(dd);
      if (dd.ok) coupling = dd.outputs.coupling as number;
      else refused = true;
    }
    coupling = Math.abs(coupling);
    const lambdaInner = v.lambdaInner[i];
    const lambda = lambdaInner + lambdaOuter;
    const temperature = v.temperature[i];
    out.lambdaInner[i] = lambdaInner;
    out.lambdaOuter[i] = lambdaOuter;
    out.lambdaTotal[i] = lambda;
    out.coupling[i] = coupling;
    out.temperature[i] = temperature;
    if (rw.ok) {
      out.deltaGCs[i] = rw.outputs.deltaG0CS as number;
      out.deltaGCr[i] = rw.outputs.deltaG0CR as number;
    }
    if (refused) {
      mask |= bit('row-refused');
    } else if (!(lambda > 0) || 2 * coupling >= lambda) {
      mask |= bit('coupling-delocalized');
    } else {
      valid[i] = 1;
      const kT = BOLTZMANN_EV_PER_K * temperature;
      const dCs = out.deltaGCs[i];
      const dCr = out.deltaGCr[i];
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

  // Vector paths: per row, CS and CR share λ, H and T, so one call over a reused two-slot
  // Float64Array gives both (no allocation per pair).
  const dg = new Float64Array(2);
  const res = new Float64Array(2);
  const terms = new Float64Array(2);
  const mljNotConverged = bit('other');
  for (let i = 0; i < n; i++) {
    if (!valid[i]) continue;
    dg[0] = out.deltaGCs[i];
    dg[1] = out.deltaGCr[i];
    const h = out.coupling[i];
    const t = out.temperature[i];
    marcusLog10kInto(res, dg, out.lambdaTotal[i], h, t);
    out.log10kCsMarcus[i] = res[0];
    out.log10kCrMarcus[i] = res[1];
    // MLJ needs ħω and a classical part λ_s = λ_outer > 0 (VALIDATION.md A1, A6).
    const hbarOmega = v.hbarOmega[i];
    if (!Number.isNaN(hbarOmega) && out.lambdaOuter[i] > 0) {
      mljLog10kInto(res, dg, out.lambdaOuter[i], out.lambdaInner[i], hbarOmega, h, t, terms);
      out.log10kCsMlj[i] = res[0];
      out.log10kCrMlj[i] = res[1];
      if (!Number.isFinite(res[0]) || !Number.isFinite(res[1])) out.warningMask[i] |= mljNotConverged;
    }
  }

  const under = bit('rate-underflow');
  for (let i = 0; i < n; i++) {
    if (!valid[i]) continue;
    const cs = Number.isNaN(out.log10kCsMlj[i]) ? out.log10kCsMarcus[i] : out.log10kCsMlj[i];
    const cr = Number.isNaN(out.log10kCrMlj[i]) ? out.log10kCrMarcus[i] : out.log10kCrMlj[i];
    if (out.log10kCsMarcus[i] < -300 || out.log10kCrMarcus[i] < -300) out.warningMask[i] |= under;
    if (Number.isFinite(cs) && Number.isFinite(cr)) {
      out.score[i] = scoreRow(score, out.deltaGCs[i], out.deltaGCr[i], out.lambdaTotal[i], cs, cr);
    }
  }
  return out;
}
