/**
 * `quench.sternVolmer`: the Stern–Volmer constant K_SV = k_q τ₀ either way round, I₀/I at a
 * quencher concentration, and the Rehm–Weller k_q(ΔG°) curve for a quencher series
 * (SCIENCE.md §13).
 */
import { KCAL_PER_MOL_PER_EV } from '../../core/constants';
import type { InputReader, MethodDefinition, WarningSink } from '../../core/method';
import { thermalEnergyEv, WARNING_CODES } from '../../core/warnings';
import { readTemperature } from '../../rates/rate-inputs';

/** Rehm & Weller's k_d in acetonitrile, M⁻¹ s⁻¹ (Isr. J. Chem. 1970, 8, 259; from memory). */
export const REHM_WELLER_DIFFUSION_RATE = 2.0e10;
/** Rehm & Weller's k_d/(K_d Z) in acetonitrile (IUPAC Gold Book, checked). */
export const REHM_WELLER_RATIO = 0.25;
/** Rehm & Weller's intrinsic barrier ΔG‡(0) = 2.4 kcal/mol, in eV (from memory). */
export const REHM_WELLER_INTRINSIC_BARRIER_EV = 2.4 / KCAL_PER_MOL_PER_EV;

/**
 * Stern–Volmer: I₀/I = 1 + K_SV[Q], K_SV = k_q τ₀ (M⁻¹ with k_q in M⁻¹ s⁻¹, τ₀ in s).
 * Reference: O. Stern, M. Volmer, Phys. Z. 1919, 20, 183; IUPAC Gold Book "Stern–Volmer kinetic
 * relationships" (from memory).
 */
export function sternVolmerIntensityRatio(ksvPerM: number, concentrationM: number): number {
  return 1 + ksvPerM * concentrationM;
}

/** K_SV = (I₀/I − 1)/[Q] from one intensity ratio (Stern & Volmer 1919). */
export function sternVolmerConstantFromRatio(
  intensityRatio: number,
  concentrationM: number,
): number {
  return (intensityRatio - 1) / concentrationM;
}

/**
 * Rehm–Weller free energy of activation, ΔG‡ = ΔG°/2 + [(ΔG°/2)² + ΔG‡(0)²]^½ (eV).
 * Reference: D. Rehm, A. Weller, Isr. J. Chem. 1970, 8, 259 (doi 10.1002/ijch.197000029).
 */
export function rehmWellerActivationEv(deltaG0Ev: number, intrinsicBarrierEv: number): number {
  const half = deltaG0Ev / 2;
  return half + Math.hypot(half, intrinsicBarrierEv);
}

/**
 * Rehm–Weller quenching constant (IUPAC Gold Book form, checked):
 * k_q = k_d / {1 + (k_d/(K_d Z))[exp(ΔG‡/RT) + exp(ΔG°/RT)]}, per molecule with k_BT.
 * Never exceeds k_d; no inverted region by construction.
 */
export function rehmWellerQuenchingRate(
  deltaG0Ev: number,
  temperatureK: number,
  diffusionRate = REHM_WELLER_DIFFUSION_RATE,
  ratio = REHM_WELLER_RATIO,
  intrinsicBarrierEv = REHM_WELLER_INTRINSIC_BARRIER_EV,
): number {
  const kt = thermalEnergyEv(temperatureK);
  const activation = rehmWellerActivationEv(deltaG0Ev, intrinsicBarrierEv);
  return diffusionRate / (1 + ratio * (Math.exp(activation / kt) + Math.exp(deltaG0Ev / kt)));
}

export interface SternVolmerInputs {
  readonly lifetimeS: number;
  readonly kq?: number;
  readonly ratio?: { readonly intensityRatio: number; readonly concentrationM: number };
  readonly concentrationM?: number;
  readonly diffusionRate: number;
  readonly series?: {
    readonly deltaG0Ev: Float64Array;
    readonly temperatureK: number;
    readonly ratio: number;
    readonly intrinsicBarrierEv: number;
  };
}

const POSITIVE = 'Must be > 0.';

function warnAboveDiffusion(kq: number, kd: number, sink: WarningSink): void {
  if (kq > kd) {
    sink.warn(
      WARNING_CODES.quenchAboveDiffusion,
      `k_q cannot exceed k_d; check inputs (k_q = ${kq.toExponential(3)}, k_d = ` +
        `${kd.toExponential(3)} M⁻¹ s⁻¹).`,
    );
  }
}

