/**
 * The analysis of a reactant-state and a product-state trace, shared by the background job and
 * the command line (`gapwise traces analyze`), so both print the same JSON for the same files.
 *
 * Two streaming passes per state, memory flat whatever the file size:
 * 1. the raw file (object store or local disk) through the parser into the calculation core's
 *    `GapSampleAccumulator` (moments, blocking, quartile sample); the parsed eV values are also
 *    written to a temporary binary file (8 bytes a sample) so pass 2 need not parse text again;
 * 2. the binary file into `HistogramCounter`s on the edges the core plans from pass 1.
 * The outputs are then composed by the core (`gapOutputsFromCounts`), the same code that
 * `reorg.gapSamples` runs on in-memory arrays.
 */
import { closeSync, mkdtempSync, openSync, readSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  CalcRefusal,
  GapSampleAccumulator,
  HistogramCounter,
  gapOutputsFromCounts,
  planGapHistograms,
  type CalcWarning,
  type GapOutputs,
  type GapStateSummary,
} from '@gapwise/calc';
import type { TraceAnalysisResult, TraceSourceInfo } from '@gapwise/contracts';
import type { TraceParseSettings } from './trace-parser';
import { TraceFileError, readTrace, traceProblems } from './trace-stream';

export interface TraceAnalysisInput {
  /** Opens the raw bytes of the file (again for each call). */
  readonly open: () => Promise<AsyncIterable<Uint8Array>>;
  readonly settings: TraceParseSettings;
  /** Raw size in bytes, for progress. */
  readonly sizeBytes: number;
  readonly info: TraceSourceInfo;
}

export interface AnalyzeOptions {
  /** Fraction done, 0…1 (called often; throttle on the receiving side). */
  readonly onProgress?: (fraction: number) => void;
  readonly signal?: AbortSignal;
  /** Folder for the temporary binary files (default: the system's). */
  readonly tmpDir?: string;
}

/** The inputs cannot be analysed (refusals of VALIDATION.md part A, unreadable files). */
export class TraceAnalysisRefusal extends Error {
  constructor(readonly errors: Array<{ field: string; message: string }>) {
    super(errors.map((e) => `${e.field}: ${e.message}`).join('; '));
    this.name = 'TraceAnalysisRefusal';
  }
}

const PASS_ONE_WEIGHT = 0.85;
const READ_BLOCK_SAMPLES = 1 << 17;

interface PassOne {
  readonly summary: GapStateSummary;
  readonly binaryPath: string;
  readonly count: number;
  /** Bad lines skipped (only with skipBadLines). */
  readonly skipped: number;
  /** The ΔE column as read (1-based) and its header name. */
  readonly columnIndex: number;
  readonly columnName: string | null;
}

