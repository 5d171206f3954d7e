/**
 * The screen score ranks each step with the model valid for it: a recombination deep in the
 * inverted region of a row without ħω is ranked with MLJ at the assumed ħω (the row marked),
 * not with the classical rate that lies orders of magnitude too low there. Expected rates come
 * from an independent evaluation of the published formulas below (plain sums, not the core).
 */
import { describe, expect, it } from 'vitest';
import { computeChunk, warningCodes } from './chunk-computer';
import type { InputChunk } from './screen-parser';
import { DEFAULT_ASSUMED_HBAR_OMEGA_EV, INVERTED_CR_BONUS, parseScoreChoice } from './screen-score';

// CODATA 2018: ħ in eV·s and k_B in eV/K.
const HBAR_EV_S = 6.582119569e-16;
const KB_EV_PER_K = 8.617333262e-5;

/** Classical Marcus (Marcus, J. Chem. Phys. 1956, 24, 966; nonadiabatic prefactor). */
function marcusLog10k(dG: number, lambda: number, h: number, t: number): number {
  const kT = KB_EV_PER_K * t;
  const k =
    ((2 * Math.PI) / HBAR_EV_S) *
    h ** 2 *
    (1 / Math.sqrt(4 * Math.PI * lambda * kT)) *
    Math.exp(-((dG + lambda) ** 2) / (4 * lambda * kT));
  return Math.log10(k);
}

/** MLJ, one quantum mode (Jortner, J. Chem. Phys. 1976, 64, 4860), summed to convergence. */
function mljLog10k(dG: number, lamS: number, lamV: number, hw: number, h: number, t: number) {
  const kT = KB_EV_PER_K * t;
  const s = lamV / hw;
  let sum = 0;
  let poisson = Math.exp(-s);
  for (let n = 0; n < 200; n++) {
    if (n > 0) poisson *= s / n;
    sum += poisson * Math.exp(-((dG + lamS + n * hw) ** 2) / (4 * lamS * kT));
  }
  const k = ((2 * Math.PI) / HBAR_EV_S) * h ** 2 * (1 / Math.sqrt(4 * Math.PI * lamS * kT)) * sum;
  return Math.log10(k);
}

const KEYS = [
  'donorOxidation',
  'acceptorReduction',
  'excitationEnergy',
  'distance',
  'radiusDonor',
  'radiusAcceptor',
  'epsilon',
  'refractiveIndex',
  'epsilonReference',
  'chargeDonor',
  'chargeAcceptor',
  'lambdaInner',
  'lambdaOuter',
  'coupling',
  'coupling0',
  'distance0',
  'beta',
  'hbarOmega',
  'temperature',
] as const;

function chunkOf(rows: Array<Partial<Record<(typeof KEYS)[number], number>>>): InputChunk {
  const values = Object.fromEntries(
    KEYS.map((k) => [k, Float64Array.from(rows, (r) => r[k] ?? Number.NaN)]),
  ) as unknown as InputChunk['values'];
  return {
    index: 0,
    lines: rows.map((_, i) => i + 2),
    donor: rows.map((_, i) => `D-${i}`),
    acceptor: rows.map((_, i) => `A-${i}`),
    solvent: rows.map(() => ''),
    values,
  } as InputChunk;
}

// Recombination ΔG°_CR ≈ −2.6 eV against λ = 0.9 eV: deep in the inverted region; charge
// separation ΔG°_CS ≈ −0.4 eV: normal region.
const base = {
  donorOxidation: 1.6,
  acceptorReduction: -1.0,
  excitationEnergy: 3.0,
  distance: 10,
  radiusDonor: 4,
  radiusAcceptor: 4,
  epsilon: 37.5,
  refractiveIndex: 1.344,
  lambdaInner: 0.3,
  lambdaOuter: 0.6,
  coupling: 0.01,
  temperature: 298.15,
};

describe('screen score: the model valid for each step', () => {
  it('ranks an inverted recombination without ħω with MLJ at the assumed ħω, and marks the row', () => {
    const out = computeChunk(chunkOf([base]), { kind: 'cs-fast-cr-inverted' });
    const dCs = out.deltaGCs[0];
    const dCr = out.deltaGCr[0];
    expect(-dCr).toBeGreaterThan(0.9);
    expect(-dCs).toBeLessThan(0.9);
    const cs = marcusLog10k(dCs, 0.9, 0.01, 298.15);
    const crMlj = mljLog10k(dCr, 0.6, 0.3, DEFAULT_ASSUMED_HBAR_OMEGA_EV, 0.01, 298.15);
    const crClassical = marcusLog10k(dCr, 0.9, 0.01, 298.15);
    expect(out.score[0]).toBeCloseTo(cs - crMlj + INVERTED_CR_BONUS, 6);
    // The classical score would have been many decades higher (the trap of the issue).
    expect(cs - crClassical + INVERTED_CR_BONUS - out.score[0]).toBeGreaterThan(5);
    expect(warningCodes(out.warningMask[0])).toContain('assumed-hbar-omega');
    // The MLJ columns keep what the row's own inputs give (no ħω: none).
    expect(Number.isNaN(out.log10kCrMlj[0])).toBe(true);
  });

  it('uses the ħω the user set, and the row’s own ħω when it gives one (not marked)', () => {
    const set = computeChunk(chunkOf([base]), {
      kind: 'cs-fast-cr-inverted',
      assumedHbarOmegaEv: 0.1,
    });
    const cs = marcusLog10k(set.deltaGCs[0], 0.9, 0.01, 298.15);
    const cr = mljLog10k(set.deltaGCr[0], 0.6, 0.3, 0.1, 0.01, 298.15);
    expect(set.score[0]).toBeCloseTo(cs - cr + INVERTED_CR_BONUS, 6);

    const own = computeChunk(chunkOf([{ ...base, hbarOmega: 0.15 }]), {
      kind: 'cs-fast-cr-inverted',
    });
    const csOwn = mljLog10k(own.deltaGCs[0], 0.6, 0.3, 0.15, 0.01, 298.15);
    const crOwn = mljLog10k(own.deltaGCr[0], 0.6, 0.3, 0.15, 0.01, 298.15);
    expect(own.score[0]).toBeCloseTo(csOwn - crOwn + INVERTED_CR_BONUS, 6);
    expect(warningCodes(own.warningMask[0])).not.toContain('assumed-hbar-omega');
  });

  it('keeps classical Marcus for a row whose steps are both in the normal region', () => {
    const normal = { ...base, donorOxidation: 0.6, acceptorReduction: -0.2, excitationEnergy: 1.2 };
    const out = computeChunk(chunkOf([normal]), { kind: 'cs-fast-cr-inverted' });
    expect(-out.deltaGCr[0]).toBeLessThan(0.9);
    const expected =
      marcusLog10k(out.deltaGCs[0], 0.9, 0.01, 298.15) -
      marcusLog10k(out.deltaGCr[0], 0.9, 0.01, 298.15);
    expect(out.score[0]).toBeCloseTo(expected, 6);
    expect(warningCodes(out.warningMask[0])).not.toContain('assumed-hbar-omega');
  });

  it('refuses an assumed ħω outside 100–4000 cm⁻¹, naming the field', () => {
    expect(parseScoreChoice('', '', '5')).toEqual({
      field: 'assumedHbarOmegaEv',
      message: 'must be a number from 0.0124 to 0.496 eV (100–4000 cm⁻¹)',
    });
    expect(parseScoreChoice('', '', '0.2')).toEqual({
      kind: 'cs-fast-cr-inverted',
      assumedHbarOmegaEv: 0.2,
    });
  });
});
