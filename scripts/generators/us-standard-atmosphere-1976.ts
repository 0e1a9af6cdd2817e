/**
 * Generator of U.S. Standard Atmosphere 1976 columns with a known truth, for tests, benchmarks and
 * the documentation's examples. It implements the defining equations of the standard and shares no
 * code with src/ (it must not: tests compare src/ against it).
 *
 * U.S. Standard Atmosphere, 1976 (NOAA/NASA/USAF, Washington D.C.), Part 1 (values from memory,
 * checked in test/domain/profile/us-standard-atmosphere-1976.test.ts against the check values of
 * docs/constants.md):
 * - geopotential altitude H [m'] from geometric altitude Z [m]: H = r0 Z / (r0 + Z), r0 = 6 356 766 m
 *   (eq. 18 there);
 * - seven layers in geopotential altitude with linear molecular-scale temperature T_M = T_b + L_b (H − H_b)
 *   (eq. 23), bases H_b = 0, 11, 20, 32, 47, 51, 71 km' and lapse rates L_b = −6.5, 0, +1.0, +2.8, 0,
 *   −2.8, −2.0 K/km', up to 84.852 km' (86 km geometric);
 * - pressure (eq. 33a/b): P = P_b [T_b / (T_b + L_b (H − H_b))]^(g0' M0 / (R* L_b)) for L_b ≠ 0 and
 *   P = P_b exp(−g0' M0 (H − H_b) / (R* T_b)) for L_b = 0;
 * - constants: T0 = 288.15 K, P0 = 101 325 Pa, g0' = 9.80665 m²/(s² m'), R* = 8.31432 J/(mol K)
 *   (the 1976 value), M0 = 28.9644 kg/kmol.
 * Above 80 km the standard's kinetic temperature departs from T_M by the ratio M/M0 (≤ 0.04 %); it
 * is ignored here (the pressure there is below 0.01 hPa).
 *
 * Humidity is not part of the standard. `humidColumn` adds a synthetic rule with a known truth
 * (documented at the function) so that wet delays, precipitable water and Tm can be checked by
 * independent integration of the generator's own vapour pressures.
 *
 * Run `npx tsx scripts/generators/us-standard-atmosphere-1976.ts` to (re)write the example request
 * fixtures/profiles/ussa1976-45n.json used in docs/profile-delays.md.
 */

import { writeFileSync } from 'node:fs';
import { type CliSpec, epochOption, runCli, writeOutput } from '../cli.js';

/** Effective Earth radius of the standard's geopotential definition [m]. */
export const USSA_R0_M = 6_356_766;
/** Standard gravity defining the geopotential metre [m/s²]. */
export const USSA_G0 = 9.80665;
/** Universal gas constant as adopted in 1976 [J/(mol K)]. */
export const USSA_RSTAR = 8.31432;
/** Sea-level mean molecular weight of air [kg/mol]. */
export const USSA_M0 = 0.0289644;
/** Top of the seven-layer model, geopotential [m']. */
export const USSA_TOP_GEOPOTENTIAL_M = 84_852;

/** Layer bases [m'] and lapse rates [K/m']. */
const LAYERS: ReadonlyArray<{ baseM: number; lapseKPerM: number }> = [
  { baseM: 0, lapseKPerM: -0.0065 },
  { baseM: 11_000, lapseKPerM: 0 },
  { baseM: 20_000, lapseKPerM: 0.001 },
  { baseM: 32_000, lapseKPerM: 0.0028 },
  { baseM: 47_000, lapseKPerM: 0 },
  { baseM: 51_000, lapseKPerM: -0.0028 },
  { baseM: 71_000, lapseKPerM: -0.002 },
];

const GMR = (USSA_G0 * USSA_M0) / USSA_RSTAR; // g0' M0 / R* [K/m']

