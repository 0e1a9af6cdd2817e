/**
 * Small pieces the a-priori routes share: turning API values into domain inputs and provenance.
 */

import { DEG } from '../../domain/constants.js';
import { GEOID_MODEL_NAME, geoidUndulationM } from '../../domain/geometry/geoid.js';
import { GRADIENT_MODELS } from '../../domain/gradients/gradient-mapping.js';
import { belowMappingFit, MAPPING_FIT_MIN_ELEVATION_DEG } from '../../domain/mapping/elevation-range.js';
import { MAPPING_MODELS, type MappingModelKey } from '../../domain/mapping/registry.js';
import type { CoefficientsHeightReference, MappingCoefficients, MappingEvaluator } from '../../domain/mapping/types.js';
import type { MetInput } from '../../domain/meteo/surface-met.js';
import { MODEL_NAMES, provenance, type ModelSet } from '../../domain/provenance.js';
import type { Site } from '../../domain/site.js';
import { fractionalDayOfYear } from '../../domain/time.js';
import { WET_MODELS } from '../../domain/zenith/wet.js';

/** Elevations below this get a warning [deg] (Niell's fit is stated from 3° up). */
export const LOW_ELEVATION_WARNING_DEG = MAPPING_FIT_MIN_ELEVATION_DEG;

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

/** VMF1 coefficients as the API sends them. */
export interface CoefficientsBody {
  ah: number;
  aw: number;
  height_reference?: CoefficientsHeightReference | undefined;
}

export const toCoefficients = (c: CoefficientsBody | undefined): MappingCoefficients | undefined =>
  c && { ah: c.ah, aw: c.aw, heightReference: c.height_reference };

/** The mapping function for a site (ellipsoidal height, taken to sea level by the EGM96 geoid) and epoch. */
export function prepareMapping(site: Site, epochIso: string, model: MappingModelKey, coefficients?: CoefficientsBody): MappingEvaluator {
  return MAPPING_MODELS[model].prepare({
    latitudeRad: site.latitudeDeg * DEG,
    heightM: site.heightM - geoidUndulationM(site.latitudeDeg, site.longitudeDeg),
    dayOfYear: fractionalDayOfYear(new Date(epochIso)),
    coefficients: toCoefficients(coefficients),
  });
}

/**
 * Provenance of the mapping part. Caller coefficients (VMF1 a values) are inputs that change with
 * every epoch, not settings, so they do not enter the fingerprint; what they refer to (site or sea
 * level) decides the height correction, which does.
 */
export function mappingProvenance(model: MappingModelKey, gradientModel: string, coefficients?: CoefficientsBody) {
  return {
    mapping: `${model}: ${MAPPING_MODELS[model].citation}`,
    mapping_height_correction: MAPPING_MODELS[model].heightCorrection(toCoefficients(coefficients)),
    geoid: GEOID_MODEL_NAME,
    gradient_mapping: `${gradientModel}: ${GRADIENT_MODELS[gradientModel]!.citation}`,
  };
}

/**
 * The provenance fields of an answer as JSON text, `"models":{…},"model_fingerprint":"…"` (JSON.stringify's
 * bytes, without the braces), computed once per combination of keys: for answers written as text.
 */
export function memoProvenanceJson(cache: Map<string, string>, key: string, models: () => ModelSet): string {
  let hit = cache.get(key);
  if (hit === undefined) cache.set(key, (hit = JSON.stringify(provenance(models())).slice(1, -1)));
  return hit;
}

export function zenithProvenance(wetModel: string) {
  return {
    zhd: MODEL_NAMES.zhd,
    zwd: `${wetModel}: ${WET_MODELS[wetModel]!.citation}`,
    saturation: MODEL_NAMES.saturation,
    standard_atmosphere: MODEL_NAMES.standardAtmosphere,
    geoid: GEOID_MODEL_NAME,
    met_reduction: 'hypsometric pressure, -6.5 K/km, constant RH',
  };
}

/** One warning for all directions below 3°, naming the first few indices. */
export function lowElevationWarning(elevationsDeg: ArrayLike<number>, what = 'elevations_deg'): string[] {
  const low: number[] = [];
  let count = 0;
  for (let i = 0; i < elevationsDeg.length; i++) {
    if (belowMappingFit(elevationsDeg[i]!)) {
      count++;
      if (low.length < 10) low.push(i);
    }
  }
  if (count === 0) return [];
  return [
    `${count} ${what} below ${LOW_ELEVATION_WARNING_DEG}° (indices ${low.join(', ')}${count > low.length ? ', …' : ''}): mapping functions are fitted from 3° up; the values are extrapolated`,
  ];
}
