/**
 * `electrode.mhcAbsolute`: the absolute Marcus–Hush–Chidsey rate from the electronic coupling
 * |H| and the electrode's density of states ρ_M (SCIENCE.md §11 "Absolute rate"), k⁰ in s⁻¹ and
 * in cm s⁻¹ with the conversion stated, and the Tafel slope at η.
 */
import { BOLTZMANN_EV_PER_K } from '../../core/constants';
import type { MethodDefinition, WarningSink } from '../../core/method';
import { noteCouplingSign } from '../../core/warnings';
import { LN_TWO_PI_OVER_HBAR } from '../../rates/marcus/marcus';
import { readLambda, readTemperature } from '../../rates/rate-inputs';
import { reportRate } from '../../rates/rate-log';
import { logMhcIntegral } from '../mhc/mhc';

/** Default reaction-layer thickness δr in Å for the s⁻¹ → cm s⁻¹ conversion. */
export const DEFAULT_REACTION_LAYER_ANGSTROM = 1;
/** cm per Å. */
const CM_PER_ANGSTROM = 1e-8;
/** Step in η (V) of the central difference for the Tafel slope. */
const TAFEL_STEP_V = 1e-4;

/**
 * ln of the absolute MHC rate (s⁻¹) for reduction at overpotential η (oxidation: −η):
 * k = (2π/ħ)|H|² ρ_M k_BT (4πλk_BT)^(−½) I(λ/k_BT, eη/k_BT).
 * References: C. E. D. Chidsey, Science 1991, 251, 919 (doi 10.1126/science.251.4996.919);
 * S. Gosavi, R. A. Marcus, J. Phys. Chem. B 2000, 104, 2067 (doi 10.1021/jp994456g; from memory).
 */
export function mhcAbsoluteRateLog(
  lambdaEv: number,
  overpotentialV: number,
  temperatureK: number,
  couplingEv: number,
  densityOfStatesPerEv: number,
): number {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  return (
    LN_TWO_PI_OVER_HBAR +
    2 * Math.log(Math.abs(couplingEv)) +
    Math.log(densityOfStatesPerEv) +
    Math.log(thermalEv) -
    0.5 * Math.log(4 * Math.PI * lambdaEv * thermalEv) +
    logMhcIntegral(lambdaEv / thermalEv, overpotentialV / thermalEv)
  );
}

/**
 * Tafel slope in mV per decade of the reduction rate at η (oxidation: pass −η), by a central
 * difference of log10 k over ±0.1 mV: 1000/|d log10 k/dη|. Null where the rate is flat
 * (saturation far beyond λ, where there is no Tafel growth).
 */
export function mhcTafelSlopeMvPerDecade(
  lambdaEv: number,
  overpotentialV: number,
  temperatureK: number,
): number | null {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  const lambdaOverKt = lambdaEv / thermalEv;
  const up = logMhcIntegral(lambdaOverKt, (overpotentialV + TAFEL_STEP_V) / thermalEv);
  const down = logMhcIntegral(lambdaOverKt, (overpotentialV - TAFEL_STEP_V) / thermalEv);
  const decadesPerVolt = Math.abs((up - down) / (2 * TAFEL_STEP_V)) / Math.LN10;
  return decadesPerVolt > 1e-9 ? 1000 / decadesPerVolt : null;
}

export interface MhcAbsoluteInputs {
  readonly lambdaEv: number;
  readonly overpotentialV: number;
  readonly temperatureK: number;
  readonly couplingEv: number;
  readonly densityOfStatesPerEv: number;
  readonly reactionLayerAngstrom: number;
}

function warnFarFromButlerVolmer(inputs: MhcAbsoluteInputs, sink: WarningSink): void {
  if (Math.abs(inputs.overpotentialV) > inputs.lambdaEv) {
    sink.warn(
      'mhc-far-from-butler-volmer',
      '|eη| > λ: far from the Butler–Volmer regime (MHC rates saturate); a BV comparison is ' +
        'meaningless here.',
    );
  }
}

export const CM_PER_S_CONVENTION =
  'k (cm s⁻¹) = k (s⁻¹) × δr, δr = reaction-layer thickness (default 1 Å = 1e-8 cm): the rate ' +
  'per electrode atom of a reactant within δr of the surface (Gosavi & Marcus 2000, from memory).';

