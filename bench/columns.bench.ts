/**
 * What a caller pays for the columnar and Arrow forms (issue 14), through HTTP against the service in its own
 * process, beside the same work in-process:
 * - 10 000 slant delays per request: directions/s for rows JSON (objects in, objects out), columns JSON
 *   (columns in, `shape=columns` out) and Arrow (an Arrow table in, `Accept: Arrow` out); one client, requests
 *   back to back, every mapping model run in the service first (targets: Arrow ≥ 3 M/s, columns ≥ 1 M/s);
 * - one realistic day of GPS-like data (30 satellites, 7–11 in view, ≈ 26 000 observations: the issue's
 *   "30-satellite data") and one of four constellations (28–38 in view, ≈ 93 000 observations),
 *   test/helpers/realistic-sky.ts: the service's CPU time per request (its process, all threads, from /proc)
 *   for objects and for columns JSON, against the same request in-process (the estimation service
 *   runZwdEstimation, target ≤ 2× for the columnar JSON forms, printed for columns in and out and for columns
 *   in with the rows answer; and the estimator alone), and the station-days per CPU-second that makes
 *   (target ≥ 30 per replica); beside it the lighter answers (`shape=columns`, and Arrow in and out) and the
 *   edge each leaves (through HTTP − in-process service). `BENCH_PART=estimation npm run bench -- columns`
 *   runs this part only; BENCH_FROM_DIST=1 runs the service and the in-process side from dist/. /proc counts
 *   CPU in ticks of 10 ms, so the service's CPU is read per block of
 *   requests back to back (`blockSize` of DAYS: 0.5–0.7 s of CPU a block quiet, a tick is ≤ 2 % of it) and
 *   divided by the block's requests; the four request forms take turns block by block, 6 blocks each, so
 *   that a change of load falls on all of them.
 * Ranges over rounds or blocks (min–max), after warm-up. The service starts as `npm start` starts it, its
 * workers warmed before it is ready (TROPODELAY_WARM_UP_ESTIMATIONS, its default); `BENCH_WARM_UP=0` starts it
 * cold, as the figures before the warm-up were taken.
 */

import { existsSync, readFileSync } from 'node:fs';
import { tableFromArrays, tableToIPC, type Table } from 'apache-arrow';
import { DEFAULT_WARM_UP_ESTIMATIONS } from '../src/config.js';
import { DEG } from '../src/domain/constants.js';
import { MAPPING_MODEL_KEYS } from '../src/domain/mapping/registry.js';
import { startServerProcess, type ServerProcess } from '../test/helpers/server-process.js';
import { dayRequest } from '../test/helpers/gps-like-days.js';

/**
 * BENCH_FROM_DIST=1: the service as `npm start` runs it (node dist/server.js) and the in-process functions from
 * the same tsc output (dist/, built beforehand: `npx tsc -p tsconfig.build.json`), so that both sides of the ratio
 * run the code a replica runs; otherwise both from the TypeScript sources under tsx (as the tests run them).
 */
const FROM_DIST = process.env.BENCH_FROM_DIST === '1';
const root = FROM_DIST ? '../dist' : '../src';
type Modules = [
  typeof import('../src/estimation/estimate.js'),
  typeof import('../src/services/zwd-estimation.js'),
  typeof import('../src/http/adapters/zwd-estimation.js'),
  typeof import('../src/http/schemas/zwd-estimates.js'),
];
const [{ estimateZwd }, { runZwdEstimation, toEstimatorOptions }, { observationsFromColumns, toZwdRequest }, { zwdEstimatesRequest }] =
  (await Promise.all([
    import(`${root}/estimation/estimate.js`),
    import(`${root}/services/zwd-estimation.js`),
    import(`${root}/http/adapters/zwd-estimation.js`),
    import(`${root}/http/schemas/zwd-estimates.js`),
  ])) as Modules;

const ARROW = 'application/vnd.apache.arrow.stream';
const N = 10_000;
const site = { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 };
const base = { site, epoch: '2026-06-21T06:30:00Z', met: { pressure_hpa: 965.3, temperature_c: 18.2, relative_humidity_pct: 61 } };
const elevation = Array.from({ length: N }, (_, i) => 3 + (87 * i) / N);
const azimuth = Array.from({ length: N }, (_, i) => (i * 37) % 360);

/** CPU seconds of a process so far (user + system, all threads), from /proc/<pid>/stat (Linux, 100 ticks/s). */
function cpuSeconds(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  return (Number(fields[11]) + Number(fields[12])) / 100;
}

/** CPU seconds of a process's main thread (its event loop) so far, from /proc/<pid>/task/<pid>/stat. */
function eventLoopCpuSeconds(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/task/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  return (Number(fields[11]) + Number(fields[12])) / 100;
}

