/**
 * Radio refractivity of moist air, N = (n − 1) 10^6, in the three-term form
 *
 *   N = k1 (Pd/T) Zd⁻¹ + k2 (e/T) Zw⁻¹ + k3 (e/T²) Zw⁻¹                          [N-units]
 *
 * Pd partial pressure of dry air [hPa], e vapour pressure [hPa], T temperature [K], Zd⁻¹ and Zw⁻¹ the
 * inverse compressibility factors (1 when compressibility is ignored; compressibility.ts). Split
 * after Davis et al. (1985), Radio Sci. 20(6), 1593–1607, eqs. 5–7, into
 *
 *   hydrostatic  N_h = k1 Rd ρ = k1 (Pd/T) Zd⁻¹ + k1 ε (e/T) Zw⁻¹     (ρ total density)
 *   wet          N_w = k2' (e/T) Zw⁻¹ + k3 (e/T²) Zw⁻¹,  k2' = k2 − ε k1
 *
 * with ε = Rd/Rv. The hydrostatic part depends on the total density only, so its zenith integral
 * follows from surface pressure and gravity (integrate.ts).
 *
 * The constant sets a caller can choose (all from memory; docs/constants.md):
 * - "smith-weintraub-1953": Smith, E. K. & Weintraub, S. (1953), The constants in the equation for
 *   atmospheric refractive index at radio frequencies, Proc. IRE 41(8), 1035–1037:
 *   k1 = 77.61 K/hPa, k2 = 72 K/hPa, k3 = 3.75e5 K²/hPa (as tabulated by Bevis et al. 1994, Table 1);
 * - "thayer-1974": Thayer, G. D. (1974), An improved equation for the radio refractive index of air,
 *   Radio Sci. 9(10), 803–807: k1 = 77.604, k2 = 64.79, k3 = 3.776e5 (the set behind Saastamoinen's
 *   ZHD constant in the form of Davis et al. 1985);
 * - "bevis-1994" (default): Bevis, M. et al. (1994), GPS meteorology: mapping zenith wet delays onto
 *   precipitable water, J. Appl. Meteorol. 33, 379–386, Table 1 weighted mean: k1 = 77.60, k2 = 70.4,
 *   k3 = 3.739e5 (the set of the service's PWV conversion);
 * - "rueger-2002-best-average": Rüeger, J. M. (2002), Refractive index formulae for radio waves,
 *   FIG XXII International Congress, Washington D.C., JS28: "best average" k1 = 77.6890,
 *   k2 = 71.2952, k3 = 3.75463e5 (for 375 ppm CO2).
 *
 * Valid for the neutral atmosphere at radio frequencies (non-dispersive below about 30 GHz); T > 0 K,
 * 0 ≤ e < P. Inputs are not checked here (levels.ts validates the profile).
 */

import { EPSILON } from './constants.js';

export interface RefractivityConstants {
  key: string;
  /** Short citation that goes into a result's `models`. */
  citation: string;
  /** k1 [K/hPa] */
  k1KPerHpa: number;
  /** k2 [K/hPa] */
  k2KPerHpa: number;
  /** k3 [K²/hPa] */
  k3K2PerHpa: number;
}

export const REFRACTIVITY_CONSTANT_SETS = {
  'smith-weintraub-1953': {
    key: 'smith-weintraub-1953',
    citation: 'Smith & Weintraub (1953) k1=77.61 k2=72 k3=3.75e5',
    k1KPerHpa: 77.61,
    k2KPerHpa: 72,
    k3K2PerHpa: 3.75e5,
  },
  'thayer-1974': {
    key: 'thayer-1974',
    citation: 'Thayer (1974) k1=77.604 k2=64.79 k3=3.776e5',
    k1KPerHpa: 77.604,
    k2KPerHpa: 64.79,
    k3K2PerHpa: 3.776e5,
  },
  'bevis-1994': {
    key: 'bevis-1994',
    citation: 'Bevis et al. (1994) k1=77.60 k2=70.4 k3=3.739e5',
    k1KPerHpa: 77.6,
    k2KPerHpa: 70.4,
    k3K2PerHpa: 3.739e5,
  },
  'rueger-2002-best-average': {
    key: 'rueger-2002-best-average',
    citation: 'Rueger (2002) best average k1=77.6890 k2=71.2952 k3=3.75463e5',
    k1KPerHpa: 77.689,
    k2KPerHpa: 71.2952,
    k3K2PerHpa: 3.75463e5,
  },
} as const satisfies Record<string, RefractivityConstants>;

