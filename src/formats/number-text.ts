/**
 * The one reader of decimal numbers in text (CSV cells, query values, RINEX fields), shared by all
 * formats. A hand-written scanner: it looks at each character once, so its time is linear in the
 * length of the text (a regular expression with nested or adjacent quantifiers over the same digits,
 * such as /^[+-]?(\d+\.?\d*|\.\d+)…$/, backtracks quadratically on a long digit string that does not
 * match: 20–98 s for one 200 kB cell). Text longer than MAX_NUMBER_CHARS is not a number at all.
 *
 * Grammar (common practice, the decimal literal of C and JSON without their restrictions on leading
 * zeros): [+-]? (digits [. digits?] | . digits) ([eE] [+-]? digits)?; with `fortranExponent` the
 * exponent letter may also be d or D (FORTRAN D format, RINEX).
 */

/** Longest text read as a number [characters]: 17 significant digits, sign, point and exponent fit many times over. */
export const MAX_NUMBER_CHARS = 64;

const isDigit = (c: number) => c >= 48 && c <= 57; // '0'..'9'

/**
 * @param text the text, already trimmed by the caller (surrounding blanks make it not a number)
 * @returns the number, or undefined when the text is not a decimal numeral of the grammar above
 */
export function readNumber(text: string, options: { fortranExponent?: boolean } = {}): number | undefined {
  const n = text.length;
  if (n === 0 || n > MAX_NUMBER_CHARS) return undefined;
  let i = 0;
  let c = text.charCodeAt(0);
  if (c === 43 || c === 45) i++; // + -
  let mantissaDigits = 0;
  while (i < n && isDigit(text.charCodeAt(i))) {
    i++;
    mantissaDigits++;
  }
  if (i < n && text.charCodeAt(i) === 46) {
    i++; // .
    while (i < n && isDigit(text.charCodeAt(i))) {
      i++;
      mantissaDigits++;
    }
  }
  if (mantissaDigits === 0) return undefined;
  let fortran = false;
  if (i < n) {
    c = text.charCodeAt(i);
    const e = c === 101 || c === 69; // e E
    const d = options.fortranExponent === true && (c === 100 || c === 68); // d D
    if (!e && !d) return undefined;
    fortran = d;
    i++;
    if (i < n && (text.charCodeAt(i) === 43 || text.charCodeAt(i) === 45)) i++;
    let exponentDigits = 0;
    while (i < n && isDigit(text.charCodeAt(i))) {
      i++;
      exponentDigits++;
    }
    if (exponentDigits === 0 || i !== n) return undefined;
  }
  return Number(fortran ? text.replace(/[dD]/, 'e') : text);
}
