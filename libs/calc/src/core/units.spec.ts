import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Quantity } from './method';
import {
  allowedUnits,
  canonicalUnit,
  convertUnits,
  fromCanonical,
  toCanonical,
  tryConvertUnits,
  UNITS_BY_QUANTITY,
  UnitError,
} from './units';

describe('units', () => {
  it('lists exactly the units of CALC-API.md, canonical first', () => {
    expect(allowedUnits('energy')).toEqual(['eV', 'meV', 'kJ/mol', 'kcal/mol', 'cm-1', 'hartree']);
    expect(allowedUnits('distance')).toEqual(['A', 'nm', 'pm']);
    expect(allowedUnits('temperature')).toEqual(['K', 'degC']);
    expect(allowedUnits('potential')).toEqual(['V', 'mV']);
    expect(allowedUnits('dipole')).toEqual(['D', 'e*A']);
    expect(allowedUnits('time')).toEqual(['s', 'ps', 'fs']);
    expect(allowedUnits('viscosity')).toEqual(['Pa*s', 'cP']);
    expect(canonicalUnit('wavenumber')).toBe('cm-1');
    expect(canonicalUnit('rateSecondOrder')).toBe('M-1 s-1');
  });

  it('converts by CODATA 2018 factors (SCIENCE.md §16 table)', () => {
    expect(toCanonical(96.48533212, 'kJ/mol', 'energy')).toBeCloseTo(1, 14);
    expect(toCanonical(23.06054783, 'kcal/mol', 'energy')).toBeCloseTo(1, 14);
    expect(toCanonical(8065.543937, 'cm-1', 'energy')).toBeCloseTo(1, 14);
    expect(toCanonical(1, 'hartree', 'energy')).toBe(27.211386245988);
    expect(toCanonical(0, 'degC', 'temperature')).toBe(273.15);
    expect(toCanonical(1, 'e*A', 'dipole')).toBeCloseTo(4.8032047, 6);
    expect(toCanonical(1, 'eV', 'wavenumber')).toBeCloseTo(8065.543937, 8);
    expect(fromCanonical(298.15, 'degC', 'temperature')).toBeCloseTo(25, 12);
  });

  it('round-trips every unit of every quantity (property)', () => {
    const pairs = (Object.keys(UNITS_BY_QUANTITY) as Quantity[]).flatMap((q) =>
      UNITS_BY_QUANTITY[q].map((unit) => [q, unit] as const),
    );
    fc.assert(
      fc.property(
        fc.constantFrom(...pairs),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        ([q, unit], value) => {
          const back = fromCanonical(toCanonical(value, unit, q), unit, q);
          expect(Math.abs(back - value)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(value)));
        },
      ),
    );
  });

  it('refuses unknown units with the VALIDATION.md A4 message', () => {
    expect(() => toCanonical(1, 'kcal', 'energy')).toThrow(
      "Unrecognised unit 'kcal' for an energy; use one of eV, meV, kJ/mol, kcal/mol, cm-1, hartree.",
    );
    expect(() => toCanonical(1, 'meV/mol', 'energy')).toThrow(UnitError);
    expect(() => toCanonical(1, 'nm', 'energy')).toThrow(UnitError);
  });

  it('converts within a kind and refuses across kinds', () => {
    expect(convertUnits(1, 'nm', 'pm')).toBeCloseTo(1000, 10);
    expect(convertUnits(1, 'hartree', 'cm-1')).toBeCloseTo(219474.6314, 3);
    expect(tryConvertUnits(1, 'eV', 'K')).toEqual({
      ok: false,
      field: 'to',
      message: "Cannot convert energy ('eV') to temperature ('K').",
    });
    expect(() => convertUnits(1, 'eV', 'A')).toThrow(UnitError);
  });
});

describe('energies of light in nm', () => {
  it('converts a wavelength to eV by E = 1239.84198/λ (SCIENCE.md §16) and back', async () => {
    const { toCanonical, fromCanonical, unrecognisedUnitMessage } = await import('./units');
    expect(toCanonical(500, 'nm', 'photonEnergy')).toBeCloseTo(1239.84198 / 500, 7);
    // 1 eV ↔ 1239.84198 nm, exact limiting identity.
    expect(fromCanonical(1, 'nm', 'photonEnergy')).toBeCloseTo(1239.84198, 4);
    expect(toCanonical(2, 'eV', 'photonEnergy')).toBe(2);
    expect(() => toCanonical(500, 'nm', 'energy')).toThrow(/wavelength/);
    expect(unrecognisedUnitMessage('nm', 'energy')).toContain('energy of light');
  });
});
