/**
 * Garbage of a warm POST /v1/zwd-estimates request (issue 14): handleZwdRequest (rows answer, default options)
 * on the GPS-like day's columns JSON as bytes (bench/json-read-day.ts), this tree against an older one
 * (BENCH_GARBAGE_REFERENCE: the root of a source tree, `git archive <commit> src | tar -x -C /tmp/before`
 * with node_modules and package.json linked), each in a child process of its own (bench/garbage.child.ts),
 * asked by turns so that the load of other processes hits both alike. Per request: the CPU time of the whole
 * child process (all threads: garbage collection on V8's helper threads counts) and the bytes allocated on the
 * heap (the sampling heap profiler with the collected objects kept: an estimate of all bytes allocated).
 * Medians and ranges over BENCH_ROUNDS (default 20) rounds of BENCH_GARBAGE_BATCH (default 5) requests,
 * the load average beside them: first the CPU rounds (no profiler; with the scavenges a request and their pauses),
 * then the allocation rounds. The largest allocation sites of one tree:
 * `node --max-semi-space-size=32 --import tsx bench/garbage.child.ts <root> sites` (a dist/ build of
 * `npx tsc -p tsconfig.build.json` gives line numbers).
 * `BENCH_GARBAGE_REFERENCE=/tmp/before npm run bench -- garbage`.
 */

import { fork } from 'node:child_process';
import { readFileSync } from 'node:fs';

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const figure = (xs: number[], digits: number, unit: string) =>
  `${median(xs).toFixed(digits)} ${unit} (${Math.min(...xs).toFixed(digits)}–${Math.max(...xs).toFixed(digits)})`;
const load = () => readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ');

interface Answer {
  cpuMs: number;
  allocatedBytes: number;
  /** Scavenges (minor GCs) and their pauses [ms, wall]: counts so far from the child, a request from next(). */
  scavenges?: number;
  scavengeMs?: number;
}

/** A child handling requests with the tree at `root`; `next()` runs one batch and gives CPU [ms] and bytes a request. */
async function treeProcess(root: string, batch: number) {
  const child = fork(new URL('./garbage.child.ts', import.meta.url), [root], {
    execArgv: ['--max-semi-space-size=32', '--import', 'tsx'],
    env: { ...process.env, BENCH_GARBAGE_BATCH: String(batch) },
  });
  let resolve: (a: Answer) => void = () => undefined;
  child.on('message', (m) => resolve(m as Answer));
  const answer = () => new Promise<Answer>((r) => (resolve = r));
  let last = await answer();
  return {
    async next(kind: 'cpu' | 'alloc'): Promise<Answer> {
      child.send(kind);
      const a = await answer();
      const since = (key: 'cpuMs' | 'scavenges' | 'scavengeMs') => ((a[key] ?? 0) - (last[key] ?? 0)) / batch;
      const answered = {
        cpuMs: since('cpuMs'),
        allocatedBytes: a.allocatedBytes,
        scavenges: since('scavenges'),
        scavengeMs: since('scavengeMs'),
      };
      last = a;
      return answered;
    },
    stop: () => child.send('stop'),
  };
}

export default async function garbageBench(): Promise<string[]> {
  const rounds = Number(process.env.BENCH_ROUNDS ?? 20);
  const batch = Number(process.env.BENCH_GARBAGE_BATCH ?? 5);
  const reference = process.env.BENCH_GARBAGE_REFERENCE;
  if (!reference) return ['BENCH_GARBAGE_REFERENCE (the root of an older source tree) is not set: nothing to compare with'];
  const load0 = load();
  const before = await treeProcess(reference, batch);
  const now = await treeProcess('.', batch);
  const old: Answer[] = [];
  const cur: Answer[] = [];
  const oldAlloc: Answer[] = [];
  const curAlloc: Answer[] = [];
  for (let r = -2; r < rounds; r++) {
    const a = await before.next('cpu');
    const b = await now.next('cpu');
    if (r >= 0) {
      old.push(a);
      cur.push(b);
    }
  }
  const load1 = load();
  for (let r = 0; r < Math.ceil(rounds / 2); r++) {
    oldAlloc.push(await before.next('alloc'));
    curAlloc.push(await now.next('alloc'));
  }
  before.stop();
  now.stop();
  const cpu = (xs: Answer[]) =>
    figure(
      xs.map((x) => x.cpuMs),
      1,
      'ms',
    );
  const mb = (xs: Answer[]) =>
    figure(
      xs.map((x) => x.allocatedBytes / 1e6),
      1,
      'MB',
    );
  const gc = (xs: Answer[], key: 'scavenges' | 'scavengeMs', unit: string) =>
    figure(
      xs.map((x) => x[key] ?? 0),
      2,
      unit,
    );
  const ratios = old.map((o, k) => cur[k]!.cpuMs / o.cpuMs);
  return [
    `GPS-like day, handleZwdRequest (rows answer), ${rounds} rounds of ${batch} requests by turns:`,
    `  CPU a request (process, all threads; load ${load0} → ${load1}): before ${cpu(old)}, now ${cpu(cur)}; now/before per round ${figure(ratios, 2, '')}`,
    `  scavenges a request (CPU rounds, --max-semi-space-size=32): before ${gc(old, 'scavenges', '')}, now ${gc(cur, 'scavenges', '')}; their pauses a request: before ${gc(old, 'scavengeMs', 'ms')}, now ${gc(cur, 'scavengeMs', 'ms')}`,
    `  heap allocated a request (sampled, ${Math.ceil(rounds / 2)} rounds of 20 requests; load ${load1} → ${load()}): before ${mb(oldAlloc)}, now ${mb(curAlloc)}`,
  ];
}
