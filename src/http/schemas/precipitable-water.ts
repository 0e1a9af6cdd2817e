import { z } from 'zod';
import {
  bounded,
  epochSchema,
  positive,
  pressureHpa,
  provenanceFields,
  siteSchema,
  temperatureC,
  ztdM,
  zwdM,
  sizedArray,
  strictObject,
} from './common.js';
import { MAX_BATCH } from './mapping-factors.js';

export const pwvRecordRequest = strictObject({
  epoch: epochSchema,
  ztd_m: ztdM().optional(),
  zwd_m: zwdM().optional(),
  ztd_sigma_m: positive('m', 'Standard deviation of ztd_m', 1).optional(),
  zwd_sigma_m: positive('m', 'Standard deviation of zwd_m', 1).optional(),
  pressure_hpa: pressureHpa('Measured surface pressure at the site; required with ztd_m').optional(),
  pressure_sigma_hpa: positive('hPa', 'Standard deviation of pressure_hpa (default 0.5 hPa)', 50).optional(),
  temperature_c: temperatureC('Surface temperature, for Tm (Bevis 1992) when tm_k is absent').optional(),
  temperature_sigma_k: positive('K', 'Standard deviation of temperature_c (default 0.5 K)', 20).optional(),
  tm_k: bounded(200, 330, 'K', 'Weighted mean temperature, if known (e.g. from a weather model)').optional(),
  tm_sigma_k: positive('K', 'Standard deviation of tm_k (default 2 K)', 50).optional(),
});

export const precipitableWaterRequest = strictObject({
  site: siteSchema,
  records: sizedArray(z.array(pwvRecordRequest), MAX_BATCH, 'records'),
  sigma_budget: z
    .boolean({ error: 'must be true or false' })
    .default(false)
    .describe('true: every record carries `sigma_budget`, the terms of pwv_sigma_mm one by one'),
});

export const pwvSigmaBudgetSchema = z
  .object({
    delay_mm: z.number().nullable().describe('From ztd_sigma_m (or zwd_sigma_m) [mm]; null when neither was given'),
    pressure_mm: z.number().describe('From pressure_sigma_hpa through the ZHD [mm] (ZTD records only)'),
    zhd_model_mm: z.number().describe('Saastamoinen ZHD model, ±0.0000005 m/hPa (IERS 2010 eq. 9.11) [mm] (ZTD records only)'),
    temperature_mm: z.number().describe('From temperature_sigma_k through the Bevis Tm [mm]'),
    tm_mm: z.number().describe('From tm_sigma_k or the 4.74 K scatter of the Bevis regression [mm]'),
    refractivity_mm: z
      .number()
      .describe("From the uncertainties of k2' and k3 (Bevis et al. 1994) [mm]; systematic, common to all records"),
    defaulted: z.array(z.string()).describe('Input sigmas that were not given and took their documented default'),
  })
  .describe('Terms of pwv_sigma_mm, each in mm of PWV; pwv_sigma_mm is their root sum of squares');

export const pwvRecordResponse = z.object({
  epoch: z.string(),
  zhd_m: z.number().nullable().describe('Zenith hydrostatic delay from the measured pressure [m]; null without pressure'),
  zwd_m: z.number().describe('Zenith wet delay [m]'),
  zwd_sigma_m: z.number().nullable().describe('Standard deviation of zwd_m [m]; null when the delay had no sigma'),
  tm_k: z.number().describe('Weighted mean temperature [K]'),
  tm_sigma_k: z.number().describe('Standard deviation of tm_k [K]'),
  conversion_factor: z.number().describe('Π = PWV/ZWD [-]'),
  pwv_mm: z.number().describe('Precipitable water vapour [mm]'),
  pwv_sigma_mm: z
    .number()
    .nullable()
    .describe('Standard deviation of pwv_mm [mm], all terms of the budget; null when neither ztd_sigma_m nor zwd_sigma_m was given'),
  sigma_budget: pwvSigmaBudgetSchema.optional(),
});

export const precipitableWaterResponse = z.object({
  records: z.array(pwvRecordResponse),
  ...provenanceFields,
});
