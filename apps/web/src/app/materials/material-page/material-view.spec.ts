import { computeMaterialResults, type MaterialInput } from '@gapwise/contracts';
import { contributionBars, headline, mobilityCurve, sigmaOf } from './material-view';

/** A square lattice: four neighbours at 5 Å, J = 5 meV (a, b twice as strong). */
const input: MaterialInput = {
  name: 'square',
  lambdaEv: 0.2,
  lambdaSigmaEv: 0.02,
  temperatureK: 300,
  dimensions: 2,
  neighbours: [
    { label: 'a', vectorAngstrom: [5, 0, 0], couplingEv: 0.006 },
    { label: '−a', vectorAngstrom: [-5, 0, 0], couplingEv: 0.006 },
    { label: 'b', vectorAngstrom: [0, 5, 0], couplingEv: 0.003 },
    { label: '−b', vectorAngstrom: [0, -5, 0], couplingEv: 0.003 },
  ],
};

function results() {
  const r = computeMaterialResults(input);
  if (!r.ok) throw new Error('fixture');
  return r.results;
}

describe('material page view', () => {
  it('shares D by r²k: J² ratio 4 gives 40 % / 10 % per neighbour', () => {
    const bars = contributionBars(['a', '−a', 'b', '−b'], results());
    expect(bars.map((b) => b.share)).toEqual(
      [0.4, 0.4, 0.1, 0.1].map((x) => expect.closeTo(x, 12)),
    );
    expect(bars[0].percent).toBe('40 %');
  });

  it('shows μ with the precision its Monte Carlo interval supports', () => {
    const r = results();
    const s = sigmaOf(r.monteCarlo!.mobility)!;
    expect(s).toBeGreaterThan(0);
    expect(headline(r).mobility).toMatch(/±/);
    expect(headline(r).mobility).toContain('cm² V⁻¹ s⁻¹');
  });

  it('draws μ(T) left to right with a marker at the case temperature', () => {
    const curve = mobilityCurve(results(), 300);
    const xs = curve.points.split(' ').map((p) => Number(p.split(',')[0]));
    expect(xs[0]).toBe(60);
    expect(xs[xs.length - 1]).toBe(580);
    expect(curve.marker).not.toBeNull();
  });
});
