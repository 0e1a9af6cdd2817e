import { z } from 'zod';
import { bounded, epochSchema, positive, pressureHpa, provenanceFields, siteSchema, temperatureC, ztdM, zwdM, sizedArray } from './common.js';
import { MAX_BATCH } from './mapping-factors.js';

export const pwvRecordRequest = z.object({
  epoch: epochSchema,
  ztd_m: ztdM().optional(),
  zwd_m: zwdM().optional(),
  ztd_sigma_m: positive('m', 'Standard deviation of ztd_m', 1).optional(),
  zwd_sigma_m: positive('m', 'Standard deviation of zwd_m', 1).optional(),
  pressure_hpa: pressureHpa('Measured surface pressure at the site; required with ztd_m').optional(),
  pressure_sigma_hpa: positive('hPa', 'Standard deviation of pressure_hpa', 50).optional(),
  temperature_c: temperatureC('Surface temperature, for Tm (Bevis 1992) when tm_k is absent').optional(),
  tm_k: bounded(200, 330, 'K', 'Weighted mean temperature, if known (e.g. from a weather model)').optional(),
  tm_sigma_k: positive('K', 'Standard deviation of tm_k', 50).optional(),
});

export const precipitableWaterRequest = z.object({
  site: siteSchema,
  records: sizedArray(z
    .array(pwvRecordRequest), MAX_BATCH, 'records'),
});

export const pwvRecordResponse = z.object({
  epoch: z.string(),
  zhd_m: z.number().nullable().describe('Zenith hydrostatic delay from the measured pressure [m]; null without pressure'),
  zwd_m: z.number().describe('Zenith wet delay [m]'),
  zwd_sigma_m: z.number().describe('Standard deviation of zwd_m [m]'),
  tm_k: z.number().describe('Weighted mean temperature [K]'),
  tm_sigma_k: z.number().describe('Standard deviation of tm_k [K]'),
  conversion_factor: z.number().describe('Π = PWV/ZWD [-]'),
  pwv_mm: z.number().describe('Precipitable water vapour [mm]'),
  pwv_sigma_mm: z.number().describe('Standard deviation of pwv_mm [mm]'),
});

export const precipitableWaterResponse = z.object({
  records: z.array(pwvRecordResponse),
  ...provenanceFields,
});
