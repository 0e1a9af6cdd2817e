/**
 * Column arrays written as JSON bytes in one pass, each number rounded to its column's decimals (the
 * precision table, output-precision.ts): the text of
 *
 *   JSON.stringify({ name: Array.from(column, (x) => roundTo(x, decimals)), … })
 *
 * parsed back to the same numbers, without the intermediate arrays of rounded doubles and without the
 * shortest-round-trip conversion of every double (the slow part of JSON.stringify on big number arrays:
 * 39 % of a 10 000-direction answer, issue 14). A rounded value is written as its integer count of the
 * last decimal, k = |Math.round(x·10^d)| (halves towards +∞, as roundTo), split into integer and fraction
 * digits: integers up to 2^53 are exact, so the digits are exactly those of k/10^d. Trailing zeros of the
 * fraction are dropped (1.5, not 1.500000); non-finite values are written as null, like JSON.stringify; -0
 * as 0. A value whose k exceeds 2^53
 * (|x| ≥ 9e9 with 6 decimals; no quantity of this service comes near) takes JSON.stringify's path.
 *
 * Pure: arrays in, bytes out.
 */

import { MAX_ROUNDED_DECIMAL_BYTES, writeRoundedDecimal, writeRoundedDecimalList } from './rounded-decimal-bytes.js';

/**
 * Where the bytes of an answer come from: new by default; a caller may hand buffers from a pool (the batch
 * routes, src/http/answer-shape.ts pooledBytes), whose content is then undefined until written.
 */
export type ByteSource = (size: number) => Uint8Array;
const newBytes: ByteSource = (size) => new Uint8Array(size);

/** A number as JSON.stringify writes it: String(x) (ECMAScript Number::toString, the shortest round trip; ASCII), null when not finite. */
export const jsonNumberText = (x: number): string => (Number.isFinite(x) ? String(x) : 'null');

/**
 * A growing byte buffer for JSON text: bytes written straight into it, ASCII text by its char codes and
 * other text as UTF-8, so that a big answer is never one big string transcoded at the end.
 */
export class JsonBytes {
  bytes: Uint8Array;
  length = 0;
  constructor(capacity: number, source: ByteSource = newBytes) {
    this.bytes = source(Math.max(capacity, 64));
  }
  reserve(extra: number): void {
    if (this.length + extra <= this.bytes.length) return;
    const grown = new Uint8Array(Math.max(this.bytes.length * 2, this.length + extra));
    grown.set(this.bytes.subarray(0, this.length));
    this.bytes = grown;
  }
  /** Any text as its UTF-8 bytes (the name is historical: JSON text of ASCII names and arrays). */
  ascii(text: string): void {
    const encoded = Buffer.from(text, 'utf8');
    this.reserve(encoded.length);
    this.bytes.set(encoded, this.length);
    this.length += encoded.length;
  }
  byte(b: number): void {
    this.reserve(1);
    this.bytes[this.length++] = b;
  }
  /** Bytes as they are. */
  raw(bytes: Uint8Array): void {
    this.reserve(bytes.length);
    this.bytes.set(bytes, this.length);
    this.length += bytes.length;
  }
  /** x rounded to `decimals` (0..15) as JSON; null for a non-finite value (rounded-decimal-bytes.ts). */
  rounded(x: number, decimals: number): void {
    this.reserve(MAX_ROUNDED_DECIMAL_BYTES);
    this.length = writeRoundedDecimal(this.bytes, this.length, x, decimals);
  }
  /** A number as JSON.stringify writes it (jsonNumberText). */
  number(x: number): void {
    const text = jsonNumberText(x);
    this.reserve(text.length);
    const b = this.bytes;
    let at = this.length;
    for (let i = 0; i < text.length; i++) b[at++] = text.charCodeAt(i);
    this.length = at;
  }
  /**
   * A string as JSON.stringify writes it, as UTF-8: quoted, with its characters as they are when all are
   * printable ASCII without `"` or `\\`; anything else (control characters, quotes, backslashes, non-ASCII,
   * lone surrogates) through JSON.stringify itself and UTF-8.
   */
  string(text: string): void {
    const n = text.length;
    this.reserve(n + 2);
    const b = this.bytes;
    let at = this.length;
    b[at++] = 0x22; // "
    for (let i = 0; i < n; i++) {
      const c = text.charCodeAt(i);
      if (c < 0x20 || c === 0x22 || c === 0x5c || c >= 0x80) {
        this.ascii(JSON.stringify(text));
        return;
      }
      b[at++] = c;
    }
    b[at++] = 0x22;
    this.length = at;
  }
  done(): Uint8Array {
    return this.bytes.subarray(0, this.length);
  }
}

/** One column of a JSON columns object: its values, and its decimals (undefined: not a number, written by JSON.stringify). */
export interface JsonColumn {
  values: ArrayLike<number> | readonly unknown[];
  decimals: number | undefined;
}

