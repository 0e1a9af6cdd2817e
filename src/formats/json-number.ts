/**
 * A JSON number read straight from UTF-8 bytes, to the double JSON.parse and Number() give (the
 * nearest double, ties to even: ECMAScript's StringToNumber, IEEE 754 round-to-nearest), without
 * making a string. src/formats/json-columns-reader.ts reads the observation columns of a request body
 * with it (issue 14: V8's parse of 80 000 numbers of 16–17 significant digits was ~5 ms a GPS-like day).
 *
 * Grammar (RFC 8259 §6): -? (0 | [1-9][0-9]*) (. [0-9]+)? ([eE] [+-]? [0-9]+)?
 *
 * The value is (−1)^s · W · 10^e with W the significant digits as an integer (leading zeros dropped).
 * Three ways to its double, each exact:
 * 1. **Clinger's fast path** (Clinger 1990, "How to read floating point numbers accurately", PLDI):
 *    when W < 2^53 and |e| ≤ 22, W and 10^|e| are doubles, so W · 10^e (or W / 10^−e) is one IEEE
 *    operation, rounded once, hence correctly.
 * 2. **16–19 digits, |e| ≤ 22:** W = wₕ + wₗ exactly as two doubles (W = hi · 10^m + lo, hi the first
 *    15 digits, with Dekker's exact product and Knuth's exact sum, below). The candidate q is the
 *    double nearest to wₕ · 10^e; the residual r = x − q (x the exact value) is computed from
 *    error-free transformations (Dekker 1971 TwoProduct, Knuth TAOCP vol. 2 §4.2.2 TwoSum) up to a
 *    rounding error below 2^−50 of the terms summed, and compared with half the gaps to q's neighbours:
 *    inside → q; beyond → the neighbour (and again); within that error of a half gap (a near-tie, where
 *    the order cannot be told from doubles) → undecided.
 * 3. Anything else (more than 19 significant digits, |e| > 22, a near-tie): `Number()` of the text.
 *
 * The shape of nearly every number in an observation column (a sign, up to 15 integer digits, a fraction of
 * up to 22 digits, no exponent: `-0.01234567891234567`, `100807.49848385264`, `12`) is read first by
 * `readPlainNumber`: one loop per run of digits, without the general reader's count of digits and
 * exponent per byte; it gives the same W and e to the same ways 1 and 2, and leaves everything else,
 * near-ties included, to the general reader. Way 2 for a quotient starts from wₕ / 10^k + wₗ / 10^k (the
 * nearest double for ~92 % of a day's 17-digit numbers, against ~69 % from wₕ / 10^k alone) and decides
 * by the half gaps alone (no early exit whose outcome is a coin toss for the branch predictor). Issue 14,
 * the GPS-like day's 79 356 numbers alone, in-process by turns against the reader before: 6.5 → 4.2 ms
 * CPU, median of 200 pairs 0.66× (load 13–16).
 *
 * The undecided band is 2^−45 of the terms (a few units of 2^−44 of an ulp): the rounding errors of the
 * three operations that form r are at most 3 · 2^−53 of them (Higham 2002, "Accuracy and Stability of
 * Numerical Algorithms", §2.2 and §4.2, standard model of floating-point arithmetic).
 */

