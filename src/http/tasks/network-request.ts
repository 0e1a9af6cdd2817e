/**
 * The network-estimation requests as a compute task (run in a worker thread by src/workers): the
 * body bytes are parsed (JSON, or a CSV table with a station column plus stations and options from
 * the query, adapters/network-csv.ts), validated against the route's schema, turned into the domain
 * request (adapters/network-estimation.ts), estimated by src/services/network-estimation.ts, and the
 * answer is serialised here. For the storing route the stations' sites come from the archive
 * (`archiveSites`, read by the route) and every station's delay columns come back to be stored.
 */

import type { Site } from '../../domain/site.js';
import { FormatError } from '../../formats/format-error.js';
import { CallerError } from '../../services/caller-error.js';
import { networkDelayColumns, runNetworkEstimation } from '../../services/network-estimation.js';
import { checkStorableDelays, checkStorableZwd, type DelayColumns } from '../../services/zwd-estimation.js';
import type { TaskOutcome } from '../../workers/task-outcome.js';
import { readNetworkObservationCsv, stationsFromQuery } from '../adapters/network-csv.js';
import { networkEstimatesResponseOf, toNetworkRequest, type NetworkStationBody } from '../adapters/network-estimation.js';
import { detailOf, issuesToFieldErrors } from '../field-errors.js';
import {
  networkCsvQuerySchema,
  networkEstimatesRequest,
  networkStoredEstimatesRequest,
  networkStoredQuerySchema,
} from '../schemas/network-estimates.js';
import { optionsFromQuery } from '../schemas/zwd-estimates.js';
import { asOutcome, fail } from './task-errors.js';

export interface NetworkRequestTaskInput {
  /** The request body as received: JSON bytes or CSV text. */
  body: Uint8Array | string;
  format: 'json' | 'csv';
  /** Raw query parameters (stations and options of a CSV request). */
  query: Record<string, unknown>;
  /** The storing route: the archive's stations by id (their sites); a station not in it is a 404. */
  archiveSites?: Record<string, Site>;
}

export interface NetworkRequestTaskOutput {
  /** The answer as UTF-8 JSON; for the storing route without its closing brace (the route appends `stored`). */
  json: Uint8Array;
  observations: number;
  /** The storing route: every station's delay columns, in the request's station order. */
  delays?: { station: string; columns: DelayColumns }[];
  modelFingerprint?: string;
  models?: Record<string, string | number | boolean | null>;
}

const utf8 = (text: string): Uint8Array => new TextEncoder().encode(text);

const bodyText = (body: Uint8Array | string) =>
  typeof body === 'string' ? body : Buffer.from(body.buffer, body.byteOffset, body.byteLength).toString('utf8');

/** The body as the JSON-equivalent object: a CSV table plus stations and options from the query, or the parsed JSON. */
function rawBody(input: NetworkRequestTaskInput, text: string, storing: boolean): unknown {
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

/** POST /v1/network-estimates and POST /v1/network/zwd-estimates: parse, validate, estimate, serialise. */
export async function handleNetworkRequest(input: NetworkRequestTaskInput): Promise<TaskOutcome<NetworkRequestTaskOutput>> {
  try {
    const archive = input.archiveSites;
    const raw = rawBody(input, bodyText(input.body), archive !== undefined);
    let stations: NetworkStationBody[];
    let body;
    if (archive) {
      const parsed = networkStoredEstimatesRequest.safeParse(raw);
      if (!parsed.success) return fail(400, issuesToFieldErrors(parsed.error.issues));
      body = parsed.data;
      const missing = body.stations.findIndex((s) => archive[s.id] === undefined);
      if (missing >= 0) {
        const id = body.stations[missing]!.id;
        return fail(404, [
          { field: `stations.${missing}.id`, message: `no station "${id}" in the archive; create it with PUT /v1/stations/${id}` },
        ]);
      }
      stations = body.stations.map((s) => ({ ...s, site: archive[s.id]! }));
    } else {
      const parsed = networkEstimatesRequest.safeParse(raw);
      if (!parsed.success) return fail(400, issuesToFieldErrors(parsed.error.issues));
      body = parsed.data;
      stations = body.stations.map((s) => ({
        id: s.id,
        site: { latitudeDeg: s.site.latitude_deg, longitudeDeg: s.site.longitude_deg, heightM: s.site.height_m },
        apriori: s.apriori,
      }));
    }
    const result = runNetworkEstimation(toNetworkRequest(stations, body));
    const observations = body.observations.length;
    if (!archive) return { ok: true, output: { json: utf8(JSON.stringify(networkEstimatesResponseOf(result))), observations } };

    // Storing: every station's series must be one a direct deposit would accept, or nothing is stored;
    // each station's series is checked as the single-station storing route checks its one.
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
    const json = JSON.stringify(networkEstimatesResponseOf(result, storeWarnings));
    return {
      ok: true,
      output: { json: utf8(json.slice(0, -1)), observations, delays, modelFingerprint: result.modelFingerprint, models: result.models },
    };
  } catch (err) {
    return asOutcome(err);
  }
}
