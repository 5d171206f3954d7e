import { describe, expect, it } from 'vitest';
import { provenanceHref, provenanceParts, provenanceText } from './provenance-text';

const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i;
const A = '3f0c1a52-7d4e-4b1a-9c55-0e1f2a3b4c5d';
const B = '9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d';

describe('provenanceText', () => {
  it('names the helper and prints its inputs by their labels with canonical units', () => {
    // Inputs of the demo DA-3 λ_outer (apps/api/src/seed/demo-data.ts); units per CALC-API.md reorg.twoSphere.
    expect(
      provenanceText({
        kind: 'derived',
        methodId: 'reorg.twoSphere',
        methodInputs: { epsilon: 35.9, distance: 10.8, radiusDonor: 5.5, refractiveIndex: 1.344 },
      }),
    ).toBe(
      'Derived with the two-sphere continuum helper from static dielectric constant ε_s = 35.9, ' +
        'centre-to-centre distance R = 10.8 Å, donor radius a_D = 5.5 Å, refractive index n = 1.344.',
    );
  });

  it('prints inputs typed with a unit in that unit, never as JSON', () => {
    // The pair page's helper dialog stores { value, unit } as typed.
    const text = provenanceText({
      kind: 'derived',
      methodId: 'coupling.hush',
      methodInputs: {
        bandMaximum: { value: 15000, unit: 'cm-1' },
        molarAbsorptivity: { value: 500, unit: 'M-1 cm-1' },
        distance: { unit: 'A', value: 12 },
      },
      note: 'From the CT band of the dyad',
    });
    expect(text).toBe(
      'Derived with the Hush charge-transfer band helper from band maximum ν̃_max = 15000 cm⁻¹, ' +
        'peak molar absorptivity ε_max = 500 M⁻¹ cm⁻¹, donor–acceptor distance r_DA = 12 Å. ' +
        'From the CT band of the dyad.',
    );
    expect(text).not.toContain('{');
  });

  it('names the traces of a trace analysis by their files and links the analysis, no ids or hashes', () => {
    const p = {
      kind: 'derived' as const,
      methodId: 'reorg.gapSamples',
      methodInputs: {
        estimator: 'lambdaFromMeans',
        temperature: 300,
        reactantTraceId: A,
        productTraceId: B,
        reactantFileName: 'reactant.dat',
        productFileName: 'product.dat',
        reactantSha256: 'ab'.repeat(32),
        productSha256: 'cd'.repeat(32),
        reactantSamples: 4000,
        productSamples: 3990,
        skippedLines: 1,
      },
      sources: [
        { type: 'trace-analysis', id: B },
        { type: 'trace', id: A },
      ],
    };
    const text = provenanceText(p);
    expect(text).toBe(
      'Derived from a trace analysis of the energy-gap samples reactant.dat (reactant state) and ' +
        'product.dat (product state), at 300 K, λ from the mean gaps of both states, 4000 and 3990 ' +
        'samples, 1 bad line skipped.',
    );
    expect(text).not.toMatch(UUID);
    expect(text).not.toContain('abab');
    const linked = provenanceParts(p).filter((x) => x.link);
    expect(linked).toEqual([{ text: 'trace analysis', link: { type: 'trace-analysis', id: B } }]);
    expect(provenanceHref(linked[0].link!, 'w1')).toBe(`/w/w1/trace-analyses/${B}`);
  });

  it('reads the file names of older trace values from their note', () => {
    const text = provenanceText({
      kind: 'derived',
      methodId: 'reorg.gapSamples',
      methodInputs: { reactantTraceId: A, productTraceId: B, temperature: 310 },
      sources: [{ type: 'trace-analysis', id: A }],
      note: 'From energy-gap samples (r.csv, p.csv) at 310 K',
    });
    expect(text).toContain('energy-gap samples r.csv (reactant state) and p.csv (product state)');
    expect(text).not.toMatch(UUID);
  });

  it('names a fitted series and links it', () => {
    const p = {
      kind: 'derived' as const,
      methodId: 'fit.drivingForceSeries',
      methodInputs: { seriesId: A, seriesVersion: 2, model: 'mlj', points: 6, temperature: 298.15 },
      sources: [{ type: 'series', id: A }],
      note: 'Fitted to series "Quinones in MeCN" (mlj, 6 points).',
    };
    expect(provenanceText(p)).toBe(
      'Fitted to the driving-force series “Quinones in MeCN” (Marcus–Levich–Jortner, 6 points) ' +
        'at 298.15 K.',
    );
    expect(provenanceParts(p).find((x) => x.link)?.link).toEqual({ type: 'series', id: A });
  });

  it('links the screen a row came from', () => {
    const p = {
      kind: 'derived' as const,
      methodId: 'drivingForce.rehmWeller',
      methodInputs: { donorOxidation: 1.1, acceptorReduction: -0.5, epsilon: Number.NaN },
      sources: [{ type: 'screen', id: B }],
      note: 'From screen "Donors × acceptors", line 12.',
    };
    expect(provenanceText(p)).toBe(
      'Derived with the Rehm–Weller helper from donor oxidation potential E_ox(D⁺/D) = 1.1 V, ' +
        'acceptor reduction potential E_red(A/A⁻) = −0.5 V. From screen "Donors × acceptors", line 12.',
    );
    expect(provenanceParts(p).at(-2)).toEqual({
      text: 'From screen "Donors × acceptors", line 12',
      link: { type: 'screen', id: B },
    });
  });

  it('writes the plain kinds as sentences', () => {
    expect(provenanceText({ kind: 'literature', citation: 'Group notebook, p. 2' })).toBe(
      'From the literature: Group notebook, p. 2.',
    );
    expect(provenanceText({ kind: 'measured', note: 'CV in MeCN, 0.1 M TBAPF6' })).toBe(
      'Measured: CV in MeCN, 0.1 M TBAPF6.',
    );
    expect(provenanceText({ kind: 'assumed' })).toBe('Assumed.');
    expect(provenanceText({ kind: 'computed', note: 'DFT, B3LYP' })).toBe('Computed: DFT, B3LYP.');
  });

  it('leaves out inputs it cannot print rather than dumping them', () => {
    expect(
      provenanceText({ kind: 'derived', methodId: 'no.such', methodInputs: { x: 2, o: { a: 1 } } }),
    ).toBe('Derived by no.such from x = 2.');
  });
});
