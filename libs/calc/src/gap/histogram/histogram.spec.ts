import seedrandom from 'seedrandom';
import { describe, expect, it } from 'vitest';

import { countInBins, freedmanDiaconisHistogram, percentileSorted } from './histogram';

describe('Freedman–Diaconis histogram', () => {
  it("matches numpy's bins='fd' edges and counts on a fixed series", () => {
    // Expected: numpy 2.4.6, np.histogram_bin_edges(x, 'fd') and np.histogram(x, edges), run by
    // hand for this test with x_i = sin(1.3 i)(1 + i/50), i = 0 … 99.
    const x = Array.from({ length: 100 }, (_, i) => Math.sin(i * 1.3) * (1 + i / 50));
    const expectedEdges = [
      -2.6189303028557136, -1.695849239366805, -0.7727681758778966, 0.1503128876110118,
      1.0733939510999204, 1.996475014588829, 2.9195560780777368,
    ];
    const histogram = freedmanDiaconisHistogram(x);
    expect(histogram.edges.length).toBe(expectedEdges.length);
    histogram.edges.forEach((edge, i) => expect(edge).toBeCloseTo(expectedEdges[i], 14));
    expect(histogram.counts).toEqual([15, 21, 15, 20, 20, 9]);
  });

  it('agrees with an independent implementation on seeded normal data', () => {
    const random = seedrandom('fd');
    const x = Array.from(
      { length: 12_345 },
      () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random()),
    );
    // Independent: sort, numpy "linear" percentiles written as (1 − g)·x_j + g·x_(j+1),
    // h = 2·IQR/n^(1/3), n_bins = ceil(range/h), counts by scanning every edge.
    const s = [...x].sort((a, b) => a - b);
    const q = (p: number) => {
      const h = (s.length - 1) * p;
      const j = Math.floor(h);
      return (1 - (h - j)) * s[j] + (h - j) * s[j + 1];
    };
    const width = (2 * (q(0.75) - q(0.25))) / Math.pow(s.length, 1 / 3);
    const bins = Math.ceil((s[s.length - 1] - s[0]) / width);
    const histogram = freedmanDiaconisHistogram(x);
    expect(histogram.counts.length).toBe(bins);
    const edges = histogram.edges;
    for (let i = 0; i <= bins; i++) {
      expect(edges[i]).toBeCloseTo(s[0] + (i * (s[s.length - 1] - s[0])) / bins, 12);
    }
    const counts = new Array(bins).fill(0);
    for (const v of x) {
      let i = 0;
      while (i < bins - 1 && v >= edges[i + 1]) i++;
      counts[i]++;
    }
    expect(histogram.counts).toEqual(counts);
  });

  it('counts the right edge into the last bin and ignores values outside', () => {
    expect(countInBins([0, 0.5, 1, 1.5, -1], [0, 0.5, 1])).toEqual([1, 2]);
  });

  it('interpolates percentiles linearly (Hyndman–Fan type 7)', () => {
    expect(percentileSorted([1, 2, 3, 4], 0.25)).toBeCloseTo(1.75, 15);
  });
});
