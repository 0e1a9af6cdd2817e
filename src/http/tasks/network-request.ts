/**
 * The network-estimation requests as a compute task (run in a worker thread by src/workers): the
 * body bytes are parsed (JSON, an Arrow IPC table with the rest of the request in its metadata, or a
 * CSV table with a station column plus stations and options from the query, adapters/network-csv.ts);
 * observations as objects or as column arrays (src/http/columns.ts) are validated against the route's schema, turned into the domain
 * request (adapters/network-estimation.ts), estimated by src/services/network-estimation.ts, and the
 * answer is serialised here. For the storing route the stations' sites come from the archive
 * (`archiveSites`, read by the route) and every station's delay columns come back to be stored.
 */

import { DEG } from '../../domain/constants.js';
import { ModelDomainError } from '../../domain/errors.js';
import type { Site } from '../../domain/site.js';
import type { NetworkObservationColumns } from '../../estimation/network/types.js';
import { FormatError } from '../../formats/format-error.js';
import { decodeResidualDay } from '../../formats/residual-day-form.js';
import { readJsonColumnsBody, type JsonColumnsBody } from '../../formats/json-columns-reader.js';
import { MAX_OBSERVATIONS } from '../../limits.js';
import { CallerError } from '../../services/caller-error.js';
import {
  networkDelayColumns,
  runNetworkEstimation,
  type NetworkEstimationRequest,
  type NetworkSizeLimit,
} from '../../services/network-estimation.js';
import { checkStorableDelays, checkStorableZwd, type DelayColumns } from '../../services/zwd-estimation.js';
import type { MetColumns } from '../../services/station-met.js';
import type { TaskOutcome } from '../../workers/task-outcome.js';
import { readNetworkObservationCsv, stationsFromQuery } from '../adapters/network-csv.js';
import {
  networkEstimatesResponseOf,
  networkObservationsFromColumns,
  networkObservationsFromObjects,
  toNetworkRequest,
  type NetworkStationBody,
} from '../adapters/network-estimation.js';
import { domainNumbersOfRead, observationsFromJsonColumns } from '../adapters/zwd-estimation.js';
import { earliest, latest } from '../../services/answer-size.js';
import type { NetworkRequestRest, PreparedNetworkRequest } from './prepared-request.js';
import { readArrowRequest } from '../answer-shape.js';
import { columnSpecsOf, jsonColumnSpecsOf, readColumns } from '../columns.js';
import { detailOf, issuesToFieldErrors } from '../field-errors.js';
import {
  networkColumnarRest,
  networkCsvQuerySchema,
  networkObjectRows,
  networkObservationSchema,
  networkStoredColumnarRest,
  networkStoredObjectRows,
  networkStoredQuerySchema,
  type NetworkDayEstimatesRequest,
  type NetworkEstimatesRequest,
  type NetworkStoredEstimatesRequest,
} from '../schemas/network-estimates.js';
import { optionsFromQuery } from '../schemas/zwd-estimates.js';
import { epochRangeOf, epochTextsOf } from './epoch-range.js';
import { asOutcome, fail } from './task-errors.js';

export interface NetworkRequestTaskInput {
  /** The request body as received: JSON bytes, an Arrow IPC stream or CSV text. */
  body: Uint8Array | string;
  format: 'json' | 'csv' | 'arrow';
  /** Raw query parameters (stations and options of a CSV request). */
  query: Record<string, unknown>;
  /** The storing route: the archive's stations by id (their sites); a station not in it is a 404. */
  archiveSites?: Record<string, Site>;
  /**
   * The storing route: the stored met (at the antenna height) of the stations without met records in the
   * request, by station id; read by the route after scanNetworkRequest.
   */
  storedMet?: Record<string, MetColumns>;
  /**
   * The storing route: the body already parsed and checked by its scan (scanNetworkRequest); then `body`
   * is not read again.
   */
  prepared?: PreparedNetworkRequest | undefined;
  /** With `prepared`: the task's memory in the pool's budget [bytes] (that of the body it was parsed from). */
  memoryBytes?: number | undefined;
}

export interface NetworkRequestTaskOutput {
  /** The answer as UTF-8 JSON; for the storing route without its closing brace (the route appends `stored`). */
  json: Uint8Array;
  observations: number;
  /** The storing route: every station's delay columns, in the request's station order. */
  delays?: { station: string; columns: DelayColumns }[];
  modelFingerprint?: string;
  models?: Record<string, string | number | boolean | null>;
  /** The storing route: where each station's met came from, in the request's station order. */
  metUsed?: MetUsed[];
}

