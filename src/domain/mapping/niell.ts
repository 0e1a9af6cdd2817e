/**
 * Niell (1996) mapping functions, hydrostatic (with seasonal term and height correction) and wet.
 *
 * Niell, A. E. (1996), Global mapping functions for the atmosphere delay at radio wavelengths,
 * J. Geophys. Res. 101(B2), 3227–3246 (corrected reprint). Coefficients: Table 3 there, confirmed
 * against the reproduction in Leick, Rapoport & Tatarnikov, GPS Satellite Surveying, Table 6.1
 * (hydrostatic) and a journal reproduction (wet); see docs/constants.md.
 *
 * - Latitude: linear interpolation in |φ| between 15° and 75°, held constant outside (confirmed).
 * - Seasonal term: p(φ, t) = p_avg(φ) − p_amp(φ) cos(2π (doy − 28)/365.25) (minus sign and 365.25
 *   confirmed; T0 = 28 from memory); in the southern hemisphere half a year, 365.25/2 d, is added
 *   to doy (from memory).
 * - Height correction (hydrostatic only), eq. 6:
 *     Δm(e) = (1/sin e − f(e; a_ht, b_ht, c_ht)) · H,  H in km (confirmed), H the height above
 *     mean sea level (Niell's fit is against sea-level heights): callers pass the API's ellipsoidal
 *     height minus the geoid undulation (geometry/geoid.ts). Δm is about 0.02 per km at 5°, so a
 *     50 m undulation taken for height would move a 5° slant by about 2.5 mm.
 *
 * Valid for elevations (0°, 90°]; Niell states the fit against ray traces at 3° and above. The
 * functions are evaluated below 3° too; callers attach a warning there.
 */

import { DEG } from '../constants.js';
import { marini, mariniNumerator } from './continued-fraction.js';
import type { MappingContext, MappingEvaluator, MappingModel } from './types.js';

/** Tabulated latitudes [deg]. */
const LATITUDES_DEG = [15, 30, 45, 60, 75] as const;

/** Niell (1996) Table 3, hydrostatic averages (confirmed). */
export const NIELL_HYDROSTATIC_AVERAGE = {
  a: [1.2769934e-3, 1.268323e-3, 1.2465397e-3, 1.2196049e-3, 1.2045996e-3],
  b: [2.9153695e-3, 2.9152299e-3, 2.9288445e-3, 2.9022565e-3, 2.9024912e-3],
  c: [62.610505e-3, 62.837393e-3, 63.721774e-3, 63.824265e-3, 64.258455e-3],
} as const;

/** Niell (1996) Table 3, hydrostatic seasonal amplitudes (confirmed). */
export const NIELL_HYDROSTATIC_AMPLITUDE = {
  a: [0, 1.2709626e-5, 2.6523662e-5, 3.4000452e-5, 4.1202191e-5],
  b: [0, 2.1414979e-5, 3.0160779e-5, 7.2562722e-5, 11.723375e-5],
  c: [0, 9.01284e-5, 4.3497037e-5, 84.795348e-5, 170.37206e-5],
} as const;

/** Niell (1996) Table 3, wet coefficients (confirmed). */
export const NIELL_WET = {
  a: [5.8021897e-4, 5.6794847e-4, 5.8118019e-4, 5.9727542e-4, 6.1641693e-4],
  b: [1.4275268e-3, 1.5138625e-3, 1.4572752e-3, 1.5007428e-3, 1.7599082e-3],
  c: [4.3472961e-2, 4.672951e-2, 4.3908931e-2, 4.4626982e-2, 5.4736038e-2],
} as const;

/** Niell (1996) height-correction coefficients (confirmed). */
export const NIELL_HEIGHT_CORRECTION = { a: 2.53e-5, b: 5.49e-3, c: 1.14e-3 } as const;

/** Day of year of the seasonal minimum of the hydrostatic coefficients [d] (from memory). */
export const NIELL_SEASONAL_PHASE_DOY = 28;

/**
 * Linear interpolation of a tabulated coefficient at |φ| [deg], constant outside 15°..75°.
 */
export function interpolateInLatitude(table: readonly number[], absLatitudeDeg: number): number {
  if (absLatitudeDeg <= LATITUDES_DEG[0]) return table[0]!;
  if (absLatitudeDeg >= LATITUDES_DEG[4]) return table[4]!;
  const i = Math.floor((absLatitudeDeg - 15) / 15);
  const t = (absLatitudeDeg - LATITUDES_DEG[i]!) / 15;
  return table[i]! + t * (table[i + 1]! - table[i]!);
}

