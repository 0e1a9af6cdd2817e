/**
 * A number rounded to a fixed count of decimals, written as JSON text straight into a byte buffer: the
 * number formatter of the column answers (json-columns.ts, the batch and estimation routes), where
 * 10^5–10^6 numbers make one answer and JSON.stringify's shortest round-trip conversion of each double was
 * the slow part (issue 14).
 *
 * The value written is the one roundTo of output-precision.ts gives, Math.round(x · 10^d) / 10^d (halves
 * towards +∞), as the integer count of its last decimal, k = |Math.round(x · 10^d)|, split into whole and
 * fraction digits. Integers up to 2^53 are exact doubles, so the digits are exactly those of k / 10^d, and
 * the text reads back as the same double (a decimal of at most 15 significant digits reads back as the
 * double nearest to it). Trailing zeros of the fraction are dropped (1.5, not 1.500000); -0 and values that
 * round to 0 are written 0; non-finite values null, as JSON.stringify writes them. A value whose k reaches
 * 2^53 (|x| ≥ 9·10^9 with 6 decimals; no quantity of this service comes near) is written by JSON.stringify
 * of the rounded value.
 *
 * How it is fast: whole and fraction are int32 for every value below 2^31 units (the fraction always, for
 * up to 9 decimals), so the digits come from int32 divisions by constants, two at a time from a table of
 * digit pairs; the fraction is written at its full width and its trailing zeros are then cut by moving the
 * end back, so no floating-point remainder is taken per number.
 *
 * Pure: numbers in, bytes out. Tested against Number.prototype.toFixed and JSON.stringify
 * (test/formats/rounded-decimal-bytes.test.ts).
 */

/** The most bytes one number takes: JSON.stringify's longest text of a double ("-1.7976931348623157e+308"). */
export const MAX_ROUNDED_DECIMAL_BYTES = 24;

/** Most decimals a caller may ask for (10^d exact, k / 10^d in range). */
export const MAX_DECIMALS = 15;

const ZERO = 0x30;
const MINUS = 0x2d;
const DOT = 0x2e;
const POW10 = Array.from({ length: MAX_DECIMALS + 1 }, (_, d) => 10 ** d);
const MAX_EXACT = 2 ** 53;
const INT32_LIMIT = 2 ** 31;

/** "00", "01", … "99" as byte pairs: two digits per int32 division. */
const DIGIT_PAIRS = new Uint8Array(200);
for (let i = 0; i < 100; i++) {
  DIGIT_PAIRS[2 * i] = ZERO + Math.floor(i / 10);
  DIGIT_PAIRS[2 * i + 1] = ZERO + (i % 10);
}

/** Count of decimal digits of a non-negative int32. */
function digitCount(v: number): number {
  if (v < 10) return 1;
  if (v < 100) return 2;
  if (v < 1000) return 3;
  if (v < 10_000) return 4;
  if (v < 100_000) return 5;
  if (v < 1_000_000) return 6;
  if (v < 10_000_000) return 7;
  if (v < 100_000_000) return 8;
  if (v < 1_000_000_000) return 9;
  return 10;
}

/** Writes the last `count` digits of the non-negative int32 v so that they end just before `end` (leading zeros as needed). */
function writeInt32Digits(b: Uint8Array, end: number, value: number, count: number): void {
  let v = value | 0; // an int32 from here on: divisions by the constant 100 become multiplications
  let i = end;
  let left = count;
  while (left >= 2) {
    const q = (v / 100) | 0;
    const pair = (v - q * 100) << 1;
    b[--i] = DIGIT_PAIRS[pair + 1]!;
    b[--i] = DIGIT_PAIRS[pair]!;
    v = q;
    left -= 2;
  }
  if (left === 1) b[--i] = ZERO + (v % 10);
}

/** Writes the last `count` digits of a non-negative integer below 2^53 (doubles) so that they end just before `end`. */
function writeWideDigits(b: Uint8Array, end: number, k: number, count: number): void {
  for (let i = end - 1; i >= end - count; i--) {
    const q = Math.floor(k / 10);
    b[i] = ZERO + (k - q * 10);
    k = q;
  }
}

function wideDigitCount(k: number): number {
  let count = 1;
  while (count < 16 && k >= POW10[count]!) count++;
  return count;
}

/** An ASCII text (JSON.stringify of a number) at `at`; returns the position after it. */
function writeAscii(b: Uint8Array, at: number, text: string): number {
  for (let i = 0; i < text.length; i++) b[at + i] = text.charCodeAt(i);
  return at + text.length;
}

/**
 * Writes x rounded to `decimals` (0..MAX_DECIMALS) as JSON text at `at`, and returns the position after it.
 * The caller makes sure MAX_ROUNDED_DECIMAL_BYTES bytes are free from `at`; bytes between the returned position
 * and at + MAX_ROUNDED_DECIMAL_BYTES may have been written (cut trailing zeros) and are free again.
 */
export function writeRoundedDecimal(b: Uint8Array, at: number, x: number, decimals: number): number {
  const scale = POW10[decimals]!;
  const units = Math.round(x * scale); // as roundTo (output-precision.ts) rounds: halves towards +∞
  const k = units < 0 ? -units : units;
  if (!(k < MAX_EXACT)) return writeAscii(b, at, Number.isFinite(x) ? JSON.stringify(units / scale) : 'null');
  if (k === 0) {
    b[at] = ZERO; // also -0 and small negatives rounded to -0, as JSON.stringify(-0) is "0"
    return at + 1;
  }
  if (units < 0) b[at++] = MINUS;
  const whole = Math.floor(k / scale);
  const fraction = k - whole * scale; // exact: integers below 2^53
  if (whole < INT32_LIMIT) {
    const count = digitCount(whole);
    at += count;
    writeInt32Digits(b, at, whole, count);
  } else {
    const count = wideDigitCount(whole);
    at += count;
    writeWideDigits(b, at, whole, count);
  }
  if (fraction === 0) return at;
  b[at] = DOT;
  let end = at + 1 + decimals;
  if (fraction < INT32_LIMIT) writeInt32Digits(b, end, fraction, decimals);
  else writeWideDigits(b, end, fraction, decimals);
  while (b[end - 1] === ZERO) end--; // the fraction is not 0, so the point is never reached
  return end;
}

/**
 * A whole column: `x0,x1,…` (no brackets), each value as writeRoundedDecimal writes it, from `at`; returns the
 * position after the last value. The caller makes sure values.length · (MAX_ROUNDED_DECIMAL_BYTES + 1) bytes
 * are free from `at`. One loop over a Float64Array (no per-value capacity check or element-kind dispatch).
 */
export function writeRoundedDecimalList(b: Uint8Array, at: number, values: Float64Array, decimals: number): number {
  const n = values.length;
  for (let i = 0; i < n; i++) {
    if (i > 0) b[at++] = 0x2c; // ,
    at = writeRoundedDecimal(b, at, values[i]!, decimals);
  }
  return at;
}
