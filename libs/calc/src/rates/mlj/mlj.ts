/**
 * `rate.mlj`: Marcus–Levich–Jortner rate with one quantum mode in its ground level and a
 * classical solvent (SCIENCE.md §2).
 */
import { BOLTZMANN_EV_PER_K } from '../../core/constants';
import type { MethodDefinition } from '../../core/method';
import {
  noteCouplingSign,
  warnBarrierLowering,
  warnCouplingMagnitude,
  warnEnergyMagnitude,
  warnLambdaBelowKt,
  warnTemperatureRange,
  WARNING_CODES,
} from '../../core/warnings';
import { adiabaticityMeasures, warnAdiabaticity } from '../coupling-regime';
import { COUPLING_REGIME_OUTPUT, LN_TWO_PI_OVER_HBAR } from '../marcus/marcus';
import {
  LAMBDA_MESSAGE,
  MAX_ENERGY_EV,
  marcusRegime,
  readEnergy,
  readLambda,
  readTemperature,
  refuseClassIII,
} from '../rate-inputs';
import { reportRate } from '../rate-log';
import { mljTermSum, mljTermSumSlot } from './mlj-term-sum';

/** Terms summed past max(S, n*) before the tolerance test may stop the sum (SCIENCE.md §2). */
export const MLJ_MIN_EXTRA_TERMS = 5;
/** Hard cap on the number of terms; reaching it is reported as non-convergence (B7). */
export const MLJ_MAX_TERMS = 1_000_000;

/**
 * Work limit: the most vibronic terms one MLJ rate may need. A request needing more is refused in
 * read(), naming ħω (a refusal, not a silent cap). 100 000 terms take about 7 ms of one CPU
 * (measured, Node 20, warm), so a single rate stays fast; S = λ_v/ħω beyond that means a mode so
 * soft next to λ_v that the thermal or classical form describes it better anyway.
 */
export const MLJ_TERMS_LIMIT = 100_000;

/**
 * Terms the MLJ sum of `mljRateLog` is expected to need: max(S, n*) + 5 (SCIENCE.md §2) plus the
 * Poisson tail past the larger of the two, where terms fall below 1e-15 of the sum about 8.3
 * standard deviations √S out (Gaussian limit of the Poisson weights, exp(−z²/2) = 1e-15).
 */
export function mljTermsEstimate(
  deltaG0Ev: number,
  lambdaSolventEv: number,
  lambdaVibEv: number,
  hbarOmegaEv: number,
): number {
  const huangRhys = lambdaVibEv / hbarOmegaEv;
  return (
    mljMinimumTerms(deltaG0Ev, lambdaSolventEv, huangRhys, hbarOmegaEv) +
    Math.ceil(8.3 * Math.sqrt(huangRhys))
  );
}

/** The refusal of a request whose MLJ sum would need more than `limit` terms (field ħω). */
export function mljTermsMessage(terms: number, huangRhys: number, limit: number): string {
  return (
    `The MLJ sum would need about ${formatCount(terms)} vibronic terms ` +
    `(S = λ_v/ħω = ${huangRhys.toPrecision(3)}), more than the limit of ${formatCount(limit)}: ` +
    'use a larger ħω or a smaller λ_v, or the thermal MLJ or classical Marcus form.'
  );
}

function formatCount(n: number): string {
  return n < 1e7 ? Math.round(n).toLocaleString('en-US') : n.toPrecision(3);
}

export interface MljSum {
  /** ln k, k in s⁻¹ (−∞ when H_AB = 0). */
  readonly lnK: number;
  /** Vibronic terms n = 0 … termsUsed − 1 that were summed. */
  readonly termsUsed: number;
  readonly converged: boolean;
}

/**
 * Index after which the MLJ sum may stop: max(S, n*) + 5 with n* = −(ΔG° + λ_s)/ħω, the term
 * where the Gaussian factor peaks (SCIENCE.md §2).
 */
export function mljMinimumTerms(
  deltaG0Ev: number,
  lambdaSolventEv: number,
  huangRhys: number,
  hbarOmegaEv: number,
): number {
  const nStar = Math.max(0, -(deltaG0Ev + lambdaSolventEv) / hbarOmegaEv);
  return Math.ceil(Math.max(huangRhys, nStar)) + MLJ_MIN_EXTRA_TERMS;
}