export type RefractivityConstantsKey = keyof typeof REFRACTIVITY_CONSTANT_SETS;
export const REFRACTIVITY_CONSTANTS_KEYS = Object.keys(REFRACTIVITY_CONSTANT_SETS) as [
  RefractivityConstantsKey,
  ...RefractivityConstantsKey[],
];
export const DEFAULT_REFRACTIVITY_CONSTANTS: RefractivityConstantsKey = 'bevis-1994';

/**
 * k2' = k2 − ε k1 [K/hPa], the wet constant left once the vapour's share of the density is counted
 * in the hydrostatic part (Davis et al. 1985, eq. 7). About 22.1 for Bevis et al. (1994).
 */
export function k2PrimeKPerHpa(set: RefractivityConstants): number {
  return set.k2KPerHpa - EPSILON * set.k1KPerHpa;
}

/**
 * Total refractivity, the three-term formula as published [N-units].
 *
 * @param set constant set
 * @param pressureHpa total pressure P [hPa]
 * @param vapourPressureHpa e [hPa]
 * @param temperatureK T [K]
 * @param dryInverseCompressibility Zd⁻¹ [-], 1 to ignore compressibility
 * @param wetInverseCompressibility Zw⁻¹ [-], 1 to ignore compressibility
 */
export function totalRefractivity(
  set: RefractivityConstants,
  pressureHpa: number,
  vapourPressureHpa: number,
  temperatureK: number,
  dryInverseCompressibility = 1,
  wetInverseCompressibility = 1,
): number {
  const pd = pressureHpa - vapourPressureHpa;
  const e = vapourPressureHpa;
  const t = temperatureK;
  return (
    set.k1KPerHpa * (pd / t) * dryInverseCompressibility +
    (set.k2KPerHpa * (e / t) + set.k3K2PerHpa * (e / (t * t))) * wetInverseCompressibility
  );
}

/**
 * Hydrostatic refractivity N_h = k1 Rd ρ [N-units] (Davis et al. 1985, eq. 6).
 * Arguments as for totalRefractivity.
 */
export function hydrostaticRefractivity(
  set: RefractivityConstants,
  pressureHpa: number,
  vapourPressureHpa: number,
  temperatureK: number,
  dryInverseCompressibility = 1,
  wetInverseCompressibility = 1,
): number {
  const pd = pressureHpa - vapourPressureHpa;
  return (set.k1KPerHpa / temperatureK) * (pd * dryInverseCompressibility + EPSILON * vapourPressureHpa * wetInverseCompressibility);
}

/**
 * Wet refractivity N_w = k2' (e/T) Zw⁻¹ + k3 (e/T²) Zw⁻¹ [N-units] (Davis et al. 1985, eq. 7).
 *
 * @param set constant set
 * @param vapourPressureHpa e [hPa]
 * @param temperatureK T [K]
 * @param wetInverseCompressibility Zw⁻¹ [-]
 */
export function wetRefractivity(
  set: RefractivityConstants,
  vapourPressureHpa: number,
  temperatureK: number,
  wetInverseCompressibility = 1,
): number {
  const e = vapourPressureHpa;
  return (k2PrimeKPerHpa(set) * (e / temperatureK) + set.k3K2PerHpa * (e / (temperatureK * temperatureK))) * wetInverseCompressibility;
}