/**
 * Niell hydrostatic coefficients at a latitude and day of year.
 *
 * @param latitudeRad geodetic latitude [rad]
 * @param dayOfYear fractional day of year, UTC [d]
 */
export function niellHydrostaticCoefficients(latitudeRad: number, dayOfYear: number): { a: number; b: number; c: number } {
  const absLatDeg = Math.abs(latitudeRad) / DEG;
  const doy = latitudeRad < 0 ? dayOfYear + 365.25 / 2 : dayOfYear;
  const season = Math.cos((2 * Math.PI * (doy - NIELL_SEASONAL_PHASE_DOY)) / 365.25);
  const coefficient = (k: 'a' | 'b' | 'c') =>
    interpolateInLatitude(NIELL_HYDROSTATIC_AVERAGE[k], absLatDeg) -
    interpolateInLatitude(NIELL_HYDROSTATIC_AMPLITUDE[k], absLatDeg) * season;
  return { a: coefficient('a'), b: coefficient('b'), c: coefficient('c') };
}

/** Niell wet coefficients at a latitude (no seasonal term). */
export function niellWetCoefficients(latitudeRad: number): { a: number; b: number; c: number } {
  const absLatDeg = Math.abs(latitudeRad) / DEG;
  return {
    a: interpolateInLatitude(NIELL_WET.a, absLatDeg),
    b: interpolateInLatitude(NIELL_WET.b, absLatDeg),
    c: interpolateInLatitude(NIELL_WET.c, absLatDeg),
  };
}

/** `models` entry of Niell's height correction from the height above sea level. */
export const NIELL_HEIGHT_CORRECTION_NAME = 'niell-1996 eq. 6, from the height above sea level (geoid)';

/**
 * Niell height correction Δm(e) [-], added to the hydrostatic mapping factor.
 *
 * @param sinElevation sin e [-], (0, 1]
 * @param heightKm site height above mean sea level [km]; negative below sea level (the
 *   correction is then negative, a linear extrapolation of Niell's fit)
 */
export function niellHeightCorrection(sinElevation: number, heightKm: number): number {
  const { a, b, c } = NIELL_HEIGHT_CORRECTION;
  return (1 / sinElevation - marini(sinElevation, a, b, c)) * heightKm;
}

export const niellModel: MappingModel = {
  key: 'niell',
  citation: 'Niell (1996)',
  requiresCoefficients: false,
  heightCorrection: () => NIELL_HEIGHT_CORRECTION_NAME,
  prepare(context: MappingContext): MappingEvaluator {
    const h = niellHydrostaticCoefficients(context.latitudeRad, context.dayOfYear);
    const w = niellWetCoefficients(context.latitudeRad);
    const heightKm = context.heightM / 1000;
    return {
      hydrostatic(elevationRad: number): number {
        const s = Math.sin(elevationRad);
        return marini(s, h.a, h.b, h.c) + niellHeightCorrection(s, heightKm);
      },
      wet(elevationRad: number): number {
        return marini(Math.sin(elevationRad), w.a, w.b, w.c);
      },
      mapBatch(elevationsRad, sinElevations, outHydrostatic, outWet) {
        // marini() written out, its numerator and the coefficients as local numbers: see "The batch loops" in
        // continued-fraction.ts (a call to a helper shared with VMF1's loop left this loop 3–4× slower in
        // some processes). The same operations in the same order as marini(): the same bits.
        const { a: ha, b: hb, c: hcc } = h;
        const { a: wa, b: wb, c: wc } = w;
        const { a: ca, b: cb, c: cc } = NIELL_HEIGHT_CORRECTION;
        const topH = mariniNumerator(ha, hb, hcc);
        const topW = mariniNumerator(wa, wb, wc);
        const topC = mariniNumerator(ca, cb, cc);
        const n = elevationsRad.length;
        for (let i = 0; i < n; i++) {
          const s = sinElevations[i]!;
          const heightCorrection = (1 / s - topC / (s + ca / (s + cb / (s + cc)))) * heightKm; // eq. 6, as niellHeightCorrection
          outHydrostatic[i] = topH / (s + ha / (s + hb / (s + hcc))) + heightCorrection;
          outWet[i] = topW / (s + wa / (s + wb / (s + wc)));
        }
      },
    };
  },
};
