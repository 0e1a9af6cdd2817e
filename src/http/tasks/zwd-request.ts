/**
 * The ZWD-estimation requests as compute tasks (run in a worker thread by src/workers): the body
 * bytes are parsed (JSON, or CSV by src/formats/observation-csv.ts with the options from the query),
 * validated against the route's schema, turned into the domain request (adapters), estimated by
 * src/services/zwd-estimation.ts, and the answer is serialised here. What comes back to the event
 * loop is only what the route sends (the JSON text) and, for a station, the delay columns it stores.
 *
 * This module is the HTTP edge running off the loop: it uses the zod schemas of src/http, which the
 * inner layers never import. src/http/compute-tasks.ts registers it with the pool.
 */

import diagnostics_channel from 'node:diagnostics_channel';
import type { Site } from '../../domain/site.js';
import { FormatError } from '../../formats/format-error.js';
import { readObservationCsv } from '../../formats/observation-csv.js';
import { earliest, latest } from '../../services/answer-size.js';
import { CallerError } from '../../services/caller-error.js';
import type { MetColumns } from '../../services/station-met.js';
import { checkStorableDelays, checkStorableZwd, delayColumns, runZwdEstimation, type DelayColumns } from '../../services/zwd-estimation.js';
import type { TaskOutcome } from '../../workers/task-outcome.js';
import { satelliteName, typedObservationColumns } from '../../estimation/design.js';
import type { ObservationColumns, TypedObservationColumns } from '../../estimation/types.js';
import { MAX_OBSERVATIONS } from '../../limits.js';
import { readJsonColumnsBody, type JsonColumnsBody } from '../../formats/json-columns-reader.js';
import {
  checkedObservationColumns,
  domainNumbersOfRead,
  observationsFromColumns,
  observationsFromObjects,
  toZwdRequest,
  typedObservationsFromJsonColumns,
  zwdEstimatesResponseOf,
} from '../adapters/zwd-estimation.js';
import { zwdEstimatesAnswer } from '../adapters/zwd-estimates-answer.js';
import { zwdEstimatesArrowAnswer } from '../adapters/zwd-estimates-arrow.js';
import { readArrowRequest, type AnswerShape } from '../answer-shape.js';
import { tableAnswer } from '../table-answer.js';
import { columnSpecsOf, jsonColumnSpecsOf, readColumns, type ColumnSpec } from '../columns.js';
import { detailOf, issuesToFieldErrors } from '../field-errors.js';
import { stationZwdEstimatesQuery } from '../schemas/station-zwd-estimates.js';
import { epochRangeOf, epochTextsOf } from './epoch-range.js';
import { asOutcome, fail } from './task-errors.js';
import type { PreparedRequest } from './prepared-request.js';
import {
  optionsFromQuery,
  zwdCsvQuerySchema,
  zwdEstimatesColumnarRest,
  zwdEstimatesObjectRows,
  zwdEstimationColumnarRest,
  zwdEstimationObjectRows,
  zwdObservationSchema,
  ZWD_ANSWER_TABLES,
  type ZwdEstimationBody,
} from '../schemas/zwd-estimates.js';

export type { PreparedRequest } from './prepared-request.js';

export interface ZwdRequestTaskInput {
  /** The request body as received: JSON bytes, an Arrow IPC stream or CSV text. */
  body: Uint8Array | string;
  format: 'json' | 'csv' | 'arrow';
  /** Raw query parameters (options of a CSV request). */
  query: Record<string, unknown>;
  /** The answer's shape (answer-shape.ts: rows, columns, Arrow; `fields`); absent = rows as JSON. */
  answer?: AnswerShape | undefined;
  /** The query parameter names as sent (raw-body.ts sentQueryKeys); absent = those of `query`. */
  queryKeys?: string[] | undefined;
  /**
   * The body already parsed and checked by the scan of a station's estimation (scanZwdRequest): then
   * `body` is not read again.
   */
  prepared?: PreparedRequest | undefined;
  /**
   * The body's share of the pool's memory budget [bytes] when `body` is empty because `prepared` carries it
   * (taskMemoryBytes of the body as received, src/http/plugins/compute-pool.ts): the prepared columns take
   * what the body took, and without it the task would count as 0 bytes.
   */
  memoryBytes?: number | undefined;
  /** A station's estimation: the site is the station's (then `site` in the body is refused). */
  station?: {
    site: Site;
    /** The station's stored met at the antenna height, used when the body has no met. */
    storedMet?: MetColumns | undefined;
    /** Warnings the route adds (e.g. a bounded met read). */
    warnings?: string[] | undefined;
  };
}

