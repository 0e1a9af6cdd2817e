/**
 * The levels of an atmospheric profile: validation, conversion to one height datum and one humidity
 * quantity, the column from the site height up, and interpolation between levels.
 *
 * Rules (documented in docs/profile-delays.md):
 * - at least MIN_LEVELS and at most MAX_LEVELS levels, ordered from the surface up;
 * - each level has exactly one height (height_m above the ellipsoid, or geopotential_height_m, which
 *   is converted with normal gravity at the site latitude, gravity.ts, and the caller's geoid
 *   undulation) and exactly one humidity quantity (humidity.ts); different levels may use different
 *   quantities; humidity may stop above some level (the levels above carry none, it may not resume;
 *   the bottom level must carry it), and is then continued climatologically (humidity-extension.ts,
 *   Smith 1966), which the result says;
 * - heights strictly increase and pressures strictly decrease from level to level;
 * - the top level is at least MIN_TOP_HEIGHT_M above the ellipsoid (above it the column is extended
 *   hydrostatically, extension.ts);
 * - vapour pressure at most SUPERSATURATION_LIMIT_PCT of saturation (rounding of reported values)
 *   and below the total pressure;
 * - the column starts at the site height: levels below it are dropped and the bottom is interpolated;
 *   a profile that starts above the site (by at most MAX_DOWNWARD_EXTENSION_M) is extended down with
 *   the standard lapse rate −6.5 K/km, the hypsometric pressure and constant relative humidity
 *   (src/domain/meteo/height-reduction.ts).
 *
 * Interpolation between two levels (physically sensible and exact for the cases named):
 * - temperature linear in height;
 * - pressure as the hydrostatic solution for a temperature linear in height, P = P1 (T/T1)^α with α
 *   fixed by the two levels' pressures (exact for a constant lapse rate and constant gravity; the
 *   U.S. Standard Atmosphere layers), exponential in height when T1 = T2;
 * - vapour pressure exponential in height (linear when either level has e = 0).
 */

import { CELSIUS_ZERO_K, RD_J_PER_KG_K } from '../constants.js';
import { ModelDomainError } from '../errors.js';
import { reducePressureHpa, reduceTemperatureC } from '../meteo/height-reduction.js';
import { EPSILON } from './constants.js';
import { geometricHeightFromGeopotentialM, type GravityAtLatitude } from './gravity.js';
import { extendHumidityAbove, type HumidityExtension } from './humidity-extension.js';
import {
  HUMIDITY_QUANTITIES,
  moistSaturationVapourPressureHpa,
  relativeHumidityOfLevelPct,
  saturationExtrapolated,
  vapourPressureOfLevelHpa,
  type HumidityQuantity,
} from './humidity.js';

export const MIN_LEVELS = 5;
export const MAX_LEVELS = 10_000;
/**
 * Lowest admissible top of a profile [m above the ellipsoid]: above it the extension is dry and holds about a
 * quarter of the ZHD at most.
 */
export const MIN_TOP_HEIGHT_M = 10_000;
/** Largest distance a profile is extended down to the site [m] (as for surface met, height-reduction.ts). */
export const MAX_DOWNWARD_EXTENSION_M = 1000;
/** Largest accepted vapour pressure relative to saturation [%]: 2 % above it covers rounding of reported values. */
export const SUPERSATURATION_LIMIT_PCT = 102;
/** A layer whose thickness departs from the hypsometric thickness by more than this fraction (and 10 m) gets a warning. */
export const HYPSOMETRIC_TOLERANCE = 0.02;
/** Layers thicker than this get a warning: interpolation across them is poor [m]. */
export const THICK_LAYER_WARNING_M = 5000;

/** A level as the caller gives it (the API's fields in camelCase). */
export interface ProfileLevelInput {
  heightM?: number | undefined;
  geopotentialHeightM?: number | undefined;
  pressureHpa: number;
  temperatureC: number;
  relativeHumidityPct?: number | undefined;
  dewpointC?: number | undefined;
  vapourPressureHpa?: number | undefined;
  specificHumidityKgKg?: number | undefined;
}

/** Levels in one datum and one humidity quantity, from the bottom up. */
export interface Column {
  /** Height above the ellipsoid [m]. */
  heightM: Float64Array;
  pressureHpa: Float64Array;
  temperatureK: Float64Array;
  vapourPressureHpa: Float64Array;
}

/** Validated levels; `humidityExtension` is set when humidity stopped below the top level. */
export interface ValidatedColumn extends Column {
  humidityExtension: HumidityExtension | null;
}

