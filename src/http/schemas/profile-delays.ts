import { z } from 'zod';
import { DEFAULT_MAPPING_MODEL } from '../../domain/mapping/registry.js';
import { DEFAULT_REFRACTIVITY_CONSTANTS } from '../../domain/profile/refractivity.js';
import { HUMIDITY_EXTENSION_METHOD } from '../../domain/profile/humidity-extension.js';
import { MAX_LEVELS, MIN_LEVELS, MIN_TOP_HEIGHT_M } from '../../domain/profile/levels.js';
import { REFRACTIVITY_CONSTANTS_KEYS } from '../../domain/profile/refractivity.js';
import {
  bounded,
  elevationDeg,
  epochSchema,
  mappingModelSchema,
  provenanceFields,
  relativeHumidityPct,
  siteSchema,
  vapourPressureHpa,
  vmf1CoefficientsSchema,
  sizedArray,
  strictObject,
} from './common.js';

/**
 * Each elevation is a launch-angle iteration of a few traces through every shell; 100 bound a request to
 * ~0.1 s of CPU even with 10 000 levels.
 */
export const MAX_PROFILE_ELEVATIONS = 100;

export const profileLevelSchema = strictObject({
  height_m: bounded(-500, 100_000, 'm', 'Height above the WGS84 ellipsoid').optional(),
  geopotential_height_m: bounded(
    -500,
    100_000,
    'm',
    'Geopotential height above mean sea level in geopotential metres (g0 = 9.80665 m/s²); converted to geometric height with WGS84 normal gravity at the site latitude, then geoid_undulation_m is added',
  ).optional(),
  pressure_hpa: bounded(0, 1100, 'hPa', 'Pressure', { exclusiveMin: true }),
  temperature_c: bounded(-130, 60, '°C', 'Air temperature'),
  relative_humidity_pct: relativeHumidityPct().optional(),
  dewpoint_c: bounded(-130, 60, '°C', 'Dew-point temperature, at most the temperature').optional(),
  vapour_pressure_hpa: vapourPressureHpa().optional(),
  specific_humidity_kg_kg: bounded(0, 0.04, 'kg/kg', 'Specific humidity').optional(),
}).describe(
  'A level of the profile: exactly one of height_m and geopotential_height_m, and exactly one of relative_humidity_pct, dewpoint_c, vapour_pressure_hpa, specific_humidity_kg_kg (levels may differ in which). Humidity may stop above some level: the levels above it then give none (it may not resume; the bottom level must give it), and their humidity is continued climatologically (humidity_extension in the response)',
);

export const profileDelaysRequest = strictObject({
  site: siteSchema,
  epoch: epochSchema,
  levels: z
    .array(profileLevelSchema, { error: `must be an array of ${MIN_LEVELS}..${MAX_LEVELS} levels` })
    .min(MIN_LEVELS, { error: `must hold ${MIN_LEVELS}..${MAX_LEVELS} levels` })
    .max(MAX_LEVELS, { error: `must hold ${MIN_LEVELS}..${MAX_LEVELS} levels` })
    .describe(
      `Levels from the surface up: heights strictly increasing, pressures strictly decreasing, top at least ${MIN_TOP_HEIGHT_M} m above the ellipsoid; ${MIN_LEVELS}..${MAX_LEVELS} levels. The column starts at site.height_m (levels below are not used; a profile starting up to 1000 m above the site is extended down)`,
    ),
  refractivity_constants: z
    .enum(REFRACTIVITY_CONSTANTS_KEYS, { error: `must be one of: ${REFRACTIVITY_CONSTANTS_KEYS.join(', ')}` })
    .default(DEFAULT_REFRACTIVITY_CONSTANTS)
    .describe(`Refractivity constants k1, k2, k3; one of ${REFRACTIVITY_CONSTANTS_KEYS.join(', ')}; default bevis-1994`),
  compressibility: z
    .boolean({ error: 'must be true or false' })
    .default(false)
    .describe('Include the inverse compressibility factors of Owens (1967) in the refractivity; default false (ideal gas)'),
  elevations_deg: sizedArray(
    z.array(elevationDeg(), { error: `must be an array of 1..${MAX_PROFILE_ELEVATIONS} elevations in (0, 90] deg` }),
    MAX_PROFILE_ELEVATIONS,
    'elevations',
  )
    .optional()
    .describe(`Vacuum (geometric) elevations to trace rays at [deg], (0, 90], 1..${MAX_PROFILE_ELEVATIONS}; absent = no slants`),
  mapping_model: mappingModelSchema
    .default(DEFAULT_MAPPING_MODEL)
    .describe('Mapping function set beside the traced factors; default niell'),
  coefficients: vmf1CoefficientsSchema.optional(),
  geoid_undulation_m: bounded(
    -120,
    100,
    'm',
    'Geoid undulation at the site, for geopotential heights; default: EGM96 at the site (the warnings say so)',
  ).optional(),
});

