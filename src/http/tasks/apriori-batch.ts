/**
 * The a-priori batch requests (slant delays, mapping factors, precipitable water) as functions of
 * the body bytes: parse, validate against the route's schema, compute, serialise. A large body runs
 * as a compute task in a worker thread (src/http/compute-tasks.ts); a small one runs the same
 * function on the event loop (src/http/batch-body.ts decides by OFFLOAD_BODY_BYTES), so both give
 * the same bytes. Errors of the caller's making come back as data (task-errors.ts).
 *
 * This module is the HTTP edge running off the loop: it uses the zod schemas of src/http, which the
 * inner layers never import; it imports no fastify.
 */

import type { z } from 'zod';
import { DEG } from '../../domain/constants.js';
import { ModelDomainError } from '../../domain/errors.js';
import { geoidUndulationM } from '../../domain/geometry/geoid.js';
import { geodeticToEcef, lookAngles, normaliseAzimuthDeg } from '../../domain/geometry/topocentric.js';
import { GRADIENT_MODELS } from '../../domain/gradients/gradient-mapping.js';
import { checkMappingElevation, mappingDefinedAt } from '../../domain/mapping/elevation-range.js';
import { assumedHeightReferenceWarning } from '../../domain/mapping/vmf1.js';
import { MODEL_NAMES, provenance } from '../../domain/provenance.js';
import type { Site } from '../../domain/site.js';
import { allocateSlantBatch, computeSlantDelays } from '../../domain/slant.js';
import { precipitableWater } from '../../domain/water-vapour/precipitable-water.js';
import { aprioriZenithDelays } from '../../domain/zenith/apriori.js';
import type { TaskOutcome } from '../../workers/task-outcome.js';
import { FormatError } from '../../formats/format-error.js';
import { issuesToFieldErrors } from '../field-errors.js';
import { checkCoefficients, mappingFactorsRequest } from '../schemas/mapping-factors.js';
import { precipitableWaterRequest } from '../schemas/precipitable-water.js';
import { slantDelaysRequest } from '../schemas/slant-delays.js';
import {
  canonicalEpoch,
  lowElevationWarning,
  mappingProvenance,
  prepareMapping,
  toCoefficients,
  toMetInput,
  toSite,
  zenithProvenance,
} from '../routes/shared.js';
import { asOutcome, fail } from './task-errors.js';
import { azimuthUnitWarning, elevationUnitGuard, relativeHumidityUnitWarning } from '../../services/unit-guards.js';
import type { Warning } from '../../services/warnings.js';

/**
 * The unit guards of the a-priori routes (src/services/unit-guards.ts): elevations that look like
 * radians are refused when one of them is below the mapping functions' 1° floor (the answer would be
 * meaningless; the floor would refuse it anyway, with a less helpful message), else warned.
 */
export function directionUnitWarnings(elevationsDeg: ArrayLike<number>, azimuthsDeg: ArrayLike<number> | null, field: string): string[] {
  let belowFloor = false;
  for (let i = 0; i < elevationsDeg.length; i++) if (!mappingDefinedAt(elevationsDeg[i]!)) belowFloor = true;
  const found: (Warning | null)[] = [elevationUnitGuard(elevationsDeg, { field, refuseElevations: belowFloor })];
  if (azimuthsDeg) found.push(azimuthUnitWarning(azimuthsDeg, field));
  return found.filter((w): w is Warning => w !== null).map((w) => w.text);
}

/** The humidity guard of a met object of the a-priori routes, as warning texts. */
export function metUnitWarnings(met: { relative_humidity_pct?: number | undefined } | undefined): string[] {
  const w = relativeHumidityUnitWarning('met.relative_humidity_pct', [met?.relative_humidity_pct ?? null]);
  return w ? [w.text] : [];
}

/** The body schemas as the routes declare them (the refinements included). */
export const slantDelaysBody = slantDelaysRequest.superRefine((v, ctx) => checkCoefficients(v, ctx));
export const mappingFactorsBody = mappingFactorsRequest.superRefine((v, ctx) => checkCoefficients(v, ctx));
export const precipitableWaterBody = precipitableWaterRequest;

type MappingBody = z.output<typeof mappingFactorsRequest>;
type PwvBody = z.output<typeof precipitableWaterRequest>;

type SlantBody = z.output<typeof slantDelaysRequest>;

