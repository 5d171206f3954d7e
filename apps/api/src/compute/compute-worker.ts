/**
 * Entry of a compute-pool worker thread (piscina loads its default export). Runs one named task
 * of compute-tasks.ts. Tells the pool the moment the task starts (shared memory, no message) (the budget counts from there,
 * not from when it was queued), and sends an AppError back as plain data, because an Error
 * crossing threads loses its class and with it the status and the named fields.
 */
import { workerData } from 'node:worker_threads';
import { AppError } from '../http/app-error';
import { computeTasks, type ComputeTaskName } from './compute-tasks';

export interface ComputeJob {
  readonly task: ComputeTaskName;
  readonly args: readonly unknown[];
  /** This task's slot in `ComputeWorkerData.starts`. */
  readonly slot: number;
}

/** What the pool gives every worker thread (piscina's `workerData`). */
export interface ComputeWorkerData {
  /** Per task slot, the time (Date.now(), ms) a worker started the task; 0 when none runs. */
  readonly starts: Float64Array;
}

const { starts } = workerData as ComputeWorkerData;

export type ComputeOutcome =
  | { readonly value: unknown }
  | {
      readonly appError: {
        status: number;
        code: string;
        message: string;
        details: AppError['details'];
      };
    };

export default async function runComputeJob(job: ComputeJob): Promise<ComputeOutcome> {
  starts[job.slot] = Date.now();
  const task = computeTasks[job.task] as (...args: unknown[]) => unknown;
  try {
    return { value: await task(...job.args) };
  } catch (error) {
    if (error instanceof AppError) {
      const { status, code, message, details } = error;
      return { appError: { status, code, message, details } };
    }
    throw error;
  }
}
