import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  relativeError,
  warningCodes,
} from '../../methods/testing/answers';

/** Independent SI evaluation: e²/(4πε₀) in J m with CODATA 2018 e and ε₀, then J → eV, m → Å. */
function twoSphereSi(aD: number, aA: number, r: number, eps: number, n: number): number {
  const e = 1.602176634e-19;
  const eps0 = 8.8541878128e-12;
  const geometryPerM = (1 / (2 * aD) + 1 / (2 * aA) - 1 / r) * 1e10;
  const joules = ((e * e) / (4 * Math.PI * eps0)) * geometryPerM * (1 / (n * n) - 1 / eps);
  return joules / e;
}

const mecn = {
  radiusDonor: 3.5,
  radiusAcceptor: 3.5,
  distance: 7,
  epsilon: 35.94,
  refractiveIndex: 1.344,
};

describe('reorg.twoSphere', () => {
  it('gives 1.082 eV for a = 3.5 Å, R = 7 Å in acetonitrile (SCIENCE.md §5 worked example)', () => {
    expect(numberOutput(computeOk('reorg.twoSphere', mecn), 'lambdaOuter')).toBeCloseTo(1.082, 3);
  });

  it('agrees with an SI-unit evaluation for unequal radii in water (n 1.333, ε 78.4, from memory)', () => {
    const input = {
      radiusDonor: 3,
      radiusAcceptor: 4.5,
      distance: 9,
      epsilon: 78.4,
      refractiveIndex: 1.333,
    };
    const expected = twoSphereSi(3, 4.5, 9, 78.4, 1.333);
    expect(
      relativeError(numberOutput(computeOk('reorg.twoSphere', input), 'lambdaOuter'), expected),
    ).toBeLessThan(1e-9);
  });

  it('scales with (Δz)² and accepts nm', () => {
    const two = computeOk('reorg.twoSphere', { ...mecn, charge: 2 });
    expect(numberOutput(two, 'lambdaOuter')).toBeCloseTo(
      4 * numberOutput(computeOk('reorg.twoSphere', mecn), 'lambdaOuter'),
      12,
    );
    const nm = computeOk('reorg.twoSphere', { ...mecn, distance: { value: 0.7, unit: 'nm' } });
    expect(numberOutput(nm, 'lambdaOuter')).toBeCloseTo(1.0815835, 6);
  });

  it('warns for a nearly non-polar solvent (B12) and outside the model range (B13)', () => {
    const nonpolar = computeOk('reorg.twoSphere', {
      ...mecn,
      epsilon: 2.38,
      refractiveIndex: 1.496,
    });
    expect(warningCodes(nonpolar)).toContain('nearly-nonpolar');
    expect(warningCodes(computeOk('reorg.twoSphere', { ...mecn, distance: 35 }))).toContain(
      'continuum-range',
    );
    expect(warningCodes(computeOk('reorg.twoSphere', { ...mecn, radiusDonor: 1 }))).toContain(
      'continuum-range',
    );
  });

  it('refuses radii ≤ 0 (A10), ε or n < 1 (A8), n² > ε (A9) and overlapping spheres (A11)', () => {
    expect(computeRefused('reorg.twoSphere', { ...mecn, radiusDonor: 0 })).toContainEqual({
      field: 'radiusDonor',
      message: 'Radii and distances must be > 0.',
    });
    expect(computeRefused('reorg.twoSphere', { ...mecn, refractiveIndex: 0.9 })).toEqual([
      {
        field: 'refractiveIndex',
        message: 'Dielectric constant and refractive index must be ≥ 1.',
      },
    ]);
    expect(computeRefused('reorg.twoSphere', { ...mecn, epsilon: 1.5 })).toEqual([
      {
        field: 'refractiveIndex',
        message:
          'Optical dielectric constant exceeds static one; for a non-polar solvent set λ_s = 0 explicitly.',
      },
    ]);
    expect(computeRefused('reorg.twoSphere', { ...mecn, distance: 6 })).toEqual([
      { field: 'distance', message: 'Centre-to-centre distance must be ≥ a_D + a_A.' },
    ]);
  });
});
