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
import { elevationSines } from '../../domain/mapping/elevation-sines.js';
import { assumedHeightReferenceWarning } from '../../domain/mapping/vmf1.js';
import { MODEL_NAMES, provenance } from '../../domain/provenance.js';
import type { Site } from '../../domain/site.js';
import { allocateSlantBatch, computeSlantDelays, type SlantBatch } from '../../domain/slant.js';
import { precipitableWater } from '../../domain/water-vapour/precipitable-water.js';
import { aprioriZenithDelays } from '../../domain/zenith/apriori.js';
import type { TaskOutcome } from '../../workers/task-outcome.js';
import { FormatError } from '../../formats/format-error.js';
import { columnsJsonBytes, jsonWithRawMembers, utf8Bytes } from '../../formats/json-columns.js';
import { issuesToFieldErrors } from '../field-errors.js';
import { checkCoefficients, mappingFactorsRequest } from '../schemas/mapping-factors.js';
import { precipitableWaterRequest } from '../schemas/precipitable-water.js';
import { slantDelaysColumnarRest, slantDelaysRequest, slantDirectionSchema, slantSatelliteSchema } from '../schemas/slant-delays.js';
import { MAX_BATCH } from '../schemas/mapping-factors.js';
import {
  arrowAnswer,
  ARROW_STREAM_TYPE,
  COLUMN_DECIMALS,
  jsonColumnsOf,
  pooledBytes,
  readArrowRequest,
  releasePooledBytes,
  type AnswerShape,
  type FieldDecimals,
} from '../answer-shape.js';
import { columnSpecsOf, float64Column, readColumns } from '../columns.js';
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

type SlantFields = Omit<z.output<typeof slantDelaysColumnarRest>, 'directions' | 'satellites'>;

/** The rows of a slant-delays request as columns, whichever form they came in. */
type SlantRows =
  | { kind: 'directions'; elevationDeg: Float64Array; azimuthDeg: Float64Array }
  | { kind: 'satellites'; id: string[]; xM: Float64Array; yM: Float64Array; zM: Float64Array };

const SLANT_DIRECTION_COLUMNS = columnSpecsOf(slantDirectionSchema.shape);
const SLANT_SATELLITE_COLUMNS = columnSpecsOf(slantSatelliteSchema.shape);

/** The per-direction fields of the answer, with their decimals in a columns answer (answer-shape.ts). */
export const SLANT_FIELDS: FieldDecimals = {
  elevation_deg: COLUMN_DECIMALS.angleDeg,
  azimuth_deg: COLUMN_DECIMALS.angleDeg,
  satellite: undefined,
  nadir_deg: COLUMN_DECIMALS.angleDeg,
  mapping_hydrostatic: COLUMN_DECIMALS.mappingFactor,
  mapping_wet: COLUMN_DECIMALS.mappingFactor,
  mapping_gradient: COLUMN_DECIMALS.mappingFactor,
  hydrostatic_m: COLUMN_DECIMALS.delayM,
  wet_m: COLUMN_DECIMALS.delayM,
  gradient_m: COLUMN_DECIMALS.delayM,
  total_m: COLUMN_DECIMALS.delayM,
};
export const SLANT_FIELD_NAMES = Object.keys(SLANT_FIELDS);

/**
 * Batches up to this many directions compute in work arrays kept from one request to the next on this thread
 * (the event loop, or one worker); larger ones get arrays of their own. 10 000 directions allocated ~0.9 MB of
 * ArrayBuffers a request for these arrays, and V8 counts ArrayBuffers as external memory: a full garbage
 * collection of the service's heap every ~20 requests (issue 14).
 */
const REUSED_WORK_DIRECTIONS = 16_384;

/** The per-direction work arrays of one slant batch: the model's outputs, radians, the answer's azimuths. */
interface SlantWork {
  batch: SlantBatch;
  elevationsRad: Float64Array;
  azimuthsRad: Float64Array;
  azimuthDeg: Float64Array;
}

function allocateSlantWork(n: number): SlantWork {
  return {
    batch: allocateSlantBatch(n),
    elevationsRad: new Float64Array(n),
    azimuthsRad: new Float64Array(n),
    azimuthDeg: new Float64Array(n),
  };
}

