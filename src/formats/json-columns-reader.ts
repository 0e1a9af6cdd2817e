/**
 * One pass over the bytes of a JSON object body whose member `key` (e.g. "observations") is an object
 * of column arrays: the columns are read straight into typed arrays (numbers by src/formats/json-number.ts,
 * exactly as JSON.parse reads them; texts interned per distinct text), and the (small) rest of the body is
 * handed to JSON.parse as an object of its own, so its members keep JSON's meaning (duplicate keys, escapes)
 * and the caller validates it as before. No text of the body and no parsed arrays are made (issue 14: the
 * GPS-like day's 2.3 MB as text, then JSON.parse, then checks, cost 9–11 ms and ~4× the body in garbage).
 *
 * The reader answers only when it is sure: the whole body must be JSON that JSON.parse accepts, and the
 * columns must pass every check of `specs` (known names, no duplicates, arrays of one length in
 * 1..maxRows, numbers in range, null only where allowed, texts without escapes or non-ASCII bytes and
 * accepted by their check). Anything else (the objects form, a value out of range, an escape, invalid
 * JSON, a BOM) answers undefined, and the caller takes its general path (JSON.parse and the full
 * checks), whose errors name what is wrong. So this reader never changes an answer or an error.
 */

import { readJsonNumber, readPlainNumber } from './json-number.js';

/** A number column: values in [min, max] (min excluded when `exclusiveMin`); null (read as NaN) where `nullable`. */
export interface JsonNumberColumnSpec {
  kind: 'number';
  required: boolean;
  min: number;
  max: number;
  exclusiveMin: boolean;
  nullable: boolean;
}

/** A text column: each distinct text checked once by `accept`. */
export interface JsonTextColumnSpec {
  kind: 'text';
  required: boolean;
  accept: (text: string) => boolean;
}

export type JsonColumnSpec = JsonNumberColumnSpec | JsonTextColumnSpec;

/** A text column as read: per row the index of its text among the distinct texts (in order of first appearance). */
export interface InternedTexts {
  index: Uint32Array;
  distinct: string[];
}

export interface JsonColumnsBody {
  /** The rest of the body as JSON.parse gives it, with `key` in its place holding 0 (its columns are below). */
  rest: Record<string, unknown>;
  rows: number;
  /** Number columns sent (null → NaN), each of `rows` values in a buffer of its own. */
  numbers: Record<string, Float64Array>;
  /** Number columns with at least one null. */
  withNulls: Set<string>;
  texts: Record<string, InternedTexts>;
}

const SPACE = 0x20;
const TAB = 0x09;
const LF = 0x0a;
const CR = 0x0d;
const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const COMMA = 0x2c;
const COLON = 0x3a;
const OPEN_BRACE = 0x7b;
const CLOSE_BRACE = 0x7d;
const OPEN_BRACKET = 0x5b;
const CLOSE_BRACKET = 0x5d;

/** Thrown inside the reader when it cannot answer; caught at its door. */
class NotRead extends Error {}
const NOT_READ = new NotRead('not read by the column reader');

/** JSON whitespace (RFC 8259 §2): space, tab, line feed, carriage return. */
function skipSpace(b: Uint8Array, i: number): number {
  const n = b.length;
  while (i < n) {
    const c = b[i]!;
    if (c !== SPACE && c !== LF && c !== CR && c !== TAB) break;
    i++;
  }
  return i;
}

/** The end (after the closing quote) of a string starting at the quote at `i`; escapes skipped, not checked. */
function skipString(b: Uint8Array, i: number): number {
  const n = b.length;
  i++;
  while (i < n) {
    const c = b[i]!;
    if (c === QUOTE) return i + 1;
    i += c === BACKSLASH ? 2 : 1;
  }
  throw NOT_READ;
}

/**
 * The end of the JSON value at `i` as JSON.parse would delimit it (strings to their closing quote,
 * arrays and objects to their matching bracket, scalars to the next delimiter). Not checked here: the
 * rest is parsed by JSON.parse, which refuses what is not JSON.
 */
