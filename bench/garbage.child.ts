/**
 * Child process of bench/garbage.bench.ts: handleZwdRequest (rows answer, default options) of a source tree
 * (argument 1: its root, "." for this one) on the GPS-like day's columns JSON as bytes (bench/json-read-day.ts),
 * warm (20 runs first). Per message from the parent it runs the task `BENCH_GARBAGE_BATCH` times (default 5)
 * and answers with the whole process's CPU time so far [ms] (all threads, so garbage collection on helper
 * threads counts), or (message "alloc") the bytes the sampling heap profiler saw allocated in 20 requests, a
 * request (every object sampled with probability ~size/interval, those collected since kept in the profile:
 * an estimate of all bytes allocated on the heap; the profiler costs CPU, so the CPU batches run without it,
 * before the first "alloc"); with each answer, the scavenges so far (minor GCs: count and pauses). With
 * argument 2 "sites" it instead prints the largest allocation sites of 20 runs and exits.
 */

import { existsSync } from 'node:fs';
import { constants, PerformanceObserver, type PerformanceEntry } from 'node:perf_hooks';
import { Session } from 'node:inspector/promises';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { handleZwdRequest } from '../src/http/tasks/zwd-request.js';
import { dayBody } from './json-read-day.js';

const root = resolve(process.argv[2] ?? '.');
const batch = Number(process.env.BENCH_GARBAGE_BATCH ?? 5);
const bytes = dayBody('gps');
// A source tree, or a build of one (`npx tsc -p tsconfig.build.json`: dist/, whose line numbers name the sites).
const taskFile = existsSync(`${root}/src/http/tasks/zwd-request.ts`)
  ? `${root}/src/http/tasks/zwd-request.ts`
  : `${root}/http/tasks/zwd-request.js`;
const handle = ((await import(pathToFileURL(taskFile).href)) as { handleZwdRequest: typeof handleZwdRequest }).handleZwdRequest;
const run = async () => {
  const outcome = await handle({ body: bytes, format: 'json', query: {} });
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.error).slice(0, 300));
};
for (let i = 0; i < 20; i++) await run();

interface ProfileNode {
  callFrame: { functionName: string; url: string; lineNumber: number };
  selfSize: number;
  children: ProfileNode[];
}
interface SamplingProfile {
  head: ProfileNode;
  samples: { size: number; nodeId: number }[];
}
const session = new Session();
session.connect();
const SAMPLING_INTERVAL = 4096;

async function sampled(work: () => Promise<void>): Promise<SamplingProfile> {
  await session.post('HeapProfiler.startSampling', {
    samplingInterval: SAMPLING_INTERVAL,
    includeObjectsCollectedByMajorGC: true,
    includeObjectsCollectedByMinorGC: true,
  } as never);
  await work();
  const { profile } = (await session.post('HeapProfiler.stopSampling')) as unknown as { profile: SamplingProfile };
  return profile;
}
const totalBytes = (p: SamplingProfile) => {
  let sum = 0;
  const walk = (n: ProfileNode) => {
    sum += n.selfSize;
    for (const c of n.children) walk(c);
  };
  walk(p.head);
  return sum;
};
const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

if (process.argv[3] === 'sites') {
  const runs = 20;
  const profile = await sampled(async () => {
    for (let i = 0; i < runs; i++) await run();
  });
  const sites = new Map<string, number>();
  // A site: the function (a built-in such as an iterator's next named with the function that called it).
  const name = (n: ProfileNode) =>
    `${n.callFrame.functionName || '(anonymous)'} ${n.callFrame.url.replace(/^.*\/(src|dist|node_modules)\//, '$1/')}${n.callFrame.url.endsWith('.js') ? `:${n.callFrame.lineNumber + 1}` : ''}`;
  const walk = (n: ProfileNode, parent: string) => {
    const own = name(n);
    const key = n.callFrame.url === '' || n.callFrame.url.startsWith('node:') ? `${own} ← ${parent}` : own;
    sites.set(key, (sites.get(key) ?? 0) + n.selfSize);
    for (const c of n.children) walk(c, n.callFrame.url === '' ? parent : own);
  };
  walk(profile.head, '');
  const total = totalBytes(profile) / runs;
  console.log(`${root}: ${(total / 1e6).toFixed(1)} MB allocated a request (sampled, ${runs} runs); largest sites [MB a request]:`);
  for (const [site, b] of [...sites].sort((a, b) => b[1] - a[1]).slice(0, Number(process.env.BENCH_GARBAGE_SITES ?? 25))) {
    console.log(`  ${(b / runs / 1e6).toFixed(2).padStart(6)}  ${site}`);
  }
  process.exit(0);
}

// Per message: "cpu" runs a batch and answers the process's CPU time so far; "alloc" runs ALLOC_BATCH requests
// under the sampling heap profiler, started for them and stopped after (the profile is read after the stop, so
// its own objects are not counted; starting it deoptimises some code once, spread over the batch).
const ALLOC_BATCH = 20;
// Scavenges (minor GCs) so far and their pauses [ms, wall] (the parent takes differences): how often the
// requests' garbage fills the young generation (the bench's --max-semi-space-size=32 makes that rarer than the
// service's default).
const scavenges = { count: 0, ms: 0 };
new PerformanceObserver((list) => {
  for (const e of list.getEntries()) {
    if ((e as PerformanceEntry & { detail?: { kind?: number } }).detail?.kind === constants.NODE_PERFORMANCE_GC_MINOR) {
      scavenges.count++;
      scavenges.ms += e.duration;
    }
  }
}).observe({ entryTypes: ['gc'] });
process.on('message', (message) => {
  if (message === 'stop') process.exit(0);
  void (async () => {
    if (message === 'cpu') {
      for (let i = 0; i < batch; i++) await run();
      // The observer's entries come a little later (a batch's last ones may count with the next batch).
      await new Promise((r) => setTimeout(r, 5));
      process.send!({ cpuMs: cpuMs(), allocatedBytes: 0, scavenges: scavenges.count, scavengeMs: scavenges.ms });
      return;
    }
    const profile = await sampled(async () => {
      for (let i = 0; i < ALLOC_BATCH; i++) await run();
    });
    process.send!({
      cpuMs: cpuMs(),
      allocatedBytes: totalBytes(profile) / ALLOC_BATCH,
      scavenges: scavenges.count,
      scavengeMs: scavenges.ms,
    });
  })();
});
process.send!({ cpuMs: cpuMs(), allocatedBytes: 0, scavenges: scavenges.count, scavengeMs: scavenges.ms });