/** Base temperature [K] and pressure [Pa] of every layer, from T0, P0 and the layer equations. */
const BASES = (() => {
  const out: { tK: number; pPa: number }[] = [{ tK: 288.15, pPa: 101_325 }];
  for (let i = 0; i + 1 < LAYERS.length; i++) {
    const { baseM, lapseKPerM } = LAYERS[i]!;
    const dH = LAYERS[i + 1]!.baseM - baseM;
    const { tK, pPa } = out[i]!;
    const tTop = tK + lapseKPerM * dH;
    const pTop = lapseKPerM === 0 ? pPa * Math.exp((-GMR * dH) / tK) : pPa * Math.pow(tK / tTop, GMR / lapseKPerM);
    out.push({ tK: tTop, pPa: pTop });
  }
  return out;
})();

/** Geopotential altitude [m'] of a geometric altitude [m] (eq. 18). */
export function geopotentialFromGeometricM(geometricM: number): number {
  return (USSA_R0_M * geometricM) / (USSA_R0_M + geometricM);
}

/** Geometric altitude [m] of a geopotential altitude [m'] (inverse of eq. 18). */
export function geometricFromGeopotentialM(geopotentialM: number): number {
  return (USSA_R0_M * geopotentialM) / (USSA_R0_M - geopotentialM);
}

/**
 * Temperature and pressure of the standard at a geometric altitude.
 *
 * @param geometricM geometric altitude above mean sea level [m], −500..86 000
 * @returns temperature [K] and pressure [hPa]
 */
export function ussa1976(geometricM: number): { temperatureK: number; pressureHpa: number } {
  const h = geopotentialFromGeometricM(geometricM);
  if (!(h >= -500 && h <= USSA_TOP_GEOPOTENTIAL_M + 1))
    throw new RangeError(`USSA 1976 generator: altitude ${geometricM} m outside −500..86 000 m`);
  let i = LAYERS.length - 1;
  while (i > 0 && h < LAYERS[i]!.baseM) i--;
  const { baseM, lapseKPerM } = LAYERS[i]!;
  const { tK, pPa } = BASES[i]!;
  const temperatureK = tK + lapseKPerM * (h - baseM);
  const pressurePa = lapseKPerM === 0 ? pPa * Math.exp((-GMR * (h - baseM)) / tK) : pPa * Math.pow(tK / temperatureK, GMR / lapseKPerM);
  return { temperatureK, pressureHpa: pressurePa / 100 };
}

/**
 * Saturation vapour pressure over water used by the generator [hPa]: the Magnus form of WMO-No. 8
 * (2008) Annex 4.B, 6.112 exp(17.62 t / (243.12 + t)), t in °C, extrapolated below −45 °C.
 * Typed here again on purpose: the generator must not call the code under test.
 */
export function generatorSaturationHpa(temperatureC: number): number {
  return 6.112 * Math.exp((17.62 * temperatureC) / (243.12 + temperatureC));
}

export interface GeneratedLevel {
  /** Geometric altitude above mean sea level = height above the ellipsoid of a synthetic place with zero geoid undulation [m]. */
  heightM: number;
  /** Geopotential altitude [m'] of the standard. */
  geopotentialHeightM: number;
  pressureHpa: number;
  temperatureK: number;
  /** Vapour pressure [hPa], the truth of the humidity rule (0 for a dry column). */
  vapourPressureHpa: number;
  /** Relative humidity of the rule [%], with respect to e_w of the generator (no enhancement factor). */
  relativeHumidityPct: number;
}

export interface ColumnOptions {
  /** Relative humidity at the surface [%]; 0 gives a dry column. */
  surfaceRelativeHumidityPct?: number;
  /** Height above which the column is dry [m]. */
  dryAboveM?: number;
  /** Added to the standard's temperature at every height [K] (warmer or colder climates); default 0. */
  temperatureOffsetK?: number;
}

/** Temperature of a column at a height [K]: the standard's plus the offset. */
export function columnTemperatureK(heightM: number, options: ColumnOptions): number {
  return ussa1976(heightM).temperatureK + (options.temperatureOffsetK ?? 0);
}

/** Ratio of the molecular weights of water and dry air, Mw/M0 = 18.01528/28.9644 [-]. */
export const GENERATOR_EPSILON = 18.01528 / 28.9644;
/** Gas constant of dry air of the standard, R* / M0 = 287.053 J/(kg K). */
export const GENERATOR_RD = USSA_RSTAR / USSA_M0;

