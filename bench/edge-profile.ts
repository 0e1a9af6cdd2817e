/**
 * A CPU profile of the service (tsc output) under one workload of bench/edge-ab.bench.ts, for the edge's
 * account: `tsx bench/edge-profile.ts <gps|arrow|columns> <requests> <profile dir> [extra node flags…]`.
 * The service's log lines go nowhere; its profiles (one per thread) land in the directory at exit.
 */

import { gpsDay, send, slantArrow, slantColumns, startService, stopService, warmSlant } from './edge-ab.bench.js';

const [part = 'arrow', count = '200', dir = '/tmp/edge-profile', ...flags] = process.argv.slice(2);
const workload = { gps: gpsDay, arrow: slantArrow, columns: slantColumns }[part as 'gps' | 'arrow' | 'columns']();
const spawned = Date.now();
const service = await startService('profiled', process.env.BENCH_EDGE_NEW ?? 'dist', [
  '--cpu-prof',
  '--cpu-prof-interval=200',
  `--cpu-prof-dir=${dir}`,
  ...flags,
]);
await warmSlant(service);
for (let i = 0; i < 20; i++) await send(service, workload);
const started = Date.now();
for (let i = 0; i < Number(count); i++) await send(service, workload);
process.stdout.write(
  `skip the first ${started - spawned} ms of the profiles (start and warm-up); measured ${Date.now() - started} ms wall\n`,
);
await stopService(service);
