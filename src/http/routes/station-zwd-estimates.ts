/**
 * POST /v1/stations/{station_id}/zwd-estimates: the ZWD estimation of /v1/zwd-estimates for a
 * station. The station's coordinates are the site; its stored met series serves as `met` unless the
 * request carries its own; the result is stored as the station's delay series (ZTD, ZWD, gradients
 * and their sigmas) under the result's fingerprint, and returned.
 *
 * Like /v1/zwd-estimates, the body stays bytes on the event loop and is parsed, validated and
 * estimated in the worker pool (services/zwd-request.ts, with `site`, `defaultMet` and `keepResult`).
 * To pick the stored met before that, the event loop only scans the body for its first and last
 * epoch (scanEpochRange).
 */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { validatorCompiler } from 'fastify-type-provider-zod';
import { reducePressureHpa, reduceTemperatureC } from '../../domain/meteo/height-reduction.js';
import type { DelayRow, MetRow, Station } from '../../storage/repository.js';
import { HttpProblem } from '../problem.js';
import { problemSchema } from '../schemas/common.js';
import { DEFAULT_ESTIMATE_SOURCE, stationZwdEstimatesQuery, stationZwdEstimatesResponse } from '../schemas/station-zwd-estimates.js';
import { stationParams } from '../schemas/stations.js';
import { MAX_OBSERVATIONS, ZWD_BODY_LIMIT_BYTES, zwdEstimationBody } from '../schemas/zwd-estimates.js';
import { requireStation, type StationRouteOptions } from './station-common.js';

/** Stored met is read this far around the observations: the largest options.met_max_gap_s allowed [ms]. */
const MET_WINDOW_MS = 86_400_000;

/**
 * Stored met rows → the estimation's met records at the antenna height: rows with both pressure and
 * temperature, one per epoch (the first source in name order), reduced from met_height_m.
 */
export function archiveMet(station: Station, rows: readonly MetRow[]) {
  const dHeightM = station.metHeightM === null ? 0 : station.heightM - station.metHeightM;
  const out: { epoch: string; pressure_hpa: number; temperature_c: number }[] = [];
  let lastEpochMs = Number.NaN;
  for (const r of rows) {
    if (r.pressureHpa === null || r.temperatureC === null || r.epochMs === lastEpochMs) continue;
    lastEpochMs = r.epochMs;
    out.push({
      epoch: new Date(r.epochMs).toISOString(),
      pressure_hpa: dHeightM === 0 ? r.pressureHpa : reducePressureHpa(r.pressureHpa, r.temperatureC, dHeightM),
      temperature_c: reduceTemperatureC(r.temperatureC, dHeightM),
    });
  }
  return out;
}

/**
 * First and last epoch of the observations in a body, without parsing it (the worker does): the
 * values of "epoch" keys in JSON (met epochs included, which only widens the window), the first
 * cell of each CSV data row. Unparseable values are left to the worker's validation.
 * @returns [ms, ms], or null when no epoch is found
 */
export function scanEpochRange(text: string, format: 'json' | 'csv'): { firstMs: number; lastMs: number } | null {
  const pattern = format === 'json' ? /"epoch"\s*:\s*"([^"]{1,64})"/g : /^([^,\r\n]{1,64}),/gm;
  let first = Infinity;
  let last = -Infinity;
  let previous = '';
  for (const m of text.matchAll(pattern)) {
    const value = m[1]!;
    if (value === previous) continue; // observations come grouped by epoch
    previous = value;
    const ms = Date.parse(value);
    if (Number.isNaN(ms)) continue; // the CSV header, or an error the worker reports
    if (ms < first) first = ms;
    if (ms > last) last = ms;
  }
  return first <= last ? { firstMs: first, lastMs: last } : null;
}

