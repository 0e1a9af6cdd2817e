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
  /** A number as JSON.stringify writes it: String(x) (shortest round trip; ASCII), null when not finite. */
  number(x: number): void {
    const text = Number.isFinite(x) ? String(x) : 'null';
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
