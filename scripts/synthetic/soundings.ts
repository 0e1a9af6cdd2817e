/**
 * Invented soundings (radiosonde-like profiles) for a synthetic station, consistent with the station's
 * known truth (scripts/synthetic/network.ts): the body of PUT /v1/stations/{id}/soundings/{epoch}.
 *
 * The column is the U.S. Standard Atmosphere 1976 generator's (scripts/generators/), shifted so its
 * temperature at the station height is the truth's, with the generator's humidity rule scaled so that
 * the column holds the truth's PWV times (1 + a sounding error): the generator's surface relative humidity
 * RH0 is found by the secant method on the column's own PWV, integrated here (trapezoid rule over the
 * levels of ρv = e / (Rv T), Rv = 461.5 J/(kg K), ρw = 1000 kg/m³; common practice), not by the code under
 * test. The synthetic truth draws PWV and temperature independently, so a cold epoch may carry more water
 * than a column of that temperature holds at RH0 = 85 %: the column is then warmed (uniformly) until it
 * does, and its surface temperature departs from the truth's (the PWV stays consistent, which is what the
 * comparison with GNSS is about).
 * The sounding error is Gaussian with `humidityErrorPct` (default 3 %, the order of radiosonde humidity
 * errors in the lower troposphere; from memory). `pwvMm` says what the column really holds.
 *
 * Humidity may be left out above `humidityTopHpa` (as a sensor that stops reporting aloft): the levels
 * above carry no humidity field.
 *
 * Everything here is invented: no real sounding, station or place.
 */

import { column, type ColumnOptions, evenHeightsM, type GeneratedLevel, ussa1976 } from '../generators/us-standard-atmosphere-1976.js';
import { gaussian, mulberry32, truthSeries, type SyntheticStation, type TruthRecord } from './network.js';

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

/** Surface relative humidity above which the column is warmed instead of moistened [%] (our choice). */
const MAX_SURFACE_RH_PCT = 85;

/** Root of f in [lo, hi] by the secant method from x0, x1 (f is smooth and monotonic here); 1e-6 of f. */
function secant(f: (x: number) => number, x0: number, x1: number, lo: number, hi: number): number {
  let f0 = f(x0);
  let f1 = f(x1);
  for (let k = 0; k < 12 && Math.abs(f1) > 1e-6 && f1 !== f0; k++) {
    const x2 = Math.min(hi, Math.max(lo, x1 - (f1 * (x1 - x0)) / (f1 - f0)));
    [x0, f0] = [x1, f1];
    x1 = x2;
    f1 = f(x1);
  }
  return x1;
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
  const truthOffsetK = truth.temperatureC + 273.15 - ussa1976(bottomM).temperatureK;
  const levelsAt = (rh0: number, temperatureOffsetK: number) =>
    column(heights, { surfaceRelativeHumidityPct: rh0, temperatureOffsetK } satisfies ColumnOptions);
  const pwvAt = (rh0: number, offsetK: number) => columnPwvMm(levelsAt(rh0, offsetK));

  // RH0 at the truth's temperature; where even MAX_SURFACE_RH_PCT holds too little (the synthetic truth
  // draws PWV and temperature independently), the column is warmed instead, at that RH0.
  let rh0 = MAX_SURFACE_RH_PCT;
  let offsetK = truthOffsetK;
  if (pwvAt(MAX_SURFACE_RH_PCT, truthOffsetK) >= targetMm)
    rh0 = secant((x) => pwvAt(x, truthOffsetK) - targetMm, 20, 60, 1, MAX_SURFACE_RH_PCT);
  else offsetK = secant((x) => pwvAt(MAX_SURFACE_RH_PCT, x) - targetMm, truthOffsetK, truthOffsetK + 10, truthOffsetK, truthOffsetK + 40);
  const generated = levelsAt(rh0, offsetK);
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

type Call = (method: 'PUT' | 'GET', url: string, payload?: object) => Promise<unknown>;

/**
 * The demo's soundings: at 00Z and 12Z of each day for every station, every other one without humidity
 * above 400 hPa, stored through the API (`call`); returns a line per station with the GNSS − sounding
 * statistics the service computes.
 */
export async function storeDemoSoundings(
  stations: readonly SyntheticStation[],
  startMs: number,
  days: number,
  seeds: Readonly<Record<string, number>>,
  call: Call,
): Promise<string[]> {
  const lines: string[] = [];
  const twelveHours = 12 * 3_600_000;
  for (const s of stations) {
    // The truth series of the station's delays (same seed), read at the sounding epochs; skip the first and last
    // 12 h, where the demo's met does not cover a ±30 min window.
    const truth = truthSeries(s, startMs, days * 2 + 1, twelveHours, seeds[s.stationId] ?? 1);
    for (let k = 1; k < truth.length - 1; k++) {
      const sounding = syntheticSounding(s, truth[k]!, {
        seed: (seeds[s.stationId] ?? 1) * 1000 + k,
        ...(k % 2 ? { humidityTopHpa: 400 } : {}),
      });
      await call('PUT', `/v1/stations/${s.stationId}/soundings/${sounding.epoch}`, sounding.body);
    }
    const from = new Date(startMs).toISOString();
    const to = new Date(startMs + days * 86_400_000).toISOString();
    const cmp = (await call('GET', `/v1/stations/${s.stationId}/sounding-comparison?from=${from}&to=${to}`)) as {
      statistics: { count: number; bias_mm: number | null; sd_mm: number | null };
    };
    const f = (x: number | null) => (x === null ? '–' : x.toFixed(2));
    lines.push(
      `soundings ${s.stationId.padEnd(5)}: ${truth.length - 2} stored; GNSS − sounding PWV over ${cmp.statistics.count} pairs: bias ${f(cmp.statistics.bias_mm)} mm, SD ${f(cmp.statistics.sd_mm)} mm`,
    );
  }
  return lines;
}
