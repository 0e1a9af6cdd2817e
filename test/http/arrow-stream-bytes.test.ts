/**
 * The Arrow answers' IPC stream written into one buffer (ipcStreamBytes, src/http/answer-shape.ts) against
 * apache-arrow's own stream writer (tableToIPC, the library's reference implementation of the Arrow columnar
 * format's "IPC Streaming Format"): the same bytes, for the slant answer's float64 columns with the answer in
 * the schema metadata, and for a table with text, nulls, integers and several record batches; and read back
 * by apache-arrow's reader (tableFromIPC, RecordBatchStreamReader) to the same values. pyarrow is not
 * installed here; the reader of the library is the independent reader available (common practice). A buffer
 * handed back (releasePooledBytes) is reused, and the answer written into it is still tableToIPC's bytes, its
 * padding zeroed over what the buffer held before.
 */

import { describe, expect, it } from 'vitest';
import { RecordBatchStreamReader, Table, tableFromArrays, tableFromIPC, tableToIPC, vectorFromArray } from 'apache-arrow';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { arrowAnswer, ipcStreamBytes, pooledBytes, releasePooledBytes } from '../../src/http/answer-shape.js';

const uniform = mulberry32(2014);
const column = (n: number, scale: number) => Float64Array.from({ length: n }, () => (uniform() - 0.3) * scale);

