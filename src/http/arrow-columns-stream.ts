/**
 * An answer table written as an Arrow IPC stream without apache-arrow's Table (issue 14): the bytes of
 * tableToIPC(tableFromArrays(columns), 'stream') with the rest of the answer in the schema metadata "answer", for
 * columns of numbers and of texts with or without nulls, as the adapters hand them to tableFromArrays (a column of
 * numbers only a Float64Array, any other an array with null for a missing value).
 *
 * What tableFromArrays and tableToIPC make of such columns (apache-arrow 20: inferType, the builders,
 * VectorAssembler and RecordBatchWriter), and so what is written here:
 * - a Float64Array: a float64 field, not nullable; numbers with nulls: a float64 field, nullable, the values 0
 *   where null; texts (with or without nulls): Utf8 dictionary-encoded with Int32 indices, nullable, a dictionary
 *   id from apache-arrow's own counter (a new Dictionary type per column, in field order, as inferType takes
 *   them), the texts in order of first appearance, index 0 where null; a column of nulls only: float64;
 * - the schema message, then one dictionary batch per text column in field order (a Utf8 column: an empty
 *   validity buffer, the m + 1 offsets, the UTF-8 bytes as TextEncoder writes them), then one record batch:
 *   per column a field node (length, null count), the validity bitmap (empty without nulls, else the builder's:
 *   bit k set for a value, whole 64-byte blocks) and the values or indices; each buffer padded to 8 bytes, its
 *   region the padded length.
 * The headers are encoded by apache-arrow's Message.encode, the stream laid out by streamOf (answer-shape.ts).
 * Anything else (no rows, a column mixing numbers and texts, other values) is not written here: the caller
 * takes tableFromArrays. test/http/zwd-estimates-arrow-stream.test.ts compares the bytes with tableToIPC.
 */

import { Dictionary, Field, Float64, Int32, Message, Schema, Utf8 } from 'apache-arrow';
import { BufferRegion, DictionaryBatch, FieldNode, RecordBatch as RecordBatchHeader } from 'apache-arrow/ipc/metadata/message';
import { align8, streamOf, type StreamMessage } from './answer-shape.js';

/** The texts of a dictionary as a Utf8 column: the UTF-8 bytes of each one after another, and count + 1 offsets into them. */
export interface Utf8Texts {
  count: number;
  offsets: Int32Array;
  bytes: Uint8Array;
}

/** A column in the buffers of its record batch. */
export interface ArrowColumn {
  /** A float64 column's values (0 where null), or a text column's indices into its dictionary (0 where null). */
  values: Float64Array | Int32Array;
  /** A text column's dictionary: its distinct texts in order of first appearance; undefined for numbers. */
  dictionary: Utf8Texts | undefined;
  nullCount: number;
  /** Bit k set when row k has a value, sized as apache-arrow's builder sizes it; used only with nulls. */
  validity: Uint8Array;
  /** tableFromArrays marks every column it builds value by value nullable, a Float64Array not. */
  nullable: boolean;
}

/** What a row gives for a field: a number, a text, or null or undefined for none. */
export type CellValue = number | string | null | undefined;

const NO_VALIDITY = new Uint8Array(0);

/** Bytes of the validity bitmap of n rows as apache-arrow's BitmapBufferBuilder flushes it: ⌈n/8⌉ in whole 64-byte blocks. */
const validityBytes = (n: number) => Math.max(64, (Math.ceil(n / 8) + 63) & ~63);

/**
 * The column of n values (valueAt(k) the value of row k), as the adapters and tableFromArrays make it (above);
 * 'absent' when every value is undefined (rowsToColumns in table-answer.ts leaves such a field out); undefined
 * when the column is not written here (numbers mixed with texts, a value of another kind). n ≥ 1.
 */