/** Step 1: the directions as given (elevation, azimuth), or from satellite ECEF positions (look angles, nadir). */
function directionsOf(
  body: SlantBody,
  site: Site,
): { elevationsRad: Float64Array; azimuthsRad: Float64Array; nadirDeg: Float64Array | undefined } {
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

/** POST /v1/slant-delays: the answer to a validated body. */
export function slantDelaysAnswer(body: SlantBody) {
  const site = toSite(body.site);
  const warnings: string[] = [...metUnitWarnings(body.met)];
  if (body.directions) {
    warnings.push(
      ...directionUnitWarnings(
        body.directions.map((d) => d.elevation_deg),
        body.directions.map((d) => d.azimuth_deg),
        'directions',
      ),
    );
  }

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
  const out = computeSlantDelays(
    mapping,
    gradientMapping,
    { zhdM, zwdM, northGradientM, eastGradientM },
    elevationsRad,
    azimuthsRad,
    allocateSlantBatch(n),
  );

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
          body.zenith?.north_gradient_m === undefined && body.zenith?.east_gradient_m === undefined
            ? ('none' as const)
            : ('caller' as const),
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
}

/** POST /v1/mapping-factors: the answer to a validated body. */
export function mappingFactorsAnswer(body: MappingBody) {
  const { site, epoch, elevations_deg, model, coefficients, gradient_model } = body;
  const unitWarnings = directionUnitWarnings(elevations_deg, null, 'elevations_deg');
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
    warnings: [...unitWarnings, ...(assumed ? [assumed] : []), ...lowElevationWarning(elevations_deg)],
  };
}

/** POST /v1/precipitable-water: the answer to a validated body. */
export function precipitableWaterAnswer(body: PwvBody) {
  const { site, records, sigma_budget } = body;
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
    ...provenance({ zhd: MODEL_NAMES.zhd, tm, conversion: MODEL_NAMES.conversion, pwv_sigma_budget: MODEL_NAMES.pwvSigmaBudget }),
    warnings,
  };
}

export interface BatchTaskInput {
  /** The request body as received (UTF-8 JSON), moved to the worker. */
  body: Uint8Array;
}

export interface BatchTaskOutput {
  /** The answer as UTF-8 JSON (moved, not copied, back to the event loop). */
  json: Uint8Array;
  /** Items of the batch (directions, elevations or records), for the metrics. */
  observations: number;
}

const bodyText = (body: Uint8Array) => Buffer.from(body.buffer, body.byteOffset, body.byteLength).toString('utf8');

/** Bytes → JSON → schema → answer → bytes; the caller's mistakes as data. */
function answerBatch<S extends z.ZodType>(
  schema: S,
  answer: (body: z.output<S>) => unknown,
  size: (body: z.output<S>) => number,
  input: BatchTaskInput,
): TaskOutcome<BatchTaskOutput> {
  try {
    let raw: unknown;
    try {
      raw = JSON.parse(bodyText(input.body));
    } catch (err) {
      throw new FormatError('body', `not valid JSON (${err instanceof Error ? err.message : String(err)})`);
    }
    const parsed = schema.safeParse(raw);
    if (!parsed.success) return fail(400, issuesToFieldErrors(parsed.error.issues));
    const json = new TextEncoder().encode(JSON.stringify(answer(parsed.data)));
    return { ok: true, output: { json, observations: size(parsed.data) } };
  } catch (err) {
    return asOutcome(err);
  }
}

/** POST /v1/slant-delays as a task. */
export async function handleSlantDelaysRequest(input: BatchTaskInput): Promise<TaskOutcome<BatchTaskOutput>> {
  return answerBatch(slantDelaysBody, slantDelaysAnswer, (b) => b.directions?.length ?? b.satellites?.length ?? 0, input);
}

/** POST /v1/mapping-factors as a task. */
export async function handleMappingFactorsRequest(input: BatchTaskInput): Promise<TaskOutcome<BatchTaskOutput>> {
  return answerBatch(mappingFactorsBody, mappingFactorsAnswer, (b) => b.elevations_deg.length, input);
}

/** POST /v1/precipitable-water as a task. */
export async function handlePrecipitableWaterRequest(input: BatchTaskInput): Promise<TaskOutcome<BatchTaskOutput>> {
  return answerBatch(precipitableWaterBody, precipitableWaterAnswer, (b) => b.records.length, input);
}