/** Where a station's met came from: the request's `met`, the station's stored met series, or neither. */
export type MetUsed = 'request' | 'archive' | 'none';

const utf8 = (text: string): Uint8Array => new TextEncoder().encode(text);

const bodyText = (body: Uint8Array | string) =>
  typeof body === 'string' ? body : Buffer.from(body.buffer, body.byteOffset, body.byteLength).toString('utf8');

/**
 * The body as the JSON-equivalent object: a CSV table plus stations and options from the query, the
 * parsed JSON, or an Arrow table plus its metadata.
 */
function rawBody(input: NetworkRequestTaskInput, storing: boolean): unknown {
  if (input.format === 'arrow') {
    // The observations are the table (station column included); the rest of the request is JSON in the schema metadata "request".
    const { columns, rest } = readArrowRequest(input.body as Uint8Array);
    return { ...(rest !== null && typeof rest === 'object' ? rest : {}), observations: columns };
  }
  const text = bodyText(input.body);
  if (input.format === 'json') {
    try {
      return JSON.parse(text);
    } catch (err) {
      throw new FormatError('body', `not valid JSON (${err instanceof Error ? err.message : String(err)})`);
    }
  }
  const parsed = (storing ? networkStoredQuerySchema : networkCsvQuerySchema).safeParse(input.query ?? {});
  if (!parsed.success) {
    const errors = issuesToFieldErrors(parsed.error.issues, 'query');
    throw new CallerError(400, detailOf(errors), errors);
  }
  const q = parsed.data as Record<string, unknown>;
  return {
    stations: stationsFromQuery(q.station as string | string[] | undefined, !storing),
    observations: readNetworkObservationCsv(text),
    options: {
      ...optionsFromQuery(q),
      satellite_clocks: q.satellite_clocks,
      reference_station: q.reference_station,
      common_mode_sigma_threshold_m: q.common_mode_sigma_threshold_m,
    },
  };
}

const OBSERVATION_COLUMNS = columnSpecsOf(networkObservationSchema.shape);
const OBSERVATION_JSON_COLUMNS = jsonColumnSpecsOf(OBSERVATION_COLUMNS);

const isColumnObject = (v: unknown) => v !== null && typeof v === 'object' && !Array.isArray(v);

type ValidatedBody = NetworkRequestRest;

type Validated =
  | { ok: true; body: ValidatedBody; observations: NetworkObservationColumns; columnar: boolean }
  | { ok: false; outcome: TaskOutcome<never> };

/** validatedInput's answer: the observations of a JSON body read in one pass still as the reader's columns. */
type ValidatedInput =
  | { ok: true; body: ValidatedBody; observations: NetworkObservationColumns | JsonColumnsBody; columnar: boolean }
  | { ok: false; outcome: TaskOutcome<never> };

const isReadColumns = (o: NetworkObservationColumns | JsonColumnsBody): o is JsonColumnsBody => 'rows' in o;

/** Columns read in one pass → the network's domain columns (the station column as names). The read must not be used after. */
function networkObservationsOfRead(read: JsonColumnsBody): NetworkObservationColumns {
  const stations = read.texts.station!;
  const station = new Array<string>(read.rows);
  for (let i = 0; i < read.rows; i++) station[i] = stations.distinct[stations.index[i]!]!;
  return { station, ...observationsFromJsonColumns(read) };
}

/** The distinct names of a text column and each row's index into them. */
function interned(column: readonly string[]): { index: Uint32Array; distinct: string[] } {
  const n = column.length;
  const index = new Uint32Array(n);
  const distinct: string[] = [];
  const seen = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    const name = column[i]!;
    let k = seen.get(name);
    if (k === undefined) seen.set(name, (k = distinct.push(name) - 1));
    index[i] = k;
  }
  return { index, distinct };
}

/**
 * A checked body as a prepared request (the scan's hand-over): columns read in one pass taken over as they
 * are (the reader's own typed arrays), domain columns (objects, Arrow, CSV) copied into typed arrays once.
 */
