/**
 * The one-pass reader of columnar JSON bodies (src/formats/json-columns-reader.ts, issue 14) against the path
 * before it, CPU time by turns so that the load of other processes hits both alike; medians and ranges over
 * rounds, the load average beside them, on the GPS-like and the four-constellation day (bench/json-read-day.ts):
 * - the parse step alone: the body's bytes → checked domain columns, typed, as the estimation task takes
 *   them (readJsonColumnsBody, typedObservationsFromJsonColumns), against the reader of BENCH_JSONREAD_REFERENCE
 *   (below) or, without it, against the path before the reader (the bytes as text, JSON.parse, the column
 *   checks and conversion: checkedObservationColumns). The rest of the body (site, apriori) goes through its
 *   schema either way and is left out of both;
 * - the whole task (handleZwdRequest, rows answer, default options): this build, against BENCH_JSONREAD_REFERENCE (the root of an
 *   older source tree: `git archive <commit> src | tar -x -C /tmp/before`, with node_modules and package.json
 *   linked) or, without it, against this build given the body as text (then the general path: JSON.parse and
 *   the full checks).
 * Each kind of work runs in a child process of its own (bench/json-read.child.ts), the two asked in turn; a
 * run's CPU is its process's (all threads) from one run to the next, so that its garbage collection counts
 * where it happens (in one process, one path's garbage is collected during the other's turn).
 * `npm run bench -- json-read`; BENCH_ROUNDS (default 30) rounds; BENCH_PART=parse or task: that part only;
 * BENCH_FROM_DIST=1: each tree's dist/ (the tsc output; build both first) instead of its src/ under tsx.
 */

import { fork, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { DAYS } from './json-read-day.js';

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const figure = (xs: number[]) => `${median(xs).toFixed(1)} ms (${Math.min(...xs).toFixed(1)}–${Math.max(...xs).toFixed(1)})`;
const FROM_DIST = process.env.BENCH_FROM_DIST === '1';
const load = () => readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ');

/** A child process doing `work` on `day` (bench/json-read.child.ts); `next()` runs it once and answers its CPU [ms]. */
async function workProcess(work: string, day: string) {
  const child: ChildProcess = fork(new URL('./json-read.child.ts', import.meta.url), [work, day], {
    execArgv: ['--max-semi-space-size=32', '--import', 'tsx'],
  });
  let resolve: (cpu: number) => void = () => undefined;
  child.on('message', (m) => resolve((m as { cpuMs: number }).cpuMs));
  const answer = () => new Promise<number>((r) => (resolve = r));
  let last = await answer();
  return {
    async next(): Promise<number> {
      child.send('run');
      const now = await answer();
      const used = now - last;
      last = now;
      return used;
    },
    stop: () => child.send('stop'),
  };
}

/** CPU [ms] per run of two kinds of work, each in its own process, asked by turns: `rounds` rounds after 5 of warm-up. */
async function byTurns(works: [string, string], day: string, rounds: number): Promise<[number[], number[]]> {
  const a = await workProcess(works[0], day);
  const b = await workProcess(works[1], day);
  const ta: number[] = [];
  const tb: number[] = [];
  for (let r = -5; r < rounds; r++) {
    const x = await a.next();
    const y = await b.next();
    if (r >= 0) {
      ta.push(x);
      tb.push(y);
    }
  }
  a.stop();
  b.stop();
  return [ta, tb];
}

export default async function jsonReadBench(): Promise<string[]> {
  const rounds = Number(process.env.BENCH_ROUNDS ?? 30);
  const reference = process.env.BENCH_JSONREAD_REFERENCE;
  const lines: string[] = [];
  const part = process.env.BENCH_PART; // "parse" or "task": that part only
  for (const day of Object.keys(DAYS) as (keyof typeof DAYS)[]) {
    lines.push(
      `${DAYS[day].name}, ${rounds} rounds by turns, CPU time of each process (all threads) per run${FROM_DIST ? ', from dist/' : ''}:`,
    );
    if (part !== 'task') {
      const load0 = load();
      const [oldParse, newParse] = await byTurns([reference ? `parse-read:${reference}` : 'parse-text', 'parse-read'], day, rounds);
      lines.push(
        `  parse step (bytes → checked typed domain columns; load ${load0} → ${load()}): ${reference ? 'reference reader' : 'text + JSON.parse + checks'} ${figure(oldParse)}, one-pass reader ${figure(newParse)}`,
      );
    }
    if (part !== 'parse') {
      const load1 = load();
      const [oldTask, newTask] = await byTurns([reference ? `task:${reference}` : 'task-text', 'task'], day, rounds);
      lines.push(
        `  handleZwdRequest (rows answer; load ${load1} → ${load()}): ${reference ? 'reference tree' : 'general path (body as text)'} ${figure(oldTask)}, reader ${figure(newTask)}`,
      );
    }
  }
  return lines;
}
