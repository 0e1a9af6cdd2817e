/**
 * A CPU profile of the estimation task as a worker thread runs it (zwdRequestTask, src/http/tasks/zwd-request.ts),
 * in-process, over a window of requests of a fresh process: the worker's own account, which bench/edge-profile.ts
 * does not give (workers end on SIGTERM and write no profile). The GPS-like day as columns JSON bytes
 * (bench/json-read-day.ts), default options, the answer in the shape asked.
 *
 *   npx tsx bench/worker-profile.ts [skip=5] [requests=40] [rows|columns] [profile file] [dist root]
 *
 * runs `skip` requests unprofiled (a fresh worker of a service after its warm-up gets ~5: edge-ab sends 10 to two
 * workers), then profiles the next `requests` (node:inspector, 250 µs sampling) and prints the process's CPU per
 * request over them (all threads: V8's background compiles and GC helpers count). The code is the dist/ of the
 * tree given (default: this one; build it first), as the service runs it. Compare a window of a fresh worker
 * (skip 5) with a warm one (skip 300) to see what V8's tier-up costs; the profile opens in Chrome's DevTools.
 */

import { writeFileSync } from 'node:fs';
import { Session } from 'node:inspector/promises';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { zwdRequestTask as Task } from '../src/http/tasks/zwd-request.js';
import { dayBody } from './json-read-day.js';

const [skip = '5', count = '40', shape = 'columns', out = '/tmp/worker.cpuprofile', root = '.'] = process.argv.slice(2);
const task = resolve(root, 'dist/http/tasks/zwd-request.js');
const { zwdRequestTask } = (await import(pathToFileURL(task).href)) as { zwdRequestTask: typeof Task };
const bytes = dayBody('gps');
const answer = { shape: shape === 'rows' ? ('rows' as const) : ('columns' as const), format: 'json' as const, fields: undefined };

/** One request as the worker runs it: its own copy of the body bytes (the task drops them once read). */
async function request(): Promise<void> {
  const outcome = await zwdRequestTask({ body: new Uint8Array(bytes), format: 'json', query: {}, answer });
  if (!outcome.ok) throw new Error(`the task failed: ${JSON.stringify(outcome.error).slice(0, 300)}`);
}

for (let i = 0; i < Number(skip); i++) await request();
const session = new Session();
session.connect();
await session.post('Profiler.enable');
await session.post('Profiler.setSamplingInterval', { interval: 250 });
await session.post('Profiler.start');
const before = process.cpuUsage();
for (let i = 0; i < Number(count); i++) await request();
const used = process.cpuUsage(before);
const { profile } = await session.post('Profiler.stop');
writeFileSync(out, JSON.stringify(profile));
process.stdout.write(
  `requests ${skip}..${Number(skip) + Number(count) - 1} of a fresh process (${task}): ${((used.user + used.system) / 1000 / Number(count)).toFixed(2)} ms CPU a request (all threads); profile in ${out}\n`,
);
