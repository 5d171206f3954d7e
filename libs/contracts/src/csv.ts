/**
 * The one CSV cell rule of every CSV the product writes (report export, screen results, the
 * pairs table download): RFC 4180 quoting plus neutralising of text a spreadsheet would run as a
 * formula (CSV injection).
 */

/** First characters that make a spreadsheet read a text cell as a formula or a DDE call. */
const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * One CSV cell. Numbers stay numbers (a negative number in a numeric column is written as is;
 * NaN and ±Infinity become an empty cell, never text). Every other value is text: a text cell
 * that starts with = + - @ tab or CR gets a leading apostrophe, whatever follows (text like
 * `-2+3+cmd|' /C calc'!A0` starts with a minus and a digit and is still a formula). Cells with a
 * comma, quote or line break are quoted.
 */
export function csvCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'bigint' || typeof value === 'boolean') return String(value);
  const text = Array.isArray(value) ? value.join(' ') : String(value);
  const safe = FORMULA_START.test(text) ? `'${text}` : text;
  return /[",\n\r]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** One CSV line (without its line end). */
export function csvRow(values: readonly unknown[]): string {
  return values.map(csvCell).join(',');
}
