/**
 * Where a pair sits between the nonadiabatic (golden-rule) and the adiabatic limit (SCIENCE.md §3,
 * CALC-API.md "couplingRegime"), and the B4 warnings of VALIDATION.md (|H_AB| > k_BT, γ > 0.1,
 * κ_A > 0.1) that every rate method computing those quantities attaches.
 */
import { BOLTZMANN_EV_PER_K, PLANCK_EV_S } from '../core/constants';
import type { WarningSink } from '../core/method';
import { WARNING_CODES } from '../core/warnings';

/** ν_n used for γ when the request gives none (CALC-API.md: 1e13 s⁻¹). */
export const DEFAULT_NUCLEAR_FREQUENCY_PER_S = 1e13;

/** `couplingRegime` of CALC-API.md. */
export type CouplingRegime = 'nonadiabatic' | 'intermediate' | 'adiabatic';

/** Below this γ or κ_A a pair is nonadiabatic; above the upper bound, adiabatic (CALC-API.md). */
export const NONADIABATIC_BELOW = 0.1;
export const ADIABATIC_ABOVE = 10;

/**
 * Landau–Zener adiabaticity γ = ν_el/(2ν_n) = π^(3/2)|H_AB|²/(h ν_n (λk_BT)^(1/2)), with h (not ħ).
 * Reference: M. D. Newton, N. Sutin, Annu. Rev. Phys. Chem. 1984, 35, 437
 * (doi 10.1146/annurev.pc.35.100184.002253; from memory); Landau–Zener form as in the IUPAC Gold
 * Book "Landau–Zener model" (checked), with ε₁₂ read as the coupling H_12.
 */
export function landauZenerGamma(
  couplingEv: number,
  lambdaEv: number,
  temperatureK: number,
  nuclearFrequencyPerS: number,
): number {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  return (
    (Math.PI ** 1.5 * couplingEv * couplingEv) /
    (PLANCK_EV_S * nuclearFrequencyPerS * Math.sqrt(lambdaEv * thermalEv))
  );
}

/** Classifies γ or κ_A: < 0.1 nonadiabatic, > 10 adiabatic, otherwise intermediate. */
export function classifyAdiabaticity(parameter: number): CouplingRegime {
  if (parameter < NONADIABATIC_BELOW) return 'nonadiabatic';
  return parameter > ADIABATIC_ABOVE ? 'adiabatic' : 'intermediate';
}

export interface AdiabaticityMeasures {
  readonly gamma: number;
  /** κ_A = 4π|H|²τ_L/(ħλ), only when τ_L is known. */
  readonly kappa?: number;
  readonly regime: CouplingRegime;
}

/**
 * γ (with ν_n, default 1e13 s⁻¹) and, when τ_L is known, κ_A; the regime comes from κ_A when it
 * exists, otherwise from γ (CALC-API.md).
 */
export function adiabaticityMeasures(
  couplingEv: number,
  lambdaEv: number,
  temperatureK: number,
  options: { readonly kappa?: number; readonly nuclearFrequencyPerS?: number } = {},
): AdiabaticityMeasures {
  const gamma = landauZenerGamma(
    couplingEv,
    lambdaEv,
    temperatureK,
    options.nuclearFrequencyPerS ?? DEFAULT_NUCLEAR_FREQUENCY_PER_S,
  );
  const regime = classifyAdiabaticity(options.kappa ?? gamma);
  return { gamma, kappa: options.kappa, regime };
}

const fmt = (x: number) =>
  Math.abs(x) >= 100 || Math.abs(x) < 0.01 ? x.toExponential(2) : x.toPrecision(3);

/**
 * B4 of VALIDATION.md and the tool rule of SCIENCE.md §3: warn when |H_AB| > k_BT, γ > 0.1 or
 * κ_A > 0.1, naming each condition that holds with its value.
 * @param corrected the method's own result already includes an adiabatic correction (crossover,
 *   Landau–Zener, adiabatic barrier); the message then says what still holds.
 */
export function warnAdiabaticity(
  couplingEv: number,
  temperatureK: number,
  measures: AdiabaticityMeasures,
  sink: WarningSink,
  corrected = false,
): void {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  const reasons: string[] = [];
  const h = Math.abs(couplingEv);
  if (h > thermalEv) reasons.push(`|H_AB| = ${fmt(h)} eV > k_BT = ${fmt(thermalEv)} eV`);
  if (measures.gamma > NONADIABATIC_BELOW)
    reasons.push(`Landau–Zener γ = ${fmt(measures.gamma)} > 0.1`);
  if (measures.kappa !== undefined && measures.kappa > NONADIABATIC_BELOW)
    reasons.push(`κ_A = ${fmt(measures.kappa)} > 0.1`);
  if (reasons.length === 0) return;
  sink.warn(
    WARNING_CODES.couplingLarge,
    corrected
      ? `Not in the weak-coupling limit (${reasons.join('; ')}; ${measures.regime}): the ` +
          'golden-rule rate overestimates; this result includes the adiabatic correction, whose ' +
          'own inputs (τ_L, ν_n) now decide it.'
      : `Nonadiabatic (golden-rule) formula overestimates (${reasons.join('; ')}; ` +
          `${measures.regime}); an adiabatic or solvent-controlled correction is needed: the ` +
          'solvent-controlled crossover (with the solvent relaxation time τ_L), the Landau–Zener ' +
          'transmission, or the adiabatic barrier.',
  );
}
