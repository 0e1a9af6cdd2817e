/**
 * The worker thread's pieces of an estimation request (issue 14), this tree's dist/ against an older tree's, by
 * turns in one process (CPU time per call, process.cpuUsage; the two trees in alternating order pair after pair,
 * so that both see the same load), on the GPS-like day as columns JSON (bench/json-read-day.ts):
 * - the `shape=columns` answer of one estimation result (zwdEstimatesAnswer; the result is this tree's);
 * - the rows answer of that result's answer objects (tableAnswer: JSON.stringify and the UTF-8 bytes);
 * - the read step: the body's bytes → checked typed columns (readJsonColumnsBody, typedObservationsFromJsonColumns);
 * - the whole task with the rows answer and with the `shape=columns` answer (zwdRequestTask on the body's bytes).
 * Medians and ranges over BENCH_ROUNDS pairs (default 100) after 10, and the median of the per-pair ratios.
 *
 *   BENCH_WORKER_REFERENCE=/tmp/ref-main npm run bench -- worker-task     (build both dist/ first)
 *
 * Without BENCH_WORKER_REFERENCE the tree is compared with itself (the spread of the method).
 */

import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import type * as Answer from '../src/http/adapters/zwd-estimates-answer.js';
import type * as TableAnswer from '../src/http/table-answer.js';
import type * as Adapters from '../src/http/adapters/zwd-estimation.js';
import type { AnswerShape } from '../src/http/answer-shape.js';
import type * as Columns from '../src/http/columns.js';
import type * as Schemas from '../src/http/schemas/zwd-estimates.js';
import type * as Task from '../src/http/tasks/zwd-request.js';
import type * as Reader from '../src/formats/json-columns-reader.js';
import type * as Service from '../src/services/zwd-estimation.js';
import { MAX_OBSERVATIONS } from '../src/limits.js';
import { dayBody } from './json-read-day.js';

const COLUMNS: AnswerShape = { shape: 'columns', format: 'json', fields: undefined };
const ROWS: AnswerShape = { shape: 'rows', format: 'json', fields: undefined };

async function treeOf(root: string) {
  const load = async <T>(path: string) => (await import(pathToFileURL(resolve(root, 'dist', `${path}.js`)).href)) as T;
  const answer = await load<typeof Answer>('http/adapters/zwd-estimates-answer');
  const tableAnswer = await load<typeof TableAnswer>('http/table-answer');
  const adapters = await load<typeof Adapters>('http/adapters/zwd-estimation');
  const columns = await load<typeof Columns>('http/columns');
  const schemas = await load<typeof Schemas>('http/schemas/zwd-estimates');
  const task = await load<typeof Task>('http/tasks/zwd-request');
  const reader = await load<typeof Reader>('formats/json-columns-reader');
  const service = await load<typeof Service>('services/zwd-estimation');
  const specs = columns.jsonColumnSpecsOf(columns.columnSpecsOf(schemas.zwdObservationSchema.shape));
  return { answer, tableAnswer, adapters, schemas, task, reader, service, specs };
}

const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const fmt = (xs: number[], digits = 2) =>
  `${median(xs).toFixed(digits)} (${Math.min(...xs).toFixed(digits)}–${Math.max(...xs).toFixed(digits)})`;
const load = () => readFileSync('/proc/loadavg', 'utf8').split(' ')[0]!;

export default async function workerTaskBench(): Promise<string[]> {
  const referenceRoot = process.env.BENCH_WORKER_REFERENCE ?? '.';
  const rounds = Number(process.env.BENCH_ROUNDS ?? 100);
  const trees = [await treeOf(referenceRoot), await treeOf('.')] as const;
  const bytes = dayBody('gps');
  // One estimation result (this tree's service), the input of both answers.
  const here = trees[1];
  const read = here.reader.readJsonColumnsBody(bytes, 'observations', here.specs, MAX_OBSERVATIONS)!;
  const rest = here.schemas.zwdEstimatesColumnarRest.parse(read.rest) as Record<string, unknown> & {
    site: { latitude_deg: number; longitude_deg: number; height_m: number };
  };
  const { site, ...body } = rest;
  const request = here.adapters.toZwdRequest(
    { latitudeDeg: site.latitude_deg, longitudeDeg: site.longitude_deg, heightM: site.height_m },
    body as Parameters<typeof here.adapters.toZwdRequest>[1],
    here.adapters.typedObservationsFromJsonColumns(read),
  );
  const result = here.service.runZwdEstimation(request);

  const rowObjects = here.adapters.zwdEstimatesResponseOf(result) as unknown as Record<string, unknown>;
  type Tree = (typeof trees)[number];
  const pieces: [string, (t: Tree) => unknown][] = [
    ['shape=columns answer (zwdEstimatesAnswer)', (t) => t.answer.zwdEstimatesAnswer(result, COLUMNS)],
    // The answer objects made once (this tree's), the same input for both trees: JSON.stringify and the bytes.
    ['rows answer from the answer objects (tableAnswer)', (t) => t.tableAnswer.tableAnswer(rowObjects, t.schemas.ZWD_ANSWER_TABLES, ROWS)],
    [
      'read step (bytes → checked typed columns)',
      (t) => t.adapters.typedObservationsFromJsonColumns(t.reader.readJsonColumnsBody(bytes, 'observations', t.specs, MAX_OBSERVATIONS)!),
    ],
    [
      'whole task, rows answer (zwdRequestTask)',
      async (t) => {
        const outcome = await t.task.zwdRequestTask({ body: new Uint8Array(bytes), format: 'json', query: {} });
        if (!outcome.ok) throw new Error('the task failed');
      },
    ],
    [
      'whole task, shape=columns answer (zwdRequestTask)',
      async (t) => {
        const outcome = await t.task.zwdRequestTask({ body: new Uint8Array(bytes), format: 'json', query: {}, answer: COLUMNS });
        if (!outcome.ok) throw new Error('the task failed');
      },
    ],
  ];
  const lines = [
    `GPS-like day, worker pieces by turns: reference ${referenceRoot}/dist, this tree's dist; CPU ms per call, median (range) of ${rounds} pairs after 10`,
  ];
  for (const [name, piece] of pieces) {
    const loadBefore = load();
    const times: [number[], number[]] = [[], []];
    const ratios: number[] = [];
    for (let r = -10; r < rounds; r++) {
      const got = [0, 0];
      for (const k of r % 2 === 0 ? [0, 1] : [1, 0]) {
        const started = cpuMs();
        await piece(trees[k]!);
        got[k] = cpuMs() - started;
      }
      if (r < 0) continue;
      times[0].push(got[0]!);
      times[1].push(got[1]!);
      ratios.push(got[1]! / got[0]!);
    }
    lines.push(
      `  ${name}: reference ${fmt(times[0])} → this tree ${fmt(times[1])}; ratio by turns ${fmt(ratios)}; load ${loadBefore} → ${load()}`,
    );
  }
  return lines;
}
