/**
 * Worker-thread entry of the compute pool (piscina calls the default export with each task): imports
 * the task's module once (by the URL its owner registered), calls the exported function, times it.
 */

import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import type { ComputeRequest, ComputeResponse } from './compute-pool.js';

const modules = new Map<string, Promise<Record<string, unknown>>>();
const requireHere = createRequire(import.meta.url);

/**
 * dist/: a plain dynamic import. From TypeScript sources (tests, tsx) the thread runs under tsx,
 * whose require hook loaded this file; Node 20 does not apply tsx's ESM hooks to a worker's dynamic
 * import(), so a .ts task module is loaded the same way as this file.
 */
const load = (url: string): Promise<Record<string, unknown>> =>
  url.endsWith('.ts') ? Promise.resolve(requireHere(fileURLToPath(url)) as Record<string, unknown>) : (import(url) as Promise<Record<string, unknown>>);

export default async function computeWorker(request: ComputeRequest): Promise<ComputeResponse> {
  let loading = modules.get(request.module);
  if (!loading) modules.set(request.module, (loading = load(request.module)));
  const run = (await loading)[request.exportName];
  if (typeof run !== 'function') throw new Error(`compute task ${request.exportName} not found in ${request.module}`);
  const started = performance.now();
  const outcome: unknown = await run(request.input);
  return { outcome, durationMs: performance.now() - started };
}