/**
 * ln k of the Marcus–Levich–Jortner rate (T = 0 form for the quantum mode):
 * k = (2π/ħ)|H|² (4πλ_s k_BT)^(−1/2) Σ_n e^(−S) Sⁿ/n! exp[−(ΔG° + λ_s + nħω)²/(4λ_s k_BT)],
 * S = λ_v/ħω, summed by `mljTermSum` (Poisson log-weights by recurrence; past max(S, n*) + 5,
 * then until a term is below 1e-15 of the running sum; log-sum-exp, so it never underflows).
 * S = 0 gives exactly the classical Marcus rate with λ_s.
 *
 * Notes: valid for ħω ≳ 4k_BT (only v = 0 of the mode populated); the prefactor and the Gaussian
 * contain λ_s only.
 * References: J. Ulstrup, J. Jortner, J. Chem. Phys. 1975, 63, 4358 (doi 10.1063/1.431152);
 * J. Jortner, J. Chem. Phys. 1976, 64, 4860 (doi 10.1063/1.432142); P. F. Barbara, T. J. Meyer,
 * M. A. Ratner, J. Phys. Chem. 1996, 100, 13148 (doi 10.1021/jp9605663).
 */
export function mljRateLog(
  deltaG0Ev: number,
  lambdaSolventEv: number,
  lambdaVibEv: number,
  hbarOmegaEv: number,
  couplingEv: number,
  temperatureK: number,
  maxTerms = MLJ_MAX_TERMS,
): MljSum {
  const widthEv = 4 * lambdaSolventEv * BOLTZMANN_EV_PER_K * temperatureK;
  const lnPrefactor =
    LN_TWO_PI_OVER_HBAR + 2 * Math.log(Math.abs(couplingEv)) - 0.5 * Math.log(Math.PI * widthEv);
  const huangRhys = lambdaVibEv / hbarOmegaEv;
  const offsetEv = deltaG0Ev + lambdaSolventEv;
  if (huangRhys === 0) {
    // Only n = 0 carries weight (0⁰ = 1): classical Marcus with λ_s.
    return { lnK: lnPrefactor - (offsetEv * offsetEv) / widthEv, termsUsed: 1, converged: true };
  }
  const minTerms = mljMinimumTerms(deltaG0Ev, lambdaSolventEv, huangRhys, hbarOmegaEv);
  const { lnK, termsUsed, converged } = mljTermSum(
    mljTermSumSlot(),
    lnPrefactor,
    offsetEv,
    hbarOmegaEv,
    huangRhys,
    1 / widthEv,
    minTerms,
    maxTerms,
  );
  return { lnK, termsUsed, converged };
}

export interface MljInputs {
  readonly deltaG0Ev: number;
  readonly lambdaSolventEv: number;
  readonly lambdaVibEv: number;
  readonly hbarOmegaEv: number;
  readonly couplingEv: number;
  readonly temperatureK: number;
  readonly units: Readonly<Record<'deltaG0' | 'lambdaSolvent' | 'lambdaVib' | 'coupling', string>>;
}

