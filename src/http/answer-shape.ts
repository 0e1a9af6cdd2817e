/**
 * The shape of a batch answer, chosen by the caller: rows (an array of objects, the default), columns
 * (one array per field, rounded to the documented precision) or Apache Arrow IPC (a binary stream of the
 * same columns at full precision; pandas, polars and R read it directly), with a `fields` selection.
 *
 *   ?shape=columns&fields=elevation_deg,total_m           JSON, columns
 *   Accept: application/vnd.apache.arrow.stream          Arrow IPC stream: the rows as a table, the rest
 *                                                        of the answer as JSON in the schema metadata "answer"
 */

import {
  DataType,
  Field,
  Float64,
  Message,
  MessageReader,
  Precision,
  Schema,
  tableFromArrays,
  tableToIPC,
  tableFromIPC,
  type Table,
} from 'apache-arrow';
import { BufferRegion, FieldNode, RecordBatch as RecordBatchHeader, type DictionaryBatch } from 'apache-arrow/ipc/metadata/message';
import { VectorAssembler } from 'apache-arrow/visitor/vectorassembler';
import { isMainThread } from 'node:worker_threads';
import { z } from 'zod';
import { FormatError } from '../formats/format-error.js';
import type { JsonColumn } from '../formats/json-columns.js';
import { HttpProblem } from './problem.js';
import { strictObject } from './schemas/common.js';

export const ARROW_STREAM_TYPE = 'application/vnd.apache.arrow.stream';

/** Decimal places of each quantity in a columns answer: what the models resolve, not more (documented in the API). */
export const COLUMN_DECIMALS = {
  angleDeg: 6, // 1e-6° ≈ 0.1 m of arc at a satellite's distance: far below any mapping sensitivity
  mappingFactor: 8, // 1e-8 of a factor ≤ 50 at 3°: < 1e-8 m of a 2.3 m ZHD
  delayM: 6, // 1 µm
} as const;

/** The per-row fields a batch answer can hold, each with its decimals in a columns answer (undefined: not a number). */
export type FieldDecimals = Record<string, number | undefined>;

export interface AnswerShape {
  shape: 'rows' | 'columns';
  format: 'json' | 'arrow';
  /** Selected per-row fields, in the caller's order; undefined = all. */
  fields: string[] | undefined;
}

/** The query of a batch route that offers answer shapes; `fields` is checked against the route's fields by answerShapeOf. */
export const answerShapeQuery = strictObject({
  shape: z
    .enum(['rows', 'columns'], { error: 'must be one of: rows, columns' })
    .default('rows')
    .describe('rows: an array of objects (default); columns: one array per field, rounded to the documented precision'),
  fields: z
    .string()
    .max(1000)
    .optional()
    .describe('Comma-separated per-row fields to return (default: all); applies to rows, columns and Arrow answers'),
});

/** The answer shape of a request: query + Accept header; an unknown field is a 400 naming the allowed ones. */
export function answerShapeOf(query: z.output<typeof answerShapeQuery>, accept: string | undefined, known: readonly string[]): AnswerShape {
  const fields = query.fields
    ?.split(',')
    .map((f) => f.trim())
    .filter(Boolean);
  const unknown = fields?.filter((f) => !known.includes(f)) ?? [];
  if (unknown.length) {
    const message = `unknown field ${unknown.join(', ')}; the fields are ${known.join(', ')}`;
    throw new HttpProblem(400, `query.fields: ${message}`, [{ field: 'query.fields', message }]);
  }
  const format = accept?.split(',').some((t) => t.split(';')[0]!.trim().toLowerCase() === ARROW_STREAM_TYPE) ? 'arrow' : 'json';
  return { shape: query.shape, format, fields: fields?.length ? fields : undefined };
}

const round = (decimals: number) => {
  const scale = 10 ** decimals;
  return (x: number) => Math.round(x * scale) / scale;
};

/** Typed or plain columns → the selected columns, rounded per field when `decimals` is given. */
export function selectColumns(
  columns: Record<string, ArrayLike<number> | readonly unknown[]>,
  fields: readonly string[] | undefined,
  decimals?: FieldDecimals,
): Record<string, unknown[]> {
  const out: Record<string, unknown[]> = {};
  for (const name of fields ?? Object.keys(columns)) {
    const column = columns[name];
    if (!column) continue;
    const d = decimals?.[name];
    out[name] = d === undefined ? Array.from(column as ArrayLike<unknown>) : Array.from(column as ArrayLike<number>, round(d));
  }
  return out;
}

