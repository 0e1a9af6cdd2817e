/**
 * The slant figures' swing (issue 14): the phases of `BENCH_PART=slant npm run bench -- columns` (every model
 * once, rows JSON, columns JSON, Arrow) against one service, with per round of `seconds` its CPU (process and
 * event loop) per request and the event loop's garbage collections (a preload script passed as node flags that
 * writes its counts on SIGUSR2 to GCWATCH_FILE).
 * `tsx bench/edge-swing.ts <rounds> <seconds> [node flags…]`
 */

import { readFileSync } from 'node:fs';
import { gpsDay, send, slantArrow, slantColumns, startService, stopService, warmSlant } from './edge-ab.bench.js';

const [rounds = '3', seconds = '2', ...flags] = process.argv.slice(2);
const N = 10_000;
const site = { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 };
const base = { site, epoch: '2026-06-21T06:30:00Z', met: { pressure_hpa: 965.3, temperature_c: 18.2, relative_humidity_pct: 61 } };
const rows = {
  name: 'rows JSON',
  path: '/v1/slant-delays',
  body: JSON.stringify({
    ...base,
    directions: Array.from({ length: N }, (_, i) => ({ elevation_deg: 3 + (87 * i) / N, azimuth_deg: (i * 37) % 360 })),
  }),
  type: 'application/json',
  accept: 'application/json',
  block: 1,
};
const gcWatch = new URL('./gc-watch.mjs', import.meta.url).pathname;
const service = await startService('swing', process.env.BENCH_EDGE_NEW ?? 'dist', ['--import', gcWatch, ...flags]);
const pid = service.child.pid!;
const file = process.env.GCWATCH_FILE ?? '/tmp/gcwatch.json';
const ticks = (path: string) => {
  const f = readFileSync(path, 'utf8').split(') ')[1]!.split(' ');
  return Number(f[11]) + Number(f[12]);
};
type Gc = { stats: Record<string, { count: number; ms: number }>; heapUsed: number; external: number };
async function gc(): Promise<Gc> {
  process.kill(pid, 'SIGUSR2');
  await new Promise((r) => setTimeout(r, 50));
  return JSON.parse(readFileSync(file, 'utf8')) as Gc;
}
await warmSlant(service);
const order = (process.env.BENCH_EDGE_ORDER ?? 'rows,columns,arrow').split(',');
const workloads = { rows, columns: slantColumns(), arrow: slantArrow(), gps: gpsDay() };
for (const name of order) {
  const w = workloads[name as keyof typeof workloads];
  for (let i = 0; i < 10; i++) await send(service, w);
  for (let r = 0; r < Number(rounds); r++) {
    const g0 = await gc();
    const p0 = ticks(`/proc/${pid}/stat`);
    const l0 = ticks(`/proc/${pid}/task/${pid}/stat`);
    const t0 = performance.now();
    let n = 0;
    while (performance.now() - t0 < Number(seconds) * 1000) {
      await send(service, w);
      n++;
    }
    const p1 = ticks(`/proc/${pid}/stat`);
    const l1 = ticks(`/proc/${pid}/task/${pid}/stat`);
    const g1 = await gc();
    const d = (k: string) =>
      `${(g1.stats[k]?.count ?? 0) - (g0.stats[k]?.count ?? 0)}×${((g1.stats[k]?.ms ?? 0) - (g0.stats[k]?.ms ?? 0)).toFixed(0)}ms`;
    process.stdout.write(
      `${name.padEnd(8)} ${n} req: process ${(((p1 - p0) * 10) / n).toFixed(2)} ms, loop ${(((l1 - l0) * 10) / n).toFixed(2)} ms, ${(N / (((p1 - p0) * 10) / n) / 1000).toFixed(2)} M/s; gc minor ${d('minor')} major ${d('major')} incr ${d('incremental')}; heap ${(g1.heapUsed / 1e6).toFixed(0)} MB ext ${(g1.external / 1e6).toFixed(0)} MB\n`,
    );
  }
}
await stopService(service);
