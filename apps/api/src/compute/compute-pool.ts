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
import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import { REPO_ROOT } from '../config';
import { AppError } from '../http/app-error';
import type { ComputeRunner, ComputeTaskName, ComputeTasks } from './compute-tasks';
import type { ComputeJob, ComputeOutcome } from './compute-worker';

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
  private started = 0;
  /** Tasks handed to piscina (at most `threads`: piscina never queues). */
  private active = 0;
  /** Tasks waiting for a thread, first come first served (at most `queue`). */
  private readonly waiting: { resolve(): void; reject(error: Error): void }[] = [];

  private constructor(
    private readonly piscina: Piscina,
    readonly options: ComputePoolOptions,
    /** The file the worker threads run (tests check the bundled server uses its bundle). */
    readonly workerFile: string,
  ) {}

  /** Calculations a worker thread is computing now (tests wait on it). */
  get running(): number {
    return this.started;
  }

  /** Calculations waiting for a thread now (tests wait on it). */
  get queued(): number {
    return this.waiting.length;
  }

  static async start(options: ComputePoolOptions): Promise<ComputePool> {
    const filename = await workerFilename();
    const piscina = new Piscina({
      filename,
      // As many threads as allowed, kept: piscina replaces a thread it terminated (over budget)
      // only up to minThreads, and a replacement is then ready for the next task.
      minThreads: options.threads,
      maxThreads: options.threads,
      // One calculation per thread: a second one would share the thread's CPU and its budget.
      concurrentTasksPerWorker: 1,
    });
    return new ComputePool(piscina, options, filename);
  }

  /** Runs `task(...args)` in a worker thread within its budget. */
  async run<T extends ComputeTaskName>(
    task: T,
    args: Parameters<ComputeTasks[T]>,
    options: ComputeRunOptions = { budget: 'interactive', advice: DEFAULT_ADVICE },
  ): Promise<Awaited<ReturnType<ComputeTasks[T]>>> {
    await this.acquire();
    try {
      return await this.runNow(task, args, options);
    } finally {
      this.release();
    }
  }

  /**
   * A thread of our own counting, or a place in our queue, or 503. The queue is kept here rather
   * than in piscina so that admission is exact (a task handed over always has a thread) and a
   * waiting task never follows a thread that is being terminated.
   */
  private async acquire(): Promise<void> {
    if (this.closed) throw poolBusy('The server is stopping.');
    if (this.active < this.options.threads) {
      this.active++;
      return;
    }
    if (this.waiting.length >= this.options.queue)
      throw poolBusy(
        `All ${this.options.threads} calculation thread(s) are busy and ${this.waiting.length} calculation(s) are waiting.`,
      );
    // The slot is handed over by release() (active stays counted).
    await new Promise<void>((resolve, reject) => this.waiting.push({ resolve, reject }));
  }

  private release(): void {
    const next = this.waiting.shift();
    if (next) next.resolve();
    else this.active--;
  }

  private async runNow<T extends ComputeTaskName>(
    task: T,
    args: Parameters<ComputeTasks[T]>,
    options: ComputeRunOptions,
  ): Promise<Awaited<ReturnType<ComputeTasks[T]>>> {
    const budgetMs =
      options.budget === 'interactive'
        ? this.options.interactiveBudgetMs
        : this.options.backgroundBudgetMs;
    const abort = new AbortController();
    const stop = () => abort.abort(options.signal?.reason);
    if (options.signal?.aborted) stop();
    else options.signal?.addEventListener('abort', stop, { once: true });
    const channel = new MessageChannel();
    let timer: NodeJS.Timeout | undefined;
    let overBudget = false;
    let counted = false;
    channel.port1.once('message', () => {
      counted = true;
      this.started++;
      timer = setTimeout(() => {
        overBudget = true;
        abort.abort();
      }, budgetMs);
      channel.port1.close();
    });
    const job: ComputeJob = { task, args, started: channel.port2 };
    try {
      const outcome = (await this.piscina.run(job, {
        signal: abort.signal,
        transferList: [channel.port2, ...(options.transferList ?? [])] as never,
      })) as ComputeOutcome;
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
      if (counted) this.started--;
      clearTimeout(timer);
      options.signal?.removeEventListener('abort', stop);
      channel.port1.close();
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