export interface ZwdRequestTaskOutput {
  /**
   * The answer as UTF-8 JSON or Arrow (moved, not copied, to the event loop). For a station: JSON without
   * its closing brace, so the route appends `stored`; with an Arrow shape the whole answer as rows JSON,
   * which the route shapes (table-answer.ts) with `stored` added.
   */
  json: Uint8Array;
  /** The answer's media type when it is not JSON (an Arrow IPC stream). */
  contentType?: string;
  /** Observations sent, for the metrics. */
  observations: number;
  /** A station's estimation: what to store. */
  delays?: DelayColumns;
  modelFingerprint?: string;
  models?: Record<string, string | number | boolean | null>;
}

const ROWS: AnswerShape = { shape: 'rows', format: 'json', fields: undefined };

const utf8 = (text: string): Uint8Array => new TextEncoder().encode(text);

const bodyText = (body: Uint8Array | string) =>
  typeof body === 'string' ? body : Buffer.from(body.buffer, body.byteOffset, body.byteLength).toString('utf8');

/** Query parameters of every body type: the stored series (`source`) and the answer's shape. */
const ANSWER_QUERY_KEYS = new Set(['source', 'shape', 'fields']);

/**
 * The site, a-priori and option query parameters belong to text/csv bodies; with a JSON body they
 * would be ignored while the body's (or the default) values are used, so they are a 400 naming each
 * (`source`, the stored series of a station's estimation, applies to both).
 */
function refuseCsvQueryWithJson(queryKeys: readonly string[]): void {
  const ignored = queryKeys.filter((k) => !ANSWER_QUERY_KEYS.has(k));
  if (ignored.length === 0) return;
  const errors = ignored.map((k) => ({
    field: `query.${k}`,
    message: 'a query parameter of text/csv bodies; with a JSON body give it in the body (site, apriori, options)',
  }));
  throw new CallerError(400, detailOf(errors), errors);
}

/** The body as the JSON-equivalent object: a CSV table plus query options, or the parsed JSON. */
function rawBody(input: ZwdRequestTaskInput, siteKnown: boolean): unknown {
  if (input.format === 'arrow') {
    // The observations are the table; the rest of the request is JSON in the schema metadata "request".
    // Number columns without nulls come as Float64Arrays (no array of boxed values per column).
    const { columns, rest } = readArrowRequest(input.body as Uint8Array, true);
    return { ...(rest !== null && typeof rest === 'object' ? rest : {}), observations: columns };
  }
  const text = bodyText(input.body);
  if (input.format === 'json') {
    refuseCsvQueryWithJson(input.queryKeys ?? Object.keys(input.query ?? {}));
    try {
      return JSON.parse(text);
    } catch (err) {
      throw new FormatError('body', `not valid JSON (${err instanceof Error ? err.message : String(err)})`);
    }
  }
  // A station's site is the stored one: site parameters are unknown keys there, not silently ignored.
  const parsed = (siteKnown ? stationZwdEstimatesQuery : zwdCsvQuerySchema).safeParse(input.query ?? {});
  if (!parsed.success) {
    const errors = issuesToFieldErrors(parsed.error.issues, 'query');
    throw new CallerError(400, detailOf(errors), errors);
  }
  const q = parsed.data as Record<string, unknown>;
  const missingSite = siteKnown ? [] : (['latitude_deg', 'longitude_deg', 'height_m'] as const).filter((k) => q[k] === undefined);
  if (missingSite.length) {
    const errors = missingSite.map((k) => ({ field: `query.${k}`, message: 'required with a text/csv body (the site)' }));
    throw new CallerError(400, `${errors[0]!.field}: ${errors[0]!.message}`, errors);
  }
  const apriori = Object.fromEntries(Object.entries({ zhd_m: q.apriori_zhd_m, zwd_m: q.apriori_zwd_m }).filter(([, v]) => v !== undefined));
  return {
    ...(siteKnown ? {} : { site: { latitude_deg: q.latitude_deg, longitude_deg: q.longitude_deg, height_m: q.height_m } }),
    observations: readObservationCsv(text),
    ...(Object.keys(apriori).length ? { apriori } : {}),
    options: optionsFromQuery(q),
  };
}

const OBSERVATION_COLUMNS = columnSpecsOf(zwdObservationSchema.shape) as Record<keyof typeof zwdObservationSchema.shape, ColumnSpec>;
const OBSERVATION_JSON_COLUMNS = jsonColumnSpecsOf(OBSERVATION_COLUMNS);

