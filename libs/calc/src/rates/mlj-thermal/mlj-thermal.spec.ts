import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  computeOk,
  computeRefused,
  numberOutput,
  relativeError,
  warningCodes,
} from '../../methods/testing/answers';
import { logScaledBesselI } from './mlj-thermal';

// CODATA 2018 (Tiesinga et al. 2021), typed here independently of constants.ts.
const KB_EV = 8.617333262e-5;
const HBAR_EV_S = 6.582119569e-16;

// 40-digit arithmetic for the independent reference (mathjs BigNumber).
// mathjs's typings do not narrow BigNumber arithmetic, so the reference works on `any`.
const big: any = create(all, { number: 'BigNumber', precision: 40 });
type Big = any;
const B = (x: number | string): Big => big.bignumber(x);

/** I_p(z) by its power series Σ_k (z/2)^(2k+p)/(k!(k+p)!) (Abramowitz & Stegun 9.6.10), 60 digits. */
function besselIBig(p: number, z: Big): Big {
  const half = big.divide(z, 2) as Big;
  const q = Math.abs(p);
  let term = big.divide(big.pow(half, q), big.factorial(B(q))) as Big;
  let sum = term;
  for (let k = 1; k < 1500; k++) {
    term = big.divide(big.multiply(term, big.multiply(half, half)), (k * (k + q)) as never) as Big;
    sum = big.add(sum, term) as Big;
    if (big.smaller(term, big.multiply(sum, B('1e-30')))) break;
  }
  return sum;
}

/**
 * Independent reference: the finite-temperature MLJ rate of SCIENCE.md §2 summed in linear space
 * in 40-digit arithmetic, p = −pMax … pMax, weights exp[−S coth(x/2)] e^(px/2) I_p(S/sinh(x/2)).
 */
function mljThermalBig(
  dG: number,
  lamS: number,
  lamV: number,
  hw: number,
  h: number,
  t: number,
  pMax: number,
): number {
  const kT = B(KB_EV * t);
  const s = B(lamV / hw);
  const x = big.divide(B(hw), kT) as Big;
  const halfX = big.divide(x, 2) as Big;
  const z = big.divide(s, big.sinh(halfX)) as Big;
  const base = big.multiply(-1, big.divide(s, big.tanh(halfX))) as Big;
  const width = big.multiply(big.multiply(4, B(lamS)), kT) as Big;
  let sum = B(0);
  const bessel = Array.from({ length: pMax + 1 }, (_, p) => besselIBig(p, z)); // I_−p = I_p
  for (let p = -pMax; p <= pMax; p++) {
    const energy = B(dG + lamS + p * hw);
    const lnW = big.add(base, big.multiply(p, halfX)) as Big;
    const gauss = big.exp(big.divide(big.multiply(-1, big.multiply(energy, energy)), width) as Big);
    sum = big.add(sum, big.multiply(big.multiply(big.exp(lnW), bessel[Math.abs(p)]), gauss)) as Big;
  }
  const prefactor =
    ((2 * Math.PI) / HBAR_EV_S) * h * h * (1 / Math.sqrt(4 * Math.PI * lamS * KB_EV * t));
  return prefactor * big.number(sum);
}

/** Classical Marcus rate with total λ (SCIENCE.md §1), for the ħω ≪ k_BT limit. */
function marcus(dG: number, lam: number, h: number, t: number): number {
  const kT = KB_EV * t;
  return (
    ((2 * Math.PI) / HBAR_EV_S) *
    h *
    h *
    (1 / Math.sqrt(4 * Math.PI * lam * kT)) *
    Math.exp(-((dG + lam) ** 2) / (4 * lam * kT))
  );
}

const base = {
  deltaG0: -0.5,
  lambdaSolvent: 0.3,
  lambdaVib: 0.2,
  coupling: 0.01,
  temperature: 298.15,
};

describe('logScaledBesselI (Miller recurrence)', () => {
  it('agrees with the 40-digit power series for small, moderate and large arguments', () => {
    for (const z of [1e-40, 1e-3, 0.5, 3.54, 40, 200]) {
      const orders = logScaledBesselI(Math.log(z), 60);
      for (const p of [0, 1, 2, 5, 17, 60]) {
        const reference = big.number(
          big.subtract(big.log(besselIBig(p, B(z))), B(z)) as Big,
        ) as number;
        if (!Number.isFinite(reference)) continue;
        expect(Math.abs(orders[p] - reference)).toBeLessThan(
          1e-10 * Math.max(1, Math.abs(reference)),
        );
      }
    }
  });
});

