/**
 * Marini (1972) continued fraction, normalised to 1 at zenith, in the three-term form used by
 * Herring (1992) and Niell (1996), eq. 4 of the corrected reprint:
 *
 *   f(e; a, b, c) = (1 + a/(1 + b/(1 + c))) / (sin e + a/(sin e + b/(sin e + c)))
 *
 * @param sinElevation sin e of the (vacuum) elevation angle [-], in (0, 1]
 * @param a,b,c coefficients [-]
 * @returns mapping factor [-], 1 at zenith
 */
export function marini(sinElevation: number, a: number, b: number, c: number): number {
  const top = 1 + a / (1 + b / (1 + c));
  const bottom = sinElevation + a / (sinElevation + b / (sinElevation + c));
  return top / bottom;
}

/** The numerator of marini(): the normalisation to 1 at zenith, a constant of the coefficients [-]. */
export function mariniNumerator(a: number, b: number, c: number): number {
  return 1 + a / (1 + b / (1 + c));
}

/**
 * marini() with its numerator computed once (mariniNumerator(a, b, c)): the batch loops evaluate one
 * set of coefficients at many elevations, and the numerator's three divisions need not be repeated.
 */
export function mariniWithNumerator(sinElevation: number, numerator: number, a: number, b: number, c: number): number {
  return numerator / (sinElevation + a / (sinElevation + b / (sinElevation + c)));
}