export function arrowColumnOf(n: number, valueAt: (k: number) => CellValue): ArrowColumn | 'absent' | undefined {
  const values = new Float64Array(n);
  let k = 0;
  for (; k < n; k++) {
    const v = valueAt(k);
    if (typeof v !== 'number') break;
    values[k] = v;
  }
  if (k === n) return { values, dictionary: undefined, nullCount: 0, validity: NO_VALIDITY, nullable: false };
  const validity = new Uint8Array(validityBytes(n));
  for (let i = 0; i < k; i++) validity[i >> 3]! |= 1 << (i & 7);
  let nullCount = 0;
  let present = k > 0;
  for (; k < n; k++) {
    const v = valueAt(k);
    if (typeof v === 'number') {
      values[k] = v;
      validity[k >> 3]! |= 1 << (k & 7);
      present = true;
    } else if (v === null || v === undefined) {
      nullCount++;
      present ||= v === null;
    } else if (typeof v === 'string' && nullCount === k)
      return textColumn(n, valueAt); // nulls, then a text
    else return undefined;
  }
  return present ? { values, dictionary: undefined, nullCount, validity, nullable: true } : 'absent';
}

/**
 * Keys numbered in order of first appearance, as apache-arrow's DictionaryBuilder numbers the texts of a column (a
 * key is equal for two rows exactly where their texts are: the text itself, or a number the text is made of): a
 * repeat of the previous key is the previous index, a key above every key so far (epochs in time order) a new one
 * without a lookup; only once the keys stop rising does a map of the keys take over.
 */
class FirstAppearance {
  /** The number of distinct keys so far. */
  size = 0;
  /** Whether the last key indexOf was given was new. */
  added = false;
  private readonly keys: (string | number)[] = [];
  private readonly indices = new Map<string | number, number>();
  private rising = true;
  private lastKey: string | number = '';
  private lastIndex = -1;

  /** The index of the key (a new key's is the size before it). */
  indexOf(key: string | number): number {
    this.added = false;
    if (key === this.lastKey && this.size > 0) return this.lastIndex;
    let index = this.rising && (this.size === 0 || key > this.lastKey) ? undefined : this.lookUp(key);
    if (index === undefined) {
      index = this.size++;
      this.added = true;
      this.keys.push(key);
      if (!this.rising) this.indices.set(key, index);
    }
    this.lastKey = key;
    this.lastIndex = index;
    return index;
  }

  private lookUp(key: string | number): number | undefined {
    if (this.rising) {
      this.rising = false;
      for (let i = 0; i < this.keys.length; i++) this.indices.set(this.keys[i]!, i);
    }
    return this.indices.get(key);
  }
}

/**
 * A column of texts and nulls (at least one text), dictionary-encoded as apache-arrow's DictionaryBuilder does;
 * undefined when it holds a number.
 */
function textColumn(n: number, valueAt: (k: number) => CellValue): ArrowColumn | undefined {
  const indices = new Int32Array(n);
  const validity = new Uint8Array(validityBytes(n));
  const seen = new FirstAppearance();
  const entries: string[] = [];
  let nullCount = 0;
  for (let k = 0; k < n; k++) {
    const v = valueAt(k);
    if (typeof v === 'string') {
      indices[k] = seen.indexOf(v);
      if (seen.added) entries.push(v);
      validity[k >> 3]! |= 1 << (k & 7);
    } else if (v === null || v === undefined) nullCount++;
    else return undefined;
  }
  return { values: indices, dictionary: utf8Of(entries), nullCount, validity, nullable: true };
}

/**
 * A column of n texts without nulls, as tableFromArrays makes it of the texts, given as their UTF-8 bytes
 * (writeAt(k, out, at) writes row k's, at most maxBytes, into out[at…] and returns where they end) and told apart
 * by keyAt(k) (equal for two rows exactly where their texts are): texts made of numbers (epochs) are written
 * once each, neither made as strings nor hashed.
 */
