/**
 * VMF1 mapping functions with caller-supplied a coefficients.
 *
 * Boehm, J., Werl, B. & Schuh, H. (2006), Troposphere mapping functions for GPS and VLBI from ECMWF
 * operational analysis data, J. Geophys. Res. 111, B02406 (all values below from memory):
 * - hydrostatic: b = 0.0029, c = c0 + ((cos(2π (doy − 28)/365.25 + ψ) + 1) c11/2 + c10)(1 − cos φ),
 *   c0 = 0.062; northern hemisphere c10 = 0.001, c11 = 0.005, ψ = 0; southern c10 = 0.002,
 *   c11 = 0.007, ψ = π;
 * - wet: b = 0.00146, c = 0.04391;
 * - the a coefficients (`coefficients.ah`, `coefficients.aw`) come from the caller, normally from
 *   the published grids or site files for the epoch;
 * - Niell's (1996) height correction is added to the hydrostatic factor only where the a
 *   coefficients refer to mean sea level (the grids: `heightReference` "sea-level"), from the height
 *   above sea level; coefficients computed for the site itself (`heightReference` "site": ray traces
 *   at the station, the site files) already hold its height, and a correction would count it twice
 *   (about 24 mm of slant at 5° and 11 mm at 7° for a station 500 m above sea level).
 *   The default, when the caller does not say, is "sea-level": it is what the service did before the
 *   choice existed (so stored results keep their meaning) and what grid users need; the caller is
 *   warned that it was assumed (see DEFAULT_COEFFICIENTS_HEIGHT_REFERENCE).
 *
 * Valid for elevations (0°, 90°]; the a coefficients are expected in 0.0005..0.002 (ah) and
 * 0..0.001 (aw) (common practice) and validated by the API.
 */

import { marini, mariniNumerator } from './continued-fraction.js';
import { NIELL_HEIGHT_CORRECTION, NIELL_HEIGHT_CORRECTION_NAME, niellHeightCorrection } from './niell.js';
import type { CoefficientsHeightReference, MappingCoefficients, MappingContext, MappingEvaluator, MappingModel } from './types.js';
import { ModelDomainError } from '../errors.js';

export const VMF1_HYDROSTATIC_B = 0.0029;

/** What VMF1 coefficients refer to when the caller does not say (see the module comment). */
export const DEFAULT_COEFFICIENTS_HEIGHT_REFERENCE: CoefficientsHeightReference = 'sea-level';

/** The height reference in force for these coefficients. */
export const coefficientsHeightReference = (coefficients?: MappingCoefficients): CoefficientsHeightReference =>
  coefficients?.heightReference ?? DEFAULT_COEFFICIENTS_HEIGHT_REFERENCE;

/** Warning text when the height reference of VMF1 coefficients was assumed, or null when given. */
export function assumedHeightReferenceWarning(coefficients?: MappingCoefficients): string | null {
  if (!coefficients || coefficients.heightReference !== undefined) return null;
  return `coefficients.height_reference not given: "${DEFAULT_COEFFICIENTS_HEIGHT_REFERENCE}" assumed (grid coefficients; Niell's height correction added from the height above sea level); send "site" for coefficients computed at the site`;
}
export const VMF1_WET_B = 0.00146;
export const VMF1_WET_C = 0.04391;

/**
 * VMF1 hydrostatic c coefficient (Boehm et al. 2006, eq. 7, from memory).
 *
 * @param latitudeRad geodetic latitude [rad]
 * @param dayOfYear fractional day of year [d]
 */
export function vmf1HydrostaticC(latitudeRad: number, dayOfYear: number): number {
  const southern = latitudeRad < 0;
  const c0 = 0.062;
  const c10 = southern ? 0.002 : 0.001;
  const c11 = southern ? 0.007 : 0.005;
  const psi = southern ? Math.PI : 0;
  return c0 + ((Math.cos((2 * Math.PI * (dayOfYear - 28)) / 365.25 + psi) + 1) * (c11 / 2) + c10) * (1 - Math.cos(latitudeRad));
}

export const vmf1Model: MappingModel = {
  key: 'vmf1',
  citation: 'Boehm, Werl & Schuh (2006) VMF1 with caller a coefficients',
  requiresCoefficients: true,
  heightCorrection: (coefficients) =>
    coefficientsHeightReference(coefficients) === 'site'
      ? 'none (coefficients at the site)'
      : `${NIELL_HEIGHT_CORRECTION_NAME}, coefficients at sea level`,
  prepare(context: MappingContext): MappingEvaluator {
    if (!context.coefficients) {
      throw new ModelDomainError('coefficients', 'model "vmf1" needs coefficients {ah, aw}', 400);
    }
    const { ah, aw } = context.coefficients;
    const ch = vmf1HydrostaticC(context.latitudeRad, context.dayOfYear);
    const heightKm = context.heightM / 1000;
    const correct = coefficientsHeightReference(context.coefficients) === 'sea-level';
    return {
      hydrostatic(elevationRad: number): number {
        const s = Math.sin(elevationRad);
        return marini(s, ah, VMF1_HYDROSTATIC_B, ch) + (correct ? niellHeightCorrection(s, heightKm) : 0);
      },
      wet(elevationRad: number): number {
        return marini(Math.sin(elevationRad), aw, VMF1_WET_B, VMF1_WET_C);
      },
      mapBatch(elevationsRad, sinElevations, outHydrostatic, outWet) {
        // marini() and niellHeightCorrection() written out with local numbers, as in Niell's loop (see
        // "The batch loops" in continued-fraction.ts): the same operations in the same order, the same bits.
        const bh = VMF1_HYDROSTATIC_B;
        const bw = VMF1_WET_B;
        const cw = VMF1_WET_C;
        const { a: ca, b: cb, c: cc } = NIELL_HEIGHT_CORRECTION;
        const topH = mariniNumerator(ah, bh, ch);
        const topW = mariniNumerator(aw, bw, cw);
        const topC = mariniNumerator(ca, cb, cc);
        const n = elevationsRad.length;
        for (let i = 0; i < n; i++) {
          const s = sinElevations[i]!;
          const heightCorrection = correct ? (1 / s - topC / (s + ca / (s + cb / (s + cc)))) * heightKm : 0;
          outHydrostatic[i] = topH / (s + ah / (s + bh / (s + ch))) + heightCorrection;
          outWet[i] = topW / (s + aw / (s + bw / (s + cw)));
        }
      },
    };
  },
};
