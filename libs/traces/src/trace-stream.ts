/**
 * Reads a trace from any byte stream (an upload, an object-store download, a local file):
 * detects gzip by its magic bytes (1f 8b), decompresses on the fly, and feeds the line parser.
 * Memory stays flat: only the current chunk and one partial line are held.
 */
import { once } from 'node:events';
import { createGunzip, type Gunzip } from 'node:zlib';
import {
  TraceLineParser,
  type BadLine,
  type TraceParseSettings,
  type TraceParseSummary,
  type TraceSink,
} from './trace-parser';

export interface ReadTraceOptions {
  /** Sees every raw chunk (as stored, possibly compressed) before it is parsed; may apply backpressure. */
  readonly onRawChunk?: (chunk: Buffer) => void | Promise<void>;
  /** Largest decompressed size of a gzip file (bytes); over it the read stops with TraceTooLargeError. */
  readonly maxDecompressedBytes?: number;
  /** Largest decompressed/compressed ratio, checked once more than 16 MiB are inflated. */
  readonly maxGzipRatio?: number;
}

export interface TraceReadResult {
  readonly summary: TraceParseSummary;
  readonly gzip: boolean;
  /** Bytes read from the source (compressed size for gzip files). */
  readonly rawBytes: number;
}

/** The file as a whole cannot be read (corrupt gzip data). */
export class TraceFileError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'TraceFileError';
  }
}

/** A gzip file expands beyond the configured cap (a decompression bomb, or simply too big). */
/** Below this many inflated bytes the ratio rule does not apply (small files compress well too). */
const RATIO_CHECK_FROM_BYTES = 16 * 1024 ** 2;

export class TraceTooLargeError extends Error {
  constructor(
    readonly limitBytes: number,
    /** Set when the ratio rule refused the file rather than the size cap. */
    readonly ratio: number | null = null,
  ) {
    super(`The file decompresses to more than ${limitBytes} bytes.`);
    this.name = 'TraceTooLargeError';
  }
}

export async function readTrace(
  source: AsyncIterable<Uint8Array>,
  settings: TraceParseSettings,
  sink: TraceSink,
  options: ReadTraceOptions = {},
): Promise<TraceReadResult> {
  const parser = new TraceLineParser(settings, sink);
  let head: Buffer | null = null;
  let gunzip: Gunzip | null = null;
  let gzipError: Error | null = null;
  let decided = false;
  let rawBytes = 0;
  let inflatedBytes = 0;
  let tooLarge = false;
  const maxInflated = options.maxDecompressedBytes ?? Number.POSITIVE_INFINITY;
  const maxRatio = options.maxGzipRatio ?? Number.POSITIVE_INFINITY;
  let ratioLimited = false;

  const feed = async (chunk: Buffer): Promise<void> => {
    if (!gunzip) {
      parser.push(chunk);
      return;
    }
    if (gzipError || tooLarge) return;
    if (!gunzip.write(chunk)) {
      await Promise.race([once(gunzip, 'drain'), once(gunzip, 'close')]);
    }
  };

  for await (const piece of source) {
    const chunk = Buffer.isBuffer(piece)
      ? piece
      : Buffer.from(piece.buffer, piece.byteOffset, piece.byteLength);
    rawBytes += chunk.length;
    if (options.onRawChunk) await options.onRawChunk(chunk);
    if (!decided) {
      head = head ? Buffer.concat([head, chunk]) : chunk;
      if (head.length < 2) continue;
      decided = true;
      if (head[0] === 0x1f && head[1] === 0x8b) {
        gunzip = createGunzip();
        const g: Gunzip = gunzip;
        g.on('data', (out: Buffer) => {
          if (tooLarge) return;
          inflatedBytes += out.length;
          const ratioOver =
            inflatedBytes > RATIO_CHECK_FROM_BYTES && inflatedBytes > maxRatio * rawBytes;
          if (inflatedBytes > maxInflated || ratioOver) {
            if (ratioOver && !(inflatedBytes > maxInflated)) ratioLimited = true;
            // Stop inflating at once; the rest of the upload is read (and discarded) unparsed.
            tooLarge = true;
            g.destroy();
            return;
          }
          parser.push(out);
        });
        gunzip.on('error', (error) => {
          gzipError = error;
        });
      }
      const first = head;
      head = null;
      await feed(first);
      continue;
    }
    await feed(chunk);
  }
  if (!decided && head) parser.push(head);
  if (gunzip) {
    const g: Gunzip = gunzip;
    if (!gzipError && !tooLarge) {
      const ended = Promise.race([once(g, 'end'), once(g, 'close')]);
      g.end();
      await ended.catch(() => undefined);
    }
    // Checked after the end: the last input's output (all of it, for a small file) comes out there.
    if (tooLarge) throw new TraceTooLargeError(maxInflated, ratioLimited ? maxRatio : null);
    if (gzipError) {
      g.destroy();
      throw new TraceFileError(
        `The file starts like gzip data but cannot be decompressed (${(gzipError as Error).message}).`,
      );
    }
  }
  return { summary: parser.finish(), gzip: gunzip !== null, rawBytes };
}

/** One reason a file is refused, in the API's field-error shape (line numbers in the message). */
export interface TraceProblem {
  readonly field: string;
  readonly message: string;
  readonly line?: number;
}

/**
 * Why a parsed file is refused, or an empty list when it is accepted: a whole-file problem, or
 * (unless bad lines are skipped) the first 20 bad lines and a line giving the total.
 */
export function traceProblems(summary: TraceParseSummary, skipBadLines: boolean): TraceProblem[] {
  const problems: TraceProblem[] = [];
  if (summary.fatal) problems.push({ field: summary.fatal.field, message: summary.fatal.message });
  if (!skipBadLines && summary.badLines.count > 0) {
    problems.push(
      ...summary.badLines.first.map((b: BadLine) => ({
        field: 'file',
        line: b.line,
        message: b.message,
      })),
    );
    problems.push({
      field: 'file',
      message: badLinesSentence(summary.badLines.count, summary.badLines.first.length),
    });
  }
  return problems;
}

export function badLinesSentence(count: number, listed: number): string {
  return count === 1
    ? '1 bad line in total.'
    : `${count} bad lines in total${listed < count ? ` (the first ${listed} are listed)` : ''}.`;
}
