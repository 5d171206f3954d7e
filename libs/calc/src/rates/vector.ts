/**
 * Vector paths for screening: `rate.marcus` and `rate.mlj` over many driving forces at once,
 * writing log10 k into a caller-owned Float64Array. No allocation per pair; the formulas are those
 * of the scalar kernels (`marcusRateLog`, `mljRateLog`), which the tests hold them to.
 */
import { BOLTZMANN_EV_PER_K } from '../core/constants';
import { LN_TWO_PI_OVER_HBAR } from './marcus/marcus';
import { MLJ_MAX_TERMS, mljMinimumTerms } from './mlj/mlj';
import { mljTermSum, mljTermSumSlot } from './mlj/mlj-term-sum';

function checkLengths(out: Float64Array, deltaG0Ev: Float64Array): void {
  if (out.length < deltaG0Ev.length) {
    throw new RangeError(`out has ${out.length} slots for ${deltaG0Ev.length} driving forces.`);
  }
}

/**
 * log10 k of the classical Marcus rate (SCIENCE.md §1; Marcus, J. Chem. Phys. 1956, 24, 966) for
 * each ΔG° in `deltaG0Ev`, with common λ, H and T; −∞ where H = 0. Inputs must be valid
 * (λ > 0, T > 0): this is an inner kernel, validation belongs to the dispatcher.
 */
export function marcusLog10kInto(
  out: Float64Array,
  deltaG0Ev: Float64Array,
  lambdaEv: number,
  couplingEv: number,
  temperatureK: number,
): Float64Array {
  checkLengths(out, deltaG0Ev);
  const widthEv = 4 * lambdaEv * BOLTZMANN_EV_PER_K * temperatureK;
  const lnPrefactor =
    LN_TWO_PI_OVER_HBAR + 2 * Math.log(Math.abs(couplingEv)) - 0.5 * Math.log(Math.PI * widthEv);
  const log10Prefactor = lnPrefactor * Math.LOG10E;
  const log10PerWidth = Math.LOG10E / widthEv;
  for (let i = 0; i < deltaG0Ev.length; i++) {
    const shifted = deltaG0Ev[i] + lambdaEv;
    out[i] = log10Prefactor - shifted * shifted * log10PerWidth;
  }
  return out;
}

/**
 * log10 k of the Marcus–Levich–Jortner rate (T = 0 form; SCIENCE.md §2; Jortner, J. Chem. Phys.
 * 1976, 64, 4860) for each ΔG°, with common λ_s, λ_v, ħω, H and T. Same convergence rule as
 * `mljRateLog`, whose term sum (`mljTermSum`) it shares.
 * Optionally records the number of terms used per pair in `termsOut`.
 */
export function mljLog10kInto(
  out: Float64Array,
  deltaG0Ev: Float64Array,
  lambdaSolventEv: number,
  lambdaVibEv: number,
  hbarOmegaEv: number,
  couplingEv: number,
  temperatureK: number,
  termsOut?: Float64Array,
): Float64Array {
  checkLengths(out, deltaG0Ev);
  const widthEv = 4 * lambdaSolventEv * BOLTZMANN_EV_PER_K * temperatureK;
  const inverseWidth = 1 / widthEv;
  const lnPrefactor =
    LN_TWO_PI_OVER_HBAR + 2 * Math.log(Math.abs(couplingEv)) - 0.5 * Math.log(Math.PI * widthEv);
  const huangRhys = lambdaVibEv / hbarOmegaEv;
  const sum = mljTermSumSlot();
  for (let i = 0; i < deltaG0Ev.length; i++) {
    const offsetEv = deltaG0Ev[i] + lambdaSolventEv;
    if (huangRhys === 0) {
      out[i] = (lnPrefactor - offsetEv * offsetEv * inverseWidth) * Math.LOG10E;
      if (termsOut) termsOut[i] = 1;
      continue;
    }
    const minTerms = mljMinimumTerms(deltaG0Ev[i], lambdaSolventEv, huangRhys, hbarOmegaEv);
    mljTermSum(
      sum,
      lnPrefactor,
      offsetEv,
      hbarOmegaEv,
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