/** `{"name":[…],…}` as UTF-8 bytes, numbers rounded per column (roundTo of output-precision.ts). */
export function columnsJsonBytes(columns: Record<string, JsonColumn>, source: ByteSource = newBytes): Uint8Array {
  let rows = 0;
  let longest = 0;
  for (const c of Object.values(columns)) {
    rows += c.values.length;
    longest = Math.max(longest, c.values.length);
  }
  // A Float64Array column is written in one loop into room reserved for its longest text (below).
  const out = new JsonBytes(rows * 12 + 64 + longest * (MAX_ROUNDED_DECIMAL_BYTES + 1), source);
  out.byte(0x7b); // {
  let first = true;
  for (const [name, { values, decimals }] of Object.entries(columns)) {
    if (!first) out.byte(0x2c);
    first = false;
    out.ascii(`${JSON.stringify(name)}:`);
    if (decimals === undefined) {
      out.ascii(JSON.stringify(Array.from(values as ArrayLike<unknown>)));
      continue;
    }
    out.byte(0x5b); // [
    if (values instanceof Float64Array) {
      out.reserve(values.length * (MAX_ROUNDED_DECIMAL_BYTES + 1) + 1);
      out.length = writeRoundedDecimalList(out.bytes, out.length, values, decimals);
      out.byte(0x5d); // ]
      continue;
    }
    const numbers = values as ArrayLike<number>;
    for (let i = 0; i < numbers.length; i++) {
      if (i > 0) out.byte(0x2c);
      const x = numbers[i];
      if (typeof x === 'number') out.rounded(x, decimals);
      else out.ascii('null');
    }
    out.byte(0x5d); // ]
  }
  out.byte(0x7d); // }
  return out.done();
}

/**
 * JSON bytes of `answer` with raw JSON bytes as the values of some of its top-level keys, each in its key's
 * place: the small rest of an answer goes through JSON.stringify, its big parts are written apart.
 */
export function jsonWithRawMembers(
  answer: Record<string, unknown>,
  raw: Record<string, Uint8Array>,
  source: ByteSource = newBytes,
): Uint8Array {
  const markers = Object.keys(raw).map((key) => ({ key, text: JSON.stringify(`\u0000raw:${key}\u0000`) }));
  const text = JSON.stringify({ ...answer, ...Object.fromEntries(markers.map((m) => [m.key, JSON.parse(m.text) as string])) });
  const parts: Uint8Array[] = [];
  let from = 0;
  for (const { key, at } of markers.map((m) => ({ ...m, at: text.indexOf(m.text) })).sort((a, b) => a.at - b.at)) {
    parts.push(Buffer.from(text.slice(from, at), 'utf8'), raw[key]!);
    from = at + markers.find((m) => m.key === key)!.text.length;
  }
  parts.push(Buffer.from(text.slice(from), 'utf8'));
  const bytes = source(parts.reduce((sum, part) => sum + part.byteLength, 0));
  let at = 0;
  for (const part of parts) {
    bytes.set(part, at);
    at += part.byteLength;
  }
  return bytes;
}

/**
 * A text (JSON.stringify's, say) as UTF-8 bytes that own their buffer exactly (a worker moves them instead
 * of copying). ASCII text (the usual answer: numbers, ISO epochs, ASCII names and warnings) is its own
 * UTF-8: written as latin1, without transcoding (a 1.2 MB answer: ~0.3 ms instead of 0.7–1.5 ms by
 * TextEncoder); the UTF-8 length equals the text's length exactly when every character is ASCII. Any
 * other text goes through TextEncoder, as before.
 */
export function utf8Bytes(text: string): Uint8Array {
  if (Buffer.byteLength(text, 'utf8') !== text.length) return new TextEncoder().encode(text);
  // Not zero-filled first (every byte is written), a buffer of its own of exactly the text's length: a plain
  // Uint8Array over it, as before (the zero fill and the Buffer made over a Uint8Array were ~0.15–0.3 ms of a
  // 1.2 MB answer).
  const bytes = Buffer.allocUnsafeSlow(text.length);
  bytes.write(text, 0, 'latin1');
  return new Uint8Array(bytes.buffer, 0, text.length);
}

/** Elements of a long array stringified per call by stringifiedBytes (~55 kB of a GPS-like day's series rows). */
export const ELEMENTS_PER_PIECE = 128;

/**
 * The largest answer written in pieces [bytes]: the scratch buffer of a thread grows up to this and is kept
 * (a day's rows answer is ~1.2 MB); a longer answer (30 days: ~36 MB) is written whole, as before, so that the
 * buffer a worker keeps while idle and the peak of a long request stay what they were.
 */
export const SCRATCH_BYTES_MAX = 4 * 1024 * 1024;

/** This thread's scratch buffer (each worker thread has its own module instance), absent while in use. */
let scratch: Buffer | undefined;

/** Thrown by ScratchWriter past SCRATCH_BYTES_MAX. */
const SCRATCH_FULL = new Error('answer longer than the scratch buffer');

