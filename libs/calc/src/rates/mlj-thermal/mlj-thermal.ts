/**
 * `rate.mljThermal`: the Marcus–Levich–Jortner rate with the quantum mode at finite temperature
 * (SCIENCE.md §2), for modes with ħω below about 4 k_BT where the T = 0 sum of `rate.mlj` fails.
 */
import { BOLTZMANN_EV_PER_K } from '../../core/constants';
import { CalcRefusal, type MethodDefinition } from '../../core/method';
import { logGamma } from '../../core/special/log-gamma';
import {
  noteCouplingSign,
  warnBarrierLowering,
  warnCouplingMagnitude,
  warnEnergyMagnitude,
  warnLambdaBelowKt,
  warnTemperatureRange,
} from '../../core/warnings';
import { adiabaticityMeasures, warnAdiabaticity } from '../coupling-regime';
import { COUPLING_REGIME_OUTPUT, LN_TWO_PI_OVER_HBAR } from '../marcus/marcus';
import { mljMethod, type MljInputs } from '../mlj/mlj';
import { marcusRegime } from '../rate-inputs';
import { reportRate } from '../rate-log';

/** Most terms p the Bessel sum may take; a wider range is refused (mode far too soft). */
export const MLJ_THERMAL_MAX_TERMS = 2_000_000;

/** Below this argument the Bessel series' leading term is exact to double precision. */
const TINY_ARGUMENT = 1e-30;
const RESCALE_ABOVE = 1e200;
const LN_RESCALE = Math.log(RESCALE_ABOVE);

/** ln sinh(y) for y > 0 without overflow: y + ln((1 − e^(−2y))/2). */
function logSinh(y: number): number {
  return y + Math.log(-Math.expm1(-2 * y) / 2);
}

/**
 * ln(e^(−z) I_p(z)) for p = 0 … maxOrder (exponentially scaled modified Bessel functions of the
 * first kind, integer order, z ≥ 0 given as ln z), never overflowing or underflowing.
 *
 * Method: Miller's backward recurrence I_(p−1) = I_(p+1) + (2p/z) I_p from an order far above
 * where I_p matters, rescaled in log space as it grows, and normalised by the identity
 * I_0(z) + 2 Σ_(p≥1) I_p(z) = e^z. For z < 1e-30 the leading term of the power series,
 * (z/2)^p/p!, is exact to double precision and is used instead.
 * References: J. C. P. Miller, in British Association Mathematical Tables vol. X, 1952;
 * W. Gautschi, SIAM Rev. 1967, 9, 24 (doi 10.1137/1009002); M. Abramowitz, I. A. Stegun,
 * Handbook of Mathematical Functions, 1964, §9.6.10 (series), §9.6.26 (recurrence), §9.6.37
 * (e^z sum) (all from memory).
 */
export function logScaledBesselI(logZ: number, maxOrder: number): Float64Array {
  const out = new Float64Array(maxOrder + 1);
  const z = Math.exp(logZ);
  if (z < TINY_ARGUMENT) {
    const logHalfZ = logZ - Math.LN2;
    for (let p = 0; p <= maxOrder; p++) out[p] = p * logHalfZ - logGamma(p + 1) - z;
    return out;
  }
  // Start where I_N/I_maxOrder and the sum's tail are far below double precision: past the
  // orders ~ 9√z where e^(−z)I_p(z) ≈ e^(−p²/2z)/√(2πz) stops mattering, and 30 past maxOrder.
  const start = Math.max(maxOrder, Math.ceil(9 * Math.sqrt(z))) + 30;
  let above = 0; // a_(p+1)
  let current = 1; // a_p, arbitrary start (the recurrence fixes only ratios)
  let scale = 0; // ln of the factor the a's carry beyond their stored values
  const logA = new Float64Array(maxOrder + 1);
  // Normalisation sum Σ' = a_0 + 2 Σ a_p, accumulated in the same running scale.
  let norm = 0;
  for (let p = start; p >= 1; p--) {
    if (p <= maxOrder) logA[p] = Math.log(current) + scale;
    norm += 2 * current;
    const below = above + ((2 * p) / z) * current; // a_(p−1)
    above = current;
    current = below;
    if (current > RESCALE_ABOVE) {
      current /= RESCALE_ABOVE;
      above /= RESCALE_ABOVE;
      norm /= RESCALE_ABOVE;
      scale += LN_RESCALE;
    }
  }
  logA[0] = Math.log(current) + scale;
  norm += current;
  const logNorm = Math.log(norm) + scale;
  for (let p = 0; p <= maxOrder; p++) out[p] = logA[p] - logNorm;
  return out;
}

export interface MljThermalSum {
  /** ln k, k in s⁻¹ (−∞ when H_AB = 0). */
  readonly lnK: number;
  /** Terms p = pLow … pHigh that were summed. */
  readonly termsUsed: number;
}

/**
 * ln k of the finite-temperature Marcus–Levich–Jortner rate, k in s⁻¹:
 * k = (2π/ħ)|H|²(4πλ_s k_BT)^(−½) Σ_(p=−∞…∞) exp[−S coth(x/2)] e^(px/2) I_p(S/sinh(x/2))
 *     × exp[−(ΔG° + λ_s + pħω)²/(4λ_s k_BT)],   x = ħω/k_BT, S = λ_v/ħω.
 * The weights are those of the net number p of quanta emitted (a Skellam distribution with mean
 * S and variance S coth(x/2)); they are evaluated as exp[−S tanh(x/4)] e^(px/2) (e^(−z) I_p(z))
 * in log space, and the sum runs over every p within 12 standard deviations of both the weights'
 * mean and the Gaussian's centre p* = −(ΔG° + λ_s)/ħω (log-sum-exp, so nothing underflows).
 * Tends to `rate.mlj` for x ≫ 1 and to classical Marcus with λ_s + λ_v for x ≪ 1.
 * References: J. Jortner, J. Chem. Phys. 1976, 64, 4860 (doi 10.1063/1.432142); N. R. Kestner,
 * J. Logan, J. Jortner, J. Phys. Chem. 1974, 78, 2148 (doi 10.1021/j100614a017); J. Ulstrup,
 * J. Jortner, J. Chem. Phys. 1975, 63, 4358 (all from memory).
 */
