/**
 * The `shape=columns` estimation answer written as bytes from the domain result
 * (src/http/adapters/zwd-estimates-answer.ts) against the path it replaces, kept here as the reference: the
 * answer objects of zwdEstimatesResponseOf turned into columns by tableAnswer (json-columns.ts). Byte for
 * byte (issue 14, a speed change: equality with the code before it is the test), on both benchmark days of
 * `npm run bench -- columns` (test/helpers/realistic-sky.ts, seed 11: GPS-like with 25 gross errors, four
 * constellations with 100), with and without gradients, with met present (measured, interpolated and
 * missing epochs) and absent, with `fields` selections, and over random results (fast-check) with the
 * numbers JSON.stringify writes in its other forms (exponents, -0, NaN, ±Infinity) and any text. Rows and
 * Arrow still go through the answer objects; their epoch texts (isoEpochText) are checked against
 * Date.prototype.toISOString here and in test/formats/iso-epoch-text.test.ts.
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { zwdEstimatesAnswer } from '../../src/http/adapters/zwd-estimates-answer.js';
import { zwdEstimatesResponseOf } from '../../src/http/adapters/zwd-estimation.js';
import type { AnswerShape } from '../../src/http/answer-shape.js';
import { ZWD_ANSWER_FIELD_NAMES, ZWD_ANSWER_TABLES } from '../../src/http/schemas/zwd-estimates.js';
import { tableAnswer } from '../../src/http/table-answer.js';
import type { ZwdEstimationResult } from '../../src/services/zwd-estimation.js';
import { anyZwdEstimationResult } from '../helpers/estimation-result-arbitrary.js';
import { estimatedDay, metRecords } from '../helpers/estimated-day.js';

/** The rows answer as it was built before: JSON.stringify of the answer objects, encoded by TextEncoder. */
const referenceRowsBytes = (r: ZwdEstimationResult) => Buffer.from(new TextEncoder().encode(JSON.stringify(zwdEstimatesResponseOf(r))));

/** The answer as it was built before: answer objects, then tableAnswer. */
const referenceBytes = (r: ZwdEstimationResult, shape: AnswerShape) =>
  Buffer.from(tableAnswer(zwdEstimatesResponseOf(r), ZWD_ANSWER_TABLES, shape).bytes);
const writtenBytes = (r: ZwdEstimationResult, shape: AnswerShape) => Buffer.from(zwdEstimatesAnswer(r, shape).bytes);

const rows = (fields?: string[]): AnswerShape => ({ shape: 'rows', format: 'json', fields });
const columns = (fields?: string[]): AnswerShape => ({ shape: 'columns', format: 'json', fields });

/** Selections of `fields` (validated names, as answerShapeOf passes them): main-table fields, other tables' fields, a repeat. */
const SELECTIONS: (string[] | undefined)[] = [
  undefined,
  ['zwd_m', 'sigma_m'],
  ['pwv_mm', 'epoch', 'met'],
  ['ztd_m', 'zwd_nodes.sigma_m', 'rejected.satellite', 'gradient_nodes.north_m'],
  ['zwd_nodes.epoch', 'zwd_nodes.zwd_m'],
  ['zwd_m', 'zwd_m', 'tm_k'],
];

function expectSameBytesInEveryShape(r: ZwdEstimationResult): void {
  for (const fields of SELECTIONS) {
    const shape = columns(fields);
    expect(writtenBytes(r, shape).equals(referenceBytes(r, shape)), `fields=${fields?.join(',') ?? 'all'}`).toBe(true);
  }
}

/** Every epoch text of the rows answer is toISOString's text of the domain epoch (ECMA-262 Date Time String Format). */
function expectIsoEpochs(r: ZwdEstimationResult): void {
  // The rows answer: JSON.stringify of the objects as UTF-8 (TextEncoder before; latin1 for ASCII text now).
  expect(writtenBytes(r, rows()).equals(referenceRowsBytes(r))).toBe(true);
  const answer = JSON.parse(writtenBytes(r, rows()).toString('utf8')) as Record<string, { epoch: string }[]>;
  const texts = (list: { epochMs: number }[]) => list.map((x) => new Date(x.epochMs).toISOString());
  expect(answer.series!.map((e) => e.epoch)).toEqual(texts(r.estimate.epochs));
  expect(answer.zwd_nodes!.map((e) => e.epoch)).toEqual(texts(r.estimate.zwdNodes));
  expect(answer.gradient_nodes!.map((e) => e.epoch)).toEqual(texts(r.estimate.gradientNodes));
  expect(answer.rejected!.map((e) => e.epoch)).toEqual(texts(r.estimate.rejected));
}

