import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { CELSIUS_ZERO_K, DEG } from '../../domain/constants.js';
import { MAPPING_MODELS } from '../../domain/mapping/registry.js';
import { EXTENSION_STOP_FRACTION } from '../../domain/profile/extension.js';
import { computeProfileDelays } from '../../domain/profile/profile-delays.js';
import { REFRACTIVITY_CONSTANT_SETS } from '../../domain/profile/refractivity.js';
import { MODEL_NAMES, provenance } from '../../domain/provenance.js';
import { problemSchema } from '../schemas/common.js';
import { checkCoefficients } from '../schemas/mapping-factors.js';
import { profileDelaysRequest, profileDelaysResponse } from '../schemas/profile-delays.js';
import { assumedHeightReferenceWarning } from '../../domain/mapping/vmf1.js';
import { lowElevationWarning, prepareMapping, toCoefficients, toSite } from './shared.js';

/** 10 000 levels of about 150 bytes each fit with room to spare. */
export const PROFILE_BODY_LIMIT_BYTES = 4 * 1024 * 1024;

const EXTENSION_DESCRIPTION = `Above the top level the column is continued as a dry isothermal atmosphere at the top temperature in hydrostatic equilibrium (gravity decreasing with height) up to where the pressure falls below ${EXTENSION_STOP_FRACTION} of the surface pressure; its hydrostatic delay does not depend on the assumed temperature, and its wet delay is zero.`;

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
    async (request) => {
      const body = request.body;
      const site = toSite(body.site);
      const modelMapping = prepareMapping(site, body.epoch, body.mapping_model, body.coefficients);
      const result = computeProfileDelays({
        latitudeRad: site.latitudeDeg * DEG,
        longitudeRad: site.longitudeDeg * DEG,
        siteHeightM: site.heightM,
        levels: body.levels.map((l) => ({
          heightM: l.height_m,
          geopotentialHeightM: l.geopotential_height_m,
          pressureHpa: l.pressure_hpa,
          temperatureC: l.temperature_c,
          relativeHumidityPct: l.relative_humidity_pct,
          dewpointC: l.dewpoint_c,
          vapourPressureHpa: l.vapour_pressure_hpa,
          specificHumidityKgKg: l.specific_humidity_kg_kg,
        })),
        geoidUndulationM: body.geoid_undulation_m,
        constants: body.refractivity_constants,
        compressibility: body.compressibility,
        elevationsRad: body.elevations_deg?.map((e) => e * DEG),
        modelMapping,
      });
      const warnings = [...result.warnings, ...(body.elevations_deg ? lowElevationWarning(body.elevations_deg) : [])];
      const constants = REFRACTIVITY_CONSTANT_SETS[body.refractivity_constants];
      const mapping = MAPPING_MODELS[body.mapping_model];
      const assumedReference = assumedHeightReferenceWarning(toCoefficients(body.coefficients));
      if (assumedReference) warnings.push(assumedReference);
      return {
        zhd_m: result.zhdM,
        zwd_m: result.zwdM,
        ztd_m: result.ztdM,
        pwv_mm: result.pwvMm,
        tm_k: result.tmK,
        top_extension: {
          method: 'dry-isothermal-hydrostatic' as const,
          description: EXTENSION_DESCRIPTION,
          top_height_m: result.topExtension.topHeightM,
          top_pressure_hpa: result.topExtension.topPressureHpa,
          top_temperature_c: result.topExtension.topTemperatureK - CELSIUS_ZERO_K,
          scale_height_m: result.topExtension.scaleHeightM,
          ceiling_height_m: result.topExtension.ceilingHeightM,
          zhd_m: result.topExtension.zhdM,
          zhd_fraction: result.topExtension.zhdFraction,
          zwd_m: 0,
        },
        column: {
          bottom_height_m: result.column.bottomHeightM,
          top_height_m: result.column.topHeightM,
          surface_pressure_hpa: result.column.surfacePressureHpa,
          surface_temperature_c: result.column.surfaceTemperatureK - CELSIUS_ZERO_K,
          levels_used: result.column.levelsUsed,
          levels_below_site: result.column.levelsBelowSite,
          extended_down_m: result.column.extendedDownM,
          shells: result.column.shells,
          earth_radius_m: result.column.earthRadiusM,
          mean_gravity_m_s2: result.meanGravityM_S2,
          zhd_height_integral_m: result.zhdHeightIntegralM,
        },
        ...(result.slants
          ? {
              slants: result.slants.map((s, i) => ({
                elevation_deg: body.elevations_deg![i]!,
                apparent_elevation_deg: s.apparentElevationRad / DEG,
                refraction_deg: s.refractionRad / DEG,
                hydrostatic_m: s.hydrostaticM,
                wet_m: s.wetM,
                total_m: s.totalM,
                bending_m: s.bendingM,
                mapping_hydrostatic: s.mappingHydrostatic,
                mapping_wet: s.mappingWet,
                model_mapping_hydrostatic: s.modelMappingHydrostatic,
                model_mapping_wet: s.modelMappingWet,
              })),
            }
          : {}),
        mapping_model: body.mapping_model,
        ...provenance({
          refractivity: `${constants.key}: ${constants.citation}`,
          compressibility: body.compressibility ? 'owens-1967 (Thayer 1974)' : 'ignored (ideal gas)',
          zhd: 'pressure integral 1e-6 k1 Rd int dP/g (Davis et al. 1985)',
          gravity: 'wgs84-normal-gravity (NIMA TR8350.2 eq. 4-1, 4-3)',
          interpolation: 'T linear, P hydrostatic power of T, e exponential in height',
          extension: 'dry-isothermal-hydrostatic',
          ray_tracing:
            'spherical shells, Bouguer n r cos(theta) = const, Gaussian radius, vacuum elevations, bending in the hydrostatic part',
          saturation: `${MODEL_NAMES.saturation}, extrapolated below -45 C`,
          mapping: `${body.mapping_model}: ${mapping.citation}`,
          mapping_height_correction: mapping.heightCorrection(toCoefficients(body.coefficients)),
          ...(body.coefficients ? { mapping_ah: body.coefficients.ah, mapping_aw: body.coefficients.aw } : {}),
        }),
        warnings,
      };
    },
  );
};

export default profileDelaysRoute;