const range = (xs: number[], digits = 2) => `${Math.min(...xs).toFixed(digits)}–${Math.max(...xs).toFixed(digits)}`;

async function post(
  server: ServerProcess,
  path: string,
  body: string | Uint8Array<ArrayBuffer>,
  type: string,
  accept = 'application/json',
) {
  const res = await fetch(`${server.baseUrl}${path}`, { method: 'POST', body, headers: { 'content-type': type, accept } });
  const bytes = await res.arrayBuffer();
  if (!res.ok) throw new Error(`${path}: ${res.status} ${Buffer.from(bytes).toString('utf8').slice(0, 300)}`);
  return bytes;
}

/**
 * Directions per second of back-to-back requests over `seconds`, in rounds: per wall-clock second (`wall`,
 * client included, inflated on a loaded machine) and per CPU-second of the service process (`cpu`, all its
 * threads: what one core of a replica delivers).
 */
async function directionsPerSecond(pid: number, send: () => Promise<unknown>, rounds = 3, seconds = 2) {
  for (let w = 0; w < 10; w++) await send();
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let r = 0; r < rounds; r++) {
    let requests = 0;
    const t0 = performance.now();
    const cpu0 = cpuSeconds(pid);
    while (performance.now() - t0 < seconds * 1000) {
      await send();
      requests++;
    }
    wall.push((requests * N) / ((performance.now() - t0) / 1000));
    cpu.push((requests * N) / (cpuSeconds(pid) - cpu0));
  }
  return { wall, cpu };
}

async function slantLines(server: ServerProcess): Promise<string[]> {
  // Every mapping model once, so that the service's batch loops have met them all before timing.
  for (const model of MAPPING_MODEL_KEYS) {
    const coefficients = model === 'vmf1' ? { coefficients: { ah: 0.00121, aw: 0.00055, height_reference: 'site' } } : {};
    await post(
      server,
      '/v1/slant-delays',
      JSON.stringify({ ...base, model, ...coefficients, directions: { elevation_deg: elevation, azimuth_deg: azimuth } }),
      'application/json',
    );
  }
  const rows = JSON.stringify({ ...base, directions: elevation.map((e, i) => ({ elevation_deg: e, azimuth_deg: azimuth[i] })) });
  const columns = JSON.stringify({ ...base, directions: { elevation_deg: elevation, azimuth_deg: azimuth } });
  const table = tableFromArrays({ elevation_deg: Float64Array.from(elevation), azimuth_deg: Float64Array.from(azimuth) }) as Table;
  table.schema.metadata.set('request', JSON.stringify(base));
  const arrow = tableToIPC(table, 'stream') as Uint8Array<ArrayBuffer>;
  const m = ({ wall, cpu }: { wall: number[]; cpu: number[] }) =>
    `${range(cpu.map((x) => x / 1e6))} per service CPU-second (${range(wall.map((x) => x / 1e6))} per wall-clock second)`;
  const pid = server.child.pid!;
  const r = await directionsPerSecond(pid, () => post(server, '/v1/slant-delays', rows, 'application/json'));
  const c = await directionsPerSecond(pid, () => post(server, '/v1/slant-delays?shape=columns', columns, 'application/json'));
  const a = await directionsPerSecond(pid, () => post(server, '/v1/slant-delays', arrow, ARROW, ARROW));
  return [
    `slant delays through HTTP, 10 000 directions a request, one client, after every mapping model (million directions/s):`,
    `  rows JSON ${m(r)}`,
    `  columns JSON ${m(c)} (target ≥ 1)`,
    `  Arrow in and out ${m(a)} (target ≥ 3)`,
  ];
}

/**
 * Days of the estimation benchmark (test/helpers/realistic-sky.ts, 30 s sampling, 5° generated, 7° cutoff):
 * - "GPS-like": one constellation of 30 satellites (6 planes × 5; 7–11 in view), ≈ 26 000 observations,
 *   25 gross errors: the "30-satellite data" (its own measurement was a day of 23 k observations);
 * - "four constellations": GPS, GLONASS, Galileo, BeiDou MEO (28–38 in view), ≈ 93 000 observations,
 *   100 gross errors.
 * `blockSize`: requests per block through HTTP (≈ 0.5–0.7 s of service CPU a block on the quiet machine).
 */
const DAYS = {
  'GPS-like (30 satellites, 7–11 in view)': { constellations: ['gps'] as const, grossErrors: 25, blockSize: 10 },
  'four constellations (28–38 in view)': {
    constellations: ['gps', 'glonass', 'galileo', 'beidou'] as const,
    grossErrors: 100,
    blockSize: 4,
  },
};

