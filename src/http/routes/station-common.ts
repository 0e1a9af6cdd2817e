/**
 * Pieces the station routes share: the station or a 404, the station's JSON shape, CSV replies,
 * and a body validator that checks only the envelope of a series upload (its records are checked
 * one by one by the route, so one bad record does not refuse the others).
 */

import type { FastifyReply, FastifySchemaCompiler } from 'fastify';
import { validatorCompiler } from 'fastify-type-provider-zod';
import type { z } from 'zod';
import { siteHeights } from '../../domain/geometry/geoid.js';
import { csvCell } from '../../formats/met-csv.js';
import { OUTPUT_DECIMALS, roundTo } from '../../formats/output-precision.js';
import type { Repository, Station } from '../../storage/repository.js';
import { OffloadedJsonBody } from '../json-upload-body.js';
import { HttpProblem } from '../problem.js';

export interface StationRouteOptions {
  /** Longest from..to of one read [days]. */
  maxReadRangeDays: number;
}

export async function requireStation(repository: Repository, stationId: string): Promise<Station> {
  const station = await repository.getStation(stationId);
  if (!station) {
    throw new HttpProblem(404, `no station "${stationId}"; create it with PUT /v1/stations/${stationId}`, [
      { field: 'params.station_id', message: 'no such station' },
    ]);
  }
  return station;
}

/**
 * Where a station is, as every station output gives it: the stored coordinates and ellipsoidal
 * height, the EGM96 geoid undulation N there and the altitude above mean sea level H = h − N
 * (src/domain/geometry/geoid.ts; rounded to 1 cm, the grid's accuracy). The one place that adds
 * columns to a station's place: GET /v1/stations, the station reads and the network answers use it.
 */
export function stationPlaceFields(s: Pick<Station, 'latitudeDeg' | 'longitudeDeg' | 'heightM'>) {
  const heights = siteHeights(s.latitudeDeg, s.longitudeDeg, s.heightM);
  return {
    latitude_deg: s.latitudeDeg,
    longitude_deg: s.longitudeDeg,
    height_m: s.heightM,
    geoid_undulation_m: roundTo(heights.geoidUndulationM, OUTPUT_DECIMALS.geoidM)!,
    altitude_m: roundTo(heights.aboveSeaLevelM, OUTPUT_DECIMALS.geoidM)!,
  };
}

export function stationJson(s: Station) {
  const base = `/v1/stations/${encodeURIComponent(s.stationId)}`;
  return {
    station_id: s.stationId,
    name: s.name,
    ...stationPlaceFields(s),
    met_height_m: s.metHeightM,
    description: s.description,
    created_at: s.createdAt,
    updated_at: s.updatedAt,
    links: { met: `${base}/met`, delays: `${base}/delays`, precipitable_water: `${base}/precipitable-water` },
  };
}

/** ISO epochs are written by src/formats/iso-epoch.ts; re-exported for the station routes. */
export { isoEpoch } from '../../formats/iso-epoch.js';

/** A CSV reply: one header row with the field names, then one line per row (`line` joins the cells with csvCell). */
export function sendCsv<T>(
  reply: FastifyReply,
  columns: readonly string[],
  rows: readonly T[],
  line: (row: T) => string,
  headers: Record<string, string> = {},
): FastifyReply {
  const lines = new Array<string>(rows.length + 2);
  lines[0] = columns.join(',');
  for (let i = 0; i < rows.length; i++) lines[i + 1] = line(rows[i]!);
  lines[rows.length + 1] = '';
  for (const [k, v] of Object.entries(headers)) reply.header(k, v);
  return reply.type('text/csv; charset=utf-8').send(lines.join('\n'));
}

/** CSV cells of a record whose keys are the columns (text cells quoted when they need it; null empty). */
export const recordLine =
  (columns: readonly string[]) =>
  (r: Record<string, string | number | boolean | null>): string =>
    columns.map((c) => (typeof r[c] === 'string' ? csvCell(r[c]) : r[c])).join(',');

/**
 * Route validator: the body is checked against `envelope` (a text body — CSV, RINEX — passes as
 * is); params and query against their own schemas. The route's documented body schema still
 * describes each record in the OpenAPI document.
 */
// fastify types a route's validatorCompiler with the whole route schema; each call gets one part's zod schema.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function envelopeValidator(envelope: z.ZodType): FastifySchemaCompiler<any> {
  return (route: { schema: z.ZodType; method: string; url: string; httpPart?: string }) => {
    if (route.httpPart === 'body') {
      const validate = validatorCompiler({ ...(route as Parameters<typeof validatorCompiler>[0]), schema: envelope });
      // Text (CSV, RINEX) and a large JSON body kept as bytes pass: they are checked where they are read.
      return (data: unknown) => (typeof data === 'string' || data instanceof OffloadedJsonBody ? { value: data } : validate(data));
    }
    return validatorCompiler(route as Parameters<typeof validatorCompiler>[0]);
  };
}
