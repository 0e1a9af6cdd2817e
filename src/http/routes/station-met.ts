import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { BATCH_BODY_LIMIT_BYTES, OFFLOAD_BODY_BYTES } from '../../limits.js';
import { OffloadedJsonBody, offloadLargeJsonBodies } from '../json-upload-body.js';
import { HttpProblem } from '../problem.js';
import { relativeHumidityUnitWarning } from '../../services/unit-guards.js';
import type { MetRow } from '../../storage/repository.js';
import { metRowsOf, readMetUploadTask } from '../tasks/met-upload.js';
import { problemSchema } from '../schemas/common.js';
import {
  DEFAULT_MET_SOURCE,
  MET_CSV_OUTPUT_COLUMNS,
  ingestQuery,
  metIngestEnvelope,
  metIngestJsonBody,
  metIngestResponse,
  metReadQuery,
  metReadResponse,
} from '../schemas/met.js';
import { stationParams } from '../schemas/stations.js';
import { CSV_TYPE, csvPieces, JSON_TYPE, jsonRecordPieces } from '../series-pieces.js';
import { loopFriendlyPages, sendPieces } from '../streamed-answer.js';
import { envelopeValidator, isoEpoch, recordLine, requireStation, type StationRouteOptions } from './station-common.js';
import { resolveSeriesRange } from './series-range.js';
import { listRejected, nothingUsable, readMetUpload, type MetUpload } from './series-ingest.js';

/** The humidity guard (src/services/unit-guards.ts) over the records to be stored, as warning texts. */
function humidityWarning(rows: readonly MetRow[]): string[] {
  const w = relativeHumidityUnitWarning(
    'relative_humidity_pct',
    rows.map((r) => r.relativeHumidityPct),
  );
  return w ? [w.text] : [];
}

/** A stored met row as the API shows it (JSON record; CSV cells in MET_CSV_OUTPUT_COLUMNS order). */
const metRecord = (r: MetRow) => ({
  epoch: isoEpoch(r.epochMs),
  source: r.source,
  pressure_hpa: r.pressureHpa,
  temperature_c: r.temperatureC,
  relative_humidity_pct: r.relativeHumidityPct,
  dewpoint_c: r.dewpointC,
  vapour_pressure_hpa: r.vapourPressureHpa,
});

