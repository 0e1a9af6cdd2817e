/**
 * Arrow requests of float64 columns read without a Table (readArrowRequest with `typed`, src/http/answer-shape.ts)
 * against apache-arrow's own reader (tableFromIPC, the library's implementation of the Arrow IPC streaming format;
 * pyarrow is not installed here, common practice): the same columns, values and request metadata; every other
 * stream (nulls, integers, several batches, text, repeated names, not Arrow at all) read as before, its errors
 * worded as before.
 */

import { Table, tableFromArrays, tableFromIPC, tableToIPC, vectorFromArray } from 'apache-arrow';
import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { readArrowRequest } from '../../src/http/answer-shape.js';
import { FormatError } from '../../src/formats/format-error.js';

const uniform = mulberry32(1414);
const column = (n: number) => Float64Array.from({ length: n }, () => (uniform() - 0.5) * 1e3);
const withRequest = (table: Table, request: unknown) => {
  table.schema.metadata.set('request', JSON.stringify(request));
  return tableToIPC(table, 'stream');
};

/** What apache-arrow's reader gives: each column's values (nulls as null), and the parsed metadata "request". */
function reference(bytes: Uint8Array) {
  const table = tableFromIPC(bytes);
  const columns = Object.fromEntries(
    table.schema.fields.map((f) => [f.name, [...table.getChild(f.name)!].map((v) => (typeof v === 'bigint' ? Number(v) : v))]),
  );
  return { columns, rest: JSON.parse(table.schema.metadata.get('request') ?? '{}') as unknown };
}

const plain = (columns: Record<string, ArrayLike<unknown>>) =>
  Object.fromEntries(Object.entries(columns).map(([k, v]) => [k, Array.from(v)]));

describe('readArrowRequest (typed) against apache-arrow tableFromIPC', () => {
  it('float64 columns of 10 000 rows: Float64Arrays of the same values, the same request', () => {
    const elevation = column(10_000);
    const azimuth = column(10_000);
    const bytes = withRequest(tableFromArrays({ elevation_deg: elevation, azimuth_deg: azimuth }) as Table, { site: { height_m: 3 } });
    const read = readArrowRequest(bytes, true);
    expect(read.columns.elevation_deg).toBeInstanceOf(Float64Array);
    expect(read.columns.elevation_deg).toEqual(elevation);
    expect(plain(read.columns)).toEqual(reference(bytes).columns);
    expect(read.rest).toEqual({ site: { height_m: 3 } });
  });

  it('the columns are views of the request bytes (no copy) when the body is 8-byte aligned', () => {
    const bytes = withRequest(tableFromArrays({ x: column(100) }) as Table, {});
    expect((readArrowRequest(bytes, true).columns.x as Float64Array).buffer).toBe(bytes.buffer);
  });

  it('nulls, integers, text, several batches and repeated names are read as before', () => {
    const streams = [
      new Table({ x: vectorFromArray([1.5, null, 3]), y: vectorFromArray([1, 2, 3]) }),
      tableFromArrays({ id: ['G01', 'E11'], x: Float64Array.from([1, 2]) }) as Table,
      tableFromArrays({ x: Int32Array.from([4, 5, 6]) }) as Table,
      (tableFromArrays({ x: column(3) }) as Table).concat(tableFromArrays({ x: column(4) }) as Table),
    ].map((t) => withRequest(t, { n: 1 }));
    for (const bytes of streams) expect(plain(readArrowRequest(bytes, true).columns)).toEqual(reference(bytes).columns);
  });

  it('bytes that are not an Arrow stream: the FormatError of apache-arrow’s reader, as before', () => {
    const garbage = new TextEncoder().encode('{"site": {}}');
    let expected = '';
    try {
      tableFromIPC(garbage);
    } catch (err) {
      expected = `not an Arrow IPC stream (${(err as Error).message})`;
    }
    expect(expected).not.toBe('');
    expect(() => readArrowRequest(garbage, true)).toThrow(expected);
    expect(() => readArrowRequest(garbage, true)).toThrow(FormatError);
    const truncated = withRequest(tableFromArrays({ x: column(1000) }) as Table, {}).subarray(0, 2000);
    expect(() => readArrowRequest(truncated, true)).toThrow(FormatError);
  });
});
