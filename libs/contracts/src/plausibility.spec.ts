import { describe, expect, it } from 'vitest';
import { PLAUSIBLE_RANGES } from '@gapwise/calc';
import { parameterPlausibility, temperaturePlausibility } from './plausibility';

// Thresholds are those of VALIDATION.md B8–B11 and B16; the values tested sit on either side.
describe('parameterPlausibility', () => {
  it('uses the one range table the core warnings use', () => {
    expect(PLAUSIBLE_RANGES.lambdaEvMax).toBe(3);
    expect(PLAUSIBLE_RANGES.deltaG0EvMax).toBe(4);
    expect(PLAUSIBLE_RANGES.couplingEvMax).toBe(0.5);
    expect(PLAUSIBLE_RANGES.temperatureK).toEqual({ min: 150, max: 500 });
  });

  it('flags a coupling above 0.5 eV and one typed in eV above 10 eV, by its label', () => {
    expect(parameterPlausibility('coupling', 0.01, 'cm-1')).toBeNull();
    expect(parameterPlausibility('coupling', 0.6, 'cm-1')).toMatch(
      /^Electronic coupling \|HAB\| = 0\.6 eV is unusually large/,
    );
    expect(parameterPlausibility('coupling', 1819, 'eV')).toMatch(/cm⁻¹ entered as eV/);
    // 1e-7 eV = 8e-4 cm⁻¹ < 0.01 cm⁻¹ (B11).
    expect(parameterPlausibility('coupling', 1e-7, 'cm-1')).toMatch(/below 0\.01 cm⁻¹/);
  });

  it('flags λ above 3 eV, |ΔG°| above 4 eV, and 20–1000 typed as eV', () => {
    expect(parameterPlausibility('lambdaOuter', 2.9, 'eV')).toBeNull();
    expect(parameterPlausibility('lambdaOuter', 3.1, 'eV')).toMatch(/above 3 eV/);
    expect(parameterPlausibility('deltaG0', -3.9, 'eV')).toBeNull();
    expect(parameterPlausibility('deltaG0', -4.1, 'eV')).toMatch(/above 4 eV/);
    expect(parameterPlausibility('deltaG0Recombination', -96, 'eV')).toMatch(
      /looks like kJ\/mol or cm⁻¹ entered as eV/,
    );
    // The same 96 eV reached from kJ/mol typed as such is only "unusually large".
    expect(parameterPlausibility('deltaG0', -96, 'kJ/mol')).toMatch(/unusually large/);
  });

  it('flags E₀₀ above 5 eV and leaves other kinds alone', () => {
    expect(parameterPlausibility('excitationEnergy', 2.5, 'eV')).toBeNull();
    expect(parameterPlausibility('excitationEnergy', 6, 'eV')).toMatch(/0–0 energy/);
    expect(parameterPlausibility('distance', 1e4, 'A')).toBeNull();
  });
});

describe('temperaturePlausibility', () => {
  it('warns outside 150–500 K, including the edges just beyond', () => {
    expect(temperaturePlausibility(150)).toBeNull();
    expect(temperaturePlausibility(500)).toBeNull();
    expect(temperaturePlausibility(149.9)).toMatch(/classical Marcus is questionable at low T/);
    expect(temperaturePlausibility(501)).toMatch(/outside 150–500 K/);
  });
});