function skipValue(b: Uint8Array, i: number): number {
  const n = b.length;
  const c = b[i];
  if (c === QUOTE) return skipString(b, i);
  if (c === OPEN_BRACE || c === OPEN_BRACKET) {
    let depth = 0;
    while (i < n) {
      const d = b[i]!;
      if (d === QUOTE) {
        i = skipString(b, i);
        continue;
      }
      if (d === OPEN_BRACE || d === OPEN_BRACKET) depth++;
      else if (d === CLOSE_BRACE || d === CLOSE_BRACKET) {
        depth--;
        if (depth === 0) return i + 1;
      }
      i++;
    }
    throw NOT_READ;
  }
  const start = i;
  while (i < n) {
    const d = b[i]!;
    if (d === COMMA || d === CLOSE_BRACE || d === CLOSE_BRACKET || d === SPACE || d === LF || d === CR || d === TAB) break;
    i++;
  }
  if (i === start) throw NOT_READ;
  return i;
}

/** The end of a member key (a string without escapes or control characters) starting at the quote at `i`. */
function keyEnd(b: Uint8Array, i: number): number {
  const n = b.length;
  i++;
  while (i < n) {
    const c = b[i]!;
    if (c === QUOTE) return i + 1;
    if (c === BACKSLASH || c < SPACE) throw NOT_READ;
    i++;
  }
  throw NOT_READ;
}

/**
 * The member name of the string [start, end) (its quotes included) is `key`: compared byte by byte, or,
 * when the name has escapes (`"observ\u0061tions"`), decoded by JSON.parse first.
 */
function memberNameIs(b: Uint8Array, start: number, end: number, key: string): boolean {
  let escaped = false;
  for (let k = start + 1; k < end - 1 && !escaped; k++) escaped = b[k] === BACKSLASH;
  if (!escaped) return bytesEqual(b, start + 1, end - 1, key);
  let name: unknown;
  try {
    name = JSON.parse(Buffer.from(b.buffer, b.byteOffset + start, end - start).toString('utf8'));
  } catch {
    throw NOT_READ;
  }
  return name === key;
}

/** The bytes [start, end) equal the ASCII text. */
function bytesEqual(b: Uint8Array, start: number, end: number, text: string): boolean {
  if (end - start !== text.length) return false;
  for (let k = 0; k < text.length; k++) if (b[start + k] !== text.charCodeAt(k)) return false;
  return true;
}

/** A Float64Array holding `values` first values of `a`, in a buffer of its own of that size. */
const trimmed = (a: Float64Array, values: number) => (a.length === values ? a : a.slice(0, values));

/** Longest probe sequence of a look-up in TextInterner (the table is at most half full: ~2 probes on average). */
const MAX_PROBES = 64;

/**
 * Distinct texts by their bytes (open addressing on an FNV-1a hash): a text is decoded, checked and
 * stored once, and each row gets its index.
 */
class TextInterner {
  private slots = new Int32Array(1024); // distinct index + 1; 0 = empty
  /**
   * The same bytes as a Buffer, for each new text in one call (printable ASCII, checked by the caller, so
   * its latin1 text is its text; issue 14: a String.fromCharCode call per piece of a subarray cost ~3× as much).
   */
  private readonly bytes: Buffer;
  private starts: number[] = [];
  private lengths: number[] = [];
  private hashes: number[] = [];
  readonly distinct: string[] = [];

  constructor(
    private readonly b: Uint8Array,
    private readonly accept: (text: string) => boolean,
  ) {
    this.bytes = Buffer.from(b.buffer, b.byteOffset, b.byteLength);
  }

