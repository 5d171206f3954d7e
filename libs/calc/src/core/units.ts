/**
 * The one units module of the calculation core. Every conversion between a unit the user typed
 * and the canonical unit of CALC-API.md happens here, with factors taken from `constants.ts`
 * (CODATA 2018). Nothing else in the core converts units.
 */
import {
  CM1_PER_EV,
  E_ANGSTROM_PER_DEBYE,
  EV_PER_HARTREE,
  KCAL_PER_MOL_PER_EV,
  HC_EV_NM,
  KJ_PER_MOL_PER_EV,
} from './constants';
import type { Quantity } from './method';

/** Offset between the Celsius and kelvin scales (exact, SI definition of °C). */
const CELSIUS_OFFSET_K = 273.15;

/**
 * One unit: value_canonical = value × scale + offset. Only temperature has an offset.
 * `dimension` groups units that convert into one another (cm⁻¹ is an energy, CALC-API.md).
 */
interface UnitDef {
  readonly dimension: Dimension;
  readonly scale: number;
  readonly offset: number;
}

type Dimension =
  | 'energy'
  | 'distance'
  | 'temperature'
  | 'potential'
  | 'dipole'
  | 'time'
  | 'viscosity'
  | 'molarAbsorptivity'
  | 'inverseDistance'
  | 'rateFirstOrder'
  | 'rateSecondOrder';

const linear = (dimension: Dimension, scale: number): UnitDef => ({ dimension, scale, offset: 0 });

/** Every unit string the core accepts, to the base unit of its dimension (eV for energy). */
const UNIT_TABLE: Readonly<Record<string, UnitDef>> = {
  eV: linear('energy', 1),
  meV: linear('energy', 1e-3),
  'kJ/mol': linear('energy', 1 / KJ_PER_MOL_PER_EV),
  'kcal/mol': linear('energy', 1 / KCAL_PER_MOL_PER_EV),
  'cm-1': linear('energy', 1 / CM1_PER_EV),
  hartree: linear('energy', EV_PER_HARTREE),
  A: linear('distance', 1),
  nm: linear('distance', 10),
  pm: linear('distance', 0.01),
  K: linear('temperature', 1),
  degC: { dimension: 'temperature', scale: 1, offset: CELSIUS_OFFSET_K },
  V: linear('potential', 1),
  mV: linear('potential', 1e-3),
  D: linear('dipole', 1),
  'e*A': linear('dipole', 1 / E_ANGSTROM_PER_DEBYE),
  s: linear('time', 1),
  ps: linear('time', 1e-12),
  fs: linear('time', 1e-15),
  'Pa*s': linear('viscosity', 1),
  cP: linear('viscosity', 1e-3),
  'M-1 cm-1': linear('molarAbsorptivity', 1),
  'A-1': linear('inverseDistance', 1),
  's-1': linear('rateFirstOrder', 1),
  'M-1 s-1': linear('rateSecondOrder', 1),
};

/** Units accepted for each quantity, canonical unit first (CALC-API.md "Shapes"). */
export const UNITS_BY_QUANTITY: Readonly<Record<Quantity, readonly string[]>> = {
  energy: ['eV', 'meV', 'kJ/mol', 'kcal/mol', 'cm-1', 'hartree'],
  // An energy of light (E₀₀, a band maximum): also a wavelength in nm, E = hc/λ.
  photonEnergy: ['eV', 'meV', 'kJ/mol', 'kcal/mol', 'cm-1', 'hartree', 'nm'],
  distance: ['A', 'nm', 'pm'],
  temperature: ['K', 'degC'],
  potential: ['V', 'mV'],
  dipole: ['D', 'e*A'],
  time: ['s', 'ps', 'fs'],
  viscosity: ['Pa*s', 'cP'],
  // Band positions and widths are energies written in cm⁻¹; any energy unit converts to them.
  wavenumber: ['cm-1', 'eV', 'meV', 'kJ/mol', 'kcal/mol', 'hartree'],
  molarAbsorptivity: ['M-1 cm-1'],
  inverseDistance: ['A-1'],
  rateFirstOrder: ['s-1'],
  rateSecondOrder: ['M-1 s-1'],
  dimensionless: [],
  integer: [],
  string: [],
  array: [],
  object: [],
};

/** Canonical unit of each quantity ('' where the quantity has no unit). */
export function canonicalUnit(quantity: Quantity): string {
  return UNITS_BY_QUANTITY[quantity][0] ?? '';
}

/** Units accepted for a quantity (for forms and help text). */
export function allowedUnits(quantity: Quantity): readonly string[] {
  return UNITS_BY_QUANTITY[quantity];
}

/** Noun phrase naming a quantity in messages ("an energy"). */
const QUANTITY_PHRASE: Readonly<Record<Quantity, string>> = {
  energy: 'an energy',
  photonEnergy: 'an energy of light',
  distance: 'a distance',
  temperature: 'a temperature',
  potential: 'a potential',
  dipole: 'a dipole',
  time: 'a time',
  viscosity: 'a viscosity',
  wavenumber: 'a wavenumber',
  molarAbsorptivity: 'a molar absorptivity',
  inverseDistance: 'an inverse distance',
  rateFirstOrder: 'a first-order rate',
  rateSecondOrder: 'a second-order rate',
  dimensionless: 'a dimensionless number',
  integer: 'an integer',
  string: 'a string',
  array: 'an array',
  object: 'an object',
};

export function quantityPhrase(quantity: Quantity): string {
  return QUANTITY_PHRASE[quantity];
}

