/**
 * Resolution of the surface met values a zenith-delay computation uses: what the caller measured,
 * reduced from the sensor height to the site height where they differ, and standard-atmosphere
 * defaults for what is missing. The result says which of the three each value is.
 */

import { checkReductionHeight, reducePressureHpa, reduceTemperatureC } from './height-reduction.js';
import {
  relativeHumidityPct,
  vapourPressureFromDewpointHpa,
  vapourPressureFromRelativeHumidityHpa,
} from './saturation.js';
import { standardAtmosphere } from './standard-atmosphere.js';

export type MetValueSource = 'measured' | 'reduced' | 'standard-atmosphere';

export interface MetInput {
  pressureHpa?: number | undefined;
  temperatureC?: number | undefined;
  relativeHumidityPct?: number | undefined;
  dewpointC?: number | undefined;
  vapourPressureHpa?: number | undefined;
  /** Height of the met sensor [m], same datum as the site height; absent = at the site height. */
  heightM?: number | undefined;
}

export interface ResolvedMet {
  pressureHpa: number;
  temperatureC: number;
  vapourPressureHpa: number;
  source: { pressure: MetValueSource; temperature: MetValueSource; humidity: MetValueSource };
  warnings: string[];
}

/**
 * @param siteHeightM site (antenna) height [m], −500..9000
 * @param met what was measured, possibly nothing
 */
export function resolveSurfaceMet(siteHeightM: number, met: MetInput | undefined = {}): ResolvedMet {
  const warnings: string[] = [];
  const atSite = standardAtmosphere(siteHeightM);
  const sensorHeightM = met.heightM ?? siteHeightM;
  const dHeightM = siteHeightM - sensorHeightM;
  const reduce = dHeightM !== 0;
  if (reduce) checkReductionHeight(dHeightM);
  const atSensor = reduce ? standardAtmosphere(sensorHeightM) : atSite;
  const measuredSource: MetValueSource = reduce ? 'reduced' : 'measured';

  // Sensor-level values, standard atmosphere where missing (used only to reduce what was measured).
  const sensorT = met.temperatureC ?? atSensor.temperatureC;
  const sensorP = met.pressureHpa ?? atSensor.pressureHpa;

  let temperatureC: number;
  let temperatureSource: MetValueSource;
  if (met.temperatureC === undefined) {
    temperatureC = atSite.temperatureC;
    temperatureSource = 'standard-atmosphere';
    warnings.push(`temperature not given: standard atmosphere ${temperatureC.toFixed(2)} °C at ${siteHeightM} m used`);
  } else {
    temperatureC = reduce ? reduceTemperatureC(met.temperatureC, dHeightM) : met.temperatureC;
    temperatureSource = measuredSource;
  }

  let pressureHpa: number;
  let pressureSource: MetValueSource;
  if (met.pressureHpa === undefined) {
    pressureHpa = atSite.pressureHpa;
    pressureSource = 'standard-atmosphere';
    warnings.push(`pressure not given: standard atmosphere ${pressureHpa.toFixed(2)} hPa at ${siteHeightM} m used`);
  } else {
    pressureHpa = reduce ? reducePressureHpa(met.pressureHpa, sensorT, dHeightM) : met.pressureHpa;
    pressureSource = measuredSource;
  }

  let humiditySource: MetValueSource = measuredSource;
  let sensorRh: number | undefined;
  let vapourPressureHpa: number | undefined;
  if (met.relativeHumidityPct !== undefined) {
    sensorRh = met.relativeHumidityPct;
  } else if (met.dewpointC !== undefined) {
    const e = vapourPressureFromDewpointHpa(met.dewpointC, sensorP);
    if (reduce) sensorRh = relativeHumidityPct(e, sensorT, sensorP);
    else vapourPressureHpa = e;
  } else if (met.vapourPressureHpa !== undefined) {
    if (reduce) sensorRh = relativeHumidityPct(met.vapourPressureHpa, sensorT, sensorP);
    else vapourPressureHpa = met.vapourPressureHpa;
  } else {
    humiditySource = 'standard-atmosphere';
    sensorRh = atSite.relativeHumidityPct;
    warnings.push(`humidity not given: standard atmosphere ${sensorRh.toFixed(1)} % relative humidity at ${siteHeightM} m used`);
  }
  if (vapourPressureHpa === undefined) {
    // Relative humidity held constant over the height difference (see height-reduction.ts).
    vapourPressureHpa = vapourPressureFromRelativeHumidityHpa(sensorRh!, temperatureC, pressureHpa);
  }

  return {
    pressureHpa,
    temperatureC,
    vapourPressureHpa,
    source: { pressure: pressureSource, temperature: temperatureSource, humidity: humiditySource },
    warnings,
  };
}
