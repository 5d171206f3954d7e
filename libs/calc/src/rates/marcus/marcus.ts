/**
 * `rate.marcus`: the classical nonadiabatic Marcus rate (SCIENCE.md §1).
 */
import { BOLTZMANN_EV_PER_K, HBAR_EV_S } from '../../core/constants';
import type { InputReader, MethodDefinition, WarningSink } from '../../core/method';
import {
  noteCouplingSign,
  warnBarrierLowering,
  warnCouplingMagnitude,
  warnEnergyMagnitude,
  warnInvertedRegion,
  warnLambdaBelowKt,
  warnTemperatureRange,
} from '../../core/warnings';
import {
  marcusRegime,
  readEnergy,
  readLambda,
  readTemperature,
  refuseClassIII,
  type Regime,
} from '../rate-inputs';
import { reportRate } from '../rate-log';
import {
  adiabaticityMeasures,
  warnAdiabaticity,
  type AdiabaticityMeasures,
  type CouplingRegime,
} from '../coupling-regime';

/** ln(2π/ħ) with ħ in eV s (2π/ħ = 9.545838906e15 eV⁻¹ s⁻¹, CODATA 2018). */
export const LN_TWO_PI_OVER_HBAR = Math.log((2 * Math.PI) / HBAR_EV_S);

/**
 * Classical activation free energy ΔG‡ = (ΔG° + λ)²/(4λ) in eV.
 * Reference: R. A. Marcus, J. Chem. Phys. 1956, 24, 966 (doi 10.1063/1.1742723).
 */
export function marcusActivationEv(deltaG0Ev: number, lambdaEv: number): number {
  const shifted = deltaG0Ev + lambdaEv;
  return (shifted * shifted) / (4 * lambdaEv);
}

/**
 * ln k of the nonadiabatic Marcus rate, k in s⁻¹:
 * k = (2π/ħ)|H_AB|² (4πλk_BT)^(−1/2) exp[−(ΔG° + λ)²/(4λk_BT)].
 * Computed in log space so the result is exact where k underflows; −∞ when H_AB = 0.
 *
 * Notes: golden rule (weak coupling), all nuclear modes classical, equal-curvature parabolas.
 * References: R. A. Marcus, J. Chem. Phys. 1956, 24, 966; R. A. Marcus, J. Chem. Phys. 1965, 43,
 * 679 (doi 10.1063/1.1696792); V. G. Levich, R. R. Dogonadze, Dokl. Akad. Nauk SSSR 1959, 124,
 * 123; N. S. Hush, Trans. Faraday Soc. 1961, 57, 557 (doi 10.1039/TF9615700557);
 * R. A. Marcus, N. Sutin, Biochim. Biophys. Acta 1985, 811, 265 (doi 10.1016/0304-4173(85)90014-X).
 */
export function marcusRateLog(
  deltaG0Ev: number,
  lambdaEv: number,
  couplingEv: number,
  temperatureK: number,
): number {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  const shifted = deltaG0Ev + lambdaEv;
  return (
    LN_TWO_PI_OVER_HBAR +
    2 * Math.log(Math.abs(couplingEv)) -
    0.5 * Math.log(4 * Math.PI * lambdaEv * thermalEv) -
    (shifted * shifted) / (4 * lambdaEv * thermalEv)
  );
}

export interface MarcusInputs {
  readonly deltaG0Ev: number;
  readonly lambdaEv: number;
  readonly couplingEv: number;
  readonly temperatureK: number;
  readonly units: { readonly deltaG0: string; readonly lambda: string; readonly coupling: string };
}

/** Reads ΔG°, λ, H, T as rate.marcus and rate.crossover share them. */
export function readMarcusInputs(reader: InputReader): MarcusInputs {
  const deltaG0Ev = readEnergy(reader, 'deltaG0');
  const lambdaEv = readLambda(reader, 'lambda');
  const couplingEv = readEnergy(reader, 'coupling');
  const temperatureK = readTemperature(reader);
  refuseClassIII(reader, couplingEv, lambdaEv);
  return {
    deltaG0Ev,
    lambdaEv,
    couplingEv,
    temperatureK,
    units: {
      deltaG0: reader.unitOf('deltaG0'),
      lambda: reader.unitOf('lambda'),
      coupling: reader.unitOf('coupling'),
    },
  };
}