const isColumnObject = (v: unknown) => v !== null && typeof v === 'object' && !Array.isArray(v);

/**
 * A JSON body whose observations are valid column arrays, read in one pass from its bytes
 * (src/formats/json-columns-reader.ts: no text of the body, no parsed arrays); undefined for anything
 * else, which rawBody and validatedBody then read as before, with their errors.
 */
function readColumnsBody(input: Pick<ZwdRequestTaskInput, 'body' | 'format' | 'query' | 'queryKeys'>): JsonColumnsBody | undefined {
  if (input.format !== 'json' || typeof input.body === 'string') return undefined;
  refuseCsvQueryWithJson(input.queryKeys ?? Object.keys(input.query ?? {}));
  return readJsonColumnsBody(input.body, 'observations', OBSERVATION_JSON_COLUMNS, MAX_OBSERVATIONS);
}

type Validated =
  | {
      ok: true;
      body: Omit<ZwdEstimationBody, 'observations'>;
      /** The observations as domain columns, or (read in one pass) as the reader's columns. */
      observations: ObservationColumns | JsonColumnsBody;
      site?: Site;
    }
  | { ok: false; outcome: TaskOutcome<never> };

const isReadColumns = (o: ObservationColumns | JsonColumnsBody): o is JsonColumnsBody => 'rows' in o;

/**
 * The validated body with its observations as the estimator's typed columns: those read in one pass taken over,
 * the others (Arrow, objects, CSV, JSON the reader left to JSON.parse) copied once here, so that their arrays are
 * garbage before the estimation instead of held beside the estimator's own copy (+33 MB at 30 days).
 */
const inDomainColumns = (v: Validated): Validated =>
  v.ok
    ? {
        ...v,
        observations: isReadColumns(v.observations)
          ? typedObservationsFromJsonColumns(v.observations)
          : typedObservationColumns(v.observations),
      }
    : v;

function preparedOf(body: Omit<ZwdEstimationBody, 'observations'>, o: ObservationColumns): PreparedRequest {
  const n = o.epochMs.length;
  const index = new Map<string, number>();
  const satellites: string[] = [];
  const satelliteIndex = new Uint32Array(n);
  for (let i = 0; i < n; i++) {
    const name = satelliteName(o.satellite, i);
    let k = index.get(name);
    if (k === undefined) index.set(name, (k = satellites.push(name) - 1));
    satelliteIndex[i] = k;
  }
  const sigma = o.sigmaM;
  return {
    body,
    epochMs: Float64Array.from(o.epochMs),
    satelliteIndex,
    satellites,
    elevationRad: Float64Array.from(o.elevationRad),
    azimuthRad: Float64Array.from(o.azimuthRad),
    residualM: Float64Array.from(o.residualM),
    sigmaM: sigma && Float64Array.from(sigma, (v) => v ?? NaN),
  };
}

/** Columns read in one pass → a prepared request, in the reader's own typed arrays (domainNumbersOfRead). */
function preparedOfRead(body: Omit<ZwdEstimationBody, 'observations'>, read: JsonColumnsBody): PreparedRequest {
  const satellites = read.texts.satellite!;
  return { body, ...domainNumbersOfRead(read), satelliteIndex: satellites.index, satellites: satellites.distinct };
}

/** A prepared request's columns as the estimator's typed columns: its own arrays, taken over (no copy). */
function observationsOfPrepared(p: PreparedRequest): TypedObservationColumns {
  return {
    epochMs: p.epochMs,
    satellite: { index: p.satelliteIndex, names: p.satellites },
    elevationRad: p.elevationRad,
    azimuthRad: p.azimuthRad,
    residualM: p.residualM,
    sigmaM: p.sigmaM,
  };
}

const restSchemaOf = (siteKnown: boolean) => (siteKnown ? zwdEstimationColumnarRest : zwdEstimatesColumnarRest);

/** The validated rest of a body (schema parsed), and the site it names. */
function validatedRest(
  parsed: { success: true; data: unknown } | { success: false; error: { issues: Parameters<typeof issuesToFieldErrors>[0] } },
): { ok: true; body: Omit<ZwdEstimationBody, 'observations'>; objects: unknown; site?: Site } | { ok: false; outcome: TaskOutcome<never> } {
  if (!parsed.success) return { ok: false, outcome: fail(400, issuesToFieldErrors(parsed.error.issues)) };
  const {
    site: s,
    observations: objects,
    ...body
  } = parsed.data as ZwdEstimationBody & { site?: { latitude_deg: number; longitude_deg: number; height_m: number } };
  const site = s ? { latitudeDeg: s.latitude_deg, longitudeDeg: s.longitude_deg, heightM: s.height_m } : undefined;
  return { ok: true, body, objects, ...(site ? { site } : {}) };
}

