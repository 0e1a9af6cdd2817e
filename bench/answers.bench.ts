/**
 * What the JSON answer of POST /v1/zwd-estimates costs in-process (issue 14): the answer written as bytes
 * from the domain result (src/http/adapters/zwd-estimates-answer.ts) against the path before it (answer
 * objects of zwdEstimatesResponseOf, then tableAnswer: JSON.stringify and UTF-8 for rows, json-columns.ts
 * for `shape=columns`), on both benchmark days of `npm run bench -- columns` (test/helpers/realistic-sky.ts,
 * seed 11, default options), rows and columns. CPU time of this process (process.cpuUsage) per answer, the
 * two paths by turns run after run (so that both see the same load), medians and ranges over 40 runs after
 * 10 of warm-up; the load average before and after beside them. `npm run bench -- answers`.
 *
 * "Before" is this tree's answer objects + tableAnswer, or with BENCH_ANSWERS_REFERENCE=<root of an older
 * source tree> (e.g. `git archive <commit> src | tar -x -C /tmp/before`, node_modules linked) that tree's,
 * so that what changed inside the answer objects (the epoch texts) is timed too; with it also the slant-delay
 * task (handleSlantDelaysRequest, rows answer, 10 000 directions: the body read, the models and the answer)
 * of both trees by turns.
 */

import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { DEG } from '../src/domain/constants.js';
import { zwdEstimatesAnswer } from '../src/http/adapters/zwd-estimates-answer.js';
import { observationsFromColumns, toZwdRequest, zwdEstimatesResponseOf } from '../src/http/adapters/zwd-estimation.js';
import type { AnswerShape } from '../src/http/answer-shape.js';
import { ZWD_ANSWER_TABLES, zwdEstimatesRequest } from '../src/http/schemas/zwd-estimates.js';
import { tableAnswer } from '../src/http/table-answer.js';
import { handleSlantDelaysRequest } from '../src/http/tasks/apriori-batch.js';
import { runZwdEstimation, type ZwdEstimationResult } from '../src/services/zwd-estimation.js';
import { simulateSky } from '../test/helpers/realistic-sky.js';

const RUNS = 40;
const WARM_UP = 10;

const DAYS = {
  'GPS-like (30 satellites)': { constellations: ['gps'] as const, grossErrors: 25 },
  'four constellations': { constellations: ['gps', 'glonass', 'galileo', 'beidou'] as const, grossErrors: 100 },
};

function estimatedDay(day: (typeof DAYS)[keyof typeof DAYS]): ZwdEstimationResult {
  const s = simulateSky({ seed: 11, durationS: 86_400, grossErrors: day.grossErrors, constellations: [...day.constellations] });
  const observations = {
    epoch: s.epochMs.map((ms) => new Date(ms).toISOString()),
    satellite: s.satellite,
    elevation_deg: s.elevationRad.map((e) => e / DEG),
    azimuth_deg: s.azimuthRad.map((a) => a / DEG),
    residual_m: s.residualM,
  };
  const first = { epoch: observations.epoch[0], satellite: s.satellite[0], elevation_deg: 45, azimuth_deg: 0, residual_m: 0 };
  const parsed = zwdEstimatesRequest.parse({
    site: { latitude_deg: s.options.latitudeDeg, longitude_deg: 7.4, height_m: s.options.heightM },
    apriori: { zhd_m: 2.2 },
    observations: [first],
  });
  const site = { latitudeDeg: parsed.site.latitude_deg, longitudeDeg: parsed.site.longitude_deg, heightM: parsed.site.height_m };
  return runZwdEstimation(toZwdRequest(site, parsed, observationsFromColumns(observations)));
}

const loadAverage = () => readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ');
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const ms = (xs: number[]) =>
  `${(median(xs) * 1e3).toFixed(2)} ms (${(Math.min(...xs) * 1e3).toFixed(2)}–${(Math.max(...xs) * 1e3).toFixed(2)})`;

/** CPU seconds per call of each function, by turns, after the warm-up. */
function byTurns(runs: Array<() => unknown>): number[][] {
  const per = runs.map(() => [] as number[]);
  for (let r = 0; r < WARM_UP + RUNS; r++) {
    runs.forEach((run, i) => {
      const before = process.cpuUsage();
      run();
      const used = process.cpuUsage(before);
      if (r >= WARM_UP) per[i]!.push((used.user + used.system) / 1e6);
    });
  }
  return per;
}

type ObjectsPath = (r: ZwdEstimationResult, shape: AnswerShape) => Uint8Array;

