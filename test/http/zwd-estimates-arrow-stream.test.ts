/**
 * The Arrow answer of POST /v1/zwd-estimates written without apache-arrow's Table (src/http/arrow-columns-stream.ts,
 * a speed change: the bytes of the path before it are the test), against apache-arrow's own writer (tableToIPC of
 * tableFromArrays, the library's implementation of the Arrow IPC streaming format, which the answer was made with
 * before): byte for byte the stream tableToIPC writes of the columns the reference answer (the answer objects +
 * tableAnswer) hands tableFromArrays, given the same dictionary ids (tableFromArrays takes them from a counter of
 * the library, so two runs of the old path differ in them; test/http/zwd-estimates-arrow.test.ts compares the
 * decoded answers with the old path's as they are). Both benchmark days, with and without gradients, met partial,
 * every `fields` selection, random results (fast-check); the writer alone on columns with nulls, texts of any kind
 * and row counts at the validity bitmap's block edges; and pyarrow as an independent reader when it is installed
 * (Debian's python3-pyarrow; skipped without it).
 */

import { execFileSync } from 'node:child_process';
import {
  DataType,
  Dictionary,
  Int32,
  Table,
  Utf8,
  tableFromArrays,
  tableFromIPC,
  tableToIPC,
  vectorFromArray,
  type Vector,
} from 'apache-arrow';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { zwdEstimatesArrowAnswer } from '../../src/http/adapters/zwd-estimates-arrow.js';
import { zwdEstimatesResponseOf } from '../../src/http/adapters/zwd-estimation.js';
import type { AnswerShape } from '../../src/http/answer-shape.js';
import { arrowColumnOf, arrowColumnsStream, type ArrowColumn, type CellValue } from '../../src/http/arrow-columns-stream.js';
import { ZWD_ANSWER_FIELD_NAMES, ZWD_ANSWER_TABLES } from '../../src/http/schemas/zwd-estimates.js';
import { isoEpochText, ISO_EPOCH_MAX_BYTES, writeIsoEpochAscii } from '../../src/formats/iso-epoch-text.js';
import { tableAnswer } from '../../src/http/table-answer.js';
import type { ZwdEstimationResult } from '../../src/services/zwd-estimation.js';
import { anyZwdEstimationResult } from '../helpers/estimation-result-arbitrary.js';
import { estimatedDay, metRecords } from '../helpers/estimated-day.js';

const arrow = (fields?: string[]): AnswerShape => ({ shape: 'rows', format: 'arrow', fields });

type PlainColumn = Float64Array | (number | string | null)[];

/** The dictionary id of each text field of a stream. */
const dictionaryIds = (bytes: Uint8Array) =>
  new Map(tableFromIPC(bytes).schema.fields.flatMap((f) => (DataType.isDictionary(f.type) ? [[f.name, f.type.id] as const] : [])));

/**
 * tableToIPC(tableFromArrays(columns)) with `answer` in the metadata, the text columns given the dictionary ids
 * `ids` (tableFromArrays is vectorFromArray per column and a Table of the vectors; a text column's type is the
 * Dictionary<Int32, Utf8> inferType gives, here with its id stated).
 */
function tableToIpcOf(columns: Record<string, PlainColumn>, answer: string, ids: Map<string, number>): Uint8Array {
  const vectors: Record<string, Vector> = {};
  for (const [name, values] of Object.entries(columns)) {
    const id = ids.get(name);
    const type = id === undefined ? undefined : new Dictionary(new Utf8(), new Int32(), id);
    vectors[name] = type ? vectorFromArray(values as (string | null)[], type) : vectorFromArray(values);
  }
  const table = new Table(vectors);
  table.schema.metadata.set('answer', answer);
  return tableToIPC(table, 'stream');
}

/** The columns the reference answer handed tableFromArrays, read back: a field not nullable as a Float64Array, else values and nulls. */
function columnsOf(bytes: Uint8Array): { columns: Record<string, PlainColumn>; answer: string } {
  const table = tableFromIPC(bytes);
  const columns: Record<string, PlainColumn> = {};
  for (const field of table.schema.fields) {
    const vector = table.getChild(field.name)!;
    columns[field.name] = field.nullable ? ([...vector] as (number | string | null)[]) : (vector.toArray() as Float64Array);
  }
  return { columns, answer: table.schema.metadata.get('answer')! };
}

const sameBytes = (a: Uint8Array, b: Uint8Array) => a.byteLength === b.byteLength && Buffer.from(a).equals(Buffer.from(b));

