/**
 * Elevations at which the mapping functions are evaluated.
 *
 * - Fitted range: Niell (1996) fitted his functions against ray traces from 3° elevation up (VMF1,
 *   Boehm et al. 2006, likewise uses 3° for its b and c coefficients, from memory). Below 3° the
 *   functions are extrapolated and the caller is warned.
 * - Floor: below 1° of vacuum elevation the functions are refused (ModelDomainError 400). There the
 *   refraction bending of the ray is of the order of the elevation itself (about 0.5° at the
 *   horizon, common practice), so a function of the geometric elevation no longer
 *   describes the path; arithmetically, Niell's height correction grows as 1/sin e (a factor of
 *   5669 at 0.001°, −487 for a site below sea level) and overflows to Infinity near 1e-308°, which
 *   JSON serialises as null. The ray trace through a profile (profile/) is not bound by this floor
 *   (it gives 0.61° of refraction at 0° vacuum elevation through the U.S. Standard Atmosphere); the
 *   mapping-function factors set beside it are null there.
 *
 * Elevations computed from positions are compared with a tolerance of 1e-9° (about 2e-11 rad,
 * 4 mm at 20 000 km), so that a satellite placed at exactly 3° is not reported as below 3° because
 * of the last bit of atan2.
 */

import { ModelDomainError } from '../errors.js';

/** Lowest elevation of the mapping functions' fit [deg] (Niell 1996). */
export const MAPPING_FIT_MIN_ELEVATION_DEG = 3;
/** Lowest elevation at which a mapping function is evaluated at all [deg]. */
export const MAPPING_MIN_ELEVATION_DEG = 1;
/** Rounding tolerance for elevations computed from positions [deg]. */
export const ELEVATION_ROUNDING_DEG = 1e-9;

/** True when the elevation [deg] is below the fitted range (with the rounding tolerance). */
export const belowMappingFit = (elevationDeg: number): boolean => elevationDeg < MAPPING_FIT_MIN_ELEVATION_DEG - ELEVATION_ROUNDING_DEG;

/** True when a mapping function may be evaluated at this elevation [deg] (not below the floor). */
export const mappingDefinedAt = (elevationDeg: number): boolean => elevationDeg >= MAPPING_MIN_ELEVATION_DEG - ELEVATION_ROUNDING_DEG;

/**
 * @param elevationDeg vacuum elevation [deg]
 * @param field the request field, e.g. "directions.3.elevation_deg"
 * @throws ModelDomainError (400) below MAPPING_MIN_ELEVATION_DEG (less the rounding tolerance)
 */
export function checkMappingElevation(elevationDeg: number, field: string): void {
  if (!mappingDefinedAt(elevationDeg)) {
    throw new ModelDomainError(
      field,
      `elevation ${elevationDeg}° is below ${MAPPING_MIN_ELEVATION_DEG}°: mapping functions are evaluated in [${MAPPING_MIN_ELEVATION_DEG}, 90] deg (fitted from ${MAPPING_FIT_MIN_ELEVATION_DEG}°; below ${MAPPING_MIN_ELEVATION_DEG}° refraction bending is as large as the elevation); drop such directions or use /v1/profile-delays (ray tracing)`,
      400,
    );
  }
}
