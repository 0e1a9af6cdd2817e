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

export const slantDelaysRequest = strictObject({
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
  directions: sizedArray(z.array(strictObject({ elevation_deg: elevationDeg(), azimuth_deg: azimuthDeg() })), MAX_BATCH, 'directions')
    .optional()
    .describe(`Directions, 1..${MAX_BATCH}; give either directions or satellites`),
  satellites: sizedArray(
    z.array(strictObject({ id: z.string().min(1).max(32), x_m: ecef('X'), y_m: ecef('Y'), z_m: ecef('Z') })),
    MAX_BATCH,
    'satellites',
  )
    .optional()
    .describe('Satellite positions, ECEF WGS84 [m]; elevation and azimuth are computed from the site'),
}).superRefine((body, ctx) => {
  const n = Number(body.directions !== undefined) + Number(body.satellites !== undefined);
  if (n !== 1) {
    ctx.addIssue({ code: 'custom', path: ['directions'], message: 'give exactly one of directions or satellites' });
  }
});

export const slantSchema = z.object({
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
});

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
  slants: z.array(slantSchema),
  geoid_undulation_m: geoidUndulationField,
  ...provenanceFields,
});
