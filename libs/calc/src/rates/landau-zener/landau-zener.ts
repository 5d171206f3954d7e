/**
 * `rate.landauZener`: the Landau–Zener / Newton–Sutin electronic transmission coefficient and the
 * rate k = κ_el ν_n exp(−ΔG‡/k_BT) (SCIENCE.md §3), which joins the golden-rule rate (small γ) to
 * the adiabatic transition-state rate (large γ).
 */
import { BOLTZMANN_EV_PER_K, PLANCK_EV_S } from '../../core/constants';
import type { InputReader, MethodDefinition } from '../../core/method';
import {
  adiabaticityMeasures,
  classifyAdiabaticity,
  DEFAULT_NUCLEAR_FREQUENCY_PER_S,
  landauZenerGamma,
} from '../coupling-regime';
import {
  COUPLING_REGIME_OUTPUT,
  marcusActivationEv,
  readMarcusInputs,
  warnMarcusValidity,
  type MarcusInputs,
} from '../marcus/marcus';
import { marcusRegime } from '../rate-inputs';
import { reportRate } from '../rate-log';

/** Effective nuclear frequencies outside this range are refused (no molecular vibration). */
export const NUCLEAR_FREQUENCY_RANGE_PER_S = { min: 1e9, max: 1e16 } as const;

/**
 * Electronic frequency ν_el = (2|H|²/h)(π³/(λk_BT))^(1/2) in s⁻¹ (h, not ħ).
 * Reference: M. D. Newton, N. Sutin, Annu. Rev. Phys. Chem. 1984, 35, 437 (from memory).
 */
export function electronicFrequencyPerS(
  couplingEv: number,
  lambdaEv: number,
  temperatureK: number,
): number {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  return (
    ((2 * couplingEv * couplingEv) / PLANCK_EV_S) * Math.sqrt(Math.PI ** 3 / (lambdaEv * thermalEv))
  );
}

/**
 * Landau–Zener transmission coefficient κ_el = 2P₀/(1 + P₀) with P₀ = 1 − exp(−γ) (the
 * single-passage probability; −expm1 keeps small γ exact, κ_el → 2γ).
 * References: L. D. Landau, Phys. Z. Sowjetunion 1932, 2, 46; C. Zener, Proc. R. Soc. Lond. A
 * 1932, 137, 696 (doi 10.1098/rspa.1932.0165); M. D. Newton, N. Sutin 1984 (all from memory).
 */
export function landauZenerTransmission(gamma: number): number {
  const p0 = -Math.expm1(-gamma);
  return (2 * p0) / (1 + p0);
}

export interface LandauZenerInputs extends MarcusInputs {
  readonly nuclearFrequencyPerS: number;
}

/** Reads ν_n (s⁻¹, default 1e13) with the A12 refusal and a sanity range. */
export function readNuclearFrequency(reader: InputReader): number {
  const value =
    reader.optionalQuantity('nuclearFrequency', 'rateFirstOrder', {
      greaterThan: 0,
      message: 'Must be > 0.',
    }) ?? DEFAULT_NUCLEAR_FREQUENCY_PER_S;
  const { min, max } = NUCLEAR_FREQUENCY_RANGE_PER_S;
  if (value > 0 && (value < min || value > max)) {
    reader.fail(
      'nuclearFrequency',
      `Field nuclearFrequency is outside the supported range (${min} to ${max} s⁻¹).`,
    );
  }
  return value;
}

export const NUCLEAR_FREQUENCY_INPUT = {
  name: 'nuclearFrequency',
  quantity: 'rateFirstOrder',
  required: false,
  label: 'Effective nuclear frequency ν_n',
  description: 'Effective nuclear frequency ν_n along the reaction coordinate (1e12–1e13 s⁻¹).',
  defaultValue: DEFAULT_NUCLEAR_FREQUENCY_PER_S,
} as const;

