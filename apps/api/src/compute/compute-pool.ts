/**
 * The pool of worker threads every calculation runs in (piscina), so the thread that answers HTTP
 * never computes. Each task has a budget of wall time counted from the moment a worker starts it
 * (time spent queued does not count); over budget the worker thread is terminated (piscina ends
 * the thread of an aborted task) and the caller gets 422 naming the budget and what to change.
 * With every thread busy and the queue full, a new task is refused with 503 and Retry-After.
 *
 * Wall time rather than CPU time: Node cannot stop a thread when its CPU clock passes a mark, only
 * when a timer fires, and a calculation is one synchronous, single-threaded loop, so on a machine
 * that is not oversubscribed its wall time is its CPU time.
 */
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';
import { REPO_ROOT } from '../config';
import { AppError } from '../http/app-error';
import type { ComputeRunner, ComputeTaskName, ComputeTasks } from './compute-tasks';
import type { ComputeJob, ComputeOutcome, ComputeWorkerData } from './compute-worker';

export interface ComputePoolOptions {
  /** Worker threads at most. */
  readonly threads: number;
  /** Tasks waiting for a thread at most; one more is refused with 503. */
  readonly queue: number;
  /** Budget of a calculation a person waits for (ms). */
  readonly interactiveBudgetMs: number;
  /** Budget of background work: screen chunks of the in-server worker (ms). */
  readonly backgroundBudgetMs: number;
}

export interface ComputeRunOptions {
  /** `interactive` (CALC_BUDGET_MS) or `background` (BACKGROUND_CALC_BUDGET_MS). */
  readonly budget: 'interactive' | 'background';
  /** What the caller can change to stay within the budget, one sentence. */
  readonly advice: string;
  /** Objects inside `args` moved to the worker rather than copied (MessagePorts must be). */
  readonly transferList?: readonly Transferable[];
  /** Stops the task (its thread is ended), e.g. a background job being handed back. */
  readonly signal?: AbortSignal;
}

/** Seconds a client is told to wait when the pool is saturated. */
export const RETRY_AFTER_SECONDS = 5;

const DEFAULT_ADVICE =
  'Ask for less work: fewer samples or points, a larger ħω, or the classical or thermal form.';

/** The worker entry: the bundle beside the bundled server, or the TypeScript source via tsx. */
async function workerFilename(): Promise<string> {
  const here = fileURLToPath(import.meta.url);
  if (here.endsWith('.ts')) return join(dirname(here), 'compute-worker-tsx.mjs');
  // Running from .cache/bundles (docker-free-scripts/run-bundled.mjs): the worker has its own
  // bundle, built (or found fresh) the same way as the server's. The query makes a second,
  // separate instance of the launcher module: the first is still evaluating (it is awaiting this
  // very server), and importing it again would wait on itself.
  const script = `${pathToFileURL(join(REPO_ROOT, 'docker-free-scripts', 'run-bundled.mjs')).href}?library`;
  const { bundledPath } = (await import(script)) as {
    bundledPath(entry: string): Promise<string>;
  };
  return bundledPath('apps/api/src/compute/compute-worker.ts');
}

export class ComputePool implements ComputeRunner {
  private closed = false;
  /** Tasks handed to piscina (at most `threads`: piscina never queues). */
  private active = 0;
  /** Slots of `starts` not held by a task. */
  private readonly freeSlots: number[];
  /** Tasks waiting for a thread, first come first served (at most `queue`). */
  private readonly waiting: { resolve(slot: number): void; reject(error: Error): void }[] = [];

  private constructor(
    private readonly piscina: Piscina,
    readonly options: ComputePoolOptions,
    /** The file the worker threads run (tests check the bundled server uses its bundle). */
    readonly workerFile: string,
    /**
     * One slot per admitted task (at most `threads`), shared with every worker thread: the
     * worker writes the time (Date.now(), ms) its task started, the pool clears it when the task
     * ends. The budget counts from that time, without a message per task (a MessageChannel per
     * task cost ~50 µs of a ~130 µs round trip, apps/api/bench/api-reads.bench.ts).
     */
    private readonly starts: Float64Array,
  ) {
    this.freeSlots = Array.from({ length: options.threads }, (_, i) => options.threads - 1 - i);
  }

  /** Calculations a worker thread is computing now (tests wait on it). */
  get running(): number {
    let n = 0;
    for (const start of this.starts) if (start > 0) n++;
    return n;
  }

  /** Calculations waiting for a thread now (tests wait on it). */
  get queued(): number {
    return this.waiting.length;
  }

  /** Tasks the worker threads have finished since the pool started (piscina's counter). */
  get completed(): number {
    return this.piscina.completed;
  }

  static async start(options: ComputePoolOptions): Promise<ComputePool> {
    const filename = await workerFilename();
    const starts = new Float64Array(new SharedArrayBuffer(8 * options.threads));
    const workerData: ComputeWorkerData = { starts };
    const piscina = new Piscina({
      filename,
      workerData,
      // As many threads as allowed, kept: piscina replaces a thread it terminated (over budget)
      // only up to minThreads, and a replacement is then ready for the next task. Idle threads
      // are never ended (no start-up cost on the next request).
      minThreads: options.threads,
      maxThreads: options.threads,
      idleTimeout: Number.MAX_SAFE_INTEGER,
      // One calculation per thread: a second one would share the thread's CPU and its budget.
      concurrentTasksPerWorker: 1,
      // An idle worker waits for its next task with Atomics.wait (piscina's default, stated):
      // the hand-off needs no turn of the worker's event loop.
      atomics: 'sync',
      // No run/wait-time histograms: nothing reads them, and they cost on every task.
      recordTiming: false,
    });
    return new ComputePool(piscina, options, filename, starts);
  }

