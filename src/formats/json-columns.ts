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

const ZERO = 0x30;
const MINUS = 0x2d;
const DOT = 0x2e;
const POW10 = Array.from({ length: 16 }, (_, d) => 10 ** d);
const MAX_EXACT = 2 ** 53;

/** The longest number written: sign, 16 digits, the point. */
const MAX_NUMBER_BYTES = 24;
const INT32_LIMIT = 2 ** 31;

/**
 * Writes the digits of a non-negative integer k < 2^53 at `at`, at least `minDigits` of them (leading zeros),
 * from the last digit back; returns the position after them. Below 2^31 the division is an int32 one.
 */
function writeDigits(b: Uint8Array, at: number, k: number, minDigits: number): number {
  let count = 1;
  while (count < 16 && k >= POW10[count]!) count++;
  if (count < minDigits) count = minDigits;
  let i = at + count - 1;
  if (k < INT32_LIMIT) {
    let v = k | 0;
    for (; i >= at; i--) {
      const q = (v / 10) | 0;
      b[i] = ZERO + v - q * 10;
      v = q;
    }
  } else {
    for (; i >= at; i--) {
      const q = Math.floor(k / 10);
      b[i] = ZERO + k - q * 10;
      k = q;
    }
  }
  return at + count;
}

/** A growing byte buffer for JSON text. */
class JsonBytes {
  bytes: Uint8Array;
  length = 0;
  constructor(capacity: number) {
    this.bytes = new Uint8Array(Math.max(capacity, 64));
  }
  reserve(extra: number): void {
    if (this.length + extra <= this.bytes.length) return;
    const grown = new Uint8Array(Math.max(this.bytes.length * 2, this.length + extra));
    grown.set(this.bytes.subarray(0, this.length));
    this.bytes = grown;
  }
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
  /** x rounded to `decimals` (0..15) as JSON; null for a non-finite value. */
  rounded(x: number, decimals: number): void {
    if (!Number.isFinite(x)) return this.ascii('null');
    const scale = POW10[decimals]!;
    const units = Math.round(x * scale); // Math.round as roundTo rounds: halves towards +∞
    const k = Math.abs(units);
    if (k >= MAX_EXACT) return this.ascii(JSON.stringify(units / scale));
    this.reserve(MAX_NUMBER_BYTES);
    const b = this.bytes;
    let at = this.length;
    if (k === 0) {
      b[at] = ZERO; // also -0 and tiny negatives, as JSON.stringify(-0) = "0"
      this.length = at + 1;
      return;
    }
    if (units < 0) b[at++] = MINUS;
    const whole = Math.floor(k / scale);
    let fraction = k - whole * scale;
    at = writeDigits(b, at, whole, 1);
    if (fraction !== 0) {
      let width = decimals;
      while (fraction % 10 === 0) {
        fraction /= 10;
        width--;
      }
      b[at++] = DOT;
      at = writeDigits(b, at, fraction, width);
    }
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
export function columnsJsonBytes(columns: Record<string, JsonColumn>): Uint8Array {
  let rows = 0;
  for (const c of Object.values(columns)) rows += c.values.length;
  const out = new JsonBytes(rows * 12 + 64);
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
export function jsonWithRawMembers(answer: Record<string, unknown>, raw: Record<string, Uint8Array>): Uint8Array {
  const markers = Object.keys(raw).map((key) => ({ key, text: JSON.stringify(`\u0000raw:${key}\u0000`) }));
  const text = JSON.stringify({ ...answer, ...Object.fromEntries(markers.map((m) => [m.key, JSON.parse(m.text) as string])) });
  const parts: Uint8Array[] = [];
  let from = 0;
  for (const { key, at } of markers.map((m) => ({ ...m, at: text.indexOf(m.text) })).sort((a, b) => a.at - b.at)) {
    parts.push(Buffer.from(text.slice(from, at), 'utf8'), raw[key]!);
    from = at + markers.find((m) => m.key === key)!.text.length;
  }
  parts.push(Buffer.from(text.slice(from), 'utf8'));
  return Buffer.concat(parts);
}