/** Gravity of the standard at a geometric altitude, g0 (r0/(r0 + Z))² [m/s²] (eq. 17 there). */
export function ussaGravity(geometricM: number): number {
  return USSA_G0 * (USSA_R0_M / (USSA_R0_M + geometricM)) ** 2;
}

/** Relative humidity of the synthetic rule at a height [%] (see `column`). */
export function ruleRelativeHumidityPct(heightM: number, options: ColumnOptions): number {
  const rh0 = options.surfaceRelativeHumidityPct ?? 0;
  if (heightM > (options.dryAboveM ?? 16_000)) return 0;
  return rh0 * (1 - (0.8 * Math.min(Math.max(heightM, 0), 10_000)) / 10_000);
}

/** Vapour pressure of the synthetic rule at a height [hPa]: RH/100 · e_w(T) with the column's T. */
export function ruleVapourPressureHpa(heightM: number, options: ColumnOptions): number {
  return (ruleRelativeHumidityPct(heightM, options) / 100) * generatorSaturationHpa(columnTemperatureK(heightM, options) - 273.15);
}

/**
 * Pressure of the humid column [hPa]: the column's temperature and the humidity rule, in
 * hydrostatic balance with the standard's gravity,
 *   dP/dz = −g(z) ρ = −g(z) (P − (1 − ε) e) / (Rd T)
 * (the virtual-temperature form of the hydrostatic equation), integrated from 1013.25 hPa at 0 m
 * with the classical Runge–Kutta scheme in 5 m steps (truncation error below 1e-9 of P).
 */
