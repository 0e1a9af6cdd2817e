/**
 * Which threads of the service spend the CPU of a workload of bench/edge-ab.bench.ts: every thread's ticks
 * (/proc/<pid>/task/<tid>/stat, by its name) over `requests` requests after warm-up.
 * `[BENCH_EDGE_BEFORE=gps:20] tsx bench/edge-threads.ts <gps|arrow|columns> <requests> [extra node flags…]`
 */

import { readdirSync, readFileSync } from 'node:fs';
import { gpsDay, send, slantArrow, slantColumns, startService, stopService, warmSlant } from './edge-ab.bench.js';

const [part = 'arrow', count = '400', ...flags] = process.argv.slice(2);
const workload = { gps: gpsDay, arrow: slantArrow, columns: slantColumns }[part as 'gps' | 'arrow' | 'columns']();
const service = await startService('threads', process.env.BENCH_EDGE_NEW ?? 'dist', flags);
const pid = service.child.pid!;

function threadTicks(): Map<string, number> {
  const out = new Map<string, number>();
  for (const tid of readdirSync(`/proc/${pid}/task`)) {
    const text = readFileSync(`/proc/${pid}/task/${tid}/stat`, 'utf8');
    const name = text.slice(text.indexOf('(') + 1, text.lastIndexOf(')'));
    const fields = text.slice(text.lastIndexOf(')') + 2).split(' ');
    const key = `${tid === String(pid) ? 'event loop' : `${name} ${tid}`}`;
    out.set(key, (out.get(key) ?? 0) + Number(fields[11]) + Number(fields[12]));
  }
  return out;
}

await warmSlant(service);
// BENCH_EDGE_BEFORE=gps:20 runs another workload first (the order of bench/edge-ab.bench.ts).
const [beforePart, beforeCount] = (process.env.BENCH_EDGE_BEFORE ?? ':0').split(':');
if (beforePart) {
  const first = { gps: gpsDay, arrow: slantArrow, columns: slantColumns }[beforePart as 'gps' | 'arrow' | 'columns']();
  for (let i = 0; i < Number(beforeCount); i++) await send(service, first);
}
for (let i = 0; i < 20; i++) await send(service, workload);
const before = threadTicks();
const n = Number(count);
for (let i = 0; i < n; i++) await send(service, workload);
const after = threadTicks();
let total = 0;
for (const [name, t] of after) {
  const d = t - (before.get(name) ?? 0);
  total += d;
  if (d > 0) process.stdout.write(`${name.padEnd(20)} ${((d * 10) / n).toFixed(3)} ms a request\n`);
}
process.stdout.write(
  `${'all threads'.padEnd(20)} ${((total * 10) / n).toFixed(3)} ms a request; load ${readFileSync('/proc/loadavg', 'utf8').split(' ')[0]}\n`,
);
await stopService(service);
