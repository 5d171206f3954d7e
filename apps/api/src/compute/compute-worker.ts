/**
 * Entry of a compute-pool worker thread (piscina loads its default export). Runs one named task
 * of compute-tasks.ts. Tells the pool the moment the task starts (the budget counts from there,
 * not from when it was queued), and sends an AppError back as plain data, because an Error
 * crossing threads loses its class and with it the status and the named fields.
 */
import type { MessagePort } from 'node:worker_threads';
import { AppError } from '../http/app-error';
import { computeTasks, type ComputeTaskName } from './compute-tasks';

export interface ComputeJob {
  readonly task: ComputeTaskName;
  readonly args: readonly unknown[];
  readonly started: MessagePort;
}

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
  job.started.postMessage('started');
  job.started.close();
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
