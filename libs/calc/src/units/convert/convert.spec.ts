import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  relativeError,
} from '../../methods/testing/answers';

describe('units.convert', () => {
  it('converts energies by the CODATA 2018 table (SCIENCE.md §16)', () => {
    const convert = (value: number, from: string, to: string) =>
      numberOutput(computeOk('units.convert', { value, from, to }), 'value');
    // 1 hartree = 2625.499639 kJ/mol = 219474.6314 cm⁻¹; 1 kcal/mol = 349.7551 cm⁻¹.
    expect(relativeError(convert(1, 'hartree', 'kJ/mol'), 2625.499639)).toBeLessThan(1e-9);
    expect(relativeError(convert(1, 'hartree', 'cm-1'), 219474.6314)).toBeLessThan(1e-9);
    expect(relativeError(convert(1, 'kcal/mol', 'cm-1'), 349.7551)).toBeLessThan(1e-6);
    expect(relativeError(convert(1, 'kJ/mol', 'cm-1'), 83.59347)).toBeLessThan(1e-6);
    expect(convert(25, 'degC', 'K')).toBeCloseTo(298.15, 12);
    // 1 e·Å = 4.8032047 D (SCIENCE.md §16).
    expect(relativeError(convert(1, 'e*A', 'D'), 4.8032047)).toBeLessThan(1e-7);
    expect(convert(1, 'cP', 'Pa*s')).toBeCloseTo(1e-3, 15);
  });

  it('refuses cross-kind conversions, unknown units and temperatures below 0 K', () => {
    expect(computeRefused('units.convert', { value: 1, from: 'eV', to: 'A' })).toEqual([
      { field: 'to', message: "Cannot convert energy ('eV') to distance ('A')." },
    ]);
    expect(computeRefused('units.convert', { value: 1, from: 'kcal', to: 'eV' })[0].field).toBe(
      'from',
    );
    expect(computeRefused('units.convert', { value: -300, from: 'degC', to: 'K' })[0].field).toBe(
      'value',
    );
    expect(computeRefused('units.convert', { value: 1, from: 3, to: 'eV' })[0].field).toBe('from');
  });
});
