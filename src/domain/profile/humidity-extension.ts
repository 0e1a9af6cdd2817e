/**
 * Climatological humidity above the last level of a sounding that carries humidity.
 *
 * Radiosonde humidity sensors often stop reporting aloft (cold, dry air), while temperature and pressure
 * go on. Above the last level with humidity, the specific humidity q is continued with the power law of
 * pressure of Smith (1966):
 *
 *   q(p) = q_h (p / p_h)^λ                     Smith, W. L. (1966), Note on the relationship between
 *                                              total precipitable water and surface dew point,
 *                                              J. Appl. Meteorol. 5, 726–727, eq. 1 (from memory)
 *
 * where q_h and p_h are the specific humidity and pressure of the last level with humidity and
 * λ = SMITH_LAMBDA = 3, the annual mean over the northern-hemisphere stations Smith analysed (his λ
 * ranges from about 2 to 4 with latitude and season; from memory). The vapour pressure follows from q:
 * e = q p / (ε + (1 − ε) q) (humidity.ts). Where that exceeds saturation over water at the level's
 * temperature (f(p) e_w(t), humidity.ts), the saturation value is taken and the levels are counted in the
 * result (`levelsAtSaturation`), so the response says so.
 *
 * The water above p_h under this law is ∫q dp / g = q_h p_h / (g (λ + 1)): with λ = 3 a quarter of
 * q_h p_h / g. At 400 hPa in a mid-latitude summer air mass (q_h ≈ 0.5 g/kg) that is about 0.5 mm; the
 * uncertainty of λ (2..4) moves it by +33 % / −20 %, i.e. about ±0.15 mm (see docs/profile-delays.md).
 *
 * Valid for any last level with humidity below the top level (p_h > p of the levels above, q_h ≥ 0). A
 * last level with q_h = 0 continues dry.
 */

import { CELSIUS_ZERO_K } from '../constants.js';
import { EPSILON } from './constants.js';
import { moistSaturationVapourPressureHpa } from './humidity.js';

/** Exponent λ of Smith's (1966) power law q ∝ p^λ, annual mean (from memory) [-]. */
export const SMITH_LAMBDA = 3;

/** Name of the method in `models` and in the response. */
export const HUMIDITY_EXTENSION_METHOD = 'smith-1966-power-law';

export interface HumidityExtension {
  /** Index (in the request) of the last level that carries humidity. */
  lastHumidityLevel: number;
  /** Pressure of that level [hPa]. */
  lastHumidityPressureHpa: number;
  /** Height of that level above the ellipsoid [m]. */
  lastHumidityHeightM: number;
  /** Specific humidity of that level [kg/kg]. */
  lastHumiditySpecificKgKg: number;
  /** Levels above it whose humidity was filled in. */
  levelsExtended: number;
  /** Of those, levels where the law exceeded saturation and saturation was used. */
  levelsAtSaturation: number;
  /** λ used [-]. */
  lambda: number;
}

/** Specific humidity of a vapour pressure e at total pressure p, q = ε e / (p − (1 − ε) e) [kg/kg]. */
export function specificHumidityKgKg(vapourPressureHpa: number, pressureHpa: number): number {
  return (EPSILON * vapourPressureHpa) / (pressureHpa - (1 - EPSILON) * vapourPressureHpa);
}

/**
 * Fills in the vapour pressure of levels `lastHumidity + 1 .. n − 1` in place.
 *
 * @param pressureHpa pressures of all levels [hPa], decreasing
 * @param temperatureK temperatures of all levels [K]
 * @param heightM heights of all levels above the ellipsoid [m]
 * @param vapourPressureHpa vapour pressures [hPa]; entries above `lastHumidity` are overwritten
 * @param lastHumidity index of the last level with humidity (0 ≤ lastHumidity < n − 1)
 */
export function extendHumidityAbove(
  pressureHpa: Float64Array,
  temperatureK: Float64Array,
  heightM: Float64Array,
  vapourPressureHpa: Float64Array,
  lastHumidity: number,
): HumidityExtension {
  const pH = pressureHpa[lastHumidity]!;
  const qH = specificHumidityKgKg(vapourPressureHpa[lastHumidity]!, pH);
  let levelsAtSaturation = 0;
  for (let i = lastHumidity + 1; i < pressureHpa.length; i++) {
    const p = pressureHpa[i]!;
    const q = qH * Math.pow(p / pH, SMITH_LAMBDA);
    const e = (q * p) / (EPSILON + (1 - EPSILON) * q);
    const saturation = moistSaturationVapourPressureHpa(temperatureK[i]! - CELSIUS_ZERO_K, p);
    if (e > saturation) levelsAtSaturation++;
    vapourPressureHpa[i] = Math.min(e, saturation);
  }
  return {
    lastHumidityLevel: lastHumidity,
    lastHumidityPressureHpa: pH,
    lastHumidityHeightM: heightM[lastHumidity]!,
    lastHumiditySpecificKgKg: qH,
    levelsExtended: pressureHpa.length - 1 - lastHumidity,
    levelsAtSaturation,
    lambda: SMITH_LAMBDA,
  };
}