function readSeries(reader: InputReader): SternVolmerInputs['series'] {
  if (reader.raw('deltaG0Series') === undefined) {
    for (const name of ['temperature', 'ratio', 'intrinsicBarrier']) {
      if (reader.raw(name) !== undefined)
        reader.fail(name, `Field ${name} is used only with deltaG0Series.`);
    }
    return undefined;
  }
  const deltaG0Ev = reader.quantityArray('deltaG0Series', 'energy', {
    minLength: 1,
    message: 'Field deltaG0Series needs at least one ΔG° value.',
  });
  for (let i = 0; i < deltaG0Ev.length; i++) {
    if (Math.abs(deltaG0Ev[i]!) > 100) {
      reader.fail(`deltaG0Series[${i}]`, `Field deltaG0Series[${i}] is outside ±100 eV.`);
    }
  }
  const temperatureK = readTemperature(reader);
  const ratio = reader.number('ratio', {
    greaterThan: 0,
    defaultValue: REHM_WELLER_RATIO,
    message: 'Field ratio k_d/(K_d Z) must be > 0.',
  });
  const intrinsicBarrierEv = reader.quantity('intrinsicBarrier', 'energy', {
    greaterThan: 0,
    defaultValue: REHM_WELLER_INTRINSIC_BARRIER_EV,
    message: 'Field intrinsicBarrier ΔG‡(0) must be > 0.',
  });
  return { deltaG0Ev, temperatureK, ratio, intrinsicBarrierEv };
}