/** One realistic day as the API's columns and objects. */
function realisticDayBodies(day: (typeof DAYS)[keyof typeof DAYS]) {
  const { rest: request, columns, count } = dayRequest({ grossErrors: day.grossErrors, constellations: [...day.constellations] });
  const objects = columns.epoch.map((e, i) => ({
    epoch: e,
    satellite: columns.satellite[i],
    elevation_deg: columns.elevation_deg[i],
    azimuth_deg: columns.azimuth_deg[i],
    residual_m: columns.residual_m[i],
  }));
  return { request, columns, objects, count };
}

/** Blocks of requests per form through HTTP (the median and range are over these). */
const BLOCKS = 6;

/** The 1-, 5- and 15-minute load averages (/proc/loadavg), to print beside the figures. */
const loadAverage = () => readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ');

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

/** CPU seconds of each function in this process (user + system), interleaved round by round after one warm-up round. */
function inProcessCpu(runs: Array<() => unknown>, rounds: number): number[][] {
  const per = runs.map(() => [] as number[]);
  for (let r = 0; r <= rounds; r++) {
    runs.forEach((run, i) => {
      const before = process.cpuUsage();
      run();
      const used = process.cpuUsage(before);
      if (r > 0) per[i]!.push((used.user + used.system) / 1e6);
    });
  }
  return per;
}

/**
 * Per day: the service's CPU per request through HTTP (its whole process, event loop and worker threads), for
 * columns and objects JSON, against the same request in-process: the estimation service (runZwdEstimation,
 * validation and adapters outside the timing) and the estimator alone (estimateZwd, no service around it).
 */
