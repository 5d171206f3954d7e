/**
 * Screens (many pairs computed by workers) and driving-force series, as the API sends them.
 * Energies in eV, temperatures in K, rates as log10 k with k in s⁻¹.
 */
import type { Page } from './pairs';

export const SCREEN_STATUSES = ['uploaded', 'running', 'cancelled', 'done', 'failed'] as const;
export type ScreenStatus = (typeof SCREEN_STATUSES)[number];

export const SCREEN_SCORE_KINDS = ['cs-fast-cr-inverted', 'fastest-forward-above-floor'] as const;
export type ScreenScoreKind = (typeof SCREEN_SCORE_KINDS)[number];

/** What the user chose when the upload had bad rows. */
export type BadRowChoice = 'none' | 'run-good' | 'fixed';

export interface ScreenProgress {
  readonly rowsDone: number;
  readonly rowCount: number;
  readonly chunksDone: number;
  readonly chunkCount: number;
  /** Rows per second since the run started (null before). */
  readonly rowsPerSecond: number | null;
  /** Estimated seconds left (null when unknown or finished). */
  readonly etaSeconds: number | null;
}

export interface Screen {
  readonly id: string;
  readonly workspaceId: string;
  readonly name: string;
  readonly status: ScreenStatus;
  readonly inputHash: string;
  readonly softwareVersion: string;
  readonly rowCount: number;
  readonly badRowCount: number;
  readonly badRows: ReadonlyArray<{ readonly line: number; readonly message: string }>;
  readonly badRowChoice: BadRowChoice;
  readonly score: {
    readonly kind: ScreenScoreKind;
    readonly floorEv: number | null;
    /**
     * ħω (eV) the score assumed for a step in the inverted region whose row gives none (MLJ is
     * ranked there, rows marked `assumed-hbar-omega`); null on screens scored before this rule.
     */
    readonly assumedHbarOmegaEv: number | null;
  };
  readonly progress: ScreenProgress;
  readonly reusedFrom: string | null;
  readonly error: string | null;
  readonly uploadMs: number | null;
  readonly createdAt: string;
  readonly startedAt: string | null;
  readonly finishedAt: string | null;
}

/** Numeric result columns: sortable and filterable by `<key>Min` / `<key>Max`. */
export const SCREEN_NUMERIC_COLUMNS = [
  'rowNumber',
  'deltaGCs',
  'deltaGCr',
  'lambdaInner',
  'lambdaOuter',
  'lambdaTotal',
  'coupling',
  'temperature',
  'log10kCsMarcus',
  'log10kCrMarcus',
  'log10kCsMlj',
  'log10kCrMlj',
  'score',
] as const;
export type ScreenNumericColumn = (typeof SCREEN_NUMERIC_COLUMNS)[number];

export interface ScreenResultRow {
  readonly rowNumber: number;
  readonly donor: string;
  readonly acceptor: string;
  readonly solvent: string;
  readonly deltaGCs: number | null;
  readonly deltaGCr: number | null;
  readonly lambdaInner: number | null;
  readonly lambdaOuter: number | null;
  readonly lambdaTotal: number | null;
  readonly coupling: number | null;
  readonly temperature: number | null;
  readonly log10kCsMarcus: number | null;
  readonly log10kCrMarcus: number | null;
  readonly log10kCsMlj: number | null;
  readonly log10kCrMlj: number | null;
  readonly regimeCs: string | null;
  readonly regimeCr: string | null;
  /**
   * nonadiabatic, intermediate or adiabatic (CALC-API.md `couplingRegime`): from the
   * Landau–Zener γ with ν_n = 1e13 s⁻¹ (screens have no τ_L); null without |H_AB|, λ or T.
   */
  readonly couplingRegime: string | null;
  readonly warnings: string[];
  readonly score: number | null;
  /** The custom score of the request (`custom=column:weight,…`), when one was asked for. */
  readonly customScore?: number;
}

export type ScreenResultPage = Page<ScreenResultRow>;

/** One measured point of a series (ΔG° in eV; log10 k with k in s⁻¹; σ of log10 k). */
export interface SeriesPoint {
  readonly label: string;
  readonly deltaG0: number;
  readonly log10k: number;
  readonly sigmaLog10k: number | null;
  readonly pairId: string | null;
}

/**
 * A measured point of a series that links a pair (by `pairIds` or by a point's `pairId`), as
 * `GET /pairs/:id/series-points` sends it: ΔG° in eV, log10 k with k in s⁻¹, σ of log10 k.
 */
export interface PairSeriesPoint extends SeriesPoint {
  readonly seriesId: string;
  readonly seriesName: string;
}

export type SeriesModel = 'marcus' | 'mlj';

export interface SeriesModelOptions {
  readonly model?: SeriesModel;
  /** eV, for MLJ. */
  readonly hbarOmega?: number;
  /** eV, for MLJ. */
  readonly lambdaVib?: number;
}

export interface SeriesInput {
  readonly name: string;
  /** K. */
  readonly temperature: number;
  readonly energyUnit?: string;
  readonly notes?: string;
  readonly modelOptions?: SeriesModelOptions;
  readonly pairIds?: string[];
  readonly points: SeriesPoint[];
}

export interface SeriesModelFit {
  readonly model: SeriesModel;
  readonly lambda: number;
  readonly coupling: number;
  readonly standardErrors: { readonly lambda: number; readonly coupling: number };
  readonly correlation: number;
  readonly covariance: number[][];
  readonly rmsLog10Residual: number;
  readonly residuals: number[];
  readonly aic: number;
  readonly bic: number;
  readonly band: {
    readonly deltaG0: number[];
    readonly log10k: number[];
    readonly lower: number[];
    readonly upper: number[];
  };
  readonly warnings: ReadonlyArray<{ readonly code: string; readonly message: string }>;
}

export interface SeriesFit {
  /** The model asked for (its fit is `fits[model]`). */
  readonly model: SeriesModel;
  readonly hbarOmega: number | null;
  readonly lambdaVib: number | null;
  readonly fits: Partial<Record<SeriesModel, SeriesModelFit>>;
  /** Model with the lower AIC when both were fitted. */
  readonly preferred: SeriesModel | null;
  readonly fittedAt: string;
}

export interface Series extends SeriesInput {
  readonly id: string;
  readonly workspaceId: string;
  readonly version: number;
  readonly energyUnit: string;
  readonly notes: string;
  readonly modelOptions: SeriesModelOptions;
  readonly pairIds: string[];
  readonly fit: SeriesFit | null;
  readonly createdAt: string;
  readonly updatedAt: string;
}

export interface SeriesListItem {
  readonly id: string;
  readonly name: string;
  readonly temperature: number;
  readonly pointCount: number;
  readonly fitted: boolean;
  readonly updatedAt: string;
}
