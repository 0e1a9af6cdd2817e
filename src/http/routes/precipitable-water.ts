import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { DEG } from '../../domain/constants.js';
import { MODEL_NAMES, provenance } from '../../domain/provenance.js';
import { precipitableWater } from '../../domain/water-vapour/precipitable-water.js';
import { problemSchema } from '../schemas/common.js';
import { precipitableWaterRequest, precipitableWaterResponse } from '../schemas/precipitable-water.js';
import { BATCH_BODY_LIMIT_BYTES } from '../../limits.js';
import { canonicalEpoch } from './shared.js';

const precipitableWaterRoute: FastifyPluginAsyncZod = async (app) => {
  app.post(
    '/v1/precipitable-water',
    {
      bodyLimit: BATCH_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Precipitable water vapour from zenith delays and surface met',
        description: `PWV = Π(Tm) · ZWD with Π from Bevis et al. (1994) and Tm from Bevis et al. (1992) or the caller. ZWD = ZTD − ZHD(P) when a total delay is given, which then needs the measured pressure (never defaulted). σ_PWV is the root sum of squares of its budget: the delay's sigma (no default: without it σ is null), pressure (default 0.5 hPa), the ZHD model, the surface temperature (default 0.5 K), Tm (4.74 K for the Bevis regression, default 2 K for a caller's tm_k) and the refractivity constants; sigma_budget=true lists the terms per record. Body limit: ${BATCH_BODY_LIMIT_BYTES} bytes (32 MiB).`,
        tags: ['water vapour'],
        body: precipitableWaterRequest,
        response: { 200: precipitableWaterResponse, 400: problemSchema, 413: problemSchema, 415: problemSchema },
      },
    },
    async (request) => {
      const { site, records, sigma_budget } = request.body;
      const latRad = site.latitude_deg * DEG;
      const warnings: string[] = [];
      let tmFromCaller = 0;
      let delaySigmaUnknown = 0;
      const out = records.map((r, i) => {
        const res = precipitableWater(
          {
            ztdM: r.ztd_m,
            zwdM: r.zwd_m,
            ztdSigmaM: r.ztd_sigma_m,
            zwdSigmaM: r.zwd_sigma_m,
            pressureHpa: r.pressure_hpa,
            pressureSigmaHpa: r.pressure_sigma_hpa,
            temperatureC: r.temperature_c,
            temperatureSigmaK: r.temperature_sigma_k,
            tmK: r.tm_k,
            tmSigmaK: r.tm_sigma_k,
          },
          latRad,
          site.height_m,
          `records.${i}`,
        );
        if (r.tm_k !== undefined) tmFromCaller++;
        if (!res.delaySigmaKnown) delaySigmaUnknown++;
        warnings.push(...res.warnings);
        const b = res.sigmaBudget;
        return {
          epoch: canonicalEpoch(r.epoch),
          zhd_m: res.zhdM,
          zwd_m: res.zwdM,
          zwd_sigma_m: res.delaySigmaKnown ? res.zwdSigmaM : null,
          tm_k: res.tmK,
          tm_sigma_k: res.tmSigmaK,
          conversion_factor: res.conversionFactor,
          pwv_mm: res.pwvMm,
          pwv_sigma_mm: res.delaySigmaKnown ? res.pwvSigmaMm : null,
          ...(sigma_budget
            ? {
                sigma_budget: {
                  delay_mm: b.delayMm,
                  pressure_mm: b.pressureMm,
                  zhd_model_mm: b.zhdModelMm,
                  temperature_mm: b.temperatureMm,
                  tm_mm: b.tmMm,
                  refractivity_mm: b.refractivityMm,
                  defaulted: b.defaulted,
                },
              }
            : {}),
        };
      });
      if (delaySigmaUnknown > 0) {
        warnings.push(
          `${delaySigmaUnknown} record(s) have neither ztd_sigma_m nor zwd_sigma_m: their pwv_sigma_mm and zwd_sigma_m are null (the delay's error is usually the largest term; give the formal error of the delay)`,
        );
      }
      const tm = tmFromCaller === 0 ? MODEL_NAMES.tm : tmFromCaller === records.length ? 'caller' : `${MODEL_NAMES.tm} and caller (mixed)`;
      return {
        records: out,
        ...provenance({ zhd: MODEL_NAMES.zhd, tm, conversion: MODEL_NAMES.conversion, pwv_sigma: MODEL_NAMES.pwvSigma }),
        warnings,
      };
    },
  );
};

export default precipitableWaterRoute;