export function keyedTextColumn(
  n: number,
  keyAt: (k: number) => number,
  writeAt: (k: number, out: Uint8Array, at: number) => number,
  maxBytes: number,
): ArrowColumn {
  const indices = new Int32Array(n);
  const seen = new FirstAppearance();
  const offsets = new Int32Array(n + 1);
  const bytes = new Uint8Array(n * maxBytes);
  for (let k = 0; k < n; k++) {
    indices[k] = seen.indexOf(keyAt(k));
    if (seen.added) offsets[seen.size] = writeAt(k, bytes, offsets[seen.size - 1]!);
  }
  const dictionary = { count: seen.size, offsets: offsets.subarray(0, seen.size + 1), bytes: bytes.subarray(0, offsets[seen.size]) };
  return { values: indices, dictionary, nullCount: 0, validity: NO_VALIDITY, nullable: true };
}

/** The body of a batch message as it is laid out: buffers one after another, each padded to 8 bytes. */
class Body {
  readonly buffers: ArrayBufferView[] = [];
  readonly regions: BufferRegion[] = [];
  length = 0;

  add(buffer: ArrayBufferView): void {
    const padded = align8(buffer.byteLength);
    this.buffers.push(buffer);
    this.regions.push(new BufferRegion(this.length, padded));
    this.length += padded;
  }
}

/**
 * The texts as a Utf8 column. Texts of ASCII only are their own bytes; otherwise each text is encoded on its own, as
 * TextEncoder (apache-arrow's encodeUtf8) does: a lone surrogate at the end of one text is U+FFFD, not half of a
 * pair with the next text's first.
 */
function utf8Of(texts: readonly string[]): Utf8Texts {
  const offsets = new Int32Array(texts.length + 1);
  const joined = texts.join('');
  const bytes = Buffer.from(joined, 'utf8');
  if (bytes.length === joined.length) {
    // One byte per character: ASCII only.
    for (let i = 0; i < texts.length; i++) offsets[i + 1] = offsets[i]! + texts[i]!.length;
    return { count: texts.length, offsets, bytes };
  }
  const parts = texts.map((text) => Buffer.from(text, 'utf8'));
  for (let i = 0; i < parts.length; i++) offsets[i + 1] = offsets[i]! + parts[i]!.length;
  return { count: texts.length, offsets, bytes: Buffer.concat(parts) };
}

/** The dictionary batch of a text column: its texts as one Utf8 column without nulls. */
function dictionaryMessage(id: number, texts: Utf8Texts): StreamMessage {
  const body = new Body();
  body.add(NO_VALIDITY);
  body.add(texts.offsets);
  body.add(texts.bytes);
  const batch = new RecordBatchHeader(texts.count, [new FieldNode(texts.count, 0)], body.regions);
  return { header: Message.encode(Message.from(new DictionaryBatch(batch, id), body.length)), buffers: body.buffers };
}

/**
 * The stream of the columns (in this order, each of n ≥ 1 rows) with `answer` in the schema metadata "answer": the
 * bytes tableToIPC writes of tableFromArrays of the same columns (with the same dictionary ids). The bytes may be
 * a view of a pooled buffer (answer-shape.ts, releasePooledBytes).
 */
export function arrowColumnsStream(columns: ReadonlyMap<string, ArrowColumn>, n: number, answer: string): Uint8Array {
  const fields: Field[] = [];
  const dictionaries: StreamMessage[] = [];
  const nodes: FieldNode[] = [];
  const body = new Body();
  for (const [name, column] of columns) {
    if (column.dictionary) {
      const type = new Dictionary(new Utf8(), new Int32()); // the next dictionary id, as tableFromArrays takes one
      fields.push(new Field(name, type, column.nullable));
      dictionaries.push(dictionaryMessage(type.id, column.dictionary));
    } else fields.push(new Field(name, new Float64(), column.nullable));
    nodes.push(new FieldNode(n, column.nullCount));
    body.add(column.nullCount > 0 ? column.validity : NO_VALIDITY);
    body.add(column.values);
  }
  const schema = Message.encode(Message.from(new Schema(fields, new Map([['answer', answer]]))));
  const header = Message.encode(Message.from(new RecordBatchHeader(n, nodes, body.regions), body.length));
  return streamOf(schema, [...dictionaries, { header, buffers: body.buffers }]);
}
