/**
 * Vapour pressure of a profile level from whichever humidity quantity the level carries.
 *
 * - relative_humidity_pct: e = RH/100 · f(p) · e_w(t)     (WMO-No. 8 (2008) Annex 4.B definitions)
 * - dewpoint_c:            e = f(p) · e_w(t_d)
 * - vapour_pressure_hpa:   e as given
 * - specific_humidity_kg_kg: e = q p / (ε + (1 − ε) q)   (from q = ε e / (p − (1 − ε) e), e.g.
 *   Wallace & Hobbs, Atmospheric Science, 2nd ed. (2006), §3.5; common practice)
 *
 * e_w and f(p) come from src/domain/meteo/saturation.ts (WMO-No. 8). Two documented extensions for
 * the upper levels of a profile:
 * - below −45 °C, the lower limit WMO states for its formula, e_w is the same formula extrapolated
 *   (a few per cent from the supercooled-water values at −60 °C, where e_w ≈ 0.02 hPa; the result
 *   carries a warning naming the levels);
 * - the enhancement-factor fit drops below 1 (unphysical) under about 46 hPa; above the 50 hPa level
 *   f = 1 is used (a change of 0.03 % of a vapour pressure that is below 0.01 hPa there).
 *
 * Valid for the API's level ranges (t −130..60 °C, p 0..1100 hPa, q 0..0.04 kg/kg); nothing is
 * clamped. Whether the result is physical (not above saturation, below the total pressure) is
 * checked by levels.ts, which names the level.
 */

import { CELSIUS_ZERO_K } from '../constants.js';
import { enhancementFactor, magnusSaturationVapourPressureHpa, SATURATION_RANGE_C } from '../meteo/saturation.js';
import { EPSILON } from './constants.js';

/** Pressure below which the enhancement factor is taken as 1 [hPa] (see module comment). */
export const ENHANCEMENT_MIN_PRESSURE_HPA = 50;

export type HumidityQuantity = 'relative_humidity_pct' | 'dewpoint_c' | 'vapour_pressure_hpa' | 'specific_humidity_kg_kg';
export const HUMIDITY_QUANTITIES: readonly HumidityQuantity[] = [
  'relative_humidity_pct',
  'dewpoint_c',
  'vapour_pressure_hpa',
  'specific_humidity_kg_kg',
];

/** f(p) of WMO-No. 8 down to 50 hPa, 1 above the 50 hPa level [-]. */
export function profileEnhancementFactor(pressureHpa: number): number {
  return pressureHpa >= ENHANCEMENT_MIN_PRESSURE_HPA ? enhancementFactor(pressureHpa) : 1;
}

/** True when e_w at this temperature is extrapolated below the WMO range. */
export const saturationExtrapolated = (temperatureC: number): boolean => temperatureC < SATURATION_RANGE_C.min;

/**
 * Saturation vapour pressure of moist air over water, f(p) e_w(t) [hPa], with the extensions of the
 * module comment.
 *
 * @param temperatureC t [°C], −130..60
 * @param pressureHpa p [hPa]
 */
export function moistSaturationVapourPressureHpa(temperatureC: number, pressureHpa: number): number {
  return profileEnhancementFactor(pressureHpa) * magnusSaturationVapourPressureHpa(temperatureC);
}

/**
 * @param quantity which humidity quantity `value` is
 * @param value its value in the unit of its name (%, °C, hPa, kg/kg)
 * @param temperatureC air temperature t [°C]
 * @param pressureHpa total pressure p [hPa]
 * @returns vapour pressure e [hPa]
 */
export function vapourPressureOfLevelHpa(quantity: HumidityQuantity, value: number, temperatureC: number, pressureHpa: number): number {
  switch (quantity) {
    case 'relative_humidity_pct':
      return (value / 100) * moistSaturationVapourPressureHpa(temperatureC, pressureHpa);
    case 'dewpoint_c':
      return moistSaturationVapourPressureHpa(value, pressureHpa);
    case 'vapour_pressure_hpa':
      return value;
    case 'specific_humidity_kg_kg':
      return (value * pressureHpa) / (EPSILON + (1 - EPSILON) * value);
  }
}

/**
 * Relative humidity with respect to water of a vapour pressure [%] (inverse of the first case).
 *
 * @param vapourPressureHpa e [hPa]
 * @param temperatureK T [K]
 * @param pressureHpa p [hPa]
 */
export function relativeHumidityOfLevelPct(vapourPressureHpa: number, temperatureK: number, pressureHpa: number): number {
  return (100 * vapourPressureHpa) / moistSaturationVapourPressureHpa(temperatureK - CELSIUS_ZERO_K, pressureHpa);
}
