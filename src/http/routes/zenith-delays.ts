import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { aprioriZenithDelays } from '../../domain/zenith/apriori.js';
import { problemSchema } from '../schemas/common.js';
import { zenithDelaysRequest, zenithDelaysResponse } from '../schemas/zenith-delays.js';
import type { Provenance } from '../../domain/provenance.js';
import { metUnitWarnings } from '../tasks/apriori-batch.js';
import { memoProvenance, toMetInput, toSite, zenithProvenance } from './shared.js';

const PROVENANCE = new Map<string, Provenance>();

const zenithDelaysRoute: FastifyPluginAsyncZod = async (app) => {
  app.post(
    '/v1/zenith-delays',
    {
      schema: {
        summary: 'A-priori zenith hydrostatic, wet and total delay at a site',
        description:
          'ZHD by Saastamoinen (Davis et al. 1985, IERS 2010 eq. 9.11) from surface pressure; ZWD by the chosen wet model from temperature and humidity. Met measured at another height is reduced to the site; missing met comes from the standard atmosphere (Berg 1948) and the response says so. Body limit: 1 MiB.',
        tags: ['a-priori delays'],
        body: zenithDelaysRequest,
        response: { 200: zenithDelaysResponse, 400: problemSchema, 413: problemSchema, 415: problemSchema, 422: problemSchema },
      },
    },
    async (request) => {
      const { site, met, wet_model } = request.body;
      const z = aprioriZenithDelays(toSite(site), toMetInput(met), wet_model);
      return {
        zhd_m: z.zhdM,
        zwd_m: z.zwdM,
        ztd_m: z.ztdM,
        met_used: {
          pressure_hpa: z.met.pressureHpa,
          temperature_c: z.met.temperatureC,
          vapour_pressure_hpa: z.met.vapourPressureHpa,
          source: z.met.source,
        },
        geoid_undulation_m: z.geoidUndulationM,
        ...memoProvenance(PROVENANCE, wet_model, () => zenithProvenance(wet_model)),
        warnings: [...metUnitWarnings(met), ...z.met.warnings],
      };
    },
  );
};

export default zenithDelaysRoute;
