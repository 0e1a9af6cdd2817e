/**
 * perf(1) samples of the service (tsc output, `--perf-basic-prof` so that JavaScript frames have names) under
 * one workload of bench/edge-ab.bench.ts: on-CPU time per thread (`cpu-clock`, the default) or page faults
 * (`page-faults`), with call graphs. A CPU profile (bench/edge-profile.ts) samples wall time, so on a loaded
 * machine it shows waits as work (piscina's postTask, 1.5 ms a request there, is not on the CPU); perf shows
 * what each thread ran. Needs perf and the right to attach to a process (root, or perf_event_paranoid ≤ 1).
 *
 *   [PERF_EVENT=page-faults] npx tsx bench/edge-perf.ts [gps|arrow|columns] [requests] [perf.data path]
 *   perf report -i <perf.data> --no-children --sort pid,sym --stdio -g none      (then --tid <thread> -g caller)
 */

import { spawn } from 'node:child_process';
import { gpsDay, send, slantArrow, slantColumns, startService, stopService, warmSlant } from './edge-ab.bench.js';

const [part = 'gps', count = '60', output = '/tmp/edge-perf.data'] = process.argv.slice(2);
const workload = { gps: gpsDay, arrow: slantArrow, columns: slantColumns }[part as 'gps' | 'arrow' | 'columns']();
const service = await startService('perf', process.env.BENCH_EDGE_NEW ?? 'dist', ['--perf-basic-prof']);
await warmSlant(service);
for (let i = 0; i < 30; i++) await send(service, workload);
const event = process.env.PERF_EVENT ?? 'cpu-clock';
const perf = spawn('perf', ['record', '-e', event, '-g', '-o', output, '-p', String(service.child.pid)], { stdio: 'inherit' });
await new Promise((r) => setTimeout(r, 1000)); // perf attached
for (let i = 0; i < Number(count); i++) await send(service, workload);
perf.kill('SIGINT');
await new Promise((r) => perf.once('exit', r));
process.stdout.write(`${count} requests of ${workload.name}; ${event} samples in ${output}\n`);
await stopService(service);
