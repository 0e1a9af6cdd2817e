/**
 * Which threads of the service spend the CPU of a workload of bench/edge-ab.bench.ts: every thread's ticks
 * and minor page faults (/proc/<pid>/task/<tid>/stat, by its name) over `requests` requests after warm-up.
 * `[BENCH_EDGE_BEFORE=gps:20] tsx bench/edge-threads.ts <gps|arrow|columns> <requests> [extra node flags…]`
 */

import { readdirSync, readFileSync } from 'node:fs';
import { gpsDay, send, slantArrow, slantColumns, startService, stopService, warmSlant } from './edge-ab.bench.js';

const [part = 'arrow', count = '400', ...flags] = process.argv.slice(2);
const workload = { gps: gpsDay, arrow: slantArrow, columns: slantColumns }[part as 'gps' | 'arrow' | 'columns']();
const service = await startService('threads', process.env.BENCH_EDGE_NEW ?? 'dist', flags);
const pid = service.child.pid!;

interface ThreadUse {
  user: number;
  system: number;
  minorFaults: number;
}

/** Per thread (by name; the event loop by its id): CPU ticks in user and kernel mode, minor page faults. */
function threadTicks(): Map<string, ThreadUse> {
  const out = new Map<string, ThreadUse>();
  for (const tid of readdirSync(`/proc/${pid}/task`)) {
    const text = readFileSync(`/proc/${pid}/task/${tid}/stat`, 'utf8');
    const name = text.slice(text.indexOf('(') + 1, text.lastIndexOf(')'));
    const fields = text.slice(text.lastIndexOf(')') + 2).split(' ');
    const key = `${tid === String(pid) ? 'event loop' : `${name} ${tid}`}`;
    const use = out.get(key) ?? { user: 0, system: 0, minorFaults: 0 };
    use.user += Number(fields[11]);
    use.system += Number(fields[12]);
    use.minorFaults += Number(fields[7]);
    out.set(key, use);
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
const perRequest = (ticks: number) => ((ticks * 10) / n).toFixed(3);
for (const [name, t] of after) {
  const b = before.get(name) ?? { user: 0, system: 0, minorFaults: 0 };
  const [user, system] = [t.user - b.user, t.system - b.system];
  total += user + system;
  if (user + system > 0)
    process.stdout.write(
      `${name.padEnd(20)} ${perRequest(user + system)} ms a request (user ${perRequest(user)}, system ${perRequest(system)}; ` +
        `${((t.minorFaults - b.minorFaults) / n).toFixed(0)} page faults)\n`,
    );
}
process.stdout.write(
  `${'all threads'.padEnd(20)} ${((total * 10) / n).toFixed(3)} ms a request; load ${readFileSync('/proc/loadavg', 'utf8').split(' ')[0]}\n`,
);
await stopService(service);
