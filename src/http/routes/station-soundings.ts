/**
 * Soundings in the station archive: a profile (the body of POST /v1/profile-delays without site and
 * epoch) stored per station and epoch with its ZHD, ZWD, PWV, Tm and models, computed on arrival by the
 * same code as POST /v1/profile-delays with the station as the site; the list, one sounding, its
 * deletion, and GNSS minus sounding PWV (src/services/soundings.ts).
 */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { DEFAULT_MAPPING_MODEL } from '../../domain/mapping/registry.js';
import { provenance } from '../../domain/provenance.js';
import { compareStationSoundings } from '../../services/soundings.js';
import type { SoundingRow, StoredSounding } from '../../storage/repository.js';
import { answerProfileDelays } from '../adapters/profile-delays.js';
import { HttpProblem } from '../problem.js';
import { problemSchema } from '../schemas/common.js';
import {
  PAIRING_RULE,
  soundingBody,
  soundingComparisonQuery,
  soundingComparisonResponse,
  soundingGetResponse,
  soundingListQuery,
  soundingListResponse,
  soundingParams,
  soundingPutResponse,
} from '../schemas/station-soundings.js';
import { stationParams } from '../schemas/stations.js';
import { PROFILE_BODY_LIMIT_BYTES } from './profile-delays.js';
import { resolveSeriesRange } from './series-range.js';
import { isoEpoch, requireStation, type StationRouteOptions } from './station-common.js';

/** Models of the profile answer that concern ray tracing and mapping functions, which a stored sounding does not compute. */
const SLANT_ONLY_MODELS = new Set(['mapping', 'mapping_height_correction', 'ray_tracing']);

const soundingJson = (s: SoundingRow) => ({
  epoch: isoEpoch(s.epochMs),
  zhd_m: s.zhdM,
  zwd_m: s.zwdM,
  ztd_m: s.ztdM,
  pwv_mm: s.pwvMm,
  tm_k: s.tmK,
  last_humidity_pressure_hpa: s.lastHumidityPressureHpa,
  levels: s.levels,
  model_fingerprint: s.modelFingerprint,
  warnings: s.warnings,
  stored_at: s.storedAt,
});

/** Every sounding route reads or writes the archive: 503 + Retry-After when the storage fails (error-handler.ts). */
const problems = { 400: problemSchema, 401: problemSchema, 403: problemSchema, 404: problemSchema, 503: problemSchema };

