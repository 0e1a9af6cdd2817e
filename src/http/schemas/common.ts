/**
 * Building blocks of the request and response schemas. Every number carries its unit and its
 * allowed range in the description (and so in the OpenAPI document), and every range violation
 * produces a message that names the range.
 */

import { z } from 'zod';
import { MAPPING_MODEL_KEYS } from '../../domain/mapping/registry.js';
import { COEFFICIENTS_HEIGHT_REFERENCES } from '../../domain/mapping/types.js';
import { DEFAULT_COEFFICIENTS_HEIGHT_REFERENCE } from '../../domain/mapping/vmf1.js';
import { GRADIENT_MODEL_KEYS } from '../../domain/gradients/gradient-mapping.js';
import { WET_MODEL_KEYS } from '../../domain/zenith/wet.js';
import { unknownKeyMessage } from '../field-errors.js';
import { STORED_GRADIENT_RANGE_M, STORED_ZTD_RANGE_M, STORED_ZWD_RANGE_M } from '../../limits.js';

/**
 * Every object of a request (JSON bodies, query strings, path parameters) is made with this: an
 * unknown key is a 400 naming the key and the closest known one ("met.pressure: unknown key; did
 * you mean pressure_hpa?"), never silently dropped. The message has one line per unknown key;
 * field-errors.ts splits it into one field error per key. The known keys are read from the schema
 * that raised the issue, so `.extend()`/`.omit()` of a strict object suggest from their own keys.
 * In the OpenAPI document the objects have `additionalProperties: false`.
 */
export function strictObject<T extends z.core.$ZodLooseShape>(shape: T) {
  return z.strictObject(shape, {
    error: (issue) => {
      if (issue.code !== 'unrecognized_keys') return undefined;
      const inst = issue.inst as { _zod?: { def?: { shape?: Record<string, unknown> } } } | undefined;
      const known = Object.keys(inst?._zod?.def?.shape ?? shape);
      return issue.keys.map((k) => unknownKeyMessage(k, known)).join('\n');
    },
  });
}

interface RangeOptions {
  /** The lower bound itself is not allowed, e.g. elevation (0, 90]. */
  exclusiveMin?: boolean;
}

/** A finite number in [min, max] (or (min, max]) with its unit, for request fields. */
export function bounded(min: number, max: number, unit: string, description: string, options: RangeOptions = {}) {
  const range = `${options.exclusiveMin ? '(' : '['}${min}, ${max}] ${unit}`.trim();
  const message = `must be a number in ${range}`;
  const lower = options.exclusiveMin
    ? z.number({ error: message }).gt(min, { error: message })
    : z.number({ error: message }).gte(min, { error: message });
  const schema = lower.lte(max, { error: message }).describe(`${description} [${unit}], ${range}`);
  NUMBER_RANGES.set(schema, { min, max, exclusiveMin: options.exclusiveMin === true, message });
  return schema;
}

/**
 * The range of a number schema made by bounded() or positive(), so that a column of 10^5 numbers can be
 * checked in a plain loop with the schema's own message (src/http/columns.ts) instead of one zod parse
 * per element. Same range, same message: one definition.
 */
export interface NumberRange {
  min: number;
  max: number;
  exclusiveMin: boolean;
  message: string;
}
const NUMBER_RANGES = new WeakMap<z.ZodType, NumberRange>();
export const numberRangeOf = (schema: z.ZodType): NumberRange | undefined => NUMBER_RANGES.get(schema);

/** A finite number > 0 (sigmas, intervals). */
export function positive(unit: string, description: string, max = Number.MAX_VALUE) {
  const message = max === Number.MAX_VALUE ? `must be a number > 0 ${unit}` : `must be a number in (0, ${max}] ${unit}`;
  const schema = z
    .number({ error: message })
    .gt(0, { error: message })
    .lte(max, { error: message })
    .describe(`${description} [${unit}], > 0${max === Number.MAX_VALUE ? '' : `, at most ${max}`}`);
  NUMBER_RANGES.set(schema, { min: 0, max, exclusiveMin: true, message });
  return schema;
}

/** An array of 1..max items, with one message naming the allowed count, e.g. "must hold 1..100000 records". */
export function sizedArray<T extends z.ZodArray<z.ZodType>>(array: T, max: number, noun: string): T {
  const message = `must hold 1..${max} ${noun}`;
  return array.min(1, { error: message }).max(max, { error: message }) as T;
}

/** Site ranges (issue 2): |latitude| ≤ 90, longitude −180..360, height −500..9000 m. */
export const SITE_RANGES = {
  latitude: [-90, 90],
  longitude: [-180, 360],
  height: [-500, 9000],
} as const;

export const siteSchema = strictObject({
  latitude_deg: bounded(-90, 90, 'deg', 'Geodetic latitude'),
  longitude_deg: bounded(-180, 360, 'deg', 'Longitude, east positive'),
  height_m: bounded(-500, 9000, 'm', 'Height above the WGS84 ellipsoid'),
}).describe('Site: geodetic coordinates on WGS84');

const ISO_MESSAGE = 'must be an ISO 8601 date-time in UTC, e.g. 2026-03-14T12:00:00Z';
export const epochSchema = z.iso
  .datetime({ offset: true, error: ISO_MESSAGE })
  .describe('Epoch, ISO 8601 date-time (UTC, e.g. 2026-03-14T12:00:00Z; an offset is converted to UTC)');

