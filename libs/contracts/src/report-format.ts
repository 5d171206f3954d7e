import type { ReportModelResult } from './reports';

export { provenanceText } from './provenance-text';

/**
 * The one number formatter of Gapwise (reports, PDFs and every web page), so a number reads the
 * same wherever it is shown. Negative numbers use the minus sign U+2212; exponents use Unicode
 * superscripts (8.98 × 10¹⁰ s⁻¹); a missing value (null, undefined, NaN) is a dash.
 */

const MINUS = '\u2212';
/** What a missing value (null, undefined, NaN) prints as. */
export const NO_VALUE = '—';
const SUPERSCRIPT: Readonly<Record<string, string>> = {
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
  '-': '⁻',
  '+': '⁺',
};

/** Replaces an ASCII hyphen-minus at the start of a number by U+2212. */
function withMinus(text: string): string {
  return text.startsWith('-') ? MINUS + text.slice(1) : text;
}

/** `10` raised to an integer, with superscript digits: 10¹⁰, 10⁻³. */
export function powerOfTen(exponent: number): string {
  const digits = String(exponent)
    .split('')
    .map((c) => SUPERSCRIPT[c] ?? c)
    .join('');
  return `10${digits}`;
}

/** Drops trailing zeros after a decimal point ("0.8000" → "0.8", "2.500" → "2.5"). */
function trimZeros(text: string): string {
  if (!text.includes('.')) return text;
  return text.replace(/\.?0+$/, '');
}

/**
 * Scientific notation with `sig` significant figures: 8.98 × 10¹⁰. Mantissa keeps trailing
 * zeros (they are significant): 1.00 × 10⁹.
 */
export function formatScientific(x: number | null | undefined, sig = 3): string {
  if (x === null || x === undefined || Number.isNaN(x)) return NO_VALUE;
  if (!Number.isFinite(x)) return x > 0 ? '∞' : `${MINUS}∞`;
  if (x === 0) return '0';
  const [mantissa, exp] = x.toExponential(sig - 1).split('e');
  const exponent = Number(exp);
  if (exponent === 0) return withMinus(mantissa);
  return `${withMinus(mantissa)} × ${powerOfTen(exponent)}`;
}

/**
 * A plain number with `sig` significant figures, trailing zeros dropped unless `keepZeros`;
 * switches to scientific notation outside 10⁻³ ≤ |x| < 10⁵.
 */
export function formatNumber(x: number | null | undefined, sig = 4, keepZeros = false): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return formatScientific(x, sig);
  if (x === 0) return '0';
  const abs = Math.abs(x);
  if (abs < 1e-3 || abs >= 1e5) return formatScientific(x, sig);
  const text = x.toPrecision(sig);
  // toPrecision may itself return exponent form for some inputs; normalise through Number.
  const plain = text.includes('e') ? String(Number(text)) : text;
  return withMinus(keepZeros ? plain : trimZeros(plain));
}

/** Fixed decimals with U+2212: log10 k = 10.95. */
export function formatFixed(x: number | null | undefined, decimals = 2): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return formatScientific(x);
  const text = x.toFixed(decimals);
  // Avoid "−0.00".
  if (Number(text) === 0) return (0).toFixed(decimals);
  return withMinus(text);
}

/** Display form of a CALC-API unit string: A → Å, cm-1 → cm⁻¹, degC → °C, s-1 → s⁻¹. */
export function displayUnit(unit: string): string {
  const table: Record<string, string> = {
    A: 'Å',
    'A-1': 'Å⁻¹',
    'cm-1': 'cm⁻¹',
    degC: '°C',
    's-1': 's⁻¹',
    'M-1 s-1': 'M⁻¹ s⁻¹',
    'M-1 cm-1': 'M⁻¹ cm⁻¹',
    'Pa*s': 'Pa s',
    'e*A': 'e Å',
    '': '',
  };
  return table[unit] ?? unit;
}

/**
 * An input value as entered: up to 6 significant figures with trailing zeros dropped, also in
 * the mantissa of scientific notation (2 × 10⁻¹³, 298.15, −6.918).
 */
