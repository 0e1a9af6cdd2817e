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
 * - Niell's (1996) height correction is added to the hydrostatic factor (the a coefficients refer to
 *   the surface of the grid's orography/ sea level; see the paper).
 *
 * Valid for elevations (0°, 90°]; the a coefficients are expected in 0.0005..0.002 (ah) and
 * 0..0.001 (aw) (common practice) and validated by the API.
 */

import { marini } from './continued-fraction.js';
import { niellHeightCorrection } from './niell.js';
import type { MappingContext, MappingEvaluator, MappingModel } from './types.js';
import { ModelDomainError } from '../errors.js';

export const VMF1_HYDROSTATIC_B = 0.0029;
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
  citation: 'Boehm, Werl & Schuh (2006) VMF1 with caller a coefficients, Niell (1996) height correction',
  requiresCoefficients: true,
  prepare(context: MappingContext): MappingEvaluator {
    if (!context.coefficients) {
      throw new ModelDomainError('coefficients', 'model "vmf1" needs coefficients {ah, aw}', 400);
    }
    const { ah, aw } = context.coefficients;
    const ch = vmf1HydrostaticC(context.latitudeRad, context.dayOfYear);
    const heightKm = context.heightM / 1000;
    return {
      hydrostatic(elevationRad: number): number {
        const s = Math.sin(elevationRad);
        return marini(s, ah, VMF1_HYDROSTATIC_B, ch) + niellHeightCorrection(s, heightKm);
      },
      wet(elevationRad: number): number {
        return marini(Math.sin(elevationRad), aw, VMF1_WET_B, VMF1_WET_C);
      },
    };
  },
};
