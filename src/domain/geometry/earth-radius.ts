/**
 * Radius of the sphere that stands in for the ellipsoid around a site when the atmosphere is
 * modelled as spherical shells (ray tracing, src/domain/profile/).
 */

import { WGS84_A_M, WGS84_E2 } from '../constants.js';

/**
 * Gaussian mean radius of curvature R = sqrt(M N), with M the meridional and N the prime-vertical
 * radius of curvature (e.g. Torge & Müller, Geodesy, 4th ed. (2012), eq. 4.27; common practice in
 * ray tracing for mapping functions):
 *
 *   R(φ) = a sqrt(1 − e²) / (1 − e² sin²φ)          [m]
 *
 * a sqrt(1 − e²) = 6 356 752 m at the equator, a / sqrt(1 − e²) = 6 399 594 m at the poles (WGS84).
 *
 * @param latitudeRad geodetic latitude [rad], any value (the formula is periodic)
 * @returns Gaussian mean radius of curvature [m]
 */
export function gaussianRadiusM(latitudeRad: number): number {
  const s2 = Math.sin(latitudeRad) ** 2;
  return (WGS84_A_M * Math.sqrt(1 - WGS84_E2)) / (1 - WGS84_E2 * s2);
}