async function estimationDayLines(server: ServerProcess, name: string, day: (typeof DAYS)[keyof typeof DAYS]): Promise<string[]> {
  const bodies = realisticDayBodies(day);
  const columnsBody = JSON.stringify({ ...bodies.request, observations: bodies.columns });
  const objectsBody = JSON.stringify({ ...bodies.request, observations: bodies.objects });
  const pid = server.child.pid!;
  const table = tableFromArrays({
    epoch: bodies.columns.epoch,
    satellite: bodies.columns.satellite,
    elevation_deg: Float64Array.from(bodies.columns.elevation_deg),
    azimuth_deg: Float64Array.from(bodies.columns.azimuth_deg),
    residual_m: Float64Array.from(bodies.columns.residual_m),
  }) as Table;
  table.schema.metadata.set('request', JSON.stringify(bodies.request));
  const arrowBody = tableToIPC(table, 'stream') as Uint8Array<ArrayBuffer>;
  // The service's CPU per request, from /proc in ticks of 10 ms: read over a block of requests back to back
  // (CPU of the block / its requests), so that a figure resolves a tenth of a tick per request at 10 a block.
  type Form = { key: string; body: string | Uint8Array<ArrayBuffer>; path: string; type: string };
  const form = (key: string, body: Form['body'], path = '/v1/zwd-estimates', type = 'application/json'): Form => ({
    key,
    body,
    path,
    type,
  });
  const forms = {
    columns: form('columns', columnsBody),
    objects: form('objects', objectsBody),
    columnsOut: form('shape=columns', columnsBody, '/v1/zwd-estimates?shape=columns'),
    arrow: form('Arrow', arrowBody, '/v1/zwd-estimates', ARROW),
  };
  /** CPU seconds per request of one block of `size` requests: the whole process, and its event-loop thread. */
  const block = async (f: Form, size: number) => {
    const before = cpuSeconds(pid);
    const loopBefore = eventLoopCpuSeconds(pid);
    for (let i = 0; i < size; i++) await post(server, f.path, f.body, f.type, f.type);
    return { process: (cpuSeconds(pid) - before) / size, loop: (eventLoopCpuSeconds(pid) - loopBefore) / size };
  };
  const parsed = zwdEstimatesRequest.parse({ ...bodies.request, observations: bodies.objects });
  const domainSite = { latitudeDeg: parsed.site.latitude_deg, longitudeDeg: parsed.site.longitude_deg, heightM: parsed.site.height_m };
  const request = toZwdRequest(domainSite, parsed, observationsFromColumns(bodies.columns));
  const estimatorInput = {
    latitudeRad: domainSite.latitudeDeg * DEG,
    heightM: domainSite.heightM,
    observations: request.observations,
    options: toEstimatorOptions(request.options),
  };
  const [service, estimator] = inProcessCpu([() => runZwdEstimation(request), () => estimateZwd(estimatorInput)], 15) as [
    number[],
    number[],
  ];
  const solutions = estimateZwd(estimatorInput).statistics.solutions;
  // Warm-up (left out): every form.
  await block(forms.columns, 3);
  for (const f of [forms.objects, forms.columnsOut, forms.arrow]) await block(f, 1);
  const blockSize = day.blockSize;
  // The forms by turns, block after block, so that all of them see the same load.
  const perForm = new Map<Form, { process: number[]; loop: number[] }>(Object.values(forms).map((f) => [f, { process: [], loop: [] }]));
  const loadBefore = loadAverage();
  for (let b = 0; b < BLOCKS; b++) {
    for (const f of Object.values(forms)) {
      const { process: p, loop } = await block(f, blockSize);
      perForm.get(f)!.process.push(p);
      perForm.get(f)!.loop.push(loop);
    }
  }
  const loadAfter = loadAverage();
  const columns = perForm.get(forms.columns)!.process;
  const objects = perForm.get(forms.objects)!.process;
  const columnsOut = perForm.get(forms.columnsOut)!.process;
  const arrow = perForm.get(forms.arrow)!.process;
  const ms = (xs: number[]) =>
    `${(median(xs) * 1000).toFixed(1)} ms (${range(
      xs.map((x) => x * 1000),
      1,
    )})`;
  const loopMs = (f: Form) => ms(perForm.get(f)!.loop);
  return [
    `one realistic day, ${name}: ${bodies.count} observations, default options (${solutions} solutions); CPU per day, median (range):`,
    `  ${FROM_DIST ? 'service and in-process code from dist/ (as npm start runs it)' : 'service and in-process code under tsx (BENCH_FROM_DIST=1: from dist/)'}; through HTTP: service CPU from /proc per block of ${blockSize} requests back to back ÷ ${blockSize}, ${BLOCKS} blocks per form, the four forms by turns; load average ${loadBefore} → ${loadAfter}`,
    `  through HTTP, service process: columns JSON (${(columnsBody.length / 1e6).toFixed(1)} MB) ${ms(columns)}, objects JSON (${(objectsBody.length / 1e6).toFixed(1)} MB) ${ms(objects)}`,
    `  through HTTP, lighter answers: columns JSON in, shape=columns out ${ms(columnsOut)}; Arrow in and out (${(arrowBody.length / 1e6).toFixed(1)} MB) ${ms(arrow)}`,
    `  in-process: estimation service (runZwdEstimation) ${ms(service)}, estimator alone (estimateZwd) ${ms(estimator)}`,
    `  through HTTP / in-process service: columns JSON in and out (shape=columns) ${(median(columnsOut) / median(service)).toFixed(2)}, columns JSON in with the rows answer ${(median(columns) / median(service)).toFixed(2)}, Arrow in and out ${(median(arrow) / median(service)).toFixed(2)} (target ≤ 2 for the columnar JSON forms); ${(1 / median(columns)).toFixed(1)} station-days per CPU-second through HTTP with columns JSON in (rows answer), ${(1 / median(columnsOut)).toFixed(1)} with shape=columns, ${(1 / median(objects)).toFixed(1)} with objects (target ≥ 30)`,
    `  of it on the event-loop thread (median (range) over the blocks): columns JSON ${loopMs(forms.columns)}, objects JSON ${loopMs(forms.objects)}, shape=columns ${loopMs(forms.columnsOut)}, Arrow ${loopMs(forms.arrow)}`,
    `  the edge (columns through HTTP − in-process service, medians): rows answer ${((median(columns) - median(service)) * 1000).toFixed(1)} ms, shape=columns answer ${((median(columnsOut) - median(service)) * 1000).toFixed(1)} ms, Arrow ${((median(arrow) - median(service)) * 1000).toFixed(1)} ms (target ≤ 16)`,
  ];
}

async function estimationLines(server: ServerProcess): Promise<string[]> {
  const lines: string[] = [];
  for (const [name, day] of Object.entries(DAYS)) lines.push(...(await estimationDayLines(server, name, day)));
  return lines;
}

export default async function bench(): Promise<string[]> {
  if (FROM_DIST && !existsSync('dist/server.js')) throw new Error('BENCH_FROM_DIST=1: build dist/ first (npx tsc -p tsconfig.build.json)');
  // The test servers' helper starts cold unless told otherwise: here the service's own default, or BENCH_WARM_UP.
  const warmUp = process.env.BENCH_WARM_UP ?? String(DEFAULT_WARM_UP_ESTIMATIONS);
  const server = await startServerProcess({ TROPODELAY_WARM_UP_ESTIMATIONS: warmUp }, true, FROM_DIST);
  try {
    // BENCH_PART=slant or estimation runs one part only.
    const part = process.env.BENCH_PART;
    return [...(part === 'estimation' ? [] : await slantLines(server)), ...(part === 'slant' ? [] : await estimationLines(server))];
  } finally {
    await server.stop();
  }
}
