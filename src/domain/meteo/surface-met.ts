/**
 * Resolution of the surface met values a zenith-delay computation uses: what the caller measured,
 * reduced from the sensor height to the site height where they differ, and standard-atmosphere
 * defaults for what is missing. The result says which of the three each value is.
 *
 * Heights here are heights above mean sea level (the standard atmosphere is defined on them);
 * callers with ellipsoidal heights subtract the geoid undulation first (geometry/geoid.ts).
 *
 * Pressure and temperature need no humidity, so they (and a ZHD from them) are resolved at every
 * temperature the API accepts (−90..60 °C). Only the vapour pressure needs the saturation formula
 * (WMO-No. 8, valid from −45 °C): below −45 °C it is extrapolated, with a warning (see
 * saturation.ts: the vapour pressure there is below 0.11 hPa and the wet delay below 2 mm).
 */

import { checkReductionHeight, reducePressureHpa, reduceTemperatureC } from './height-reduction.js';
import {
  belowSaturationRange,
  relativeHumidityPct,
  SATURATION_RANGE_C,
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
 * @param siteHeightM site (antenna) height above mean sea level [m], −500..9000
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
    warnings.push(
      `temperature not given: standard atmosphere ${temperatureC.toFixed(2)} °C at ${+siteHeightM.toFixed(1)} m above sea level used`,
    );
  } else {
    temperatureC = reduce ? reduceTemperatureC(met.temperatureC, dHeightM) : met.temperatureC;
    temperatureSource = measuredSource;
  }

  let pressureHpa: number;
  let pressureSource: MetValueSource;
  if (met.pressureHpa === undefined) {
    pressureHpa = atSite.pressureHpa;
    pressureSource = 'standard-atmosphere';
    warnings.push(
      `pressure not given: standard atmosphere ${pressureHpa.toFixed(2)} hPa at ${+siteHeightM.toFixed(1)} m above sea level used`,
    );
  } else {
    pressureHpa = reduce ? reducePressureHpa(met.pressureHpa, sensorT, dHeightM) : met.pressureHpa;
    pressureSource = measuredSource;
  }

  const coldTemperatures = [sensorT, temperatureC, ...(met.dewpointC === undefined ? [] : [met.dewpointC])].filter(belowSaturationRange);
  if (coldTemperatures.length > 0) {
    warnings.push(
      `${Math.min(...coldTemperatures).toFixed(1)} °C is below the ${SATURATION_RANGE_C.min} °C validity of the saturation formula (WMO-No. 8): the vapour pressure is extrapolated (it is below 0.11 hPa there, the wet delay below 2 mm); ZHD and pressure are unaffected`,
    );
  }

  let humiditySource: MetValueSource = measuredSource;
  let sensorRh: number | undefined;
  let vapourPressureHpa: number | undefined;
  if (met.relativeHumidityPct !== undefined) {
    sensorRh = met.relativeHumidityPct;
  } else if (met.dewpointC !== undefined) {
    const e = vapourPressureFromDewpointHpa(met.dewpointC, sensorP, 'extrapolate');
    if (reduce) sensorRh = relativeHumidityPct(e, sensorT, sensorP, 'extrapolate');
    else vapourPressureHpa = e;
  } else if (met.vapourPressureHpa !== undefined) {
    if (reduce) sensorRh = relativeHumidityPct(met.vapourPressureHpa, sensorT, sensorP, 'extrapolate');
    else vapourPressureHpa = met.vapourPressureHpa;
  } else {
    humiditySource = 'standard-atmosphere';
    sensorRh = atSite.relativeHumidityPct;
    warnings.push(
      `humidity not given: standard atmosphere ${sensorRh.toFixed(1)} % relative humidity at ${+siteHeightM.toFixed(1)} m above sea level used`,
    );
  }
  if (vapourPressureHpa === undefined) {
    // Relative humidity held constant over the height difference (see height-reduction.ts).
    vapourPressureHpa = vapourPressureFromRelativeHumidityHpa(sensorRh!, temperatureC, pressureHpa, 'extrapolate');
  }

  return {
    pressureHpa,
    temperatureC,
    vapourPressureHpa,
    source: { pressure: pressureSource, temperature: temperatureSource, humidity: humiditySource },
    warnings,
  };
}