describe('ipcStreamBytes against apache-arrow tableToIPC (the Arrow IPC streaming format)', () => {
  it('float64 columns of a 10 000-direction answer with the answer in the metadata: the same bytes', () => {
    const columns = { elevation_deg: column(10_000, 90), mapping_wet: column(10_000, 10), total_m: column(10_000, 30) };
    const table = tableFromArrays(columns) as Table;
    table.schema.metadata.set('answer', JSON.stringify({ warnings: ['é'], provenance: { zhd: 'x' } }));
    const bytes = ipcStreamBytes(table);
    expect(Buffer.from(bytes).equals(Buffer.from(tableToIPC(table, 'stream')))).toBe(true);
    const read = tableFromIPC(bytes);
    expect(read.numRows).toBe(10_000);
    expect(read.getChild('total_m')!.toArray()).toEqual(columns.total_m);
    expect(JSON.parse(read.schema.metadata.get('answer')!)).toEqual({ warnings: ['é'], provenance: { zhd: 'x' } });
  });

  it('text, nulls, integers, odd lengths and two record batches: the same bytes, read back batch by batch', () => {
    const first = tableFromArrays({ id: ['G01', 'E05', 'C19'], x: Float64Array.from([1.5, -2, 3]) }) as Table;
    const second = new Table({
      id: vectorFromArray(['R07', null, 'J02', 'G32', 'E11']),
      x: vectorFromArray([0.25, null, 7, 8, 9]),
    });
    const table = first.concat(second);
    table.schema.metadata.set('answer', '{}');
    const bytes = ipcStreamBytes(table);
    expect(Buffer.from(bytes).equals(Buffer.from(tableToIPC(table, 'stream')))).toBe(true);
    const batches = [...RecordBatchStreamReader.from(bytes)];
    expect(batches.map((b) => b.numRows)).toEqual([3, 5]);
    expect([...tableFromIPC(bytes).getChild('id')!]).toEqual(['G01', 'E05', 'C19', 'R07', null, 'J02', 'G32', 'E11']);
  });

  it('an empty selection of rows: the schema and the end-of-stream marker, as tableToIPC writes them', () => {
    const table = tableFromArrays({ total_m: new Float64Array(0) }) as Table;
    expect(Buffer.from(ipcStreamBytes(table)).equals(Buffer.from(tableToIPC(table, 'stream')))).toBe(true);
  });

  for (const n of [10_000, 1, 0]) {
    it(`arrowAnswer of ${n} float64 rows (written without a Table): the bytes of tableToIPC(tableFromArrays(…))`, () => {
      const columns = { elevation_deg: column(n, 90), azimuth_deg: column(n, 360), total_m: column(n, 30) };
      const rest = { zenith: { zhd_m: 2.3 }, warnings: ['ü'] };
      const reference = tableFromArrays({ total_m: columns.total_m, elevation_deg: columns.elevation_deg }) as Table;
      reference.schema.metadata.set('answer', JSON.stringify(rest));
      const bytes = arrowAnswer(columns, ['total_m', 'elevation_deg'], rest);
      expect(Buffer.from(bytes).equals(Buffer.from(tableToIPC(reference, 'stream')))).toBe(true);
      expect(tableFromIPC(bytes).getChild('total_m')!.toArray()).toEqual(columns.total_m);
    });
  }

  it('arrowAnswer of alternating sizes and selections (record batch headers kept per rows and columns): each the bytes of tableToIPC', () => {
    for (const [n, fields] of [
      [10_000, ['total_m', 'elevation_deg']],
      [3, ['total_m', 'elevation_deg']],
      [10_000, ['azimuth_deg', 'total_m', 'elevation_deg']],
      [10_000, ['elevation_deg', 'azimuth_deg']],
      [3, ['azimuth_deg']],
      [10_000, ['total_m', 'elevation_deg']],
    ] as const) {
      const columns = { elevation_deg: column(n, 90), azimuth_deg: column(n, 360), total_m: column(n, 30) };
      const reference = tableFromArrays(Object.fromEntries(fields.map((f) => [f, columns[f]]))) as Table;
      reference.schema.metadata.set('answer', JSON.stringify({ n }));
      const bytes = arrowAnswer(columns, fields, { n });
      expect(Buffer.from(bytes).equals(Buffer.from(tableToIPC(reference, 'stream'))), `${n} rows, ${fields.join(', ')}`).toBe(true);
    }
  });

  it('arrowAnswer: the selected fields in the caller order, the rest of the answer in the metadata "answer"', () => {
    const columns = { a: column(7, 1), b: column(7, 1), c: column(7, 1) };
    const read = tableFromIPC(arrowAnswer(columns, ['c', 'a'], { zenith: { ztd_m: 2.4 } }));
    expect(read.schema.fields.map((f) => f.name)).toEqual(['c', 'a']);
    expect(read.getChild('c')!.toArray()).toEqual(columns.c);
    expect(JSON.parse(read.schema.metadata.get('answer')!)).toEqual({ zenith: { ztd_m: 2.4 } });
  });

  it('a released answer buffer is reused, and the answer written into it is still the bytes of tableToIPC', () => {
    const big = tableFromArrays({ a: Float64Array.from({ length: 9000 }, (_, i) => i - 0.5), b: new Float64Array(9000).fill(-1) }) as Table;
    // Buffers released by an earlier test of this file would be reused before the one released here: take every
    // free one (the pool keeps at most 8; pooledBytes(n) takes one of n to 4n bytes) and keep them, so that the
    // test stands alone.
    for (const size of [64 * 1024, 256 * 1024, 1024 * 1024]) for (let i = 0; i < 8; i++) pooledBytes(size);
    const first = ipcStreamBytes(big);
    releasePooledBytes(first);
    first.fill(0xff); // left over in the pooled buffer: the padding of the next answer must still be 0
    const small = tableFromArrays({
      b: Float64Array.from({ length: 5001 }, (_, i) => i / 7),
      c: Float64Array.from({ length: 5001 }, (_, i) => -i),
    }) as Table;
    small.schema.metadata.set('answer', '{"x":1}');
    const second = ipcStreamBytes(small);
    // The same memory, now with the smaller table: every byte (padding included) as tableToIPC writes it.
    expect(second.buffer === first.buffer).toBe(true);
    expect(Buffer.from(second).equals(Buffer.from(tableToIPC(small, 'stream')))).toBe(true);
    const third = ipcStreamBytes(big);
    expect(third.buffer === second.buffer).toBe(false); // still in use (not released)
    expect(Buffer.from(third).equals(Buffer.from(tableToIPC(big, 'stream')))).toBe(true);
  });

  it('answers under 64 kB are not pooled: each takes a buffer of its own size', () => {
    const small = tableFromArrays({ total_m: column(100, 30) }) as Table;
    const first = ipcStreamBytes(small);
    expect(first.buffer.byteLength).toBe(first.byteLength);
    releasePooledBytes(first);
    expect(ipcStreamBytes(small).buffer === first.buffer).toBe(false);
  });
});