/** The selected columns with their decimals, for columnsJsonBytes (src/formats/json-columns.ts). */
export function jsonColumnsOf(
  columns: Record<string, ArrayLike<number> | readonly unknown[]>,
  fields: readonly string[] | undefined,
  decimals: FieldDecimals,
): Record<string, JsonColumn> {
  const out: Record<string, JsonColumn> = {};
  for (const name of fields ?? Object.keys(columns)) {
    const values = columns[name];
    if (values) out[name] = { values, decimals: decimals[name] };
  }
  return out;
}

/** The rows as an Arrow IPC stream; `rest` (the answer without its rows) goes into the schema metadata "answer". */
export function arrowAnswer(
  columns: Record<string, Float64Array | string[]>,
  fields: readonly string[] | undefined,
  rest: unknown,
): Uint8Array {
  const chosen: Record<string, Float64Array | string[]> = {};
  for (const name of fields ?? Object.keys(columns)) if (columns[name]) chosen[name] = columns[name];
  return arrowAnswerOfText(chosen, JSON.stringify(rest));
}

/** The columns as an Arrow IPC stream with `answer` (the rest of the answer, JSON text) in the schema metadata "answer". */
export function arrowAnswerOfText(chosen: Record<string, Float64Array | string[]>, answer: string): Uint8Array {
  const numbers = Object.values(chosen);
  if (numbers.length > 0 && numbers[0]!.length > 0 && numbers.every((c) => c instanceof Float64Array && c.length === numbers[0]!.length)) {
    return float64StreamBytes(chosen as Record<string, Float64Array>, answer);
  }
  const table = tableFromArrays(chosen) as Table;
  table.schema.metadata.set('answer', answer);
  return ipcStreamBytes(table);
}

/**
 * Float64 columns of one length (at least one row) without nulls, and the answer in the schema metadata "answer": the bytes of
 * ipcStreamBytes(tableFromArrays(columns)) (tested byte for byte against tableToIPC), without the Table, its
 * vectors and the VectorAssembler's walk over them (a sixth of an Arrow answer's CPU): the schema (each column
 * a float64 field, not nullable, as tableFromArrays makes it) and the record batch header are written by
 * apache-arrow's Message.encode; the body is, per column, an empty validity buffer and the values. (tableFromArrays
 * marks a float64 column without nulls not nullable, and an empty one nullable: the empty answer takes the Table.)
 */
function float64StreamBytes(columns: Record<string, Float64Array>, answer: string): Uint8Array {
  const names = Object.keys(columns);
  const n = columns[names[0]!]!.length;
  const schema = new Schema(
    names.map((name) => new Field(name, new Float64(), false)),
    new Map([['answer', answer]]),
  );
  const schemaMessage = Message.encode(Message.from(schema));
  const header = float64BatchHeader(n, names.length);
  return streamOf(schemaMessage, [{ header, buffers: names.map((name) => columns[name]!) }]);
}

/** Encoded record batch headers of float64BatchHeader, by rows and columns (a few batch sizes recur). */
const float64BatchHeaders = new Map<string, Uint8Array>();
const FLOAT64_BATCH_HEADERS_KEPT = 64;

/**
 * The encoded header (Message.encode) of a record batch of n rows in `count` float64 columns without nulls, each an
 * empty validity buffer and the values: a function of n and count only, so encoded once per pair (apache-arrow's
 * encoder builds each node and buffer region as a flatbuffer struct with 64-bit BigInt fields, a twentieth of an
 * Arrow answer's CPU while the service warms up). The bytes are shared: read them, never write them.
 */
function float64BatchHeader(n: number, count: number): Uint8Array {
  const key = `${n}:${count}`;
  const known = float64BatchHeaders.get(key);
  if (known) return known;
  const nodes: FieldNode[] = [];
  const regions: BufferRegion[] = [];
  let bodyLength = 0;
  for (let i = 0; i < count; i++) {
    nodes.push(new FieldNode(n, 0));
    regions.push(new BufferRegion(bodyLength, 0), new BufferRegion(bodyLength, align8(8 * n)));
    bodyLength += align8(8 * n);
  }
  const header = Message.encode(Message.from(new RecordBatchHeader(n, nodes, regions), bodyLength));
  if (float64BatchHeaders.size >= FLOAT64_BATCH_HEADERS_KEPT) float64BatchHeaders.clear();
  float64BatchHeaders.set(key, header);
  return header;
}