const stationSoundingsRoute: FastifyPluginAsyncZod<StationRouteOptions> = async (app, options) => {
  app.put(
    '/v1/stations/:station_id/soundings/:epoch',
    {
      bodyLimit: PROFILE_BODY_LIMIT_BYTES,
      schema: {
        summary: 'Store a sounding of a station, with its ZWD, PWV and Tm',
        description: `The body is the profile of POST /v1/profile-delays without site and epoch: the station (latitude, longitude, antenna height) is the site, the path gives the epoch, and the column is integrated from the antenna height up by the same code. Humidity may stop above some level; it is then continued climatologically (Smith 1966) and the answer says where measured humidity stopped. One sounding per station and epoch: a second PUT replaces it (201 created, 200 replaced). Needs a write key. Body limit: ${PROFILE_BODY_LIMIT_BYTES} bytes.`,
        tags: ['station archive', 'water vapour'],
        params: soundingParams,
        body: soundingBody,
        response: {
          200: soundingPutResponse,
          201: soundingPutResponse,
          ...problems,
          413: problemSchema,
          415: problemSchema,
          422: problemSchema,
        },
      },
    },
    async (request, reply) => {
      const { station_id: stationId, epoch } = request.params;
      const station = await requireStation(app.repository, stationId);
      const epochMs = Date.parse(epoch);
      const answer = answerProfileDelays({
        ...request.body,
        site: { latitude_deg: station.latitudeDeg, longitude_deg: station.longitudeDeg, height_m: station.heightM },
        epoch: isoEpoch(epochMs),
        mapping_model: DEFAULT_MAPPING_MODEL,
      });
      const { models, model_fingerprint } = provenance(
        Object.fromEntries(Object.entries(answer.models).filter(([k]) => !SLANT_ONLY_MODELS.has(k))),
      );
      const sounding: StoredSounding = {
        epochMs,
        zhdM: answer.zhd_m,
        zwdM: answer.zwd_m,
        ztdM: answer.ztd_m,
        pwvMm: answer.pwv_mm,
        tmK: answer.tm_k,
        lastHumidityPressureHpa: answer.humidity_extension?.last_humidity_pressure_hpa ?? null,
        levels: request.body.levels.length,
        warnings: answer.warnings,
        modelFingerprint: model_fingerprint,
        storedAt: new Date().toISOString(),
        profileJson: JSON.stringify(request.body),
      };
      const { created } = await app.repository.putSounding(stationId, sounding, { modelFingerprint: model_fingerprint, models });
      return reply.code(created ? 201 : 200).send({
        station_id: stationId,
        created,
        sounding: soundingJson(sounding),
        humidity_extension: answer.humidity_extension,
        models,
        model_fingerprint,
        warnings: answer.warnings,
      });
    },
  );

  app.get(
    '/v1/stations/:station_id/soundings/:epoch',
    {
      schema: {
        summary: 'One stored sounding with its profile and models',
        tags: ['station archive', 'water vapour'],
        params: soundingParams,
        response: { 200: soundingGetResponse, ...problems },
      },
    },
    async (request) => {
      const { station_id: stationId, epoch } = request.params;
      await requireStation(app.repository, stationId);
      const sounding = await app.repository.getSounding(stationId, Date.parse(epoch));
      if (!sounding) throw noSounding(stationId, epoch);
      const [modelSet] = await app.repository.readModelSets([sounding.modelFingerprint]);
      return {
        station_id: stationId,
        sounding: soundingJson(sounding),
        models: modelSet?.models ?? {},
        profile: JSON.parse(sounding.profileJson) as Record<string, unknown>,
      };
    },
  );

  app.delete(
    '/v1/stations/:station_id/soundings/:epoch',
    {
      schema: {
        summary: 'Delete one sounding',
        description: 'Removes the sounding for good. 404 when the station or the sounding does not exist.',
        tags: ['station archive', 'water vapour'],
        params: soundingParams,
        response: { 204: z.null().describe('Deleted'), ...problems },
      },
    },
    async (request, reply) => {
      const { station_id: stationId, epoch } = request.params;
      await requireStation(app.repository, stationId);
      if (!(await app.repository.deleteSounding(stationId, Date.parse(epoch)))) throw noSounding(stationId, epoch);
      return reply.code(204).send(null);
    },
  );

  app.get(
    '/v1/stations/:station_id/soundings',
    {
      schema: {
        summary: 'The soundings of a station in a range, with their ZWD, PWV and Tm',
        description: `Without their profiles (GET one sounding for that). Range defaults as for the station series (the maximum range ending at the latest stored delay epoch, or now); one request reads at most ${options.maxReadRangeDays} days.`,
        tags: ['station archive', 'water vapour'],
        params: stationParams,
        querystring: soundingListQuery,
        response: { 200: soundingListResponse, ...problems },
      },
    },
    async (request) => {
      const stationId = request.params.station_id;
      await requireStation(app.repository, stationId);
      const range = await resolveSeriesRange(app.repository, stationId, 'delays', request.query, options.maxReadRangeDays);
      const soundings = await app.repository.readSoundings(stationId, range);
      return { station_id: stationId, from: isoEpoch(range.fromMs), to: isoEpoch(range.toMs), soundings: soundings.map(soundingJson) };
    },
  );

  app.get(
    '/v1/stations/:station_id/sounding-comparison',
    {
      schema: {
        summary: 'GNSS minus sounding precipitable water: bias, SD and count, with the pairs',
        description: `For each sounding in the range, the station's GNSS PWV (as GET /v1/stations/{station_id}/precipitable-water computes it, default met gap and ZTD σ limit) at the sounding epoch. ${PAIRING_RULE} Range defaults as for the sounding list; at most ${options.maxReadRangeDays} days.`,
        tags: ['station archive', 'water vapour'],
        params: stationParams,
        querystring: soundingComparisonQuery,
        response: { 200: soundingComparisonResponse, ...problems },
      },
    },
    async (request) => {
      const stationId = request.params.station_id;
      const q = request.query;
      const station = await requireStation(app.repository, stationId);
      const range = await resolveSeriesRange(app.repository, stationId, 'delays', q, options.maxReadRangeDays);
      const result = await compareStationSoundings(
        app.repository,
        station,
        range,
        q.source === undefined ? { kind: 'preferred' } : { kind: 'one', source: q.source },
        q.window_s * 1000,
      );
      const s = result.statistics;
      return {
        station_id: stationId,
        from: isoEpoch(range.fromMs),
        to: isoEpoch(range.toMs),
        window_s: q.window_s,
        pairing: PAIRING_RULE,
        gnss_sources: result.sources,
        statistics: { count: s.count, bias_mm: s.biasMm, sd_mm: s.sdMm, rms_mm: s.rmsMm },
        pairs: result.pairs.map((p) => ({
          epoch: isoEpoch(p.soundingEpochMs),
          sounding_pwv_mm: p.soundingPwvMm,
          gnss_pwv_mm: p.gnssPwvMm,
          gnss_pwv_sigma_mm: p.gnssPwvSigmaMm,
          difference_mm: p.differenceMm,
          pairing: p.pairing,
          gnss_epochs: p.gnssEpochsMs.map(isoEpoch),
        })),
        unpaired: result.unpairedEpochsMs.map(isoEpoch),
        excluded_gnss_records: result.excludedGnssRecords,
        warnings: result.warnings,
      };
    },
  );
};

function noSounding(stationId: string, epoch: string): HttpProblem {
  return new HttpProblem(
    404,
    `no sounding of station "${stationId}" at ${epoch}; store one with PUT /v1/stations/${stationId}/soundings/${epoch}`,
    [{ field: 'params.epoch', message: 'no sounding at this epoch' }],
  );
}

export default stationSoundingsRoute;