/** 10^k [–] for k = 0..22: each exactly a double (5^22 < 2^53). */
const POW10 = [
  1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/** 5^k for k = 0..22, each exactly a double (5^22 < 2^53): W · 10^k is exact when W · 5^k < 2^53. */
const POW5 = POW10.map((_, k) => 5 ** k);

const TWO_53 = 9007199254740992;
/** Veltkamp's splitting constant 2^27 + 1 (Dekker 1971). */
const SPLITTER = 134217729;
/** The undecided band around a half gap, relative to the sum of the residual's terms (see the header). */
const BAND = 2 ** -45;
/**
 * |r| below q · 2^−55 decides q at once (roundedProduct): both half gaps are at least q · 2^−54, and the
 * rounding errors of r are far below the other half of that.
 */
const QUICK = 2 ** -55;

/**
 * Significant digits kept in `hi` (< 10^8) and in all (up to 11 more in `lo`, < 10^11): then
 * hi · 10^k (k the digits in lo) is a double exactly (hi · 5^k < 10^8 · 5^11 < 2^53, times 2^k), and
 * W = hi · 10^k + lo is one exact sum of two doubles away.
 */
const HI_DIGITS = 8;
const MAX_DIGITS = 19;

/** Words of a double (little-endian machines: the high word, with the sign and exponent, second): its exponent bits. */
const f64 = new Float64Array(1);
const u32 = new Uint32Array(f64.buffer);
const HI = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0;

/** Veltkamp's split of 10^k into two halves of 26 bits: 10^k = POW10_HI[k] + POW10_LO[k] exactly. */
const POW10_HI = POW10.map((b) => SPLITTER * b - (SPLITTER * b - b));
const POW10_LO = POW10.map((b, k) => b - POW10_HI[k]!);

/**
 * Low part of Dekker's exact product a · 10^k = p + (returned), p = fl(a · 10^k) (Dekker 1971; exact
 * without overflow or underflow, as here).
 */
function productError(a: number, k: number, p: number): number {
  const t = SPLITTER * a;
  const ah = t - (t - a);
  const al = a - ah;
  const bh = POW10_HI[k]!;
  const bl = POW10_LO[k]!;
  return al * bl - (p - ah * bh - al * bh - ah * bl);
}

/** 2^k at [k + 1074] for k = −1074..1023: every power of two a double holds. */
const TWO_TO = Float64Array.from({ length: 2098 }, (_, i) => 2 ** (i - 1074));
const TWO_32 = 4294967296;

/**
 * k with 2^k ≤ q < 2^(k+1), q a positive normal double. For 2^−32 ≤ q < 2^32 (every number of an observation
 * column) from Math.clz32 of the integer part of q or of q · 2^32 (exact), in registers; else from its
 * exponent bits (through memory: ~3× the cost, issue 14).
 */
function binaryExponent(q: number): number {
  if (q >= 1) {
    if (q < TWO_32) return 31 - Math.clz32(q);
  } else if (q >= 1 / TWO_32) return -1 - Math.clz32(q * TWO_32);
  f64[0] = q;
  return ((u32[HI]! >>> 20) & 0x7ff) - 1023;
}

/** The gap from q (a positive normal double, 2^k ≤ q < 2^(k+1)) to the next double up [same unit as q]. */
const gapAbove = (k: number) => TWO_TO[k - 52 + 1074]!;

/** q (2^k ≤ q < 2^(k+1)) is a power of two: the gap below it is half the gap above. */
const isPowerOfTwo = (q: number, k: number) => q === TWO_TO[k + 1074];

/**
 * W · 10^e correctly rounded, W = wh + wl exactly (|wl| ≤ ulp(wh)/2, W ≥ 2^53, |e| ≤ 22), or NaN when the
 * rounding is not decided here (a near-tie), written to `wide[0]`: a double returned by a function that V8
 * does not inline is a heap number, garbage for each value (issue 14: ~46 000 a GPS-like day when the
 * function holding both ways below was too big to inline).
 */
const wide = new Float64Array(1);
function roundedWide(wh: number, wl: number, e: number): void {
  if (e >= 0) roundedProduct(wh, wl, e);
  else roundedQuotient(wh, wl, -e);
}

/** (wh + wl) · 10^e correctly rounded, or NaN, to `wide[0]` (roundedWide). */
function roundedProduct(wh: number, wl: number, e: number): void {
  // x = (wh + wl) · P; r(q) = x − q = (c1 − q) + c2 + wl·P with c1 + c2 = wh · P exactly.
  const P = POW10[e]!;
  const c1 = wh * P;
  const c2 = productError(wh, e, c1);
  const wlP = wl * P;
  let q = c1;
  for (let step = 0; step < 4; step++) {
    const d = c1 - q; // exact (Sterbenz: q within a few ulps of c1)
    const r = d + c2 + wlP;
    // Both half gaps exceed q · 2^−54 (the one below a power of two equals it): well inside, q.
    if (Math.abs(r) < q * QUICK) {
      wide[0] = q;
      return;
    }
    const band = (Math.abs(d) + Math.abs(c2) + Math.abs(wlP)) * BAND;
    const k = binaryExponent(q);
    const up = gapAbove(k) / 2;
    const down = isPowerOfTwo(q, k) ? up / 2 : up;
    if (r < up - band && r > -down + band) {
      wide[0] = q;
      return;
    }
    if (r > up + band) q += 2 * up;
    else if (r < -down - band) q -= 2 * down;
    else break;
  }
  wide[0] = NaN;
}

/** (wh + wl) / 10^k correctly rounded, or NaN, to `wide[0]` (roundedWide). */
function roundedQuotient(wh: number, wl: number, k: number): void {
  // x = (wh + wl) / P; r(q) · P = (wh − a1) − a2 + wl with a1 + a2 = q · P exactly. The first q with wl in
  // it: one step (a second product) for ~8 % of a day's numbers instead of ~31 % from wh / P alone.
  const P = POW10[k]!;
  let q = wh / P + wl / P;
  for (let step = 0; step < 4; step++) {
    const a1 = q * P;
    const a2 = productError(q, k, a1);
    const d = wh - a1; // exact (Sterbenz)
    const r = d - a2 + wl;
    const band = (Math.abs(d) + Math.abs(a2) + Math.abs(wl)) * BAND;
    const b = binaryExponent(q);
    const gap = gapAbove(b);
    const powerOfTwo = isPowerOfTwo(q, b);
    const up = (gap / 2) * P; // exact: a power of two times 10^k
    const down = powerOfTwo ? up / 2 : up;
    if (r < up - band && r > -down + band) {
      wide[0] = q;
      return;
    }
    if (r > up + band) q += gap;
    else if (r < -down - band) q -= powerOfTwo ? gap / 2 : gap;
    else break;
  }
  wide[0] = NaN;
}

/**
 * The value of four ASCII digits in the 32-bit little-endian word `w` (its first byte the first digit), or
 * −1 when a byte is not a digit. Per byte b: b is a digit when b & 0xf0 = 0x30 (0x30..0x3f, so b + 6 carries
 * into no other byte) and then (b + 6) & 0xf0 = 0x30 (not 0x3a..0x3f). The value by pairs: 10 · d₀ + d₁ and 10 · d₂ + d₃ in
 * the even bytes, then 100 · (first pair) + (second pair).
 */
function fourDigits(w: number): number {
  if ((w & 0xf0f0f0f0) !== 0x30303030 || ((w + 0x06060606) & 0xf0f0f0f0) !== 0x30303030) return -1;
  const d = w - 0x30303030;
  const pairs = (d * 10 + (d >>> 8)) & 0x00ff00ff;
  return (pairs & 0xff) * 100 + (pairs >>> 16);
}

/** Latin-1 text of bytes [start, end) (a number is ASCII), for Number(). */
function asciiText(bytes: Uint8Array, start: number, end: number): string {
  let text = '';
  for (let i = start; i < end; i++) text += String.fromCharCode(bytes[i]!);
  return text;
}

/**
 * The JSON number that starts at `start` in `bytes` (UTF-8; `view` a DataView of the same bytes, for
 * reading four digits at a time), exactly as JSON.parse reads it, written to
 * `out[at]` (NaN when the bytes there are not a JSON number: JSON has no NaN). Returns the index after
 * the number's last byte; the caller checks that what follows is allowed there (`1.5x`, `01` stop early).
 */
export function readJsonNumber(bytes: Uint8Array, view: DataView, start: number, out: Float64Array, at: number): number {
  const end = readPlainNumber(bytes, view, start, out, at);
  return end >= 0 ? end : readAnyNumber(bytes, view, start, out, at);
}

const MINUS = 0x2d;
const POINT = 0x2e;
const ZERO = 0x30;

/**
 * A number of the plain shape −?(0|[1-9]d{0,14})(.d{1,22})? not followed by an exponent, as readJsonNumber
 * reads it, written to `out[at]`; returns the index after it, or −1 (nothing written) for any other text
 * and for a near-tie, which readJsonNumber's general path then reads.
 *
 * Its digits as W = hi · 10^m + lo: hi the integer digits and the first four fraction digits (< 2^53,
 * checked), lo the m further fraction digits (m ≤ 15, so lo < 2^53). hi · 10^m is exact when
 * hi · 5^m < 2^53 (checked; else −1), so w = fl(hi · 10^m + lo) with its remainder lo − (w − hi · 10^m)
 * (Fast2Sum: hi · 10^m ≥ 10^m > lo when hi > 0) is W exactly, as two doubles: then the ways 1 and 2 of the
 * header, with e = −(fraction digits). Each loop reads a byte `^ 0x30`: the digits give 0..9, every other
 * byte more, and a read past the end (undefined) 0x30, so the loops stop at the end of the bytes too.
 */
export function readPlainNumber(bytes: Uint8Array, view: DataView, start: number, out: Float64Array, at: number): number {
  let p = start;
  const negative = bytes[p] === MINUS;
  if (negative) p++;
  const integerStart = p;
  let c = bytes[p]! ^ ZERO;
  if (c > 9) return -1;
  let hi = c;
  p++;
  if (c === 0) {
    if ((bytes[p]! ^ ZERO) <= 9) return -1; // "01" is not JSON: the general path stops after the 0
  } else {
    while ((c = bytes[p]! ^ ZERO) <= 9) {
      hi = hi * 10 + c;
      p++;
    }
    if (p - integerStart > 15) return -1;
  }
  if (bytes[p] !== POINT) {
    if (isExponent(bytes[p])) return -1;
    out[at] = negative ? -hi : hi; // an integer of up to 15 digits: exact
    return p;
  }
  p++;
  const fractionStart = p;
  const four = p + 4 <= bytes.length ? fourDigits(view.getInt32(p, true)) : -1;
  if (four >= 0) {
    hi = hi * 10_000 + four;
    p += 4;
  } else {
    while (p < fractionStart + 4 && (c = bytes[p]! ^ ZERO) <= 9) {
      hi = hi * 10 + c;
      p++;
    }
    if (p === fractionStart) return -1; // "1." is not JSON
  }
  const loStart = p;
  let lo = 0;
  for (let four: number; p + 4 <= bytes.length && (four = fourDigits(view.getInt32(p, true))) >= 0; p += 4) lo = lo * 10_000 + four;
  while ((c = bytes[p]! ^ ZERO) <= 9) {
    lo = lo * 10 + c;
    p++;
  }
  const m = p - loStart;
  const e = fractionStart - p;
  if (isExponent(bytes[p]) || m > 15 || e < -22 || !(hi < TWO_53)) return -1;
  let x: number;
  if (m === 0) x = hi / POW10[-e]!;
  else {
    if (!(hi * POW5[m]! < TWO_53)) return -1;
    const t = hi * POW10[m]!;
    const wh = t + lo;
    if (wh < TWO_53) x = wh / POW10[-e]!;
    else {
      roundedQuotient(wh, lo - (wh - t), -e);
      x = wide[0]!;
    }
    if (Number.isNaN(x)) return -1; // a near-tie: Number() of the text, by the general path
  }
  out[at] = negative ? -x : x;
  return p;
}

/** e or E. */
const isExponent = (c: number | undefined) => c === 0x65 || c === 0x45;

/** readJsonNumber for any text (the grammar in full, any number of digits, exponents). */
function readAnyNumber(bytes: Uint8Array, view: DataView, start: number, out: Float64Array, at: number): number {
  const n = bytes.length;
  let i = start;
  let c = i < n ? bytes[i]! : 0;
  const negative = c === 45; // -
  if (negative) c = ++i < n ? bytes[i]! : 0;
  let hi = 0; // the first 8 significant digits
  let lo = 0; // the next 11
  let digits = 0; // significant digits (after leading zeros)
  let e = 0; // decimal exponent of the last kept digit
  if (c === 48) {
    c = ++i < n ? bytes[i]! : 0; // a leading 0 stands alone
  } else if (c >= 49 && c <= 57) {
    do {
      hi = hi * 10 + (c - 48);
      digits++;
      c = ++i < n ? bytes[i]! : 0;
    } while (c >= 48 && c <= 57 && digits < HI_DIGITS);
    while (c >= 48 && c <= 57 && digits < MAX_DIGITS) {
      lo = lo * 10 + (c - 48);
      digits++;
      c = ++i < n ? bytes[i]! : 0;
    }
    while (c >= 48 && c <= 57) {
      digits++; // beyond 19: left to Number()
      e++;
      c = ++i < n ? bytes[i]! : 0;
    }
  } else {
    out[at] = NaN;
    return i;
  }
  if (c === 46) {
    // . then at least one digit
    c = ++i < n ? bytes[i]! : 0;
    if (!(c >= 48 && c <= 57)) {
      out[at] = NaN;
      return i;
    }
    if (digits === 0) {
      while (c === 48) {
        e--; // leading zeros of the fraction
        c = ++i < n ? bytes[i]! : 0;
      }
    }
    // Four digits at a time while they fit (a fraction of 14–16 digits is most of a column's bytes).
    while (digits <= HI_DIGITS - 4 && i + 4 <= n) {
      const four = fourDigits(view.getInt32(i, true));
      if (four < 0) break;
      hi = hi * 10_000 + four;
      digits += 4;
      e -= 4;
      i += 4;
    }
    c = i < n ? bytes[i]! : 0;
    while (c >= 48 && c <= 57 && digits < HI_DIGITS) {
      hi = hi * 10 + (c - 48);
      digits++;
      e--;
      c = ++i < n ? bytes[i]! : 0;
    }
    while (digits <= MAX_DIGITS - 4 && i + 4 <= n) {
      const four = fourDigits(view.getInt32(i, true));
      if (four < 0) break;
      lo = lo * 10_000 + four;
      digits += 4;
      e -= 4;
      i += 4;
    }
    c = i < n ? bytes[i]! : 0;
    while (c >= 48 && c <= 57 && digits < MAX_DIGITS) {
      lo = lo * 10 + (c - 48);
      digits++;
      e--;
      c = ++i < n ? bytes[i]! : 0;
    }
    while (c >= 48 && c <= 57) {
      digits++; // beyond 19: left to Number()
      c = ++i < n ? bytes[i]! : 0;
    }
  }
  if (c === 101 || c === 69) {
    // e E, a sign, at least one digit
    c = ++i < n ? bytes[i]! : 0;
    const negativeExponent = c === 45;
    if (c === 45 || c === 43) c = ++i < n ? bytes[i]! : 0;
    if (!(c >= 48 && c <= 57)) {
      out[at] = NaN;
      return i;
    }
    let exponent = 0;
    do {
      if (exponent < 100_000) exponent = exponent * 10 + (c - 48);
      c = ++i < n ? bytes[i]! : 0;
    } while (c >= 48 && c <= 57);
    e += negativeExponent ? -exponent : exponent;
  }
  if (digits === 0) {
    out[at] = negative ? -0 : 0;
    return i;
  }
  let x = NaN;
  if (digits <= MAX_DIGITS && e >= -22 && e <= 22) {
    const loDigits = digits - HI_DIGITS;
    if (loDigits <= 0) x = e >= 0 ? hi * POW10[e]! : hi / POW10[-e]!;
    else {
      const t = hi * POW10[loDigits]!; // exact (HI_DIGITS)
      const w = t + lo;
      if (w < TWO_53)
        x = e >= 0 ? w * POW10[e]! : w / POW10[-e]!; // W < 2^53: w is W exactly
      else {
        roundedWide(w, lo - (w - t), e); // Fast2Sum (t ≥ lo): w + (lo − (w − t)) = W exactly
        x = wide[0]!;
      }
    }
  }
  if (Number.isNaN(x)) out[at] = Number(asciiText(bytes, start, i));
  else out[at] = negative ? -x : x;
  return i;
}

const one = new Float64Array(1);

/** The JSON number of the whole of `text` (ASCII), as readJsonNumber reads it; undefined when it is not one. */
export function jsonNumberOf(text: string): number | undefined {
  const bytes = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c > 0x7f) return undefined; // not ASCII: not a JSON number
    bytes[i] = c;
  }
  const end = readJsonNumber(bytes, new DataView(bytes.buffer), 0, one, 0);
  const v = one[0]!;
  return end === text.length && !Number.isNaN(v) ? v : undefined;
}
