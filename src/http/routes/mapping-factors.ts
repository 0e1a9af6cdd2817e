import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { DEG } from '../../domain/constants.js';
import { geoidUndulationM } from '../../domain/geometry/geoid.js';
import { GRADIENT_MODELS } from '../../domain/gradients/gradient-mapping.js';
import { checkMappingElevation } from '../../domain/mapping/elevation-range.js';
import { assumedHeightReferenceWarning } from '../../domain/mapping/vmf1.js';
import { provenance } from '../../domain/provenance.js';
import { BATCH_BODY_LIMIT_BYTES } from '../../limits.js';
import { problemSchema } from '../schemas/common.js';
import { checkCoefficients, mappingFactorsRequest, mappingFactorsResponse } from '../schemas/mapping-factors.js';
import { lowElevationWarning, mappingProvenance, prepareMapping, toCoefficients, toSite } from './shared.js';

const mappingFactorsRoute: FastifyPluginAsyncZod = async (app) => {
  app.post(
    '/v1/mapping-factors',
    {
      bodyLimit: BATCH_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Hydrostatic, wet and gradient mapping factors at given elevations',
        description: `Mapping functions in the normalised continued-fraction form (Marini 1972): niell (Niell 1996, default), vmf1 (Boehm et al. 2006 with caller a coefficients), chao (Chao 1972), cosecant. Gradient mapping: chen-herring (default) or tilting. Body limit: ${BATCH_BODY_LIMIT_BYTES} bytes (32 MiB).`,
        tags: ['a-priori delays'],
        body: mappingFactorsRequest.superRefine((v, ctx) => checkCoefficients(v, ctx)),
        response: { 200: mappingFactorsResponse, 400: problemSchema, 413: problemSchema, 415: problemSchema },
      },
    },
    async (request) => {
      const { site, epoch, elevations_deg, model, coefficients, gradient_model } = request.body;
      elevations_deg.forEach((e, i) => checkMappingElevation(e, `elevations_deg.${i}`));
      const mapping = prepareMapping(toSite(site), epoch, model, coefficients);
      const gradientMapping = GRADIENT_MODELS[gradient_model]!.prepare(mapping);
      const n = elevations_deg.length;
      const hydrostatic = new Array<number>(n);
      const wet = new Array<number>(n);
      const gradient = new Array<number>(n);
      for (let i = 0; i < n; i++) {
        const e = elevations_deg[i]! * DEG;
        hydrostatic[i] = mapping.hydrostatic(e);
        wet[i] = mapping.wet(e);
        gradient[i] = gradientMapping(e);
      }
      const assumed = assumedHeightReferenceWarning(toCoefficients(coefficients));
      return {
        model,
        hydrostatic,
        wet,
        gradient,
        geoid_undulation_m: geoidUndulationM(site.latitude_deg, site.longitude_deg),
        ...provenance(mappingProvenance(model, gradient_model, coefficients)),
        warnings: [...(assumed ? [assumed] : []), ...lowElevationWarning(elevations_deg)],
      };
    },
  );
};

export default mappingFactorsRoute;