export const sternVolmerMethod = {
  id: 'quench.sternVolmer',
  summary:
    'Stern–Volmer K_SV = k_q τ₀ (from k_q, or k_q from I₀/I at [Q]), I₀/I at a concentration, and the Rehm–Weller k_q(ΔG°) curve.',
  references: [
    'O. Stern, M. Volmer, Phys. Z. 1919, 20, 183 (from memory)',
    'D. Rehm, A. Weller, Isr. J. Chem. 1970, 8, 259; doi 10.1002/ijch.197000029',
    'IUPAC Compendium of Chemical Terminology (Gold Book): Rehm–Weller equation; Stern–Volmer kinetic relationships',
  ],
  inputs: [
    {
      name: 'lifetime',
      quantity: 'time',
      required: true,
      label: 'Unquenched lifetime τ₀',
      description: 'Lifetime τ₀ of the excited state without quencher (> 0).',
    },
    {
      name: 'kq',
      quantity: 'rateSecondOrder',
      required: false,
      label: 'Quenching constant k_q',
      description:
        'Bimolecular quenching constant k_q (give kq, or intensityRatio with quencherConcentration).',
    },
    {
      name: 'intensityRatio',
      quantity: 'dimensionless',
      required: false,
      label: 'Intensity ratio I₀/I',
      description: 'Measured I₀/I (≥ 1) at quencherConcentration.',
    },
    {
      name: 'quencherConcentration',
      quantity: 'dimensionless',
      required: false,
      label: 'Quencher concentration [Q]',
      description: 'Quencher concentration of the measured I₀/I, mol/L (> 0).',
    },
    {
      name: 'concentration',
      quantity: 'dimensionless',
      required: false,
      label: 'Concentration for I₀/I',
      description: 'Quencher concentration (mol/L, ≥ 0) at which to predict I₀/I.',
    },
    {
      name: 'kDiffusion',
      quantity: 'rateSecondOrder',
      required: false,
      label: 'Diffusion limit k_d',
      description: 'Diffusion-limited rate k_d (Rehm–Weller’s acetonitrile value by default).',
      defaultValue: REHM_WELLER_DIFFUSION_RATE,
    },
    {
      name: 'deltaG0Series',
      quantity: 'energy',
      required: false,
      label: 'ΔG° of the quencher series',
      description: 'Array of ΔG° values (one per quencher) for the Rehm–Weller k_q(ΔG°) curve.',
    },
    {
      name: 'temperature',
      quantity: 'temperature',
      required: false,
      description: 'Absolute temperature (required with deltaG0Series).',
    },
    {
      name: 'ratio',
      quantity: 'dimensionless',
      required: false,
      label: 'k_d/(K_d Z)',
      description: 'Rehm–Weller k_d/(K_d Z) (acetonitrile value by default).',
      defaultValue: REHM_WELLER_RATIO,
    },
    {
      name: 'intrinsicBarrier',
      quantity: 'energy',
      required: false,
      label: 'Intrinsic barrier ΔG‡(0)',
      description: 'Rehm–Weller ΔG‡(0) (2.4 kcal/mol by default).',
      defaultValue: REHM_WELLER_INTRINSIC_BARRIER_EV,
    },
  ],
  outputs: [
    { name: 'KSV', unit: 'M-1', description: 'Stern–Volmer constant K_SV = k_q τ₀.' },
    { name: 'kq', unit: 'M-1 s-1', description: 'Quenching constant k_q = K_SV/τ₀.' },
    {
      name: 'intensityRatio',
      unit: '',
      description: 'I₀/I = 1 + K_SV[Q] at `concentration` (when given).',
    },
    {
      name: 'rehmWeller',
      unit: '',
      description:
        'Per ΔG° of the series: { deltaG0 (eV), activationFreeEnergy (eV), kq (M⁻¹ s⁻¹), log10kq }.',
    },
  ],
  read(reader) {
    const lifetimeS = reader.quantity('lifetime', 'time', { greaterThan: 0, message: POSITIVE });
    const kq = reader.optionalQuantity('kq', 'rateSecondOrder', {
      atLeast: 0,
      message: 'Field kq must be ≥ 0 M⁻¹ s⁻¹.',
    });
    const intensityRatio = reader.optionalNumber('intensityRatio', {
      atLeast: 1,
      message: 'Field intensityRatio I₀/I must be ≥ 1 (quenching lowers the intensity).',
    });
    const quencherConcentration = reader.optionalNumber('quencherConcentration', {
      greaterThan: 0,
      message: 'Field quencherConcentration must be > 0 mol/L.',
    });
    const concentrationM = reader.optionalNumber('concentration', {
      atLeast: 0,
      message: 'Field concentration must be ≥ 0 mol/L.',
    });
    const diffusionRate = reader.quantity('kDiffusion', 'rateSecondOrder', {
      greaterThan: 0,
      defaultValue: REHM_WELLER_DIFFUSION_RATE,
      message: 'Field kDiffusion must be > 0 M⁻¹ s⁻¹.',
    });
    let ratio: SternVolmerInputs['ratio'];
    if (kq !== undefined && (intensityRatio !== undefined || quencherConcentration !== undefined)) {
      reader.fail('kq', 'Give kq, or intensityRatio with quencherConcentration, not both.');
    } else if (kq === undefined) {
      if (intensityRatio === undefined) {
        reader.fail('kq', 'Give kq, or intensityRatio with quencherConcentration.');
      } else if (quencherConcentration === undefined) {
        reader.fail(
          'quencherConcentration',
          'Field quencherConcentration is required with intensityRatio.',
        );
      } else {
        ratio = { intensityRatio, concentrationM: quencherConcentration };
      }
    }
    const series = readSeries(reader);
    return { lifetimeS, kq, ratio, concentrationM, diffusionRate, series };
  },
  compute(inputs, sink) {
    const ksv =
      inputs.kq !== undefined
        ? inputs.kq * inputs.lifetimeS
        : sternVolmerConstantFromRatio(inputs.ratio!.intensityRatio, inputs.ratio!.concentrationM);
    const kq = inputs.kq ?? ksv / inputs.lifetimeS;
    warnAboveDiffusion(kq, inputs.diffusionRate, sink);
    const outputs: Record<string, unknown> = { KSV: ksv, kq };
    if (inputs.concentrationM !== undefined) {
      outputs['intensityRatio'] = sternVolmerIntensityRatio(ksv, inputs.concentrationM);
    }
    if (inputs.series) {
      const { temperatureK, ratio, intrinsicBarrierEv } = inputs.series;
      outputs['rehmWeller'] = Array.from(inputs.series.deltaG0Ev, (deltaG0) => {
        const rate = rehmWellerQuenchingRate(
          deltaG0,
          temperatureK,
          inputs.diffusionRate,
          ratio,
          intrinsicBarrierEv,
        );
        return {
          deltaG0,
          activationFreeEnergy: rehmWellerActivationEv(deltaG0, intrinsicBarrierEv),
          kq: rate,
          log10kq: rate > 0 ? Math.log10(rate) : null,
        };
      });
    }
    return outputs;
  },
} satisfies MethodDefinition<SternVolmerInputs>;

/** What `quench.sternVolmer` answers (the compiler reads it through `MethodOutputs`). */
export type SternVolmerOutputs = ReturnType<(typeof sternVolmerMethod)['compute']>;