  /** Runs `task(...args)` in a worker thread within its budget. */
  async run<T extends ComputeTaskName>(
    task: T,
    args: Parameters<ComputeTasks[T]>,
    options: ComputeRunOptions = { budget: 'interactive', advice: DEFAULT_ADVICE },
  ): Promise<Awaited<ReturnType<ComputeTasks[T]>>> {
    const slot =
      this.active < this.options.threads && !this.closed ? this.take() : await this.acquire();
    try {
      return await this.runNow(task, args, options, slot);
    } finally {
      this.release(slot);
    }
  }

  private take(): number {
    this.active++;
    return this.freeSlots.pop()!;
  }

  /**
   * A thread of our own counting, or a place in our queue, or 503. The queue is kept here rather
   * than in piscina so that admission is exact (a task handed over always has a thread) and a
   * waiting task never follows a thread that is being terminated.
   */
  private async acquire(): Promise<number> {
    if (this.closed) throw poolBusy('The server is stopping.');
    if (this.active < this.options.threads) return this.take();
    if (this.waiting.length >= this.options.queue)
      throw poolBusy(
        `All ${this.options.threads} calculation thread(s) are busy and ${this.waiting.length} calculation(s) are waiting.`,
      );
    // The slot is handed over by release() (active stays counted).
    return new Promise<number>((resolve, reject) => this.waiting.push({ resolve, reject }));
  }

  private release(slot: number): void {
    this.starts[slot] = 0;
    const next = this.waiting.shift();
    if (next) next.resolve(slot);
    else {
      this.active--;
      this.freeSlots.push(slot);
    }
  }

  private async runNow<T extends ComputeTaskName>(
    task: T,
    args: Parameters<ComputeTasks[T]>,
    options: ComputeRunOptions,
    slot: number,
  ): Promise<Awaited<ReturnType<ComputeTasks[T]>>> {
    const budgetMs =
      options.budget === 'interactive'
        ? this.options.interactiveBudgetMs
        : this.options.backgroundBudgetMs;
    const abort = new AbortController();
    const signal = options.signal;
    const stop = signal ? () => abort.abort(signal.reason) : undefined;
    if (signal?.aborted) stop!();
    else if (stop) signal!.addEventListener('abort', stop, { once: true });
    let overBudget = false;
    // Fires one budget after the hand-off, then again until the budget counted from the moment
    // the worker started (a thread being replaced may start the task late) has passed.
    const check = () => {
      const started = this.starts[slot]!;
      const left = started > 0 ? started + budgetMs - Date.now() : budgetMs;
      if (left > 0) timer = setTimeout(check, left);
      else {
        overBudget = true;
        abort.abort();
      }
    };
    let timer = setTimeout(check, budgetMs);
    this.starts[slot] = 0;
    const job: ComputeJob = { task, args, slot };
    try {
      const outcome = (await this.piscina.run(
        job,
        options.transferList
          ? { signal: abort.signal, transferList: options.transferList as never }
          : { signal: abort.signal },
      )) as ComputeOutcome;
      if ('appError' in outcome) {
        const e = outcome.appError;
        throw new AppError(e.status, e.code, e.message, e.details);
      }
      return outcome.value as Awaited<ReturnType<ComputeTasks[T]>>;
    } catch (error) {
      if (overBudget) throw overBudgetError(budgetMs, options);
      if (this.closed) throw poolBusy('The server is stopping.');
      throw error;
    } finally {
      clearTimeout(timer);
      if (stop) signal!.removeEventListener('abort', stop);
    }
  }

  /** Ends every worker thread, running calculations included (server shutdown). */
  async destroy(): Promise<void> {
    this.closed = true;
    for (const waiter of this.waiting.splice(0)) waiter.reject(poolBusy('The server is stopping.'));
    // destroy(), not close(): close waits for running tasks (up to its closeTimeout), while the
    // server must stop within 10 s of SIGTERM whatever is being computed.
    await this.piscina.destroy();
  }
}

function seconds(ms: number): string {
  return `${Number((ms / 1000).toPrecision(3))} s`;
}

function overBudgetError(budgetMs: number, options: ComputeRunOptions): AppError {
  const variable =
    options.budget === 'interactive' ? 'CALC_BUDGET_MS' : 'BACKGROUND_CALC_BUDGET_MS';
  return new AppError(
    422,
    'calculation-over-budget',
    `The calculation did not finish within its budget of ${seconds(budgetMs)} of computing time and was stopped. ${options.advice} (The server's budget is set by ${variable}.)`,
  );
}

function poolBusy(reason: string): AppError {
  return new AppError(
    503,
    'calculation-pool-busy',
    `${reason} Try again in ${RETRY_AFTER_SECONDS} s.`,
    { retryAfterSeconds: RETRY_AFTER_SECONDS },
  );
}
