import { z } from 'zod';
import { DEFAULT_WET_MODEL } from '../../domain/zenith/wet.js';
import {
  epochSchema,
  geoidUndulationField,
  metSchema,
  metSourceSchema,
  provenanceFields,
  siteSchema,
  wetModelSchema,
  strictObject,
} from './common.js';

export const zenithDelaysRequest = strictObject({
  site: siteSchema,
  epoch: epochSchema,
  met: metSchema.optional(),
  wet_model: wetModelSchema.default(DEFAULT_WET_MODEL),
});

export const metUsedSchema = z.object({
  pressure_hpa: z.number().describe('Pressure at the site height [hPa]'),
  temperature_c: z.number().describe('Temperature at the site height [°C]'),
  vapour_pressure_hpa: z.number().describe('Water vapour pressure at the site height [hPa]'),
  source: z.object({ pressure: metSourceSchema, temperature: metSourceSchema, humidity: metSourceSchema }),
});

export const zenithDelaysResponse = z.object({
  zhd_m: z.number().describe('Zenith hydrostatic delay [m]'),
  zwd_m: z.number().describe('Zenith wet delay [m]'),
  ztd_m: z.number().describe('Zenith total delay [m]'),
  met_used: metUsedSchema,
  geoid_undulation_m: geoidUndulationField,
  ...provenanceFields,
});