/** Text written into a growing Buffer (up to SCRATCH_BYTES_MAX): ASCII as latin1 (a copy), any other text as UTF-8. */
class ScratchWriter {
  length = 0;
  constructor(public bytes: Buffer) {}
  private reserve(extra: number): void {
    if (this.length + extra <= this.bytes.length) return;
    if (this.length + extra > SCRATCH_BYTES_MAX) throw SCRATCH_FULL;
    const grown = Buffer.allocUnsafeSlow(Math.min(Math.max(this.bytes.length * 2, this.length + extra), SCRATCH_BYTES_MAX));
    this.bytes.copy(grown, 0, 0, this.length);
    this.bytes = grown;
  }
  byte(b: number): void {
    this.reserve(1);
    this.bytes[this.length++] = b;
  }
  text(text: string): void {
    const size = Buffer.byteLength(text, 'utf8');
    this.reserve(size);
    this.length += this.bytes.write(text, this.length, size, size === text.length ? 'latin1' : 'utf8');
  }
}

/** Whether JSON.stringify of `element` calls a toJSON (or serialises a BigInt): then its index would matter. */
const hasOwnJson = (element: unknown): boolean =>
  typeof element === 'bigint' ||
  ((typeof element === 'object' || typeof element === 'function') &&
    element !== null &&
    typeof (element as { toJSON?: unknown }).toJSON === 'function');

/** A member written in pieces: an array longer than a piece, whose elements' text does not depend on their index. */
function inPieces(value: unknown): value is readonly unknown[] {
  if (!Array.isArray(value) || value.length <= ELEMENTS_PER_PIECE || hasOwnJson(value)) return false;
  for (let i = 0; i < value.length; i++) if (hasOwnJson(value[i])) return false;
  return true;
}

/**
 * `[e0,e1,…]` as JSON.stringify writes it, a piece of ELEMENTS_PER_PIECE elements per call: each piece's text
 * `[…]` is written with its opening bracket over the previous piece's closing one, which then becomes a comma.
 */
function writeArrayInPieces(out: ScratchWriter, array: readonly unknown[]): void {
  for (let i = 0; i < array.length; i += ELEMENTS_PER_PIECE) {
    const joint = out.length - 1;
    if (i > 0) out.length = joint;
    out.text(JSON.stringify(Array.prototype.slice.call(array, i, i + ELEMENTS_PER_PIECE)));
    if (i > 0) out.bytes[joint] = 0x2c; // ,
  }
}

/**
 * The bytes of utf8Bytes(JSON.stringify(value)) for a plain object, without the text of the whole: each
 * top-level member is stringified alone, and a long array member (an answer's rows) a piece of
 * ELEMENTS_PER_PIECE elements at a time, into this thread's scratch buffer, then copied into bytes that own
 * their buffer exactly (the worker moves them). One text of a 1.2 MB answer was a string of V8's large-object
 * space: flattened for its UTF-8 length (a fresh mapping each time: ~290 page faults), scanned, copied
 * (DEVELOPERS.md, "The HTTP edge of the estimation routes"). JSON's meaning is kept: members in
 * Object.keys order, a member whose value has no JSON text (undefined, a function) left out, toJSON called
 * with the member's key (a member is stringified as `{key: value}`); an array with an element that has a
 * toJSON (called with its index) or a BigInt is stringified whole. An array or an object with a toJSON at the
 * top goes through JSON.stringify whole, and so does an answer longer than SCRATCH_BYTES_MAX, once the
 * buffer is full (its toJSON functions, if any, are then called a second time). Throws what JSON.stringify
 * throws (a cycle, a BigInt).
 */
export function stringifiedBytes(value: object): Uint8Array {
  if (Array.isArray(value) || hasOwnJson(value)) return utf8Bytes(JSON.stringify(value));
  const out = new ScratchWriter(scratch ?? Buffer.allocUnsafeSlow(1024 * 1024));
  scratch = undefined; // not shared with a call made meanwhile (a toJSON that writes an answer)
  try {
    writeObject(out, value);
  } catch (err) {
    if (err !== SCRATCH_FULL) throw err;
    return utf8Bytes(JSON.stringify(value));
  } finally {
    scratch = out.bytes;
  }
  const bytes = Buffer.allocUnsafeSlow(out.length);
  out.bytes.copy(bytes, 0, 0, out.length);
  return new Uint8Array(bytes.buffer, 0, bytes.length);
}

/** `{…}` of a plain object's members into `out` (stringifiedBytes). */
function writeObject(out: ScratchWriter, value: object): void {
  out.byte(0x7b); // {
  for (const key of Object.keys(value)) {
    const member = (value as Record<string, unknown>)[key];
    const start = out.length;
    if (start > 1) out.byte(0x2c); // ,
    if (inPieces(member)) {
      out.text(`${JSON.stringify(key)}:`);
      writeArrayInPieces(out, member);
      continue;
    }
    const text = JSON.stringify({ [key]: member });
    if (text.length === 2)
      out.length = start; // {}: no JSON text of this member
    else out.text(text.slice(1, -1));
  }
  out.byte(0x7d); // }
}