const stationZwdEstimatesRoute: FastifyPluginAsyncZod<StationRouteOptions> = async (app) => {
  // In this route's scope JSON bodies stay bytes: the worker thread parses them.
  app.removeContentTypeParser('application/json');
  app.addContentTypeParser('application/json', { parseAs: 'buffer' }, (_request, body, done) => done(null, body));
  app.post(
    '/v1/stations/:station_id/zwd-estimates',
    {
      bodyLimit: ZWD_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Estimate ZWD and gradients for a station and store the result as its delay series',
        description: [
          'The request of POST /v1/zwd-estimates without `site`: the station gives latitude, longitude and height (JSON body, or text/csv with the options as query parameters).',
          "Without `met` in the request, the station's stored met series (records with pressure and temperature, reduced from met_height_m to the antenna height; at one epoch the first source in name order) around the observations serves as `met`.",
          'The result is returned as by /v1/zwd-estimates and stored as the station\'s delay series under `?source=` (default "zwd-estimates") and the result\'s model_fingerprint: per epoch ztd_m, ztd_sigma_m = sigma_m (the a-priori ZHD is a fixed value), zwd_m, zwd_sigma_m, gradients and their sigmas.',
          `Up to ${MAX_OBSERVATIONS} observations. Body limit: ${ZWD_BODY_LIMIT_BYTES} bytes. Writes need \`Authorization: Bearer <key>\`.`,
        ].join(' '),
        tags: ['station archive', 'estimation'],
        security: [{ bearerKey: [] }],
        params: stationParams,
        querystring: stationZwdEstimatesQuery,
        body: zwdEstimationBody,
        response: {
          200: stationZwdEstimatesResponse,
          400: problemSchema,
          401: problemSchema,
          403: problemSchema,
          404: problemSchema,
          413: problemSchema,
          415: problemSchema,
          422: problemSchema,
          503: problemSchema,
        },
      },
      // The body is validated in the worker (see above); params and query here.
      validatorCompiler: (route) =>
        route.httpPart === 'body' ? (data: unknown) => ({ value: data }) : validatorCompiler(route as unknown as Parameters<typeof validatorCompiler>[0]),
    },
    async (request, reply) => {
      const stationId = request.params.station_id;
      const station = await requireStation(app.repository, stationId);
      const source = request.query.source ?? DEFAULT_ESTIMATE_SOURCE;
      const raw = request.body as unknown as Buffer | string;
      const type = (request.headers['content-type'] ?? '').split(';')[0]!.trim().toLowerCase();
      const format = type === 'text/csv' ? 'csv' : type === 'application/json' ? 'json' : undefined;
      if (!format) throw new HttpProblem(415, `content type ${type || '(none)'} is not accepted here; send application/json or text/csv`);
      const text = typeof raw === 'string' ? raw : raw.toString('utf8');

      const requestHasMet = format === 'json' && /"met"\s*:\s*\[/.test(text);
      let defaultMet: ReturnType<typeof archiveMet> | undefined;
      if (!requestHasMet) {
        const range = scanEpochRange(text, format);
        if (range) {
          const rows = await app.repository.readMet(stationId, { fromMs: range.firstMs - MET_WINDOW_MS, toMs: range.lastMs + MET_WINDOW_MS });
          defaultMet = archiveMet(station, rows);
        }
      }
      const metUsed = requestHasMet ? 'request' : defaultMet && defaultMet.length > 0 ? 'archive' : 'none';

      const output = await app.compute.run('zwd-estimate-request', {
        body: text,
        format,
        query: request.query as Record<string, unknown>,
        site: { latitude_deg: station.latitudeDeg, longitude_deg: station.longitudeDeg, height_m: station.heightM },
        defaultMet,
        keepResult: true,
      });
      const result = output.result!;
      const rows: DelayRow[] = result.series.map((e) => ({
        epochMs: Date.parse(e.epoch),
        source,
        ztdM: e.ztd_m,
        ztdSigmaM: e.sigma_m,
        zwdM: e.zwd_m,
        zwdSigmaM: e.sigma_m,
        northGradientM: e.north_gradient_m,
        eastGradientM: e.east_gradient_m,
        northGradientSigmaM: e.north_gradient_sigma_m,
        eastGradientSigmaM: e.east_gradient_sigma_m,
        modelFingerprint: result.model_fingerprint,
      }));
      const counts =
        rows.length > 0
          ? await app.repository.writeDelays(stationId, rows, { modelFingerprint: result.model_fingerprint, models: result.models })
          : { inserted: 0, updated: 0, unchanged: 0 };
      const warnings = [...result.warnings];
      if (metUsed === 'archive') warnings.push(`met: ${defaultMet!.length} records of the station's stored met series`);
      if (metUsed === 'none') warnings.push('met: neither in the request nor stored for this station around the observations; no ZHD or PWV per epoch');
      return reply.type('application/json').send({ ...result, warnings, station_id: stationId, met_used: metUsed, stored: { source, ...counts } });
    },
  );
};

export default stationZwdEstimatesRoute;