export interface PreparedColumn extends Column {
  /** Levels of the request that lie in the column (the bottom level may be interpolated or extended). */
  levelsUsed: number;
  /** Levels of the request below the site height, not used. */
  levelsBelowSite: number;
  /** How far the profile was extended down to reach the site [m]; 0 when it reached it. */
  extendedDownM: number;
}

const HUMIDITY_FIELDS: Record<HumidityQuantity, keyof ProfileLevelInput> = {
  relative_humidity_pct: 'relativeHumidityPct',
  dewpoint_c: 'dewpointC',
  vapour_pressure_hpa: 'vapourPressureHpa',
  specific_humidity_kg_kg: 'specificHumidityKgKg',
};

const at = (i: number, field: string) => `levels.${i}.${field}`;
const count = (n: number, noun: string) => `${n} ${noun}${n === 1 ? '' : 's'}`;
const fmt = (x: number, digits = 3) => Number(x.toPrecision(digits + 3)).toString();

/**
 * Validates the levels and converts them to heights above the ellipsoid and vapour pressures.
 *
 * @param levels levels from the surface up
 * @param gravity normal gravity at the site latitude (for geopotential heights)
 * @param geoidUndulationM geoid undulation N at the site [m] (ellipsoidal = orthometric + N)
 * @param warnings collects what the caller should know
 * @param geoidSource where N comes from: the caller, the EGM96 model (geometry/geoid.ts), or nowhere (N = 0)
 * @throws ModelDomainError (400) naming levels.<i>.<field> and the rule it breaks
 */
