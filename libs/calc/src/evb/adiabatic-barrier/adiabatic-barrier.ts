/**
 * `evb.adiabaticBarrier`: the exact barrier of the two-state adiabatic ground surface
 * (SCIENCE.md §3), found numerically, beside the Brunschwig–Sutin closed form, and the adiabatic
 * transition-state rate k = ν_n exp(−ΔG‡_ad/k_BT).
 */
import { BOLTZMANN_EV_PER_K } from '../../core/constants';
import { CalcRefusal, type MethodDefinition } from '../../core/method';
import { WARNING_CODES } from '../../core/warnings';
import { adiabaticityMeasures, NONADIABATIC_BELOW } from '../../rates/coupling-regime';
import {
  NUCLEAR_FREQUENCY_INPUT,
  readNuclearFrequency,
} from '../../rates/landau-zener/landau-zener';
import {
  COUPLING_REGIME_OUTPUT,
  marcusActivationEv,
  readMarcusInputs,
  warnMarcusValidity,
  type MarcusInputs,
} from '../../rates/marcus/marcus';
import { marcusRegime } from '../../rates/rate-inputs';
import { reportRate } from '../../rates/rate-log';

/**
 * Lower adiabatic surface of the two diabatic parabolas E₁ = λx², E₂ = λ(x − 1)² + ΔG°:
 * E_g(x) = (E₁ + E₂)/2 − ½√((E₂ − E₁)² + 4H²).
 * Reference: B. S. Brunschwig, N. Sutin, Coord. Chem. Rev. 1999, 187, 233
 * (doi 10.1016/S0010-8545(99)90001-8; from memory); SCIENCE.md §3.
 */
export function groundSurfaceEv(
  x: number,
  deltaG0Ev: number,
  lambdaEv: number,
  couplingEv: number,
): number {
  const e1 = lambdaEv * x * x;
  const e2 = lambdaEv * (x - 1) * (x - 1) + deltaG0Ev;
  return 0.5 * (e1 + e2) - 0.5 * Math.hypot(e2 - e1, 2 * couplingEv);
}

/**
 * The Brunschwig–Sutin approximation ΔG‡ ≈ (λ + ΔG°)²/(4λ) − |H| + H²/(λ + ΔG°); exact in the
 * symmetric case (λ/4 − |H| + H²/λ), low in the asymmetric one because it ignores the shift of
 * the barrier top (0.0043 eV, 11 %, for λ = 0.8, ΔG° = −0.3, H = 0.05 eV; SCIENCE.md §3).
 * Reference: B. S. Brunschwig, N. Sutin, Coord. Chem. Rev. 1999, 187, 233 (from memory).
 */
