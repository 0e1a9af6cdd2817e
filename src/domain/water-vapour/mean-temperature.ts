/**
 * Weighted mean temperature of the atmosphere, Tm, from surface temperature.
 *
 * Bevis, M., Businger, S., Herring, T. A., Rocken, C., Anthes, R. A. & Ware, R. H. (1992), GPS
 * meteorology: remote sensing of atmospheric water vapor using the Global Positioning System,
 * J. Geophys. Res. 97(D14), 15787–15801, eq. 16 (from memory):
 *
 *   Tm = 70.2 + 0.72 Ts      [K], Ts surface temperature [K]
 *
 * fitted to radiosonde profiles at US sites with an rms scatter of about 4.74 K (from memory), which
 * we carry as the standard uncertainty of Tm. Valid for Ts in about 240..320 K (the range of the
 * fit's data); outside it the regression extrapolates and the caller is warned.
 */

export const BEVIS_TM_INTERCEPT_K = 70.2;
export const BEVIS_TM_SLOPE = 0.72;
/** Rms scatter of the Bevis (1992) regression [K] (from memory). */
export const BEVIS_TM_SIGMA_K = 4.74;
export const BEVIS_TM_FIT_RANGE_K = { min: 240, max: 320 } as const;

/** @param surfaceTemperatureK [K] @returns Tm [K] */
export function bevisMeanTemperatureK(surfaceTemperatureK: number): number {
  return BEVIS_TM_INTERCEPT_K + BEVIS_TM_SLOPE * surfaceTemperatureK;
}