export const landauZenerMethod = {
  id: 'rate.landauZener',
  summary:
    'Landau–Zener transmission coefficient κ_el and k = κ_el ν_n exp(−ΔG‡/k_BT), from the nonadiabatic to the adiabatic limit.',
  references: [
    'M. D. Newton, N. Sutin, Annu. Rev. Phys. Chem. 1984, 35, 437; doi 10.1146/annurev.pc.35.100184.002253',
    'C. Zener, Proc. R. Soc. Lond. A 1932, 137, 696; doi 10.1098/rspa.1932.0165',
    'L. D. Landau, Phys. Z. Sowjetunion 1932, 2, 46',
    'IUPAC Compendium of Chemical Terminology (Gold Book): Landau–Zener model',
  ],
  inputs: [
    {
      name: 'deltaG0',
      quantity: 'energy',
      required: true,
      description: 'Standard free-energy change ΔG°.',
    },
    {
      name: 'lambda',
      quantity: 'energy',
      required: true,
      description: 'Total reorganization energy λ (> 0).',
    },
    {
      name: 'coupling',
      quantity: 'energy',
      required: true,
      description: 'Diabatic coupling H_AB (either sign; 2|H_AB| < λ).',
    },
    {
      name: 'temperature',
      quantity: 'temperature',
      required: true,
      description: 'Absolute temperature.',
    },
    NUCLEAR_FREQUENCY_INPUT,
  ],
  outputs: [
    {
      name: 'electronicFrequency',
      unit: 's-1',
      description: 'ν_el = (2|H_AB|²/h)(π³/(λk_BT))^½.',
    },
    { name: 'gamma', unit: '', description: 'Landau–Zener γ = ν_el/(2ν_n).' },
    { name: 'transmission', unit: '', description: 'κ_el = 2P₀/(1 + P₀), P₀ = 1 − e^(−γ).' },
    { name: 'k', unit: 's-1', description: 'k = κ_el ν_n exp(−ΔG‡/k_BT).' },
    { name: 'log10k', unit: '', description: 'log10 of k in s⁻¹ (null when H_AB = 0).' },
    {
      name: 'kGoldenRule',
      unit: 's-1',
      description: 'Golden-rule (classical Marcus) rate ν_el exp(−ΔG‡/k_BT), for comparison.',
    },
    {
      name: 'adiabaticity',
      unit: '',
      description: 'nonadiabatic (γ < 0.1), intermediate or adiabatic (γ > 10).',
    },
    { name: 'activationFreeEnergy', unit: 'eV', description: 'ΔG‡ = (ΔG° + λ)²/(4λ).' },
    { name: 'regime', unit: '', description: 'normal, activationless or inverted.' },
    COUPLING_REGIME_OUTPUT,
  ],
  read(reader) {
    const base = readMarcusInputs(reader);
    return { ...base, nuclearFrequencyPerS: readNuclearFrequency(reader) };
  },
  compute(inputs, sink) {
    const { deltaG0Ev, lambdaEv, couplingEv, temperatureK, nuclearFrequencyPerS } = inputs;
    const measures = adiabaticityMeasures(couplingEv, lambdaEv, temperatureK, {
      nuclearFrequencyPerS,
    });
    warnMarcusValidity(inputs, sink, measures, true);
    const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
    const activationEv = marcusActivationEv(deltaG0Ev, lambdaEv);
    const gamma = landauZenerGamma(couplingEv, lambdaEv, temperatureK, nuclearFrequencyPerS);
    const transmission = landauZenerTransmission(gamma);
    const zero = couplingEv === 0;
    const rate = reportRate(
      Math.log(transmission) + Math.log(nuclearFrequencyPerS) - activationEv / thermalEv,
      zero,
      sink,
      'lambda',
    );
    const electronicFrequency = electronicFrequencyPerS(couplingEv, lambdaEv, temperatureK);
    const golden = reportRate(
      Math.log(electronicFrequency) - activationEv / thermalEv,
      zero,
      sink,
      'lambda',
    );
    return {
      electronicFrequency,
      gamma,
      transmission,
      k: rate.k,
      log10k: rate.log10k,
      kGoldenRule: golden.k,
      adiabaticity: classifyAdiabaticity(gamma),
      activationFreeEnergy: activationEv,
      regime: marcusRegime(deltaG0Ev, lambdaEv),
      couplingRegime: measures.regime,
    };
  },
} satisfies MethodDefinition<LandauZenerInputs>;

/** What `rate.landauZener` answers (the compiler reads it through `MethodOutputs`). */
export type LandauZenerOutputs = ReturnType<(typeof landauZenerMethod)['compute']>;
