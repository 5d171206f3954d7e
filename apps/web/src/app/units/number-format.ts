/**
 * Number display rules (PRODUCT.md): sensible significant figures, scientific notation for rates
 * with log10 k beside them, a true minus sign. The formatting itself is `@gapwise/contracts`'
 * (report-format.ts), so a page and its PDF print a number alike; this module adds the pages'
 * default precision and the reading of typed numbers.
 */
import { formatMeasured, formatNumber } from '@gapwise/contracts';

export { formatFixed, formatScientific } from '@gapwise/contracts';

/**
 * A number with `digits` significant figures: the one formatter of `@gapwise/contracts`
 * (`formatNumber`, shared with reports and PDFs), with the pages' default of 3 figures.
 */
export function formatSignificant(value: number | null | undefined, digits = 3): string {
  return formatNumber(value, digits);
}

/** Plain ASCII scientific form for copying into spreadsheets: `8.98e+10`. */
export function formatScientificAscii(value: number, digits = 4): string {
  return value.toExponential(digits - 1);
}

/**
 * Editable text for a number: up to 12 significant figures, no trailing zeros, so a value
 * converted from its canonical unit and back reads exactly as typed.
 */
export function editableText(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '';
  return String(Number(value.toPrecision(12)));
}

/**
 * Strict number parsing (VALIDATION.md): decimal point `.`, optional exponent, optional sign;
 * refuses locale commas, empty text, NaN and infinities. Returns null when refused.
 */
export function parseStrictNumber(text: string): number | null {
  const t = text.trim().replace(/^−/, '-');
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) return null;
  const v = Number(t);
  return Number.isFinite(v) ? v : null;
}

/**
 * A derived value and its σ as two cells, rounded together by the one rule (`formatMeasured`:
 * σ to 2 significant digits, the value to the same decimal place): { value: "0.812",
 * sigma: "0.013" }. Without σ the value has 4 significant figures and `sigma` is null.
 */
export function measuredParts(
  value: number | null | undefined,
  sigma: number | null | undefined,
): { value: string; sigma: string | null } {
  const text = formatMeasured(value ?? null, sigma ?? null);
  const [v, s] = text.split(' ± ');
  return { value: v!, sigma: s ?? null };
}
