/**
 * Zenith hydrostatic delay (ZHD) from surface pressure.
 *
 * Saastamoinen (1972) in the form of Davis et al. (1985), Radio Sci. 20(6), 1593–1607, as given in
 * IERS Conventions (2010), IERS Technical Note 36, ch. 9 (2012 update), eq. 9.11:
 *
 *   ZHD = 0.0022768 P / (1 − 0.00266 cos 2φ − 0.28e-6 H)       [m]
 *
 * P surface pressure [hPa], φ geodetic latitude, H height [m]. The constant 0.0022768 m/hPa is
 * from memory and consistent with 1e-6 · k1 · Rd / g_m = 1e-6 · 77.604 · 287.0464 / 9.784.
 * IERS asks for the height above the geoid; we use the height the caller gives (ellipsoidal in the
 * API): a 100 m geoid undulation changes the denominator by 2.8e-5, i.e. 0.06 mm of a 2.3 m ZHD.
 *
 * Valid range: P 300..1100 hPa, |φ| ≤ 90°, H −500..9000 m (the API's ranges).
 */

/** m/hPa, IERS Conventions (2010) eq. 9.11 (from memory). */
export const SAASTAMOINEN_ZHD_M_PER_HPA = 0.0022768;

/**
 * Standard uncertainty of that constant [m/hPa]: IERS Conventions (2010) eq. 9.11 writes it
 * (0.0022768 ± 0.0000005) (from memory): a relative 2.2e-4, 0.5 mm of a 2.3 m ZHD. This is the
 * ZHD model error the PWV budget carries; departures from hydrostatic equilibrium (strong winds,
 * fronts) are not included.
 */
export const SAASTAMOINEN_ZHD_M_PER_HPA_SIGMA = 0.0000005;

/**
 * Gravity-variation factor of the hydrostatic delay, 1 − 0.00266 cos 2φ − 0.28e-6 H [-].
 * IERS Conventions (2010) eq. 9.11 denominator.
 */
export function saastamoinenGravityFactor(latitudeRad: number, heightM: number): number {
  return 1 - 0.00266 * Math.cos(2 * latitudeRad) - 0.28e-6 * heightM;
}

/**
 * @param pressureHpa surface pressure at the site [hPa], 300..1100
 * @param latitudeRad geodetic latitude [rad]
 * @param heightM site height [m]
 * @returns zenith hydrostatic delay [m]
 */
export function zenithHydrostaticDelayM(pressureHpa: number, latitudeRad: number, heightM: number): number {
  return (SAASTAMOINEN_ZHD_M_PER_HPA * pressureHpa) / saastamoinenGravityFactor(latitudeRad, heightM);
}

/**
 * Derivative of the ZHD with respect to pressure [m/hPa], for error propagation.
 */
export function zenithHydrostaticDelayPerHpa(latitudeRad: number, heightM: number): number {
  return SAASTAMOINEN_ZHD_M_PER_HPA / saastamoinenGravityFactor(latitudeRad, heightM);
}
