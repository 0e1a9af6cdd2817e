/**
 * Residual deposits in the station archive: PUT one station-day of residuals (read and encoded in
 * the worker pool, src/http/tasks/residual-deposit.ts), list a station's days, GET one day back
 * (JSON column arrays, or CSV), DELETE one day. Campaigns (routes/campaigns.ts) estimate from them.
 */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { OBSERVATION_CSV_OPTIONAL_COLUMNS, OBSERVATION_CSV_REQUIRED_COLUMNS } from '../../formats/observation-csv.js';
import { decodeResidualDay, type ResidualDay } from '../../formats/residual-day-form.js';
import { MAX_OBSERVATIONS, ZWD_BODY_LIMIT_BYTES } from '../../limits.js';
import { ResidualStore } from '../../storage/campaigns/residual-store.js';
import { HttpProblem } from '../problem.js';
import { bodyInWorkerValidator, keepJsonBodiesAsBytes, rawBodyOf, transferOf } from '../raw-body.js';
import { problemSchema } from '../schemas/common.js';
import {
  residualDayParams,
  residualDepositBody,
  residualGetResponse,
  residualListQuery,
  residualListResponse,
  residualPutResponse,
} from '../schemas/residuals.js';
import { stationParams } from '../schemas/stations.js';
import { isoEpoch, requireStation } from './station-common.js';

const problems = { 400: problemSchema, 401: problemSchema, 403: problemSchema, 404: problemSchema, 503: problemSchema };

const noDeposit = (stationId: string, day: string) =>
  new HttpProblem(
    404,
    `no residuals of station "${stationId}" on ${day}; deposit them with PUT /v1/stations/${stationId}/residuals/${day}`,
    [{ field: 'params.day', message: 'no deposit on this day' }],
  );

/** The observations of a stored day as the API's column arrays. */
function observationColumns(d: ResidualDay) {
  return {
    epoch: d.epochMs.map(isoEpoch),
    satellite: d.satellite,
    elevation_deg: d.elevationDeg,
    azimuth_deg: d.azimuthDeg,
    residual_m: d.residualM,
    ...(d.sigmaM ? { sigma_m: d.sigmaM } : {}),
  };
}

/** CSV with the columns the observation CSV reader takes (src/formats/observation-csv.ts). */
function observationCsv(d: ResidualDay): string {
  const header = [...OBSERVATION_CSV_REQUIRED_COLUMNS, ...(d.sigmaM ? OBSERVATION_CSV_OPTIONAL_COLUMNS : [])];
  const lines = [header.join(',')];
  for (let k = 0; k < d.epochMs.length; k++) {
    const cells = [isoEpoch(d.epochMs[k]!), d.satellite[k]!, d.elevationDeg[k]!, d.azimuthDeg[k]!, d.residualM[k]!];
    if (d.sigmaM) cells.push(d.sigmaM[k] ?? '');
    lines.push(cells.join(','));
  }
  return lines.join('\n') + '\n';
}

const stationResidualsRoute: FastifyPluginAsyncZod = async (app) => {
  const store = () => new ResidualStore(app.repository.sqlExecutor());

  // The deposit keeps JSON and Arrow bodies as bytes for the worker, in a scope of its own.
  await app.register(async (scope) => {
    keepJsonBodiesAsBytes(scope);
    scope.withTypeProvider<import('fastify-type-provider-zod').ZodTypeProvider>().put(
      '/v1/stations/:station_id/residuals/:day',
      {
        bodyLimit: ZWD_BODY_LIMIT_BYTES,
        schema: {
          summary: 'Deposit the residuals of one station-day (for campaigns)',
          description: [
            'The observations in the forms the estimation routes take: JSON `{observations: [...]}` (objects or column arrays), text/csv (the observation CSV), or an Arrow IPC stream (the table is the observations).',
            'Every epoch must lie within the UTC day (400 naming the row otherwise); each (epoch, satellite) once.',
            'Stored in a compact form (docs/campaigns.md): replaces a deposit of the same day (201 when new, 200 when replaced). `sha256` is of the canonical stored form, so the same observations sent again give the same digest.',
            `Up to ${MAX_OBSERVATIONS} observations. Body limit: ${ZWD_BODY_LIMIT_BYTES} bytes.`,
          ].join(' '),
          tags: ['station archive', 'campaigns'],
          params: residualDayParams,
          body: residualDepositBody,
          response: { 200: residualPutResponse, 201: residualPutResponse, ...problems, 413: problemSchema, 415: problemSchema },
        },
        validatorCompiler: bodyInWorkerValidator,
      },
      async (request, reply) => {
        const { station_id: stationId, day } = request.params;
        await requireStation(app.repository, stationId);
        const raw = rawBodyOf(request);
        const read = await app.compute.run('residual-deposit-read', { ...raw, day }, transferOf(raw));
        const storedAt = new Date().toISOString();
        const { created } = await store().put(
          { stationId, day, observationCount: read.observationCount, sha256: read.sha256, storedAt },
          read.bytes,
        );
        request.auditDetail = { source: 'residuals', records: read.observationCount };
        return reply.code(created ? 201 : 200).send({
          station_id: stationId,
          day,
          observation_count: read.observationCount,
          sha256: read.sha256,
          stored_bytes: read.bytes.byteLength,
        });
      },
    );
  });

  app.get(
    '/v1/stations/:station_id/residuals',
    {
      schema: {
        summary: "A station's residual deposits: one entry per day",
        description: 'Optional `start` and `end` (days, inclusive) narrow the list.',
        tags: ['station archive', 'campaigns'],
        params: stationParams,
        querystring: residualListQuery,
        response: { 200: residualListResponse, ...problems },
      },
    },
    async (request) => {
      const stationId = request.params.station_id;
      await requireStation(app.repository, stationId);
      const days = await store().list(stationId, request.query.start, request.query.end);
      return {
        station_id: stationId,
        days: days.map((d) => ({
          day: d.day,
          observation_count: d.observationCount,
          sha256: d.sha256,
          stored_bytes: d.storedBytes,
          stored_at: d.storedAt,
        })),
      };
    },
  );

  app.get(
    '/v1/stations/:station_id/residuals/:day',
    {
      schema: {
        summary: 'The residuals deposited for one station-day',
        description: 'JSON column arrays sorted by epoch then satellite; `Accept: text/csv` gives the observation CSV.',
        tags: ['station archive', 'campaigns'],
        params: residualDayParams,
        response: { 200: residualGetResponse, ...problems },
      },
    },
    async (request, reply) => {
      const { station_id: stationId, day } = request.params;
      await requireStation(app.repository, stationId);
      const stored = await store().get(stationId, day);
      if (!stored) throw noDeposit(stationId, day);
      const decoded = decodeResidualDay(day, stored.data);
      if ((request.headers.accept ?? '').includes('text/csv'))
        return reply.type('text/csv; charset=utf-8').send(observationCsv(decoded) as never);
      return { station_id: stationId, day, observations: observationColumns(decoded) };
    },
  );

  app.delete(
    '/v1/stations/:station_id/residuals/:day',
    {
      schema: {
        summary: 'Delete the residuals of one station-day',
        description: 'Removes the deposit for good (results stored from it stay). 404 when there is none.',
        tags: ['station archive', 'campaigns'],
        params: residualDayParams,
        response: { 204: z.null().describe('Deleted'), ...problems },
      },
    },
    async (request, reply) => {
      const { station_id: stationId, day } = request.params;
      await requireStation(app.repository, stationId);
      if (!(await store().delete(stationId, day))) throw noDeposit(stationId, day);
      return reply.code(204).send(null);
    },
  );
};

export default stationResidualsRoute;