export function humidPressureHpa(heightsM: readonly number[], options: ColumnOptions): number[] {
  const slope = (z: number, p: number) => {
    const tK = columnTemperatureK(z, options);
    return (-ussaGravity(z) * (p - (1 - GENERATOR_EPSILON) * ruleVapourPressureHpa(z, options))) / (GENERATOR_RD * tK);
  };
  const out: number[] = [];
  let z = 0;
  let p = 1013.25;
  const stepM = 5;
  for (const target of heightsM) {
    if (target < z) throw new RangeError('humidPressureHpa: heights must be ascending and ≥ 0');
    while (z < target) {
      const h = Math.min(stepM, target - z);
      const k1 = slope(z, p);
      const k2 = slope(z + h / 2, p + (h / 2) * k1);
      const k3 = slope(z + h / 2, p + (h / 2) * k2);
      const k4 = slope(z + h, p + h * k3);
      p += (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
      z += h;
    }
    out.push(p);
  }
  return out;
}

/**
 * A column at the given geometric altitudes (ascending, ≥ 0 m). Humidity rule (synthetic, not a
 * climatology): RH(z) = RH0 (1 − 0.8 z / 10 km) up to 10 km, RH0/5 from 10 km to `dryAboveM`
 * (default 16 km), 0 above; e = RH/100 · e_w(T) with the generator's own e_w. A dry column has the
 * standard's pressures; a humid one, or one with a temperature offset, the pressures of
 * `humidPressureHpa`.
 */
export function column(heightsM: readonly number[], options: ColumnOptions = {}): GeneratedLevel[] {
  const integrate = (options.surfaceRelativeHumidityPct ?? 0) > 0 || (options.temperatureOffsetK ?? 0) !== 0;
  const pressures = integrate ? humidPressureHpa(heightsM, options) : heightsM.map((h) => ussa1976(h).pressureHpa);
  return heightsM.map((heightM, i) => {
    const temperatureK = columnTemperatureK(heightM, options);
    const relativeHumidityPct = ruleRelativeHumidityPct(heightM, options);
    return {
      heightM,
      geopotentialHeightM: geopotentialFromGeometricM(heightM),
      pressureHpa: pressures[i]!,
      temperatureK,
      vapourPressureHpa: (relativeHumidityPct / 100) * generatorSaturationHpa(temperatureK - 273.15),
      relativeHumidityPct,
    };
  });
}

/**
 * Heights of a column with `n` levels from `bottomM` to `topM`, spaced more densely near the
 * ground like a weather-model column: z_i = bottom + (top − bottom) · s_i^1.6, s_i = i/(n − 1).
 */
export function stretchedHeightsM(n: number, bottomM: number, topM: number): number[] {
  return Array.from({ length: n }, (_, i) => bottomM + (topM - bottomM) * Math.pow(i / (n - 1), 1.6));
}

/** Evenly spaced heights from bottom to top, both included [m]. */
export function evenHeightsM(stepM: number, bottomM: number, topM: number): number[] {
  const n = Math.round((topM - bottomM) / stepM);
  return Array.from({ length: n + 1 }, (_, i) => bottomM + i * stepM);
}

/** API form of a level (the field names of POST /v1/profile-delays). */
export type ApiHumidity = 'vapour_pressure_hpa' | 'relative_humidity_pct' | 'none';

export function toApiLevels(
  levels: readonly GeneratedLevel[],
  humidity: ApiHumidity = 'vapour_pressure_hpa',
  heights: 'height_m' | 'geopotential_height_m' = 'height_m',
): Record<string, number>[] {
  return levels.map((l) => {
    const out: Record<string, number> = {};
    out[heights] = heights === 'height_m' ? l.heightM : l.geopotentialHeightM;
    out.pressure_hpa = l.pressureHpa;
    out.temperature_c = l.temperatureK - 273.15;
    if (humidity === 'vapour_pressure_hpa') out.vapour_pressure_hpa = l.vapourPressureHpa;
    else if (humidity === 'relative_humidity_pct') out.relative_humidity_pct = l.relativeHumidityPct;
    else out.relative_humidity_pct = 0;
    return out;
  });
}

/** The example request of the documentation: 40 levels from 0 to 30 km, RH0 = 70 %, site at 45° N. */
export function exampleRequest(epochIso = '2026-04-29T07:00:00Z') {
  const heights = stretchedHeightsM(40, 0, 30_000).map((h) => Math.round(h));
  const levels = column(heights, { surfaceRelativeHumidityPct: 70 }).map((l) => ({
    height_m: l.heightM,
    pressure_hpa: Number(l.pressureHpa.toFixed(3)),
    temperature_c: Number((l.temperatureK - 273.15).toFixed(2)),
    relative_humidity_pct: Number(l.relativeHumidityPct.toFixed(1)),
  }));
  return {
    site: { latitude_deg: 45, longitude_deg: 10, height_m: 0 },
    epoch: epochIso,
    levels,
    elevations_deg: [3, 5, 10, 15, 30, 90],
  };
}

export const USSA_CLI: CliSpec = {
  command: 'npx tsx scripts/generators/us-standard-atmosphere-1976.ts',
  summary:
    "Writes the documentation's example request for POST /v1/profile-delays: the U.S. Standard Atmosphere 1976 at 45° N,\n" +
    '40 levels from 0 to 30 km, 70 % surface relative humidity.',
  options: {
    start: { type: 'string', value: 'EPOCH', description: 'epoch of the request, ISO 8601 with a zone', default: '2026-04-29T07:00:00Z' },
    out: {
      type: 'string',
      value: 'FILE',
      description: 'file to write ("-": standard output)',
      default: 'fixtures/profiles/ussa1976-45n.json',
    },
  },
};

if (import.meta.url === `file://${process.argv[1]}`) {
  runCli(USSA_CLI, (values) => {
    const epochIso = new Date(epochOption(values, 'start')).toISOString().replace('.000Z', 'Z');
    const text = JSON.stringify(exampleRequest(epochIso), null, 2) + '\n';
    if (values.out === USSA_CLI.options.out!.default) {
      const target = new URL('../../fixtures/profiles/ussa1976-45n.json', import.meta.url);
      writeFileSync(target, text);
      process.stdout.write(`wrote ${target.pathname}\n`);
    } else writeOutput(text, values.out);
  });
}