let reusedWork: SlantWork | undefined;

/**
 * Work arrays for n directions. Those of a batch up to REUSED_WORK_DIRECTIONS are views of arrays kept for the
 * next request on this thread: valid until the next call, so the answer is serialised before the task returns
 * (handleSlantDelaysRequest has no await between the computation and the bytes).
 */
function slantWork(n: number): SlantWork {
  if (n > REUSED_WORK_DIRECTIONS) return allocateSlantWork(n);
  reusedWork ??= allocateSlantWork(REUSED_WORK_DIRECTIONS);
  const view = (a: Float64Array) => a.subarray(0, n);
  const b = reusedWork.batch;
  return {
    batch: {
      sinElevation: view(b.sinElevation),
      mappingHydrostatic: view(b.mappingHydrostatic),
      mappingWet: view(b.mappingWet),
      mappingGradient: view(b.mappingGradient),
      hydrostaticM: view(b.hydrostaticM),
      wetM: view(b.wetM),
      gradientM: view(b.gradientM),
      totalM: view(b.totalM),
    },
    elevationsRad: view(reusedWork.elevationsRad),
    azimuthsRad: view(reusedWork.azimuthsRad),
    azimuthDeg: view(reusedWork.azimuthDeg),
  };
}

/** Step 1: the directions (elevation, azimuth) as given, or from satellite ECEF positions (look angles, nadir). */
function directionsOf(
  rows: SlantRows,
  site: Site,
  work: SlantWork,
): { elevationsRad: Float64Array; azimuthsRad: Float64Array; nadirDeg: Float64Array | undefined } {
  const { elevationsRad, azimuthsRad } = work;
  if (rows.kind === 'directions') {
    const n = rows.elevationDeg.length;
    for (let i = 0; i < n; i++) {
      // The field name is built only for the direction that fails (a template per row was 5 % of a batch).
      if (!mappingDefinedAt(rows.elevationDeg[i]!)) checkMappingElevation(rows.elevationDeg[i]!, `directions.${i}.elevation_deg`);
      elevationsRad[i] = rows.elevationDeg[i]! * DEG;
      azimuthsRad[i] = rows.azimuthDeg[i]! * DEG;
    }
    return { elevationsRad, azimuthsRad, nadirDeg: undefined };
  }
  const n = rows.id.length;
  const nadirDeg = new Float64Array(n);
  const latRad = site.latitudeDeg * DEG;
  const lonRad = site.longitudeDeg * DEG;
  const siteEcef = geodeticToEcef(latRad, lonRad, site.heightM);
  for (let i = 0; i < n; i++) {
    const look = lookAngles(latRad, lonRad, siteEcef, { xM: rows.xM[i]!, yM: rows.yM[i]!, zM: rows.zM[i]! });
    if (!(look.elevationRad > 0)) {
      throw new ModelDomainError(
        `satellites.${i}`,
        `satellite ${rows.id[i]} is at elevation ${(look.elevationRad / DEG).toFixed(3)}° from the site; elevations must be in (0, 90] deg`,
        400,
      );
    }
    checkMappingElevation(look.elevationRad / DEG, `satellites.${i}`);
    elevationsRad[i] = look.elevationRad;
    azimuthsRad[i] = look.azimuthRad;
    nadirDeg[i] = look.nadirRad / DEG;
  }
  return { elevationsRad, azimuthsRad, nadirDeg };
}

/** Step 3: the per-direction answer as columns (every field of SLANT_FIELDS that applies). */
function slantColumns(
  rows: SlantRows,
  out: SlantBatch,
  elevationsDeg: Float64Array,
  work: SlantWork,
  nadirDeg: Float64Array | undefined,
): Record<string, Float64Array | string[]> {
  const azimuthDeg = work.azimuthDeg;
  if (rows.kind === 'directions') for (let i = 0; i < azimuthDeg.length; i++) azimuthDeg[i] = normaliseAzimuthDeg(rows.azimuthDeg[i]!);
  else for (let i = 0; i < azimuthDeg.length; i++) azimuthDeg[i] = normaliseAzimuthDeg(work.azimuthsRad[i]! / DEG);
  return {
    elevation_deg: elevationsDeg,
    azimuth_deg: azimuthDeg,
    ...(rows.kind === 'satellites' ? { satellite: rows.id, nadir_deg: nadirDeg! } : {}),
    mapping_hydrostatic: out.mappingHydrostatic,
    mapping_wet: out.mappingWet,
    mapping_gradient: out.mappingGradient,
    hydrostatic_m: out.hydrostaticM,
    wet_m: out.wetM,
    gradient_m: out.gradientM,
    total_m: out.totalM,
  };
}