export function validateLevels(
  levels: readonly ProfileLevelInput[],
  gravity: GravityAtLatitude,
  geoidUndulationM: number,
  warnings: string[],
  geoidSource: 'caller' | 'egm96' | 'none' = geoidUndulationM === 0 ? 'none' : 'caller',
): ValidatedColumn {
  const n = levels.length;
  if (n < MIN_LEVELS || n > MAX_LEVELS) {
    throw new ModelDomainError('levels', `must hold ${MIN_LEVELS}..${MAX_LEVELS} levels, got ${n}`, 400);
  }
  const heightM = new Float64Array(n);
  const pressureHpa = new Float64Array(n);
  const temperatureK = new Float64Array(n);
  const vapourPressureHpa = new Float64Array(n);
  const heightFields: string[] = new Array(n);
  let usesGeopotential = false;
  const extrapolated: number[] = [];
  const lastHumidity = lastLevelWithHumidity(levels);

  for (let i = 0; i < n; i++) {
    const level = levels[i]!;
    // Height: exactly one of the two.
    if ((level.heightM === undefined) === (level.geopotentialHeightM === undefined)) {
      throw new ModelDomainError(
        level.heightM === undefined ? `levels.${i}` : at(i, 'geopotential_height_m'),
        'give exactly one of height_m (above the ellipsoid) and geopotential_height_m',
        400,
      );
    }
    if (level.heightM !== undefined) {
      heightM[i] = level.heightM;
      heightFields[i] = 'height_m';
    } else {
      heightM[i] = geometricHeightFromGeopotentialM(level.geopotentialHeightM!, gravity) + geoidUndulationM;
      heightFields[i] = 'geopotential_height_m';
      usesGeopotential = true;
    }
    pressureHpa[i] = level.pressureHpa;
    temperatureK[i] = level.temperatureC + CELSIUS_ZERO_K;

    if (i > 0 && !(heightM[i]! > heightM[i - 1]!)) {
      throw new ModelDomainError(
        at(i, heightFields[i]!),
        `must increase with the level index (levels go from the surface up): ${fmt(heightM[i]!)} m at level ${i} is not above ${fmt(heightM[i - 1]!)} m at level ${i - 1}${usesGeopotential ? ' (heights compared above the ellipsoid)' : ''}`,
        400,
      );
    }
    if (i > 0 && !(pressureHpa[i]! < pressureHpa[i - 1]!)) {
      throw new ModelDomainError(
        at(i, 'pressure_hpa'),
        `must decrease with height: ${level.pressureHpa} hPa at level ${i} is not below ${pressureHpa[i - 1]} hPa at level ${i - 1}`,
        400,
      );
    }

    // Humidity: exactly one quantity.
    const given = HUMIDITY_QUANTITIES.filter((q) => level[HUMIDITY_FIELDS[q]] !== undefined);
    if (i > lastHumidity) continue; // humidity stopped below: filled in after the loop
    if (given.length !== 1) {
      throw new ModelDomainError(
        given.length === 0 ? `levels.${i}` : at(i, given[1]!),
        given.length === 0
          ? `give exactly one of ${HUMIDITY_QUANTITIES.join(', ')}: humidity may stop above some level, but level ${lastHumidity} above this one carries humidity again`
          : `give exactly one of ${HUMIDITY_QUANTITIES.join(', ')} (got ${given.join(' and ')})`,
        400,
      );
    }
    const quantity = given[0]!;
    const value = level[HUMIDITY_FIELDS[quantity]] as number;
    const e = vapourPressureOfLevelHpa(quantity, value, level.temperatureC, level.pressureHpa);
    if (!(e < level.pressureHpa)) {
      throw new ModelDomainError(
        at(i, quantity),
        `gives a vapour pressure of ${fmt(e)} hPa, not below the total pressure ${level.pressureHpa} hPa`,
        400,
      );
    }
    const saturation = moistSaturationVapourPressureHpa(level.temperatureC, level.pressureHpa);
    if (quantity !== 'relative_humidity_pct' && e > (SUPERSATURATION_LIMIT_PCT / 100) * saturation) {
      const what =
        quantity === 'dewpoint_c'
          ? `dew point ${value} °C is above the temperature ${level.temperatureC} °C`
          : `gives a vapour pressure of ${fmt(e)} hPa`;
      throw new ModelDomainError(
        at(i, quantity),
        `${what}: ${((100 * e) / saturation).toFixed(1)} % of saturation (${fmt(saturation)} hPa at ${level.temperatureC} °C); at most ${SUPERSATURATION_LIMIT_PCT} % is accepted`,
        400,
      );
    }
    if (e > 0 && (saturationExtrapolated(level.temperatureC) || (quantity === 'dewpoint_c' && saturationExtrapolated(value)))) {
      if (quantity === 'relative_humidity_pct' || quantity === 'dewpoint_c') extrapolated.push(i);
    }
    vapourPressureHpa[i] = e;
  }

  const top = n - 1;
  if (heightM[top]! < MIN_TOP_HEIGHT_M) {
    throw new ModelDomainError(
      at(top, heightFields[top]!),
      `the top level is at ${fmt(heightM[top]!)} m; the profile must reach at least ${MIN_TOP_HEIGHT_M} m above the ellipsoid (the column above the top is extended hydrostatically and taken as dry)`,
      400,
    );
  }
  if (lastHumidity < 0) {
    throw new ModelDomainError(
      'levels.0',
      `give exactly one of ${HUMIDITY_QUANTITIES.join(', ')}: at least the bottom level must carry humidity (humidity may stop above some level)`,
      400,
    );
  }
  const humidityExtension =
    lastHumidity < n - 1 ? extendHumidityAbove(pressureHpa, temperatureK, heightM, vapourPressureHpa, lastHumidity) : null;
  if (humidityExtension) warnings.push(humidityExtensionWarning(humidityExtension));
  if (extrapolated.length) {
    warnings.push(
      `${count(extrapolated.length, 'level')} colder than −45 °C ${extrapolated.length === 1 ? 'gives' : 'give'} humidity as relative humidity or dew point (${extrapolated.length === 1 ? 'level' : 'levels'} ${listIndices(extrapolated)}): the WMO-No. 8 saturation formula is extrapolated there (vapour pressures below 0.1 hPa)`,
    );
  }
  if (usesGeopotential) {
    warnings.push(
      geoidSource === 'none'
        ? 'geopotential heights converted with WGS84 normal gravity at the site latitude; geoid_undulation_m not given, so heights above mean sea level are taken as heights above the ellipsoid'
        : geoidSource === 'egm96'
          ? `geopotential heights converted with WGS84 normal gravity at the site latitude and the EGM96 geoid undulation ${geoidUndulationM.toFixed(2)} m (geoid_undulation_m not given)`
          : `geopotential heights converted with WGS84 normal gravity at the site latitude and the geoid undulation ${geoidUndulationM} m`,
    );
  }
  checkLayers({ heightM, pressureHpa, temperatureK, vapourPressureHpa }, gravity, warnings);
  return { heightM, pressureHpa, temperatureK, vapourPressureHpa, humidityExtension };
}

/** Index of the last level that gives any humidity quantity; −1 when none does. */
function lastLevelWithHumidity(levels: readonly ProfileLevelInput[]): number {
  for (let i = levels.length - 1; i >= 0; i--) {
    if (HUMIDITY_QUANTITIES.some((q) => levels[i]![HUMIDITY_FIELDS[q]] !== undefined)) return i;
  }
  return -1;
}

