/**
 * Readers for the inputs the rate methods share (ΔG°, λ, H_AB, T), with the refusal wording of
 * VALIDATION.md A1, A2, A5 and a generous sanity range that keeps every later step finite.
 */
import type { InputReader } from '../core/method';

/** Energies beyond ±1e5 eV are refused: no chemistry lives there and exponents would overflow. */
export const MAX_ENERGY_EV = 1e5;
/** Temperatures above 1e5 K are refused for the same reason. */
export const MAX_TEMPERATURE_K = 1e5;

export const LAMBDA_MESSAGE = 'Reorganization energy must be a positive number.';
export const TEMPERATURE_MESSAGE = 'Temperature must be > 0 K (absolute). Did you enter °C?';
export const CLASS_III_MESSAGE =
  'Coupling too strong: delocalized (Robin–Day class III); no diabatic ET rate.';

function checkRange(reader: InputReader, name: string, value: number, limit: number, unit: string) {
  if (Math.abs(value) > limit) {
    reader.fail(name, `Field ${name} is outside the supported range (|value| ≤ ${limit} ${unit}).`);
    return Number.NaN;
  }
  return value;
}

/** Any energy (eV), of either sign, within ±1e5 eV. */
export function readEnergy(reader: InputReader, name: string): number {
  return checkRange(reader, name, reader.quantity(name, 'energy'), MAX_ENERGY_EV, 'eV');
}

/** A reorganization energy (eV): > 0 (A1) and ≤ 1e5 eV. */
export function readLambda(reader: InputReader, name: string): number {
  const value = reader.quantity(name, 'energy', { greaterThan: 0, message: LAMBDA_MESSAGE });
  return checkRange(reader, name, value, MAX_ENERGY_EV, 'eV');
}

/** An absolute temperature (K): > 0 (A2) and ≤ 1e5 K; `degC` is accepted and converted. */
export function readTemperature(reader: InputReader, name = 'temperature'): number {
  const value = reader.quantity(name, 'temperature', {
    greaterThan: 0,
    message: TEMPERATURE_MESSAGE,
  });
  return checkRange(reader, name, value, MAX_TEMPERATURE_K, 'K');
}

/**
 * A5: refuse 2|H_AB| ≥ λ, where the two-state ground surface has no barrier (Robin–Day class III;
 * M. B. Robin, P. Day, Adv. Inorg. Chem. Radiochem. 1967, 10, 247; SCIENCE.md §3).
 */
export function refuseClassIII(reader: InputReader, couplingEv: number, lambdaEv: number): void {
  if (
    Number.isFinite(couplingEv) &&
    Number.isFinite(lambdaEv) &&
    2 * Math.abs(couplingEv) >= lambdaEv
  ) {
    reader.fail('coupling', CLASS_III_MESSAGE);
  }
}

/** The Marcus regime of CALC-API.md: activationless when |ΔG° + λ| ≤ 0.01 λ. */
export type Regime = 'normal' | 'activationless' | 'inverted';

export function marcusRegime(deltaG0Ev: number, lambdaEv: number): Regime {
  const shifted = deltaG0Ev + lambdaEv;
  if (Math.abs(shifted) <= 0.01 * lambdaEv) return 'activationless';
  // Outside the band, shifted > 0 is −ΔG° < λ; `warnInvertedRegion` uses the same test.
  return shifted > 0 ? 'normal' : 'inverted';
}