const CONTINUATION = -1;
/** n rounded up to a multiple of 8 (the alignment of every message and body buffer of the stream). */
export const align8 = (n: number) => (n + 7) & ~7;

/**
 * Buffers of answers and of request bodies of the a-priori batch routes, handed back once nothing reads them
 * (releasePooledBytes: an answer on the response's 'finish', when Node has handed every byte to the operating
 * system; a request body once the task on the event loop has read it, batch-body.ts) and reused by the next
 * request on this thread. V8 counts every ArrayBuffer as external memory, and counts the external memory grown
 * since the last full garbage collection against the old generation's limit: a route that allocates buffers
 * but few JavaScript objects (an Arrow request: ~0.1 MB of heap against 0.33 MB of buffers) reaches that limit
 * before the young generation fills, and each time V8 marks the whole service heap instead of a cheap
 * scavenge (issue 14; DEVELOPERS.md "Where the time goes: slant delays through HTTP"). Only sizes from
 * SMALLEST_POOLED_BYTES up to POOLED_BYTES take pooled buffers, and at most POOLED_BUFFERS free ones are
 * kept. Only the event loop pools: bytes made in a worker thread leave with their buffer (moved whole; a view
 * of a larger pooled buffer would be copied), and bytes moved to a worker are detached: releasing them does nothing.
 */
const POOLED_BYTES = 2 * 1024 * 1024;
const POOLED_BUFFERS = 8;
const freeBuffers: ArrayBuffer[] = [];
const issuedBuffers = new WeakSet<ArrayBuffer>();

/** Sizes smaller than this are not pooled (their buffers cost little; a pooled one would be mostly unused). */
const SMALLEST_POOLED_BYTES = 64 * 1024;

/**
 * size bytes of undefined content (what an earlier user left): from the pool when one of its buffers fits (at
 * most 4× larger), else new. Hand them back with releasePooledBytes once nothing reads them, or simply drop them.
 */
export function pooledBytes(size: number): Uint8Array<ArrayBuffer> {
  if (!isMainThread || size < SMALLEST_POOLED_BYTES || size > POOLED_BYTES) return new Uint8Array(size);
  const i = freeBuffers.findIndex((b) => b.byteLength >= size && b.byteLength <= 4 * size);
  if (i >= 0) return new Uint8Array(freeBuffers.splice(i, 1)[0]!, 0, size);
  const fresh = new ArrayBuffer(size);
  issuedBuffers.add(fresh);
  return new Uint8Array(fresh);
}

/**
 * Hands the buffer of bytes from pooledBytes (an answer made by ipcStreamBytes, or a body read by readBatchBodies)
 * back to the pool. Call it only once nothing reads the bytes any more; bytes of any other origin, and moved
 * (detached) buffers, are ignored.
 */
export function releasePooledBytes(bytes: Uint8Array): void {
  const buffer = bytes.buffer;
  if (!(buffer instanceof ArrayBuffer) || !issuedBuffers.has(buffer) || buffer.byteLength === 0) return;
  if (freeBuffers.length < POOLED_BUFFERS && !freeBuffers.includes(buffer)) freeBuffers.push(buffer);
}

/**
 * tableToIPC(table, 'stream'), byte for byte, written into one buffer of its exact size: the messages are
 * encoded by apache-arrow itself (Message.encode of the schema and of each record batch's header, the body
 * laid out by its VectorAssembler), only the stream writer's chunk queue and the join of its chunks are left
 * out (a tenth of a 10 000-direction Arrow answer's CPU). The stream, as the writer writes it (Arrow columnar
 * format, "Encapsulated message format" and "IPC Streaming Format"): per message the continuation marker
 * 0xFFFFFFFF, the metadata size, the flatbuffer padded to 8 bytes, then the body buffers each padded to 8;
 * the end-of-stream marker 0xFFFFFFFF 0x00000000. Tables with dictionaries take tableToIPC. The bytes may be a
 * view of a pooled buffer: hand them back with releasePooledBytes once sent, or simply drop them.
 */