function humidityExtensionWarning(x: HumidityExtension): string {
  const saturated = x.levelsAtSaturation
    ? `; at ${count(x.levelsAtSaturation, 'level')} the law exceeded saturation and saturation over water was used`
    : '';
  return `measured humidity stops at level ${x.lastHumidityLevel} (${fmt(x.lastHumidityPressureHpa)} hPa, ${fmt(x.lastHumidityHeightM)} m): the ${count(x.levelsExtended, 'level')} above carry specific humidity q = q(${fmt(x.lastHumidityPressureHpa)} hPa) · (p / ${fmt(x.lastHumidityPressureHpa)} hPa)^${x.lambda} (Smith 1966, climatological)${saturated}`;
}

function listIndices(indices: readonly number[], max = 8): string {
  return indices.slice(0, max).join(', ') + (indices.length > max ? ', …' : '');
}

/**
 * Warnings for layers whose thickness does not fit their pressures and temperatures (hypsometric
 * equation with the mean virtual temperature, e.g. Wallace & Hobbs (2006) eq. 3.29) and for very
 * thick layers.
 */
function checkLayers(column: Column, gravity: GravityAtLatitude, warnings: string[]): void {
  const { heightM, pressureHpa, temperatureK, vapourPressureHpa } = column;
  const inconsistent: string[] = [];
  let firstExample = '';
  const thick: number[] = [];
  for (let i = 0; i + 1 < heightM.length; i++) {
    const dz = heightM[i + 1]! - heightM[i]!;
    const virtual = (k: number) => temperatureK[k]! / (1 - (vapourPressureHpa[k]! / pressureHpa[k]!) * (1 - EPSILON));
    const meanTv = (virtual(i) + virtual(i + 1)) / 2;
    const g = gravity.at((heightM[i]! + heightM[i + 1]!) / 2);
    const hypsometric = ((RD_J_PER_KG_K * meanTv) / g) * Math.log(pressureHpa[i]! / pressureHpa[i + 1]!);
    if (Math.abs(dz - hypsometric) > HYPSOMETRIC_TOLERANCE * hypsometric + 10) {
      inconsistent.push(`${i}–${i + 1}`);
      if (!firstExample) firstExample = `levels ${i}–${i + 1}: ${fmt(dz)} m given, ${fmt(hypsometric)} m hypsometric`;
    }
    if (dz > THICK_LAYER_WARNING_M) thick.push(i);
  }
  if (inconsistent.length) {
    warnings.push(
      `${count(inconsistent.length, 'layer')} (levels ${inconsistent.slice(0, 8).join(', ')}${inconsistent.length > 8 ? ', …' : ''}) ${inconsistent.length === 1 ? 'is' : 'are'} thicker or thinner than their pressures and temperatures allow by more than ${HYPSOMETRIC_TOLERANCE * 100} % (${firstExample}); check heights, pressures and units`,
    );
  }
  if (thick.length) {
    warnings.push(
      `${count(thick.length, 'layer')} thicker than ${THICK_LAYER_WARNING_M} m (from levels ${listIndices(thick)}); values inside them are interpolated`,
    );
  }
}

/** Values inside a layer of a column. */
export interface LayerPoint {
  pressureHpa: number;
  temperatureK: number;
  vapourPressureHpa: number;
}

/** True when the vapour pressure is interpolated exponentially in the layer above level i. */
export const vapourExponential = (column: Column, i: number): boolean =>
  column.vapourPressureHpa[i]! > 0 && column.vapourPressureHpa[i + 1]! > 0;

/**
 * Interpolates inside the layer between levels i and i + 1 (rules in the module comment).
 *
 * @param column the levels
 * @param i index of the lower level
 * @param heightM height inside [h_i, h_i+1] [m]
 */
export function interpolateInLayer(column: Column, i: number, heightM: number): LayerPoint {
  const z1 = column.heightM[i]!;
  const z2 = column.heightM[i + 1]!;
  const w = (heightM - z1) / (z2 - z1);
  const t1 = column.temperatureK[i]!;
  const t2 = column.temperatureK[i + 1]!;
  const temperatureK = t1 + w * (t2 - t1);
  // Fraction of the way in ln T; → w as T2 → T1 (exponential pressure).
  const dlnT = Math.log(t2 / t1);
  const fraction = Math.abs(t2 - t1) > 1e-9 * t1 ? Math.log1p((w * (t2 - t1)) / t1) / dlnT : w;
  const p1 = column.pressureHpa[i]!;
  const pressureHpa = p1 * Math.exp(fraction * Math.log(column.pressureHpa[i + 1]! / p1));
  const e1 = column.vapourPressureHpa[i]!;
  const e2 = column.vapourPressureHpa[i + 1]!;
  const vapourPressureHpa = e1 > 0 && e2 > 0 ? e1 * Math.exp(w * Math.log(e2 / e1)) : e1 + w * (e2 - e1);
  return { pressureHpa, temperatureK, vapourPressureHpa };
}