/** The answer objects + tableAnswer of this tree, or of the tree at BENCH_ANSWERS_REFERENCE. */
async function objectsPath(): Promise<{ label: string; answer: ObjectsPath }> {
  const root = process.env.BENCH_ANSWERS_REFERENCE;
  if (!root) {
    return {
      label: 'answer objects + tableAnswer',
      answer: (r, shape) => tableAnswer(zwdEstimatesResponseOf(r), ZWD_ANSWER_TABLES, shape).bytes,
    };
  }
  const load = async <T>(file: string) => (await import(pathToFileURL(`${root}/src/${file}`).href)) as T;
  const adapters = await load<{ zwdEstimatesResponseOf: typeof zwdEstimatesResponseOf }>('http/adapters/zwd-estimation.ts');
  const tables = await load<{ tableAnswer: typeof tableAnswer }>('http/table-answer.ts');
  const schemas = await load<{ ZWD_ANSWER_TABLES: typeof ZWD_ANSWER_TABLES }>('http/schemas/zwd-estimates.ts');
  return {
    label: `answer objects + tableAnswer of ${root}`,
    answer: (r, shape) => tables.tableAnswer(adapters.zwdEstimatesResponseOf(r), schemas.ZWD_ANSWER_TABLES, shape).bytes,
  };
}

/** The slant-delay task of this tree and of the reference tree by turns, 10 000 directions, rows answer. */
async function slantLines(root: string): Promise<string[]> {
  const n = 10_000;
  const body = JSON.stringify({
    site: { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 },
    epoch: '2026-06-21T06:30:00Z',
    met: { pressure_hpa: 965.3, temperature_c: 18.2, relative_humidity_pct: 61 },
    directions: {
      elevation_deg: Array.from({ length: n }, (_, i) => 3 + (87 * i) / n),
      azimuth_deg: Array.from({ length: n }, (_, i) => (i * 37) % 360),
    },
  });
  const module = (await import(pathToFileURL(`${root}/src/http/tasks/apriori-batch.ts`).href)) as {
    handleSlantDelaysRequest: typeof handleSlantDelaysRequest;
  };
  const run = (handle: typeof handleSlantDelaysRequest) => async () => {
    const outcome = await handle({ body: new Uint8Array(Buffer.from(body)) });
    if (!outcome.ok) throw new Error('slant delays: not answered');
    return outcome.output.json;
  };
  const before = run(module.handleSlantDelaysRequest);
  const after = run(handleSlantDelaysRequest);
  if (!Buffer.from(await before()).equals(Buffer.from(await after()))) throw new Error('slant delays: the answers differ');
  const times: [number[], number[]] = [[], []];
  const loadBefore = loadAverage();
  for (let r = 0; r < WARM_UP + RUNS; r++) {
    for (const [i, f] of [before, after].entries()) {
      const started = process.cpuUsage();
      await f();
      const used = process.cpuUsage(started);
      if (r >= WARM_UP) times[i]!.push((used.user + used.system) / 1e6);
    }
  }
  const ratio = times[1].map((x, i) => x / times[0][i]!);
  return [
    `slant delays, 10 000 directions, rows answer (handleSlantDelaysRequest): ${root} ${ms(times[0])} → this tree ${ms(times[1])}; ratio by turns ${median(ratio).toFixed(2)} (${Math.min(...ratio).toFixed(2)}–${Math.max(...ratio).toFixed(2)}); load average ${loadBefore} → ${loadAverage()}`,
  ];
}

export default async function bench(): Promise<string[]> {
  const lines: string[] = [];
  const reference = await objectsPath();
  for (const [name, day] of Object.entries(DAYS)) {
    const result = estimatedDay(day);
    for (const shape of ['rows', 'columns'] as const) {
      const answerShape: AnswerShape = { shape, format: 'json', fields: undefined };
      const before = () => reference.answer(result, answerShape);
      const after = () => zwdEstimatesAnswer(result, answerShape).bytes;
      if (!Buffer.from(before()).equals(Buffer.from(after()))) throw new Error(`${name} ${shape}: the answers differ`);
      const loadBefore = loadAverage();
      const [old, now] = byTurns([before, after]) as [number[], number[]];
      const ratio = now.map((x, i) => x / old[i]!);
      lines.push(
        `${name}, ${result.estimate.epochs.length} epochs, shape=${shape} (${(after().length / 1e6).toFixed(2)} MB): ${reference.label} ${ms(old)} → this tree (zwdEstimatesAnswer) ${ms(now)}; ratio by turns ${median(ratio).toFixed(2)} (${Math.min(...ratio).toFixed(2)}–${Math.max(...ratio).toFixed(2)}); load average ${loadBefore} → ${loadAverage()}`,
      );
    }
  }
  const root = process.env.BENCH_ANSWERS_REFERENCE;
  if (root) lines.push(...(await slantLines(root)));
  return lines;
}
