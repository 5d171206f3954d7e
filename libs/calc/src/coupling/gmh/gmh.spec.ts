import { eigs } from 'mathjs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  relativeError,
  warningCodes,
} from '../../methods/testing/answers';

/**
 * Adiabatic data from a two-state diabatic model, diagonalised with mathjs `eigs` (an outside
 * library): diabatic energies E_a, E_b, coupling H, diabatic dipoles μ_a, μ_b and no diabatic
 * transition dipole (the GMH premise, Cave & Newton 1996).
 */
function adiabaticData(ea: number, eb: number, h: number, muA: number, muB: number) {
  const { eigenvectors } = eigs([
    [ea, h],
    [h, eb],
  ]) as unknown as { eigenvectors: { value: number; vector: number[] }[] };
  const [ground, excited] = [...eigenvectors].sort((x, y) => x.value - y.value);
  const dipole = (u: number[], v: number[]) => u[0] * v[0] * muA + u[1] * v[1] * muB;
  return {
    transitionDipole: dipole(ground.vector, excited.vector),
    dipoleDifference: dipole(excited.vector, excited.vector) - dipole(ground.vector, ground.vector),
    transitionEnergy: excited.value - ground.value,
  };
}

describe('coupling.gmh', () => {
  it('returns |H| exactly from adiabatic data of a two-state model (SCIENCE.md §8 self-consistency)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1, max: 1, noNaN: true }),
        fc.double({ min: 0.01, max: 0.5, noNaN: true }),
        fc.double({ min: 2, max: 30, noNaN: true }),
        (gap, h, muDiff) => {
          const data = adiabaticData(0, gap, h, 0, muDiff);
          const answer = computeOk('coupling.gmh', data);
          expect(relativeError(numberOutput(answer, 'coupling'), h)).toBeLessThan(1e-9);
        },
      ),
    );
  });

  it('reduces to Mulliken–Hush μ₁₂ΔE/Δμ when μ₁₂ ≪ Δμ (Hush 1967)', () => {
    const answer = computeOk('coupling.gmh', {
      transitionDipole: 0.01,
      dipoleDifference: 20,
      transitionEnergy: 2,
    });
    expect(relativeError(numberOutput(answer, 'coupling'), (0.01 * 2) / 20)).toBeLessThan(1e-6);
    // 1 eV = 8065.543937 cm⁻¹ (CODATA 2018, SCIENCE.md §16).
    expect(numberOutput(answer, 'couplingCm1')).toBeCloseTo(
      numberOutput(answer, 'coupling') * 8065.543937,
      8,
    );
  });

  it('gives the same H for dipoles in D and in e·Å (1 D = 0.20819433271 e·Å)', () => {
    const debye = computeOk('coupling.gmh', {
      transitionDipole: 3,
      dipoleDifference: 12,
      transitionEnergy: 1.5,
    });
    const mixed = computeOk('coupling.gmh', {
      transitionDipole: { value: 3 * 0.20819433271, unit: 'e*A' },
      dipoleDifference: 12,
      transitionEnergy: 1.5,
    });
    expect(numberOutput(mixed, 'coupling')).toBeCloseTo(numberOutput(debye, 'coupling'), 12);
  });

  it('warns for strongly mixed states μ₁₂ > Δμ₁₂/2 (B32)', () => {
    const answer = computeOk('coupling.gmh', {
      transitionDipole: 6,
      dipoleDifference: 4,
      transitionEnergy: 1,
    });
    expect(warningCodes(answer)).toContain('gmh-strong-mixing');
  });

  it('refuses ΔE ≤ 0 and both dipoles zero (A29)', () => {
    const message = 'Adiabatic gap must be > 0; dipoles cannot both be zero.';
    expect(
      computeRefused('coupling.gmh', {
        transitionDipole: 0,
        dipoleDifference: 0,
        transitionEnergy: 0,
      }),
    ).toEqual([
      { field: 'transitionEnergy', message },
      { field: 'transitionDipole', message },
    ]);
  });
});