/** Whether `unit` is accepted for `quantity`. */
export function isUnitFor(unit: string, quantity: Quantity): boolean {
  return UNITS_BY_QUANTITY[quantity].includes(unit);
}

/**
 * Energy of light in eV from a wavelength in nm, E = hc/λ (hc = 1239.84198 eV nm, CODATA 2018
 * exact h and c; SCIENCE.md §16). Only for λ > 0.
 */
export function photonEnergyEvFromNm(wavelengthNm: number): number {
  return HC_EV_NM / wavelengthNm;
}

/** Wavelength in nm of light of energy E (eV), λ = hc/E. Only for E > 0. */
export function wavelengthNmFromEv(energyEv: number): number {
  return HC_EV_NM / energyEv;
}

/** A wavelength read as an energy of light: the one non-linear unit of the core. */
function isWavelengthForLight(unit: string, quantity: Quantity): boolean {
  return unit === 'nm' && quantity === 'photonEnergy';
}

/** VALIDATION.md A4 message for a unit not in the fixed list. */
export function unrecognisedUnitMessage(unit: string, quantity: Quantity): string {
  const allowed = UNITS_BY_QUANTITY[quantity];
  if (unit === 'nm' && quantity === 'energy') {
    return (
      `Unit 'nm' is a wavelength: it is accepted only for an energy of light (such as the ` +
      `excitation energy E₀₀), not for this energy; use one of ${allowed.join(', ')}.`
    );
  }
  if (allowed.length === 0) {
    return `Unrecognised unit '${unit}' for ${quantityPhrase(quantity)}; give a bare number.`;
  }
  return (
    `Unrecognised unit '${unit}' for ${quantityPhrase(quantity)}; ` +
    `use one of ${allowed.join(', ')}.`
  );
}

/** Thrown only by the throwing convenience wrappers below; the dispatcher never lets it escape. */
export class UnitError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UnitError';
  }
}

function unitDef(unit: string): UnitDef | undefined {
  return Object.hasOwn(UNIT_TABLE, unit) ? UNIT_TABLE[unit] : undefined;
}

/**
 * Converts `value` typed in `unit` to the canonical unit of `quantity`.
 * Throws `UnitError` (A4 message) for a unit not accepted for that quantity.
 */
export function toCanonical(value: number, unit: string, quantity: Quantity): number {
  if (!isUnitFor(unit, quantity)) throw new UnitError(unrecognisedUnitMessage(unit, quantity));
  if (isWavelengthForLight(unit, quantity)) return photonEnergyEvFromNm(value);
  const from = unitDef(unit)!;
  const canonical = unitDef(canonicalUnit(quantity))!;
  return (value * from.scale + from.offset - canonical.offset) / canonical.scale;
}

/** Converts a canonical value of `quantity` to `unit`. Throws `UnitError` for a foreign unit. */
export function fromCanonical(value: number, unit: string, quantity: Quantity): number {
  if (!isUnitFor(unit, quantity)) throw new UnitError(unrecognisedUnitMessage(unit, quantity));
  if (isWavelengthForLight(unit, quantity)) return wavelengthNmFromEv(value);
  const to = unitDef(unit)!;
  const canonical = unitDef(canonicalUnit(quantity))!;
  return (value * canonical.scale + canonical.offset - to.offset) / to.scale;
}

/**
 * Factor turning a difference of two values typed in `unit` into a canonical difference
 * (offsets cancel in differences: 1 degC of difference is 1 K).
 */
export function differenceScale(unit: string, quantity: Quantity): number {
  if (!isUnitFor(unit, quantity)) throw new UnitError(unrecognisedUnitMessage(unit, quantity));
  if (isWavelengthForLight(unit, quantity)) {
    throw new UnitError('A difference of wavelengths is not a difference of energies; use eV.');
  }
  return unitDef(unit)!.scale / unitDef(canonicalUnit(quantity))!.scale;
}

/** Every unit string known to the core, in table order. */
export function knownUnits(): readonly string[] {
  return Object.keys(UNIT_TABLE);
}

/** Result of a conversion that may be refused: the value, or a message saying why not. */
export type ConversionResult =
  | { readonly ok: true; readonly value: number }
  | { readonly ok: false; readonly field: 'from' | 'to'; readonly message: string };

/**
 * Converts between any two known units of the same kind (energy ↔ cm⁻¹ ↔ hartree are all
 * energies); refuses unknown units and conversions across kinds.
 */
export function tryConvertUnits(value: number, from: string, to: string): ConversionResult {
  const fromDef = unitDef(from);
  const toDef = unitDef(to);
  const known = knownUnits().join(', ');
  if (!fromDef)
    return {
      ok: false,
      field: 'from',
      message: `Unrecognised unit '${from}'; use one of ${known}.`,
    };
  if (!toDef)
    return { ok: false, field: 'to', message: `Unrecognised unit '${to}'; use one of ${known}.` };
  if (fromDef.dimension !== toDef.dimension) {
    return {
      ok: false,
      field: 'to',
      message: `Cannot convert ${fromDef.dimension} ('${from}') to ${toDef.dimension} ('${to}').`,
    };
  }
  return { ok: true, value: (value * fromDef.scale + fromDef.offset - toDef.offset) / toDef.scale };
}

/** Throwing form of `tryConvertUnits`, for scripts and web pages. */
export function convertUnits(value: number, from: string, to: string): number {
  const result = tryConvertUnits(value, from, to);
  if (!result.ok) throw new UnitError(result.message);
  return result.value;
}

/** Kind of a unit string ('energy', 'distance', …), or undefined when unknown. */
export function unitDimension(unit: string): string | undefined {
  return unitDef(unit)?.dimension;
}
