/**
 * Rate curves for plots: log10 k against −ΔG° (classical Marcus and Marcus–Levich–Jortner) and
 * against temperature (Arrhenius form). Every rate comes from the calculation core's dispatcher,
 * so a curve and the number in the results panel cannot disagree. No DOM, no framework.
 */
import { BOLTZMANN_EV_PER_K, calculate, type CalcRequest } from '@gapwise/calc';

function log10kOf(request: CalcRequest): number | null {
  const answer = calculate(request);
  if (!answer.ok) return null;
  const out = answer.outputs;
  if (typeof out['log10k'] === 'number' && Number.isFinite(out['log10k'])) return out['log10k'];
  const k = out['k'];
  return typeof k === 'number' && k > 0 ? Math.log10(k) : null;
}

export interface MeasuredPointInput {
  /** eV. */
  readonly deltaG0: number;
  readonly log10k: number;
  readonly sigmaLog10k?: number | null;
  readonly seriesId?: string;
  readonly seriesName?: string;
}

/** A measured point on the plot's axes: x = −ΔG° (eV), y = log10 k, σ of y when known. */
export interface MeasuredPoint {
  readonly x: number;
  readonly y: number;
  readonly sigma: number | null;
  readonly seriesId: string;
  readonly seriesName: string;
}

export interface DrivingForceInputs {
  /** Total λ (classical curve), eV. */
  readonly lambda: number;
  readonly coupling: number;
  readonly temperature: number;
  /** For the MLJ curve: classical part λ_s, quantum part λ_v and ħω, eV. All three or none. */
  readonly lambdaSolvent?: number | null;
  readonly lambdaVib?: number | null;
  readonly hbarOmega?: number | null;
  /** The pair's own ΔG° and log10 k (drawn as a marked point). */
  readonly pair?: { readonly deltaG0: number; readonly log10k: number } | null;
  /** Measured points of the pair's series, if any (σ of log10 k and the series optional). */
  readonly measured?: ReadonlyArray<MeasuredPointInput>;
  readonly samples?: number;
}

export interface DrivingForcePoint {
  /** −ΔG°, eV (the horizontal axis). */
  readonly minusDeltaG0: number;
  readonly marcus: number | null;
  readonly mlj: number | null;
}

export interface DrivingForceGeometry {
  readonly domain: readonly [number, number];
  readonly log10kDomain: readonly [number, number];
  readonly points: readonly DrivingForcePoint[];
  /** −ΔG° where the inverted region begins (= λ); shade from here to the domain's end. */
  readonly invertedFrom: number;
  readonly hasMlj: boolean;
  readonly pair: { readonly x: number; readonly y: number } | null;
  readonly measured: ReadonlyArray<MeasuredPoint>;
}