export function ipcStreamBytes(table: Table): Uint8Array {
  if (table.batches.some((batch) => batch.dictionaries.size > 0)) return tableToIPC(table, 'stream');
  const schema = Message.encode(Message.from(table.schema));
  const batches = table.batches.map((batch) => {
    const body = VectorAssembler.assemble(batch);
    const header = Message.encode(Message.from(new RecordBatchHeader(batch.numRows, body.nodes, body.bufferRegions), body.byteLength));
    return { header, buffers: body.buffers };
  });
  return streamOf(schema, batches);
}

/** A message of the stream after the schema (a dictionary or record batch): its encoded header and its body buffers. */
export interface StreamMessage {
  header: Uint8Array;
  buffers: ArrayBufferView[];
}

/**
 * The stream of an encoded schema message and the messages after it (encoded header, body buffers), in one buffer
 * (from the answer pool, as ipcStreamBytes' answers).
 */
export function streamOf(schema: Uint8Array, batches: StreamMessage[]): Uint8Array {
  let size = align8(8 + schema.byteLength) + 8; // the schema message and the end-of-stream marker
  for (const { header, buffers } of batches) {
    size += align8(8 + header.byteLength);
    for (const buffer of buffers) size += align8(buffer.byteLength);
  }
  // A pooled buffer holds an earlier answer's bytes: each piece is written with its padding set to 0.
  const bytes = pooledBytes(size);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let at = 0;
  const padded = (piece: Uint8Array, from: number, end: number) => {
    bytes.set(piece, from);
    bytes.fill(0, from + piece.byteLength, end);
  };
  const message = (flatbuffer: Uint8Array) => {
    const aligned = align8(8 + flatbuffer.byteLength);
    view.setInt32(at, CONTINUATION, true);
    view.setInt32(at + 4, aligned - 8, true);
    padded(flatbuffer, at + 8, at + aligned);
    at += aligned;
  };
  message(schema);
  for (const { header, buffers } of batches) {
    message(header);
    for (const buffer of buffers) {
      padded(new Uint8Array(buffer.buffer, buffer.byteOffset, buffer.byteLength), at, at + align8(buffer.byteLength));
      at += align8(buffer.byteLength);
    }
  }
  view.setInt32(at, CONTINUATION, true); // end of stream: the marker and a metadata size of 0
  view.setInt32(at + 4, 0, true);
  return bytes;
}

/** An Arrow column as a Float64Array when it is a number column without nulls (no copy for float64), else undefined. */
function typedNumberColumn(vector: { nullCount: number; toArray(): unknown }): Float64Array | undefined {
  if (vector.nullCount > 0) return undefined;
  const values = vector.toArray();
  if (values instanceof Float64Array) return values;
  if (values instanceof BigInt64Array || values instanceof BigUint64Array) return Float64Array.from(values, Number);
  // Float16 columns come as raw Uint16Array halves: left to the element-wise path.
  const exact = [Float32Array, Int32Array, Int16Array, Int8Array, Uint32Array, Uint8Array];
  if (exact.some((T) => values instanceof T)) return Float64Array.from(values as ArrayLike<number>);
  return undefined;
}

/** Every column of an Arrow IPC stream through apache-arrow's Table (typed: number columns without nulls as Float64Arrays). */
function tableColumns(
  bytes: Uint8Array,
  typed: boolean,
): { columns: Record<string, unknown[] | Float64Array>; metadata: Map<string, string> } {
  let table: Table;
  try {
    table = tableFromIPC(bytes);
  } catch (err) {
    throw new FormatError('body', `not an Arrow IPC stream (${err instanceof Error ? err.message : String(err)})`);
  }
  const columns: Record<string, unknown[] | Float64Array> = {};
  for (const field of table.schema.fields) {
    const vector = table.getChild(field.name)!;
    const asTyped = typed ? typedNumberColumn(vector) : undefined;
    columns[field.name] =
      asTyped ??
      Array.from(vector.nullCount > 0 ? [...vector] : (vector.toArray() as ArrayLike<unknown>), (v) =>
        typeof v === 'bigint' ? Number(v) : v,
      );
  }
  return { columns, metadata: table.schema.metadata };
}

/** How a column of a directly read stream is laid out (Arrow columnar format, "Buffer Layouts"). */
type DirectColumn = 'float64' | 'utf8' | 'dictionary';