export async function analyzeTraces(
  reactant: TraceAnalysisInput,
  product: TraceAnalysisInput,
  temperatureK: number,
  options: AnalyzeOptions = {},
): Promise<TraceAnalysisResult> {
  if (!(temperatureK > 0) || !Number.isFinite(temperatureK)) {
    throw new TraceAnalysisRefusal([
      { field: 'temperature', message: 'Temperature must be > 0 K (absolute). Did you enter °C?' },
    ]);
  }
  const folder = mkdtempSync(join(options.tmpDir ?? tmpdir(), 'gapwise-trace-'));
  try {
    const totalBytes = Math.max(1, reactant.sizeBytes + product.sizeBytes);
    const bytesSeen = { reactant: 0, product: 0 };
    const report = () =>
      options.onProgress?.(
        (PASS_ONE_WEIGHT * (bytesSeen.reactant + bytesSeen.product)) / totalBytes,
      );
    const [r, p] = await Promise.all([
      passOne(
        'reactant',
        reactant,
        folder,
        (bytes) => {
          bytesSeen.reactant = bytes;
          report();
        },
        options.signal,
      ),
      passOne(
        'product',
        product,
        folder,
        (bytes) => {
          bytesSeen.product = bytes;
          report();
        },
        options.signal,
      ),
    ]);
    const warnings: CalcWarning[] = [];
    const sink = { warn: (code: string, message: string) => warnings.push({ code, message }) };
    let outputs: GapOutputs;
    try {
      const plan = planGapHistograms(r.summary, p.summary);
      const own = {
        reactant: new HistogramCounter(plan.reactantEdges),
        product: new HistogramCounter(plan.productEdges),
      };
      const common = {
        reactant: new HistogramCounter(plan.commonEdges),
        product: new HistogramCounter(plan.commonEdges),
      };
      const total = r.count + p.count;
      let done = 0;
      for (const [state, pass] of [
        ['reactant', r],
        ['product', p],
      ] as const) {
        forEachBlock(pass.binaryPath, (block) => {
          own[state].pushMany(block);
          common[state].pushMany(block);
          done += block.length;
          if (options.signal?.aborted) throw options.signal.reason;
          options.onProgress?.(PASS_ONE_WEIGHT + ((1 - PASS_ONE_WEIGHT) * done) / total);
        });
      }
      outputs = gapOutputsFromCounts(
        r.summary,
        p.summary,
        plan,
        {
          reactant: own.reactant.counts,
          product: own.product.counts,
          commonReactant: common.reactant.counts,
          commonProduct: common.product.counts,
        },
        temperatureK,
        sink,
      );
    } catch (error) {
      if (error instanceof CalcRefusal) throw new TraceAnalysisRefusal([...error.errors]);
      throw error;
    }
    for (const [state, input, pass] of [
      ['reactant', reactant, r],
      ['product', product, p],
    ] as const) {
      if (pass.skipped > 0) {
        warnings.push({
          code: 'trace-bad-lines-skipped',
          message: `${pass.skipped} bad line${pass.skipped === 1 ? ' was' : 's were'} skipped in the ${state} file (${input.info.fileName}).`,
        });
      }
    }
    options.onProgress?.(1);
    return {
      method: 'reorg.gapSamples',
      temperatureK,
      sources: {
        reactant: {
          ...reactant.info,
          sampleCount: r.count,
          skippedLineCount: r.skipped,
          columnIndex: r.columnIndex,
          columnName: r.columnName,
        },
        product: {
          ...product.info,
          sampleCount: p.count,
          skippedLineCount: p.skipped,
          columnIndex: p.columnIndex,
          columnName: p.columnName,
        },
      },
      outputs,
      warnings,
    };
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

/** Pass 1 of one state: parse, accumulate, and keep the eV values in a binary file. */
async function passOne(
  state: 'reactant' | 'product',
  input: TraceAnalysisInput,
  folder: string,
  onBytes: (bytes: number) => void,
  signal: AbortSignal | undefined,
): Promise<PassOne> {
  const accumulator = new GapSampleAccumulator();
  const binaryPath = join(folder, `${state}.f64`);
  const fd = openSync(binaryPath, 'w');
  let seen = 0;
  try {
    const source = await input.open();
    const field = `${state}Samples`;
    let read;
    try {
      read = await readTrace(
        source,
        input.settings,
        (values, n) => {
          const chunk = values.subarray(0, n);
          accumulator.pushMany(chunk);
          writeSync(fd, new Uint8Array(chunk.buffer, chunk.byteOffset, n * 8));
        },
        {
          onRawChunk: (chunk) => {
            if (signal?.aborted) throw signal.reason;
            seen += chunk.length;
            onBytes(seen);
          },
        },
      );
    } catch (error) {
      if (error instanceof TraceFileError)
        throw new TraceAnalysisRefusal([{ field, message: error.message }]);
      throw error;
    }
    const problems = traceProblems(read.summary, input.settings.skipBadLines === true);
    if (problems.length > 0) {
      throw new TraceAnalysisRefusal(problems.map((pr) => ({ field, message: pr.message })));
    }
    const skipped = input.settings.skipBadLines ? read.summary.badLines.count : 0;
    const stats = accumulator.statistics();
    const [q1, q3] = stats.quartileEstimates;
    return {
      summary: { stats, iqr: q3 - q1 },
      binaryPath,
      count: accumulator.count,
      skipped,
      columnIndex: read.summary.columnIndex,
      columnName: read.summary.columnName,
    };
  } finally {
    closeSync(fd);
  }
}

/** Reads a binary file of float64 values block by block. */
function forEachBlock(path: string, visit: (block: Float64Array) => void): void {
  const fd = openSync(path, 'r');
  try {
    const buffer = new Float64Array(READ_BLOCK_SAMPLES);
    const bytes = new Uint8Array(buffer.buffer);
    while (true) {
      const n = readSync(fd, bytes, 0, bytes.length, null);
      if (n <= 0) break;
      visit(buffer.subarray(0, Math.floor(n / 8)));
    }
  } finally {
    closeSync(fd);
  }
}
