import { z } from 'zod';
import { DEFAULT_MAPPING_MODEL } from '../../domain/mapping/registry.js';
import { DEFAULT_GRADIENT_MODEL } from '../../domain/gradients/gradient-mapping.js';
import { DEFAULT_WET_MODEL } from '../../domain/zenith/wet.js';
import {
  azimuthDeg,
  bounded,
  elevationDeg,
  epochSchema,
  gradientM,
  gradientModelSchema,
  mappingModelSchema,
  metSchema,
  provenanceFields,
  siteSchema,
  vmf1CoefficientsSchema,
  wetModelSchema,
  zhdM,
  zwdM,
  sizedArray,
  geoidUndulationField,
  strictObject,
} from './common.js';
import { MAX_BATCH } from './mapping-factors.js';
import { metUsedSchema } from './zenith-delays.js';

const ecef = (axis: string) => bounded(-1e8, 1e8, 'm', `Satellite ${axis} coordinate, ECEF WGS84`);

/** One direction, and one satellite: the rows of a slant-delays request (objects, or columns of these fields). */
export const slantDirectionSchema = strictObject({ elevation_deg: elevationDeg(), azimuth_deg: azimuthDeg() });
export const slantSatelliteSchema = strictObject({ id: z.string().min(1).max(32), x_m: ecef('X'), y_m: ecef('Y'), z_m: ecef('Z') });

/** A row schema as column arrays (the documented columnar form; checked by src/http/columns.ts, one loop per column). */
const columnsOf = (row: typeof slantDirectionSchema | typeof slantSatelliteSchema, noun: string) =>
  strictObject(Object.fromEntries(Object.entries(row.shape).map(([k, v]) => [k, z.array(v as z.ZodType)]))).describe(
    `The ${noun} as column arrays of equal length (1..${MAX_BATCH}), one per field`,
  );

/** Everything but the rows (which src/http/tasks/apriori-batch.ts checks by form: objects with zod, columns in one loop). */
export const slantDelaysFields = {
  site: siteSchema,
  epoch: epochSchema,
  met: metSchema.optional(),
  wet_model: wetModelSchema.default(DEFAULT_WET_MODEL),
  model: mappingModelSchema.default(DEFAULT_MAPPING_MODEL),
  coefficients: vmf1CoefficientsSchema.optional(),
  gradient_model: gradientModelSchema.default(DEFAULT_GRADIENT_MODEL),
  zenith: strictObject({
    zhd_m: zhdM().optional(),
    zwd_m: zwdM().optional(),
    north_gradient_m: gradientM('North gradient G_N').optional(),
    east_gradient_m: gradientM('East gradient G_E').optional(),
  })
    .optional()
    .describe('Zenith values to map; what is missing comes from met or the standard atmosphere (gradients: 0)'),
};

/** The rule both forms share: exactly one of directions or satellites. */
export function oneKindOfRows(body: { directions?: unknown; satellites?: unknown }, ctx: z.RefinementCtx): void {
  const n = Number(body.directions !== undefined) + Number(body.satellites !== undefined);
  if (n !== 1) ctx.addIssue({ code: 'custom', path: ['directions'], message: 'give exactly one of directions or satellites' });
}

export const slantDelaysRequest = strictObject({
  ...slantDelaysFields,
  directions: z
    .union([sizedArray(z.array(slantDirectionSchema), MAX_BATCH, 'directions'), columnsOf(slantDirectionSchema, 'directions')])
    .optional()
    .describe(`Directions, 1..${MAX_BATCH}, as objects or as column arrays; give either directions or satellites`),
  satellites: z
    .union([sizedArray(z.array(slantSatelliteSchema), MAX_BATCH, 'satellites'), columnsOf(slantSatelliteSchema, 'satellites')])
    .optional()
    .describe('Satellite positions, ECEF WGS84 [m], as objects or as column arrays; elevation and azimuth are computed from the site'),
}).superRefine(oneKindOfRows);

/** The request with its rows given as columns: the rows are checked by src/http/columns.ts, the rest here. */
export const slantDelaysColumnarRest = strictObject({
  ...slantDelaysFields,
  directions: z.unknown().optional(),
  satellites: z.unknown().optional(),
}).superRefine(oneKindOfRows);

export const slantSchema = z
  .object({
    elevation_deg: z.number().describe('Vacuum elevation [deg]'),
    azimuth_deg: z.number().describe('Azimuth from north through east [deg], [0, 360) (360 is returned as 0)'),
    satellite: z.string().optional(),
    nadir_deg: z.number().optional().describe('Nadir angle at the satellite [deg] (satellites only)'),
    mapping_hydrostatic: z.number(),
    mapping_wet: z.number(),
    mapping_gradient: z.number(),
    hydrostatic_m: z.number(),
    wet_m: z.number(),
    gradient_m: z.number(),
    total_m: z.number(),
  })
  .partial()
  .describe(
    'One direction; every field is present unless the query parameter `fields` leaves it out (satellite and nadir_deg: satellites only)',
  );

export const slantDelaysResponse = z.object({
  zenith: z.object({
    zhd_m: z.number(),
    zwd_m: z.number(),
    ztd_m: z.number(),
    north_gradient_m: z.number(),
    east_gradient_m: z.number(),
    source: z.object({
      zhd: z.enum(['caller', 'met']),
      zwd: z.enum(['caller', 'met']),
      gradients: z.enum(['caller', 'none']),
    }),
  }),
  met_used: metUsedSchema.optional(),
  slants: z
    .union([z.array(slantSchema), z.record(z.string(), z.array(z.union([z.number(), z.string()])))])
    .describe(
      'One entry per direction (shape=rows), or one array per field (shape=columns: angles rounded to 1e-6 deg, mapping factors to 1e-8, delays to 1e-6 m); `fields` selects the fields',
    ),
  geoid_undulation_m: geoidUndulationField,
  ...provenanceFields,
});
