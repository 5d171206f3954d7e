/**
 * One pass over an uploaded trace: the raw bytes go at the same time to the SHA-256 hash, to the
 * object store (multipart, staging key) and through the parser. Only a file the parser accepts
 * is committed to its content address; otherwise the staged upload is discarded, so a refused or
 * interrupted upload leaves no object behind (and the caller writes no row).
 */
import { createHash } from 'node:crypto';
import type { TraceObjectStore } from './trace-object-store';
import {
  TraceFileError,
  readTrace,
  traceProblems,
  type TraceParseSettings,
  type TraceParseSummary,
  type TraceProblem,
} from '@gapwise/traces';

export interface IngestedTrace {
  readonly sha256: string;
  readonly objectKey: string;
  /** Bytes as uploaded (compressed size for gzip files). */
  readonly sizeBytes: number;
  readonly gzip: boolean;
  readonly summary: TraceParseSummary;
}

/** The file was read to the end and refused; nothing was stored. */
export class TraceRefusedError extends Error {
  constructor(
    readonly problems: TraceProblem[],
    readonly summary: TraceParseSummary | null,
  ) {
    super(problems.map((p) => p.message).join(' '));
    this.name = 'TraceRefusedError';
  }
}

export async function ingestTrace(
  store: TraceObjectStore,
  source: AsyncIterable<Uint8Array>,
  settings: TraceParseSettings,
  options: {
    readonly onBytes?: (bytes: number) => void;
    readonly maxDecompressedBytes?: number;
    readonly maxGzipRatio?: number;
  } = {},
): Promise<IngestedTrace> {
  const hash = createHash('sha256');
  const staged = store.beginUpload();
  let committed = false;
  try {
    let seen = 0;
    let result;
    try {
      result = await readTrace(source, settings, () => undefined, {
        maxDecompressedBytes: options.maxDecompressedBytes,
        maxGzipRatio: options.maxGzipRatio,
        onRawChunk: async (chunk) => {
          hash.update(chunk);
          seen += chunk.length;
          options.onBytes?.(seen);
          await staged.write(chunk);
        },
      });
    } catch (error) {
      if (error instanceof TraceFileError)
        throw new TraceRefusedError([{ field: 'file', message: error.message }], null);
      throw error;
    }
    const problems = traceProblems(result.summary, settings.skipBadLines === true);
    if (problems.length > 0) throw new TraceRefusedError(problems, result.summary);
    const sha256 = hash.digest('hex');
    const { key } = await staged.commit(sha256);
    committed = true;
    return {
      sha256,
      objectKey: key,
      sizeBytes: result.rawBytes,
      gzip: result.gzip,
      summary: result.summary,
    };
  } finally {
    if (!committed) await staged.discard();
  }
}