/**
 * The body checked against the route's schema. Observations as objects go through zod with the rest;
 * observations as column arrays (JSON or Arrow) are checked by src/http/columns.ts, one loop per column
 * with the same rules and messages, and the rest by the schema without them (issue 14: per-observation
 * zod objects were most of a large request's cost).
 */
function validatedBody(raw: unknown, siteKnown: boolean): Validated {
  const given = (raw ?? {}) as { observations?: unknown };
  const columnar = isColumnObject(given.observations);
  let observations: ObservationColumns | undefined;
  if (columnar) observations = checkedObservationColumns(given.observations, OBSERVATION_COLUMNS, MAX_OBSERVATIONS);
  if (columnar && !observations) {
    // Something is off: the full check names the column and the row.
    const read = readColumns(given.observations, 'observations', OBSERVATION_COLUMNS, MAX_OBSERVATIONS, 'observations');
    if (!read.ok) return { ok: false, outcome: fail(400, read.errors) };
    observations = observationsFromColumns(read.columns);
  }
  const schema = columnar ? restSchemaOf(siteKnown) : siteKnown ? zwdEstimationObjectRows : zwdEstimatesObjectRows;
  const rest = validatedRest(schema.safeParse(raw));
  if (!rest.ok) return rest;
  observations ??= observationsFromObjects(rest.objects as Parameters<typeof observationsFromObjects>[0]);
  return { ok: true, body: rest.body, observations, ...(rest.site ? { site: rest.site } : {}) };
}

/**
 * The body read and checked: in one pass from its bytes when it is JSON with valid observation columns
 * (the rest of it through the schema as before), else parsed and checked as before (validatedBody).
 */
function validatedInput(input: ZwdRequestTaskInput, siteKnown: boolean): Validated {
  const read = readColumnsBody(input);
  if (!read) return validatedBody(rawBody(input, siteKnown), siteKnown);
  const rest = validatedRest(restSchemaOf(siteKnown).safeParse(read.rest));
  if (!rest.ok) return rest;
  return { ok: true, body: rest.body, observations: read, ...(rest.site ? { site: rest.site } : {}) };
}

/**
 * Published (node:diagnostics_channel) just before the estimation starts, with the observation count:
 * bench/service-memory.child.ts measures there what the task still holds (heap and array buffers after
 * a full GC). No subscriber, no cost.
 */
export const zwdEstimationStart = diagnostics_channel.channel('tropodelay:zwd-request:estimation-start');

/**
 * POST /v1/zwd-estimates and POST /v1/stations/{id}/zwd-estimates: parse, validate, estimate, serialise.
 * The caller's input is left as it is (in-process callers may send it again); the pool runs
 * zwdRequestTask, which owns its input.
 */
export async function handleZwdRequest(input: ZwdRequestTaskInput): Promise<TaskOutcome<ZwdRequestTaskOutput>> {
  return zwdRequestTask({ ...input });
}

/**
 * handleZwdRequest as the worker pool runs it (src/http/compute-tasks.ts): the input is the task's own
 * (moved to the thread), so the body bytes and a prepared body's typed columns are dropped from it once
 * read, and with them the text and the parsed JSON become garbage before the estimation (issue 14: the
 * 30-day body's 73 MB of bytes were otherwise held through the estimation's peak).
 */
