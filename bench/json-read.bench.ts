/**
 * The one-pass reader of columnar JSON bodies (src/formats/json-columns-reader.ts, issue 14) against the path
 * before it, in-process, CPU time (process.cpuUsage) by turns in one process so that the load of other
 * processes hits both alike; medians and ranges over rounds, the load average beside them:
 * - the parse step alone: the body's bytes → checked domain columns. Before: the bytes as text, JSON.parse,
 *   the column checks and conversion (checkedObservationColumns). Now: readJsonColumnsBody and
 *   observationsFromJsonColumns. The rest of the body (site, apriori) goes through its schema either way
 *   and is left out of both;
 * - the whole task (handleZwdRequest, rows answer, default options): the same body as bytes (this build),
 *   against BENCH_JSONREAD_REFERENCE (the root of an older source tree: `git archive <commit> src | tar -x -C
 *   /tmp/before`, with node_modules and package.json linked) or, without it, against this build given the body
 *   as text (then the general path: JSON.parse and the full checks);
 * on the GPS-like day and the four-constellation day (test/helpers/realistic-sky.ts, seed 11, as
 * bench/columns.bench.ts builds them). `npm run bench -- json-read`; BENCH_ROUNDS (default 30) rounds.
 */

import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { DEG } from '../src/domain/constants.js';
import { MAX_OBSERVATIONS } from '../src/limits.js';
import { readJsonColumnsBody } from '../src/formats/json-columns-reader.js';
import { checkedObservationColumns, observationsFromJsonColumns } from '../src/http/adapters/zwd-estimation.js';
import { columnSpecsOf, jsonColumnSpecsOf, type ColumnSpec } from '../src/http/columns.js';
import { zwdObservationSchema } from '../src/http/schemas/zwd-estimates.js';
import { handleZwdRequest } from '../src/http/tasks/zwd-request.js';
import { simulateSky } from '../test/helpers/realistic-sky.js';
import { skyInput } from '../test/helpers/synthetic-input.js';

const DAYS = {
  'GPS-like day (26 452 observations)': { constellations: ['gps'] as const, grossErrors: 25 },
  'four-constellation day': { constellations: ['gps', 'glonass', 'galileo', 'beidou'] as const, grossErrors: 100 },
};

/** One realistic day as the columns JSON body of POST /v1/zwd-estimates (as bench/columns.bench.ts builds it). */
function dayBody(day: (typeof DAYS)[keyof typeof DAYS]): Uint8Array<ArrayBuffer> {
  const input = skyInput(
    simulateSky({ seed: 11, durationS: 86_400, grossErrors: day.grossErrors, constellations: [...day.constellations] }),
  );
  const o = input.observations;
  const iso = new Map<number, string>();
  const epoch = o.epochMs.map((ms) => iso.get(ms) ?? (iso.set(ms, new Date(ms).toISOString()), iso.get(ms)!));
  const body = {
    site: { latitude_deg: input.latitudeRad / DEG, longitude_deg: 7.4, height_m: input.heightM ?? 500 },
    apriori: { zhd_m: 2.2 },
    observations: {
      epoch,
      satellite: o.satellite,
      elevation_deg: o.elevationRad.map((e) => e / DEG),
      azimuth_deg: o.azimuthRad.map((a) => a / DEG),
      residual_m: o.residualM,
    },
  };
  return new Uint8Array(Buffer.from(JSON.stringify(body)));
}

const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const figure = (xs: number[]) => `${median(xs).toFixed(1)} ms (${Math.min(...xs).toFixed(1)}–${Math.max(...xs).toFixed(1)})`;
const load = () => readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ');

/** CPU [ms] of each function, by turns, `rounds` rounds after 5 of warm-up. */
async function byTurns(runs: Array<() => unknown>, rounds: number): Promise<number[][]> {
  const per = runs.map(() => [] as number[]);
  for (let r = -5; r < rounds; r++) {
    for (let k = 0; k < runs.length; k++) {
      const before = cpuMs();
      await runs[k]!();
      const used = cpuMs() - before;
      if (r >= 0) per[k]!.push(used);
    }
  }
  return per;
}

const SPECS = columnSpecsOf(zwdObservationSchema.shape) as Parameters<typeof checkedObservationColumns>[1] & Record<string, ColumnSpec>;
const JSON_SPECS = jsonColumnSpecsOf(SPECS);

export default async function jsonReadBench(): Promise<string[]> {
  const rounds = Number(process.env.BENCH_ROUNDS ?? 30);
  const reference = process.env.BENCH_JSONREAD_REFERENCE;
  const before = reference
    ? ((await import(pathToFileURL(`${reference}/src/http/tasks/zwd-request.ts`).href)) as { handleZwdRequest: typeof handleZwdRequest })
        .handleZwdRequest
    : undefined;
  const lines: string[] = [];
  for (const [name, day] of Object.entries(DAYS)) {
    const bytes = dayBody(day);
    const text = Buffer.from(bytes).toString('utf8');
    const loadBefore = load();
    const [oldParse, newParse] = await byTurns(
      [
        () => {
          const raw = JSON.parse(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8')) as {
            observations: unknown;
          };
          if (!checkedObservationColumns(raw.observations, SPECS, MAX_OBSERVATIONS)) throw new Error('not checked');
        },
        () => {
          const read = readJsonColumnsBody(bytes, 'observations', JSON_SPECS, MAX_OBSERVATIONS);
          if (!read) throw new Error('not read');
          observationsFromJsonColumns(read);
        },
      ],
      rounds,
    );
    const task = async (body: Uint8Array | string, handle = handleZwdRequest) => {
      const outcome = await handle({ body, format: 'json', query: {} });
      if (!outcome.ok) throw new Error(`${name}: ${JSON.stringify(outcome).slice(0, 300)}`);
    };
    const [oldTask, newTask] = await byTurns([() => (before ? task(bytes, before) : task(text)), () => task(bytes)], rounds);
    const loadAfter = load();
    lines.push(
      `${name}, ${(bytes.length / 1e6).toFixed(1)} MB, ${rounds} rounds by turns, CPU time, load ${loadBefore} → ${loadAfter}:`,
      `  parse step (bytes → checked domain columns): text + JSON.parse + checks ${figure(oldParse!)}, one-pass reader ${figure(newParse!)}`,
      `  handleZwdRequest (rows answer): ${before ? 'reference tree' : 'general path (body as text)'} ${figure(oldTask!)}, reader ${figure(newTask!)}`,
    );
  }
  return lines;
}