function preparedNetworkOf(v: Extract<ValidatedInput, { ok: true }>): PreparedNetworkRequest {
  const o = v.observations;
  if (isReadColumns(o)) {
    const stations = o.texts.station!;
    const satellites = o.texts.satellite!;
    return {
      body: v.body,
      columnar: v.columnar,
      stationIndex: stations.index,
      stations: stations.distinct,
      satelliteIndex: satellites.index,
      satellites: satellites.distinct,
      ...domainNumbersOfRead(o),
    };
  }
  const station = interned(o.station);
  const satellite = interned(o.satellite);
  const sigma = o.sigmaM;
  return {
    body: v.body,
    columnar: v.columnar,
    stationIndex: station.index,
    stations: station.distinct,
    epochMs: Float64Array.from(o.epochMs),
    satelliteIndex: satellite.index,
    satellites: satellite.distinct,
    elevationRad: Float64Array.from(o.elevationRad),
    azimuthRad: Float64Array.from(o.azimuthRad),
    residualM: Float64Array.from(o.residualM),
    sigmaM: sigma && Float64Array.from(sigma, (x) => x ?? NaN),
  };
}

/**
 * A prepared request's observations as the network's domain columns: the values validatedInput gives for the
 * same body (names per row, arrays of numbers, σ null where a row has none).
 */
function observationsOfPrepared(p: PreparedNetworkRequest): NetworkObservationColumns {
  const n = p.epochMs.length;
  const station = new Array<string>(n);
  const satellite = new Array<string>(n);
  for (let i = 0; i < n; i++) {
    station[i] = p.stations[p.stationIndex[i]!]!;
    satellite[i] = p.satellites[p.satelliteIndex[i]!]!;
  }
  const sigma = p.sigmaM;
  return {
    station,
    epochMs: Array.from(p.epochMs),
    satellite,
    elevationRad: Array.from(p.elevationRad),
    azimuthRad: Array.from(p.azimuthRad),
    residualM: Array.from(p.residualM),
    sigmaM: sigma && Array.from(sigma, (x) => (Number.isNaN(x) ? null : x)),
  };
}

/**
 * The body checked against the route's schema. Observations as objects go through zod with the rest;
 * observations as column arrays (JSON or Arrow) are checked by src/http/columns.ts with the same rules
 * and messages (fields name the column and the row), the rest by the schema without them.
 */
function validatedBody(raw: unknown, storing: boolean): Validated {
  const given = (raw ?? {}) as { observations?: unknown };
  const columnar = isColumnObject(given.observations);
  let observations: NetworkObservationColumns | undefined;
  if (columnar) {
    const read = readColumns(given.observations, 'observations', OBSERVATION_COLUMNS, MAX_OBSERVATIONS, 'observations');
    if (!read.ok) return { ok: false, outcome: fail(400, read.errors) };
    observations = networkObservationsFromColumns(read.columns);
  }
  const schema = storing
    ? columnar
      ? networkStoredColumnarRest
      : networkStoredObjectRows
    : columnar
      ? networkColumnarRest
      : networkObjectRows;
  const parsed = schema.safeParse(raw);
  if (!parsed.success) return { ok: false, outcome: fail(400, issuesToFieldErrors(parsed.error.issues)) };
  const { observations: objects, ...body } = parsed.data as NetworkEstimatesRequest;
  observations ??= networkObservationsFromObjects(objects);
  return { ok: true, body: body as ValidatedBody, observations, columnar };
}

/**
 * The body read and checked: a JSON body whose observations are valid column arrays in one pass from its
 * bytes (src/formats/json-columns-reader.ts, as the single-station routes read it; the rest of it through
 * the schema as before), anything else parsed and checked by validatedBody, with its errors.
 */
function validatedInput(input: NetworkRequestTaskInput, storing: boolean): ValidatedInput {
  const read =
    input.format === 'json' && typeof input.body !== 'string'
      ? readJsonColumnsBody(input.body, 'observations', OBSERVATION_JSON_COLUMNS, MAX_OBSERVATIONS)
      : undefined;
  if (!read) return validatedBody(rawBody(input, storing), storing);
  const parsed = (storing ? networkStoredColumnarRest : networkColumnarRest).safeParse(read.rest);
  if (!parsed.success) return { ok: false, outcome: fail(400, issuesToFieldErrors(parsed.error.issues)) };
  const { observations: _columns, ...body } = parsed.data as NetworkEstimatesRequest;
  return { ok: true, body: body as ValidatedBody, observations: read, columnar: true };
}

