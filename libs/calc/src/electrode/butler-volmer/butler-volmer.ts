/** Butler–Volmer electrode kinetics. */
import { BOLTZMANN_EV_PER_K } from '../../core/constants';
import { CalcRefusal } from '../../core/method';
import type { MethodDefinition, WarningSink } from '../../core/method';

/** Largest log10 rate reported (doubles overflow near 1e308). */
const MAX_LOG10_RATE = 300;

export interface ButlerVolmerInputs {
  /** Standard rate constant k⁰ (any rate unit; the outputs share it). */
  readonly k0: number;
  /** Transfer coefficient α, 0 ≤ α ≤ 1. */
  readonly alpha: number;
  readonly overpotentialV: number;
  readonly temperatureK: number;
}

export interface ButlerVolmerRates {
  readonly kRed: number;
  readonly kOx: number;
  readonly log10kRed: number;
  readonly log10kOx: number;
}

/**
 * Butler–Volmer rates k_red = k⁰ exp(−αeη/k_BT), k_ox = k⁰ exp((1 − α)eη/k_BT).
 *
 * Method: evaluated in log space (log10 outputs stay exact when a rate underflows).
 * Notes: an empirical law; MHC (`electrode.mhc`) approaches it with α ≈ ½ only for |eη| ≪ λ.
 * Sign convention η = E − E°′, reduction favoured when η < 0 (SCIENCE.md §0).
 * References: J. A. V. Butler, Trans. Faraday Soc. 1924, 19, 729 (doi 10.1039/TF9241900729);
 * T. Erdey-Grúz, M. Volmer, Z. Phys. Chem. 1930, 150A, 203; A. J. Bard, L. R. Faulkner,
 * Electrochemical Methods, 2nd ed., Wiley, 2001, ch. 3.
 */
export function butlerVolmerRates(inputs: ButlerVolmerInputs): ButlerVolmerRates {
  const etaOverKt = inputs.overpotentialV / (BOLTZMANN_EV_PER_K * inputs.temperatureK);
  const lnK0 = Math.log(inputs.k0);
  const lnRed = lnK0 - inputs.alpha * etaOverKt;
  const lnOx = lnK0 + (1 - inputs.alpha) * etaOverKt;
  return {
    kRed: Math.exp(lnRed),
    kOx: Math.exp(lnOx),
    log10kRed: lnRed / Math.LN10,
    log10kOx: lnOx / Math.LN10,
  };
}

export const butlerVolmerMethod = {
  id: 'electrode.butlerVolmer',
  summary: 'Butler–Volmer reduction and oxidation rates from k⁰, α and the overpotential.',
  references: [
    'J. A. V. Butler, Trans. Faraday Soc. 1924, 19, 729. doi:10.1039/TF9241900729',
    'T. Erdey-Grúz, M. Volmer, Z. Phys. Chem. 1930, 150A, 203.',
    'A. J. Bard, L. R. Faulkner, Electrochemical Methods, 2nd ed., Wiley, New York, 2001.',
  ],
  inputs: [
    {
      name: 'k0',
      quantity: 'dimensionless',
      required: true,
      description: 'Standard rate constant k⁰ (outputs share its unit).',
    },
    {
      name: 'alpha',
      quantity: 'dimensionless',
      required: true,
      description: 'Transfer coefficient α (0–1).',
    },
    { name: 'overpotential', quantity: 'potential', required: true, description: 'η = E − E°′.' },
    { name: 'temperature', quantity: 'temperature', required: true, description: 'Temperature.' },
  ],
  outputs: [
    { name: 'kRed', unit: 'k0', description: 'Reduction rate.' },
    { name: 'kOx', unit: 'k0', description: 'Oxidation rate.' },
    { name: 'log10kRed', unit: '', description: 'log10 of kRed.' },
    { name: 'log10kOx', unit: '', description: 'log10 of kOx.' },
  ],
  read(reader) {
    const k0 = reader.number('k0', { greaterThan: 0, message: 'Must be > 0.' });
    const alpha = reader.number('alpha', {
      atLeast: 0,
      atMost: 1,
      message: 'Transfer coefficient must be between 0 and 1.',
    });
    const overpotentialV = reader.quantity('overpotential', 'potential', {
      message: 'Overpotential must be finite.',
    });
    const temperatureK = reader.quantity('temperature', 'temperature', {
      greaterThan: 0,
      message: 'Temperature must be > 0 K (absolute). Did you enter °C?',
    });
    return { k0, alpha, overpotentialV, temperatureK };
  },
  compute(inputs, _warnings: WarningSink) {
    const rates = butlerVolmerRates(inputs);
    if (Math.max(rates.log10kRed, rates.log10kOx) > MAX_LOG10_RATE) {
      // Joint refusal: the exponential would overflow a double (never report Infinity).
      throw new CalcRefusal([
        {
          field: 'overpotential',
          message: 'Rate exceeds 1e300: overpotential far outside any Butler–Volmer regime.',
        },
      ]);
    }
    return { ...rates };
  },
} satisfies MethodDefinition<ButlerVolmerInputs>;

/** What `electrode.butlerVolmer` answers (the compiler reads it through `MethodOutputs`). */
export type ButlerVolmerOutputs = ReturnType<(typeof butlerVolmerMethod)['compute']>;
