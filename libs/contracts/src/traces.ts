/**
 * Energy-gap traces and their analyses, as the API sends them and the command line prints them.
 * Energies are in eV (canonical); `unit` is the unit the file was written in.
 */
import type { GapOutputs } from '@gapwise/calc';

export const TRACE_STATES = ['reactant', 'product'] as const;
export type TraceState = (typeof TRACE_STATES)[number];

/** Energy units a trace file may be written in (CALC-API.md energy units). */
export const TRACE_FILE_UNITS = ['eV', 'meV', 'kcal/mol', 'kJ/mol', 'hartree', 'cm-1'] as const;
export type TraceFileUnit = (typeof TRACE_FILE_UNITS)[number];

export interface TraceBadLine {
  readonly line: number;
  readonly message: string;
}

/** An uploaded trace (the raw file is kept in object storage, content-addressed by SHA-256). */
export interface Trace {
  readonly id: string;
  readonly workspaceId: string;
  readonly state: TraceState;
  readonly fileName: string;
  readonly sizeBytes: number;
  readonly sha256: string;
  readonly gzip: boolean;
  readonly unit: TraceFileUnit;
  /** The column as chosen (header name or 1-based index as text); null: the last column. */
  readonly columnSetting: string | null;
  readonly columnIndex: number;
  readonly columnName: string | null;
  readonly delimiter: 'comma' | 'tab' | 'whitespace';
  readonly skipBadLines: boolean;
  readonly sampleCount: number;
  readonly lineCount: number;
  /** Lines skipped as bad (only with skipBadLines), with the first 20 of them. */
  readonly skippedLineCount: number;
  readonly skippedLines: TraceBadLine[];
  readonly minEv: number;
  readonly maxEv: number;
  readonly meanEv: number;
  readonly uploadedAt: string;
  readonly uploadedBy: { readonly id: string; readonly displayName: string } | null;
}

export const TRACE_ANALYSIS_STATUSES = ['queued', 'running', 'done', 'failed'] as const;
export type TraceAnalysisStatus = (typeof TRACE_ANALYSIS_STATUSES)[number];

/** Body of `POST /api/workspaces/:wid/trace-analyses`. */
export interface TraceAnalysisRequest {
  readonly reactantTraceId: string;
  readonly productTraceId: string;
  /** Kelvin. */
  readonly temperature: number;
}

/** Which file a result was computed from, and how it was read. */
export interface TraceSourceInfo {
  readonly traceId: string | null;
  readonly fileName: string;
  readonly sha256: string;
  readonly sizeBytes: number;
  readonly unit: string;
  readonly columnIndex: number;
  readonly columnName: string | null;
  readonly sampleCount: number;
  readonly skippedLineCount: number;
}

/**
 * The JSON of a finished analysis; the command line prints the same object for the same files.
 * `outputs` holds the `reorg.gapSamples` outputs (CALC-API.md), typed by the calculation core.
 */
export interface TraceAnalysisResult {
  readonly method: 'reorg.gapSamples';
  readonly temperatureK: number;
  readonly sources: { readonly reactant: TraceSourceInfo; readonly product: TraceSourceInfo };
  readonly outputs: GapOutputs;
  readonly warnings: ReadonlyArray<{ readonly code: string; readonly message: string }>;
}

export interface TraceAnalysis {
  readonly id: string;
  readonly workspaceId: string;
  readonly reactantTraceId: string;
  readonly productTraceId: string;
  readonly temperatureK: number;
  readonly status: TraceAnalysisStatus;
  /** 0…1 */
  readonly progress: number;
  readonly result: TraceAnalysisResult | null;
  readonly error: ReadonlyArray<{ readonly field: string; readonly message: string }> | null;
  readonly attempts: number;
  readonly createdAt: string;
  readonly startedAt: string | null;
  readonly finishedAt: string | null;
}

/** Parameters an analysis can give a pair. `lambda` is written to `lambdaKind`. */
export const ATTACHABLE_TRACE_PARAMETERS = ['lambda', 'deltaG0'] as const;
export type AttachableTraceParameter = (typeof ATTACHABLE_TRACE_PARAMETERS)[number];

/** Body of `POST /api/trace-analyses/:id/attach`. */
export interface TraceAttachRequest {
  readonly pairId: string;
  readonly parameters: AttachableTraceParameter[];
  /** Which λ of the pair receives the sampled λ (default lambdaOuter). */
  readonly lambdaKind?: 'lambdaOuter' | 'lambdaInner';
  /** Version of the pair the user saw (optimistic locking); the current one when absent. */
  readonly version?: number;
}