/** The body checked, its observations in domain columns: from the scan's prepared request when there is one. */
function validatedTaskInput(input: NetworkRequestTaskInput, storing: boolean): Validated {
  const p = input.prepared;
  if (p) return { ok: true, body: p.body, observations: observationsOfPrepared(p), columnar: p.columnar };
  const v = validatedInput(input, storing);
  if (!v.ok || !isReadColumns(v.observations)) return v as Validated;
  return { ...v, observations: networkObservationsOfRead(v.observations) };
}

/** An estimator's `observations.<row>.<field>` as the columnar form names it, `observations.<field>.<row>`. */
function asColumnField(err: unknown): unknown {
  if (!(err instanceof ModelDomainError) && !(err instanceof CallerError)) return err;
  const column = (field: string) => field.replace(/^observations\.(\d+)\.(\w+)$/, 'observations.$2.$1');
  if (err instanceof ModelDomainError) {
    const field = column(err.field);
    return field === err.field ? err : new ModelDomainError(field, err.message.replace(err.field, field), err.status);
  }
  const errors = err.errors.map((e) => ({ ...e, field: column(e.field) }));
  return errors.some((e, i) => e.field !== err.errors[i]!.field) ? new CallerError(err.status, detailOf(errors), errors) : err;
}

/** POST /v1/network-estimates and POST /v1/network/zwd-estimates: parse, validate, estimate, serialise. */
export async function handleNetworkRequest(input: NetworkRequestTaskInput): Promise<TaskOutcome<NetworkRequestTaskOutput>> {
  let columnar = false;
  try {
    const archive = input.archiveSites;
    const validated = validatedTaskInput(input, archive !== undefined);
    if (!validated.ok) return validated.outcome;
    const { body } = validated;
    columnar = validated.columnar;
    if (archive) {
      const stations = archiveStations(body.stations as NetworkStoredEstimatesRequest['stations'], archive);
      if (!Array.isArray(stations)) return stations;
      return storedEstimate(stations, body, validated.observations, input.storedMet ?? {});
    }
    const stations = (body.stations as NetworkEstimatesRequest['stations']).map((s) => ({
      id: s.id,
      site: { latitudeDeg: s.site.latitude_deg, longitudeDeg: s.site.longitude_deg, heightM: s.site.height_m },
      apriori: s.apriori,
    }));
    const result = runNetworkEstimation(toNetworkRequest(stations, body, validated.observations));
    const observations = validated.observations.epochMs.length;
    return { ok: true, output: { json: utf8(JSON.stringify(networkEstimatesResponseOf(result))), observations } };
  } catch (err) {
    return asOutcome(columnar ? asColumnField(err) : err);
  }
}

const storedMetCount = (stored: Record<string, MetColumns> | undefined, station: string) => stored?.[station]?.epochMs.length ?? 0;

/**
 * The storing route: the stored met of stations without met records in the request joins the request's
 * met (already at the antenna height, as request met is at the site); per station where its met came from.
 */
function withStoredMet(request: NetworkEstimationRequest, stations: NetworkStationBody[], stored: Record<string, MetColumns>): MetUsed[] {
  const inRequest = new Set(request.met?.station ?? []);
  const used = stations.map((s): MetUsed => (inRequest.has(s.id) ? 'request' : storedMetCount(stored, s.id) > 0 ? 'archive' : 'none'));
  if (!used.includes('archive')) return used;
  const met = request.met ?? { station: [], epochMs: [], pressureHpa: [], temperatureC: [] };
  const humidity = request.metRelativeHumidityPct ?? met.epochMs.map(() => null);
  stations.forEach((s, i) => {
    if (used[i] !== 'archive') return;
    const rows = stored[s.id]!;
    for (let k = 0; k < rows.epochMs.length; k++) {
      met.station.push(s.id);
      met.epochMs.push(rows.epochMs[k]!);
      met.pressureHpa.push(rows.pressureHpa[k]!);
      met.temperatureC.push(rows.temperatureC[k]!);
      humidity.push(null);
    }
  });
  request.met = met;
  request.metRelativeHumidityPct = humidity;
  return used;
}

