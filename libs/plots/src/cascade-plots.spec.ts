import { describe, expect, it } from 'vitest';
import { disconnectivityLayout, energyLevels, populationPaths } from './cascade-plots';

const box = { width: 400, height: 300, left: 40, right: 10, top: 10, bottom: 30 };

describe('cascade plot geometry', () => {
  it('maps log time to x and population to y', () => {
    const { paths, decades } = populationPaths([1e-12, 1e-10], { A: [1, 0] }, box);
    expect(decades.map((d) => d.exponent)).toEqual([-12, -11, -10]);
    // First point at the left edge and the top (p = 1), last at the right and the bottom (p = 0).
    expect(paths['A']).toBe('M40.0,10.0 L390.0,270.0');
  });

  it('puts levels at their energies and side by side when they would overlap', () => {
    const { levels, y } = energyLevels(
      [
        { id: 'G', energy: 0 },
        { id: 'A', energy: 2 },
        { id: 'B', energy: 2.05 },
      ],
      box,
    );
    expect(levels[0].y).toBe(y(0));
    expect(y(0)).toBe(270);
    expect(y(2.05)).toBe(10);
    expect(levels[1].x2).toBeLessThanOrEqual(levels[2].x1);
  });

  it('gives every state its own column, in the order given, when asked', () => {
    const { levels } = energyLevels(
      [
        { id: 'G', energy: 0 },
        { id: 'X', energy: 2 },
        { id: 'C', energy: 1 },
      ],
      box,
      { columnPerState: true },
    );
    expect(levels[0].x2).toBeLessThanOrEqual(levels[1].x1);
    expect(levels[1].x2).toBeLessThanOrEqual(levels[2].x1);
  });

  it('joins two minima at the join energy between them', () => {
    const { points, segments } = disconnectivityLayout(
      [
        { id: 'A', kind: 'minimum', energy: 0, children: [] },
        { id: 'B', kind: 'minimum', energy: 0.5, children: [] },
        { id: 'j', kind: 'join', energy: 1, children: ['A', 'B'] },
      ],
      ['j'],
      box,
    );
    expect(points['j'].x).toBeCloseTo((points['A'].x + points['B'].x) / 2, 9);
    expect(points['j'].y).toBe(10);
    expect(segments).toContainEqual({ x1: points['A'].x, y1: 270, x2: points['A'].x, y2: 10 });
  });
});
