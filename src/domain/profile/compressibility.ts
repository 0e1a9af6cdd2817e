/**
 * Inverse compressibility factors of dry air and water vapour, the departure of moist air from the
 * ideal gas law that Thayer (1974) carries in the refractivity formula.
 *
 * Owens, J. C. (1967), Optical refractive index of air: dependence on pressure, temperature and
 * composition, Appl. Opt. 6(1), 51–59, eqs. 12 and 13, as quoted by Thayer (1974), Radio Sci. 9(10),
 * 803–807 (from memory):
 *
 *   Zd⁻¹ = 1 + Pd [57.97e-8 (1 + 0.52/T) − 9.4611e-4 t/T²]
 *   Zw⁻¹ = 1 + 1650 (e/T³) [1 − 0.01317 t + 1.75e-4 t² + 1.44e-6 t³]
 *
 * Pd, e in hPa, T in K, t in °C. At 1013.25 hPa and 0 °C, Zd⁻¹ = 1.00059, the value the CIPM
 * formula for the density of air gives (1/0.99942). Fitted to tropospheric conditions (about −50 to
 * +50 °C); above, the pressure is so low that either correction is below 1e-6 of the refractivity
 * that it multiplies, so the formulas are used as they are.
 *
 * When compressibility is ignored (the default of POST /v1/profile-delays), both factors are 1: the
 * zenith hydrostatic delay does not change (it follows from pressure and gravity), the wet delay
 * changes by a few hundredths of a per cent (+0.04 % for the standard atmosphere with 70 % surface
 * relative humidity; Zw⁻¹ − 1 ≈ 7e-4 in warm humid surface air).
 */

import { CELSIUS_ZERO_K } from '../constants.js';

/** @param dryPressureHpa Pd [hPa] @param temperatureK T [K] @returns Zd⁻¹ [-] */
export function inverseCompressibilityDry(dryPressureHpa: number, temperatureK: number): number {
  const t = temperatureK - CELSIUS_ZERO_K;
  return 1 + dryPressureHpa * (57.97e-8 * (1 + 0.52 / temperatureK) - (9.4611e-4 * t) / (temperatureK * temperatureK));
}

/** @param vapourPressureHpa e [hPa] @param temperatureK T [K] @returns Zw⁻¹ [-] */
export function inverseCompressibilityWet(vapourPressureHpa: number, temperatureK: number): number {
  const t = temperatureK - CELSIUS_ZERO_K;
  return 1 + ((1650 * vapourPressureHpa) / temperatureK ** 3) * (1 - 0.01317 * t + 1.75e-4 * t * t + 1.44e-6 * t * t * t);
}
