/**
 * `rate.ruler`: the empirical Moser–Dutton protein ruler (SCIENCE.md §9).
 */
import type { MethodDefinition } from '../../core/method';
import { warnEnergyMagnitude, WARNING_CODES } from '../../core/warnings';
import { marcusRegime, readEnergy, readLambda } from '../rate-inputs';
import { reportRate } from '../rate-log';

/** Van der Waals contact distance of the ruler, Å (Moser et al. 1992). */
export const RULER_CONTACT_ANGSTROM = 3.6;
/** Default distance slope in log10 units per Å (Moser et al. 1992). */
export const RULER_DEFAULT_SLOPE_PER_ANGSTROM = 0.6;
/** Empirical width coefficient 3.1 eV⁻¹ of the quadratic term (not 1/(4k_BT ln 10)). */
const RULER_WIDTH_PER_EV = 3.1;
/** Maximal (contact, activationless) log10 k of the ruler. */
const RULER_LOG10_MAX = 13;

/**
 * Distance slope of the ruler in log10 k per Å: 1.2 − 0.8ρ for packing density ρ (Page et al.
 * 1999), or 0.6 when ρ is not given (Moser et al. 1992; ρ = 0.75 gives 0.6).
 */
export function rulerSlopePerAngstrom(packingDensity?: number): number {
  return packingDensity === undefined
    ? RULER_DEFAULT_SLOPE_PER_ANGSTROM
    : 1.2 - 0.8 * packingDensity;
}

/**
 * Moser–Dutton ruler, log10 k (k in s⁻¹), R edge to edge in Å:
 * exergonic: log10 k = 13 − slope (R − 3.6) − 3.1 (ΔG° + λ)²/λ;
 * endergonic (ΔG° > 0, from memory): 13 − slope (R − 3.6) − 3.1 (−ΔG° + λ)²/λ − ΔG°/0.06.
 * References: C. C. Moser, J. M. Keske, K. Warncke, R. S. Farid, P. L. Dutton, Nature 1992, 355,
 * 796 (doi 10.1038/355796a0); C. C. Page, C. C. Moser, X. Chen, P. L. Dutton, Nature 1999, 402,
 * 47 (doi 10.1038/46972). Both from memory.
 */
export function rulerLog10Rate(
  distanceAngstrom: number,
  deltaG0Ev: number,
  lambdaEv: number,
  packingDensity?: number,
): number {
  const slope = rulerSlopePerAngstrom(packingDensity);
  const distanceTerm = slope * (distanceAngstrom - RULER_CONTACT_ANGSTROM);
  if (deltaG0Ev <= 0) {
    const shifted = deltaG0Ev + lambdaEv;
    return RULER_LOG10_MAX - distanceTerm - (RULER_WIDTH_PER_EV * shifted * shifted) / lambdaEv;
  }
  const mirrored = -deltaG0Ev + lambdaEv;
  return (
    RULER_LOG10_MAX -
    distanceTerm -
    (RULER_WIDTH_PER_EV * mirrored * mirrored) / lambdaEv -
    deltaG0Ev / 0.06
  );
}

export interface RulerInputs {
  readonly distanceAngstrom: number;
  readonly deltaG0Ev: number;
  readonly lambdaEv: number;
  readonly packingDensity?: number;
  readonly units: { readonly deltaG0: string; readonly lambda: string };
}

export const rulerMethod = {
  id: 'rate.ruler',
  summary: 'Empirical Moser–Dutton ruler for ET in proteins (edge-to-edge distance).',
  references: [
    'C. C. Moser, J. M. Keske, K. Warncke, R. S. Farid, P. L. Dutton, Nature 1992, 355, 796; doi 10.1038/355796a0',
    'C. C. Page, C. C. Moser, X. Chen, P. L. Dutton, Nature 1999, 402, 47; doi 10.1038/46972',
  ],
  inputs: [
    {
      name: 'distance',
      quantity: 'distance',
      required: true,
      description: 'Edge-to-edge distance R (> 0).',
    },
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
      description: 'Reorganization energy λ (> 0).',
    },
    {
      name: 'packingDensity',
      quantity: 'dimensionless',
      required: false,
      description: 'Protein packing density ρ in [0, 1]; slope 1.2 − 0.8ρ (default slope 0.6).',
    },
  ],
  outputs: [
    { name: 'log10k', unit: '', description: 'log10 of k in s⁻¹.' },
    { name: 'k', unit: 's-1', description: 'Rate constant (0 when below 1e-300).' },
    { name: 'regime', unit: '', description: 'normal, activationless or inverted.' },
  ],
  read(reader) {
    const distanceAngstrom = reader.quantity('distance', 'distance', {
      greaterThan: 0,
      message: 'Radii and distances must be > 0.',
    });
    if (distanceAngstrom > 1e4)
      reader.fail('distance', 'Field distance is outside the supported range (≤ 1e4 A).');
    const deltaG0Ev = readEnergy(reader, 'deltaG0');
    const lambdaEv = readLambda(reader, 'lambda');
    const packingDensity = reader.optionalNumber('packingDensity', {
      atLeast: 0,
      atMost: 1,
      message: 'Packing density must be between 0 and 1.',
    });
    return {
      distanceAngstrom,
      deltaG0Ev,
      lambdaEv,
      packingDensity,
      units: { deltaG0: reader.unitOf('deltaG0'), lambda: reader.unitOf('lambda') },
    };
  },
  compute(inputs, sink) {
    const { distanceAngstrom, deltaG0Ev, lambdaEv, packingDensity } = inputs;
    if (deltaG0Ev > 0) {
      sink.warn(
        WARNING_CODES.rulerEndergonic,
        'Endergonic: using the endergonic variant (from memory); exergonic form invalid here.',
      );
    }
    if (distanceAngstrom > 25 || distanceAngstrom < RULER_CONTACT_ANGSTROM) {
      sink.warn(WARNING_CODES.rulerRange, "Outside the ruler's calibrated range (3.6–25 Å).");
    }
    warnEnergyMagnitude('lambda', 'lambda', lambdaEv, inputs.units.lambda, sink);
    warnEnergyMagnitude('deltaG0', 'deltaG0', deltaG0Ev, inputs.units.deltaG0, sink);
    const log10k = rulerLog10Rate(distanceAngstrom, deltaG0Ev, lambdaEv, packingDensity);
    const rate = reportRate(log10k / Math.LOG10E, false, sink, 'lambda');
    return { log10k, k: rate.k, regime: marcusRegime(deltaG0Ev, lambdaEv) };
  },
} satisfies MethodDefinition<RulerInputs>;

/** What `rate.ruler` answers (the compiler reads it through `MethodOutputs`). */
export type RulerOutputs = ReturnType<(typeof rulerMethod)['compute']>;
