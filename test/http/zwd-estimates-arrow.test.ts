/**
 * The Arrow path of POST /v1/zwd-estimates (issue 14, a speed change: equality with the code before it is the
 * test), both ends, decoded by apache-arrow's own reader (tableFromIPC, the library's implementation of the
 * Arrow IPC streaming format; pyarrow is not installed here, common practice):
 * - the answer written from the domain result (src/http/adapters/zwd-estimates-arrow.ts) against the path it
 *   replaces, kept as the reference: the answer objects of zwdEstimatesResponseOf shaped by tableAnswer. The
 *   same schema (names, types, nullability), the same metadata "answer", the same values, on both benchmark days
 *   of `npm run bench -- columns` (test/helpers/realistic-sky.ts, seed 11), with and without gradients, with met,
 *   with `fields`, and over random results (fast-check). Bytes may differ only where tableToIPC's differ run to run.
 * - requests with Utf8 or dictionary-encoded text columns, read without a Table (readArrowRequest in
 *   src/http/answer-shape.ts): the columns apache-arrow reads, and through the task the same answer as the same
 *   request as columns JSON; streams the direct reader leaves to apache-arrow (nulls, several batches,
 *   large offsets) and a bad epoch text give the answer and the 400 that columns JSON gives.
 */

import { Dictionary, Float64, Int32, Table, Utf8, tableFromIPC, tableToIPC, vectorFromArray, type Vector } from 'apache-arrow';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { zwdEstimatesArrowAnswer } from '../../src/http/adapters/zwd-estimates-arrow.js';
import { zwdEstimatesResponseOf } from '../../src/http/adapters/zwd-estimation.js';
import { readArrowRequest, type AnswerShape } from '../../src/http/answer-shape.js';
import { ZWD_ANSWER_FIELD_NAMES, ZWD_ANSWER_TABLES } from '../../src/http/schemas/zwd-estimates.js';
import { tableAnswer } from '../../src/http/table-answer.js';
import { handleZwdRequest } from '../../src/http/tasks/zwd-request.js';
import type { ZwdEstimationResult } from '../../src/services/zwd-estimation.js';
import { anyZwdEstimationResult } from '../helpers/estimation-result-arbitrary.js';
import { estimatedDay, metRecords } from '../helpers/estimated-day.js';
import { dayRequest } from '../helpers/gps-like-days.js';

const arrow = (fields?: string[]): AnswerShape => ({ shape: 'rows', format: 'arrow', fields });

/** What apache-arrow reads of a stream: per field its name, type, nullability and values, and the schema metadata. */
function decoded(bytes: Uint8Array) {
  const table = tableFromIPC(bytes);
  return {
    fields: table.schema.fields.map((f) => ({
      name: f.name,
      type: String(f.type),
      nullable: f.nullable,
      values: [...table.getChild(f.name)!] as unknown[],
    })),
    metadata: Object.fromEntries(table.schema.metadata),
    rows: table.numRows,
  };
}

/** The Arrow answer as it was built before: answer objects, then tableAnswer. */
const referenceAnswer = (r: ZwdEstimationResult, shape: AnswerShape) => tableAnswer(zwdEstimatesResponseOf(r), ZWD_ANSWER_TABLES, shape);

function expectSameArrowAnswer(r: ZwdEstimationResult, shape: AnswerShape): void {
  const written = zwdEstimatesArrowAnswer(r, shape);
  const reference = referenceAnswer(r, shape);
  expect(written.contentType).toBe(reference.contentType);
  expect(decoded(written.bytes)).toEqual(decoded(reference.bytes));
}

/** Selections of `fields` (validated names, as answerShapeOf passes them): series fields, other tables' fields, a repeat. */
const SELECTIONS: (string[] | undefined)[] = [
  undefined,
  ['zwd_m', 'sigma_m'],
  ['pwv_mm', 'epoch', 'met'],
  ['ztd_m', 'zwd_nodes.sigma_m', 'rejected.satellite', 'gradient_nodes.north_m'],
  ['zwd_nodes.epoch', 'zwd_nodes.zwd_m'],
  ['zwd_m', 'zwd_m', 'tm_k'],
];