export function formatInputNumber(x: number, sig = 6): string {
  const text = formatNumber(x, sig);
  const [mantissa, rest] = text.split(' × ');
  return rest === undefined ? text : `${trimZeros(mantissa)} × ${rest}`;
}

/** A value with its display unit ("0.8 eV", "298.15 K", "12 Å"). */
export function formatQuantity(value: number, unit: string, sig = 4): string {
  const u = displayUnit(unit);
  return u ? `${formatNumber(value, sig)} ${u}` : formatNumber(value, sig);
}

/** An input value with its display unit, as entered: "298.15 K", "2 × 10⁻¹³ s". */
export function formatInputQuantity(value: number, unit: string, sig = 6): string {
  const u = displayUnit(unit);
  return u ? `${formatInputNumber(value, sig)} ${u}` : formatInputNumber(value, sig);
}

/** A first-order rate in scientific notation with 3 significant figures: 8.98 × 10¹⁰ s⁻¹. */
export function formatRate(k: number | null, unit = 's-1'): string {
  if (k === null) return '—';
  return `${formatScientific(k, 3)} ${displayUnit(unit)}`;
}

/** log10 k with two decimals (the rate's 3 significant figures): 10.95. */
export function formatLog10(log10k: number | null): string {
  return log10k === null ? '—' : formatFixed(log10k, 2);
}

/** An energy in eV with 3 significant figures: 0.0781 eV. */
export function formatEnergyEv(valueEv: number | null): string {
  return valueEv === null ? '—' : `${formatNumber(valueEv, 3, true)} eV`;
}

/** "8.98 × 10¹⁰ s⁻¹ (log10 k = 10.95)" — k and log10 k side by side, as reports print them. */
export function formatRateWithLog(k: number | null, log10k: number | null): string {
  if (k === null && log10k === null) return '—';
  // Below the double range the rate is only known through log10 k (VALIDATION.md B2).
  const rate =
    k !== null && k > 0
      ? formatRate(k)
      : log10k !== null
        ? `${powerOfTen(Math.floor(log10k))}…`
        : formatRate(k);
  return log10k === null ? rate : `${rate} (log10 k = ${formatLog10(log10k)})`;
}

/** Uncertainty as ± value in the canonical unit, or an em dash. */
export function formatUncertainty(sigma: number | null, unit: string): string {
  if (sigma === null) return '—';
  return `± ${formatQuantity(sigma, unit, 2)}`;
}

/** Human label for a regime id. */
export function formatRegime(regime: string | null): string {
  if (!regime) return '—';
  return regime.charAt(0).toUpperCase() + regime.slice(1);
}

/** ISO time as "2026-12-02 14:05 UTC" (reports are read across time zones). */
export function formatReportDate(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  const pad = (n: number) => String(n).padStart(2, '0');
  return (
    `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())} ` +
    `${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())} UTC`
  );
}

/** Status label as printed: "Changes requested". */
export function formatReportStatus(status: string): string {
  const s = status.replace(/-/g, ' ');
  return s.charAt(0).toUpperCase() + s.slice(1);
}

export const MODEL_NAMES: Readonly<Record<string, string>> = {
  marcus: 'Classical nonadiabatic Marcus',
  mlj: 'Marcus–Levich–Jortner (one quantum mode)',
  mljThermal: 'Marcus–Levich–Jortner, thermal (finite-temperature mode)',
  crossover: 'Nonadiabatic–adiabatic crossover (solvent control)',
  ruler: 'Empirical protein ruler',
};

export function modelName(model: string): string {
  return MODEL_NAMES[model] ?? model;
}

/** "log10 k 10.62 – 11.21 (95 %, median 10.95; 2000 samples)". */
export function intervalText(result: ReportModelResult, hasUncertainties = false): string {
  const iv = result.interval;
  if (!iv) return hasUncertainties ? 'not available for this model' : 'no uncertainties given';
  const width = iv.percentiles[1] - iv.percentiles[0];
  return (
    `${formatFixed(iv.log10kLow)} to ${formatFixed(iv.log10kHigh)} ` +
    `(${formatNumber(width, 3)} %, median ${formatFixed(iv.log10kMedian)}; ${iv.samples} samples)`
  );
}