export const mljMethod = {
  id: 'rate.mlj',
  summary: 'Marcus–Levich–Jortner rate: one quantum mode (ground level) plus a classical solvent.',
  references: [
    'J. Ulstrup, J. Jortner, J. Chem. Phys. 1975, 63, 4358; doi 10.1063/1.431152',
    'J. Jortner, J. Chem. Phys. 1976, 64, 4860; doi 10.1063/1.432142',
    'P. F. Barbara, T. J. Meyer, M. A. Ratner, J. Phys. Chem. 1996, 100, 13148; doi 10.1021/jp9605663',
  ],
  inputs: [
    {
      name: 'deltaG0',
      quantity: 'energy',
      required: true,
      description: 'Standard free-energy change ΔG°.',
    },
    {
      name: 'lambdaSolvent',
      quantity: 'energy',
      required: true,
      label: 'Classical reorganization energy λ_s',
      description: 'Classical (solvent, low-frequency) reorganization energy λ_s (> 0).',
    },
    {
      name: 'lambdaVib',
      quantity: 'energy',
      required: true,
      description: 'Inner-sphere high-frequency reorganization energy λ_v (≥ 0).',
    },
    {
      name: 'hbarOmega',
      quantity: 'energy',
      required: true,
      description: 'Effective quantum mode energy ħω (> 0).',
    },
    {
      name: 'coupling',
      quantity: 'energy',
      required: true,
      description: 'Diabatic coupling H_AB (either sign).',
    },
    {
      name: 'temperature',
      quantity: 'temperature',
      required: true,
      description: 'Absolute temperature.',
    },
  ],
  outputs: [
    {
      name: 'k',
      unit: 's-1',
      description: 'Rate constant (0 when below 1e-300 or when H_AB = 0).',
    },
    { name: 'log10k', unit: '', description: 'log10 of k in s⁻¹ (null when H_AB = 0).' },
    { name: 'huangRhys', unit: '', description: 'Huang–Rhys factor S = λ_v/ħω.' },
    { name: 'termsUsed', unit: '', description: 'Vibronic terms summed until converged.' },
    { name: 'regime', unit: '', description: 'Regime by the CALC-API rule with λ = λ_s + λ_v.' },
    COUPLING_REGIME_OUTPUT,
  ],
  read(reader) {
    const deltaG0Ev = readEnergy(reader, 'deltaG0');
    const lambdaSolventEv = readLambda(reader, 'lambdaSolvent');
    const lambdaVibEv = reader.quantity('lambdaVib', 'energy', {
      atLeast: 0,
      message: 'Huang–Rhys factor must be ≥ 0.',
    });
    const hbarOmegaEv = reader.quantity('hbarOmega', 'energy', {
      greaterThan: 0,
      message: 'Mode energy must be > 0.',
    });
    if (lambdaVibEv > MAX_ENERGY_EV)
      reader.fail('lambdaVib', `${LAMBDA_MESSAGE} (≤ ${MAX_ENERGY_EV} eV)`);
    if (hbarOmegaEv > MAX_ENERGY_EV)
      reader.fail('hbarOmega', `Mode energy must be ≤ ${MAX_ENERGY_EV} eV.`);
    const terms = mljTermsEstimate(deltaG0Ev, lambdaSolventEv, lambdaVibEv, hbarOmegaEv);
    if (terms > MLJ_TERMS_LIMIT)
      reader.fail('hbarOmega', mljTermsMessage(terms, lambdaVibEv / hbarOmegaEv, MLJ_TERMS_LIMIT));
    const couplingEv = readEnergy(reader, 'coupling');
    const temperatureK = readTemperature(reader);
    refuseClassIII(reader, couplingEv, lambdaSolventEv + lambdaVibEv);
    return {
      deltaG0Ev,
      lambdaSolventEv,
      lambdaVibEv,
      hbarOmegaEv,
      couplingEv,
      temperatureK,
      units: {
        deltaG0: reader.unitOf('deltaG0'),
        lambdaSolvent: reader.unitOf('lambdaSolvent'),
        lambdaVib: reader.unitOf('lambdaVib'),
        coupling: reader.unitOf('coupling'),
      },
    };
  },
  compute(inputs, sink) {
    const { deltaG0Ev, lambdaSolventEv, lambdaVibEv, hbarOmegaEv, couplingEv, temperatureK } =
      inputs;
    const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
    noteCouplingSign(couplingEv, sink);
    warnLambdaBelowKt(lambdaSolventEv, temperatureK, sink);
    // γ with the total λ: the curvature of the diabatic surfaces along the reaction coordinate.
    const measures = adiabaticityMeasures(couplingEv, lambdaSolventEv + lambdaVibEv, temperatureK);
    warnAdiabaticity(couplingEv, temperatureK, measures, sink);
    warnBarrierLowering(couplingEv, lambdaSolventEv + lambdaVibEv, sink);
    warnTemperatureRange(temperatureK, sink);
    warnEnergyMagnitude(
      'lambdaSolvent',
      'lambda',
      lambdaSolventEv,
      inputs.units.lambdaSolvent,
      sink,
    );
    warnEnergyMagnitude('lambdaVib', 'lambda', lambdaVibEv, inputs.units.lambdaVib, sink);
    warnEnergyMagnitude('deltaG0', 'deltaG0', deltaG0Ev, inputs.units.deltaG0, sink);
    warnCouplingMagnitude('coupling', couplingEv, inputs.units.coupling, sink);
    if (hbarOmegaEv < 4 * thermalEv && lambdaVibEv > 0) {
      sink.warn(
        WARNING_CODES.lowFrequencyMode,
        `Low-frequency mode (ħω = ${hbarOmegaEv} eV < 4k_BT): use the thermal MLJ form ` +
          '(finite temperature) or include the mode in λ_s.',
      );
    }
    const sum = mljRateLog(
      deltaG0Ev,
      lambdaSolventEv,
      lambdaVibEv,
      hbarOmegaEv,
      couplingEv,
      temperatureK,
    );
    if (!sum.converged) {
      sink.warn(
        WARNING_CODES.mljNotConverged,
        `MLJ sum not converged after ${sum.termsUsed} terms.`,
      );
    }
    const rate = reportRate(sum.lnK, couplingEv === 0, sink, 'lambdaSolvent');
    return {
      k: rate.k,
      log10k: rate.log10k,
      huangRhys: lambdaVibEv / hbarOmegaEv,
      termsUsed: sum.termsUsed,
      regime: marcusRegime(deltaG0Ev, lambdaSolventEv + lambdaVibEv),
      couplingRegime: measures.regime,
    };
  },
} satisfies MethodDefinition<MljInputs>;

/** What `rate.mlj` answers (the compiler reads it through `MethodOutputs`). */
export type MljOutputs = ReturnType<(typeof mljMethod)['compute']>;