/** Columns → one object per direction (shape=rows), with the selected fields. */
function slantEntries(columns: Record<string, Float64Array | string[]>, fields: readonly string[]) {
  const present = fields.filter((f) => columns[f] !== undefined);
  const n = columns.total_m!.length;
  const slants = new Array<Record<string, number | string>>(n);
  for (let i = 0; i < n; i++) {
    const entry: Record<string, number | string> = {};
    for (const f of present) entry[f] = columns[f]![i]!;
    slants[i] = entry;
  }
  return slants;
}

/**
 * POST /v1/slant-delays: the answer to a validated request, its per-direction part as columns. The columns of
 * a batch up to REUSED_WORK_DIRECTIONS are work arrays of this thread: serialise them before the next call.
 */
export function slantDelaysAnswer(body: SlantFields, rows: SlantRows) {
  const site = toSite(body.site);
  const warnings: string[] = [...metUnitWarnings(body.met)];
  if (rows.kind === 'directions') warnings.push(...directionUnitWarnings(rows.elevationDeg, rows.azimuthDeg, 'directions'));

  const needMet = body.zenith?.zhd_m === undefined || body.zenith?.zwd_m === undefined;
  const apriori = needMet ? aprioriZenithDelays(site, toMetInput(body.met), body.wet_model) : undefined;
  if (apriori) warnings.push(...apriori.met.warnings);
  const zhdM = body.zenith?.zhd_m ?? apriori!.zhdM;
  const zwdM = body.zenith?.zwd_m ?? apriori!.zwdM;
  const northGradientM = body.zenith?.north_gradient_m ?? 0;
  const eastGradientM = body.zenith?.east_gradient_m ?? 0;

  const work = slantWork(rows.kind === 'directions' ? rows.elevationDeg.length : rows.id.length);
  const { elevationsRad, azimuthsRad, nadirDeg } = directionsOf(rows, site, work);

  const mapping = prepareMapping(site, body.epoch, body.model, body.coefficients);
  const assumed = assumedHeightReferenceWarning(toCoefficients(body.coefficients));
  if (assumed) warnings.push(assumed);
  const out = computeSlantDelays(
    mapping,
    GRADIENT_MODELS[body.gradient_model]!,
    { zhdM, zwdM, northGradientM, eastGradientM },
    elevationsRad,
    azimuthsRad,
    work.batch,
  );

  const elevationsDeg = rows.kind === 'directions' ? rows.elevationDeg : elevationsRad.map((e) => e / DEG);
  warnings.push(...lowElevationWarning(elevationsDeg, rows.kind));
  return {
    columns: slantColumns(rows, out, elevationsDeg, work, nadirDeg),
    rest: {
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
      geoid_undulation_m: apriori?.geoidUndulationM ?? geoidUndulationM(site.latitudeDeg, site.longitudeDeg),
      ...provenance({
        ...(apriori ? zenithProvenance(body.wet_model) : { zhd: 'caller', zwd: 'caller' }),
        ...mappingProvenance(body.model, body.gradient_model, body.coefficients),
      }),
      warnings,
    },
  };
}

/**
 * Step 0: the request as fields + rows. Rows given as objects are checked by the route's zod schema;
 * rows given as columns (JSON column arrays or an Arrow table) by src/http/columns.ts, one loop per
 * column with the same rules and messages, and the rest by the schema without its rows.
 */
