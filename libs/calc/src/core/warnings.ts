/**
 * Warnings shared by several methods (VALIDATION.md part B), each with a stable kebab-case code.
 * Methods call these helpers instead of re-wording the same caution, so the web page, the API and
 * the command line show one message per condition.
 */
import { BOLTZMANN_EV_PER_K, CM1_PER_EV } from './constants';
import type { WarningSink } from './method';

/** Stable warning codes of the calculation core (VALIDATION.md part B numbers in comments). */
export const WARNING_CODES = {
  invertedRegion: 'inverted-region', // B1
  rateUnderflow: 'rate-underflow', // B2
  lambdaBelowKt: 'lambda-below-kt', // B3
  couplingLarge: 'coupling-large', // B4
  barrierLowering: 'coupling-barrier-lowering', // B5
  lowFrequencyMode: 'low-frequency-mode', // B6
  mljNotConverged: 'mlj-not-converged', // B7
  temperatureRange: 'temperature-range', // B8
  valueUnusuallyLarge: 'value-unusually-large', // B9
  energyUnitSuspect: 'energy-unit-suspect', // B10
  couplingUnitSuspect: 'coupling-unit-suspect', // B11
  nearlyNonpolar: 'nearly-nonpolar', // B12
  continuumRange: 'continuum-range', // B13
  bornCorrectionLarge: 'born-correction-large', // B14
  referenceElectrode: 'reference-electrode', // B15
  excitationEnergySuspect: 'excitation-energy-suspect', // B16
  rulerEndergonic: 'ruler-endergonic', // B22
  rulerRange: 'ruler-range', // B23
  crossRelationAsymmetric: 'cross-relation-asymmetric', // B24
  hushBandNarrow: 'hush-band-narrow', // B31
  quenchAboveDiffusion: 'kq-above-diffusion-limit', // B33 (also quench.diffusion)
  gmhStrongMixing: 'gmh-strong-mixing', // B32
  couplingZero: 'coupling-zero', // note: H = 0 gives k = 0
  couplingNegative: 'coupling-negative', // note: sign is gauge-dependent, |H| used
  fourPointNegative: 'four-point-negative',
  degenerateStates: 'degenerate-states',
  mixedStates: 'mixed-states', // kinetics.network: two states within k_BT with a large |H_AB|
  stepTooFast: 'step-too-fast', // kinetics.network: k above ~1e13 s⁻¹ (vibrational relaxation)
} as const;

/**
 * The plausibility ranges of VALIDATION.md B8–B11 and B16, in one place: the core's warnings,
 * the pair fields and the derivation helpers of the web page all read these numbers.
 */
export const PLAUSIBLE_RANGES = {
  /** B8: outside this range, check that λ, ΔG°, ε_s, τ_L refer to this temperature. */
  temperatureK: { min: 150, max: 500 },
  /** B9: |λ| above this is unusually large. */
  lambdaEvMax: 3,
  /** B9: |ΔG°| above this is unusually large. */
  deltaG0EvMax: 4,
  /** B9: |H_AB| above this is unusually large. */
  couplingEvMax: 0.5,
  /** B10: λ or |ΔG°| typed in eV within this range looks like kJ/mol or cm⁻¹. */
  energyTypedAsEvSuspect: { min: 20, max: 1000 },
  /** B11: H_AB typed in eV above this, or in cm⁻¹ below `couplingCm1Min`, suggests a unit slip. */
  couplingTypedEvMax: 10,
  couplingCm1Min: 0.01,
  /** B16: E₀₀ above this is implausible (0–0 energy, not absorption maximum). */
  excitationEnergyEvMax: 5,
} as const;

/** Thermal energy k_BT in eV (CODATA 2018 k_B). */
export function thermalEnergyEv(temperatureK: number): number {
  return BOLTZMANN_EV_PER_K * temperatureK;
}

/** Whether a typed unit means eV (a bare number is canonical eV). */
function typedInEv(unit: string): boolean {
  return unit === '' || unit === 'eV';
}

/** B8: temperatures outside 150–500 K. */
export function warnTemperatureRange(temperatureK: number, sink: WarningSink): void {
  if (
    temperatureK < PLAUSIBLE_RANGES.temperatureK.min ||
    temperatureK > PLAUSIBLE_RANGES.temperatureK.max
  ) {
    sink.warn(
      WARNING_CODES.temperatureRange,
      'Check that λ, ΔG°, ε_s, τ_L refer to this temperature; classical Marcus questionable at ' +
        `low T (T = ${temperatureK} K).`,
    );
  }
}

/**
 * B9 and B10 for a reorganization energy or driving force: unusually large values, and values
 * that look like kJ/mol or cm⁻¹ typed as eV.
 * @param kind 'lambda' (B9 threshold 3 eV) or 'deltaG0' (B9 threshold 4 eV on |ΔG°|)
 */