export interface NetworkScanOutput {
  /** First and last observation epoch over all stations [ms]; null when none could be read (the estimation says why). */
  range: { firstMs: number; lastMs: number } | null;
  /** The station ids of the request (`stations[].id`, or the CSV query's `station=`), as far as they could be read. */
  stations: string[];
  /** The stations that have met records in the request. */
  metStations: string[];
  /** Observations counted by the scan (the compute-size metric). */
  observations: number;
  /** The body bytes, moved back for the estimation task (absent for a text body, or when `prepared`). */
  body?: Uint8Array;
  /** The body parsed and checked, for the estimation task (its typed columns moved, not copied); absent when the check failed. */
  prepared?: PreparedNetworkRequest;
}

const stringsOf = (values: unknown): string[] => (Array.isArray(values) ? values.filter((v): v is string => typeof v === 'string') : []);

/**
 * The first pass of the storing network route: the observations' epoch range, the request's stations and
 * which of them have met in the request, so that the route reads only those stations and the stored met of
 * the others only. A body that passes the estimation's own checks is parsed once: the scan answers from the
 * checked body and hands it on (`prepared`), and the estimation task does not read the bytes again. Anything
 * else is scanned roughly and left to the estimation task, which reads the bytes and says why (an unreadable
 * body scans as nothing).
 */
export async function scanNetworkRequest(input: NetworkRequestTaskInput): Promise<TaskOutcome<NetworkScanOutput>> {
  try {
    const validated = validatedInput(input, true);
    if (validated.ok) {
      const prepared = preparedNetworkOf(validated);
      const n = prepared.epochMs.length;
      const metStations = [...new Set((validated.body.met ?? []).map((r) => r.station))];
      return {
        ok: true,
        output: {
          range: n > 0 ? { firstMs: earliest(prepared.epochMs), lastMs: latest(prepared.epochMs) } : null,
          stations: validated.body.stations.map((s) => s.id),
          metStations,
          observations: n,
          // The typed columns own their buffers: the worker moves them to the event loop (compute-worker.ts).
          prepared,
        },
      };
    }
  } catch {
    // not readable: the estimation task reads it again and answers the error
  }
  const back = typeof input.body === 'string' ? {} : { body: input.body };
  let raw: { stations?: unknown; observations?: unknown; met?: unknown };
  try {
    raw = (rawBody(input, true) ?? {}) as typeof raw;
  } catch {
    return { ok: true, output: { range: null, stations: [], metStations: [], observations: 0, ...back } };
  }
  const listed = Array.isArray(raw.stations) ? raw.stations : [];
  const stations = stringsOf(listed.map((s) => (s !== null && typeof s === 'object' ? (s as { id?: unknown }).id : undefined)));
  const metStations = [
    ...new Set(
      stringsOf(
        Array.isArray(raw.met)
          ? raw.met.map((r) => (r !== null && typeof r === 'object' ? (r as { station?: unknown }).station : undefined))
          : [],
      ),
    ),
  ];
  const epochs = epochTextsOf(raw.observations);
  return { ok: true, output: { range: epochRangeOf(epochs), stations, metStations, observations: epochs.length, ...back } };
}

/** The listed stations with their archive sites, or the 404 naming the first that is not in the archive. */
function archiveStations(
  listed: NetworkStoredEstimatesRequest['stations'],
  archive: Record<string, Site>,
): NetworkStationBody[] | TaskOutcome<never> {
  const missing = listed.findIndex((s) => archive[s.id] === undefined);
  if (missing >= 0) {
    const id = listed[missing]!.id;
    return fail(404, [
      { field: `stations.${missing}.id`, message: `no station "${id}" in the archive; create it with PUT /v1/stations/${id}` },
    ]);
  }
  return listed.map((s) => ({ ...s, site: archive[s.id]! }));
}

/**
 * The storing routes' estimation: the stations' stored met where the request has none, the estimation,
 * and every station's series checked as the single-station storing route checks its one (a series a
 * direct deposit would refuse makes the whole request a 422: nothing is stored). The answer's JSON
 * comes without its closing brace: the route appends `stored`.
 */
