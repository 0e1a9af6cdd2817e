import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { aprioriZenithDelays, type AprioriZenith } from '../../domain/zenith/apriori.js';
import { jsonNumberText } from '../../formats/json-columns.js';
import { problemSchema } from '../schemas/common.js';
import { zenithDelaysRequest, zenithDelaysResponse } from '../schemas/zenith-delays.js';
import { metUnitWarnings } from '../tasks/apriori-batch.js';
import { memoProvenanceJson, toMetInput, toSite, zenithProvenance } from './shared.js';

const PROVENANCE_JSON = new Map<string, string>();

/**
 * The 200 answer (zenithDelaysResponse) as JSON text, written field by field: the bytes JSON.stringify gives
 * for the same object, keys in the schema's order, with the provenance fields' text written once per wet
 * model (memoProvenanceJson). JSON.stringify of the object cost ~2 µs of the request's ~40 µs of service CPU,
 * most of it the fixed model names and the doubles (DEVELOPERS.md, "The per-request cost of the single-point
 * routes"); test/http/zenith-answer-bytes.test.ts compares the bytes with JSON.stringify over a sweep of inputs.
 */
export function zenithAnswerJson(z: AprioriZenith, provenanceJson: string, warnings: readonly string[]): string {
  const m = z.met;
  return (
    `{"zhd_m":${jsonNumberText(z.zhdM)},"zwd_m":${jsonNumberText(z.zwdM)},"ztd_m":${jsonNumberText(z.ztdM)},` +
    `"met_used":{"pressure_hpa":${jsonNumberText(m.pressureHpa)},"temperature_c":${jsonNumberText(m.temperatureC)},` +
    `"vapour_pressure_hpa":${jsonNumberText(m.vapourPressureHpa)},"source":{"pressure":${JSON.stringify(m.source.pressure)},` +
    `"temperature":${JSON.stringify(m.source.temperature)},"humidity":${JSON.stringify(m.source.humidity)}}},` +
    `"geoid_undulation_m":${jsonNumberText(z.geoidUndulationM)},${provenanceJson},"warnings":${JSON.stringify(warnings)}}`
  );
}

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
    async (request, reply) => {
      const { site, met, wet_model } = request.body;
      const z = aprioriZenithDelays(toSite(site), toMetInput(met), wet_model);
      const provenanceJson = memoProvenanceJson(PROVENANCE_JSON, wet_model, () => zenithProvenance(wet_model));
      const answer = zenithAnswerJson(z, provenanceJson, [...metUnitWarnings(met), ...z.met.warnings]);
      // Already JSON: fastify sends a string returned with a JSON content type as it is. (Returning
      // `reply.send(answer)` instead cost ~3 µs more a request: fastify sends the returned reply once more.)
      reply.type('application/json; charset=utf-8');
      return answer as never;
    },
  );
};

export default zenithDelaysRoute;