export function warnEnergyMagnitude(
  field: string,
  kind: 'lambda' | 'deltaG0',
  valueEv: number,
  typedUnit: string,
  sink: WarningSink,
): void {
  const magnitude = Math.abs(valueEv);
  const limit = kind === 'lambda' ? PLAUSIBLE_RANGES.lambdaEvMax : PLAUSIBLE_RANGES.deltaG0EvMax;
  if (magnitude > limit) {
    sink.warn(
      WARNING_CODES.valueUnusuallyLarge,
      `Unusually large value of ${field} (${valueEv} eV); check units (kJ/mol entered as eV?).`,
    );
  }
  const suspect = PLAUSIBLE_RANGES.energyTypedAsEvSuspect;
  if (typedInEv(typedUnit) && magnitude >= suspect.min && magnitude <= suspect.max) {
    sink.warn(
      WARNING_CODES.energyUnitSuspect,
      `${field} = ${valueEv} eV looks like kJ/mol or cm⁻¹ entered as eV.`,
    );
  }
}

/** B9 (|H| > 0.5 eV) and B11 (H typed in eV but > 10, or in cm⁻¹ but < 0.01 cm⁻¹). */
export function warnCouplingMagnitude(
  field: string,
  couplingEv: number,
  typedUnit: string,
  sink: WarningSink,
): void {
  const magnitude = Math.abs(couplingEv);
  if (magnitude > PLAUSIBLE_RANGES.couplingEvMax) {
    sink.warn(
      WARNING_CODES.valueUnusuallyLarge,
      `Unusually large value of ${field} (${couplingEv} eV); check units (kJ/mol entered as eV?).`,
    );
  }
  const typedCm1 = magnitude * CM1_PER_EV;
  if (
    (typedInEv(typedUnit) && magnitude > PLAUSIBLE_RANGES.couplingTypedEvMax) ||
    (typedUnit === 'cm-1' && magnitude > 0 && typedCm1 < PLAUSIBLE_RANGES.couplingCm1Min)
  ) {
    sink.warn(WARNING_CODES.couplingUnitSuspect, `Check coupling units (${field}).`);
  }
}

/** B3: λ below k_BT makes the classical Gaussian unreliable. */
export function warnLambdaBelowKt(lambdaEv: number, temperatureK: number, sink: WarningSink): void {
  if (lambdaEv < thermalEnergyEv(temperatureK)) {
    sink.warn(
      WARNING_CODES.lambdaBelowKt,
      'λ smaller than thermal energy: classical Gaussian not reliable.',
    );
  }
}

/**
 * B1: the inverted region, where classical Marcus neglects nuclear tunnelling. The same rule as
 * the `regime` output (CALC-API.md): inside the activationless band |ΔG° + λ| ≤ 0.01 λ there is
 * no inverted-region warning, so `activationless` never comes with `inverted-region`.
 */
export function warnInvertedRegion(deltaG0Ev: number, lambdaEv: number, sink: WarningSink): void {
  if (deltaG0Ev + lambdaEv < -0.01 * lambdaEv) {
    sink.warn(
      WARNING_CODES.invertedRegion,
      'Inverted region: classical Marcus neglects nuclear tunnelling and may underestimate k by ' +
        'orders of magnitude; use MLJ.',
    );
  }
}

/** B5: |H| > λ/10 lowers the barrier by about |H|, which the diabatic rate leaves out. */
export function warnBarrierLowering(couplingEv: number, lambdaEv: number, sink: WarningSink): void {
  if (Math.abs(couplingEv) > lambdaEv / 10) {
    sink.warn(
      WARNING_CODES.barrierLowering,
      'Barrier lowering by ~|H_AB| not included in the diabatic rate.',
    );
  }
}

/** Notes for H = 0 (k = 0) and H < 0 (|H| used; the sign is gauge-dependent). */
export function noteCouplingSign(couplingEv: number, sink: WarningSink): void {
  if (couplingEv === 0) {
    sink.warn(WARNING_CODES.couplingZero, 'H_AB = 0: no electronic coupling, so k = 0.');
  } else if (couplingEv < 0) {
    sink.warn(
      WARNING_CODES.couplingNegative,
      'H_AB < 0 used as |H_AB|: the sign of a coupling is gauge-dependent; only |H_AB|² enters.',
    );
  }
}

/** Underflow note when a rate is below the double range (B2); log10 k stays exact. */
export function warnRateUnderflow(log10k: number, sink: WarningSink): void {
  sink.warn(
    WARNING_CODES.rateUnderflow,
    `Rate below floating-point range; reported as log10 k (= ${log10k.toFixed(3)}), k given as 0.`,
  );
}
