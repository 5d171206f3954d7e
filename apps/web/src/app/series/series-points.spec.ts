import { parsePastedPoints, pointBody } from './series-points';

describe('series points from a paste', () => {
  it('reads labelled rows with commas, tabs or semicolons and skips a header', () => {
    const r = parsePastedPoints(
      'label,dG [kJ/mol],k\nDA-1, -38.6, 4.2e7\nDA-2\t-53.1\t3.5e8\t0.1\nDA-3; -67.5; 1.5e9\n',
    );
    expect(r.problems).toEqual([]);
    expect(r.rows).toEqual([
      { label: 'DA-1', deltaG0: '-38.6', rate: '4.2e7', sigma: '' },
      { label: 'DA-2', deltaG0: '-53.1', rate: '3.5e8', sigma: '0.1' },
      { label: 'DA-3', deltaG0: '-67.5', rate: '1.5e9', sigma: '' },
    ]);
  });

  it('reads unlabelled rows and names the line of a bad cell', () => {
    const r = parsePastedPoints('-0.4, 9.1, 0.2\n-0.6, fast\n-0.8,9.9');
    expect(r.rows.map((p) => p.deltaG0)).toEqual(['-0.4', '-0.8']);
    expect(r.problems).toEqual(['Line 2: rate "fast" is not a number.']);
    expect(parsePastedPoints('A, -0.3, 1e9\nB, x, 1e9').problems).toEqual([
      'Line 2: ΔG° "x" is not a number.',
    ]);
    expect(parsePastedPoints('A, -0.3').problems[0]).toContain('Line 1: expected label');
  });

  it('sends k or log10 k as typed, σ only when given', () => {
    const p = { label: ' DA-1 ', deltaG0: '−0.4', rate: '4.2e7', sigma: '' };
    expect(pointBody(p, 'k')).toEqual({
      label: 'DA-1',
      deltaG0: -0.4,
      k: 4.2e7,
      sigmaLog10k: null,
    });
    expect(pointBody({ ...p, rate: '7.6', sigma: '0.15' }, 'log10k')).toEqual({
      label: 'DA-1',
      deltaG0: -0.4,
      log10k: 7.6,
      sigmaLog10k: 0.15,
    });
  });
});
