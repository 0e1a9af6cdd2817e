/**
 * Invented soundings (radiosonde-like profiles) for a synthetic station, consistent with the station's
 * known truth (scripts/synthetic/network.ts): the body of PUT /v1/stations/{id}/soundings/{epoch}.
 *
 * The column is the U.S. Standard Atmosphere 1976 generator's (scripts/generators/), shifted so its
 * temperature at the station height is the truth's, with the generator's humidity rule scaled so that
 * the column holds the truth's PWV times (1 + a sounding error): relative humidity at the surface RH0 is
 * found by the secant method on the column's own PWV, integrated here (trapezoid rule over the levels of
 * ρv = e / (Rv T), Rv = 461.5 J/(kg K), ρw = 1000 kg/m³; common practice), not by the code under test.
 * The sounding error is Gaussian with `humidityErrorPct` (default 3 %, the order of radiosonde humidity
 * errors in the lower troposphere; from memory). RH0 is capped at 100 %: a truth wetter than a saturated
 * column of that temperature gets the saturated column, and `pwvMm` says what the column really holds.
 *
 * Humidity may be left out above `humidityTopHpa` (as a sensor that stops reporting aloft): the levels
 * above carry no humidity field.
 *
 * Everything here is invented: no real sounding, station or place.
 */

import { column, type ColumnOptions, evenHeightsM, type GeneratedLevel, ussa1976 } from '../generators/us-standard-atmosphere-1976.js';
import { gaussian, mulberry32, type SyntheticStation, type TruthRecord } from './network.js';

const RV_J_PER_KG_K = 461.5;
const RHO_WATER_KG_M3 = 1000;
/** Level spacing [m] and top [m above the station]. */
const LEVEL_STEP_M = 250;
const TOP_ABOVE_STATION_M = 30_000;

export interface SoundingLevel {
  height_m: number;
  pressure_hpa: number;
  temperature_c: number;
  relative_humidity_pct?: number;
}

export interface SyntheticSounding {
  epoch: string;
  body: { levels: SoundingLevel[] };
  /** PWV of the generated column (with the sounding error, before rounding) [mm]. */
  pwvMm: number;
  /** The truth's PWV at the epoch [mm]. */
  truthPwvMm: number;
}

export interface SyntheticSoundingOptions {
  /** Seed of the sounding error. */
  seed: number;
  /** Relative humidity error, 1σ [%] of the value; default 3. */
  humidityErrorPct?: number;
  /** Leave humidity out above this pressure [hPa]; default: humidity at every level. */
  humidityTopHpa?: number;
}

/** PWV of generated levels [mm]: trapezoid rule of ρv = e / (Rv T) over height. */
export function columnPwvMm(levels: readonly GeneratedLevel[]): number {
  let kgPerM2 = 0;
  for (let i = 1; i < levels.length; i++) {
    const a = levels[i - 1]!;
    const b = levels[i]!;
    const rhoA = (a.vapourPressureHpa * 100) / (RV_J_PER_KG_K * a.temperatureK);
    const rhoB = (b.vapourPressureHpa * 100) / (RV_J_PER_KG_K * b.temperatureK);
    kgPerM2 += ((rhoA + rhoB) / 2) * (b.heightM - a.heightM);
  }
  return (kgPerM2 / RHO_WATER_KG_M3) * 1000;
}

/**
 * A sounding of `station` at the truth record's epoch.
 *
 * @param station the invented station (its height is the column's bottom)
 * @param truth the station's truth at the sounding epoch (temperature [°C], PWV [mm])
 */
export function syntheticSounding(station: SyntheticStation, truth: TruthRecord, options: SyntheticSoundingOptions): SyntheticSounding {
  const random = mulberry32(options.seed);
  const error = 1 + ((options.humidityErrorPct ?? 3) / 100) * gaussian(random);
  const targetMm = truth.pwvMm * error;
  const bottomM = Math.max(0, Math.round(station.heightM));
  const heights = evenHeightsM(LEVEL_STEP_M, bottomM, bottomM + TOP_ABOVE_STATION_M);
  const temperatureOffsetK = truth.temperatureC + 273.15 - ussa1976(bottomM).temperatureK;
  const levelsAt = (rh0: number) => column(heights, { surfaceRelativeHumidityPct: rh0, temperatureOffsetK } satisfies ColumnOptions);

  // Secant method on PWV(RH0), nearly linear; three steps reach 1e-6 mm.
  let x0 = 40;
  let x1 = 80;
  let f0 = columnPwvMm(levelsAt(x0)) - targetMm;
  let f1 = columnPwvMm(levelsAt(x1)) - targetMm;
  for (let k = 0; k < 8 && Math.abs(f1) > 1e-6 && f1 !== f0; k++) {
    const x2 = Math.min(100, Math.max(1, x1 - (f1 * (x1 - x0)) / (f1 - f0)));
    [x0, f0] = [x1, f1];
    x1 = x2;
    f1 = columnPwvMm(levelsAt(x1)) - targetMm;
    if (x1 === 100 && f1 < 0) break; // saturated column: as wet as this temperature allows
  }
  const generated = levelsAt(x1);
  const levels = generated.map((l) => {
    const level: SoundingLevel = {
      height_m: l.heightM,
      pressure_hpa: Math.round(l.pressureHpa * 100) / 100,
      temperature_c: Math.round((l.temperatureK - 273.15) * 100) / 100,
    };
    if (options.humidityTopHpa === undefined || l.pressureHpa >= options.humidityTopHpa) {
      level.relative_humidity_pct = Math.round(l.relativeHumidityPct * 100) / 100;
    }
    return level;
  });
  return { epoch: new Date(truth.epochMs).toISOString(), body: { levels }, pwvMm: columnPwvMm(generated), truthPwvMm: truth.pwvMm };
}
