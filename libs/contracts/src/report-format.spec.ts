import { describe, expect, it } from 'vitest';
import { provenanceText } from './report-format';

describe('provenanceText', () => {
  it('prints derivation inputs by their labels, with canonical units, from the method catalog', () => {
    // Inputs of the demo DA-3 λ_outer (apps/api/src/seed/demo-data.ts); units per CALC-API.md reorg.twoSphere.
    const text = provenanceText({
      kind: 'derived',
      methodId: 'reorg.twoSphere',
      methodInputs: { epsilon: 35.9, distance: 10.8, radiusDonor: 5.5, refractiveIndex: 1.344 },
    });
    expect(text).toBe(
      'Derived: reorg.twoSphere from static dielectric constant ε_s = 35.9, ' +
        'centre-to-centre distance R = 10.8 Å, donor radius a_D = 5.5 Å, refractive index n = 1.344',
    );
  });

  it('uses the method’s own units: volts, electronvolts, debye', () => {
    expect(
      provenanceText({
        kind: 'derived',
        methodId: 'drivingForce.rehmWeller',
        methodInputs: { donorOxidation: 0.62, acceptorReduction: -0.72, excitationEnergy: 2.9 },
      }),
    ).toBe(
      'Derived: drivingForce.rehmWeller from donor oxidation potential E_ox(D⁺/D) = 0.62 V, ' +
        'acceptor reduction potential E_red(A/A⁻) = −0.72 V, 0–0 excitation energy E₀₀ = 2.9 eV',
    );
    expect(
      provenanceText({
        kind: 'derived',
        methodId: 'coupling.gmh',
        methodInputs: { transitionDipole: 1.1 },
        note: 'From the CT band',
      }),
    ).toBe('Derived: coupling.gmh from adiabatic transition dipole μ₁₂ = 1.1 D; From the CT band');
  });

  it('leaves unknown methods and non-numeric inputs without units', () => {
    expect(
      provenanceText({ kind: 'derived', methodId: 'no.such', methodInputs: { x: 2, tag: 'a' } }),
    ).toBe('Derived: no.such from x = 2, tag = "a"');
    expect(provenanceText({ kind: 'literature', citation: 'Group notebook, p. 2' })).toBe(
      'Literature: Group notebook, p. 2',
    );
  });
});
