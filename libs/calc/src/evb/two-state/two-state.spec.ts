import { eigs } from 'mathjs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeOk, numberOutput, warningCodes } from '../../methods/testing/answers';
import { twoStateMixing } from './two-state';

/** Ground energy of the two-state model at reaction coordinate x (SCIENCE.md §3 parabolas). */
function groundAt(x: number, lambda: number, dG: number, h: number): number {
  return twoStateMixing(lambda * x * x, lambda * (x - 1) ** 2 + dG, h).ground;
}

/** Golden-section search for a minimum of f on [a, b] (independent of the code under test). */
function goldenMinimum(f: (x: number) => number, a: number, b: number): number {
  const ratio = (Math.sqrt(5) - 1) / 2;
  let [lo, hi] = [a, b];
  for (let i = 0; i < 200; i++) {
    const c = hi - ratio * (hi - lo);
    const d = lo + ratio * (hi - lo);
    if (f(c) < f(d)) hi = d;
    else lo = c;
  }
  return f((lo + hi) / 2);
}

describe('evb.twoState', () => {
  it('splits exactly 2|H| at the crossing (SCIENCE.md §3)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -5, max: 5, noNaN: true }),
        fc.double({ min: -1, max: 1, noNaN: true }),
        (e, h) => {
          const answer = computeOk('evb.twoState', { energy1: e, energy2: e, coupling: h });
          expect(numberOutput(answer, 'splitting')).toBeCloseTo(2 * Math.abs(h), 12);
        },
      ),
    );
  });

  it('matches mathjs eigs for eigenvalues and the ground-state weight', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -2, max: 2, noNaN: true }),
        fc.double({ min: -2, max: 2, noNaN: true }),
        fc.double({ min: -0.5, max: 0.5, noNaN: true }).filter((h) => Math.abs(h) > 1e-6),
        (e1, e2, h) => {
          const { eigenvectors } = eigs([
            [e1, h],
            [h, e2],
          ]) as unknown as { eigenvectors: { value: number; vector: number[] }[] };
          const [ground, excited] = [...eigenvectors].sort((x, y) => x.value - y.value);
          const mixing = twoStateMixing(e1, e2, h);
          expect(mixing.ground).toBeCloseTo(ground.value, 9);
          expect(mixing.excited).toBeCloseTo(excited.value, 9);
          const norm = ground.vector[0] ** 2 + ground.vector[1] ** 2;
          expect(mixing.groundWeight1).toBeCloseTo(ground.vector[0] ** 2 / norm, 7);
        },
      ),
    );
  });

  it('gives the exact symmetric barrier λ/4 − |H| + H²/λ (SCIENCE.md §3)', () => {
    const [lambda, h] = [0.8, 0.05];
    const barrier =
      groundAt(0.5, lambda, 0, h) - goldenMinimum((x) => groundAt(x, lambda, 0, h), -0.5, 0.5);
    expect(barrier).toBeCloseTo(lambda / 4 - h + (h * h) / lambda, 9);
  });

  it('shows the asymmetric closed form to be 0.0043 eV low for λ 0.8, ΔG° −0.3, H 0.05 (SCIENCE.md §3)', () => {
    const [lambda, dG, h] = [0.8, -0.3, 0.05];
    const ground = (x: number) => groundAt(x, lambda, dG, h);
    const minimum = goldenMinimum(ground, -0.5, 0.3);
    const top = -goldenMinimum((x) => -ground(x), 0, 0.8);
    const closedForm = (lambda + dG) ** 2 / (4 * lambda) - h + (h * h) / (lambda + dG);
    expect(top - minimum - closedForm).toBeCloseTo(0.0043, 4);
  });

  it('notes degenerate uncoupled states and reports weight 0.5', () => {
    const answer = computeOk('evb.twoState', { energy1: 1, energy2: 1, coupling: 0 });
    expect(numberOutput(answer, 'groundWeight1')).toBe(0.5);
    expect(warningCodes(answer)).toContain('degenerate-states');
  });
});
