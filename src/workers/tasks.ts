/**
 * The computations that run off the event loop, in worker threads, by name. Each takes plain,
 * structured-cloneable data and returns plain data; a model-domain error comes back as data
 * ({ ok: false, error }) because thrown errors lose their fields across the thread boundary.
 */

import { estimateZwdOutcome } from '../estimation/estimate.js';

export const COMPUTE_TASKS = {
  'zwd-estimate': estimateZwdOutcome,
} as const;

export type ComputeTaskName = keyof typeof COMPUTE_TASKS;
export type ComputeTaskInput<T extends ComputeTaskName> = Parameters<(typeof COMPUTE_TASKS)[T]>[0];
export type ComputeTaskOutcome<T extends ComputeTaskName> = ReturnType<(typeof COMPUTE_TASKS)[T]>;

export interface ComputeRequest {
  task: ComputeTaskName;
  input: unknown;
}

export interface ComputeResponse {
  outcome: unknown;
  /** Run time inside the worker [ms]. */
  durationMs: number;
}

/** Runs one task (in a worker, or inline when no pool is used). */
export function runComputeTask(request: ComputeRequest): ComputeResponse {
  const started = performance.now();
  const run = COMPUTE_TASKS[request.task] as (input: unknown) => unknown;
  if (!run) throw new Error(`unknown compute task ${request.task}`);
  const outcome = run(request.input);
  return { outcome, durationMs: performance.now() - started };
}