describe('the Arrow answer written from the result, decoded as the answer objects + tableAnswer', () => {
  const gpsLike = estimatedDay({});
  it('GPS-like day (gradients, rejections, no met), every selection of fields', () => {
    expect(gpsLike.estimate.rejected.length).toBeGreaterThan(0);
    for (const fields of SELECTIONS) expectSameArrowAnswer(gpsLike, arrow(fields));
  });

  it('the series is the table (Utf8 texts dictionary-encoded, as tableFromArrays makes them), the rest in "answer"', () => {
    const answer = decoded(zwdEstimatesArrowAnswer(gpsLike, arrow()).bytes);
    expect(answer.rows).toBe(gpsLike.estimate.epochs.length);
    expect(answer.fields.find((f) => f.name === 'epoch')!.type).toBe('Dictionary<Int32, Utf8>');
    expect(answer.fields.find((f) => f.name === 'zwd_m')!.type).toBe('Float64');
    const rest = JSON.parse(answer.metadata.answer!) as Record<string, unknown>;
    expect(Object.keys(rest).slice(0, 3)).toEqual(['zwd_nodes', 'gradient_nodes', 'rejected']);
  });

  it('GPS-like day without gradients (null gradient fields), and with met over part of the day', () => {
    const noGradients = estimatedDay({}, { options: { gradients: null } });
    expect(noGradients.estimate.epochs[0]!.northGradientM).toBeNull();
    const withMet = estimatedDay({}, { met: metRecords(gpsLike.estimate.epochs[0]!.epochMs - 300_000) });
    expect(new Set(withMet.epochMet!.map((m) => m.met)).has('missing')).toBe(true);
    for (const r of [noGradients, withMet]) for (const fields of SELECTIONS) expectSameArrowAnswer(r, arrow(fields));
  });

  it('four-constellation day', () => {
    const r = estimatedDay({ constellations: ['gps', 'glonass', 'galileo', 'beidou'], grossErrors: 100 });
    for (const fields of [undefined, ['zwd_m', 'rejected.satellite']]) expectSameArrowAnswer(r, arrow(fields));
  });

  it('every field name of the answer alone, and an answer without rows', () => {
    for (const name of ZWD_ANSWER_FIELD_NAMES) expectSameArrowAnswer(gpsLike, arrow([name]));
    const empty = {
      ...gpsLike,
      estimate: { ...gpsLike.estimate, zwdNodes: [], gradientNodes: [], epochs: [], rejected: [] },
      epochZwd: [],
      epochMet: [],
    } as ZwdEstimationResult;
    expectSameArrowAnswer(empty, arrow());
  });

  it('over random results (fast-check): numbers of every kind, nulls, any text', () => {
    const result = anyZwdEstimationResult(gpsLike);
    const anyFields = fc.option(fc.array(fc.constantFrom(...ZWD_ANSWER_FIELD_NAMES), { minLength: 1, maxLength: 5 }), { nil: undefined });
    fc.assert(
      fc.property(result, anyFields, (r, fields) => expectSameArrowAnswer(r, arrow(fields))),
      { numRuns: 200 },
    );
  });
});

type Columns = ReturnType<typeof dayRequest>['columns'];

/** The request as an Arrow stream: texts as `textType` (Utf8, or a dictionary of Utf8 as tableFromArrays makes it). */
function arrowRequest(columns: Columns, rest: unknown, text: 'utf8' | 'dictionary', extra: Record<string, Vector> = {}): Uint8Array {
  const textVector = (values: (string | null)[]) =>
    text === 'utf8' ? vectorFromArray(values, new Utf8()) : vectorFromArray(values, new Dictionary(new Utf8(), new Int32()));
  const table = new Table({
    epoch: textVector(columns.epoch),
    satellite: textVector(columns.satellite),
    elevation_deg: vectorFromArray(Float64Array.from(columns.elevation_deg)),
    azimuth_deg: vectorFromArray(Float64Array.from(columns.azimuth_deg)),
    residual_m: vectorFromArray(Float64Array.from(columns.residual_m)),
    ...extra,
  });
  table.schema.metadata.set('request', JSON.stringify(rest));
  return tableToIPC(table, 'stream');
}

/** What apache-arrow reads of a request: each column's values, nulls as null. */
function referenceColumns(bytes: Uint8Array) {
  const table = tableFromIPC(bytes);
  return Object.fromEntries(table.schema.fields.map((f) => [f.name, [...table.getChild(f.name)!]]));
}
const plain = (columns: Record<string, ArrayLike<unknown>>) =>
  Object.fromEntries(Object.entries(columns).map(([k, v]) => [k, Array.from(v)]));

/** The task's answer, as the route runs it; JSON columns as the reference (the same request in another form). */
async function answerOf(
  body: Uint8Array | string,
  format: 'json' | 'arrow',
  answer: AnswerShape = { shape: 'columns', format: 'json', fields: undefined },
) {
  const outcome = await handleZwdRequest({ body, format, query: {}, answer });
  return outcome.ok ? { ok: true, text: Buffer.from(outcome.output.json).toString('utf8') } : outcome;
}