/** The answer written from the result is the stream tableToIPC writes of the reference answer's columns (same ids). */
function expectReferenceBytes(r: ZwdEstimationResult, shape: AnswerShape): void {
  const written = zwdEstimatesArrowAnswer(r, shape).bytes;
  const { columns, answer } = columnsOf(tableAnswer(zwdEstimatesResponseOf(r), ZWD_ANSWER_TABLES, shape).bytes);
  expect(sameBytes(written, tableToIpcOf(columns, answer, dictionaryIds(written)))).toBe(true);
}

/** Selections of `fields`: series fields, other tables' fields, a repeat, text fields only. */
const SELECTIONS: (string[] | undefined)[] = [
  undefined,
  ['zwd_m', 'sigma_m'],
  ['pwv_mm', 'epoch', 'met'],
  ['ztd_m', 'zwd_nodes.sigma_m', 'rejected.satellite', 'gradient_nodes.north_m'],
  ['zwd_m', 'zwd_m', 'tm_k'],
  ['zhd_source', 'epoch'],
];

describe('the Arrow answer: the bytes tableToIPC writes of the reference answer columns', () => {
  const gpsLike = estimatedDay({});

  it('GPS-like day (gradients, rejections, no met), every selection and every field alone', () => {
    for (const fields of SELECTIONS) expectReferenceBytes(gpsLike, arrow(fields));
    for (const name of ZWD_ANSWER_FIELD_NAMES) expectReferenceBytes(gpsLike, arrow([name]));
  });

  it('without gradients (columns of nulls only), and with met over part of the day (numbers with nulls)', () => {
    const noGradients = estimatedDay({}, { options: { gradients: null } });
    const withMet = estimatedDay({}, { met: metRecords(gpsLike.estimate.epochs[0]!.epochMs - 300_000) });
    const read = tableFromIPC(zwdEstimatesArrowAnswer(withMet, arrow()).bytes);
    expect(read.getChild('pwv_mm')!.nullCount).toBeGreaterThan(0);
    expect(tableFromIPC(zwdEstimatesArrowAnswer(noGradients, arrow()).bytes).getChild('north_gradient_m')!.nullCount).toBe(
      noGradients.estimate.epochs.length,
    );
    for (const r of [noGradients, withMet]) for (const fields of SELECTIONS) expectReferenceBytes(r, arrow(fields));
  });

  it('four-constellation day', () => {
    const r = estimatedDay({ constellations: ['gps', 'glonass', 'galileo', 'beidou'], grossErrors: 100 });
    for (const fields of [undefined, ['epoch', 'zwd_m', 'rejected.satellite']]) expectReferenceBytes(r, arrow(fields));
  });

  it('over random results with rows (fast-check): numbers of every kind, nulls, any text, repeated epochs', () => {
    const result = anyZwdEstimationResult(gpsLike).filter((r) => r.estimate.epochs.length > 0);
    const anyFields = fc.option(fc.array(fc.constantFrom(...ZWD_ANSWER_FIELD_NAMES), { minLength: 1, maxLength: 5 }), { nil: undefined });
    fc.assert(
      fc.property(result, anyFields, (r, fields) => expectReferenceBytes(r, arrow(fields))),
      { numRuns: 300 },
    );
  });

  it('epochs repeated, out of order, in fractions of a millisecond, before 1970 and after 9999 (fast-check): one text each', () => {
    // Epochs one whole millisecond apart or less: toISOString writes the whole milliseconds (Date's TimeClip).
    const near = [0, -0.5, 0.5, 999.9, 1000, 1000.2, 1e12, 1e12 + 0.3, 1e12 - 0.3, -1e12];
    const anyEpochMs = fc.constantFrom(...near, 253_402_300_800_000, 8.64e15, -8.64e15);
    const withEpochs = (epochMs: number[]) =>
      ({
        ...gpsLike,
        estimate: { ...gpsLike.estimate, epochs: epochMs.map((ms, k) => ({ ...gpsLike.estimate.epochs[k]!, epochMs: ms })) },
        epochZwd: gpsLike.epochZwd.slice(0, epochMs.length),
      }) as ZwdEstimationResult;
    fc.assert(
      fc.property(fc.array(anyEpochMs, { minLength: 1, maxLength: 40 }), (epochMs) => {
        expectReferenceBytes(withEpochs(epochMs), arrow(['epoch', 'zwd_m']));
      }),
      { numRuns: 300 },
    );
  });

  it('takes one dictionary id per text column from apache-arrow, as tableFromArrays did: the next type gets the next id', () => {
    const ids = [...dictionaryIds(zwdEstimatesArrowAnswer(gpsLike, arrow(['epoch', 'zwd_m', 'zhd_source'])).bytes).values()];
    expect(ids).toHaveLength(2);
    expect(ids[1]).toBe(ids[0]! + 1);
    expect(new Dictionary(new Utf8(), new Int32()).id).toBe(ids[1]! + 1);
  });
});