export const humidityExtensionSchema = z
  .object({
    method: z.literal(HUMIDITY_EXTENSION_METHOD),
    description: z.string(),
    last_humidity_level: z.number().int().describe('Index in levels of the last level that carries humidity: measured humidity stops here'),
    last_humidity_pressure_hpa: z.number().describe('Pressure of that level [hPa]'),
    last_humidity_height_m: z.number().describe('Height of that level above the ellipsoid [m]'),
    last_humidity_specific_kg_kg: z.number().describe('Specific humidity of that level, q_h [kg/kg]'),
    lambda: z.number().describe('Exponent of the power law q = q_h (p / p_h)^lambda [-]'),
    levels_extended: z.number().int().describe('Levels above it whose humidity was filled in'),
    levels_at_saturation: z
      .number()
      .int()
      .describe('Of those, levels where the law exceeded saturation over water, which was used instead'),
  })
  .nullable()
  .describe(
    'How humidity was continued above the last level that carries it (Smith 1966 power law of pressure); null when every level carries humidity',
  );

export const profileSlantSchema = z.object({
  elevation_deg: z.number().describe('Vacuum (geometric) elevation of the outgoing ray [deg], as requested'),
  apparent_elevation_deg: z.number().describe('Launch (apparent) elevation of the ray at the antenna [deg]'),
  refraction_deg: z.number().describe('Refraction angle, apparent minus vacuum elevation [deg]'),
  hydrostatic_m: z.number().describe('Slant hydrostatic delay including the geometric bending term [m] (= mapping_hydrostatic · zhd_m)'),
  wet_m: z.number().describe('Slant wet delay [m] (= mapping_wet · zwd_m)'),
  total_m: z.number().describe('Slant total delay [m]'),
  bending_m: z
    .number()
    .describe(
      'Geometric bending term, ray length minus the projection of station-to-exit onto the outgoing direction [m]; part of hydrostatic_m',
    ),
  mapping_hydrostatic: z.number().describe('Ray-traced hydrostatic mapping factor [-]'),
  mapping_wet: z.number().nullable().describe('Ray-traced wet mapping factor [-]; null for a dry column'),
  model_mapping_hydrostatic: z
    .number()
    .nullable()
    .describe(
      'Hydrostatic mapping factor of mapping_model at the vacuum elevation [-]; null below 1°, where mapping functions are not evaluated',
    ),
  model_mapping_wet: z.number().nullable().describe('Wet mapping factor of mapping_model at the vacuum elevation [-]; null below 1°'),
});

export const profileDelaysResponse = z.object({
  zhd_m: z.number().describe('Zenith hydrostatic delay, 1e-6 k1 Rd ∫dP/g with normal gravity [m]'),
  zwd_m: z.number().describe('Zenith wet delay, 1e-6 ∫N_w dz [m]'),
  ztd_m: z.number().describe('Zenith total delay [m]'),
  pwv_mm: z.number().describe('Precipitable water vapour, ∫ρv dz / ρw [mm]'),
  tm_k: z.number().nullable().describe('Weighted mean temperature ∫(e/T)dz / ∫(e/T²)dz [K]; null for a dry column'),
  top_extension: z
    .object({
      method: z.literal('dry-isothermal-hydrostatic'),
      description: z.string(),
      top_height_m: z.number().describe('Height of the top level [m]'),
      top_pressure_hpa: z.number().describe('Pressure at the top level [hPa]'),
      top_temperature_c: z.number().describe('Temperature of the extension (that of the top level) [°C]'),
      scale_height_m: z.number().describe('Scale height Rd T / g at the top [m]'),
      ceiling_height_m: z.number().describe('Height where the extension stops (pressure below 1e-6 of the surface pressure) [m]'),
      zhd_m: z.number().describe('Part of zhd_m above the top level [m]'),
      zhd_fraction: z.number().describe('zhd_m of the extension / zhd_m [-]'),
      zwd_m: z.number().describe('Part of zwd_m above the top level [m]: 0, the extension is dry'),
    })
    .describe('How the column was continued above the top level'),
  column: z
    .object({
      bottom_height_m: z.number().describe('Bottom of the column: the site height [m]'),
      top_height_m: z.number().describe('Top level [m]'),
      surface_pressure_hpa: z.number().describe('Pressure at the site height [hPa]'),
      surface_temperature_c: z.number().describe('Temperature at the site height [°C]'),
      levels_used: z.number().int().describe('Levels of the request inside the column'),
      levels_below_site: z.number().int().describe('Levels below the site height, not used'),
      extended_down_m: z.number().describe('How far the profile was extended down to the site [m]; 0 if it reached it'),
      shells: z.number().int().describe('Spherical shells the column was divided into'),
      earth_radius_m: z.number().describe('Radius of the shells’ centre: Gaussian mean radius of curvature at the site [m]'),
      mean_gravity_m_s2: z.number().describe('Mean gravity of the column, surface pressure / ∫dP/g [m/s²]'),
      zhd_height_integral_m: z
        .number()
        .describe('1e-6 ∫N_h dz over the given heights [m]; equals zhd_m when heights and pressures are in hydrostatic balance'),
    })
    .describe('The column as computed'),
  humidity_extension: humidityExtensionSchema,
  slants: z.array(profileSlantSchema).optional().describe('One per elevations_deg, in order; absent when no elevations were requested'),
  mapping_model: z.string().describe('The mapping function of model_mapping_*'),
  ...provenanceFields,
});

export type ProfileDelaysRequest = z.output<typeof profileDelaysRequest>;
export type ProfileDelaysResponse = z.input<typeof profileDelaysResponse>;
