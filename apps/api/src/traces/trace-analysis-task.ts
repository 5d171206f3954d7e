/**
 * The trace analysis in a compute-pool worker thread. Parsing the files, accumulating the
 * statistics and counting the histograms (pass 2 is one synchronous loop over every sample) is
 * CPU work, so it runs in the pool within the background budget; object storage stays with the
 * thread that owns the S3 client. The two threads talk over a MessagePort per file: the worker
 * asks for the next chunk, the server thread reads it from object storage and sends it (one
 * chunk in flight per file, so memory stays flat), and progress comes back on a third port.
 */
import { MessageChannel, type MessagePort } from 'node:worker_threads';
import type { TraceAnalysisResult } from '@gapwise/contracts';
import {
  TraceAnalysisRefusal,
  analyzeTraces,
  type AnalyzeOptions,
  type TraceAnalysisInput,
} from '@gapwise/traces';
import type { ComputeRunner } from '../compute/compute-tasks';

type FileMessage = { chunk: Uint8Array } | { done: true } | { error: string };

/** What crosses to the worker for one file: everything but `open`, plus the port to read from. */
export interface PortedTraceInput extends Omit<TraceAnalysisInput, 'open'> {
  readonly port: MessagePort;
}

export interface TraceAnalysisTask {
  readonly reactant: PortedTraceInput;
  readonly product: PortedTraceInput;
  readonly temperatureK: number;
  readonly tmpDir?: string;
  readonly progress: MessagePort;
}

export type TraceAnalysisTaskOutcome =
  | { readonly result: TraceAnalysisResult }
  | { readonly refused: Array<{ field: string; message: string }> };

/** Worker side: the file's bytes, chunk by chunk, asked for over its port. */
async function* chunksFrom(port: MessagePort): AsyncIterable<Uint8Array> {
  try {
    while (true) {
      const message = await new Promise<FileMessage>((resolve) => {
        port.once('message', resolve);
        port.postMessage('next');
      });
      if ('error' in message) throw new Error(message.error);
      if ('done' in message) return;
      yield message.chunk;
    }
  } finally {
    port.close();
  }
}

/** Worker side (compute-tasks.ts `traceAnalysis`): the analysis, a refusal as plain data. */
export async function runTraceAnalysisTask(
  task: TraceAnalysisTask,
): Promise<TraceAnalysisTaskOutcome> {
  const input = ({ port, ...rest }: PortedTraceInput): TraceAnalysisInput => ({
    ...rest,
    open: async () => chunksFrom(port),
  });
  try {
    const result = await analyzeTraces(
      input(task.reactant),
      input(task.product),
      task.temperatureK,
      {
        tmpDir: task.tmpDir,
        onProgress: (fraction) => task.progress.postMessage(fraction),
      },
    );
    return { result };
  } catch (error) {
    // An Error crossing threads loses its class; the refusal's fields are sent as data.
    if (error instanceof TraceAnalysisRefusal) return { refused: error.errors };
    throw error;
  } finally {
    task.progress.close();
  }
}

/** Server side: answers the worker's requests for the next chunk of one file. */
function serveFile(port: MessagePort, open: TraceAnalysisInput['open']): () => Promise<void> {
  let iterator: AsyncIterator<Uint8Array> | null = null;
  port.on('message', () => {
    void (async () => {
      let message: FileMessage;
      try {
        iterator ??= (await open())[Symbol.asyncIterator]();
        const next = await iterator.next();
        // A copy of its own: a stream chunk may be a slice of a shared pool buffer.
        message = next.done ? { done: true } : { chunk: new Uint8Array(next.value) };
      } catch (error) {
        message = { error: (error as Error)?.message ?? String(error) };
      }
      try {
        port.postMessage(message, 'chunk' in message ? [message.chunk.buffer as ArrayBuffer] : []);
      } catch {
        // The worker thread is gone (stopped or over budget): nothing is waiting for the bytes.
      }
    })();
  });
  return async () => {
    port.close();
    await iterator?.return?.().catch(() => undefined);
  };
}

/**
 * Runs `analyzeTraces` in a worker thread of the pool (background budget); `signal` stops it.
 * A refusal is rethrown as `TraceAnalysisRefusal`; over budget the pool's 422 AppError.
 */
export async function analyzeTracesInPool(
  compute: ComputeRunner,
  reactant: TraceAnalysisInput,
  product: TraceAnalysisInput,
  temperatureK: number,
  options: AnalyzeOptions = {},
): Promise<TraceAnalysisResult> {
  const files = [new MessageChannel(), new MessageChannel()];
  const progress = new MessageChannel();
  progress.port1.on('message', (fraction: number) => options.onProgress?.(fraction));
  const stops = [serveFile(files[0].port1, reactant.open), serveFile(files[1].port1, product.open)];
  const ported = (
    { settings, sizeBytes, info }: TraceAnalysisInput,
    port: MessagePort,
  ): PortedTraceInput => ({ settings, sizeBytes, info, port });
  try {
    const outcome = await compute.run(
      'traceAnalysis',
      [
        {
          reactant: ported(reactant, files[0].port2),
          product: ported(product, files[1].port2),
          temperatureK,
          tmpDir: options.tmpDir,
          progress: progress.port2,
        },
      ],
      {
        budget: 'background',
        advice:
          'Analyse shorter traces (fewer samples), or raise BACKGROUND_CALC_BUDGET_MS for long ones.',
        transferList: [files[0].port2, files[1].port2, progress.port2],
        signal: options.signal,
      },
    );
    if ('refused' in outcome) throw new TraceAnalysisRefusal(outcome.refused);
    return outcome.result;
  } finally {
    progress.port1.close();
    await Promise.all(stops.map((stop) => stop()));
  }
}