/** The layout of a field the direct reader takes, or undefined (the general reader takes the stream). */
function directColumnOf(type: DataType): DirectColumn | undefined {
  if (DataType.isFloat(type) && type.precision === Precision.DOUBLE) return 'float64';
  if (DataType.isUtf8(type)) return 'utf8';
  if (DataType.isDictionary(type) && DataType.isUtf8(type.dictionary) && type.indices.bitWidth === 32 && type.indices.isSigned)
    return 'dictionary';
  return undefined;
}

/** Whether bytes[start, end) hold ASCII only (then latin1 decodes them as UTF-8 does). */
function isAscii(bytes: Uint8Array, start: number, end: number): boolean {
  for (let i = start; i < end; i++) if (bytes[i]! > 0x7f) return false;
  return true;
}

/** Texts of up to this many bytes are interned by their bytes as a number (length and 6 bytes: < 2^51, exact). */
const SHORT_TEXT_BYTES = 6;

/** UTF-8 as apache-arrow decodes a Utf8 value (util/utf8: a TextDecoder('utf-8'), replacement characters, a leading BOM dropped). */
const utf8Decoder = new TextDecoder('utf-8');

/**
 * The texts of a Utf8 column of n values without nulls (offsets: n + 1 int32 into `data`), or undefined when the
 * offsets do not fit the data (the general reader words the error). A text equal in bytes to the previous row's is
 * the previous row's string (the epoch of every satellite of an epoch), and a short ASCII text (a satellite) is
 * made once per distinct text: each decoded once, and the checks of the column (checkedTextColumn in
 * adapters/zwd-estimation.ts) pass over repeats by identity.
 */
function utf8Texts(body: Uint8Array, offsetsRegion: BufferRegion, dataRegion: BufferRegion, n: number): string[] | undefined {
  if (Number(offsetsRegion.length) < 4 * (n + 1) || Number(offsetsRegion.offset) + 4 * (n + 1) > body.byteLength) return undefined;
  const dataStart = Number(dataRegion.offset);
  const dataLength = Number(dataRegion.length);
  if (dataStart + dataLength > body.byteLength) return undefined;
  const offsets = new DataView(body.buffer, body.byteOffset + Number(offsetsRegion.offset), 4 * (n + 1));
  const data = body.subarray(dataStart, dataStart + dataLength);
  const latin1 = Buffer.from(data.buffer, data.byteOffset, data.byteLength);
  const texts = new Array<string>(n);
  const shortTexts = new Map<number, string>();
  let start = offsets.getInt32(0, true);
  if (start < 0) return undefined;
  let lastStart = -1;
  let lastEnd = -1;
  let last = '';
  for (let i = 0; i < n; i++) {
    const end = offsets.getInt32(4 * (i + 1), true);
    if (end < start || end > dataLength) return undefined;
    let same = lastStart >= 0 && end - start === lastEnd - lastStart;
    for (let k = 0; same && k < end - start; k++) same = data[start + k] === data[lastStart + k];
    if (!same) {
      const length = end - start;
      if (length <= SHORT_TEXT_BYTES && isAscii(data, start, end)) {
        // A short ASCII text (a satellite): its bytes as one number, its string made once.
        let key = length;
        for (let k = start; k < end; k++) key = key * 256 + data[k]!;
        last = shortTexts.get(key) ?? latin1.toString('latin1', start, end);
        if (shortTexts.size < 4096) shortTexts.set(key, last);
      } else last = isAscii(data, start, end) ? latin1.toString('latin1', start, end) : utf8Decoder.decode(data.subarray(start, end));
      lastStart = start;
      lastEnd = end;
    }
    texts[i] = last;
    start = end;
  }
  return texts;
}

/**
 * The common request of the batch routes read without a Table: a stream of one record batch (after at most one
 * dictionary batch per dictionary, none a delta) whose columns are float64, Utf8 or Utf8 dictionary-encoded with
 * int32 indices (what apache-arrow's tableFromArrays makes of texts), none with nulls (distinct names;
 * apache-arrow refuses compressed bodies). A float64 column is a Float64Array view of the body, a text column an
 * array of texts, each text decoded once per run of equal rows (Utf8) or once per dictionary entry: the same
 * values tableColumns gives. The messages are decoded by apache-arrow's MessageReader. Anything else, a
 * malformed stream included, is undefined: tableColumns reads it (and words its errors).
 */
