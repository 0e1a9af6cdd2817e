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

/*
 * The batch loops. The models' batch loops (MappingEvaluator.mapBatch) evaluate one set of coefficients at
 * many elevations: they take mariniNumerator() once and write the denominator out in the loop,
 * numerator / (s + a/(s + b/(s + c))), with the coefficients as local numbers, the same operations in the
 * same order as marini() (the same bits: test/domain/mapping.test.ts). They do not call a helper for it:
 * with one helper shared by Niell's and VMF1's loops, Niell's loop ran at 53–66 ns of CPU a direction
 * instead of 15–17 in most processes (100 000 directions after every model had run; slow in 17 of 21
 * processes with the helper, in none of 11 with the loop written out; V8 11.3, Node 20), which
 * `npm run bench -- apriori` read as 0.56–0.6 of the hand-written kernel.
 */
