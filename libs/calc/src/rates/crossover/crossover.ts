/**
 * `rate.crossover`: nonadiabatic-to-solvent-controlled interpolation (SCIENCE.md §3).
 */
import { BOLTZMANN_EV_PER_K, HBAR_EV_S } from '../../core/constants';
import type { MethodDefinition } from '../../core/method';
import { adiabaticityMeasures } from '../coupling-regime';
import {
  COUPLING_REGIME_OUTPUT,
  marcusActivationEv,
  marcusRateLog,
  readMarcusInputs,
  warnMarcusValidity,
  type MarcusInputs,
} from '../marcus/marcus';
import { marcusRegime } from '../rate-inputs';
import { reportRate } from '../rate-log';

/** Longitudinal relaxation times beyond this range are refused (outside any liquid). */
const TAU_L_RANGE_S = { min: 1e-18, max: 1e3 } as const;

/**
 * Solvent adiabaticity parameter κ_A = 4π|H_AB|²τ_L/(ħλ) (symmetric-case form).
 * References: L. D. Zusman, Chem. Phys. 1980, 49, 295 (doi 10.1016/0301-0104(80)85267-0);
 * I. Rips, J. Jortner, J. Chem. Phys. 1987, 87, 2090 (doi 10.1063/1.453184).
 */
export function adiabaticityParameter(couplingEv: number, lambdaEv: number, tauLS: number): number {
  return (4 * Math.PI * couplingEv * couplingEv * tauLS) / (HBAR_EV_S * lambdaEv);
}

/**
 * ln of the solvent-controlled (adiabatic) limit k = τ_L⁻¹ (λ/(16πk_BT))^½ exp(−ΔG‡/k_BT), s⁻¹.
 * References: L. D. Zusman, Chem. Phys. 1980, 49, 295; I. Rips, J. Jortner, J. Chem. Phys. 1987,
 * 87, 2090 (both from memory).
 */
export function solventControlledRateLog(
  deltaG0Ev: number,
  lambdaEv: number,
  temperatureK: number,
  tauLS: number,
): number {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  return (
    -Math.log(tauLS) +
    0.5 * Math.log(lambdaEv / (16 * Math.PI * thermalEv)) -
    marcusActivationEv(deltaG0Ev, lambdaEv) / thermalEv
  );
}

export interface CrossoverInputs extends MarcusInputs {
  readonly tauLS: number;
}

export const crossoverMethod = {
  id: 'rate.crossover',
  summary: 'Nonadiabatic-to-solvent-controlled crossover rate k = k_NA/(1 + κ_A).',
  references: [
    'L. D. Zusman, Chem. Phys. 1980, 49, 295; doi 10.1016/0301-0104(80)85267-0',
    'I. Rips, J. Jortner, J. Chem. Phys. 1987, 87, 2090; doi 10.1063/1.453184',
    'R. A. Marcus, J. Chem. Phys. 1956, 24, 966; doi 10.1063/1.1742723',
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
      description: 'Diabatic coupling H_AB (either sign).',
    },
    {
      name: 'temperature',
      quantity: 'temperature',
      required: true,
      description: 'Absolute temperature.',
    },
    {
      name: 'tauL',
      quantity: 'time',
      required: true,
      description: 'Longitudinal solvent relaxation time τ_L (> 0).',
    },
  ],
  outputs: [
    { name: 'kNonadiabatic', unit: 's-1', description: 'Golden-rule Marcus rate k_NA.' },
    {
      name: 'kAdiabatic',
      unit: 's-1',
      description: 'Solvent-controlled limit τ_L⁻¹(λ/16πk_BT)^½ e^(−ΔG‡/k_BT).',
    },
    { name: 'adiabaticity', unit: '', description: 'κ_A = 4π|H_AB|²τ_L/(ħλ).' },
    { name: 'k', unit: 's-1', description: 'k_NA/(1 + κ_A).' },
    { name: 'log10k', unit: '', description: 'log10 of k in s⁻¹ (null when H_AB = 0).' },
    { name: 'activationFreeEnergy', unit: 'eV', description: 'ΔG‡ = (ΔG° + λ)²/(4λ).' },
    { name: 'regime', unit: '', description: 'normal, activationless or inverted.' },
    COUPLING_REGIME_OUTPUT,
  ],
  read(reader) {
    const base = readMarcusInputs(reader);
    const tauLS = reader.quantity('tauL', 'time', { greaterThan: 0, message: 'Must be > 0.' });
    if (tauLS < TAU_L_RANGE_S.min || tauLS > TAU_L_RANGE_S.max) {
      reader.fail('tauL', 'Field tauL is outside the supported range (1e-18 s to 1e3 s).');
    }
    return { ...base, tauLS };
  },
  compute(inputs, sink) {
    const { deltaG0Ev, lambdaEv, couplingEv, temperatureK, tauLS } = inputs;
    const kappa = adiabaticityParameter(couplingEv, lambdaEv, tauLS);
    const measures = adiabaticityMeasures(couplingEv, lambdaEv, temperatureK, { kappa });
    // The crossover formula is itself the correction B4 asks for; the warning still says where
    // the pair sits (SCIENCE.md §3: warn when κ_A > 0.1), worded for a corrected result.
    warnMarcusValidity(inputs, sink, measures, true);
    const zero = couplingEv === 0;
    const lnNonadiabatic = marcusRateLog(deltaG0Ev, lambdaEv, couplingEv, temperatureK);
    const nonadiabatic = reportRate(lnNonadiabatic, zero, sink, 'lambda');
    const adiabatic = reportRate(
      solventControlledRateLog(deltaG0Ev, lambdaEv, temperatureK, tauLS),
      false,
      sink,
      'tauL',
    );
    const rate = reportRate(lnNonadiabatic - Math.log1p(kappa), zero, sink, 'lambda');
    return {
      kNonadiabatic: nonadiabatic.k,
      kAdiabatic: adiabatic.k,
      adiabaticity: kappa,
      k: rate.k,
      log10k: rate.log10k,
      activationFreeEnergy: marcusActivationEv(deltaG0Ev, lambdaEv),
      regime: marcusRegime(deltaG0Ev, lambdaEv),
      couplingRegime: measures.regime,
    };
  },
} satisfies MethodDefinition<CrossoverInputs>;

/** What `rate.crossover` answers (the compiler reads it through `MethodOutputs`). */
export type CrossoverOutputs = ReturnType<(typeof crossoverMethod)['compute']>;
