/**
 * Vector paths for screening: `rate.marcus` and `rate.mlj` over many driving forces at once,
 * writing log10 k into a caller-owned Float64Array. No allocation per pair; the formulas are those
 * of the scalar kernels (`marcusRateLog`, `mljRateLog`), which the tests hold them to.
 */
import { BOLTZMANN_EV_PER_K } from '../core/constants';
import { LN_TWO_PI_OVER_HBAR } from './marcus/marcus';
import { MLJ_MAX_TERMS, MLJ_RELATIVE_TOLERANCE, mljMinimumTerms } from './mlj/mlj';

/** Terms whose Poisson step ln S − ln n is tabulated per call (covers S and n* up to ~250). */
const LN_STEP_TABLE_SIZE = 256;

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
 * `mljRateLog` (past max(S, n*) + 5, then until a term is < 1e-15 of the running sum); the
 * Poisson log-weights use the recurrence ln P_n = ln P_(n−1) + ln S − ln n instead of ln Γ.
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
  const lnS = Math.log(huangRhys);
  // ln S − ln n for the first terms, computed once per call instead of once per term and pair.
  const poissonSteps = new Float64Array(LN_STEP_TABLE_SIZE);
  for (let n = 1; n < LN_STEP_TABLE_SIZE; n++) poissonSteps[n] = lnS - Math.log(n);
  for (let i = 0; i < deltaG0Ev.length; i++) {
    const offsetEv = deltaG0Ev[i] + lambdaSolventEv;
    if (huangRhys === 0) {
      out[i] = (lnPrefactor - offsetEv * offsetEv * inverseWidth) * Math.LOG10E;
      if (termsOut) termsOut[i] = 1;
      continue;
    }
    const minTerms = mljMinimumTerms(deltaG0Ev[i], lambdaSolventEv, huangRhys, hbarOmegaEv);
    let lnPoisson = -huangRhys;
    let maxLn = Number.NEGATIVE_INFINITY;
    let sumRelative = 0;
    let n = 0;
    for (; n < MLJ_MAX_TERMS; n++) {
      if (n > 0) lnPoisson += n < LN_STEP_TABLE_SIZE ? poissonSteps[n] : lnS - Math.log(n);
      const energyEv = offsetEv + n * hbarOmegaEv;
      const lnTerm = lnPoisson - energyEv * energyEv * inverseWidth;
      let relative: number;
      if (lnTerm > maxLn) {
        sumRelative = sumRelative * Math.exp(maxLn - lnTerm) + 1;
        relative = 1;
        maxLn = lnTerm;
      } else {
        relative = Math.exp(lnTerm - maxLn);
        sumRelative += relative;
      }
      if (n + 1 >= minTerms && relative < MLJ_RELATIVE_TOLERANCE * sumRelative) {
        n++;
        break;
      }
    }
    out[i] = (lnPrefactor + maxLn + Math.log(sumRelative)) * Math.LOG10E;
    if (termsOut) termsOut[i] = n;
  }
  return out;
}
