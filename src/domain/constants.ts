/**
 * Physical constants used by the models, each with its unit and authority.
 *
 * Where a value is recalled rather than checked against the publication, the comment
 * says "from memory" (see docs/constants.md for the
 * transcription status of every value).
 */

/** Degrees to radians [rad/deg]. */
export const DEG = Math.PI / 180;

/** WGS84 semi-major axis [m]. NIMA TR8350.2 (2000), Table 3.1. */
export const WGS84_A_M = 6_378_137.0;
/** WGS84 flattening [-]. NIMA TR8350.2 (2000), Table 3.1. */
export const WGS84_F = 1 / 298.257223563;
/** WGS84 first eccentricity squared [-], derived: e² = f (2 − f). */
export const WGS84_E2 = WGS84_F * (2 - WGS84_F);

/** Specific gas constant of dry air [J/(kg K)]. Davis et al. (1985), as used in IERS Conventions (2010) ch. 9 (from memory). */
export const RD_J_PER_KG_K = 287.0464;
/** Specific gas constant of water vapour [J/(kg K)]. Bevis et al. (1994) (from memory). */
export const RV_J_PER_KG_K = 461.5;
/** Density of liquid water [kg/m³]. Bevis et al. (1994) (common practice). */
export const RHO_WATER_KG_M3 = 1000;

/**
 * Mean gravity at the centroid of the atmospheric column used by Saastamoinen's formula [m/s²].
 * Saastamoinen (1972); Davis et al. (1985). From memory; consistent with the ZHD constant
 * 0.0022768 = 1e-6 · 77.604 · 287.0464 / 9.784 (docs/constants.md).
 */
export const G_MEAN_M_S2 = 9.784;

/** Standard gravity [m/s²]. CGPM (1901), by definition. */
export const G0_M_S2 = 9.80665;

/** Kelvin offset of the Celsius scale [K]. SI, by definition. */
export const CELSIUS_ZERO_K = 273.15;

/**
 * Refractivity constants of Bevis et al. (1994), J. Appl. Meteorol. 33, 379–386 (from memory).
 * k1 [K/hPa], k2 [K/hPa], k3 [K²/hPa]; k2' = k2 − k1 Mw/Md [K/hPa].
 */
export const BEVIS_1994 = {
  k1_K_per_hPa: 77.6,
  k2_K_per_hPa: 70.4,
  k3_K2_per_hPa: 3.739e5,
  k2prime_K_per_hPa: 22.1,
} as const;

/**
 * Standard uncertainties of the refractivity constants as Bevis et al. (1994) quote them (from
 * memory): k1 = 77.60 ± 0.05 K/hPa, k2' = 22.1 ± 2.2 K/hPa, k3 = (3.739 ± 0.012)e5 K²/hPa.
 * They are common to every PWV value (systematic), not independent from record to record.
 */
export const BEVIS_1994_SIGMA = {
  k1_K_per_hPa: 0.05,
  k2prime_K_per_hPa: 2.2,
  k3_K2_per_hPa: 0.012e5,
} as const;

/**
 * Standard lapse rate of temperature in the troposphere [K/m] (negative: temperature falls with height).
 * U.S. Standard Atmosphere (1976), −6.5 K/km up to 11 km geopotential.
 */
export const STANDARD_LAPSE_RATE_K_PER_M = -0.0065;
