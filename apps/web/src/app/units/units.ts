import {
  allowedUnits,
  differenceScale,
  fromCanonical,
  toCanonical,
  type Quantity,
} from '@gapwise/calc';

/** How each CALC-API.md unit string is shown to people. */
const UNIT_LABELS: Readonly<Record<string, string>> = {
  'cm-1': 'cm⁻¹',
  A: 'Å',
  degC: '°C',
  'e*A': 'e·Å',
  'Pa*s': 'Pa·s',
  'M-1 cm-1': 'M⁻¹ cm⁻¹',
  'A-1': 'Å⁻¹',
  's-1': 's⁻¹',
  'M-1 s-1': 'M⁻¹ s⁻¹',
};

export function unitLabel(unit: string): string {
  return UNIT_LABELS[unit] ?? unit;
}

/** Units offered for a quantity, canonical first (from the calculation core's list). */
export function unitsFor(quantity: Quantity): readonly string[] {
  return allowedUnits(quantity);
}

/** Canonical value of `value` typed in `unit` (identity for dimensionless quantities). */
export function canonicalOf(value: number, unit: string, quantity: Quantity): number {
  return unit === '' || allowedUnits(quantity).length === 0
    ? value
    : toCanonical(value, unit, quantity);
}

/** `value` (canonical) expressed in `unit`. */
export function displayOf(value: number, unit: string, quantity: Quantity): number {
  return unit === '' || allowedUnits(quantity).length === 0
    ? value
    : fromCanonical(value, unit, quantity);
}

/** Converts a difference (an uncertainty) from `unit` to canonical: no offset (°C vs K). */
export function canonicalDifference(value: number, unit: string, quantity: Quantity): number {
  return unit === '' || allowedUnits(quantity).length === 0
    ? value
    : value * differenceScale(unit, quantity);
}

export function displayDifference(value: number, unit: string, quantity: Quantity): number {
  return unit === '' || allowedUnits(quantity).length === 0
    ? value
    : value / differenceScale(unit, quantity);
}
