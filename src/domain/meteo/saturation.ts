/**
 * Saturation water vapour pressure and the enhancement factor of moist air.
 *
 * Source: WMO Guide to Meteorological Instruments and Methods of Observation, WMO-No. 8 (2008),
 * Annex 4.B: the Magnus-type form over a plane surface of pure water, e_w(t) = 6.112 exp(17.62 t / (243.12 + t)) hPa
 * (confirmed, docs/constants.md), and the enhancement factor f(p) = 1.0016 + 3.15e-6 p − 0.074/p (from memory).
 * WMO defines relative humidity with respect to water also below 0 °C, so no ice branch is used.
 */

import { ModelDomainError } from '../errors.js';

/** Validity of the WMO-No. 8 water formula [°C] (Annex 4.B states −45 °C to 60 °C). */
export const SATURATION_RANGE_C = { min: -45, max: 60 } as const;

/**
 * What to do below −45 °C: "refuse" (a ModelDomainError), or "extrapolate" the formula down to the
 * API's −90 °C. Extrapolating is what a caller wants when the vapour pressure only feeds a wet delay:
 * at −45 °C e_w is 0.11 hPa and at −60 °C 0.02 hPa, so even a 20 % error of the extrapolation moves
 * the Saastamoinen ZWD by less than 0.3 mm (computed from the formulas here); the caller is warned.
 */
export type ColdRange = 'refuse' | 'extrapolate';

/** True when a temperature [°C] is below the validity of the saturation formula. */
export const belowSaturationRange = (temperatureC: number): boolean => temperatureC < SATURATION_RANGE_C.min;

/**
 * Saturation vapour pressure over water, e_w(t), WMO-No. 8 (2008) Annex 4.B.
 *
 * @param temperatureC air temperature t [°C], valid −45..60 °C
 * @param cold below −45 °C: "refuse" (default) or "extrapolate" (see ColdRange)
 * @returns saturation vapour pressure [hPa] (pure phase, no enhancement factor)
 * @throws ModelDomainError outside −45..60 °C ("extrapolate": above 60 °C or below −90 °C only)
 */
export function saturationVapourPressureHpa(temperatureC: number, field = 'temperature_c', cold: ColdRange = 'refuse'): number {
  if (cold === 'extrapolate' && temperatureC >= -90 && temperatureC < SATURATION_RANGE_C.min) {
    return magnusSaturationVapourPressureHpa(temperatureC);
  }
  if (!(temperatureC >= SATURATION_RANGE_C.min && temperatureC <= SATURATION_RANGE_C.max)) {
    throw new ModelDomainError(
      field,
      `saturation vapour pressure (WMO-No. 8) is defined for ${SATURATION_RANGE_C.min}..${SATURATION_RANGE_C.max} °C, got ${temperatureC} °C`,
    );
  }
  return magnusSaturationVapourPressureHpa(temperatureC);
}

/**
 * The WMO-No. 8 (2008) Annex 4.B formula itself, without the range check: for callers that
 * extrapolate it knowingly and say so (atmospheric profiles reach −90 °C, where the vapour pressure
 * is below 0.001 hPa and a few per cent of it do not matter).
 *
 * @param temperatureC air temperature t [°C]
 * @returns saturation vapour pressure over water [hPa]
 */
export function magnusSaturationVapourPressureHpa(temperatureC: number): number {
  return 6.112 * Math.exp((17.62 * temperatureC) / (243.12 + temperatureC));
}

/**
 * Enhancement factor of water vapour in moist air, f(p), WMO-No. 8 (2008) Annex 4.B (from memory).
 *
 * @param pressureHpa total air pressure p [hPa], 300..1100
 * @returns f [-], about 1.004 at 1000 hPa
 */
export function enhancementFactor(pressureHpa: number): number {
  return 1.0016 + 3.15e-6 * pressureHpa - 0.074 / pressureHpa;
}

/**
 * Water vapour pressure of moist air from relative humidity: e = RH/100 · f(p) · e_w(t).
 *
 * @param relativeHumidityPct relative humidity with respect to water [%], 0..100
 * @param temperatureC air temperature [°C]
 * @param pressureHpa total pressure [hPa]
 * @returns vapour pressure [hPa]
 */
export function vapourPressureFromRelativeHumidityHpa(
  relativeHumidityPct: number,
  temperatureC: number,
  pressureHpa: number,
  cold: ColdRange = 'refuse',
): number {
  return (relativeHumidityPct / 100) * enhancementFactor(pressureHpa) * saturationVapourPressureHpa(temperatureC, 'temperature_c', cold);
}

/**
 * Water vapour pressure from the dew point: e = f(p) · e_w(t_d).
 *
 * @param dewpointC dew-point temperature [°C]
 * @param pressureHpa total pressure [hPa]
 * @returns vapour pressure [hPa]
 */
export function vapourPressureFromDewpointHpa(dewpointC: number, pressureHpa: number, cold: ColdRange = 'refuse'): number {
  return enhancementFactor(pressureHpa) * saturationVapourPressureHpa(dewpointC, 'dewpoint_c', cold);
}

/**
 * Relative humidity of a vapour pressure at a given temperature and pressure (inverse of
 * vapourPressureFromRelativeHumidityHpa).
 *
 * @returns relative humidity [%]
 */
export function relativeHumidityPct(
  vapourPressureHpa: number,
  temperatureC: number,
  pressureHpa: number,
  cold: ColdRange = 'refuse',
): number {
  return (100 * vapourPressureHpa) / (enhancementFactor(pressureHpa) * saturationVapourPressureHpa(temperatureC, 'temperature_c', cold));
}