function slantRequestOf(raw: unknown): { ok: true; fields: SlantFields; rows: SlantRows } | { ok: false; outcome: TaskOutcome<never> } {
  const given = (raw ?? {}) as { directions?: unknown; satellites?: unknown };
  const columnar = [given.directions, given.satellites].some(
    (r) => r !== undefined && r !== null && typeof r === 'object' && !Array.isArray(r),
  );
  if (!columnar) {
    const parsed = slantDelaysBody.safeParse(raw);
    if (!parsed.success) return { ok: false, outcome: fail(400, issuesToFieldErrors(parsed.error.issues)) };
    const { directions, satellites, ...fields } = parsed.data;
    const d = directions as { elevation_deg: number; azimuth_deg: number }[] | undefined;
    const sat = satellites as { id: string; x_m: number; y_m: number; z_m: number }[] | undefined;
    const rows: SlantRows = d
      ? {
          kind: 'directions',
          elevationDeg: Float64Array.from(d, (r) => r.elevation_deg),
          azimuthDeg: Float64Array.from(d, (r) => r.azimuth_deg),
        }
      : {
          kind: 'satellites',
          id: sat!.map((r) => r.id),
          xM: Float64Array.from(sat!, (r) => r.x_m),
          yM: Float64Array.from(sat!, (r) => r.y_m),
          zM: Float64Array.from(sat!, (r) => r.z_m),
        };
    return { ok: true, fields, rows };
  }
  const rest = slantDelaysColumnarRest.safeParse(raw);
  if (!rest.success) return { ok: false, outcome: fail(400, issuesToFieldErrors(rest.error.issues)) };
  const isDirections = given.directions !== undefined;
  const read = isDirections
    ? readColumns(given.directions, 'directions', SLANT_DIRECTION_COLUMNS, MAX_BATCH, 'directions')
    : readColumns(given.satellites, 'satellites', SLANT_SATELLITE_COLUMNS, MAX_BATCH, 'satellites');
  if (!read.ok) return { ok: false, outcome: fail(400, read.errors) };
  const c = read.columns;
  const rows: SlantRows = isDirections
    ? { kind: 'directions', elevationDeg: float64Column(c.elevation_deg)!, azimuthDeg: float64Column(c.azimuth_deg)! }
    : { kind: 'satellites', id: c.id as string[], xM: float64Column(c.x_m)!, yM: float64Column(c.y_m)!, zM: float64Column(c.z_m)! };
  const { directions: _d, satellites: _s, ...fields } = rest.data;
  return { ok: true, fields: fields as SlantFields, rows };
}

/** An Arrow request: the table's columns are the rows (directions or satellites by their column names). */
function slantArrowRequest(bytes: Uint8Array): unknown {
  const { columns, rest } = readArrowRequest(bytes, true);
  const kind = 'elevation_deg' in columns || 'azimuth_deg' in columns ? 'directions' : 'satellites';
  return { ...(rest as object), [kind]: columns };
}

