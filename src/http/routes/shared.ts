/**
 * Small pieces the a-priori routes share: turning API values into domain inputs and provenance.
 */

import { DEG } from '../../domain/constants.js';
import { GRADIENT_MODELS } from '../../domain/gradients/gradient-mapping.js';
import { MAPPING_MODELS, type MappingModelKey } from '../../domain/mapping/registry.js';
import type { MappingEvaluator } from '../../domain/mapping/types.js';
import type { MetInput } from '../../domain/meteo/surface-met.js';
import { MODEL_NAMES, provenance, type ModelSet, type Provenance } from '../../domain/provenance.js';
import type { Site } from '../../domain/site.js';
import { fractionalDayOfYear } from '../../domain/time.js';
import { WET_MODELS } from '../../domain/zenith/wet.js';

/** Elevations below this get a warning [deg] (Niell's fit is stated from 3° up). */
export const LOW_ELEVATION_WARNING_DEG = 3;

export interface SiteBody {
  latitude_deg: number;
  longitude_deg: number;
  height_m: number;
}

export const toSite = (s: SiteBody): Site => ({ latitudeDeg: s.latitude_deg, longitudeDeg: s.longitude_deg, heightM: s.height_m });

export interface MetBody {
  pressure_hpa?: number | undefined;
  temperature_c?: number | undefined;
  relative_humidity_pct?: number | undefined;
  dewpoint_c?: number | undefined;
  vapour_pressure_hpa?: number | undefined;
  height_m?: number | undefined;
}

export const toMetInput = (m: MetBody | undefined): MetInput | undefined =>
  m && {
    pressureHpa: m.pressure_hpa,
    temperatureC: m.temperature_c,
    relativeHumidityPct: m.relative_humidity_pct,
    dewpointC: m.dewpoint_c,
    vapourPressureHpa: m.vapour_pressure_hpa,
    heightM: m.height_m,
  };

/** ISO 8601 with offset → canonical UTC string. */
export const canonicalEpoch = (iso: string): string => new Date(iso).toISOString();

export function prepareMapping(
  site: Site,
  epochIso: string,
  model: MappingModelKey,
  coefficients?: { ah: number; aw: number },
): MappingEvaluator {
  return MAPPING_MODELS[model].prepare({
    latitudeRad: site.latitudeDeg * DEG,
    heightM: site.heightM,
    dayOfYear: fractionalDayOfYear(new Date(epochIso)),
    coefficients,
  });
}

/**
 * Provenance of the mapping part. Caller coefficients (VMF1 a values) are inputs that change with
 * every epoch, not settings, so they do not enter the fingerprint.
 */
export function mappingProvenance(model: MappingModelKey, gradientModel: string) {
  return {
    mapping: `${model}: ${MAPPING_MODELS[model].citation}`,
    gradient_mapping: `${gradientModel}: ${GRADIENT_MODELS[gradientModel]!.citation}`,
  };
}

/** Provenance of a route's fixed model choices, computed once per combination of keys. */
export function memoProvenance(cache: Map<string, Provenance>, key: string, models: () => ModelSet): Provenance {
  let hit = cache.get(key);
  if (!hit) cache.set(key, (hit = provenance(models())));
  return hit;
}

export function zenithProvenance(wetModel: string) {
  return {
    zhd: MODEL_NAMES.zhd,
    zwd: `${wetModel}: ${WET_MODELS[wetModel]!.citation}`,
    saturation: MODEL_NAMES.saturation,
    standard_atmosphere: MODEL_NAMES.standardAtmosphere,
    met_reduction: 'hypsometric pressure, -6.5 K/km, constant RH',
  };
}

/** One warning for all directions below 3°, naming the first few indices. */
export function lowElevationWarning(elevationsDeg: ArrayLike<number>, what = 'elevations_deg'): string[] {
  const low: number[] = [];
  let count = 0;
  for (let i = 0; i < elevationsDeg.length; i++) {
    if (elevationsDeg[i]! < LOW_ELEVATION_WARNING_DEG) {
      count++;
      if (low.length < 10) low.push(i);
    }
  }
  if (count === 0) return [];
  return [
    `${count} ${what} below ${LOW_ELEVATION_WARNING_DEG}° (indices ${low.join(', ')}${count > low.length ? ', …' : ''}): mapping functions are fitted from 3° up; the values are extrapolated`,
  ];
}