/**
 * The column from the site height up: drops levels below the site (interpolating the bottom) or
 * extends the profile down to the site (at most MAX_DOWNWARD_EXTENSION_M).
 *
 * @param column validated levels
 * @param siteHeightM site height above the ellipsoid [m]
 * @param warnings collects what the caller should know
 * @throws ModelDomainError (400) when the profile starts too far above the site
 */
export function columnFromSite(column: Column, siteHeightM: number, warnings: string[], bottomField = 'levels.0.height_m'): PreparedColumn {
  const n = column.heightM.length;
  const z0 = column.heightM[0]!;
  if (!(siteHeightM < column.heightM[n - 1]!)) {
    throw new ModelDomainError(
      'site.height_m',
      `the site (${siteHeightM} m) must lie below the top level of the profile (${fmt(column.heightM[n - 1]!)} m)`,
      400,
    );
  }
  if (z0 > siteHeightM) {
    const dz = z0 - siteHeightM;
    if (dz > MAX_DOWNWARD_EXTENSION_M) {
      throw new ModelDomainError(
        bottomField,
        `the profile starts ${fmt(dz)} m above the site (site.height_m = ${siteHeightM} m); it is extended down to the site by at most ${MAX_DOWNWARD_EXTENSION_M} m`,
        400,
      );
    }
    const t0C = column.temperatureK[0]! - CELSIUS_ZERO_K;
    const p0 = column.pressureHpa[0]!;
    const temperatureC = reduceTemperatureC(t0C, -dz);
    const pressureHpa = reducePressureHpa(p0, t0C, -dz);
    const rhPct = relativeHumidityOfLevelPct(column.vapourPressureHpa[0]!, column.temperatureK[0]!, p0);
    const vapourPressureHpa = (rhPct / 100) * moistSaturationVapourPressureHpa(temperatureC, pressureHpa);
    warnings.push(
      `the profile starts ${fmt(dz)} m above the site: extended down with −6.5 K/km, hypsometric pressure and constant relative humidity (${fmt(pressureHpa)} hPa, ${fmt(temperatureC)} °C at the site)`,
    );
    return {
      heightM: prepend(siteHeightM, column.heightM),
      pressureHpa: prepend(pressureHpa, column.pressureHpa),
      temperatureK: prepend(temperatureC + CELSIUS_ZERO_K, column.temperatureK),
      vapourPressureHpa: prepend(vapourPressureHpa, column.vapourPressureHpa),
      levelsUsed: n,
      levelsBelowSite: 0,
      extendedDownM: dz,
    };
  }
  let i = 0;
  while (column.heightM[i + 1]! <= siteHeightM) i++; // stops below the top (checked above)
  if (column.heightM[i] === siteHeightM) {
    if (i > 0) warnings.push(`${count(i, 'level')} below the site height not used; the column starts at level ${i}`);
    return { ...sliceColumn(column, i), levelsUsed: n - i, levelsBelowSite: i, extendedDownM: 0 };
  }
  const bottom = interpolateInLayer(column, i, siteHeightM);
  const rest = sliceColumn(column, i + 1);
  warnings.push(
    `${count(i + 1, 'level')} below the site height not used; the column starts at the site height, interpolated between levels ${i} and ${i + 1}`,
  );
  return {
    heightM: prepend(siteHeightM, rest.heightM),
    pressureHpa: prepend(bottom.pressureHpa, rest.pressureHpa),
    temperatureK: prepend(bottom.temperatureK, rest.temperatureK),
    vapourPressureHpa: prepend(bottom.vapourPressureHpa, rest.vapourPressureHpa),
    levelsUsed: n - i - 1,
    levelsBelowSite: i + 1,
    extendedDownM: 0,
  };
}

function prepend(x: number, values: Float64Array): Float64Array {
  const out = new Float64Array(values.length + 1);
  out[0] = x;
  out.set(values, 1);
  return out;
}

function sliceColumn(column: Column, from: number): Column {
  return {
    heightM: column.heightM.slice(from),
    pressureHpa: column.pressureHpa.slice(from),
    temperatureK: column.temperatureK.slice(from),
    vapourPressureHpa: column.vapourPressureHpa.slice(from),
  };
}
