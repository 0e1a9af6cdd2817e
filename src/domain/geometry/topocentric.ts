/**
 * Site-to-satellite geometry on the WGS84 ellipsoid.
 *
 * Geodetic → ECEF: e.g. Hofmann-Wellenhof, Lichtenegger & Wasle, GNSS (2008), eq. 2.15; the
 * topocentric (east, north, up) rotation: eq. 2.29 there (common practice). The nadir angle at the
 * satellite follows from the triangle geocentre–site–satellite: sin η = |r_site| cos e / |r_sat|.
 */

import { WGS84_A_M, WGS84_E2 } from '../constants.js';

export interface Ecef {
  xM: number;
  yM: number;
  zM: number;
}

/**
 * @param latitudeRad geodetic latitude [rad]
 * @param longitudeRad longitude [rad]
 * @param heightM ellipsoidal height [m]
 * @returns ECEF position [m], WGS84
 */
export function geodeticToEcef(latitudeRad: number, longitudeRad: number, heightM: number): Ecef {
  const sinLat = Math.sin(latitudeRad);
  const cosLat = Math.cos(latitudeRad);
  const n = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * sinLat * sinLat);
  return {
    xM: (n + heightM) * cosLat * Math.cos(longitudeRad),
    yM: (n + heightM) * cosLat * Math.sin(longitudeRad),
    zM: (n * (1 - WGS84_E2) + heightM) * sinLat,
  };
}

export interface LookAngles {
  /** Elevation above the ellipsoid's tangent plane [rad], −π/2..π/2. */
  elevationRad: number;
  /** Azimuth from north through east [rad], [0, 2π). */
  azimuthRad: number;
  /** Nadir angle at the satellite, between its geocentre direction and the site [rad]. */
  nadirRad: number;
  /** Site–satellite distance [m]. */
  rangeM: number;
}

/**
 * Look angles from a site to a point given in ECEF.
 *
 * @param latitudeRad geodetic latitude of the site [rad]
 * @param longitudeRad longitude of the site [rad]
 * @param site site position, ECEF [m]
 * @param target target position, ECEF [m]
 */
export function lookAngles(latitudeRad: number, longitudeRad: number, site: Ecef, target: Ecef): LookAngles {
  const dx = target.xM - site.xM;
  const dy = target.yM - site.yM;
  const dz = target.zM - site.zM;
  const sinLat = Math.sin(latitudeRad);
  const cosLat = Math.cos(latitudeRad);
  const sinLon = Math.sin(longitudeRad);
  const cosLon = Math.cos(longitudeRad);
  const east = -sinLon * dx + cosLon * dy;
  const north = -sinLat * cosLon * dx - sinLat * sinLon * dy + cosLat * dz;
  const up = cosLat * cosLon * dx + cosLat * sinLon * dy + sinLat * dz;
  const rangeM = Math.hypot(east, north, up);
  // atan2 rather than asin(up/range): well conditioned near the zenith too.
  const elevationRad = Math.atan2(up, Math.hypot(east, north));
  const azimuthRad = normaliseAzimuthRad(Math.atan2(east, north));
  // Nadir angle: angle at the satellite between −r_sat and (site − sat).
  const rSat = Math.hypot(target.xM, target.yM, target.zM);
  const cosNadir = (target.xM * dx + target.yM * dy + target.zM * dz) / (rSat * rangeM);
  const nadirRad = Math.acos(Math.min(1, Math.max(-1, cosNadir)));
  return { elevationRad, azimuthRad, nadirRad, rangeM };
}

/**
 * An azimuth in [0, 2π) [rad]. −1e-17 + 2π rounds to 2π in floating point, which a caller would read
 * as "360°": such values become 0.
 */
export function normaliseAzimuthRad(azimuthRad: number): number {
  const full = 2 * Math.PI;
  let a = azimuthRad % full;
  if (a < 0) a += full;
  return a >= full ? 0 : a;
}

/** An azimuth in [0, 360) [deg]; 360 becomes 0 (the same direction). */
export function normaliseAzimuthDeg(azimuthDeg: number): number {
  if (azimuthDeg >= 0 && azimuthDeg < 360) return azimuthDeg; // as x % 360 gives it there, without the remainder (a tenth of a slant batch)
  let a = azimuthDeg % 360;
  if (a < 0) a += 360;
  return a >= 360 ? 0 : a;
}
