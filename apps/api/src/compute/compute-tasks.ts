/**
 * The calculations an HTTP request or the in-server workers can start, by name. They run inside
 * the worker threads of the compute pool (compute-worker.ts), never on the thread that answers
 * HTTP: every argument and answer crosses a thread boundary, so both are structured-cloneable
 * plain data. Nothing here touches the database or the network (the PDF renderer reads its font
 * files; the trace analysis writes its scratch files).
 */
import { calculate, serializeAnswer } from '@gapwise/calc';
import { computeMaterialResults, computePairResults } from '@gapwise/contracts';
import type { Pair, ReportReviewState } from '@gapwise/contracts';
import { renderReportPdf } from '../reports/pdf/render-report';
import {
  buildCascadeReportSnapshot,
  type CascadeForReport,
} from '../reports/cascade-report-snapshot';
import {
  buildReportSnapshot,
  snapshotIdOf,
  type SnapshotContext,
} from '../reports/report-snapshot';
import { computeChunk } from '../screens/chunk-computer';
import { runTraceAnalysisTask } from '../traces/trace-analysis-task';
import { fitSeries } from '../series/series-fit';

export const computeTasks = {
  /** `POST /api/calc`: the serialized CALC-API.md answer (the bytes `gapwise calc` prints). */
  calc: (request: unknown): { ok: boolean; body: string } => {
    const answer = calculate(request);
    return { ok: answer.ok, body: serializeAnswer(answer) };
  },
  /** A cascade's `kinetics.network` answer (issue 17): save and compute of /api/cascades. */
  cascadeResults: (network: Record<string, unknown>) => {
    const answer = calculate({ method: 'kinetics.network', inputs: network });
    return answer.ok
      ? { ok: true as const, outputs: answer.outputs, warnings: answer.warnings }
      : { ok: false as const, errors: answer.errors };
  },
  /** `POST /api/electrode-cases/{id}/fit` and apply-fit: `fit.electrodeKinetics` (issue 18). */
  electrodeFit: (inputs: Record<string, unknown>) => {
    const answer = calculate({ method: 'fit.electrodeKinetics', inputs });
    return answer.ok
      ? { ok: true as const, outputs: answer.outputs, warnings: answer.warnings }
      : { ok: false as const, errors: answer.errors };
  },
  /** A material case's hopping transport, μ(T) and Monte Carlo (issue 18): /api/materials. */
  materialResults: computeMaterialResults,
  /** `POST /api/series/{id}/fit`: both models' fits, band and information criteria. */
  seriesFit: fitSeries,
  /** `POST /api/pairs/{id}/compute`: a pair's results by the shared dispatcher. */
  pairResults: computePairResults,
  /** A screen chunk of the in-server `screen-chunk` worker (background budget). */
  screenChunk: computeChunk,
  /** A trace analysis of the in-server `trace-analysis` worker (background budget). */
  traceAnalysis: runTraceAnalysisTask,
  /** Report creation and revision: the frozen snapshot (Monte Carlo included) and its hash. */
  reportSnapshot: (context: SnapshotContext, pairs: readonly Pair[]) => {
    const snapshot = buildReportSnapshot(context, pairs);
    return { snapshot, snapshotId: snapshotIdOf(snapshot) };
  },
  /** A cascade report's frozen snapshot (full network, Monte Carlo of yields) and its hash. */
  cascadeReportSnapshot: (context: SnapshotContext, cascade: CascadeForReport) => {
    const snapshot = buildCascadeReportSnapshot(context, cascade);
    return { snapshot, snapshotId: snapshotIdOf(snapshot) };
  },
  /** A report's PDF (layout, plots, embedded fonts). A Buffer crosses threads as a Uint8Array. */
  reportPdf: async (
    snapshot: Parameters<typeof renderReportPdf>[0],
    review: ReportReviewState,
  ): Promise<Uint8Array> => {
    const pdf = await renderReportPdf(snapshot, review);
    return new Uint8Array(pdf.buffer, pdf.byteOffset, pdf.byteLength);
  },
};

export type ComputeTasks = typeof computeTasks;
export type ComputeTaskName = keyof ComputeTasks;

/** What use-cases need of the pool: run a named task (compute-pool.ts `ComputePool`). */
export interface ComputeRunner {
  run<T extends ComputeTaskName>(
    task: T,
    args: Parameters<ComputeTasks[T]>,
    options?: {
      budget: 'interactive' | 'background';
      advice: string;
      transferList?: readonly Transferable[];
      signal?: AbortSignal;
    },
  ): Promise<Awaited<ReturnType<ComputeTasks[T]>>>;
}

/**
 * Runs tasks on the calling thread. Only for one-shot commands with no HTTP to answer (demo
 * seeding, test fixtures); the server always uses the pool.
 */
export const inlineCompute: ComputeRunner = {
  run: async (task, args) =>
    (computeTasks[task] as (...a: unknown[]) => never)(...(args as unknown[])),
};