export function drivingForceCurves(inputs: DrivingForceInputs): DrivingForceGeometry {
  const { lambda, coupling, temperature } = inputs;
  const samples = Math.max(11, inputs.samples ?? 121);
  const pairX = inputs.pair ? -inputs.pair.deltaG0 : null;
  const measured: MeasuredPoint[] = (inputs.measured ?? [])
    .filter((m) => Number.isFinite(m.deltaG0) && Number.isFinite(m.log10k))
    .map((m) => ({
      x: -m.deltaG0,
      y: m.log10k,
      sigma: m.sigmaLog10k != null && m.sigmaLog10k > 0 ? m.sigmaLog10k : null,
      seriesId: m.seriesId ?? '',
      seriesName: m.seriesName ?? '',
    }));
  const xs = [pairX ?? 0, ...measured.map((m) => m.x)];
  const lo = Math.min(-0.3 * lambda, ...xs.map((x) => x - 0.1 * lambda));
  const hi = Math.max(2.6 * lambda, ...xs.map((x) => x + 0.15 * lambda));
  const hasMlj =
    (inputs.lambdaSolvent ?? 0) > 0 && (inputs.lambdaVib ?? -1) >= 0 && (inputs.hbarOmega ?? 0) > 0;
  const points: DrivingForcePoint[] = [];
  for (let i = 0; i < samples; i++) {
    const x = lo + ((hi - lo) * i) / (samples - 1);
    const marcus = log10kOf({
      method: 'rate.marcus',
      inputs: { deltaG0: -x, lambda, coupling, temperature },
    });
    const mlj = hasMlj
      ? log10kOf({
          method: 'rate.mlj',
          inputs: {
            deltaG0: -x,
            lambdaSolvent: inputs.lambdaSolvent,
            lambdaVib: inputs.lambdaVib,
            hbarOmega: inputs.hbarOmega,
            coupling,
            temperature,
          },
        })
      : null;
    points.push({ minusDeltaG0: x, marcus, mlj });
  }
  const ys = [
    ...points.flatMap((p) => [p.marcus, p.mlj]),
    inputs.pair?.log10k ?? null,
    ...measured.flatMap((m) => [m.y - (m.sigma ?? 0), m.y + (m.sigma ?? 0)]),
  ].filter((v): v is number => v !== null && Number.isFinite(v));
  const top = ys.length ? Math.max(...ys) : 10;
  // Show about fourteen decades below the maximum: deeper tails say nothing a reader can use.
  const bottom = Math.max(ys.length ? Math.min(...ys) : top - 10, top - 14);
  return {
    domain: [lo, hi],
    log10kDomain: [Math.floor(bottom - 0.5), Math.ceil(top + 0.8)],
    points,
    invertedFrom: lambda,
    hasMlj,
    pair: pairX !== null && inputs.pair ? { x: pairX, y: inputs.pair.log10k } : null,
    measured,
  };
}

export interface TemperaturePoint {
  readonly temperature: number;
  /** 1000/T, K⁻¹ (the Arrhenius axis). */
  readonly inverseT: number;
  readonly log10k: number | null;
}

export interface TemperatureGeometry {
  readonly points: readonly TemperaturePoint[];
  readonly inverseTDomain: readonly [number, number];
  readonly log10kDomain: readonly [number, number];
  /** Apparent activation energy −k_B d ln k/d(1/T) at the pair's temperature, eV. */
  readonly apparentEa: number | null;
  readonly pair: { readonly x: number; readonly y: number } | null;
}

/**
 * log10 k over a temperature window around `temperature` for the pair's own rate request
 * (its `inputs.temperature` is replaced), with the apparent activation energy at `temperature`
 * from a central difference in 1/T (SCIENCE.md §15).
 */
export function temperatureCurve(
  request: CalcRequest,
  temperature: number,
  window: { readonly low?: number; readonly high?: number; readonly samples?: number } = {},
): TemperatureGeometry {
  const base = request.inputs as Record<string, unknown>;
  const at = (t: number) =>
    log10kOf({ method: request.method, inputs: { ...base, temperature: t } });
  const low = window.low ?? Math.max(20, temperature - 100);
  const high = window.high ?? temperature + 100;
  const samples = Math.max(11, window.samples ?? 61);
  const points: TemperaturePoint[] = [];
  for (let i = 0; i < samples; i++) {
    // Even steps in 1/T, so the Arrhenius plot is sampled evenly.
    const inv = 1 / high + ((1 / low - 1 / high) * i) / (samples - 1);
    const t = 1 / inv;
    points.push({ temperature: t, inverseT: 1000 * inv, log10k: at(t) });
  }
  const h = 1e-3 / temperature;
  const tPlus = 1 / (1 / temperature - h);
  const tMinus = 1 / (1 / temperature + h);
  const yPlus = at(tPlus);
  const yMinus = at(tMinus);
  const apparentEa =
    yPlus !== null && yMinus !== null
      ? (-BOLTZMANN_EV_PER_K * Math.LN10 * (yPlus - yMinus)) / (1 / tPlus - 1 / tMinus)
      : null;
  const own = at(temperature);
  const ys = points.map((p) => p.log10k).filter((v): v is number => v !== null);
  const yLo = ys.length ? Math.min(...ys) : 0;
  const yHi = ys.length ? Math.max(...ys) : 1;
  const pad = Math.max(0.2, 0.08 * (yHi - yLo));
  return {
    points,
    inverseTDomain: [1000 / high, 1000 / low],
    log10kDomain: [yLo - pad, yHi + pad],
    apparentEa,
    pair: own !== null ? { x: 1000 / temperature, y: own } : null,
  };
}

