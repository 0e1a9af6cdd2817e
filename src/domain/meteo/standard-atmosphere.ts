/**
 * Standard-atmosphere surface meteorology for a site height, used when a caller sends no
 * measured met data.
 *
 * Source: Berg, H. (1948), Allgemeine Meteorologie, Dümmler, Bonn, in the form given in GNSS
 * textbooks (e.g. Hofmann-Wellenhof, Lichtenegger & Wasle, GNSS, 2008, ch. 5):
 *   P = P0 (1 − 2.26e-5 h)^5.225   [hPa]      (eq. for pressure)
 *   T = T0 − 0.0065 h              [K]
 *   RH = RH0 exp(−6.396e-4 h)      [%]
 * with reference values at mean sea level P0 = 1013.25 hPa, T0 = 18 °C and RH0 = 50 %.
 * T0 = 18 °C is the textbook choice we follow; other texts use 15 °C (from memory, see
 * docs/constants.md). h is the height above mean sea level [m]; callers with ellipsoidal
 * heights subtract the geoid undulation first (geometry/geoid.ts).
 *
 * Valid for h in −500..9000 m (the site range); the form follows the U.S. Standard Atmosphere
 * (1976) pressure to within 0.3 % there.
 */

import { CELSIUS_ZERO_K } from '../constants.js';
import { ModelDomainError } from '../errors.js';
import { vapourPressureFromRelativeHumidityHpa } from './saturation.js';

export const BERG_REFERENCE = {
  pressureHpa: 1013.25,
  temperatureC: 18,
  relativeHumidityPct: 50,
} as const;

export const STANDARD_ATMOSPHERE_HEIGHT_RANGE_M = { min: -500, max: 9000 } as const;

export interface SurfaceMet {
  pressureHpa: number;
  temperatureC: number;
  relativeHumidityPct: number;
  vapourPressureHpa: number;
}

/**
 * Standard-atmosphere met values at a height (Berg 1948 form, see module comment).
 *
 * @param heightM height [m], −500..9000
 * @returns pressure [hPa], temperature [°C], relative humidity [%], vapour pressure [hPa]
 * @throws ModelDomainError outside −500..9000 m
 */
export function standardAtmosphere(heightM: number): SurfaceMet {
  const { min, max } = STANDARD_ATMOSPHERE_HEIGHT_RANGE_M;
  if (!(heightM >= min && heightM <= max)) {
    throw new ModelDomainError('site.height_m', `standard atmosphere is defined for ${min}..${max} m above sea level, got ${heightM} m`);
  }
  const pressureHpa = BERG_REFERENCE.pressureHpa * Math.pow(1 - 2.26e-5 * heightM, 5.225);
  const temperatureK = BERG_REFERENCE.temperatureC + CELSIUS_ZERO_K - 0.0065 * heightM;
  const temperatureC = temperatureK - CELSIUS_ZERO_K;
  const relativeHumidityPct = BERG_REFERENCE.relativeHumidityPct * Math.exp(-6.396e-4 * heightM);
  const vapourPressureHpa = vapourPressureFromRelativeHumidityHpa(relativeHumidityPct, temperatureC, pressureHpa);
  return { pressureHpa, temperatureC, relativeHumidityPct, vapourPressureHpa };
}