/** POST /v1/mapping-factors: the answer to a validated body. */
export function mappingFactorsAnswer(body: MappingBody) {
  const { site, epoch, elevations_deg, model, coefficients, gradient_model } = body;
  const unitWarnings = directionUnitWarnings(elevations_deg, null, 'elevations_deg');
  elevations_deg.forEach((e, i) => checkMappingElevation(e, `elevations_deg.${i}`));
  const mapping = prepareMapping(toSite(site), epoch, model, coefficients);
  const n = elevations_deg.length;
  const elevationsRad = Float64Array.from(elevations_deg, (e) => e * DEG);
  const hydrostatic = new Float64Array(n);
  const wet = new Float64Array(n);
  const gradient = new Float64Array(n);
  const sinElevations = elevationSines(elevationsRad, new Float64Array(n));
  mapping.mapBatch(elevationsRad, sinElevations, hydrostatic, wet);
  GRADIENT_MODELS[gradient_model]!.mapBatch(elevationsRad, sinElevations, hydrostatic, gradient);
  const assumed = assumedHeightReferenceWarning(toCoefficients(coefficients));
  return {
    model,
    hydrostatic: Array.from(hydrostatic),
    wet: Array.from(wet),
    gradient: Array.from(gradient),
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
  /** The request body as received (UTF-8 JSON, or an Arrow IPC stream where the route takes one), moved to the worker. */
  body: Uint8Array;
  bodyFormat?: 'json' | 'arrow';
  /** The answer's shape, where the route offers shapes (answer-shape.ts); default rows as JSON. */
  answer?: AnswerShape;
}

export interface BatchTaskOutput {
  /** The answer's bytes, UTF-8 JSON unless contentType says otherwise (moved, not copied, back to the event loop). */
  json: Uint8Array;
  contentType?: string;
  /** Items of the batch (directions, elevations or records), for the metrics. */
  observations: number;
}

const bodyText = (body: Uint8Array) => Buffer.from(body.buffer, body.byteOffset, body.byteLength).toString('utf8');

function parseJsonBody(body: Uint8Array): unknown {
  try {
    return JSON.parse(bodyText(body));
  } catch (err) {
    throw new FormatError('body', `not valid JSON (${err instanceof Error ? err.message : String(err)})`);
  }
}

/** Bytes → JSON → schema → answer → bytes; the caller's mistakes as data. */
function answerBatch<S extends z.ZodType>(
  schema: S,
  answer: (body: z.output<S>) => unknown,
  size: (body: z.output<S>) => number,
  input: BatchTaskInput,
): TaskOutcome<BatchTaskOutput> {
  try {
    if (input.bodyFormat === 'arrow') return fail(415, [{ field: 'body', message: 'this route takes application/json only' }]);
    const parsed = schema.safeParse(parseJsonBody(input.body));
    if (!parsed.success) return fail(400, issuesToFieldErrors(parsed.error.issues));
    const json = utf8Bytes(JSON.stringify(answer(parsed.data)));
    return { ok: true, output: { json, observations: size(parsed.data) } };
  } catch (err) {
    return asOutcome(err);
  }
}

/** POST /v1/slant-delays as a task: the request in any form, the answer in the shape asked for. */
export async function handleSlantDelaysRequest(input: BatchTaskInput): Promise<TaskOutcome<BatchTaskOutput>> {
  try {
    const raw = input.bodyFormat === 'arrow' ? slantArrowRequest(input.body) : parseJsonBody(input.body);
    const request = slantRequestOf(raw);
    if (!request.ok) return request.outcome;
    const { columns, rest } = slantDelaysAnswer(request.fields, request.rows);
    const shape = input.answer ?? { shape: 'rows', format: 'json', fields: undefined };
    const observations = columns.total_m!.length;
    if (shape.format === 'arrow') {
      return { ok: true, output: { json: arrowAnswer(columns, shape.fields, rest), observations, contentType: ARROW_STREAM_TYPE } };
    }
    const { zenith, geoid_undulation_m, ...others } = rest;
    const met = 'met_used' in others ? { met_used: others.met_used } : {};
    // The key order of the rows answer as before: zenith, met_used, slants, geoid, provenance, warnings.
    const answer = { zenith, ...met, slants: null as unknown, geoid_undulation_m, ...others };
    if (shape.shape === 'columns') {
      // The columns are written as bytes in one pass (json-columns.ts), the small rest by JSON.stringify, both
      // into pooled buffers (answer-shape.ts pooledBytes; the route hands the answer back once sent).
      const slants = columnsJsonBytes(jsonColumnsOf(columns, shape.fields, SLANT_FIELDS), pooledBytes);
      const json = jsonWithRawMembers(answer, { slants }, pooledBytes);
      releasePooledBytes(slants); // copied into the answer
      return { ok: true, output: { json, observations } };
    }
    answer.slants = slantEntries(columns, shape.fields ?? SLANT_FIELD_NAMES);
    return { ok: true, output: { json: utf8Bytes(JSON.stringify(answer)), observations } };
  } catch (err) {
    return asOutcome(err);
  }
}

/** POST /v1/mapping-factors as a task. */
export async function handleMappingFactorsRequest(input: BatchTaskInput): Promise<TaskOutcome<BatchTaskOutput>> {
  return answerBatch(mappingFactorsBody, mappingFactorsAnswer, (b) => b.elevations_deg.length, input);
}

/** POST /v1/precipitable-water as a task. */
export async function handlePrecipitableWaterRequest(input: BatchTaskInput): Promise<TaskOutcome<BatchTaskOutput>> {
  return answerBatch(precipitableWaterBody, precipitableWaterAnswer, (b) => b.records.length, input);
}
