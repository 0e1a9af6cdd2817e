/**
 * POST /v1/profile-delays between the API shape and the domain (src/domain/profile/profile-delays.ts):
 * the request body → the computation → the answer. Shared with the soundings of the archive, which store
 * the same request and answer (src/http/routes/station-soundings.ts).
 */

import { CELSIUS_ZERO_K, DEG } from '../../domain/constants.js';
import { MAPPING_MODELS } from '../../domain/mapping/registry.js';
import { assumedHeightReferenceWarning } from '../../domain/mapping/vmf1.js';
import { EXTENSION_STOP_FRACTION } from '../../domain/profile/extension.js';
import { HUMIDITY_EXTENSION_METHOD, SMITH_LAMBDA } from '../../domain/profile/humidity-extension.js';
import { computeProfileDelays } from '../../domain/profile/profile-delays.js';
import { REFRACTIVITY_CONSTANT_SETS } from '../../domain/profile/refractivity.js';
import { MODEL_NAMES, provenance } from '../../domain/provenance.js';
import type { ProfileDelaysRequest, ProfileDelaysResponse } from '../schemas/profile-delays.js';
import { lowElevationWarning, prepareMapping, toCoefficients, toSite } from '../routes/shared.js';

const EXTENSION_DESCRIPTION = `Above the top level the column is continued as a dry isothermal atmosphere at the top temperature in hydrostatic equilibrium (gravity decreasing with height) up to where the pressure falls below ${EXTENSION_STOP_FRACTION} of the surface pressure; its hydrostatic delay does not depend on the assumed temperature, and its wet delay is zero.`;

const HUMIDITY_EXTENSION_DESCRIPTION = `Above the last level that carries humidity, specific humidity follows q = q_h (p / p_h)^${SMITH_LAMBDA} (Smith 1966, J. Appl. Meteorol. 5, 726–727; lambda is his annual mean), limited to saturation over water; the water above p_h under this law is q_h p_h / (g (lambda + 1)).`;

/** The validated body of POST /v1/profile-delays → its answer. */
export function answerProfileDelays(body: ProfileDelaysRequest): ProfileDelaysResponse {
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
    humidity_extension: result.humidityExtension
      ? {
          method: HUMIDITY_EXTENSION_METHOD,
          description: HUMIDITY_EXTENSION_DESCRIPTION,
          last_humidity_level: result.humidityExtension.lastHumidityLevel,
          last_humidity_pressure_hpa: result.humidityExtension.lastHumidityPressureHpa,
          last_humidity_height_m: result.humidityExtension.lastHumidityHeightM,
          last_humidity_specific_kg_kg: result.humidityExtension.lastHumiditySpecificKgKg,
          lambda: result.humidityExtension.lambda,
          levels_extended: result.humidityExtension.levelsExtended,
          levels_at_saturation: result.humidityExtension.levelsAtSaturation,
        }
      : null,
    mapping_model: body.mapping_model,
    ...provenance({
      refractivity: `${constants.key}: ${constants.citation}`,
      compressibility: body.compressibility ? 'owens-1967 (Thayer 1974)' : 'ignored (ideal gas)',
      zhd: 'pressure integral 1e-6 k1 Rd int dP/g (Davis et al. 1985)',
      gravity: 'wgs84-normal-gravity (NIMA TR8350.2 eq. 4-1, 4-3)',
      interpolation: 'T linear, P hydrostatic power of T, e exponential in height',
      extension: 'dry-isothermal-hydrostatic',
      ...(result.humidityExtension ? { humidity_extension: `${HUMIDITY_EXTENSION_METHOD} (lambda ${SMITH_LAMBDA})` } : {}),
      ray_tracing: 'spherical shells, Bouguer n r cos(theta) = const, Gaussian radius, vacuum elevations, bending in the hydrostatic part',
      saturation: `${MODEL_NAMES.saturation}, extrapolated below -45 C`,
      mapping: `${body.mapping_model}: ${mapping.citation}`,
      mapping_height_correction: mapping.heightCorrection(toCoefficients(body.coefficients)),
      ...(body.coefficients ? { mapping_ah: body.coefficients.ah, mapping_aw: body.coefficients.aw } : {}),
    }),
    warnings,
  };
}