export function brunschwigSutinBarrierEv(
  deltaG0Ev: number,
  lambdaEv: number,
  couplingEv: number,
): number {
  const h = Math.abs(couplingEv);
  return marcusActivationEv(deltaG0Ev, lambdaEv) - h + (h * h) / (lambdaEv + deltaG0Ev);
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;

/** Golden-section search for a minimum of f on [a, b] to |b − a| < tol (Kiefer 1953). */
function goldenMinimum(f: (x: number) => number, a: number, b: number, tol: number): number {
  let c = b - GOLDEN * (b - a);
  let d = a + GOLDEN * (b - a);
  let fc = f(c);
  let fd = f(d);
  while (Math.abs(b - a) > tol) {
    if (fc < fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - GOLDEN * (b - a);
      fc = f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + GOLDEN * (b - a);
      fd = f(d);
    }
  }
  return 0.5 * (a + b);
}

export interface AdiabaticBarrier {
  /** Reactant minimum and barrier top on the ground surface (reaction coordinate x). */
  readonly reactantX: number;
  readonly transitionX: number;
  /** E_g(top) − E_g(reactant minimum), eV. */
  readonly barrierEv: number;
}

/**
 * Locates the extrema of E_g numerically: a scan on 4001 points over a range that holds both
 * diabatic minima and the crossing, then golden-section refinement (to 1e-13 in x) of the
 * reactant-side minimum and the maximum that follows it. Returns null when E_g has a single
 * minimum (no barrier: Robin–Day class III, or a well that is not on the ground surface, as in
 * the inverted region).
 * Reference: SCIENCE.md §3 ("locate the extrema of E_g numerically").
 */
export function adiabaticBarrier(
  deltaG0Ev: number,
  lambdaEv: number,
  couplingEv: number,
): AdiabaticBarrier | null {
  const f = (x: number) => groundSurfaceEv(x, deltaG0Ev, lambdaEv, couplingEv);
  const crossing = (lambdaEv + deltaG0Ev) / (2 * lambdaEv);
  const lo = Math.min(-1, crossing - 1);
  const hi = Math.max(2, crossing + 1);
  const n = 4000;
  const step = (hi - lo) / n;
  const values = Array.from({ length: n + 1 }, (_, i) => f(lo + i * step));
  let minIndex = -1;
  for (let i = 1; i < n; i++) {
    if (values[i] <= values[i - 1] && values[i] < values[i + 1]) {
      minIndex = i;
      break;
    }
  }
  if (minIndex < 0) return null;
  let maxIndex = -1;
  for (let i = minIndex + 1; i < n; i++) {
    if (values[i] >= values[i - 1] && values[i] > values[i + 1]) {
      maxIndex = i;
      break;
    }
  }
  if (maxIndex < 0) return null;
  const tol = 1e-13 * (hi - lo);
  const reactantX = goldenMinimum(f, lo + (minIndex - 1) * step, lo + (minIndex + 1) * step, tol);
  const transitionX = goldenMinimum(
    (x) => -f(x),
    lo + (maxIndex - 1) * step,
    lo + (maxIndex + 1) * step,
    tol,
  );
  return { reactantX, transitionX, barrierEv: f(transitionX) - f(reactantX) };
}

export interface AdiabaticBarrierInputs extends MarcusInputs {
  readonly nuclearFrequencyPerS: number;
}

export const adiabaticBarrierMethod = {
  id: 'evb.adiabaticBarrier',
  summary:
    'Exact barrier of the two-state adiabatic ground surface (numerical), the Brunschwig–Sutin approximation, and k = ν_n exp(−ΔG‡_ad/k_BT).',
  references: [
    'B. S. Brunschwig, N. Sutin, Coord. Chem. Rev. 1999, 187, 233; doi 10.1016/S0010-8545(99)90001-8',
    'A. Warshel, R. M. Weiss, J. Am. Chem. Soc. 1980, 102, 6218; doi 10.1021/ja00540a008',
    'M. B. Robin, P. Day, Adv. Inorg. Chem. Radiochem. 1967, 10, 247',
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
      name: 'barrier',
      unit: 'eV',
      description: 'Exact ΔG‡_ad: E_g at the barrier top minus E_g at the reactant minimum.',
    },
    {
      name: 'barrierApproximate',
      unit: 'eV',
      description: 'Brunschwig–Sutin (λ + ΔG°)²/(4λ) − |H| + H²/(λ + ΔG°).',
    },
    { name: 'barrierDiabatic', unit: 'eV', description: 'Diabatic ΔG‡ = (ΔG° + λ)²/(4λ).' },
    { name: 'k', unit: 's-1', description: 'Adiabatic TST rate ν_n exp(−ΔG‡_ad/k_BT).' },
    { name: 'log10k', unit: '', description: 'log10 of k in s⁻¹.' },
    {
      name: 'reactantMinimum',
      unit: '',
      description: 'Reaction coordinate x of the reactant minimum (diabatic minima at 0 and 1).',
    },
    { name: 'transitionState', unit: '', description: 'Reaction coordinate x of the barrier top.' },
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
    // The barrier-lowering caution (B5) is about diabatic rates; this barrier includes it.
    const filtered = {
      warn: (code: string, message: string) => {
        if (code !== WARNING_CODES.barrierLowering) sink.warn(code, message);
      },
    };
    warnMarcusValidity(inputs, filtered, measures, true);
    const found = adiabaticBarrier(deltaG0Ev, lambdaEv, couplingEv);
    if (!found) {
      throw new CalcRefusal([
        {
          field: 'deltaG0',
          message:
            'The adiabatic ground surface has a single minimum (no barrier between reactant and ' +
            'product wells, e.g. in the inverted region or for a strongly uphill step); no ' +
            'adiabatic barrier.',
        },
      ]);
    }
    if (measures.gamma < NONADIABATIC_BELOW) {
      sink.warn(
        'adiabatic-rate-weak-coupling',
        `Weak coupling (Landau–Zener γ = ${measures.gamma.toExponential(2)} < 0.1): the ` +
          'adiabatic rate ν_n exp(−ΔG‡_ad/k_BT) overestimates; use the Marcus (golden-rule) rate or ' +
          'the Landau–Zener transmission.',
      );
    }
    const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
    const rate = reportRate(
      Math.log(nuclearFrequencyPerS) - found.barrierEv / thermalEv,
      false,
      sink,
      'lambda',
    );
    return {
      barrier: found.barrierEv,
      barrierApproximate: brunschwigSutinBarrierEv(deltaG0Ev, lambdaEv, couplingEv),
      barrierDiabatic: marcusActivationEv(deltaG0Ev, lambdaEv),
      k: rate.k,
      log10k: rate.log10k,
      reactantMinimum: found.reactantX,
      transitionState: found.transitionX,
      regime: marcusRegime(deltaG0Ev, lambdaEv),
      couplingRegime: measures.regime,
    };
  },
} satisfies MethodDefinition<AdiabaticBarrierInputs>;

/** What `evb.adiabaticBarrier` answers (the compiler reads it through `MethodOutputs`). */
export type AdiabaticBarrierOutputs = ReturnType<(typeof adiabaticBarrierMethod)['compute']>;
