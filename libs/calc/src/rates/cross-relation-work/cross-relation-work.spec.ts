import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeOk, computeRefused, numberOutput } from '../../methods/testing/answers';
import { debyeKappaPerAngstrom } from './cross-relation-work';

const base = { k11: 4.2, k22: 3.3e6, K12: 1.2e4, temperature: 298.15 };
const charged = {
  ...base,
  charge1: 2,
  charge2: 3,
  productCharge1: 3,
  productCharge2: 2,
  radius1: 3.4,
  radius2: 6.8,
  epsilon: 78.4,
  ionicStrength: 0.1,
};

describe('rate.crossRelationWork', () => {
  it('equals rate.crossRelation exactly when every work term is zero (z₁z₂ = z₁′z₂′ = z₁z₁′ = z₂z₂′ = 0)', () => {
    const zero = computeOk('rate.crossRelationWork', {
      ...charged,
      charge1: 0,
      charge2: 1,
      productCharge1: 1,
      productCharge2: 0,
    });
    const plain = computeOk('rate.crossRelation', base);
    expect(numberOutput(zero, 'k12')).toBe(numberOutput(plain, 'k12'));
    expect(numberOutput(zero, 'f12')).toBe(numberOutput(plain, 'f12'));
    expect(numberOutput(zero, 'W12')).toBe(1);
  });

  it('matches an independent mathjs evaluation of the Marcus–Sutin (1985) form', () => {
    const answer = computeOk('rate.crossRelationWork', charged);
    const scope = {
      k11: 4.2,
      k22: 3.3e6,
      K: 1.2e4,
      Z: 1e11,
      kt: 8.617333262e-5 * 298.15,
      C: 14.3996454784,
      eps: 78.4,
      // κ from its definition in SI units: sqrt(2 N_A μ e²/(ε ε₀ k_B T)), m⁻¹ → Å⁻¹.
      kappa: evaluate(
        'sqrt(2 * 6.02214076e23 * 0.1 * 1000 * (1.602176634e-19)^2 / (78.4 * 8.8541878128e-12 * 1.380649e-23 * 298.15)) * 1e-10',
      ) as number,
    };
    const w = (zi: number, zj: number, r: number) =>
      evaluate('zi * zj * C / (eps * r * (1 + kappa * r))', { ...scope, zi, zj, r }) as number;
    const w12 = w(2, 3, 10.2);
    const w21 = w(3, 2, 10.2);
    const w11 = w(2, 3, 6.8);
    const w22 = w(3, 2, 13.6);
    const lnf = evaluate(
      '(log(K) + (w12 - w21)/kt)^2 / (4 * (log(k11 * k22 / Z^2) + (w11 + w22)/kt))',
      { ...scope, w12, w21, w11, w22 },
    ) as number;
    const k12 = evaluate('sqrt(k11 * k22 * K * exp(lnf)) * exp(-(w12 + w21 - w11 - w22)/(2*kt))', {
      ...scope,
      lnf,
      w12,
      w21,
      w11,
      w22,
    }) as number;
    expect(numberOutput(answer, 'k12') / k12).toBeCloseTo(1, 10);
    expect(numberOutput(answer, 'f12')).toBeCloseTo(Math.exp(lnf), 10);
    const terms = answer.outputs['workTerms'] as Record<string, number>;
    expect(terms['w12']).toBeCloseTo(w12, 12);
    expect(terms['w22']).toBeCloseTo(w22, 12);
  });

  it('uses the Debye–Hückel κ = 0.329 √μ Å⁻¹ of water at 25 °C (Marcus & Sutin 1985, from memory)', () => {
    expect(debyeKappaPerAngstrom(1, 78.4, 298.15)).toBeCloseTo(0.329, 3);
  });

  it('screens the work terms away at high ionic strength (limit μ → ∞)', () => {
    const screened = computeOk('rate.crossRelationWork', { ...charged, ionicStrength: 1e8 });
    const plain = computeOk('rate.crossRelation', base);
    expect(numberOutput(screened, 'k12') / numberOutput(plain, 'k12')).toBeCloseTo(1, 2);
    // Neutral reactants giving a +1/−1 product pair (w11 = w22 = w12 = 0, w21 < 0): the
    // product attraction raises k12 above the plain cross relation, and W12 = exp(−w21/2k_BT).
    const attractive = computeOk('rate.crossRelationWork', {
      ...charged,
      charge1: 0,
      charge2: 0,
      productCharge1: 1,
      productCharge2: -1,
      ionicStrength: 0,
    });
    expect(numberOutput(attractive, 'k12')).toBeGreaterThan(numberOutput(plain, 'k12'));
    const w21 = (attractive.outputs['workTerms'] as Record<string, number>)['w21']!;
    expect(w21).toBeCloseTo(-14.3996454784 / (78.4 * 10.2), 12);
    expect(numberOutput(attractive, 'W12')).toBeCloseTo(
      Math.exp(-w21 / (2 * 8.617333262e-5 * 298.15)),
      12,
    );
  });

  it('warns cross-relation-asymmetric (B24) for a strongly asymmetric reaction', () => {
    const answer = computeOk('rate.crossRelationWork', { ...charged, K12: 1e40 });
    expect(answer.warnings.map((w) => w.code)).toContain('cross-relation-asymmetric');
  });

  it('refuses bad inputs naming the field', () => {
    const fields = (inputs: unknown) =>
      computeRefused('rate.crossRelationWork', inputs).map((e) => e.field);
    expect(fields({ ...charged, productCharge1: 4 })).toContain('productCharge1');
    expect(fields({ ...charged, productCharge2: 4 })).toContain('productCharge2');
    expect(fields({ ...charged, radius1: 0 })).toContain('radius1');
    expect(fields({ ...charged, epsilon: 0.5 })).toContain('epsilon');
    expect(fields({ ...charged, ionicStrength: -1 })).toContain('ionicStrength');
    expect(fields({ ...charged, k11: 1e12, k22: 1e11 })).toContain('k11');
    expect(fields({ ...charged, K12: undefined })).toContain('K12');
    expect(fields({ ...charged, charge1: 1.5 })).toContain('charge1');
    // Attractive self-exchange work pushing ln(k11k22/Z²) + (w11 + w22)/k_BT to ≥ 0: refused.
    expect(
      fields({
        ...charged,
        k11: 1e10,
        k22: 1e10,
        charge1: -3,
        productCharge1: -2,
        charge2: 3,
        productCharge2: 2,
        radius1: 1,
        radius2: 1,
        epsilon: 2,
        ionicStrength: 0,
      }),
    ).toContain('k11');
  });
});