  /** The index of the text of bytes [start, end) with hash h; throws when the text is refused. */
  indexOf(start: number, end: number, h: number): number {
    const b = this.b;
    const length = end - start;
    const mask = this.slots.length - 1;
    let slot = h & mask;
    for (let probes = 0; ; probes++) {
      const k = this.slots[slot]! - 1;
      if (k < 0) break;
      // Texts made to share a hash (FNV-1a is not keyed) would make each look-up long: past MAX_PROBES
      // the body goes to the general path (JSON.parse, whose sets are hashed with a per-process seed).
      if (probes === MAX_PROBES) throw NOT_READ;
      if (this.hashes[k] === h && this.lengths[k] === length) {
        const s = this.starts[k]!;
        let same = true;
        for (let j = 0; j < length; j++) {
          if (b[s + j] !== b[start + j]) {
            same = false;
            break;
          }
        }
        if (same) return k;
      }
      slot = (slot + 1) & mask;
    }
    const text = this.bytes.toString('latin1', start, end);
    if (!this.accept(text)) throw NOT_READ;
    const k = this.distinct.push(text) - 1;
    this.starts.push(start);
    this.lengths.push(length);
    this.hashes.push(h);
    this.slots[slot] = k + 1;
    if (this.distinct.length * 2 > this.slots.length) this.grow();
    return k;
  }

  /** The length in bytes of the distinct text k. */
  lengthOf(k: number): number {
    return this.lengths[k]!;
  }

  private grow(): void {
    const slots = new Int32Array(this.slots.length * 2);
    const mask = slots.length - 1;
    for (let k = 0; k < this.distinct.length; k++) {
      let slot = this.hashes[k]! & mask;
      while (slots[slot] !== 0) slot = (slot + 1) & mask;
      slots[slot] = k + 1;
    }
    this.slots = slots;
  }
}

/** Reads the columns object at `i` (its opening brace) into `out`; returns the index after its closing brace. */
function readColumnsObject(
  b: Uint8Array,
  i: number,
  specs: Readonly<Record<string, JsonColumnSpec>>,
  names: readonly string[],
  maxRows: number,
  out: JsonColumnsBody,
): number {
  let rows = -1;
  const seen = new Set<string>();
  i = skipSpace(b, i + 1);
  if (b[i] === CLOSE_BRACE) throw NOT_READ;
  for (;;) {
    if (b[i] !== QUOTE) throw NOT_READ;
    const end = keyEnd(b, i);
    const name = names.find((k) => bytesEqual(b, i + 1, end - 1, k));
    if (name === undefined || seen.has(name)) throw NOT_READ;
    seen.add(name);
    i = skipSpace(b, end);
    if (b[i] !== COLON) throw NOT_READ;
    i = skipSpace(b, i + 1);
    if (b[i] !== OPEN_BRACKET) throw NOT_READ;
    const spec = specs[name]!;
    const capacity = rows < 0 ? Math.min(1024, maxRows) : rows;
    const read =
      spec.kind === 'number' ? readNumberArray(b, i, spec, capacity, rows, maxRows) : readTextArray(b, i, spec, capacity, rows, maxRows);
    if (rows < 0) rows = read.rows;
    if (spec.kind === 'number') {
      out.numbers[name] = trimmed(read.values as Float64Array, rows);
      if (read.nulls) out.withNulls.add(name);
    } else {
      const index = read.values as Uint32Array;
      out.texts[name] = { index: index.length === rows ? index : index.slice(0, rows), distinct: read.distinct! };
    }
    i = skipSpace(b, read.end);
    if (b[i] === COMMA) {
      i = skipSpace(b, i + 1);
      continue;
    }
    if (b[i] !== CLOSE_BRACE) throw NOT_READ;
    break;
  }
  for (const name of names) if (specs[name]!.required && !seen.has(name)) throw NOT_READ;
  out.rows = rows;
  return i + 1;
}

interface ArrayRead {
  values: Float64Array | Uint32Array;
  rows: number;
  end: number;
  nulls?: boolean;
  distinct?: string[];
}

/**
 * A number array at `i` (its bracket): every value a JSON number in the spec's range (or null where
 * nullable); `rows` values when the length is known already (≥ 0), else 1..maxRows.
 */
