/**
 * What the Arrow form of POST /v1/zwd-estimates costs in-process (issue 14), this tree against an older one by
 * turns: the request reader (readArrowRequest, typed, as the task calls it) on the request of `npm run bench --
 * columns` (tableFromArrays: epoch and satellite dictionary-encoded Utf8, three float64 columns) and on the same
 * request with plain Utf8 texts (what pyarrow and polars send); the Arrow answer (zwdEstimatesArrowAnswer of both
 * trees; without a reference tree, the answer objects + tableAnswer against it); and the whole task
 * (handleZwdRequest: read, check, estimate, Arrow answer) beside the estimation service alone (runZwdEstimation).
 * Both benchmark days
 * (test/helpers/realistic-sky.ts, seed 11: GPS-like with 25 gross errors, four constellations with 100).
 * CPU time of this process (process.cpuUsage) per call, old and new run after run (so that both see the same
 * load), medians and ranges over RUNS runs after WARM_UP of warm-up, the load average before and after beside
 * them.
 *
 *   git archive <commit> src | tar -x -C /tmp/before && ln -s $PWD/node_modules /tmp/before/node_modules
 *   BENCH_ARROW_REFERENCE=/tmp/before npm run bench -- arrow-path
 *
 * Without BENCH_ARROW_REFERENCE only the answers are compared (the old answer path is still in this tree).
 */

import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { Dictionary, Int32, Table, Utf8, tableToIPC, vectorFromArray } from 'apache-arrow';
import { zwdEstimatesArrowAnswer } from '../src/http/adapters/zwd-estimates-arrow.js';
import { observationsFromColumns, toZwdRequest, zwdEstimatesResponseOf } from '../src/http/adapters/zwd-estimation.js';
import { readArrowRequest, type AnswerShape } from '../src/http/answer-shape.js';
import { ZWD_ANSWER_TABLES, zwdEstimatesRequest } from '../src/http/schemas/zwd-estimates.js';
import { tableAnswer } from '../src/http/table-answer.js';
import { handleZwdRequest } from '../src/http/tasks/zwd-request.js';
import { runZwdEstimation } from '../src/services/zwd-estimation.js';
import { dayRequest } from '../test/helpers/gps-like-days.js';

const RUNS = Number(process.env.BENCH_RUNS ?? 30);
const WARM_UP = 8;

const DAYS = {
  'GPS-like (30 satellites)': { constellations: ['gps'] as const, grossErrors: 25 },
  'four constellations': { constellations: ['gps', 'glonass', 'galileo', 'beidou'] as const, grossErrors: 100 },
};

const ARROW_ANSWER: AnswerShape = { shape: 'rows', format: 'arrow', fields: undefined };

/** One day as the Arrow request, texts as `text`, and the estimation service's request for it. */
function dayOf(day: (typeof DAYS)[keyof typeof DAYS]) {
  const { columns, rest } = dayRequest({ grossErrors: day.grossErrors, constellations: [...day.constellations] });
  const body = (text: 'dictionary' | 'utf8') => {
    const type = () => (text === 'utf8' ? new Utf8() : new Dictionary(new Utf8(), new Int32())); // a dictionary id per column
    const table = new Table({
      epoch: vectorFromArray(columns.epoch, type()),
      satellite: vectorFromArray(columns.satellite, type()),
      elevation_deg: vectorFromArray(Float64Array.from(columns.elevation_deg)),
      azimuth_deg: vectorFromArray(Float64Array.from(columns.azimuth_deg)),
      residual_m: vectorFromArray(Float64Array.from(columns.residual_m)),
    });
    table.schema.metadata.set('request', JSON.stringify(rest));
    return tableToIPC(table, 'stream');
  };
  const first = { epoch: columns.epoch[0], satellite: columns.satellite[0], elevation_deg: 45, azimuth_deg: 0, residual_m: 0 };
  const parsed = zwdEstimatesRequest.parse({ ...rest, observations: [first] });
  const site = { latitudeDeg: parsed.site.latitude_deg, longitudeDeg: parsed.site.longitude_deg, heightM: parsed.site.height_m };
  const serviceRequest = toZwdRequest(site, parsed, observationsFromColumns(columns));
  return { count: columns.epoch.length, bodies: { dictionary: body('dictionary'), utf8: body('utf8') }, serviceRequest };
}

