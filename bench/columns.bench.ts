/**
 * What a caller pays for the columnar and Arrow forms (issue 14), through HTTP against the service in its own
 * process, beside the same work in-process:
 * - 10 000 slant delays per request: directions/s for rows JSON (objects in, objects out), columns JSON
 *   (columns in, `shape=columns` out) and Arrow (an Arrow table in, `Accept: Arrow` out); one client, requests
 *   back to back, every mapping model run in the service first (targets: Arrow ≥ 3 M/s, columns ≥ 1 M/s);
 * - one realistic day of four-constellation data (≈ 30 satellites in view, test/helpers/realistic-sky.ts):
 *   the service's CPU time per request (its process, all threads, from /proc) for objects and for columns JSON,
 *   against the in-process estimation service (runZwdEstimation) on the same request (target ≤ 2×), and the
 *   station-days per CPU-second that makes (target ≥ 30 per replica).
 * Ranges over rounds (min–max), after warm-up.
 */

import { readFileSync } from 'node:fs';
import { tableFromArrays, tableToIPC, type Table } from 'apache-arrow';
import { DEG } from '../src/domain/constants.js';
import { MAPPING_MODEL_KEYS } from '../src/domain/mapping/registry.js';
import { runZwdEstimation } from '../src/services/zwd-estimation.js';
import { startServerProcess, type ServerProcess } from '../test/helpers/server-process.js';
import { simulateSky } from '../test/helpers/realistic-sky.js';
import { skyInput } from '../test/helpers/synthetic-input.js';
import { observationsFromColumns, toZwdRequest } from '../src/http/adapters/zwd-estimation.js';
import { zwdEstimatesRequest } from '../src/http/schemas/zwd-estimates.js';

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

/** One realistic day as the API's columns and objects. */
function realisticDayBodies() {
  const input = skyInput(simulateSky({ seed: 11, durationS: 86_400, grossErrors: 100 }));
  const o = input.observations;
  const iso = new Map<number, string>();
  const epoch = o.epochMs.map((ms) => iso.get(ms) ?? (iso.set(ms, new Date(ms).toISOString()), iso.get(ms)!));
  const columns = {
    epoch,
    satellite: o.satellite,
    elevation_deg: o.elevationRad.map((e) => e / DEG),
    azimuth_deg: o.azimuthRad.map((a) => a / DEG),
    residual_m: o.residualM,
  };
  const request = {
    site: { latitude_deg: input.latitudeRad / DEG, longitude_deg: 7.4, height_m: input.heightM ?? 500 },
    apriori: { zhd_m: 2.2 },
  };
  const objects = epoch.map((e, i) => ({
    epoch: e,
    satellite: o.satellite[i],
    elevation_deg: columns.elevation_deg[i],
    azimuth_deg: columns.azimuth_deg[i],
    residual_m: o.residualM[i],
  }));
  return { request, columns, objects, count: epoch.length };
}

async function estimationLines(server: ServerProcess): Promise<string[]> {
  const day = realisticDayBodies();
  const columnsBody = JSON.stringify({ ...day.request, observations: day.columns });
  const objectsBody = JSON.stringify({ ...day.request, observations: day.objects });
  const pid = server.child.pid!;
  const serverCpu = async (body: string, rounds: number) => {
    const per: number[] = [];
    for (let r = 0; r < rounds; r++) {
      const before = cpuSeconds(pid);
      await post(server, '/v1/zwd-estimates', body, 'application/json');
      per.push(cpuSeconds(pid) - before);
    }
    return per;
  };
  // In-process: the estimation service on the same request (validated once, outside the timing).
  const parsed = zwdEstimatesRequest.parse({ ...day.request, observations: day.objects });
  const domainSite = { latitudeDeg: parsed.site.latitude_deg, longitudeDeg: parsed.site.longitude_deg, heightM: parsed.site.height_m };
  const inProcess: number[] = [];
  for (let r = 0; r < 5; r++) {
    const before = process.cpuUsage();
    runZwdEstimation(toZwdRequest(domainSite, parsed, observationsFromColumns(day.columns)));
    const used = process.cpuUsage(before);
    if (r > 0) inProcess.push((used.user + used.system) / 1e6);
  }
  await serverCpu(columnsBody, 2); // warm-up
  await serverCpu(objectsBody, 1);
  const columns = await serverCpu(columnsBody, 4);
  const objects = await serverCpu(objectsBody, 3);
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
  const ratio = median(columns) / median(inProcess);
  return [
    `one realistic day (${day.count} observations, four constellations) through HTTP, service CPU per request (s):`,
    `  columns JSON ${range(columns)} (${(columnsBody.length / 1e6).toFixed(1)} MB), objects JSON ${range(objects)} (${(objectsBody.length / 1e6).toFixed(1)} MB); in-process estimation service ${range(inProcess)}`,
    `  columns / in-process ${ratio.toFixed(2)} (target ≤ 2); ${(1 / median(columns)).toFixed(1)} station-days per CPU-second through HTTP with columns, ${(1 / median(objects)).toFixed(1)} with objects (target ≥ 30)`,
  ];
}

export default async function bench(): Promise<string[]> {
  const server = await startServerProcess({}, true);
  try {
    // BENCH_PART=slant or estimation runs one part only.
    const part = process.env.BENCH_PART;
    return [...(part === 'estimation' ? [] : await slantLines(server)), ...(part === 'slant' ? [] : await estimationLines(server))];
  } finally {
    await server.stop();
  }
}