function readNumberArray(b: Uint8Array, i: number, spec: JsonNumberColumnSpec, capacity: number, rows: number, maxRows: number): ArrayRead {
  const { min, max, exclusiveMin, nullable } = spec;
  const view = new DataView(b.buffer, b.byteOffset, b.byteLength);
  let values = new Float64Array(capacity);
  let count = 0;
  let nulls = false;
  i = skipSpace(b, i + 1);
  if (b[i] === CLOSE_BRACKET) throw NOT_READ;
  for (;;) {
    if (count === values.length) {
      if (rows >= 0 || count >= maxRows) throw NOT_READ; // longer than the first column, or than allowed
      const grown = new Float64Array(Math.min(values.length * 2, maxRows));
      grown.set(values);
      values = grown;
    }
    if (b[i] === 0x6e) {
      // n: null
      if (!nullable || b[i + 1] !== 0x75 || b[i + 2] !== 0x6c || b[i + 3] !== 0x6c) throw NOT_READ;
      values[count] = NaN;
      nulls = true;
      i += 4;
    } else {
      const end = readPlainNumber(b, view, i, values, count);
      i = end >= 0 ? end : readJsonNumber(b, view, i, values, count);
      const v = values[count]!;
      if (!((exclusiveMin ? v > min : v >= min) && v <= max)) throw NOT_READ; // NaN (not a number) fails too
    }
    count++;
    let c = b[i];
    if (c === SPACE || c === LF || c === CR || c === TAB) {
      i = skipSpace(b, i);
      c = b[i];
    }
    if (c === COMMA) {
      i = skipSpace(b, i + 1);
      continue;
    }
    if (c !== CLOSE_BRACKET) throw NOT_READ;
    break;
  }
  if ((rows >= 0 && count !== rows) || count > maxRows) throw NOT_READ;
  return { values, rows: count, end: i + 1, nulls };
}

/** Slots of the cache of short texts in readTextArray (a power of two). */
const SHORT_CACHE = 256;

/**
 * The first four bytes of a text (from its first byte) when they hold its closing quote (a text of up to
 * three bytes: a satellite), else 0. Such a word tells the text: the same word, the same text (what
 * follows the quote in the word is part of the key, so at worst a miss). 0 is no such word (a text
 * holds no byte 0).
 */
function shortTextWord(b: Uint8Array, view: DataView, start: number): number {
  if (start + 4 > b.length) return 0;
  const w = view.getInt32(start, true);
  // a byte equal to the quote: (byte ^ 0x22) is 0 (the classic zero-byte test: (v − 0x01…) & ~v & 0x80…)
  const v = w ^ 0x22222222;
  return ((v - 0x01010101) & ~v & 0x80808080) !== 0 ? w : 0;
}

/** Slot of a short text's word in the cache: the top bits of its product with a large odd constant. */
const shortSlot = (w: number) => Math.imul(w, 0x9e3779b1) >>> 24;