const loadAverage = () => readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ');
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const ms = (xs: number[]) =>
  `${(median(xs) * 1e3).toFixed(2)} ms (${(Math.min(...xs) * 1e3).toFixed(2)}–${(Math.max(...xs) * 1e3).toFixed(2)})`;

/** CPU seconds per call of each function, by turns, after the warm-up. */
async function byTurns(runs: Array<() => unknown>): Promise<number[][]> {
  const per = runs.map(() => [] as number[]);
  for (let r = 0; r < WARM_UP + RUNS; r++) {
    for (const [i, run] of runs.entries()) {
      const before = process.cpuUsage();
      await run();
      const used = process.cpuUsage(before);
      if (r >= WARM_UP) per[i]!.push((used.user + used.system) / 1e6);
    }
  }
  return per;
}

/** "label: old → new; ratio by turns" with the load average before and after. */
async function compared(
  label: string,
  old: () => unknown,
  now: () => unknown,
  beside: Record<string, () => unknown> = {},
): Promise<string> {
  const loadBefore = loadAverage();
  const [a, b, ...others] = await byTurns([old, now, ...Object.values(beside)]);
  const ratio = b!.map((x, i) => x / a![i]!);
  const besideText = Object.keys(beside)
    .map((name, i) => `; ${name} ${ms(others[i]!)}`)
    .join('');
  return `  ${label}: ${ms(a!)} → ${ms(b!)}; ratio by turns ${median(ratio).toFixed(2)} (${Math.min(...ratio).toFixed(2)}–${Math.max(...ratio).toFixed(2)})${besideText}; load average ${loadBefore} → ${loadAverage()}`;
}

export default async function bench(): Promise<string[]> {
  const root = process.env.BENCH_ARROW_REFERENCE;
  const load = async <T>(file: string) => (await import(pathToFileURL(`${root}/src/${file}`).href)) as T;
  const old = root
    ? {
        read: (await load<{ readArrowRequest: typeof readArrowRequest }>('http/answer-shape.ts')).readArrowRequest,
        task: (await load<{ handleZwdRequest: typeof handleZwdRequest }>('http/tasks/zwd-request.ts')).handleZwdRequest,
        answer: (await load<{ zwdEstimatesArrowAnswer: typeof zwdEstimatesArrowAnswer }>('http/adapters/zwd-estimates-arrow.ts'))
          .zwdEstimatesArrowAnswer,
      }
    : undefined;
  const lines = [
    `old: ${root ?? 'the answer objects + tableAnswer of this tree'}; new: this tree; CPU per call, median (range) of ${RUNS} runs`,
  ];
  for (const [name, day] of Object.entries(DAYS)) {
    const d = dayOf(day);
    const result = runZwdEstimation(d.serviceRequest);
    lines.push(`${name}, ${d.count} observations, ${result.estimate.epochs.length} epochs:`);
    lines.push(
      old
        ? await compared(
            'Arrow answer (zwdEstimatesArrowAnswer)',
            () => old.answer(result, ARROW_ANSWER),
            () => zwdEstimatesArrowAnswer(result, ARROW_ANSWER),
          )
        : await compared(
            'Arrow answer (answer objects + tableAnswer → zwd-estimates-arrow.ts)',
            () => tableAnswer(zwdEstimatesResponseOf(result), ZWD_ANSWER_TABLES, ARROW_ANSWER),
            () => zwdEstimatesArrowAnswer(result, ARROW_ANSWER),
          ),
    );
    if (!old) continue;
    for (const text of ['dictionary', 'utf8'] as const) {
      const body = d.bodies[text];
      lines.push(
        await compared(
          `request reader, ${text} texts (${(body.length / 1e6).toFixed(2)} MB)`,
          () => old.read(body, true),
          () => readArrowRequest(body, true),
        ),
      );
    }
    for (const text of ['dictionary', 'utf8'] as const) {
      const task = (handle: typeof handleZwdRequest) => async () => {
        const outcome = await handle({ body: d.bodies[text], format: 'arrow', query: {}, answer: ARROW_ANSWER });
        if (!outcome.ok) throw new Error(`${name}: ${outcome.error.detail}`);
      };
      lines.push(
        await compared(`whole task, Arrow in (${text} texts) and out (handleZwdRequest)`, task(old.task), task(handleZwdRequest), {
          'estimation service alone (runZwdEstimation)': () => runZwdEstimation(d.serviceRequest),
        }),
      );
    }
  }
  return lines;
}
