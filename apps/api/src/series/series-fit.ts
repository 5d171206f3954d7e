/**
 * Fits a series with the core's `fit.drivingForceSeries` (Levenberg–Marquardt in log10 k; one
 * implementation, shared with the command line), adds the 95 % band from the core's
 * `confidenceBandLog10k`, and compares classical Marcus with MLJ by residuals and information
 * criteria (AIC, BIC for least squares with Gaussian errors: n ln(RSS/n) + 2p and
 * n ln(RSS/n) + p ln n; H. Akaike, IEEE Trans. Autom. Control 1974, 19, 716; G. Schwarz,
 * Ann. Stat. 1978, 6, 461). Both models have p = 2 free parameters (the MLJ mode is fixed).
 */
import { calculate, confidenceBandLog10k, fitDrivingForceSeries } from '@gapwise/calc';
import type { SeriesFit, SeriesModel, SeriesModelFit, SeriesPoint } from '@gapwise/contracts';
import { validationFailed } from '../http/app-error';

export interface FitRequest {
  readonly model: SeriesModel;
  readonly hbarOmega?: number;
  readonly lambdaVib?: number;
}

const PARAMETERS = 2;

function grid(points: readonly SeriesPoint[], lambda: number): number[] {
  const xs = points.map((p) => p.deltaG0);
  const lo = Math.min(...xs, -2 * lambda) - 0.1;
  const hi = Math.max(...xs, 0) + 0.1;
  return Array.from({ length: 121 }, (_, i) => lo + ((hi - lo) * i) / 120);
}

function fitOne(
  points: readonly SeriesPoint[],
  temperatureK: number,
  request: FitRequest,
): SeriesModelFit {
  const inputs = {
    points: points.map((p) => ({ deltaG0: p.deltaG0, k: 10 ** p.log10k })),
    temperature: temperatureK,
    model: request.model,
    ...(request.model === 'mlj'
      ? { hbarOmega: request.hbarOmega, lambdaVib: request.lambdaVib }
      : {}),
  };
  const answer = calculate({ method: 'fit.drivingForceSeries', inputs });
  if (!answer.ok) {
    throw validationFailed(
      answer.errors.map((e) => ({ field: `${request.model}.${e.field}`, message: e.message })),
    );
  }
  const o = answer.outputs;
  // The band needs the fit's internal covariance: the same deterministic fit, run once more.
  const fit = fitDrivingForceSeries({
    points: points.map((p) => ({ deltaG0Ev: p.deltaG0, k: 10 ** p.log10k })),
    temperatureK,
    model: request.model,
    hbarOmegaEv: request.hbarOmega,
    lambdaVibEv: request.lambdaVib,
  });
  const n = points.length;
  const rss = o.residuals.reduce((s, r) => s + r * r, 0);
  const base = n * Math.log(Math.max(rss, 1e-300) / n);
  return {
    model: request.model,
    lambda: o.lambda,
    coupling: o.coupling,
    standardErrors: o.standardErrors,
    correlation: o.correlation,
    covariance: o.covariance.map((r) => [...r]),
    rmsLog10Residual: o.rmsLog10Residual,
    residuals: [...o.residuals],
    aic: base + 2 * PARAMETERS,
    bic: base + PARAMETERS * Math.log(n),
    band: confidenceBandLog10k(fit, grid(points, o.lambda)),
    warnings: answer.warnings,
  };
}

/** Fits the asked model, and the other one too when it can be fitted, for the comparison. */
export function fitSeries(
  points: readonly SeriesPoint[],
  temperatureK: number,
  request: FitRequest,
): SeriesFit {
  const fits: Partial<Record<SeriesModel, SeriesModelFit>> = {};
  fits[request.model] = fitOne(points, temperatureK, request);
  const mljPossible = request.hbarOmega !== undefined && request.lambdaVib !== undefined;
  const other: SeriesModel = request.model === 'marcus' ? 'mlj' : 'marcus';
  if (other === 'marcus' || mljPossible) {
    try {
      fits[other] = fitOne(points, temperatureK, { ...request, model: other });
    } catch {
      // The comparison is optional; the asked model's fit stands on its own.
    }
  }
  const both = fits.marcus && fits.mlj;
  return {
    model: request.model,
    hbarOmega: request.hbarOmega ?? null,
    lambdaVib: request.lambdaVib ?? null,
    fits,
    preferred: both ? (fits.marcus!.aic <= fits.mlj!.aic ? 'marcus' : 'mlj') : null,
    fittedAt: new Date().toISOString(),
  };
}
