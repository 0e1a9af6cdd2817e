import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { DelayRow } from '../../storage/repository.js';
import { ModelSetSpans } from '../../services/homogeneity.js';
import { CSV_TYPE, csvPieces, JSON_TYPE, jsonRecordPieces } from '../series-pieces.js';
import { loopFriendlyPages, sendPieces } from '../streamed-answer.js';
import { HttpProblem } from '../problem.js';
import { problemSchema } from '../schemas/common.js';
import {
  DELAY_CSV_COLUMNS,
  delayDepositEnvelope,
  delayDepositJsonBody,
  delayDepositResponse,
  delayReadQuery,
  delayReadResponse,
} from '../schemas/delays.js';
import type { z } from 'zod';
import { OffloadedJsonBody, offloadLargeJsonBodies } from '../json-upload-body.js';
import { delayRowsOf } from '../tasks/json-upload.js';
import { stationParams } from '../schemas/stations.js';
import { BATCH_BODY_LIMIT_BYTES } from '../../limits.js';
import { envelopeValidator, isoEpoch, recordLine, requireStation, type StationRouteOptions } from './station-common.js';
import { resolveSeriesRange } from './series-range.js';
import { DEPOSIT_SOURCE_KEY, listRejected, nothingUsable, readDelayDeposit, type DelayDeposit } from './series-ingest.js';
import { modelFingerprintHeaders } from '../fingerprint-headers.js';

export { DEPOSIT_SOURCE_KEY } from './series-ingest.js';

/** A stored delay row as the API shows it (JSON record; CSV cells in DELAY_CSV_COLUMNS order). */
const delayRecord = (r: DelayRow) => ({
  epoch: isoEpoch(r.epochMs),
  ztd_m: r.ztdM,
  ztd_sigma_m: r.ztdSigmaM,
  zwd_m: r.zwdM,
  zwd_sigma_m: r.zwdSigmaM,
  north_gradient_m: r.northGradientM,
  east_gradient_m: r.eastGradientM,
  north_gradient_sigma_m: r.northGradientSigmaM,
  east_gradient_sigma_m: r.eastGradientSigmaM,
  source: r.source,
  model_fingerprint: r.modelFingerprint,
});

/** The pages as they are, each added to `spans` on its way. */
async function* withSpans(pages: AsyncIterable<DelayRow[]>, spans: ModelSetSpans): AsyncGenerator<DelayRow[], void, undefined> {
  for await (const page of pages) {
    spans.add(page);
    yield page;
  }
}

const stationDelaysRoute: FastifyPluginAsyncZod<StationRouteOptions> = async (app, options) => {
  offloadLargeJsonBodies(app);

  /** The deposit read and checked: on the event loop up to OFFLOAD_BODY_BYTES, in the worker pool above. */
  async function readDeposit(body: unknown): Promise<DelayDeposit> {
    if (!(body instanceof OffloadedJsonBody)) return readDelayDeposit(body as z.output<typeof delayDepositEnvelope>);
    const output = await app.compute.run('delay-deposit-read', { body: body.bytes }, [body.bytes.buffer]);
    return { ...output, rows: delayRowsOf(output.columns, output.source, output.set.model_fingerprint) };
  }

  app.post(
    '/v1/stations/:station_id/delays',
    {
      bodyLimit: BATCH_BODY_LIMIT_BYTES,
      validatorCompiler: envelopeValidator(delayDepositEnvelope),
      schema: {
        summary: 'Deposit a zenith total delay series computed elsewhere',
        description: `Stores the records keyed by (epoch, source) with the fingerprint of \`models\` plus \`${DEPOSIT_SOURCE_KEY}: source\`: a retrieval shows it and says when a range mixes fingerprints. Bad records are listed in \`rejected\`, the good ones stored; none good is a 400. Body limit: ${BATCH_BODY_LIMIT_BYTES} bytes (32 MiB). Writes need \`Authorization: Bearer <key>\`.`,
        tags: ['station archive'],
        security: [{ bearerKey: [] }],
        params: stationParams,
        body: delayDepositJsonBody,
        response: {
          200: delayDepositResponse,
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
      if (typeof body === 'string') {
        const type = request.headers['content-type'] ?? '(none)';
        throw new HttpProblem(415, `content type ${type} is not accepted here; send the delay series as application/json`);
      }
      const { source, set, rows, rejected } = await readDeposit(body);
      if (rows.length === 0) throw nothingUsable(rejected);
      const counts = await app.repository.writeDelays(stationId, rows, { modelFingerprint: set.model_fingerprint, models: set.models });
      request.auditDetail = { source, records: rows.length + rejected.length, ...counts };
      return { station_id: stationId, source, ...counts, ...listRejected(rejected), warnings: [], ...set };
    },
  );

  app.get(
    '/v1/stations/:station_id/delays',
    {
      schema: {
        summary: 'Stored delay series of a station in a time range',
        description: `Every record carries its source and model fingerprint; \`homogeneous\` is false (with a warning listing the fingerprints and their epochs) when the range mixes model sets. from/to inclusive, ISO 8601; one request reads at most ${options.maxReadRangeDays} days. format=csv answers text/csv with a header row of the field names and the headers x-homogeneous and x-model-fingerprints.`,
        tags: ['station archive'],
        params: stationParams,
        querystring: delayReadQuery,
        response: {
          200: delayReadResponse,
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
      const range = await resolveSeriesRange(app.repository, stationId, 'delays', request.query, options.maxReadRangeDays);
      const source = request.query.source;
      if (request.query.format === 'csv') {
        // The headers need the model sets of the range before the first row: a first pass over the narrow rows.
        const spans = new ModelSetSpans();
        for await (const page of loopFriendlyPages(app.repository, 'zenith-delays', stationId, range, { source })) spans.add(page);
        const fingerprints = spans.fingerprints();
        const summary = spans.summary(await app.repository.readModelSets(fingerprints));
        const line = recordLine(DELAY_CSV_COLUMNS);
        const pages = loopFriendlyPages(app.repository, 'delays', stationId, range, { source });
        return sendPieces(
          reply,
          CSV_TYPE,
          csvPieces(DELAY_CSV_COLUMNS, pages, (rows) => rows.map((r) => line(delayRecord(r)))),
          { 'x-homogeneous': String(summary.homogeneous), ...modelFingerprintHeaders(fingerprints) },
        );
      }
      // JSON: the summary follows the records, so it is gathered while they are written.
      const spans = new ModelSetSpans();
      const pages = withSpans(loopFriendlyPages(app.repository, 'delays', stationId, range, { source }), spans);
      const head = { station_id: stationId, from: isoEpoch(range.fromMs), to: isoEpoch(range.toMs) };
      return sendPieces(
        reply,
        JSON_TYPE,
        jsonRecordPieces(head, pages, delayRecord, async () => spans.summary(await app.repository.readModelSets(spans.fingerprints()))),
      );
    },
  );
};

export default stationDelaysRoute;
