import { parseStrictNumber } from '../units/number-format';

/** A row of the data table as typed (text, so nothing is lost before validation). */
export interface PointText {
  readonly label: string;
  readonly deltaG0: string;
  readonly rate: string;
  readonly sigma: string;
}

export type RateKind = 'k' | 'log10k';

export interface PasteResult {
  readonly rows: PointText[];
  readonly problems: string[];
}

const SPLIT = /\s*[,;\t]\s*|\s{2,}/;

/**
 * Reads pasted rows `label, ΔG°, rate[, σ(log10 k)]` (comma, semicolon or tab separated; a
 * header line whose second cell is not a number is skipped). A row with three cells whose first
 * one is a number is read as `ΔG°, rate, σ` without a label. Problems name the line.
 */
export function parsePastedPoints(text: string): PasteResult {
  const rows: PointText[] = [];
  const problems: string[] = [];
  const lines = text.replace(/\r/g, '').split('\n');
  lines.forEach((raw, i) => {
    const line = raw.trim();
    if (!line || line.startsWith('#')) return;
    let cells = line.split(SPLIT).map((c) => c.trim());
    if (cells.length >= 2 && parseStrictNumber(cells[0]) !== null) cells = ['', ...cells];
    if (cells.length < 3) {
      problems.push(`Line ${i + 1}: expected label, ΔG°, rate and optionally σ.`);
      return;
    }
    const [label, dg, rate, sigma = ''] = cells;
    if (parseStrictNumber(dg) === null) {
      if (i === 0 || rows.length === 0) return; // a header line
      problems.push(`Line ${i + 1}: ΔG° "${dg}" is not a number.`);
      return;
    }
    if (parseStrictNumber(rate) === null) {
      problems.push(`Line ${i + 1}: rate "${rate}" is not a number.`);
      return;
    }
    if (sigma !== '' && parseStrictNumber(sigma) === null) {
      problems.push(`Line ${i + 1}: σ "${sigma}" is not a number.`);
      return;
    }
    rows.push({ label, deltaG0: dg, rate, sigma });
  });
  return { rows, problems };
}

/** Body of one point for the API (numbers already validated by the form). */
export function pointBody(p: PointText, kind: RateKind) {
  const rate = parseStrictNumber(p.rate) as number;
  const sigma = p.sigma.trim() === '' ? null : parseStrictNumber(p.sigma);
  return {
    label: p.label.trim(),
    deltaG0: parseStrictNumber(p.deltaG0) as number,
    ...(kind === 'k' ? { k: rate } : { log10k: rate }),
    sigmaLog10k: sigma,
  };
}