/**
 * The validity warnings every classical-Marcus-based rate shares (VALIDATION.md B1, B3–B5,
 * B8–B11). B4 (|H_AB| > k_BT, γ > 0.1, κ_A > 0.1) comes from the measures the caller computed.
 * @param corrected the caller's rate already includes an adiabatic correction
 */
export function warnMarcusValidity(
  inputs: MarcusInputs,
  sink: WarningSink,
  measures: AdiabaticityMeasures,
  corrected = false,
): void {
  const { deltaG0Ev, lambdaEv, couplingEv, temperatureK, units } = inputs;
  noteCouplingSign(couplingEv, sink);
  warnInvertedRegion(deltaG0Ev, lambdaEv, sink);
  warnLambdaBelowKt(lambdaEv, temperatureK, sink);
  warnAdiabaticity(couplingEv, temperatureK, measures, sink, corrected);
  warnBarrierLowering(couplingEv, lambdaEv, sink);
  warnTemperatureRange(temperatureK, sink);
  warnEnergyMagnitude('lambda', 'lambda', lambdaEv, units.lambda, sink);
  warnEnergyMagnitude('deltaG0', 'deltaG0', deltaG0Ev, units.deltaG0, sink);
  warnCouplingMagnitude('coupling', couplingEv, units.coupling, sink);
}

/** The `couplingRegime` output every rate method lists (CALC-API.md). */
export const COUPLING_REGIME_OUTPUT = {
  name: 'couplingRegime',
  unit: '',
  description:
    'nonadiabatic, intermediate or adiabatic: from κ_A when τ_L is known, else from the ' +
    'Landau–Zener γ with ν_n = 1e13 s⁻¹ (< 0.1 nonadiabatic, > 10 adiabatic).',
} as const;

export interface MarcusOutputs {
  readonly k: number;
  readonly log10k: number | null;
  readonly activationFreeEnergy: number;
  readonly regime: Regime;
  readonly couplingRegime: CouplingRegime;
  [key: string]: unknown;
}

export const marcusMethod = {
  id: 'rate.marcus',
  summary: 'Classical nonadiabatic Marcus rate constant.',
  references: [
    'R. A. Marcus, J. Chem. Phys. 1956, 24, 966; doi 10.1063/1.1742723',
    'R. A. Marcus, J. Chem. Phys. 1965, 43, 679; doi 10.1063/1.1696792',
    'N. S. Hush, Trans. Faraday Soc. 1961, 57, 557; doi 10.1039/TF9615700557',
    'R. A. Marcus, N. Sutin, Biochim. Biophys. Acta 1985, 811, 265',
  ],
  inputs: [
    {
      name: 'deltaG0',
      quantity: 'energy',
      required: true,
      description: 'Standard free-energy change ΔG° (negative is downhill).',
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
  ],
  outputs: [
    {
      name: 'k',
      unit: 's-1',
      description: 'Rate constant (0 when below 1e-300 or when H_AB = 0).',
    },
    {
      name: 'log10k',
      unit: '',
      description: 'log10 of k in s⁻¹, exact even when k underflows (null when H_AB = 0).',
    },
    { name: 'activationFreeEnergy', unit: 'eV', description: 'ΔG‡ = (ΔG° + λ)²/(4λ).' },
    { name: 'regime', unit: '', description: 'normal, activationless or inverted.' },
    COUPLING_REGIME_OUTPUT,
  ],
  read: readMarcusInputs,
  compute(inputs, sink): MarcusOutputs {
    const { deltaG0Ev, lambdaEv, couplingEv, temperatureK } = inputs;
    const measures = adiabaticityMeasures(couplingEv, lambdaEv, temperatureK);
    warnMarcusValidity(inputs, sink, measures);
    const lnK = marcusRateLog(deltaG0Ev, lambdaEv, couplingEv, temperatureK);
    const rate = reportRate(lnK, couplingEv === 0, sink, 'lambda');
    return {
      k: rate.k,
      log10k: rate.log10k,
      activationFreeEnergy: marcusActivationEv(deltaG0Ev, lambdaEv),
      regime: marcusRegime(deltaG0Ev, lambdaEv),
      couplingRegime: measures.regime,
    };
  },
} satisfies MethodDefinition<MarcusInputs>;