/** A text array at `i` (its bracket): every value a string of printable ASCII without escapes, accepted by the spec. */
function readTextArray(b: Uint8Array, i: number, spec: JsonTextColumnSpec, capacity: number, rows: number, maxRows: number): ArrayRead {
  const interner = new TextInterner(b, spec.accept);
  const view = new DataView(b.buffer, b.byteOffset, b.byteLength);
  const shortWords = new Int32Array(SHORT_CACHE);
  const shortIndex = new Int32Array(SHORT_CACHE);
  let values = new Uint32Array(capacity);
  let count = 0;
  const n = b.length;
  let lastStart = -1;
  let lastLength = -1;
  let lastIndex = 0;
  i = skipSpace(b, i + 1);
  if (b[i] === CLOSE_BRACKET) throw NOT_READ;
  for (;;) {
    if (b[i] !== QUOTE) throw NOT_READ;
    const start = i + 1;
    let k: number;
    let end: number;
    // A short text (a satellite) by its first word, when it was met before: one look-up, no byte loop.
    const word = shortTextWord(b, view, start);
    const slot = shortSlot(word);
    if (word !== 0 && shortWords[slot] === word) {
      k = shortIndex[slot]!;
      end = start + interner.lengthOf(k);
    } else {
      // Compared with the (checked) text of the row before, eight bytes at a time: runs of one text (an
      // epoch on every satellite in view) cost one comparison per eight bytes; only a new text is checked,
      // hashed and looked up. As doubles: the row before's bytes are printable ASCII, so its eight bytes are
      // neither ±0 nor NaN, and equal doubles are equal bytes.
      let j = start;
      const offset = lastStart - start;
      const sameEnd = start + lastLength;
      const wordsEnd = Math.min(sameEnd, n) - 8;
      while (j <= wordsEnd && view.getFloat64(j, true) === view.getFloat64(j + offset, true)) j += 8;
      while (j < sameEnd && b[j] === b[j + offset]) j++;
      if (j === sameEnd && b[j] === QUOTE) k = lastIndex;
      else {
        let h = 0x811c9dc5;
        for (j = start; ; j++) {
          if (j >= n) throw NOT_READ;
          const c = b[j]!;
          if (c === QUOTE) break;
          if (c < SPACE || c >= 0x7f || c === BACKSLASH) throw NOT_READ;
          h = Math.imul(h ^ c, 0x01000193);
        }
        k = interner.indexOf(start, j, h);
        if (word !== 0) {
          shortWords[slot] = word;
          shortIndex[slot] = k;
        }
      }
      end = j;
    }
    lastStart = start;
    lastLength = end - start;
    lastIndex = k;
    if (count === values.length) {
      if (rows >= 0 || count >= maxRows) throw NOT_READ;
      const grown = new Uint32Array(Math.min(values.length * 2, maxRows));
      grown.set(values);
      values = grown;
    }
    values[count++] = k;
    i = skipSpace(b, end + 1);
    const c = b[i];
    if (c === COMMA) {
      i = skipSpace(b, i + 1);
      continue;
    }
    if (c !== CLOSE_BRACKET) throw NOT_READ;
    break;
  }
  if ((rows >= 0 && count !== rows) || count > maxRows) throw NOT_READ;
  return { values, rows: count, end: i + 1, distinct: interner.distinct };
}

/**
 * The body of `bytes` (UTF-8 JSON) read in one pass when it is an object whose member `key` is an object
 * of the columns `specs`, all valid (see the header); undefined otherwise.
 *
 * @param key the member holding the columns, e.g. "observations" (given once, without escapes)
 * @param specs the columns by name: what each may hold
 * @param maxRows most values a column may hold
 */
export function readJsonColumnsBody(
  bytes: Uint8Array,
  key: string,
  specs: Readonly<Record<string, JsonColumnSpec>>,
  maxRows: number,
): JsonColumnsBody | undefined {
  const b = bytes;
  const names = Object.keys(specs);
  const out: JsonColumnsBody = { rest: {}, rows: 0, numbers: {}, withNulls: new Set(), texts: {} };
  const members: string[] = [];
  let found = false;
  try {
    let i = skipSpace(b, 0);
    if (b[i] !== OPEN_BRACE) return undefined;
    i = skipSpace(b, i + 1);
    if (b[i] === CLOSE_BRACE) return undefined;
    // Decoded as the general path decodes the whole body (Buffer#toString: invalid UTF-8 → U+FFFD).
    const text = Buffer.from(b.buffer, b.byteOffset, b.byteLength);
    for (;;) {
      if (b[i] !== QUOTE) return undefined;
      const memberStart = i;
      const end = skipString(b, i);
      const isKey = memberNameIs(b, i, end, key);
      i = skipSpace(b, end);
      if (b[i] !== COLON) return undefined;
      i = skipSpace(b, i + 1);
      if (isKey) {
        if (found || b[i] !== OPEN_BRACE) return undefined;
        found = true;
        i = readColumnsObject(b, i, specs, names, maxRows, out);
        members.push(`${JSON.stringify(key)}:0`);
      } else {
        i = skipValue(b, i);
        members.push(text.toString('utf8', memberStart, i));
      }
      i = skipSpace(b, i);
      if (b[i] === COMMA) {
        i = skipSpace(b, i + 1);
        continue;
      }
      if (b[i] !== CLOSE_BRACE) return undefined;
      break;
    }
    if (!found || skipSpace(b, i + 1) !== b.length) return undefined;
  } catch (err) {
    if (err === NOT_READ) return undefined;
    throw err;
  }
  try {
    out.rest = JSON.parse(`{${members.join(',')}}`) as Record<string, unknown>;
  } catch {
    return undefined;
  }
  return out;
}
