import {
  binDensities,
  gaussianOverlay,
  mergedReactant,
  normalDensity,
  tiltedReactant,
} from './gap-outputs';

describe('gap output transformations', () => {
  it('turns counts into densities that integrate to one', () => {
    const d = binDensities({ edges: [0, 0.5, 1, 2], counts: [2, 6, 2] });
    expect(d.map((p) => p.density)).toEqual([0.4, 1.2, 0.2]);
    expect(d.reduce((s, p) => s + p.density * (p.x1 - p.x0), 0)).toBeCloseTo(1, 12);
  });

  it('evaluates the normal density (1/√(2π) at the mean of a unit normal)', () => {
    expect(normalDensity(0, 0, 1)).toBeCloseTo(0.3989422804014327, 15);
    expect(normalDensity(1, 1, 0.25)).toBeCloseTo(0.7978845608028654, 15);
    const pts = gaussianOverlay(0, 1, -1, 1, 3);
    expect(pts.map((p) => p.x)).toEqual([-1, 0, 1]);
  });

  it('tilts the reactant curve by x and skips empty bins', () => {
    expect(
      tiltedReactant({
        x: [-0.1, 0, 0.1],
        reactant: [0.3, null, 0.1],
        product: [null, null, null],
      }),
    ).toEqual([
      { x: -0.1, g: 0.19999999999999998 },
      { x: 0.1, g: 0.2 },
    ]);
  });

  it('gives the merged reactant curve as points, none for an analysis without one', () => {
    expect(mergedReactant(undefined)).toEqual([]);
    expect(mergedReactant(null)).toEqual([]);
    expect(
      mergedReactant({
        x: [-0.1, 0.1],
        reactant: [0.3, 0.1],
        product: [0.2, 0.2],
        overlapBins: 1,
        shiftEv: -0.05,
        shiftStandardError: 0.01,
      }),
    ).toEqual([
      { x: -0.1, g: 0.3 },
      { x: 0.1, g: 0.1 },
    ]);
  });
});