/** A measured rate at one temperature (K, s⁻¹). */
export interface MeasuredRate {
  readonly temperature: number;
  readonly k: number;
}

export interface ArrheniusFitGeometry {
  /** Measured points on the Arrhenius axes (1000/T, log10 k). */
  readonly measured: readonly { readonly x: number; readonly y: number }[];
  /** The fitted straight line over `inverseTDomain` (two end points), or null when refused. */
  readonly line: readonly { readonly x: number; readonly y: number }[] | null;
  /** E_a and its standard error (eV), null when refused. */
  readonly ea: { readonly value: number; readonly error: number } | null;
  /** ΔH‡ (eV) and ΔS‡ (J mol⁻¹ K⁻¹) with standard errors, from the Eyring fit. */
  readonly eyring: {
    readonly enthalpy: number;
    readonly enthalpyError: number;
    readonly entropy: number;
    readonly entropyError: number;
  } | null;
  /** The core's refusal messages (e.g. fewer than 3 distinct temperatures). */
  readonly errors: readonly string[];
  /** Domains widened to hold the measured points. */
  readonly inverseTDomain: readonly [number, number];
  readonly log10kDomain: readonly [number, number];
}

/**
 * Measured k(T) on the Arrhenius axes with the `analysis.temperature` least-squares line, and the
 * plot's domains widened to hold them (the fit itself comes from the calculation core).
 */
export function arrheniusFitGeometry(
  points: readonly MeasuredRate[],
  inverseTDomain: readonly [number, number],
  log10kDomain: readonly [number, number],
): ArrheniusFitGeometry {
  const measured = points
    .filter((p) => p.temperature > 0 && p.k > 0)
    .map((p) => ({ x: 1000 / p.temperature, y: Math.log10(p.k) }));
  const xs = [...inverseTDomain, ...measured.map((p) => p.x)];
  const ys = [...log10kDomain, ...measured.map((p) => p.y)];
  const xDomain: [number, number] = [Math.min(...xs), Math.max(...xs)];
  const yDomain: [number, number] = [Math.min(...ys), Math.max(...ys)];
  const widen = (d: [number, number], lo: number, hi: number, pad: number): [number, number] =>
    d[0] === lo && d[1] === hi ? d : [d[0] - pad, d[1] + pad];
  const domains = {
    inverseTDomain: widen(
      xDomain,
      inverseTDomain[0],
      inverseTDomain[1],
      0.02 * (xDomain[1] - xDomain[0]),
    ),
    log10kDomain: widen(yDomain, log10kDomain[0], log10kDomain[1], 0.2),
  };
  const answer = calculate({ method: 'analysis.temperature', inputs: { points } });
  if (!answer.ok) {
    return {
      measured,
      line: null,
      ea: null,
      eyring: null,
      errors: answer.errors.map((e) => e.message),
      ...domains,
    };
  }
  const o = answer.outputs;
  const se = o.standardErrors;
  const ea = o.arrheniusEa;
  const lnA = Math.log(o.arrheniusPrefactor);
  const at = (x: number) => ({
    x,
    y: (lnA - (ea * x) / (1000 * BOLTZMANN_EV_PER_K)) / Math.LN10,
  });
  return {
    measured,
    line: [at(domains.inverseTDomain[0]), at(domains.inverseTDomain[1])],
    ea: { value: ea, error: se.arrheniusEa },
    eyring: {
      enthalpy: o.eyringEnthalpy,
      enthalpyError: se.eyringEnthalpy,
      entropy: o.eyringEntropy,
      entropyError: se.eyringEntropy,
    },
    errors: [],
    ...domains,
  };
}
