/**
 * `reorg.normalModes`: the vibrational reorganization energy, a λ-weighted effective mode and the
 * total Huang–Rhys factor from a list of normal modes (SCIENCE.md §6), so that MLJ inputs can come
 * from a frequency calculation.
 */
import type { InputReader, MethodDefinition } from '../../core/method';
import { thermalEnergyEv, WARNING_CODES } from '../../core/warnings';
import { readTemperature } from '../../rates/rate-inputs';

const MODE_ENERGY_MESSAGE = 'Mode energy must be > 0.';
const HUANG_RHYS_MESSAGE = 'Huang–Rhys factor must be ≥ 0.';

/** One mode: ħω_j (eV) and its Huang–Rhys factor S_j. */
export interface NormalMode {
  readonly hbarOmegaEv: number;
  readonly huangRhys: number;
}

/** S = Δ²/2 for a dimensionless displacement Δ (SCIENCE.md §6). */
export function huangRhysFromDisplacement(displacement: number): number {
  return (displacement * displacement) / 2;
}

export interface NormalModeSummary {
  /** λ_v = Σ S_j ħω_j, eV. */
  readonly lambdaVibEv: number;
  /** ħω_eff = Σ λ_j ħω_j / Σ λ_j, eV (λ-weighted mean). */
  readonly effectiveHbarOmegaEv: number;
  /** Σ S_j. */
  readonly huangRhysTotal: number;
  /** S_eff = λ_v/ħω_eff, the Huang–Rhys factor of the single effective mode. */
  readonly huangRhysEffective: number;
  /** λ_j = S_j ħω_j per mode, eV. */
  readonly modeLambdasEv: number[];
}

/**
 * λ_v = Σ S_j ħω_j; ħω_eff = Σ λ_j ħω_j/Σ λ_j (λ-weighted, the convention of SCIENCE.md §6);
 * S_eff = λ_v/ħω_eff. Needs Σ S_j > 0.
 * References: K. Huang, A. Rhys, Proc. R. Soc. Lond. A 1950, 204, 406
 * (doi 10.1098/rspa.1950.0184); J. Jortner, J. Chem. Phys. 1976, 64, 4860
 * (doi 10.1063/1.432142; from memory) for the single effective mode.
 */
export function summarizeNormalModes(modes: readonly NormalMode[]): NormalModeSummary {
  const modeLambdasEv = modes.map((m) => m.huangRhys * m.hbarOmegaEv);
  const lambdaVibEv = modeLambdasEv.reduce((s, l) => s + l, 0);
  const weighted = modes.reduce((s, m, i) => s + modeLambdasEv[i]! * m.hbarOmegaEv, 0);
  const effectiveHbarOmegaEv = weighted / lambdaVibEv;
  return {
    lambdaVibEv,
    effectiveHbarOmegaEv,
    huangRhysTotal: modes.reduce((s, m) => s + m.huangRhys, 0),
    huangRhysEffective: lambdaVibEv / effectiveHbarOmegaEv,
    modeLambdasEv,
  };
}

export interface NormalModesInputs {
  readonly modes: NormalMode[];
  readonly temperatureK?: number;
}

function readMode(child: InputReader): NormalMode {
  const hbarOmegaEv = child.quantity('hbarOmega', 'energy', {
    greaterThan: 0,
    message: MODE_ENERGY_MESSAGE,
  });
  if (hbarOmegaEv > 10)
    child.fail('hbarOmega', 'Mode energy is outside the supported range (≤ 10 eV).');
  const hasS = child.raw('huangRhys') !== undefined;
  const hasDisplacement = child.raw('displacement') !== undefined;
  if (hasS && hasDisplacement) {
    child.fail('displacement', 'Give huangRhys or displacement for a mode, not both.');
    return { hbarOmegaEv, huangRhys: Number.NaN };
  }
  if (hasDisplacement) {
    const displacement = child.number('displacement');
    if (Math.abs(displacement) > 1e3)
      child.fail('displacement', 'Field displacement is outside ±1000.');
    return { hbarOmegaEv, huangRhys: huangRhysFromDisplacement(displacement) };
  }
  if (!hasS) {
    child.fail('huangRhys', 'Give huangRhys (S) or displacement (Δ, S = Δ²/2) for each mode.');
    return { hbarOmegaEv, huangRhys: Number.NaN };
  }
  const huangRhys = child.number('huangRhys', { atLeast: 0, message: HUANG_RHYS_MESSAGE });
  if (huangRhys > 1e6)
    child.fail('huangRhys', 'Field huangRhys is outside the supported range (≤ 1e6).');
  return { hbarOmegaEv, huangRhys };
}

