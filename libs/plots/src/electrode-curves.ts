/**
 * Electrode-kinetics curves for plots (issue 18): log10 k_red and log10 k_ox against the
 * overpotential for Marcus–Hush–Chidsey (quadrature and the closed form) and Butler–Volmer, the
 * apparent transfer coefficient α(η) and the curvature of the Tafel plot MHC predicts, and the
 * limiting rate at large |η|. Every rate comes from the calculation core's kernels
 * (`logMhcIntegral`, `logMhcClosedForm`, `butlerVolmerRates`). No DOM, no framework.
 */
import {
  BOLTZMANN_EV_PER_K,
  butlerVolmerRates,
  logMhcClosedForm,
  logMhcIntegral,
} from '@gapwise/calc';

export interface ElectrodeCurveInputs {
  readonly lambdaEv: number;
  readonly temperatureK: number;
  /** log10 of k⁰ (any rate unit; the curves share it). */
  readonly log10k0: number;
  /** Transfer coefficient of the Butler–Volmer curve (½ unless a fit says otherwise). */
  readonly alpha?: number;
  /** Overpotential range in V; ±(λ + 0.3) by default. */
  readonly etaRangeV?: readonly [number, number];
  readonly steps?: number;
}

export interface ElectrodeCurvePoint {
  readonly etaV: number;
  /** MHC by quadrature (the reference). */
  readonly mhcRed: number;
  readonly mhcOx: number;
  /** MHC by the Zeng 2014 closed form. */
  readonly closedRed: number;
  readonly closedOx: number;
  readonly bvRed: number;
  readonly bvOx: number;
  /**
   * Apparent transfer coefficient of the favoured direction, α = (k_BT/e)|d ln k/dη| (reduction
   * for η ≤ 0, oxidation above), by central differences of the MHC integral.
   */
  readonly apparentAlpha: number;
  /** d²log10 k/dη² of the favoured direction in decades per V² (0 for Butler–Volmer). */
  readonly curvature: number;
}

export interface ElectrodeCurves {
  readonly points: readonly ElectrodeCurvePoint[];
  /**
   * log10 of the limiting MHC rate at η → −∞ (reduction; oxidation at +∞ is the same):
   * k⁰ · 2√(πλ̃)/I(λ̃, 0) (SCIENCE.md §11: I → 2√(πλ̃)).
   */
  readonly log10Limit: number;
  /** α(η → 0) of MHC, which is ½ exactly by symmetry. */
  readonly alphaAtZero: number;
}

const STEP_V = 1e-3;

/**
 * Samples the curves over the overpotential range. References: C. E. D. Chidsey, Science 1991,
 * 251, 919; Y. Zeng et al., J. Electroanal. Chem. 2014, 735, 77; A. J. Bard, L. R. Faulkner,
 * Electrochemical Methods, 2nd ed., 2001, ch. 3.
 */
export function electrodeCurves(inputs: ElectrodeCurveInputs): ElectrodeCurves {
  const thermalEv = BOLTZMANN_EV_PER_K * inputs.temperatureK;
  const l = inputs.lambdaEv / thermalEv;
  const alpha = inputs.alpha ?? 0.5;
  const span = inputs.lambdaEv + 0.3;
  const [lo, hi] = inputs.etaRangeV ?? [-span, span];
  const steps = inputs.steps ?? 121;
  const ln0 = logMhcIntegral(l, 0);
  const k0 = 10 ** inputs.log10k0;
  const log10Of = (lnI: number) => inputs.log10k0 + (lnI - ln0) / Math.LN10;
  /** log10 k of the favoured direction at η (reduction for η ≤ 0). */
  const favoured = (eta: number) => log10Of(logMhcIntegral(l, (eta <= 0 ? eta : -eta) / thermalEv));
  const points: ElectrodeCurvePoint[] = [];
  for (let i = 0; i < steps; i++) {
    const eta = steps > 1 ? lo + ((hi - lo) * i) / (steps - 1) : lo;
    const e = eta / thermalEv;
    const bv = butlerVolmerRates({
      k0,
      alpha,
      overpotentialV: eta,
      temperatureK: inputs.temperatureK,
    });
    // Differences on the favoured side of η (one-sided through η = 0 would mix the branches).
    const side = eta <= 0 ? -1 : 1;
    const centre = eta === 0 ? side * STEP_V : eta;
    const up = favoured(centre + STEP_V);
    const mid = favoured(centre);
    const down = favoured(centre - STEP_V);
    const slope = Math.abs(up - down) / (2 * STEP_V);
    points.push({
      etaV: eta,
      mhcRed: log10Of(logMhcIntegral(l, e)),
      mhcOx: log10Of(logMhcIntegral(l, -e)),
      closedRed: log10Of(logMhcClosedForm(l, e)),
      closedOx: log10Of(logMhcClosedForm(l, -e)),
      bvRed: bv.log10kRed,
      bvOx: bv.log10kOx,
      apparentAlpha: slope * Math.LN10 * thermalEv,
      curvature: (up - 2 * mid + down) / (STEP_V * STEP_V),
    });
  }
  return {
    points,
    log10Limit: inputs.log10k0 + (Math.log(2 * Math.sqrt(Math.PI * l)) - ln0) / Math.LN10,
    alphaAtZero: 0.5,
  };
}