function storedEstimate(
  stations: NetworkStationBody[],
  body: ValidatedBody,
  observations: NetworkObservationColumns,
  storedMet: Record<string, MetColumns>,
  sizeLimit?: NetworkSizeLimit,
): TaskOutcome<NetworkRequestTaskOutput> {
  const request = { ...toNetworkRequest(stations, body, observations), sizeLimit };
  const metUsed = withStoredMet(request, stations, storedMet);
  const result = runNetworkEstimation(request);
  const storeWarnings: string[] = [];
  const delays = result.output.stations.map((st, s) => {
    const columns = networkDelayColumns(result, s);
    try {
      checkStorableDelays(columns);
      storeWarnings.push(...checkStorableZwd(columns).map((w) => `station ${st.station}: ${w.text}`));
    } catch (err) {
      if (err instanceof CallerError)
        throw CallerError.field(422, `stations.${s}`, `station ${st.station}: ${err.errors[0]?.message ?? err.message}`);
      throw err;
    }
    return { station: st.station, columns };
  });
  result.output.stations.forEach((st, s) => {
    if (metUsed[s] === 'archive')
      storeWarnings.push(
        `station ${st.station}: met from ${storedMetCount(storedMet, st.station)} records of the station's stored met series`,
      );
  });
  const json = JSON.stringify(networkEstimatesResponseOf(result, storeWarnings));
  return {
    ok: true,
    output: {
      json: utf8(json.slice(0, -1)),
      observations: observations.epochMs.length,
      delays,
      modelFingerprint: result.modelFingerprint,
      models: result.models,
      metUsed,
    },
  };
}

export interface NetworkDayTaskInput {
  /** The UTC day, YYYY-MM-DD. */
  day: string;
  /** The request body, checked by the route against networkDayEstimatesRequest. */
  body: NetworkDayEstimatesRequest;
  /** The stations' residual deposits of the day in their stored form, in the order of body.stations. */
  residuals: Uint8Array[];
  archiveSites: Record<string, Site>;
  storedMet: Record<string, MetColumns>;
  /** Largest stations × observations (the replica's setting). */
  maxStationObservations: number;
  /** The task's memory in the pool's budget [bytes] (stations × observations × NETWORK_DAY_MEMORY_PER_STATION_OBSERVATION). */
  memoryBytes: number;
}

/** The day's deposits of the stations as the network's observation columns (station order, then each deposit's order). */
export function depositedObservations(
  day: string,
  stations: readonly string[],
  residuals: readonly Uint8Array[],
): NetworkObservationColumns {
  const days = residuals.map((bytes) => decodeResidualDay(day, bytes));
  const n = days.reduce((sum, d) => sum + d.epochMs.length, 0);
  const columns: NetworkObservationColumns = {
    station: new Array<string>(n),
    epochMs: new Array<number>(n),
    satellite: new Array<string>(n),
    elevationRad: new Array<number>(n),
    azimuthRad: new Array<number>(n),
    residualM: new Array<number>(n),
  };
  const sigmas = days.some((d) => d.sigmaM !== undefined) ? new Array<number | null>(n).fill(null) : undefined;
  let i = 0;
  days.forEach((d, s) => {
    for (let k = 0; k < d.epochMs.length; k++, i++) {
      columns.station[i] = stations[s]!;
      columns.epochMs[i] = d.epochMs[k]!;
      columns.satellite[i] = d.satellite[k]!;
      columns.elevationRad[i] = d.elevationDeg[k]! * DEG;
      columns.azimuthRad[i] = d.azimuthDeg[k]! * DEG;
      columns.residualM[i] = d.residualM[k]!;
      if (sigmas && d.sigmaM) sigmas[i] = d.sigmaM[k] ?? null;
    }
  });
  if (sigmas) columns.sigmaM = sigmas;
  return columns;
}

/** POST /v1/network/days/{day}/zwd-estimates: the stations' deposits of the day estimated jointly; the rows to store. */
export async function handleNetworkDayRequest(input: NetworkDayTaskInput): Promise<TaskOutcome<NetworkRequestTaskOutput>> {
  try {
    const stations = archiveStations(input.body.stations, input.archiveSites);
    if (!Array.isArray(stations)) return stations;
    const observations = depositedObservations(
      input.day,
      stations.map((s) => s.id),
      input.residuals,
    );
    return storedEstimate(stations, input.body, observations, input.storedMet, {
      stationObservations: input.maxStationObservations,
      field: 'stations',
      name: 'TROPODELAY_NETWORK_DAY_MAX_STATION_OBSERVATIONS',
      advice:
        'Estimate fewer stations together (a subnetwork with a few distant stations keeps the absolute level) or raise the setting where the replica has the memory',
    });
  } catch (err) {
    return asOutcome(err);
  }
}