export function mljThermalRateLog(
  deltaG0Ev: number,
  lambdaSolventEv: number,
  lambdaVibEv: number,
  hbarOmegaEv: number,
  couplingEv: number,
  temperatureK: number,
): MljThermalSum {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  const widthEv = 4 * lambdaSolventEv * thermalEv;
  const lnPrefactor =
    LN_TWO_PI_OVER_HBAR + 2 * Math.log(Math.abs(couplingEv)) - 0.5 * Math.log(Math.PI * widthEv);
  const offsetEv = deltaG0Ev + lambdaSolventEv;
  const huangRhys = lambdaVibEv / hbarOmegaEv;
  if (huangRhys === 0) {
    return { lnK: lnPrefactor - (offsetEv * offsetEv) / widthEv, termsUsed: 1 };
  }
  const x = hbarOmegaEv / thermalEv;
  const logZ = Math.log(huangRhys) - logSinh(x / 2);
  // Variance of p under the weights: S coth(x/2) = S (1 + 2/(e^x − 1)).
  const spread = Math.sqrt(huangRhys * (1 + 2 / Math.expm1(x)));
  const gaussianSpread = Math.sqrt(widthEv / 2) / hbarOmegaEv;
  const centre = -offsetEv / hbarOmegaEv;
  const margin = 12 * (spread + gaussianSpread) + 30;
  const pLow = Math.floor(Math.min(huangRhys, centre) - margin);
  const pHigh = Math.ceil(Math.max(huangRhys, centre) + margin);
  const termsUsed = pHigh - pLow + 1;
  if (termsUsed > MLJ_THERMAL_MAX_TERMS) {
    throw new CalcRefusal([
      {
        field: 'hbarOmega',
        message:
          `The thermal sum would need ${termsUsed} terms (ħω far below k_BT with a large λ_v); ` +
          'include this mode in λ_s instead.',
      },
    ]);
  }
  const maxOrder = Math.max(Math.abs(pLow), Math.abs(pHigh));
  const logBessel = logScaledBesselI(logZ, maxOrder);
  const logWeightBase = -huangRhys * Math.tanh(x / 4);
  let maxLn = Number.NEGATIVE_INFINITY;
  let sumRelative = 0;
  for (let p = pLow; p <= pHigh; p++) {
    const energyEv = offsetEv + p * hbarOmegaEv;
    const lnTerm =
      logWeightBase + (p * x) / 2 + logBessel[Math.abs(p)] - (energyEv * energyEv) / widthEv;
    if (lnTerm > maxLn) {
      sumRelative = sumRelative * Math.exp(maxLn - lnTerm) + 1;
      maxLn = lnTerm;
    } else {
      sumRelative += Math.exp(lnTerm - maxLn);
    }
  }
  return { lnK: lnPrefactor + maxLn + Math.log(sumRelative), termsUsed };
}

export const mljThermalMethod = {
  id: 'rate.mljThermal',
  summary:
    'Marcus–Levich–Jortner rate with the quantum mode at finite temperature (Bessel form); for ħω < 4 k_BT.',
  references: [
    'J. Jortner, J. Chem. Phys. 1976, 64, 4860; doi 10.1063/1.432142',
    'N. R. Kestner, J. Logan, J. Jortner, J. Phys. Chem. 1974, 78, 2148; doi 10.1021/j100614a017',
    'J. Ulstrup, J. Jortner, J. Chem. Phys. 1975, 63, 4358; doi 10.1063/1.431152',
  ],
  inputs: mljMethod.inputs,
  outputs: [
    {
      name: 'k',
      unit: 's-1',
      description: 'Rate constant (0 when below 1e-300 or when H_AB = 0).',
    },
    { name: 'log10k', unit: '', description: 'log10 of k in s⁻¹ (null when H_AB = 0).' },
    { name: 'huangRhys', unit: '', description: 'Huang–Rhys factor S = λ_v/ħω.' },
    {
      name: 'termsUsed',
      unit: '',
      description: 'Terms p (net quanta emitted) summed, over ±12 spreads around S and p*.',
    },
    { name: 'regime', unit: '', description: 'Regime by the CALC-API rule with λ = λ_s + λ_v.' },
    COUPLING_REGIME_OUTPUT,
  ],
  read: (reader) => mljMethod.read(reader),
  compute(inputs, sink) {
    const { deltaG0Ev, lambdaSolventEv, lambdaVibEv, hbarOmegaEv, couplingEv, temperatureK } =
      inputs;
    noteCouplingSign(couplingEv, sink);
    warnLambdaBelowKt(lambdaSolventEv, temperatureK, sink);
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
    const sum = mljThermalRateLog(
      deltaG0Ev,
      lambdaSolventEv,
      lambdaVibEv,
      hbarOmegaEv,
      couplingEv,
      temperatureK,
    );
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

/** What `rate.mljThermal` answers (the compiler reads it through `MethodOutputs`). */
export type MljThermalOutputs = ReturnType<(typeof mljThermalMethod)['compute']>;