/** The stream of plain columns (as the adapters hand them to tableFromArrays) through arrowColumnOf and arrowColumnsStream. */
function writtenStream(columns: Record<string, PlainColumn>, answer: string): Uint8Array {
  const n = Object.values(columns)[0]!.length;
  const direct = new Map<string, ArrowColumn>();
  for (const [name, values] of Object.entries(columns)) {
    const column = arrowColumnOf(n, (k) => values[k] as CellValue);
    if (column === undefined || column === 'absent') throw new Error(`${name}: not written directly`);
    direct.set(name, column);
  }
  return arrowColumnsStream(direct, n, answer);
}

/** A column as the adapters hand it to tableFromArrays: numbers only as a Float64Array, any other as it is. */
const handed = (values: PlainColumn): PlainColumn =>
  !(values instanceof Float64Array) && values.every((v) => typeof v === 'number') ? Float64Array.from(values as number[]) : values;

function expectTableToIpcBytes(given: Record<string, PlainColumn>, answer = '{"x":1}'): void {
  const columns = Object.fromEntries(Object.entries(given).map(([name, values]) => [name, handed(values)]));
  const written = writtenStream(columns, answer);
  expect(sameBytes(written, tableToIpcOf(columns, answer, dictionaryIds(written)))).toBe(true);
}

describe('arrowColumnsStream: tableToIPC(tableFromArrays(columns)) byte for byte', () => {
  it('row counts at the edges of the validity bitmap blocks (64 bytes), with nulls in texts and numbers', () => {
    for (const n of [1, 7, 8, 9, 63, 64, 65, 511, 512, 513, 520, 1000]) {
      const text = Array.from({ length: n }, (_, k) => (k % 5 === 3 ? null : `G${k % 7}`));
      const numbers = Array.from({ length: n }, (_, k) => (k % 4 === 1 ? null : k / 3));
      const plain = Float64Array.from({ length: n }, (_, k) => -k * 1e-3);
      expectTableToIpcBytes({ text, numbers, plain, epoch: Array.from({ length: n }, (_, k) => `2026-01-01T00:${k}`) });
    }
  });

  it('nulls only, nulls before the first text, -0, NaN, ±Infinity, the smallest subnormal', () => {
    expectTableToIpcBytes({
      nothing: [null, null, null],
      late: [null, null, 'met'],
      odd: [-0, NaN, null],
      far: Float64Array.from([Infinity, -Infinity, 5e-324]),
    });
  });

  it('texts of any kind: non-ASCII, empty, a lone surrogate at the end of one text and the start of the next', () => {
    expectTableToIpcBytes({ a: ['\ud800', '\udc00', 'é', '', '\ufeffG01', '𝔾', null, '\ud800'], b: ['', '', '', '', '', '', '', ''] });
  });

  it('random columns (fast-check): numbers and nulls, texts and nulls, numbers only', () => {
    const anyText = fc.oneof(fc.string({ maxLength: 4 }), fc.string({ unit: 'binary', maxLength: 3 }), fc.constantFrom('met', 'missing'));
    const anyNumber = fc.oneof(fc.double(), fc.integer());
    const column = (n: number) =>
      fc.oneof(
        fc.array(fc.option(anyNumber, { nil: null }), { minLength: n, maxLength: n }),
        fc.array(fc.option(anyText, { nil: null }), { minLength: n, maxLength: n }),
        fc.array(anyNumber, { minLength: n, maxLength: n }),
      );
    const table = fc
      .integer({ min: 1, max: 150 })
      .chain((n) => fc.dictionary(fc.constantFrom('a', 'b', 'c', 'd', 'e'), column(n), { minKeys: 1 }));
    fc.assert(
      fc.property(table, (columns) => expectTableToIpcBytes(columns)), // a column of nulls only is float64 to both
      { numRuns: 300 },
    );
  });

  it('declines what it does not write (numbers mixed with texts, other values), leaves out a field no row has', () => {
    expect(arrowColumnOf(3, (k) => [1, 'G01', null][k] as CellValue)).toBeUndefined();
    expect(arrowColumnOf(3, (k) => ['G01', null, 2][k] as CellValue)).toBeUndefined();
    expect(arrowColumnOf(2, (k) => [true, false][k] as unknown as CellValue)).toBeUndefined();
    expect(arrowColumnOf(2, () => undefined)).toBe('absent');
    expect(arrowColumnOf(2, (k) => [undefined, null][k])).not.toBe('absent');
  });

  it('an answer with a text column decodes to the same columns and metadata as tableFromArrays + tableToIPC', () => {
    const columns = { epoch: ['2026-01-01T00:00:00.000Z', '2026-01-01T00:05:00.000Z'], zwd_m: Float64Array.from([0.12, 0.13]) };
    const read = tableFromIPC(writtenStream(columns, '{"warnings":[]}'));
    const reference = tableFromArrays(columns) as Table;
    expect(read.schema.fields.map((f) => [f.name, String(f.type), f.nullable])).toEqual(
      reference.schema.fields.map((f) => [f.name, String(f.type), f.nullable]),
    );
    expect([...read.getChild('epoch')!]).toEqual(columns.epoch);
    expect(read.schema.metadata.get('answer')).toBe('{"warnings":[]}');
  });
});

