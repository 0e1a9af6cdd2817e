/**
 * Decimal text of a number rounded to a fixed count of decimals, exactly as
 * `String(Math.round(x * 10^d) / 10^d)` writes it (shortest round-trip form, trailing zeros
 * dropped, "-0" written "0"), but built from the integer Math.round(x * 10^d): about three times
 * faster, which matters for the 1.3 million cells of a station-year as CSV.
 *
 * Why the texts agree: the integer n has at most 15 digits here, and a decimal of at most 15
 * significant digits is the shortest text that reads back as the nearest double to it (IEEE 754
 * binary64 keeps 15 decimal digits), so String(n / 10^d) writes exactly the digits of n with the
 * point moved. Outside that case (|n| ≥ 10^15, |x| < 10^-6 where String switches to exponent
 * form, NaN, ±Infinity) the text comes from String itself.
 */

const SCALE = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8] as const;
const ZEROS = '00000000';

/** @param digits decimals kept, 0..8 */
export function roundedDecimalText(x: number, digits: number): string {
  const scale = SCALE[digits]!;
  const n = Math.round(x * scale);
  const a = Math.abs(n);
  if (!(a < 1e15) || (a !== 0 && a < scale * 1e-6)) return String(n / scale);
  if (a === 0) return '0';
  const whole = Math.floor(a / scale);
  let fraction = a - whole * scale;
  const sign = n < 0 ? '-' : '';
  if (fraction === 0) return `${sign}${whole}`;
  let fractionDigits = digits;
  while (fraction % 10 === 0) {
    fraction /= 10;
    fractionDigits--;
  }
  const text = String(fraction);
  return `${sign}${whole}.${ZEROS.slice(0, fractionDigits - text.length)}${text}`;
}