describe('byte for byte the answer objects + tableAnswer, the benchmark days', () => {
  const gpsLike = estimatedDay({});
  it('GPS-like day (default options: gradients, rejections, no met)', () => {
    expect(gpsLike.estimate.rejected.length).toBeGreaterThan(0);
    expect(gpsLike.estimate.gradientNodes.length).toBeGreaterThan(0);
    expect(gpsLike.epochMet).toBeNull();
    expectSameBytesInEveryShape(gpsLike);
    expectIsoEpochs(gpsLike);
  });

  it('GPS-like day without gradients (null gradient fields, no gradient nodes)', () => {
    const r = estimatedDay({}, { options: { gradients: null } });
    expect(r.estimate.gradientNodes).toHaveLength(0);
    expect(r.estimate.epochs[0]!.northGradientM).toBeNull();
    expectSameBytesInEveryShape(r);
  });

  it('GPS-like day with met over part of the day (measured or interpolated, and missing epochs)', () => {
    const r = estimatedDay({}, { met: metRecords(gpsLike.estimate.epochs[0]!.epochMs - 300_000) });
    const qualities = new Set(r.epochMet!.map((m) => m.met));
    expect(qualities.has('missing')).toBe(true);
    expect(qualities.size).toBeGreaterThan(1);
    expectSameBytesInEveryShape(r);
  });

  it('four-constellation day', () => {
    const r = estimatedDay({ constellations: ['gps', 'glonass', 'galileo', 'beidou'], grossErrors: 100 });
    expect(r.estimate.rejected.length).toBeGreaterThan(0);
    expectSameBytesInEveryShape(r);
    expectIsoEpochs(r);
  });

  it('every field name of the answer alone', () => {
    for (const name of ZWD_ANSWER_FIELD_NAMES) {
      for (const shape of [rows([name]), columns([name])])
        expect(writtenBytes(gpsLike, shape).equals(referenceBytes(gpsLike, shape))).toBe(true);
    }
  });

  it('warnings with non-ASCII text, quotes, backslashes, control characters and a lone surrogate come out as JSON.stringify + UTF-8', () => {
    const r: ZwdEstimationResult = {
      ...gpsLike,
      warnings: [...gpsLike.warnings, { code: 'met-missing', text: 'Δt ≥ 30 s, "quoted" \\ back\nline \u0001 \ud800 😀' }],
    } as ZwdEstimationResult;
    for (const shape of [rows(), columns()]) {
      const bytes = writtenBytes(r, shape);
      expect(bytes.equals(shape.shape === 'rows' ? referenceRowsBytes(r) : referenceBytes(r, shape))).toBe(true);
      expect((JSON.parse(bytes.toString('utf8')) as { warnings: string[] }).warnings.at(-1)).toBe(r.warnings.at(-1)!.text);
    }
  });

  it('an answer without rows in any table', () => {
    const empty = {
      ...gpsLike,
      estimate: { ...gpsLike.estimate, zwdNodes: [], gradientNodes: [], epochs: [], rejected: [] },
      epochZwd: [],
      epochMet: [],
    } as ZwdEstimationResult;
    expectSameBytesInEveryShape(empty);
  });

  it('the bytes own their buffer exactly (the worker moves them instead of copying)', () => {
    for (const shape of [rows(), columns()]) {
      const { bytes } = zwdEstimatesAnswer(gpsLike, shape);
      expect([bytes.byteOffset, bytes.byteLength]).toEqual([0, bytes.buffer.byteLength]);
    }
  });
});

describe('byte for byte over random results (fast-check)', () => {
  const result = anyZwdEstimationResult(estimatedDay({ durationS: 3600, grossErrors: 0 }));
  const anyShape = fc
    .record({
      shape: fc.constant('columns' as const),
      fields: fc.option(fc.array(fc.constantFrom(...ZWD_ANSWER_FIELD_NAMES), { minLength: 1, maxLength: 6 }), { nil: undefined }),
    })
    .map((s): AnswerShape => ({ ...s, format: 'json' }));

  it('columns, with and without fields', () => {
    fc.assert(
      fc.property(result, anyShape, (r, shape) => {
        expect(writtenBytes(r, shape).equals(referenceBytes(r, shape))).toBe(true);
      }),
      { numRuns: 400 },
    );
  });

  // The epochs of a columns answer are written as bytes from their milliseconds (writeIsoEpochAscii), the
  // reference makes isoEpochText's string: the same text for any epoch a Date holds (source: ECMA-262
  // Date Time String Format; before 1970 and from year 10000 on, and fractional milliseconds, take
  // toISOString in both).
  it('columns: epochs before 1970, from year 10000 on, with fractional milliseconds', () => {
    const anyEpoch = fc.oneof(
      fc.integer({ min: -8.64e15, max: 8.64e15 }),
      fc.double({ min: -8.64e15, max: 8.64e15, noNaN: true }),
      fc.integer({ min: -62_198_755_200_000, max: 0 }), // years 0..1970
      fc.integer({ min: 253_402_300_799_000, max: 253_402_300_801_000 }), // around 10000-01-01
    );
    const withEpochs = <T extends { epochMs: number }>(list: T[], epochs: number[]) =>
      list.map((x, i) => ({ ...x, epochMs: epochs[i % epochs.length]! }));
    fc.assert(
      fc.property(result, fc.array(anyEpoch, { minLength: 1, maxLength: 20 }), anyShape, (r, epochs, shape) => {
        const e = r.estimate;
        const moved = {
          ...r,
          estimate: {
            ...e,
            epochs: withEpochs(e.epochs, epochs),
            zwdNodes: withEpochs(e.zwdNodes, epochs),
            gradientNodes: withEpochs(e.gradientNodes, epochs),
            rejected: withEpochs(e.rejected, epochs),
          },
        };
        expect(writtenBytes(moved, shape).equals(referenceBytes(moved, shape))).toBe(true);
      }),
      { numRuns: 300 },
    );
  });

  it('rows: the UTF-8 of JSON.stringify of the answer objects, ASCII or not', () => {
    fc.assert(
      fc.property(result, (r) => {
        expect(writtenBytes(r, rows()).equals(referenceRowsBytes(r))).toBe(true);
      }),
      { numRuns: 300 },
    );
  });
});
