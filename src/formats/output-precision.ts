/**
 * The one table of output precisions: how many decimals each quantity keeps in JSON answers and in
 * CSV cells. Every writer of a PWV, delay or station column takes its decimals from here, so one
 * quantity has one precision in every file (a CSV column never mixes 2.3 and 2.345678).
 *
 * Each step is far below the uncertainty of the quantity (and it halves the size and the time of a
 * station-year as CSV): delays 1 µm (σ of a ZTD ≥ ~1 mm), PWV 0.0001 mm (σ ≥ ~0.5 mm), pressure
 * 0.0001 hPa, temperatures 0.0001 K, Π 1e-8; coordinates 1e-6° (about 0.1 m); ellipsoidal heights
 * 1 mm as stored; geoid undulation and altitude 1 cm (the EGM96 grid with bilinear interpolation is
 * good to a few cm: src/domain/geometry/geoid.ts).
 *
 * Pure: numbers in, numbers or text out.
 */

export const OUTPUT_DECIMALS = {
  /** delays (ZTD, ZHD, ZWD and their σ) [m] */
  m: 6,
  /** PWV and its σ [mm] */
  mm: 4,
  /** pressure [hPa] */
  hpa: 4,
  /** temperatures [°C or K] */
  k: 4,
  /** conversion factor Π [-] */
  pi: 8,
  /** latitude, longitude [deg] */
  deg: 6,
  /** ellipsoidal heights [m] */
  heightM: 3,
  /** geoid undulation and altitude above mean sea level [m] */
  geoidM: 2,
} as const;

const SCALE = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8];

/** x rounded to `digits` decimals (JSON answers); null stays null. */
export const roundTo = (x: number | null, digits: number): number | null =>
  x === null ? null : Math.round(x * SCALE[digits]!) / SCALE[digits]!;

/** CSV cell with exactly `digits` decimals (trailing zeros kept); empty for null. */
export const fixedCell = (x: number | null, digits: number): string => (x === null ? '' : x.toFixed(digits));