describe('rate.mljThermal', () => {
  it('agrees with an independent 40-digit series summation (mathjs BigNumber) to 1e-9', () => {
    for (const [hw, dG] of [
      [0.05, -0.5],
      [0.02, -1.2],
      [0.12, 0.1],
    ]) {
      const answer = computeOk('rate.mljThermal', { ...base, hbarOmega: hw, deltaG0: dG });
      const reference = mljThermalBig(dG, 0.3, 0.2, hw, 0.01, 298.15, 90);
      expect(relativeError(numberOutput(answer, 'k'), reference)).toBeLessThan(1e-9);
    }
  }, 120_000);

  it('tends to classical Marcus with λ_s + λ_v for ħω ≪ k_BT (SCIENCE.md §2 limit)', () => {
    const answer = computeOk('rate.mljThermal', { ...base, hbarOmega: 0.0005 });
    // Leading correction is O((ħω/k_BT)²/12) in the vibrational width: below 1e-4 here.
    expect(relativeError(numberOutput(answer, 'k'), marcus(-0.5, 0.5, 0.01, 298.15))).toBeLessThan(
      1e-4,
    );
    // The T = 0 sum keeps the narrow λ_s width and is far off in the same case (SCIENCE.md §2).
    const cold = computeOk('rate.mlj', { ...base, hbarOmega: 0.0005 });
    expect(relativeError(numberOutput(cold, 'k'), marcus(-0.5, 0.5, 0.01, 298.15))).toBeGreaterThan(
      0.1,
    );
  });

  it('tends to rate.mlj for ħω ≫ k_BT (SCIENCE.md §2: 0.04% at ħω = 0.18 eV)', () => {
    const thermal = numberOutput(computeOk('rate.mljThermal', { ...base, hbarOmega: 0.18 }), 'k');
    const cold = numberOutput(computeOk('rate.mlj', { ...base, hbarOmega: 0.18 }), 'k');
    // The v = 1 population e^(−ħω/k_BT) = 9e-4 bounds the difference at this ħω.
    expect(relativeError(thermal, cold)).toBeLessThan(Math.exp(-0.18 / (KB_EV * 298.15)));
    const stiff = numberOutput(computeOk('rate.mljThermal', { ...base, hbarOmega: 0.5 }), 'k');
    const stiffCold = numberOutput(computeOk('rate.mlj', { ...base, hbarOmega: 0.5 }), 'k');
    expect(relativeError(stiff, stiffCold)).toBeLessThan(1e-8);
  });

  it('equals classical Marcus with λ_s exactly when λ_v = 0', () => {
    const answer = computeOk('rate.mljThermal', { ...base, lambdaVib: 0, hbarOmega: 0.05 });
    expect(relativeError(numberOutput(answer, 'k'), marcus(-0.5, 0.3, 0.01, 298.15))).toBeLessThan(
      1e-12,
    );
  });

  it('reports couplingRegime and regime like rate.mlj, and no low-frequency-mode warning', () => {
    // γ = 0.03 for |H| = 0.005 eV, λ = 0.5 eV (Newton & Sutin form): nonadiabatic.
    const answer = computeOk('rate.mljThermal', { ...base, coupling: 0.005, hbarOmega: 0.01 });
    expect(answer.outputs['couplingRegime']).toBe('nonadiabatic');
    expect(answer.outputs['regime']).toBe('activationless');
    expect(warningCodes(answer)).not.toContain('low-frequency-mode');
    const strong = computeOk('rate.mljThermal', { ...base, coupling: 0.1, hbarOmega: 0.01 });
    expect(warningCodes(strong)).toContain('coupling-large');
  });

  it('stays finite deep in the inverted region and for stiff modes (log space)', () => {
    const deep = computeOk('rate.mljThermal', { ...base, deltaG0: -3.5, hbarOmega: 0.2 });
    expect(Number.isFinite(numberOutput(deep, 'log10k'))).toBe(true);
    const huge = computeOk('rate.mljThermal', { ...base, hbarOmega: 20 });
    expect(Number.isFinite(numberOutput(huge, 'log10k'))).toBe(true);
  });

  it('refuses as rate.mlj does, naming the field (A1, A5, A6, A7)', () => {
    const fields = (inputs: object) =>
      computeRefused('rate.mljThermal', { ...base, hbarOmega: 0.05, ...inputs }).map(
        (e) => e.field,
      );
    expect(fields({ hbarOmega: 0 })).toContain('hbarOmega');
    expect(fields({ lambdaVib: -0.1 })).toContain('lambdaVib');
    expect(fields({ lambdaSolvent: 0 })).toContain('lambdaSolvent');
    expect(fields({ coupling: 0.3 })).toContain('coupling');
  });

  it('refuses a mode so soft that the sum would need millions of terms', () => {
    const errors = computeRefused('rate.mljThermal', {
      ...base,
      lambdaVib: 50,
      hbarOmega: 1e-7,
    });
    expect(errors[0].field).toBe('hbarOmega');
  });
});
