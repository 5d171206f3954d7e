import type { ScreenNumericColumn, ScreenResultRow } from '@gapwise/contracts';

/** How a numeric result column is named and shown (quantity, unit, digits). */
export interface ResultColumn {
  readonly key: ScreenNumericColumn;
  /** Short header for the table. */
  readonly header: string;
  /** Quantity with unit, for axes, legends and filters. */
  readonly label: string;
  readonly unit: string;
  readonly digits: number;
}

export const RESULT_COLUMNS: readonly ResultColumn[] = [
  { key: 'rowNumber', header: 'Line', label: 'Line in the file', unit: '', digits: 0 },
  {
    key: 'deltaGCs',
    header: 'ΔG°CS / eV',
    label: 'ΔG° charge separation / eV',
    unit: 'eV',
    digits: 3,
  },
  {
    key: 'deltaGCr',
    header: 'ΔG°CR / eV',
    label: 'ΔG° charge recombination / eV',
    unit: 'eV',
    digits: 3,
  },
  { key: 'lambdaInner', header: 'λi / eV', label: 'λ inner / eV', unit: 'eV', digits: 3 },
  { key: 'lambdaOuter', header: 'λo / eV', label: 'λ outer / eV', unit: 'eV', digits: 3 },
  { key: 'lambdaTotal', header: 'λ / eV', label: 'λ total / eV', unit: 'eV', digits: 3 },
  { key: 'coupling', header: '|HAB| / meV', label: '|H_AB| / meV', unit: 'meV', digits: 3 },
  { key: 'temperature', header: 'T / K', label: 'Temperature / K', unit: 'K', digits: 4 },
  {
    key: 'log10kCsMarcus',
    header: 'log₁₀ kCS Marcus',
    label: 'log₁₀(k_CS / s⁻¹), Marcus',
    unit: 'log10 s-1',
    digits: 3,
  },
  {
    key: 'log10kCrMarcus',
    header: 'log₁₀ kCR Marcus',
    label: 'log₁₀(k_CR / s⁻¹), Marcus',
    unit: 'log10 s-1',
    digits: 3,
  },
  {
    key: 'log10kCsMlj',
    header: 'log₁₀ kCS MLJ',
    label: 'log₁₀(k_CS / s⁻¹), MLJ',
    unit: 'log10 s-1',
    digits: 3,
  },
  {
    key: 'log10kCrMlj',
    header: 'log₁₀ kCR MLJ',
    label: 'log₁₀(k_CR / s⁻¹), MLJ',
    unit: 'log10 s-1',
    digits: 3,
  },
  { key: 'score', header: 'Score', label: 'Ranking score / decades', unit: 'decades', digits: 3 },
];

export const COLUMN_BY_KEY = new Map(RESULT_COLUMNS.map((c) => [c.key, c]));

/** Value shown for a column: |H_AB| in meV (stored in eV), everything else as stored. */
export function shownValue(row: ScreenResultRow, key: ScreenNumericColumn): number | null {
  const v = row[key];
  if (v === null || v === undefined || !Number.isFinite(v)) return null;
  return key === 'coupling' ? v * 1000 : v;
}

/** Converts a shown filter value back to the stored unit (meV → eV for |H_AB|). */
export function storedValue(key: ScreenNumericColumn, shown: number): number {
  return key === 'coupling' ? shown / 1000 : shown;
}

/** The rate columns the scatter plot can draw, with the driving force that belongs to each. */
export const PLOT_RATES = [
  { key: 'log10kCsMarcus', x: 'deltaGCs', name: 'Charge separation, classical Marcus' },
  { key: 'log10kCrMarcus', x: 'deltaGCr', name: 'Charge recombination, classical Marcus' },
  { key: 'log10kCsMlj', x: 'deltaGCs', name: 'Charge separation, MLJ' },
  { key: 'log10kCrMlj', x: 'deltaGCr', name: 'Charge recombination, MLJ' },
] as const satisfies ReadonlyArray<{
  key: ScreenNumericColumn;
  x: ScreenNumericColumn;
  name: string;
}>;
export type PlotRate = (typeof PLOT_RATES)[number];

/** Columns the points can be coloured by: numeric ones, or a regime (then shapes too). */
export const COLOUR_BY = [
  { key: 'score', name: 'Ranking score' },
  { key: 'lambdaTotal', name: 'λ total' },
  { key: 'coupling', name: '|H_AB|' },
  { key: 'deltaGCr', name: 'ΔG° charge recombination' },
  { key: 'regimeCr', name: 'Regime of recombination' },
  { key: 'regimeCs', name: 'Regime of charge separation' },
] as const;
export type ColourBy = (typeof COLOUR_BY)[number]['key'];

export const REGIME_LABELS: Record<string, string> = {
  normal: 'normal',
  activationless: 'activationless',
  inverted: 'inverted',
};

/** Plain words for the warning codes of a screen row. */
export const WARNING_LABELS: Record<string, string> = {
  'inverted-region': 'charge separation in the inverted region',
  'rate-underflow': 'rate below 10⁻³⁰⁰ s⁻¹',
  'lambda-below-kt': 'λ below k_BT',
  'coupling-large': '|H_AB| above k_BT (nonadiabatic formula doubtful)',
  'coupling-barrier-lowering': '|H_AB| above λ/10 (barrier lowered)',
  'low-frequency-mode': 'ħω below 4 k_BT',
  'temperature-range': 'temperature outside 150–500 K',
  'value-unusually-large': 'unusually large value',
  'nearly-nonpolar': 'nearly nonpolar solvent',
  'continuum-range': 'outside the continuum model’s range',
  'born-correction-large': 'large solvent (Born) correction',
  'excitation-energy-suspect': 'excitation energy looks suspect',
  'coupling-zero': '|H_AB| is zero',
  'coupling-delocalized': '2|H_AB| ≥ λ: delocalized, no diabatic rate',
  'row-refused': 'a derivation refused the row',
  other: 'other warning of the core',
  'assumed-hbar-omega': 'ħω assumed for the score (a step in the inverted region, no ħω given)',
};