export const mhcAbsoluteMethod = {
  id: 'electrode.mhcAbsolute',
  summary:
    'Absolute Marcus–Hush–Chidsey rate from |H| and the electrode density of states: k_red, k_ox, k⁰ in s⁻¹ and cm s⁻¹, Tafel slope at η.',
  references: [
    'C. E. D. Chidsey, Science 1991, 251, 919; doi 10.1126/science.251.4996.919 (from memory)',
    'S. Gosavi, R. A. Marcus, J. Phys. Chem. B 2000, 104, 2067; doi 10.1021/jp994456g (from memory)',
    'R. A. Marcus, J. Chem. Phys. 1965, 43, 679; doi 10.1063/1.1696792',
  ],
  inputs: [
    { name: 'lambda', quantity: 'energy', required: true, description: 'Reorganization energy λ.' },
    {
      name: 'overpotential',
      quantity: 'potential',
      required: true,
      description: 'Overpotential η = E − E°′ (reduction favoured when negative).',
    },
    {
      name: 'temperature',
      quantity: 'temperature',
      required: true,
      description: 'Absolute temperature.',
    },
    {
      name: 'coupling',
      quantity: 'energy',
      required: true,
      label: 'Electronic coupling |H_AB|',
      description: 'Electronic coupling |H_AB| between the redox centre and the electrode.',
    },
    {
      name: 'densityOfStates',
      quantity: 'dimensionless',
      required: true,
      label: 'Density of states ρ_M',
      description: 'Electrode density of states at the Fermi level, eV⁻¹ per atom (> 0).',
    },
    {
      name: 'reactionLayer',
      quantity: 'distance',
      required: false,
      label: 'Reaction-layer thickness δr',
      description: 'δr for the s⁻¹ → cm s⁻¹ conversion.',
      defaultValue: DEFAULT_REACTION_LAYER_ANGSTROM,
    },
  ],
  outputs: [
    { name: 'kRed', unit: 's-1', description: 'Reduction rate at η.' },
    { name: 'kOx', unit: 's-1', description: 'Oxidation rate at η.' },
    { name: 'log10kRed', unit: '', description: 'log10 k_red.' },
    { name: 'log10kOx', unit: '', description: 'log10 k_ox.' },
    {
      name: 'k0',
      unit: 's-1',
      description: 'Standard rate constant k⁰ = k_red(η = 0) = k_ox(η = 0).',
    },
    { name: 'k0CmPerS', unit: 'cm s-1', description: 'k⁰ × δr (see conversion).' },
    {
      name: 'tafelSlope',
      unit: 'mV/decade',
      description:
        'Tafel slope of the favoured direction at η (reduction for η ≤ 0); null when saturated.',
    },
    { name: 'tafelSlopeReduction', unit: 'mV/decade', description: 'Tafel slope of k_red at η.' },
    { name: 'tafelSlopeOxidation', unit: 'mV/decade', description: 'Tafel slope of k_ox at η.' },
    { name: 'conversion', unit: '', description: 'The s⁻¹ → cm s⁻¹ convention used.' },
  ],
  read(reader) {
    const lambdaEv = readLambda(reader, 'lambda');
    const overpotentialV = reader.quantity('overpotential', 'potential');
    if (Math.abs(overpotentialV) > 1e3) {
      reader.fail('overpotential', 'λ must be > 0; overpotential must be finite (|η| ≤ 1000 V).');
    }
    const temperatureK = readTemperature(reader);
    const couplingEv = reader.quantity('coupling', 'energy');
    if (Math.abs(couplingEv) > 1e3) reader.fail('coupling', 'Field coupling is outside ±1000 eV.');
    const densityOfStatesPerEv = reader.number('densityOfStates', {
      greaterThan: 0,
      message: 'Density of states must be > 0 eV⁻¹.',
    });
    const reactionLayerAngstrom = reader.quantity('reactionLayer', 'distance', {
      greaterThan: 0,
      defaultValue: DEFAULT_REACTION_LAYER_ANGSTROM,
      message: 'Radii and distances must be > 0.',
    });
    return {
      lambdaEv,
      overpotentialV,
      temperatureK,
      couplingEv,
      densityOfStatesPerEv,
      reactionLayerAngstrom,
    };
  },
  compute(inputs, sink) {
    const { lambdaEv, overpotentialV, temperatureK, couplingEv, densityOfStatesPerEv } = inputs;
    noteCouplingSign(couplingEv, sink);
    warnFarFromButlerVolmer(inputs, sink);
    const zero = couplingEv === 0;
    const lnRate = (eta: number) =>
      zero ? 0 : mhcAbsoluteRateLog(lambdaEv, eta, temperatureK, couplingEv, densityOfStatesPerEv);
    const red = reportRate(lnRate(overpotentialV), zero, sink, 'coupling');
    const ox = reportRate(lnRate(-overpotentialV), zero, sink, 'coupling');
    const k0 = reportRate(lnRate(0), zero, sink, 'coupling');
    const tafelSlopeReduction = mhcTafelSlopeMvPerDecade(lambdaEv, overpotentialV, temperatureK);
    const tafelSlopeOxidation = mhcTafelSlopeMvPerDecade(lambdaEv, -overpotentialV, temperatureK);
    return {
      kRed: red.k,
      kOx: ox.k,
      log10kRed: red.log10k,
      log10kOx: ox.log10k,
      k0: k0.k,
      k0CmPerS: k0.k * inputs.reactionLayerAngstrom * CM_PER_ANGSTROM,
      tafelSlope: overpotentialV <= 0 ? tafelSlopeReduction : tafelSlopeOxidation,
      tafelSlopeReduction,
      tafelSlopeOxidation,
      conversion: CM_PER_S_CONVENTION.replace(
        'default 1 Å = 1e-8 cm',
        `here ${inputs.reactionLayerAngstrom} Å = ${inputs.reactionLayerAngstrom * CM_PER_ANGSTROM} cm`,
      ),
    };
  },
} satisfies MethodDefinition<MhcAbsoluteInputs>;

/** What `electrode.mhcAbsolute` answers (the compiler reads it through `MethodOutputs`). */
export type MhcAbsoluteOutputs = ReturnType<(typeof mhcAbsoluteMethod)['compute']>;
