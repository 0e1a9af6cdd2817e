/**
 * Normal gravity of the WGS84 ellipsoid with latitude and height, and the conversion of geopotential
 * height to geometric height that follows from it.
 *
 * Somigliana's closed formula on the ellipsoid, NIMA TR8350.2 (2000) eq. 4-1 (from memory):
 *
 *   γ(φ) = γe (1 + k sin²φ) / sqrt(1 − e² sin²φ)                                    [m/s²]
 *
 * and its expansion in ellipsoidal height h, eq. 4-3 there (from memory):
 *
 *   γ(φ, h) = γ(φ) [1 − (2/a)(1 + f + m − 2 f sin²φ) h + (3/a²) h²]                 [m/s²]
 *
 * with a, f, e² of WGS84 (src/domain/constants.ts), k and m in profile/constants.ts. The first-order
 * term is the free-air gradient, −0.3086 mGal/m at mid latitude (common practice). The expansion is
 * stated for heights near the Earth; at 150 km the neglected third-order term is 4e-6 of γ.
 *
 * Valid for |φ| ≤ 90° and h from −500 m to 150 km (the ceiling of the extended column); the
 * functions do not check their input (callers validate heights).
 */

import { G0_M_S2, WGS84_A_M, WGS84_E2, WGS84_F } from '../constants.js';
import { WGS84_GAMMA_EQUATOR_M_S2, WGS84_M, WGS84_SOMIGLIANA_K } from './constants.js';

/**
 * Normal gravity on the ellipsoid, Somigliana (NIMA TR8350.2 eq. 4-1).
 *
 * @param latitudeRad geodetic latitude φ [rad]
 * @returns γ(φ) [m/s²]; 9.7803253359 at the equator, 9.8321849379 at the poles
 */
export function normalGravityOnEllipsoid(latitudeRad: number): number {
  const s2 = Math.sin(latitudeRad) ** 2;
  return (WGS84_GAMMA_EQUATOR_M_S2 * (1 + WGS84_SOMIGLIANA_K * s2)) / Math.sqrt(1 - WGS84_E2 * s2);
}

/** Coefficient (1/a)(1 + f + m − 2 f sin²φ) of the height expansion [1/m]. */
function firstOrderHeightCoefficient(latitudeRad: number): number {
  const s2 = Math.sin(latitudeRad) ** 2;
  return (1 + WGS84_F + WGS84_M - 2 * WGS84_F * s2) / WGS84_A_M;
}

/** Gravity at a latitude as a function of height, prepared once per site. */
export interface GravityAtLatitude {
  /** γ on the ellipsoid at this latitude [m/s²]. */
  surfaceM_S2: number;
  /** @param heightM ellipsoidal height h [m] @returns γ(φ, h) [m/s²] (NIMA TR8350.2 eq. 4-3) */
  at(heightM: number): number;
  /** @param heightM h [m] @returns ∫0^h γ(φ, h') dh' [m²/s²], the normal potential difference */
  potentialDifference(heightM: number): number;
}

/**
 * @param latitudeRad geodetic latitude [rad]
 */
export function gravityAtLatitude(latitudeRad: number): GravityAtLatitude {
  const gamma = normalGravityOnEllipsoid(latitudeRad);
  const c1 = firstOrderHeightCoefficient(latitudeRad);
  const c2 = 1 / (WGS84_A_M * WGS84_A_M);
  return {
    surfaceM_S2: gamma,
    at: (h) => gamma * (1 - 2 * c1 * h + 3 * c2 * h * h),
    potentialDifference: (h) => gamma * (h - c1 * h * h + c2 * h * h * h),
  };
}

/**
 * Geometric height of a geopotential height: solves ∫0^z γ(φ, h) dh = g0 Z for z, with the
 * geopotential metre defined by standard gravity g0 = 9.80665 m/s² (WMO convention, common
 * practice). The result is a height above the surface of zero geopotential (mean sea level); add
 * the geoid undulation to get a height above the ellipsoid.
 *
 * Newton's iteration on a function whose derivative is γ itself; converged to 1e-6 m (a micrometre).
 *
 * @param geopotentialHeightM geopotential height Z [m'], −500..100 000
 * @param gravity normal gravity at the site latitude
 * @returns geometric height z [m]; e.g. at 45.50° (where γ = g0) Z = 10 000 m' gives z = 10 015.76 m
 */
export function geometricHeightFromGeopotentialM(geopotentialHeightM: number, gravity: GravityAtLatitude): number {
  const target = G0_M_S2 * geopotentialHeightM;
  let z = (geopotentialHeightM * G0_M_S2) / gravity.surfaceM_S2;
  for (let i = 0; i < 20; i++) {
    const step = (gravity.potentialDifference(z) - target) / gravity.at(z);
    z -= step;
    if (Math.abs(step) < 1e-6) break;
  }
  return z;
}
