import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { z } from 'zod';
import type { Site } from '../../domain/site.js';
import { DEG } from '../../domain/constants.js';
import { ModelDomainError } from '../../domain/errors.js';
import { geoidUndulationM } from '../../domain/geometry/geoid.js';
import { geodeticToEcef, lookAngles, normaliseAzimuthDeg } from '../../domain/geometry/topocentric.js';
import { GRADIENT_MODELS } from '../../domain/gradients/gradient-mapping.js';
import { checkMappingElevation } from '../../domain/mapping/elevation-range.js';
import { assumedHeightReferenceWarning } from '../../domain/mapping/vmf1.js';
import { provenance } from '../../domain/provenance.js';
import { allocateSlantBatch, computeSlantDelays } from '../../domain/slant.js';
import { aprioriZenithDelays } from '../../domain/zenith/apriori.js';
import { problemSchema } from '../schemas/common.js';
import { checkCoefficients } from '../schemas/mapping-factors.js';
import { slantDelaysRequest, slantDelaysResponse } from '../schemas/slant-delays.js';
import { BATCH_BODY_LIMIT_BYTES } from '../../limits.js';
import { lowElevationWarning, mappingProvenance, prepareMapping, toCoefficients, toMetInput, toSite, zenithProvenance } from './shared.js';

type SlantBody = z.output<typeof slantDelaysRequest>;

/** Step 1: the directions as given (elevation, azimuth), or from satellite ECEF positions (look angles, nadir). */
function directionsOf(body: SlantBody, site: Site): { elevationsRad: Float64Array; azimuthsRad: Float64Array; nadirDeg: Float64Array | undefined } {
  const n = body.directions?.length ?? body.satellites!.length;
  const elevationsRad = new Float64Array(n);
  const azimuthsRad = new Float64Array(n);
  const nadirDeg = body.satellites ? new Float64Array(n) : undefined;
  if (body.directions) {
    body.directions.forEach((d, i) => {
      checkMappingElevation(d.elevation_deg, `directions.${i}.elevation_deg`);
      elevationsRad[i] = d.elevation_deg * DEG;
      azimuthsRad[i] = d.azimuth_deg * DEG;
    });
    return { elevationsRad, azimuthsRad, nadirDeg };
  }
  const latRad = site.latitudeDeg * DEG;
  const lonRad = site.longitudeDeg * DEG;
  const siteEcef = geodeticToEcef(latRad, lonRad, site.heightM);
  body.satellites!.forEach((s, i) => {
    const look = lookAngles(latRad, lonRad, siteEcef, { xM: s.x_m, yM: s.y_m, zM: s.z_m });
    if (!(look.elevationRad > 0)) {
      throw new ModelDomainError(
        `satellites.${i}`,
        `satellite ${s.id} is at elevation ${(look.elevationRad / DEG).toFixed(3)}° from the site; elevations must be in (0, 90] deg`,
        400,
      );
    }
    checkMappingElevation(look.elevationRad / DEG, `satellites.${i}`);
    elevationsRad[i] = look.elevationRad;
    azimuthsRad[i] = look.azimuthRad;
    nadirDeg![i] = look.nadirRad / DEG;
  });
  return { elevationsRad, azimuthsRad, nadirDeg };
}

/** Step 3: one answer entry per direction. */
function slantEntries(
  body: SlantBody,
  out: ReturnType<typeof computeSlantDelays>,
  elevationsDeg: Float64Array,
  azimuthsRad: Float64Array,
  nadirDeg: Float64Array | undefined,
) {
  const n = elevationsDeg.length;
  const slants = new Array(n);
  for (let i = 0; i < n; i++) {
    slants[i] = {
      elevation_deg: body.directions ? body.directions[i]!.elevation_deg : elevationsDeg[i]!,
      azimuth_deg: normaliseAzimuthDeg(body.directions ? body.directions[i]!.azimuth_deg : azimuthsRad[i]! / DEG),
      ...(body.satellites ? { satellite: body.satellites[i]!.id, nadir_deg: nadirDeg![i]! } : {}),
      mapping_hydrostatic: out.mappingHydrostatic[i]!,
      mapping_wet: out.mappingWet[i]!,
      mapping_gradient: out.mappingGradient[i]!,
      hydrostatic_m: out.hydrostaticM[i]!,
      wet_m: out.wetM[i]!,
      gradient_m: out.gradientM[i]!,
      total_m: out.totalM[i]!,
    };
  }
  return slants;
}

