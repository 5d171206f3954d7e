import { describe, expect, it } from 'vitest';
import { histogramGeometry } from './histogram';

const frame = { width: 320, height: 150, margin: { left: 40, bottom: 30, top: 6, right: 8 } };

describe('histogramGeometry', () => {
  it('draws each bin as its share of the samples, with ticks on both axes', () => {
    // 4 bins of width 0.5 over log10 k 10–12; counts 10, 30, 40, 20 of 100 samples.
    const g = histogramGeometry(
      {
        edges: [10, 10.5, 11, 11.5, 12],
        counts: [10, 30, 40, 20],
        low: 10.6,
        high: 11.4,
        median: 11,
      },
      frame,
    )!;
    expect(g.shares).toEqual([10, 30, 40, 20]);
    // Inner area 272 wide for 2 log10 units: one bin is 68 units wide, minus the 1 unit gap.
    expect(g.bars[0].x).toBeCloseTo(40, 9);
    expect(g.bars[0].width).toBeCloseTo(67, 9);
    // Tallest bar reaches 1/1.1 of the inner height (10 % head room).
    expect(g.bars[2].height).toBeCloseTo(114 / 1.1, 9);
    expect(g.bars.map((b) => b.inside)).toEqual([false, true, true, false]);
    expect(g.medianX).toBeCloseTo(40 + 136, 9);
    expect(g.xTicks.map((t) => t.value)).toEqual([10, 10.5, 11, 11.5, 12]);
    expect(g.yTicks[0]).toEqual({ value: 0, y: 6 + 114 });
    expect(g.yTicks.length).toBeGreaterThanOrEqual(2);
  });

  it('draws nothing without samples or with broken edges', () => {
    const base = { low: 0, high: 1, median: 0.5 };
    expect(histogramGeometry({ ...base, edges: [0, 1], counts: [0] }, frame)).toBeNull();
    expect(histogramGeometry({ ...base, edges: [0, 1, 2], counts: [1] }, frame)).toBeNull();
    expect(histogramGeometry({ ...base, edges: [0, Number.NaN], counts: [3] }, frame)).toBeNull();
  });
});
