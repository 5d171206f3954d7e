/**
 * Vector paths with a parameter set per pair: classical Marcus and MLJ over whole arrays of
 * driving forces, reorganization energies, couplings, modes and temperatures, for screens where
 * every row differs. One call per chunk, no allocation per pair; the formulas are those of the
 * scalar kernels (`marcusRateLog`, `mljRateLog`), which the tests hold them to. Inner kernels:
 * inputs must be valid (λ > 0, ħω > 0, T > 0); validation belongs to the caller.
 */
import { BOLTZMANN_EV_PER_K } from '../core/constants';
import { LN_TWO_PI_OVER_HBAR } from './marcus/marcus';
import { MLJ_MAX_TERMS, mljMinimumTerms } from './mlj/mlj';
import { mljTermSum, mljTermSumSlot } from './mlj/mlj-term-sum';

function checkArrays(out: Float64Array, n: number, inputs: readonly ArrayLike<number>[]): void {
  if (out.length < n) throw new RangeError(`out has ${out.length} slots for ${n} pairs.`);
  for (const a of inputs) {
    if (a.length < n) throw new RangeError(`an input array has ${a.length} values for ${n} pairs.`);
  }
}

/**
 * log10 k of the classical Marcus rate (SCIENCE.md §1; R. A. Marcus, J. Chem. Phys. 1956, 24, 966)
 * for pair i with its own ΔG°, λ, H and T: out[i] = log10[(2π/ħ)H²(4πλk_BT)^(−1/2)
 * exp(−(ΔG° + λ)²/(4λk_BT))]; −∞ where H = 0, NaN where an input is NaN.
 */
export function marcusLog10kIntoArrays(
  out: Float64Array,
  deltaG0Ev: ArrayLike<number>,
  lambdaEv: ArrayLike<number>,
  couplingEv: ArrayLike<number>,
  temperatureK: ArrayLike<number>,
): Float64Array {
  const n = deltaG0Ev.length;
  checkArrays(out, n, [lambdaEv, couplingEv, temperatureK]);
  const halfLnPi = 0.5 * Math.log(Math.PI);
  for (let i = 0; i < n; i++) {
    const lambda = lambdaEv[i];
    const widthEv = 4 * lambda * BOLTZMANN_EV_PER_K * temperatureK[i];
    const shifted = deltaG0Ev[i] + lambda;
    const lnK =
      LN_TWO_PI_OVER_HBAR +
      2 * Math.log(Math.abs(couplingEv[i])) -
      halfLnPi -
      0.5 * Math.log(widthEv) -
      (shifted * shifted) / widthEv;
    out[i] = lnK * Math.LOG10E;
  }
  return out;
}

/**
 * log10 k of the Marcus–Levich–Jortner rate (T = 0 form of the mode; SCIENCE.md §2; J. Jortner,
 * J. Chem. Phys. 1976, 64, 4860) for pair i with its own ΔG°, λ_s, λ_v, ħω, H and T. Same
 * term sum as `mljRateLog` (`mljTermSum`). A pair whose λ_s, ħω or T is not > 0, or any input NaN, gets NaN (and 0
 * terms) instead of a runaway sum. Optionally records the terms used per pair in `termsOut`.
 */
export function mljLog10kIntoArrays(
  out: Float64Array,
  deltaG0Ev: ArrayLike<number>,
  lambdaSolventEv: ArrayLike<number>,
  lambdaVibEv: ArrayLike<number>,
  hbarOmegaEv: ArrayLike<number>,
  couplingEv: ArrayLike<number>,
  temperatureK: ArrayLike<number>,
  termsOut?: Float64Array,
): Float64Array {
  const n = deltaG0Ev.length;
  checkArrays(out, n, [lambdaSolventEv, lambdaVibEv, hbarOmegaEv, couplingEv, temperatureK]);
  const halfLnPi = 0.5 * Math.log(Math.PI);
  const sum = mljTermSumSlot();
  for (let i = 0; i < n; i++) {
    const lambdaS = lambdaSolventEv[i];
    const hbarOmega = hbarOmegaEv[i];
    const t = temperatureK[i];
    const dG = deltaG0Ev[i];
    const huangRhys = lambdaVibEv[i] / hbarOmega;
    if (!(lambdaS > 0 && hbarOmega > 0 && t > 0 && huangRhys >= 0) || Number.isNaN(dG)) {
      out[i] = Number.NaN;
      if (termsOut) termsOut[i] = 0;
      continue;
    }
    const widthEv = 4 * lambdaS * BOLTZMANN_EV_PER_K * t;
    const inverseWidth = 1 / widthEv;
    const lnPrefactor =
      LN_TWO_PI_OVER_HBAR +
      2 * Math.log(Math.abs(couplingEv[i])) -
      halfLnPi -
      0.5 * Math.log(widthEv);
    const offsetEv = dG + lambdaS;
    if (huangRhys === 0) {
      out[i] = (lnPrefactor - offsetEv * offsetEv * inverseWidth) * Math.LOG10E;
      if (termsOut) termsOut[i] = 1;
      continue;
    }
    const minTerms = mljMinimumTerms(dG, lambdaS, huangRhys, hbarOmega);
    mljTermSum(
      sum,
      lnPrefactor,
      offsetEv,
      hbarOmega,
      huangRhys,
      inverseWidth,
      minTerms,
      MLJ_MAX_TERMS,
    );
    out[i] = sum.lnK * Math.LOG10E;
    if (termsOut) termsOut[i] = sum.termsUsed;
  }
  return out;
}
