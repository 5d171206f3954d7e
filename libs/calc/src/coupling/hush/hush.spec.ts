import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  relativeError,
  warningCodes,
} from '../../methods/testing/answers';

describe('coupling.hush', () => {
  it('applies the published 2.06e-2 (Hush 1967; Creutz 1983, from memory), worked by hand', () => {
    // ν̃ = 10000 cm⁻¹, ε = 1000 M⁻¹ cm⁻¹, Δν̃ = 5000 cm⁻¹, r = 5 Å:
    // 0.0206 × √(5e10) / 5 = 0.0206 × 223606.7977 / 5 = 921.260 cm⁻¹.
    const answer = computeOk('coupling.hush', {
      bandMaximum: 10000,
      molarAbsorptivity: 1000,
      bandwidth: 5000,
      distance: 5,
    });
    expect(numberOutput(answer, 'couplingCm1')).toBeCloseTo(921.26, 2);
    expect(numberOutput(answer, 'coupling')).toBeCloseTo(921.26 / 8065.543937, 6);
  });

  it('agrees within 0.1% with the constant recomputed from CODATA (0.0205872, SCIENCE.md §8)', () => {
    const input = { bandMaximum: 6000, molarAbsorptivity: 5000, bandwidth: 3500, distance: 6.5 };
    const recomputed = (0.0205872 * Math.sqrt(6000 * 5000 * 3500)) / 6.5;
    expect(
      relativeError(numberOutput(computeOk('coupling.hush', input), 'couplingCm1'), recomputed),
    ).toBeLessThan(1e-3);
  });

  it('accepts band positions in eV (an energy converts to cm⁻¹)', () => {
    const ev = computeOk('coupling.hush', {
      bandMaximum: { value: 10000 / 8065.543937, unit: 'eV' },
      molarAbsorptivity: 1000,
      bandwidth: 5000,
      distance: 5,
    });
    expect(numberOutput(ev, 'couplingCm1')).toBeCloseTo(921.26, 2);
  });

  it('warns when the band is narrower than 0.9 × the Hush width √(2298 ν̃) at 298.15 K (B31; SCIENCE.md §8)', () => {
    const narrowWidth = 0.85 * Math.sqrt(2298 * 10000);
    const fineWidth = 0.95 * Math.sqrt(2298 * 10000);
    const band = { bandMaximum: 10000, molarAbsorptivity: 1000, distance: 5 };
    expect(warningCodes(computeOk('coupling.hush', { ...band, bandwidth: narrowWidth }))).toContain(
      'hush-band-narrow',
    );
    expect(
      warningCodes(computeOk('coupling.hush', { ...band, bandwidth: fineWidth })),
    ).not.toContain('hush-band-narrow');
  });

  it('refuses non-positive band parameters or distance (A30)', () => {
    const message = 'Band parameters and distance must be > 0.';
    expect(
      computeRefused('coupling.hush', {
        bandMaximum: 0,
        molarAbsorptivity: -1,
        bandwidth: 100,
        distance: 0,
      }),
    ).toEqual([
      { field: 'bandMaximum', message },
      { field: 'molarAbsorptivity', message },
      { field: 'distance', message },
    ]);
  });
});
