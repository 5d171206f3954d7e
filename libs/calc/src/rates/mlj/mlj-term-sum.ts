/**
 * The one vibronic term sum of the Marcus–Levich–Jortner rate (T = 0 form of the quantum mode),
 * shared by `rate.mlj` (`mljRateLog`, also behind the driving-force fit) and the screening vector
 * paths (`mljLog10kInto`, `mljLog10kIntoArrays`), so they cannot drift apart.
 */

/** The sum stops once a term is below this fraction of the running sum (SCIENCE.md §2). */
export const MLJ_RELATIVE_TOLERANCE = 1e-15;

/** ln n for the first terms of the Poisson recurrence (shared by every pair and call). */
const LN_N_TABLE_SIZE = 512;
const LN_N = new Float64Array(LN_N_TABLE_SIZE);
for (let n = 1; n < LN_N_TABLE_SIZE; n++) LN_N[n] = Math.log(n);

/** Where `mljTermSum` writes its answer; the caller reuses one across pairs (no allocation). */
export interface MljTermSumSlot {
  /** ln k, k in s⁻¹: the prefactor's log plus the log of the sum. */
  lnK: number;
  /** Vibronic terms n = 0 … termsUsed − 1 that were summed. */
  termsUsed: number;
  /** False when `maxTerms` was reached before the tolerance test stopped the sum. */
  converged: boolean;
}

/**
 * ln k = lnPrefactor + ln Σ_n e^(−S) Sⁿ/n! exp[−(ΔG° + λ_s + nħω)²/(4λ_s k_BT)] for S > 0.
 * The Poisson log-weights follow the recurrence ln P_n = ln P_(n−1) + ln S − ln n (ln n tabulated
 * for the first 512 terms); the sum is kept as a running log-sum-exp, so no term underflows or
 * overflows. It runs past `minTerms` (max(S, n*) + 5, `mljMinimumTerms`) and stops when a term is
 * below 1e-15 of the running sum, or after `maxTerms` terms (then `converged` is false).
 * S = 0 (only n = 0 weighs) is the classical Marcus rate, left to the caller.
 * References: J. Ulstrup, J. Jortner, J. Chem. Phys. 1975, 63, 4358 (doi 10.1063/1.431152);
 * J. Jortner, J. Chem. Phys. 1976, 64, 4860 (doi 10.1063/1.432142); SCIENCE.md §2.
 */
export function mljTermSum(
  slot: MljTermSumSlot,
  lnPrefactor: number,
  offsetEv: number,
  hbarOmegaEv: number,
  huangRhys: number,
  inverseWidthPerEv: number,
  minTerms: number,
  maxTerms: number,
): MljTermSumSlot {
  const lnS = Math.log(huangRhys);
  let lnPoisson = -huangRhys;
  let maxLn = Number.NEGATIVE_INFINITY;
  let sumRelative = 0; // Σ exp(lnTerm − maxLn)
  for (let n = 0; n < maxTerms; n++) {
    if (n > 0) lnPoisson += lnS - (n < LN_N_TABLE_SIZE ? LN_N[n] : Math.log(n));
    const energyEv = offsetEv + n * hbarOmegaEv;
    const lnTerm = lnPoisson - energyEv * energyEv * inverseWidthPerEv;
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
      slot.lnK = lnPrefactor + maxLn + Math.log(sumRelative);
      slot.termsUsed = n + 1;
      slot.converged = true;
      return slot;
    }
  }
  slot.lnK = lnPrefactor + maxLn + Math.log(sumRelative);
  slot.termsUsed = maxTerms;
  slot.converged = false;
  return slot;
}

/** A fresh slot for `mljTermSum`. */
export function mljTermSumSlot(): MljTermSumSlot {
  return { lnK: Number.NaN, termsUsed: 0, converged: false };
}