describe('Arrow requests with text columns, read without a Table', () => {
  const { columns, rest } = dayRequest({ durationS: 4 * 3600 });

  it('Utf8 and dictionary texts: the columns apache-arrow reads, the same metadata', () => {
    for (const text of ['utf8', 'dictionary'] as const) {
      const bytes = arrowRequest(columns, rest, text);
      const read = readArrowRequest(bytes, true);
      expect(read.columns.elevation_deg).toBeInstanceOf(Float64Array);
      expect(plain(read.columns)).toEqual(referenceColumns(bytes));
      expect(read.rest).toEqual(rest);
    }
  });

  it('texts of any kind (non-ASCII, a leading byte-order mark, empty, repeats): what apache-arrow decodes', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.string(), fc.string({ unit: 'grapheme' }), fc.constantFrom('\ufeffG01', 'G01', '', 'Δ')), {
          minLength: 1,
          maxLength: 30,
        }),
        fc.constantFrom('utf8' as const, 'dictionary' as const),
        (texts, text) => {
          const n = texts.length;
          const bytes = arrowRequest(
            {
              epoch: texts,
              satellite: [...texts].reverse(),
              elevation_deg: new Array(n).fill(10),
              azimuth_deg: new Array(n).fill(0),
              residual_m: new Array(n).fill(0),
            },
            {},
            text,
          );
          expect(plain(readArrowRequest(bytes, true).columns)).toEqual(referenceColumns(bytes));
        },
      ),
      { numRuns: 200 },
    );
  });

  it('through the task: the same answer as the request as columns JSON (columns and Arrow answers)', async () => {
    const json = JSON.stringify({ ...rest, observations: columns });
    for (const text of ['utf8', 'dictionary'] as const) {
      const bytes = arrowRequest(columns, rest, text);
      expect(await answerOf(bytes, 'arrow')).toEqual(await answerOf(json, 'json'));
      const [fromArrow, fromJson] = [
        await handleZwdRequest({ body: bytes, format: 'arrow', query: {}, answer: arrow() }),
        await handleZwdRequest({ body: json, format: 'json', query: {}, answer: arrow() }),
      ];
      if (!fromArrow.ok || !fromJson.ok) throw new Error('estimation failed');
      expect(decoded(fromArrow.output.json)).toEqual(decoded(fromJson.output.json));
    }
  });

  it('left to apache-arrow (nulls, several batches, a sigma column with nulls): the answers of columns JSON', async () => {
    const n = columns.epoch.length;
    const sigma = Array.from({ length: n }, (_, i) => (i % 3 === 0 ? null : 0.01));
    const withNullSigma = arrowRequest(columns, rest, 'utf8', { sigma_m: vectorFromArray(sigma, new Float64()) });
    expect(await answerOf(withNullSigma, 'arrow')).toEqual(
      await answerOf(JSON.stringify({ ...rest, observations: { ...columns, sigma_m: sigma } }), 'json'),
    );
    const half = Math.floor(n / 2);
    const part = (from: number, to: number) =>
      tableFromIPC(
        arrowRequest(
          mapColumns(columns, (c) => c.slice(from, to)),
          rest,
          'utf8',
        ),
      );
    const twoBatches = part(0, half).concat(part(half, n));
    twoBatches.schema.metadata.set('request', JSON.stringify(rest));
    const stream = tableToIPC(twoBatches, 'stream');
    expect(tableFromIPC(stream).batches).toHaveLength(2);
    expect(await answerOf(stream, 'arrow')).toEqual(await answerOf(JSON.stringify({ ...rest, observations: columns }), 'json'));
  });

  it('a text with a null, and a bad epoch text: the 400 of columns JSON', async () => {
    const satellite: (string | null)[] = [...columns.satellite];
    satellite[5] = null;
    for (const [name, values] of [
      ['satellite', satellite],
      ['epoch', columns.epoch.map((e, i) => (i === 7 ? '2026-13-01T00:00:00Z' : e))],
    ] as const) {
      const changed = { ...columns, [name]: values };
      const fromJson = await answerOf(JSON.stringify({ ...rest, observations: changed }), 'json');
      expect(fromJson).toMatchObject({ ok: false, error: { status: 400 } });
      for (const text of ['utf8', 'dictionary'] as const)
        expect(await answerOf(arrowRequest(changed as Columns, rest, text), 'arrow')).toEqual(fromJson);
    }
  });
});

function mapColumns(columns: Columns, f: <T>(c: T[]) => T[]): Columns {
  return Object.fromEntries(Object.entries(columns).map(([k, v]) => [k, f(v as unknown[])])) as Columns;
}
