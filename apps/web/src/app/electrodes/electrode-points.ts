/**
 * Measured k(η) pasted or uploaded as CSV: one point a line, `η (V), k[, direction]`, comma,
 * semicolon, tab or spaces between. A header line is skipped. Direction is `red`/`reduction` or
 * `ox`/`oxidation`; without it η ≤ 0 is read as reduction and η > 0 as oxidation. With
 * `currentMode`, the second column is a current density j (A cm⁻²) and k = |j|/(F·Γ) with the
 * surface coverage Γ (mol cm⁻²) given: the rate constant of a surface-confined couple at the
 * start of a potential step (A. J. Bard, L. R. Faulkner, Electrochemical Methods, 2nd ed., §14.3).
 */
import type { ElectrodeDirection, ElectrodePoint } from './electrode-api';

/** Faraday constant, C mol⁻¹ (CODATA 2018, exact). */
export const FARADAY_C_PER_MOL = 96485.33212;

export interface ParsedPoints {
  readonly points: ElectrodePoint[];
  /** Line-numbered problems, in the words the form shows. */
  readonly errors: string[];
}

export function parseElectrodeCsv(
  text: string,
  options: { currentMode?: boolean; coverageMolPerCm2?: number } = {},
): ParsedPoints {
  const points: ElectrodePoint[] = [];
  const errors: string[] = [];
  const lines = text.split(/\r?\n/);
  if (options.currentMode && !(options.coverageMolPerCm2 && options.coverageMolPerCm2 > 0)) {
    return { points, errors: ['Surface coverage Γ (mol cm⁻²) must be > 0 to convert currents.'] };
  }
  lines.forEach((raw, index) => {
    const line = raw.trim();
    if (!line || line.startsWith('#')) return;
    const cells = line.split(/[,;\t ]+/).filter(Boolean);
    const eta = Number(cells[0]);
    const value = Number(cells[1]);
    if (!Number.isFinite(eta) || cells.length < 2 || !Number.isFinite(value)) {
      if (index === 0 && !Number.isFinite(eta)) return; // header
      errors.push(`Line ${index + 1}: expected "η (V), k" with two numbers.`);
      return;
    }
    const k = options.currentMode
      ? Math.abs(value) / (FARADAY_C_PER_MOL * options.coverageMolPerCm2!)
      : value;
    if (!(k > 0)) {
      errors.push(`Line ${index + 1}: rate constant k must be > 0.`);
      return;
    }
    if (Math.abs(eta) > 3) {
      errors.push(`Line ${index + 1}: overpotential η must be within ±3 V.`);
      return;
    }
    let direction: ElectrodeDirection = eta <= 0 ? 'reduction' : 'oxidation';
    const word = (cells[2] ?? '').toLowerCase();
    if (word.startsWith('red')) direction = 'reduction';
    else if (word.startsWith('ox')) direction = 'oxidation';
    else if (word) {
      errors.push(`Line ${index + 1}: direction must be "reduction" or "oxidation".`);
      return;
    }
    points.push({ overpotentialV: eta, k, direction });
  });
  return { points, errors };
}

/** The points as CSV text the textarea shows (full precision). */
export function pointsToCsv(points: readonly ElectrodePoint[]): string {
  return [
    'eta_V, k, direction',
    ...points.map((p) => `${p.overpotentialV}, ${p.k}, ${p.direction}`),
  ].join('\n');
}
