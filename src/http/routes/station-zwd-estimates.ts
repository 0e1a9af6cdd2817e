/**
 * POST /v1/stations/{station_id}/zwd-estimates: runs the ZWD estimation of /v1/zwd-estimates
 * (src/services/zwd-estimation.ts) for a station, with the station's coordinates as the site and its
 * stored met series as `met` unless the request carries its own, and stores the result as the
 * station's delay series (ZTD, ZWD, gradients and their sigmas) under the result's fingerprint.
 */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { reducePressureHpa, reduceTemperatureC } from '../../domain/meteo/height-reduction.js';
import { runZwdEstimation } from '../../services/zwd-estimation.js';
import type { DelayRow, MetRow, Station } from '../../storage/repository.js';
import { problemSchema } from '../schemas/common.js';
import { DEFAULT_ESTIMATE_SOURCE, stationZwdEstimatesRequest, stationZwdEstimatesResponse } from '../schemas/station-zwd-estimates.js';
import { stationParams } from '../schemas/stations.js';
import { ZWD_BODY_LIMIT_BYTES } from '../schemas/zwd-estimates.js';
import { requireStation, type StationRouteOptions } from './station-common.js';

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

const stationZwdEstimatesRoute: FastifyPluginAsyncZod<StationRouteOptions> = async (app) => {
  app.post(
    '/v1/stations/:station_id/zwd-estimates',
    {
      bodyLimit: ZWD_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Estimate ZWD and gradients for a station and store the result as its delay series',
        description: [
          'The request of POST /v1/zwd-estimates without `site`: the station gives latitude, longitude and height.',
          "Without `met` in the request, the station's stored met series (records with pressure and temperature, reduced from met_height_m to the antenna height; at one epoch the first source in name order) covering the observations ± options.met_max_gap_s serves as `met`.",
          'The result is returned as by /v1/zwd-estimates and stored as the station\'s delay series under `source` (default "zwd-estimates") and the result\'s model_fingerprint: per epoch ztd_m, ztd_sigma_m = sigma_m (the a-priori ZHD is fixed), zwd_m, zwd_sigma_m, gradients and their sigmas.',
          `Body limit: ${ZWD_BODY_LIMIT_BYTES} bytes. Writes need \`Authorization: Bearer <key>\`.`,
        ].join(' '),
        tags: ['station archive', 'estimation'],
        security: [{ bearerKey: [] }],
        params: stationParams,
        body: stationZwdEstimatesRequest,
        response: { 200: stationZwdEstimatesResponse, 400: problemSchema, 401: problemSchema, 403: problemSchema, 404: problemSchema, 413: problemSchema, 422: problemSchema },
      },
    },
    async (request) => {
      const stationId = request.params.station_id;
      const station = await requireStation(app.repository, stationId);
      const { source = DEFAULT_ESTIMATE_SOURCE, ...body } = request.body;
      const site = { latitude_deg: station.latitudeDeg, longitude_deg: station.longitudeDeg, height_m: station.heightM };

      let metUsed: 'request' | 'archive' | 'none' = body.met ? 'request' : 'none';
      if (!body.met) {
        let first = Infinity;
        let last = -Infinity;
        for (const o of body.observations) {
          const t = Date.parse(o.epoch);
          if (t < first) first = t;
          if (t > last) last = t;
        }
        const gapMs = body.options.met_max_gap_s * 1000;
        const stored = archiveMet(station, await app.repository.readMet(stationId, { fromMs: first - gapMs, toMs: last + gapMs }));
        if (stored.length > 0) {
          body.met = stored;
          metUsed = 'archive';
        }
      }

      const result = runZwdEstimation(site, body);
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
      if (metUsed === 'archive') warnings.push(`met: ${body.met!.length} records of the station's stored met series`);
      if (metUsed === 'none') warnings.push('met: neither in the request nor stored for this station around the observations; no ZHD or PWV per epoch');
      return { ...result, warnings, station_id: stationId, met_used: metUsed, stored: { source, ...counts } };
    },
  );
};

export default stationZwdEstimatesRoute;