export async function zwdRequestTask(input: ZwdRequestTaskInput): Promise<TaskOutcome<ZwdRequestTaskOutput>> {
  try {
    const station = input.station;
    // Domain columns at once: the reader's typed columns are not held through the estimation.
    const validated: Validated = input.prepared
      ? { ok: true, body: input.prepared.body, observations: observationsOfPrepared(input.prepared) }
      : inDomainColumns(validatedInput(input, station !== undefined));
    input.body = '';
    input.prepared = undefined;
    if (!validated.ok) return validated.outcome;
    const { body } = validated;
    const observations = validated.observations as ObservationColumns;
    const site = station?.site ?? validated.site!;
    const request = toZwdRequest(site, body, observations, station?.storedMet);
    const count = observations.epochMs.length;
    if (zwdEstimationStart.hasSubscribers) zwdEstimationStart.publish({ observations: count });
    const result = runZwdEstimation(request);
    const shape = input.answer ?? ROWS;
    if (!station) {
      const shaped = shape.format === 'arrow' ? zwdEstimatesArrowAnswer(result, shape) : zwdEstimatesAnswer(result, shape);
      return { ok: true, output: { json: shaped.bytes, contentType: shaped.contentType, observations: count } };
    }

    const metUsed = body.met !== undefined ? 'request' : request.met ? 'archive' : 'none';
    const metWarnings = [
      ...(station.warnings ?? []),
      ...(metUsed === 'archive' ? [`met: ${request.met!.epochMs.length} records of the station's stored met series`] : []),
      ...(metUsed === 'none'
        ? ['met: neither in the request nor stored for this station around the observations; no ZHD or PWV per epoch']
        : []),
    ];
    const delays = delayColumns(result);
    checkStorableDelays(delays);
    metWarnings.push(...checkStorableZwd(delays).map((w) => w.text));
    const answer = { ...zwdEstimatesResponseOf(result, metWarnings), met_used: metUsed };
    // Arrow: the route shapes the answer once it knows what was stored (the table and the rest travel as they are).
    const json = shape.format === 'arrow' ? utf8(JSON.stringify(answer)) : tableAnswer(answer, ZWD_ANSWER_TABLES, shape).bytes;
    return {
      ok: true,
      output: {
        json: shape.format === 'arrow' ? json : json.subarray(0, json.length - 1),
        observations: count,
        delays,
        modelFingerprint: result.modelFingerprint,
        models: result.models,
      },
    };
  } catch (err) {
    return asOutcome(err);
  }
}

export interface EpochRangeOutput {
  /** First and last observation epoch [ms]; null when none could be read (the estimation task then reports why). */
  range: { firstMs: number; lastMs: number } | null;
  /** The body carries its own met (JSON `met`). */
  hasMet: boolean;
  observations: number;
  /** The body bytes, moved back for the estimation task (absent for a text body, or when `prepared`). */
  body?: Uint8Array;
  /** The body parsed and checked, for the estimation task (its typed columns moved, not copied); absent when the check failed. */
  prepared?: PreparedRequest;
}

/**
 * The first pass of a station's estimation: the observation epoch range (from the `epoch` field or
 * column, wherever it is) and whether the body has met, so that the route reads only the stored met
 * it needs. Errors are left to the estimation task.
 */
const bytesBack = (body: Uint8Array | string) => (typeof body === 'string' ? {} : { body });

export async function scanZwdRequest(
  input: Pick<ZwdRequestTaskInput, 'body' | 'format'> & Partial<Pick<ZwdRequestTaskInput, 'query' | 'queryKeys'>>,
): Promise<TaskOutcome<EpochRangeOutput>> {
  // A body that passes the estimation's own checks is parsed once: the range from its checked epochs, and
  // the parsed body handed on. Anything else is left to the estimation task, which reads the bytes and says why.
  if (input.query !== undefined) {
    try {
      const validated = validatedInput({ ...input, query: input.query }, true);
      if (validated.ok) {
        const o = validated.observations;
        const prepared = isReadColumns(o) ? preparedOfRead(validated.body, o) : preparedOf(validated.body, o);
        const epochMs = prepared.epochMs;
        const firstMs = earliest(epochMs);
        const lastMs = latest(epochMs);
        // The typed columns own their buffers: the worker moves them to the event loop (compute-worker.ts).
        return {
          ok: true,
          output: { range: { firstMs, lastMs }, hasMet: validated.body.met !== undefined, observations: epochMs.length, prepared },
        };
      }
    } catch {
      // not readable: the estimation task reads it again and answers the error
    }
  }
  let epochs: unknown[] = [];
  let hasMet = false;
  try {
    if (input.format === 'arrow') {
      const { columns, rest } = readArrowRequest(input.body as Uint8Array);
      epochs = columns.epoch ?? [];
      hasMet = rest !== null && typeof rest === 'object' && (rest as { met?: unknown }).met !== undefined;
    } else if (input.format === 'csv') {
      epochs = readObservationCsv(bodyText(input.body)).map((r) => r.epoch);
    } else {
      const text = bodyText(input.body);
      const parsed = JSON.parse(text) as { observations?: unknown; met?: unknown } | null;
      hasMet = parsed !== null && typeof parsed === 'object' && parsed.met !== undefined;
      if (parsed) epochs = epochTextsOf(parsed.observations);
    }
  } catch {
    return { ok: true, output: { range: null, hasMet, observations: 0, ...bytesBack(input.body) } };
  }
  return { ok: true, output: { range: epochRangeOf(epochs), hasMet, observations: epochs.length, ...bytesBack(input.body) } };
}
