/**
 * The computations that run off the event loop, in worker threads, by name. Each takes plain,
 * structured-cloneable data and returns a TaskOutcome: errors come back as data because thrown
 * errors lose their fields across the thread boundary.
 */

import { handleZwdRequest } from '../services/zwd-request.js';

export const COMPUTE_TASKS = {
  /** A whole POST .../zwd-estimates request: parse, validate, estimate, serialise. */
  'zwd-estimate-request': handleZwdRequest,
} as const;

export type ComputeTaskName = keyof typeof COMPUTE_TASKS;
export type ComputeTaskInput<T extends ComputeTaskName> = Parameters<(typeof COMPUTE_TASKS)[T]>[0];
export type ComputeTaskOutput<T extends ComputeTaskName> = Extract<Awaited<ReturnType<(typeof COMPUTE_TASKS)[T]>>, { ok: true }>['output'];

export interface ComputeRequest {
  task: ComputeTaskName;
  input: unknown;
}

export interface ComputeResponse {
  outcome: unknown;
  /** Run time inside the worker [ms]. */
  durationMs: number;
}

/** Runs one task (in a worker thread). */
export async function runComputeTask(request: ComputeRequest): Promise<ComputeResponse> {
  const started = performance.now();
  const run = COMPUTE_TASKS[request.task] as ((input: unknown) => Promise<unknown>) | undefined;
  if (!run) throw new Error(`unknown compute task ${request.task}`);
  const outcome = await run(request.input);
  return { outcome, durationMs: performance.now() - started };
}