const stationMetRoute: FastifyPluginAsyncZod<StationRouteOptions> = async (app, options) => {
  offloadLargeJsonBodies(app);

  /**
   * The upload read and checked, with the source its rows are stored under (a JSON body's `source`, else
   * `?source=`, else the default). A JSON or text body above OFFLOAD_BODY_BYTES is read in the worker
   * pool (JSON: src/http/tasks/json-upload.ts; CSV, RINEX met: tasks/met-upload.ts); the write stays here.
   */
  async function readUpload(body: unknown, contentType: string, querySource: string | undefined): Promise<MetUpload & { source: string }> {
    if (body instanceof OffloadedJsonBody) {
      const output = await app.compute.run('met-json-upload-read', { body: body.bytes, querySource }, [body.bytes.buffer]);
      const { columns, observations: _rows, ...rest } = output;
      return { ...rest, rows: metRowsOf(columns) };
    }
    if (typeof body !== 'string') {
      const source = (body as { source?: string }).source ?? querySource ?? DEFAULT_MET_SOURCE;
      return { source, ...readMetUpload(body, contentType, source) };
    }
    const source = querySource ?? DEFAULT_MET_SOURCE;
    let output;
    if (body.length <= OFFLOAD_BODY_BYTES) {
      const outcome = await readMetUploadTask({ text: body, contentType, source });
      if (!outcome.ok) throw new HttpProblem(outcome.error.status, outcome.error.detail, outcome.error.errors);
      output = outcome.output;
    } else {
      output = await app.compute.run('met-upload-read', { text: body, contentType, source });
    }
    const { columns, observations: _rows, ...rest } = output;
    return { ...rest, source, rows: metRowsOf(columns) };
  }

  app.post(
    '/v1/stations/:station_id/met',
    {
      bodyLimit: BATCH_BODY_LIMIT_BYTES,
      validatorCompiler: envelopeValidator(metIngestEnvelope),
      schema: {
        summary: 'Store met records of a station (JSON, CSV or a RINEX meteorological file)',
        description: [
          'The body is one of:',
          '- application/json: `{ records: [...], source? }` as below;',
          '- text/csv: a header row with the field names of a record (epoch, source, pressure_hpa, temperature_c, relative_humidity_pct, dewpoint_c, vapour_pressure_hpa), then one record per row; `?source=` names the producer of rows without a `source` cell. The CSV that GET answers with format=csv uploads back unchanged;',
          '- text/plain: a RINEX meteorological observation file, version 2.10/2.11 or 3.00-3.05, recognised by its header. PR, TD and HR are stored; other observation types (ZW, ZD, ZT, WD, WS, RI, HI, ...) are counted in `rinex.ignored_values` and not stored; epochs (GPS time) are converted to UTC.',
          'Records are keyed by (epoch, source): sending the same records again changes nothing. Each record needs pressure_hpa or temperature_c and at most one humidity field. Bad records are listed in `rejected` (by index or line) and the good ones stored; a body that is not what its content type claims, or has no good record, is a 400 and stores nothing.',
          `Body limit: ${BATCH_BODY_LIMIT_BYTES} bytes (32 MiB). Writes need \`Authorization: Bearer <key>\`.`,
        ].join('\n'),
        tags: ['station archive'],
        security: [{ bearerKey: [] }],
        params: stationParams,
        querystring: ingestQuery,
        body: metIngestJsonBody,
        response: {
          200: metIngestResponse,
          400: problemSchema,
          401: problemSchema,
          403: problemSchema,
          404: problemSchema,
          413: problemSchema,
          415: problemSchema,
          503: problemSchema,
        },
      },
    },
    async (request) => {
      const stationId = request.params.station_id;
      await requireStation(app.repository, stationId);
      const body = request.body as unknown;
      const { source, ...upload } = await readUpload(body, request.headers['content-type'] ?? 'application/json', request.query.source);
      if (upload.rows.length === 0) throw nothingUsable(upload.rejected);
      const counts = await app.repository.writeMet(stationId, upload.rows);
      request.auditDetail = { source, records: upload.rows.length + upload.rejected.length, ...counts };
      return {
        station_id: stationId,
        source,
        format: upload.format,
        sources: [...new Set(upload.rows.map((r) => r.source))],
        ...counts,
        ...listRejected(upload.rejected),
        warnings: [...upload.warnings, ...humidityWarning(upload.rows)],
        ...(upload.rinex ? { rinex: upload.rinex } : {}),
      };
    },
  );

  app.get(
    '/v1/stations/:station_id/met',
    {
      schema: {
        summary: 'Met records of a station in a time range, as stored',
        description: `from/to inclusive, ISO 8601; one request reads at most ${options.maxReadRangeDays} days (TROPO_MAX_READ_RANGE_DAYS). format=csv answers text/csv with a header row of the field names.`,
        tags: ['station archive'],
        params: stationParams,
        querystring: metReadQuery,
        response: {
          200: metReadResponse,
          400: problemSchema,
          401: problemSchema,
          403: problemSchema,
          404: problemSchema,
          503: problemSchema,
        },
      },
    },
    async (request, reply) => {
      const stationId = request.params.station_id;
      await requireStation(app.repository, stationId);
      const range = await resolveSeriesRange(app.repository, stationId, 'met', request.query, options.maxReadRangeDays);
      const pages = loopFriendlyPages(app.repository, 'met', stationId, range, { source: request.query.source });
      if (request.query.format === 'csv') {
        const line = recordLine(MET_CSV_OUTPUT_COLUMNS);
        return sendPieces(
          reply,
          CSV_TYPE,
          csvPieces(MET_CSV_OUTPUT_COLUMNS, pages, (rows) => rows.map((r) => line(metRecord(r)))),
        );
      }
      const head = { station_id: stationId, from: isoEpoch(range.fromMs), to: isoEpoch(range.toMs) };
      return sendPieces(reply, JSON_TYPE, jsonRecordPieces(head, pages, metRecord));
    },
  );
};

export default stationMetRoute;
