import { calculate } from '@gapwise/calc';
import { FARADAY_C_PER_MOL, parseElectrodeCsv, pointsToCsv } from './electrode-points';
import { caseLog10k0 } from './electrode-page';
import type { ElectrodeCase } from './electrode-api';

describe('parseElectrodeCsv', () => {
  it('reads η, k and direction, skips a header, infers direction from the sign of η', () => {
    const parsed = parseElectrodeCsv('eta, k\n-0.2; 140\n0.1\t30 ox\n0.0 5 red');
    expect(parsed.errors).toEqual([]);
    expect(parsed.points).toEqual([
      { overpotentialV: -0.2, k: 140, direction: 'reduction' },
      { overpotentialV: 0.1, k: 30, direction: 'oxidation' },
      { overpotentialV: 0, k: 5, direction: 'reduction' },
    ]);
    expect(parseElectrodeCsv(pointsToCsv(parsed.points)).points).toEqual(parsed.points);
  });

  it('names the line of a bad point', () => {
    const parsed = parseElectrodeCsv('-0.1, 3\n-0.2, -4\n0.3 abc\n9, 1\n0.1 2 sideways');
    expect(parsed.errors).toEqual([
      'Line 2: rate constant k must be > 0.',
      'Line 3: expected "η (V), k" with two numbers.',
      'Line 4: overpotential η must be within ±3 V.',
      'Line 5: direction must be "reduction" or "oxidation".',
    ]);
  });

  it('converts current density to k = |j|/(FΓ) with the coverage stated', () => {
    const gamma = 1e-10;
    const parsed = parseElectrodeCsv('-0.3, -2.5e-4', {
      currentMode: true,
      coverageMolPerCm2: gamma,
    });
    expect(parsed.points[0].k).toBeCloseTo(2.5e-4 / (FARADAY_C_PER_MOL * gamma), 9);
    expect(parseElectrodeCsv('-0.3, 1', { currentMode: true }).errors[0]).toMatch(/coverage Γ/);
  });
});

describe('caseLog10k0', () => {
  it('is log10 k⁰ as typed, or the core electrode.mhcAbsolute k⁰ from |H| and ρ_M', () => {
    const base = { rateSource: 'k0', k0: 12.5, lambdaEv: 0.8, temperatureK: 298.15 };
    expect(caseLog10k0(base as ElectrodeCase)).toBeCloseTo(Math.log10(12.5), 12);
    const coupled = {
      ...base,
      rateSource: 'coupling',
      k0: null,
      couplingEv: 0.002,
      densityOfStatesPerEv: 0.3,
    } as unknown as ElectrodeCase;
    const core = calculate({
      method: 'electrode.mhcAbsolute',
      inputs: {
        lambda: 0.8,
        overpotential: 0,
        temperature: 298.15,
        coupling: 0.002,
        densityOfStates: 0.3,
      },
    });
    if (!core.ok) throw new Error('refused');
    expect(caseLog10k0(coupled)).toBeCloseTo(Math.log10(core.outputs.k0), 12);
  });
});