const slantDelaysRoute: FastifyPluginAsyncZod = async (app) => {
  app.post(
    '/v1/slant-delays',
    {
      bodyLimit: BATCH_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Slant delays along directions or towards satellites',
        description: `slant = m_h ZHD + m_w ZWD + m_g (G_N cos a + G_E sin a). Zenith values not supplied come from met or the standard atmosphere; gradients default to 0. Directions may be given as elevation/azimuth or as satellite ECEF positions (WGS84). Up to 100 000 directions. Body limit: ${BATCH_BODY_LIMIT_BYTES} bytes (32 MiB).`,
        tags: ['a-priori delays'],
        body: slantDelaysRequest.superRefine((v, ctx) => checkCoefficients(v, ctx)),
        response: { 200: slantDelaysResponse, 400: problemSchema, 413: problemSchema, 415: problemSchema },
      },
    },
    async (request) => {
      const body = request.body;
      const site = toSite(body.site);
      const warnings: string[] = [];

      const needMet = body.zenith?.zhd_m === undefined || body.zenith?.zwd_m === undefined;
      const apriori = needMet ? aprioriZenithDelays(site, toMetInput(body.met), body.wet_model) : undefined;
      if (apriori) warnings.push(...apriori.met.warnings);
      const zhdM = body.zenith?.zhd_m ?? apriori!.zhdM;
      const zwdM = body.zenith?.zwd_m ?? apriori!.zwdM;
      const northGradientM = body.zenith?.north_gradient_m ?? 0;
      const eastGradientM = body.zenith?.east_gradient_m ?? 0;

      const { elevationsRad, azimuthsRad, nadirDeg } = directionsOf(body, site);
      const n = elevationsRad.length;

      const mapping = prepareMapping(site, body.epoch, body.model, body.coefficients);
      const assumed = assumedHeightReferenceWarning(toCoefficients(body.coefficients));
      if (assumed) warnings.push(assumed);
      const gradientMapping = GRADIENT_MODELS[body.gradient_model]!.prepare(mapping);
      const out = computeSlantDelays(mapping, gradientMapping, { zhdM, zwdM, northGradientM, eastGradientM }, elevationsRad, azimuthsRad, allocateSlantBatch(n));

      const elevationsDeg = elevationsRad.map((e) => e / DEG);
      warnings.push(...lowElevationWarning(elevationsDeg, body.directions ? 'directions' : 'satellites'));
      const slants = slantEntries(body, out, elevationsDeg, azimuthsRad, nadirDeg);
      return {
        zenith: {
          zhd_m: zhdM,
          zwd_m: zwdM,
          ztd_m: zhdM + zwdM,
          north_gradient_m: northGradientM,
          east_gradient_m: eastGradientM,
          source: {
            zhd: body.zenith?.zhd_m === undefined ? ('met' as const) : ('caller' as const),
            zwd: body.zenith?.zwd_m === undefined ? ('met' as const) : ('caller' as const),
            gradients:
              body.zenith?.north_gradient_m === undefined && body.zenith?.east_gradient_m === undefined ? ('none' as const) : ('caller' as const),
          },
        },
        ...(apriori
          ? {
              met_used: {
                pressure_hpa: apriori.met.pressureHpa,
                temperature_c: apriori.met.temperatureC,
                vapour_pressure_hpa: apriori.met.vapourPressureHpa,
                source: apriori.met.source,
              },
            }
          : {}),
        slants,
        geoid_undulation_m: apriori?.geoidUndulationM ?? geoidUndulationM(site.latitudeDeg, site.longitudeDeg),
        ...provenance({
          ...(apriori ? zenithProvenance(body.wet_model) : { zhd: 'caller', zwd: 'caller' }),
          ...mappingProvenance(body.model, body.gradient_model, body.coefficients),
        }),
        warnings,
      };
    },
  );
};

export default slantDelaysRoute;