export const pressureHpa = (description = 'Surface pressure') => bounded(300, 1100, 'hPa', description);
export const temperatureC = (description = 'Air temperature') => bounded(-90, 60, '°C', description);
export const relativeHumidityPct = () => bounded(0, 100, '%', 'Relative humidity with respect to water');
export const dewpointC = () => bounded(-90, 60, '°C', 'Dew-point temperature');
export const vapourPressureHpa = () => bounded(0, 200, 'hPa', 'Water vapour pressure');
export const zwdM = (description = 'Zenith wet delay') => bounded(STORED_ZWD_RANGE_M[0], STORED_ZWD_RANGE_M[1], 'm', description);
export const ztdM = (description = 'Zenith total delay') => bounded(STORED_ZTD_RANGE_M[0], STORED_ZTD_RANGE_M[1], 'm', description);
export const zhdM = (description = 'Zenith hydrostatic delay') => bounded(1, 3, 'm', description);
export const gradientM = (description: string) => bounded(STORED_GRADIENT_RANGE_M[0], STORED_GRADIENT_RANGE_M[1], 'm', description);
export const elevationDeg = () =>
  bounded(
    0,
    90,
    'deg',
    'Vacuum (geometric) elevation angle; below 3° the answer carries a warning; mapping functions refuse elevations below 1° (a profile is still traced there)',
    { exclusiveMin: true },
  );
export const azimuthDeg = () => bounded(0, 360, 'deg', 'Azimuth from north through east');

function keyEnum<K extends string>(keys: readonly [K, ...K[]], what: string) {
  return z.enum(keys, { error: `must be one of: ${keys.join(', ')}` }).describe(`${what}; one of ${keys.join(', ')}`);
}

export const mappingModelSchema = keyEnum(MAPPING_MODEL_KEYS, 'Mapping function');
export const wetModelSchema = keyEnum(WET_MODEL_KEYS, 'Zenith wet delay model');
export const gradientModelSchema = keyEnum(GRADIENT_MODEL_KEYS, 'Gradient mapping function');

export const vmf1CoefficientsSchema = strictObject({
  ah: bounded(0.0005, 0.002, '', 'VMF1 hydrostatic a coefficient'),
  aw: bounded(0, 0.001, '', 'VMF1 wet a coefficient'),
  height_reference: z
    .enum(COEFFICIENTS_HEIGHT_REFERENCES, { error: `must be one of: ${COEFFICIENTS_HEIGHT_REFERENCES.join(', ')}` })
    .optional()
    .describe(
      `What ah refers to: "sea-level" (grid coefficients: Niell's height correction is added from the site's height above sea level) or "site" (coefficients computed at the site: no height correction). Absent: "${DEFAULT_COEFFICIENTS_HEIGHT_REFERENCE}", with a warning`,
    ),
}).describe('Coefficients for model "vmf1", from the VMF1 grids or site files for the epoch');

/** Met at a site, partial allowed; at most one humidity quantity. */
export const metSchema = strictObject({
  pressure_hpa: pressureHpa().optional(),
  temperature_c: temperatureC().optional(),
  relative_humidity_pct: relativeHumidityPct().optional(),
  dewpoint_c: dewpointC().optional(),
  vapour_pressure_hpa: vapourPressureHpa().optional(),
  height_m: bounded(-500, 9000, 'm', 'Height of the met sensor (same datum as the site); absent = at the site height').optional(),
})
  .superRefine((met, ctx) => {
    const given = (['relative_humidity_pct', 'dewpoint_c', 'vapour_pressure_hpa'] as const).filter((k) => met[k] !== undefined);
    if (given.length > 1) {
      ctx.addIssue({
        code: 'custom',
        path: [given[1]!],
        message: `give at most one of relative_humidity_pct, dewpoint_c, vapour_pressure_hpa (got ${given.join(' and ')})`,
      });
    }
  })
  .describe('Surface met. Missing values come from the standard atmosphere at the site height (and the response says so)');

export const metSourceSchema = z.enum(['measured', 'reduced', 'standard-atmosphere']);

export const modelsSchema = z
  .record(z.string(), z.union([z.string(), z.number(), z.boolean(), z.null()]))
  .describe('The models and settings that produced this result');

export const geoidUndulationField = z
  .number()
  .describe(
    'EGM96 geoid undulation N at the site [m]: heights above sea level (Niell height correction, standard atmosphere) are height_m − N',
  );

export const provenanceFields = {
  models: modelsSchema,
  model_fingerprint: z.string().describe('Short hash of `models`: results are homogeneous only when it is equal'),
  warnings: z.array(z.string()).describe('Values defaulted or extrapolated, elevations below 3°, and similar'),
};

export const problemSchema = z
  .object({
    type: z.string(),
    title: z.string(),
    status: z.number().int(),
    detail: z.string(),
    instance: z.string().optional(),
    errors: z
      .array(z.object({ field: z.string(), message: z.string() }))
      .optional()
      .describe('One entry per offending field, with its allowed range'),
  })
  .describe('RFC 9457 problem details (application/problem+json)');