export const normalModesMethod = {
  id: 'reorg.normalModes',
  summary:
    'Vibrational λ_v = Σ S_j ħω_j, λ-weighted effective ħω and total Huang–Rhys factor from normal modes (S_j or displacements Δ_j).',
  references: [
    'K. Huang, A. Rhys, Proc. R. Soc. Lond. A 1950, 204, 406; doi 10.1098/rspa.1950.0184',
    'J. Jortner, J. Chem. Phys. 1976, 64, 4860; doi 10.1063/1.432142 (from memory)',
  ],
  inputs: [
    {
      name: 'modes',
      quantity: 'array',
      required: true,
      label: 'Normal modes',
      description:
        'Array of { hbarOmega (energy, > 0; e.g. cm-1), huangRhys (S ≥ 0) } or { hbarOmega, displacement (dimensionless Δ, S = Δ²/2) }.',
    },
    {
      name: 'temperature',
      quantity: 'temperature',
      required: false,
      description: 'Absolute temperature, to flag modes with ħω < 4 k_BT.',
    },
  ],
  outputs: [
    { name: 'lambdaVib', unit: 'eV', description: 'λ_v = Σ S_j ħω_j.' },
    {
      name: 'effectiveHbarOmega',
      unit: 'eV',
      description: 'ħω_eff = Σ λ_j ħω_j / Σ λ_j (λ-weighted mean; the convention used).',
    },
    { name: 'huangRhysTotal', unit: '', description: 'Σ S_j over the modes.' },
    {
      name: 'huangRhysEffective',
      unit: '',
      description: 'S_eff = λ_v/ħω_eff of the single effective mode (the MLJ input).',
    },
    { name: 'modeLambdas', unit: 'eV', description: 'λ_j = S_j ħω_j per mode, in input order.' },
  ],
  read(reader) {
    const children = reader.objectArray('modes', {
      minLength: 1,
      message: 'Field modes needs at least one mode.',
    });
    const modes = children.map(readMode);
    if (
      modes.length > 0 &&
      modes.every((m) => Number.isFinite(m.huangRhys)) &&
      modes.every((m) => m.huangRhys === 0)
    ) {
      reader.fail('modes', 'At least one mode needs S > 0 (or a non-zero displacement): λ_v = 0.');
    }
    const temperatureK =
      reader.raw('temperature') === undefined ? undefined : readTemperature(reader);
    return { modes, temperatureK };
  },
  compute(inputs, sink) {
    const summary = summarizeNormalModes(inputs.modes);
    if (inputs.temperatureK !== undefined) {
      const limit = 4 * thermalEnergyEv(inputs.temperatureK);
      const low = inputs.modes
        .map((m, i) => ({ i, m }))
        .filter(({ m }) => m.hbarOmegaEv < limit && m.huangRhys > 0);
      if (low.length > 0) {
        sink.warn(
          WARNING_CODES.lowFrequencyMode,
          `Low-frequency mode${low.length > 1 ? 's' : ''} (modes[${low.map(({ i }) => i).join('], modes[')}]) ` +
            'with ħω < 4 k_BT: use thermal MLJ or include them in λ_s.',
        );
      }
    }
    return {
      lambdaVib: summary.lambdaVibEv,
      effectiveHbarOmega: summary.effectiveHbarOmegaEv,
      huangRhysTotal: summary.huangRhysTotal,
      huangRhysEffective: summary.huangRhysEffective,
      modeLambdas: summary.modeLambdasEv,
    };
  },
} satisfies MethodDefinition<NormalModesInputs>;

/** What `reorg.normalModes` answers (the compiler reads it through `MethodOutputs`). */
export type NormalModesOutputs = ReturnType<(typeof normalModesMethod)['compute']>;