function directStream(bytes: Uint8Array): { columns: Record<string, Float64Array | string[]>; metadata: Map<string, string> } | undefined {
  try {
    const reader = new MessageReader(bytes);
    const schema = reader.readSchema();
    if (!schema) return undefined;
    const names = schema.fields.map((f) => f.name);
    if (new Set(names).size !== names.length) return undefined;
    const kinds = schema.fields.map((f) => directColumnOf(f.type));
    if (kinds.some((k) => k === undefined)) return undefined;
    const dictionaries = new Map<number, string[]>();
    let message = reader.readMessage();
    while (message?.isDictionaryBatch()) {
      const batch = message.header() as DictionaryBatch;
      const body = reader.readMessageBody(message.bodyLength);
      const id = Number(batch.id);
      const type = schema.dictionaries.get(id);
      if (batch.isDelta || dictionaries.has(id) || !type || !DataType.isUtf8(type)) return undefined;
      const m = Number(batch.data.length);
      const [node] = batch.nodes;
      const buffers = batch.buffers;
      if (batch.nodes.length !== 1 || buffers.length !== 3 || Number(node!.length) !== m || Number(node!.nullCount) !== 0) return undefined;
      const texts = m === 0 ? [] : utf8Texts(body, buffers[1]!, buffers[2]!, m);
      if (!texts) return undefined;
      dictionaries.set(id, texts);
      message = reader.readMessage();
    }
    if (!message || !message.isRecordBatch()) return undefined;
    const header = message.header() as RecordBatchHeader;
    const body = reader.readMessageBody(message.bodyLength);
    if (reader.readMessage() !== null) return undefined; // another batch: the general reader joins them
    const n = Number(header.length);
    const width = (k: DirectColumn | undefined) => (k === 'utf8' ? 3 : 2);
    if (header.nodes.length !== names.length || header.buffers.length !== kinds.reduce((sum, k) => sum + width(k), 0)) return undefined;
    if (n === 0 && kinds.some((k) => k !== 'float64')) return undefined;
    const columns: Record<string, Float64Array | string[]> = {};
    let b = 0;
    for (let i = 0; i < names.length; i++) {
      const node = header.nodes[i]!;
      const kind = kinds[i]!;
      const first = header.buffers[b + 1]!;
      b += width(kind);
      if (Number(node.length) !== n || Number(node.nullCount) !== 0) return undefined;
      if (kind === 'utf8') {
        const texts = utf8Texts(body, first, header.buffers[b - 1]!, n);
        if (!texts) return undefined;
        columns[names[i]!] = texts;
        continue;
      }
      const size = kind === 'float64' ? 8 : 4;
      const offset = body.byteOffset + Number(first.offset);
      if (Number(first.length) < size * n || offset % size !== 0 || Number(first.offset) + size * n > body.byteLength) return undefined;
      if (kind === 'float64') {
        columns[names[i]!] = new Float64Array(body.buffer, offset, n);
        continue;
      }
      const entries = dictionaries.get((schema.fields[i]!.type as { id: number }).id);
      if (!entries) return undefined;
      const indices = new Int32Array(body.buffer, offset, n);
      const texts = new Array<string>(n);
      for (let r = 0; r < n; r++) {
        const text = entries[indices[r]!];
        if (text === undefined) return undefined;
        texts[r] = text;
      }
      columns[names[i]!] = texts;
    }
    return { columns, metadata: schema.metadata };
  } catch {
    return undefined;
  }
}

/**
 * An Arrow IPC stream request: its columns, and the rest of the request from the schema metadata "request" (JSON).
 * With `typed`, number columns without nulls come as Float64Arrays (a float64 column without a copy), for readers
 * that check and compute on typed columns (columns.ts accepts them); otherwise every column is a plain array
 * (nulls as null).
 */
export function readArrowRequest(bytes: Uint8Array): { columns: Record<string, unknown[]>; rest: unknown };
export function readArrowRequest(bytes: Uint8Array, typed: true): { columns: Record<string, unknown[] | Float64Array>; rest: unknown };
export function readArrowRequest(bytes: Uint8Array, typed = false): { columns: Record<string, unknown[] | Float64Array>; rest: unknown } {
  const flat = typed ? directStream(bytes) : undefined;
  const read = flat ?? tableColumns(bytes, typed);
  const meta = read.metadata.get('request');
  let rest: unknown = {};
  if (meta !== undefined) {
    try {
      rest = JSON.parse(meta);
    } catch {
      throw new FormatError('body.metadata.request', 'must be the rest of the request (everything but the rows) as JSON');
    }
  }
  return { columns: read.columns, rest };
}
