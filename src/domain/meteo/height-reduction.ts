/**
 * Reduction of surface met values measured at a sensor height to the antenna (site) height.
 *
 * - Temperature: the standard tropospheric lapse rate, −6.5 K/km (U.S. Standard Atmosphere 1976).
 * - Pressure: the hypsometric equation with the mean temperature of the layer,
 *     P_site = P_met · exp(−g0 (h_site − h_met) / (Rd · T̄)),  T̄ = (T_met + T_site)/2   [K]
 *   (e.g. Wallace & Hobbs, Atmospheric Science, 2nd ed. (2006), eq. 3.29; humidity's effect on the
 *   virtual temperature is ignored: about 0.1 % of the pressure difference, under 0.01 hPa for 10 m).
 * - Humidity: relative humidity is held constant across the height difference (common practice for
 *   sensors a few metres to tens of metres from the antenna) and the vapour pressure is recomputed
 *   at the reduced temperature and pressure.
 *
 * Valid for height differences up to 1000 m; larger differences are an error, because a surface
 * sensor that far from the antenna does not describe its column.
 */

import { CELSIUS_ZERO_K, G0_M_S2, RD_J_PER_KG_K, STANDARD_LAPSE_RATE_K_PER_M } from '../constants.js';
import { ModelDomainError } from '../errors.js';

export const MAX_REDUCTION_HEIGHT_DIFFERENCE_M = 1000;

/**
 * @param temperatureC temperature at the sensor [°C]
 * @param dHeightM site height minus sensor height [m]
 * @returns temperature at the site [°C]
 */
export function reduceTemperatureC(temperatureC: number, dHeightM: number): number {
  return temperatureC + STANDARD_LAPSE_RATE_K_PER_M * dHeightM;
}

/**
 * @param pressureHpa pressure at the sensor [hPa]
 * @param temperatureC temperature at the sensor [°C]
 * @param dHeightM site height minus sensor height [m]
 * @returns pressure at the site [hPa]
 */
export function reducePressureHpa(pressureHpa: number, temperatureC: number, dHeightM: number): number {
  const sensorK = temperatureC + CELSIUS_ZERO_K;
  const siteK = sensorK + STANDARD_LAPSE_RATE_K_PER_M * dHeightM;
  const meanK = (sensorK + siteK) / 2;
  return pressureHpa * Math.exp((-G0_M_S2 * dHeightM) / (RD_J_PER_KG_K * meanK));
}

export function checkReductionHeight(dHeightM: number, field = 'met.height_m'): void {
  if (Math.abs(dHeightM) > MAX_REDUCTION_HEIGHT_DIFFERENCE_M) {
    throw new ModelDomainError(
      field,
      `met sensor is ${Math.abs(dHeightM).toFixed(0)} m from the site height; reduction is done for at most ${MAX_REDUCTION_HEIGHT_DIFFERENCE_M} m`,
      400,
    );
  }
}
