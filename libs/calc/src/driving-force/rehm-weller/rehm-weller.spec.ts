import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  warningCodes,
} from '../../methods/testing/answers';

// e²/(4πε₀) in eV Å from CODATA 2018 SI values (e = 1.602176634e-19 C, ε₀ = 8.8541878128e-12 F/m),
// computed here rather than taken from constants.ts.
const COULOMB = 1.602176634e-19 / (4 * Math.PI * 8.8541878128e-12) / 1e-10;

const mecn = {
  donorOxidation: 1.0,
  acceptorReduction: -1.2,
  excitationEnergy: 2.8,
  distance: 7,
  epsilon: 35.94,
  donorReference: 'SCE',
  acceptorReference: 'SCE',
};

describe('drivingForce.rehmWeller', () => {
  it('gives the ion-pair Coulomb term −0.057 eV in acetonitrile at 7 Å (SCIENCE.md §4)', () => {
    const answer = computeOk('drivingForce.rehmWeller', mecn);
    expect(numberOutput(answer, 'coulombTerm')).toBeCloseTo(-0.057, 3);
    expect(numberOutput(answer, 'coulombTerm')).toBeCloseTo(-COULOMB / (35.94 * 7), 9);
    // ΔG°_CS = e(E_ox − E_red) − E₀₀ + w (Rehm & Weller 1970; IUPAC Gold Book, checked).
    expect(numberOutput(answer, 'deltaG0CS')).toBeCloseTo(2.2 - 2.8 - COULOMB / (35.94 * 7), 9);
    expect(numberOutput(answer, 'solventCorrection')).toBe(0);
    expect(warningCodes(answer)).toEqual([]);
  });

  it('satisfies ΔG°_CS + ΔG°_CR = −E₀₀ exactly (SCIENCE.md §4 identity)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1, max: 2, noNaN: true }),
        fc.double({ min: -2.5, max: 0.5, noNaN: true }),
        fc.double({ min: 1, max: 4, noNaN: true }),
        (eox, ered, e00) => {
          const answer = computeOk('drivingForce.rehmWeller', {
            ...mecn,
            donorOxidation: eox,
            acceptorReduction: ered,
            excitationEnergy: e00,
          });
          expect(numberOutput(answer, 'deltaG0CS') + numberOutput(answer, 'deltaG0CR')).toBeCloseTo(
            -e00,
            12,
          );
        },
      ),
    );
  });

  it('makes ΔG° more negative for a more oxidisable donor (SCIENCE.md §4 sign check)', () => {
    const easier = computeOk('drivingForce.rehmWeller', { ...mecn, donorOxidation: 0.8 });
    const harder = computeOk('drivingForce.rehmWeller', mecn);
    expect(numberOutput(easier, 'deltaG0CS')).toBeLessThan(numberOutput(harder, 'deltaG0CS'));
  });

  it('reproduces the acetonitrile → toluene example with the Weller correction (SCIENCE.md §4)', () => {
    // SCIENCE.md §4: r ≈ 3.5–3.8 Å; Born term +1.55 eV, ion pair −0.83 eV at 7.3 Å; ΔG° ≈ −0.66 eV
    // in acetonitrile becomes +0.12 eV in toluene (ε 2.38 and 35.94, from memory).
    const inMecn = { ...mecn, distance: 7.3, excitationEnergy: 2.8 };
    const cs = numberOutput(computeOk('drivingForce.rehmWeller', inMecn), 'deltaG0CS');
    const shifted = { ...inMecn, excitationEnergy: 2.8 + (cs + 0.66) };
    expect(numberOutput(computeOk('drivingForce.rehmWeller', shifted), 'deltaG0CS')).toBeCloseTo(
      -0.66,
      12,
    );
    const toluene = computeOk('drivingForce.rehmWeller', {
      ...shifted,
      epsilon: 2.38,
      radiusDonor: 3.5,
      radiusAcceptor: 3.8,
      epsilonReference: 35.94,
    });
    expect(numberOutput(toluene, 'solventCorrection')).toBeCloseTo(1.55, 2);
    expect(numberOutput(toluene, 'coulombTerm')).toBeCloseTo(-0.83, 2);
    expect(numberOutput(toluene, 'deltaG0CS')).toBeCloseTo(0.12, 2);
    expect(warningCodes(toluene)).toContain('born-correction-large');
  });

  it('warns on unstated or mixed reference electrodes (B15) and a suspicious E₀₀ (B16)', () => {
    const { donorReference: _d, acceptorReference: _a, ...unstated } = mecn;
    expect(warningCodes(computeOk('drivingForce.rehmWeller', unstated))).toContain(
      'reference-electrode',
    );
    const mixed = computeOk('drivingForce.rehmWeller', { ...mecn, acceptorReference: 'Fc+/Fc' });
    expect(warningCodes(mixed)).toContain('reference-electrode');
    expect(
      warningCodes(computeOk('drivingForce.rehmWeller', { ...mecn, excitationEnergy: 6 })),
    ).toContain('excitation-energy-suspect');
    expect(
      warningCodes(computeOk('drivingForce.rehmWeller', { ...mecn, excitationEnergy: 1.1 })),
    ).toContain('excitation-energy-suspect');
  });

  it('refuses R ≤ 0 (A13), ε < 1 (A8), radii ≤ 0 (A10) and an incomplete Born set', () => {
    expect(
      computeRefused('drivingForce.rehmWeller', { ...mecn, distance: 0, epsilon: 0.5 }),
    ).toEqual([
      { field: 'distance', message: 'Ion-pair distance must be > 0.' },
      { field: 'epsilon', message: 'Dielectric constant and refractive index must be ≥ 1.' },
    ]);
    expect(
      computeRefused('drivingForce.rehmWeller', {
        ...mecn,
        radiusDonor: -1,
        radiusAcceptor: 3,
        epsilonReference: 37,
      })[0],
    ).toEqual({ field: 'radiusDonor', message: 'Radii and distances must be > 0.' });
    expect(computeRefused('drivingForce.rehmWeller', { ...mecn, radiusDonor: 3 })[0].field).toBe(
      'epsilonReference',
    );
  });

  describe('charged reactants (SCIENCE.md §4)', () => {
    // Ru(bpy)₃²⁺* / MV²⁺-type couple: z_D = z_A = 2, r_D = 7.0 Å, r_A = 3.5 Å, potentials in
    // acetonitrile (ε_ref = 35.94), ET in dichloromethane (ε_s = 8.93). SCIENCE.md §4 check value
    // (from memory): ΔG_Born = −0.0866 eV, where the neutral form gives +0.26 eV.
    const ru = {
      ...mecn,
      epsilon: 8.93,
      radiusDonor: 7.0,
      radiusAcceptor: 3.5,
      epsilonReference: 35.94,
      chargeDonor: 2,
      chargeAcceptor: 2,
    };

    it('applies the Born term with the real charges: −0.0866 eV', () => {
      const answer = computeOk('drivingForce.rehmWeller', ru);
      expect(numberOutput(answer, 'solventCorrection')).toBeCloseTo(-0.0866, 4);
      // Independent: (e²/8πε₀)[(2z_D + 1)/r_D + (1 − 2z_A)/r_A](1/ε_s − 1/ε_ref).
      const born = (COULOMB / 2) * (5 / 7 + -3 / 3.5) * (1 / 8.93 - 1 / 35.94);
      expect(numberOutput(answer, 'solventCorrection')).toBeCloseTo(born, 10);
      // The neutral (Weller) form would give +0.26 eV: 0.35 eV off.
      const neutral = -(COULOMB / 2) * (1 / 7 + 1 / 3.5) * (1 / 35.94 - 1 / 8.93);
      expect(neutral).toBeCloseTo(0.26, 2);
      // Work terms with the real charges: w(D³⁺A⁺) − w(D²⁺A²⁺) = 14.4 (3·1 − 2·2)/(ε_s R).
      expect(numberOutput(answer, 'coulombTerm')).toBeCloseTo((COULOMB * (3 - 4)) / (8.93 * 7), 10);
      expect(numberOutput(answer, 'deltaG0CS')).toBeCloseTo(
        2.2 - 2.8 + (COULOMB * (3 - 4)) / (8.93 * 7) + born,
        10,
      );
    });

    it('reduces to Weller’s neutral form for z_D = z_A = 0', () => {
      const answer = computeOk('drivingForce.rehmWeller', {
        ...ru,
        chargeDonor: 0,
        chargeAcceptor: 0,
      });
      const neutral = -(COULOMB / 2) * (1 / 7 + 1 / 3.5) * (1 / 35.94 - 1 / 8.93);
      expect(numberOutput(answer, 'solventCorrection')).toBeCloseTo(neutral, 10);
    });

    it('refuses a non-integer or out-of-range charge, naming the field', () => {
      const errors = computeRefused('drivingForce.rehmWeller', { ...ru, chargeDonor: 1.5 });
      expect(errors.map((e) => e.field)).toContain('chargeDonor');
      const far = computeRefused('drivingForce.rehmWeller', { ...ru, chargeAcceptor: 40 });
      expect(far.map((e) => e.field)).toContain('chargeAcceptor');
    });
  });
});
