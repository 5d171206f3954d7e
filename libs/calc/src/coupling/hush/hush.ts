/**
 * `coupling.hush`: coupling from an intervalence / charge-transfer band (SCIENCE.md §8).
 */
import { BOLTZMANN_EV_PER_K, CM1_PER_EV } from '../../core/constants';
import type { MethodDefinition } from '../../core/method';
import { WARNING_CODES } from '../../core/warnings';
import { readTemperature } from '../../rates/rate-inputs';

/**
 * Published Hush constant 2.06×10⁻² (cm⁻¹ units with ε in M⁻¹ cm⁻¹ and r in Å). Recomputing it
 * from CODATA 2018 for a Gaussian band gives 0.0205872 (SCIENCE.md §8), which rounds to it; the
 * published value is used so results match the literature.
 */
export const HUSH_CONSTANT = 2.06e-2;
const BAND_MESSAGE = 'Band parameters and distance must be > 0.';

/**
 * Hush band analysis: H_AB[cm⁻¹] = 2.06×10⁻² (ν̃_max ε_max Δν̃_1/2)^½ / r_DA, with ν̃ and Δν̃ in
 * cm⁻¹, ε in M⁻¹ cm⁻¹ and r_DA in Å. Assumes a Gaussian band and n = 1.
 * References: N. S. Hush, Prog. Inorg. Chem. 1967, 8, 391 (doi 10.1002/9780470166093.ch7);
 * C. Creutz, Prog. Inorg. Chem. 1983, 30, 1 (doi 10.1002/9780470166314.ch1). From memory.
 */
export function hushCouplingCm1(
  bandMaximumCm1: number,
  molarAbsorptivity: number,
  bandwidthCm1: number,
  distanceAngstrom: number,
): number {
  return (
    (HUSH_CONSTANT * Math.sqrt(bandMaximumCm1 * molarAbsorptivity * bandwidthCm1)) /
    distanceAngstrom
  );
}

/**
 * Hush's predicted high-temperature band width Δν̃_1/2 = (16 ln2 k_BT ν̃_max)^½ in cm⁻¹
 * (k_BT in cm⁻¹). Reference: N. S. Hush, Prog. Inorg. Chem. 1967, 8, 391 (from memory).
 */
export function hushLimitWidthCm1(bandMaximumCm1: number, temperatureK: number): number {
  const thermalCm1 = BOLTZMANN_EV_PER_K * temperatureK * CM1_PER_EV;
  return Math.sqrt(16 * Math.LN2 * thermalCm1 * bandMaximumCm1);
}

export interface HushInputs {
  readonly bandMaximumCm1: number;
  readonly molarAbsorptivity: number;
  readonly bandwidthCm1: number;
  readonly distanceAngstrom: number;
  readonly temperatureK: number;
}

export const hushMethod = {
  id: 'coupling.hush',
  summary: 'Hush coupling from a charge-transfer band (published constant 2.06e-2).',
  references: [
    'N. S. Hush, Prog. Inorg. Chem. 1967, 8, 391; doi 10.1002/9780470166093.ch7',
    'C. Creutz, Prog. Inorg. Chem. 1983, 30, 1; doi 10.1002/9780470166314.ch1',
  ],
  inputs: [
    {
      name: 'bandMaximum',
      quantity: 'wavenumber',
      required: true,
      description: 'Band maximum ν̃_max (> 0).',
    },
    {
      name: 'molarAbsorptivity',
      quantity: 'molarAbsorptivity',
      required: true,
      description: 'Peak molar absorptivity ε_max (> 0).',
    },
    {
      name: 'bandwidth',
      quantity: 'wavenumber',
      required: true,
      description: 'Full width at half maximum Δν̃_1/2 (> 0).',
    },
    {
      name: 'distance',
      quantity: 'distance',
      required: true,
      description: 'Donor–acceptor distance r_DA (> 0).',
    },
    {
      name: 'temperature',
      quantity: 'temperature',
      required: false,
      description: 'Temperature for the Hush width check.',
      defaultValue: 298.15,
    },
  ],
  outputs: [
    { name: 'coupling', unit: 'eV', description: '|H_AB|.' },
    { name: 'couplingCm1', unit: 'cm-1', description: '|H_AB| in cm⁻¹.' },
  ],
  read(reader) {
    const positive = { greaterThan: 0, message: BAND_MESSAGE };
    const bandMaximumCm1 = reader.quantity('bandMaximum', 'wavenumber', positive);
    const molarAbsorptivity = reader.quantity('molarAbsorptivity', 'molarAbsorptivity', positive);
    const bandwidthCm1 = reader.quantity('bandwidth', 'wavenumber', positive);
    const distanceAngstrom = reader.quantity('distance', 'distance', positive);
    const temperatureK = reader.raw('temperature') === undefined ? 298.15 : readTemperature(reader);
    for (const [name, value] of Object.entries({
      bandMaximum: bandMaximumCm1,
      molarAbsorptivity,
      bandwidth: bandwidthCm1,
    })) {
      if (value > 1e12) reader.fail(name, `Field ${name} is outside the supported range (≤ 1e12).`);
    }
    return { bandMaximumCm1, molarAbsorptivity, bandwidthCm1, distanceAngstrom, temperatureK };
  },
  compute(inputs, sink) {
    const { bandMaximumCm1, molarAbsorptivity, bandwidthCm1, distanceAngstrom, temperatureK } =
      inputs;
    if (bandwidthCm1 < 0.9 * hushLimitWidthCm1(bandMaximumCm1, temperatureK)) {
      sink.warn(
        WARNING_CODES.hushBandNarrow,
        'Band narrower than Hush limit: class II/III borderline; Hush H unreliable.',
      );
    }
    const couplingCm1 = hushCouplingCm1(
      bandMaximumCm1,
      molarAbsorptivity,
      bandwidthCm1,
      distanceAngstrom,
    );
    return { coupling: couplingCm1 / CM1_PER_EV, couplingCm1 };
  },
} satisfies MethodDefinition<HushInputs>;

/** What `coupling.hush` answers (the compiler reads it through `MethodOutputs`). */
export type HushOutputs = ReturnType<(typeof hushMethod)['compute']>;
