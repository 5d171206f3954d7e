/**
 * Number display rules (PRODUCT.md): sensible significant figures, scientific notation for rates
 * with log10 k beside them, a true minus sign.
 */
const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻',
  '0': '⁰',
  '1': '¹',
  '2': '²',
  '3': '³',
  '4': '⁴',
  '5': '⁵',
  '6': '⁶',
  '7': '⁷',
  '8': '⁸',
  '9': '⁹',
};

function minus(text: string): string {
  return text.replace(/^-/, '−');
}

/** `0.3456` → `0.346`; `-1234.5` → `−1230`, with `digits` significant figures. */
export function formatSignificant(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 1e6 || abs < 1e-4) return formatScientific(value, digits);
  return minus(String(Number(value.toPrecision(digits))));
}

/** `8.978e10` → `8.98 × 10¹⁰`. */
export function formatScientific(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const [mantissa, exponent] = value.toExponential(digits - 1).split('e');
  const exp = String(Number(exponent))
    .split('')
    .map((c) => SUPERSCRIPT[c] ?? c)
    .join('');
  return `${minus(mantissa)} × 10${exp}`;
}

/** Plain ASCII scientific form for copying into spreadsheets: `8.98e+10`. */
export function formatScientificAscii(value: number, digits = 4): string {
  return value.toExponential(digits - 1);
}

/** Fixed decimals with a true minus sign (log10 k: two decimals). */
export function formatFixed(value: number | null | undefined, decimals = 2): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return minus(value.toFixed(decimals));
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
