/**
 * Rates are computed as ln k and only exponentiated at the end (SCIENCE.md §0), so log10 k stays
 * exact when k itself underflows the double range (VALIDATION.md B2).
 */
import { CalcRefusal, type WarningSink } from '../core/method';
import { warnRateUnderflow } from '../core/warnings';

/** Below this log10 k a rate is reported as 0 with a warning (VALIDATION.md B2: k < 1e-300). */
export const LOG10_UNDERFLOW = -300;
/** Above this log10 k a rate is refused as outside the double range (inputs must be absurd). */
export const LOG10_OVERFLOW = 300;

export interface ReportedRate {
  /** k in its canonical unit; 0 when it underflows or when H = 0. */
  readonly k: number;
  /** log10 k; null only when k is exactly 0 (H = 0). */
  readonly log10k: number | null;
}

/**
 * Turns ln k into the reported pair (k, log10 k), warning on underflow and refusing values that
 * even the logarithm cannot hold. `lnK = −∞` means an exactly zero rate (H = 0).
 * @param field input blamed when the result is out of range
 */
export function reportRate(
  lnK: number,
  exactlyZero: boolean,
  sink: WarningSink,
  field: string,
): ReportedRate {
  if (exactlyZero) return { k: 0, log10k: null };
  const log10k = lnK * Math.LOG10E;
  if (!Number.isFinite(log10k)) {
    throw new CalcRefusal([
      { field, message: 'Result outside the floating-point range even in log space; check units.' },
    ]);
  }
  if (log10k > LOG10_OVERFLOW) {
    throw new CalcRefusal([
      {
        field,
        message: `Rate above floating-point range (log10 k = ${log10k.toFixed(1)}); check units.`,
      },
    ]);
  }
  if (log10k < LOG10_UNDERFLOW) {
    warnRateUnderflow(log10k, sink);
    return { k: 0, log10k };
  }
  return { k: Math.exp(lnK), log10k };
}
