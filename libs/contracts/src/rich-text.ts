/**
 * The subscript markup of Gapwise's scientific text (parameter labels, calculation messages,
 * report equations): `H_AB`, `τ_L`, `ε_s`, `E_ox` (the letters and digits after `_`), `k_{B}T`
 * (`_{…}` for anything else) and `k_BT` (the Boltzmann factor: only the B is a subscript). The
 * web page draws the runs as `<sub>` or SVG `<tspan>`, the PDF as smaller, lowered text; the
 * stored strings, the API and the CSV exports keep the markup.
 *
 * An underscore right after two Latin letters, or after a digit that follows a letter or digit,
 * is left alone: `my_solvent`, `run_2.csv` or `S3_BUCKET` are names someone typed, not symbols
 * (products of symbols such as `4πλ_s` or `ΔE_R` still get their subscript).
 */

/** One run of text: plain, or a subscript. */
export interface TextRun {
  readonly text: string;
  readonly sub: boolean;
}

const MARKUP =
  /_\{([^}]*)\}|(?<=k)_(B)(?=T(?![A-Za-z0-9]))|(?<![A-Za-z]{2}|[A-Za-z0-9][0-9])_([A-Za-z0-9]+)/g;

/** Splits `text` into plain runs and subscripts. */
export function textRuns(text: string): TextRun[] {
  const runs: TextRun[] = [];
  let from = 0;
  for (const m of text.matchAll(MARKUP)) {
    if (m.index > from) runs.push({ text: text.slice(from, m.index), sub: false });
    runs.push({ text: m[1] ?? m[2] ?? m[3] ?? '', sub: true });
    from = m.index + m[0].length;
  }
  if (from < text.length) runs.push({ text: text.slice(from), sub: false });
  return runs;
}

/**
 * The text without its markup, subscripts written inline (`|H_AB|` → `|HAB|`): what a
 * `<sub>` rendering reads as, for places that take no markup (aria-label, tooltip, title).
 */
export function plainText(text: string): string {
  return textRuns(text)
    .map((r) => r.text)
    .join('');
}
