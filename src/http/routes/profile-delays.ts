import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { answerProfileDelays } from '../adapters/profile-delays.js';
import { problemSchema } from '../schemas/common.js';
import { checkCoefficients } from '../schemas/mapping-factors.js';
import { profileDelaysRequest, profileDelaysResponse } from '../schemas/profile-delays.js';

/** 10 000 levels of about 150 bytes each fit with room to spare. */
export const PROFILE_BODY_LIMIT_BYTES = 4 * 1024 * 1024;

const profileDelaysRoute: FastifyPluginAsyncZod = async (app) => {
  app.post(
    '/v1/profile-delays',
    {
      bodyLimit: PROFILE_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Zenith delays, precipitable water, Tm and ray-traced mapping factors from an atmospheric profile',
        description: `Integrates a vertical profile (radiosonde ascent or weather-model column) from the site height up: refractivity N = k1 Pd/T + k2 e/T + k3 e/T² (constant sets of Smith & Weintraub 1953, Thayer 1974, Bevis et al. 1994, Rüeger 2002), ZHD = 1e-6 k1 Rd ∫dP/g with WGS84 normal gravity, ZWD = 1e-6 ∫N_w dz, PWV = ∫ρv dz/ρw, Tm = ∫(e/T)dz/∫(e/T²)dz. Rays are traced through spherical shells (n r cos θ = const) at vacuum elevations, iterating on the launch angle; the slant delay is the optical path minus the projection of station-to-exit onto the outgoing direction, and its bending term is assigned to the hydrostatic part. Mapping factors (slant / zenith of the same column) are set beside those of mapping_model. Body limit: ${PROFILE_BODY_LIMIT_BYTES} bytes (4 MiB).`,
        tags: ['atmospheric profiles'],
        body: profileDelaysRequest.superRefine((v, ctx) =>
          checkCoefficients({ model: v.mapping_model, coefficients: v.coefficients }, ctx),
        ),
        response: { 200: profileDelaysResponse, 400: problemSchema, 413: problemSchema, 415: problemSchema, 422: problemSchema },
      },
    },
    async (request) => answerProfileDelays(request.body),
  );
};

export default profileDelaysRoute;
