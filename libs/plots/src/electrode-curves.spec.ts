import { calculate } from '@gapwise/calc';
import { describe, expect, it } from 'vitest';
import { electrodeCurves } from './electrode-curves';

const T = 298.15;

describe('electrodeCurves', () => {
  const curves = electrodeCurves({ lambdaEv: 0.3, temperatureK: T, log10k0: 0 });

  it('equals the core method electrode.mhc and electrode.butlerVolmer point by point', () => {
    for (const p of curves.points.filter((_, i) => i % 20 === 0)) {
      const mhc = calculate({
        method: 'electrode.mhc',
        inputs: { lambda: 0.3, overpotential: p.etaV, temperature: T },
      });
      const zero = calculate({
        method: 'electrode.mhc',
        inputs: { lambda: 0.3, overpotential: 0, temperature: T },
      });
      const bv = calculate({
        method: 'electrode.butlerVolmer',
        inputs: { k0: 1, alpha: 0.5, overpotential: p.etaV, temperature: T },
      });
      if (!mhc.ok || !zero.ok || !bv.ok) throw new Error('refused');
      const o = mhc.outputs as Record<string, number>;
      const z = zero.outputs as Record<string, number>;
      expect(p.mhcRed).toBeCloseTo(o['log10kRedIntegral'] - z['log10kRedIntegral'], 10);
      expect(p.mhcOx).toBeCloseTo(o['log10kOxIntegral'] - z['log10kOxIntegral'], 10);
      expect(p.closedRed).toBeCloseTo(o['log10kRed'] - z['log10kRedIntegral'], 10);
      expect(p.bvRed).toBeCloseTo((bv.outputs as Record<string, number>)['log10kRed'], 12);
    }
  });

  it('gives the SCIENCE.md §11 factors at λ = 0.3 eV, η = −0.2 V: MHC ×18.8, BV ×49', () => {
    const at = electrodeCurves({
      lambdaEv: 0.3,
      temperatureK: T,
      log10k0: 0,
      etaRangeV: [-0.2, 0.2],
      steps: 3,
    }).points[0];
    expect(10 ** at.mhcRed).toBeCloseTo(18.8, 0);
    expect(10 ** at.bvRed).toBeCloseTo(49, -1);
  });

  it('has α → ½ near η = 0, α falling and negative curvature at large |η|, and the plateau', () => {
    const near = curves.points.reduce((a, b) => (Math.abs(b.etaV) < Math.abs(a.etaV) ? b : a));
    expect(near.apparentAlpha).toBeCloseTo(0.5, 2);
    const far = curves.points[0]; // η = −0.6 V, beyond λ
    expect(far.apparentAlpha).toBeLessThan(0.2);
    expect(far.curvature).toBeLessThan(0);
    // I → 2√(πλ̃) (SCIENCE.md §11): the curve approaches the limit from below.
    expect(far.mhcRed).toBeLessThan(curves.log10Limit);
    const deep = electrodeCurves({
      lambdaEv: 0.3,
      temperatureK: T,
      log10k0: 0,
      etaRangeV: [-3, -3],
      steps: 1,
    });
    expect(deep.points[0].mhcRed).toBeCloseTo(deep.log10Limit, 3);
  });
});