describe('writeIsoEpochAscii (the epochs of the Arrow answer as bytes): the bytes of isoEpochText', () => {
  const bytesOf = (ms: number) => {
    const out = new Uint8Array(ISO_EPOCH_MAX_BYTES + 3).fill(0x7e);
    const end = writeIsoEpochAscii(ms, out, 3);
    return Buffer.from(out.subarray(3, end));
  };
  it('whole and fractional milliseconds from before 1970 to the largest date, then the RangeError of an invalid one', () => {
    const anyMs = fc.oneof(
      fc.integer({ min: 0, max: 253_402_300_799_999 }),
      fc.integer({ min: -8.64e15, max: 8.64e15 }),
      fc.double({ min: -8.64e15, max: 8.64e15, noNaN: true }),
      fc.constantFrom(0, -0, 86_399_999, 86_400_000, 253_402_300_799_999, 253_402_300_800_000, 8.64e15, -8.64e15, 1e12 + 0.5),
    );
    fc.assert(
      fc.property(anyMs, (ms) => {
        expect(bytesOf(ms).toString('latin1')).toBe(isoEpochText(ms));
      }),
      { numRuns: 5000 },
    );
    for (const ms of [NaN, Infinity, 8.64e15 + 1]) expect(() => bytesOf(ms)).toThrow(RangeError);
  });
});

/** Whether python3 with pyarrow is installed (Debian's python3-pyarrow). */
function hasPyarrow(): boolean {
  try {
    execFileSync('python3', ['-c', 'import pyarrow'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

/** pyarrow's reading of a stream: per field its name, type text and nullability, the columns as lists, the metadata. */
const PYARROW_READ = `
import sys, json, pyarrow.ipc as ipc
table = ipc.open_stream(sys.stdin.buffer.read()).read_all()
print(json.dumps({
  "fields": [[f.name, str(f.type), f.nullable] for f in table.schema],
  "columns": {name: table.column(name).to_pylist() for name in table.column_names},
  "answer": table.schema.metadata[b"answer"].decode("utf-8"),
}))
`;

describe.skipIf(!hasPyarrow())('pyarrow as an independent reader (Debian python3-pyarrow)', () => {
  it('the GPS-like day with met over part of the day: the types, nulls, values and metadata apache-arrow reads', () => {
    const gpsLike = estimatedDay({});
    const r = estimatedDay({}, { met: metRecords(gpsLike.estimate.epochs[0]!.epochMs - 300_000) });
    const bytes = zwdEstimatesArrowAnswer(r, arrow()).bytes;
    const read = JSON.parse(
      execFileSync('python3', ['-c', PYARROW_READ], { input: bytes, maxBuffer: 64 * 1024 * 1024 }).toString('utf8'),
    ) as {
      fields: [string, string, boolean][];
      columns: Record<string, unknown[]>;
      answer: string;
    };
    const table = tableFromIPC(bytes);
    const pyarrowType = (type: DataType) =>
      DataType.isDictionary(type) ? 'dictionary<values=string, indices=int32, ordered=0>' : 'double';
    expect(read.fields).toEqual(table.schema.fields.map((f) => [f.name, pyarrowType(f.type), f.nullable]));
    for (const f of table.schema.fields) expect(read.columns[f.name]).toEqual([...table.getChild(f.name)!]);
    expect(read.answer).toBe(table.schema.metadata.get('answer'));
  });
});
