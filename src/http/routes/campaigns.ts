/**
 * Reprocessing campaigns (src/services/campaigns): submit, list, progress, cancel, report; residuals
 * uploaded to a campaign (read and encoded in the worker pool like a deposit), their list and the close
 * of the uploads. The items run on every replica (plugins/campaigns.ts).
 */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { MAPPING_MODELS, type MappingModelKey } from '../../domain/mapping/registry.js';
import { provenance } from '../../domain/provenance.js';
import type { CampaignReport, CampaignStatus } from '../../services/campaigns/campaigns.js';
import { zwdModels } from '../../services/zwd-estimation.js';
import { toOptionValues } from '../adapters/zwd-estimation.js';
import { MAX_OBSERVATIONS, ZWD_BODY_LIMIT_BYTES } from '../../limits.js';
import { windowFromHours } from '../../services/campaigns/item-windows.js';
import { HttpProblem } from '../problem.js';
import { bodyInWorkerValidator, keepJsonBodiesAsBytes, rawBodyOf, transferOf } from '../raw-body.js';
import {
  campaignBody,
  campaignListResponse,
  campaignParams,
  campaignReportResponse,
  campaignResponse,
  campaignUploadListResponse,
  campaignUploadParams,
  campaignUploadResponse,
  RESIDUAL_INPUTS,
} from '../schemas/campaigns.js';
import { problemSchema } from '../schemas/common.js';
import { residualDepositBody } from '../schemas/residuals.js';
import { DEFAULT_ESTIMATE_SOURCE } from '../schemas/station-zwd-estimates.js';

const problems = { 401: problemSchema, 403: problemSchema, 404: problemSchema, 503: problemSchema };

const noCampaign = (id: string) =>
  new HttpProblem(404, `no campaign "${id}"; GET /v1/campaigns lists them`, [{ field: 'params.campaign_id', message: 'no such campaign' }]);

const cpuS = (ms: number) => Math.round(ms) / 1000;
const HOUR_MS = 3_600_000;
const isoSecond = (ms: number) => new Date(ms).toISOString().replace(/\.\d{3}Z$/, 'Z');

function campaignJson(s: CampaignStatus) {
  const c = s.campaign;
  return {
    campaign_id: c.campaignId,
    name: c.name,
    state: c.state,
    start_date: c.startDate,
    end_date: c.endDate,
    residuals: c.inputKind === 'upload' ? ('uploaded' as const) : ('deposited' as const),
    window:
      c.windowLengthMs !== null && c.windowStepMs !== null
        ? { length_hours: c.windowLengthMs / HOUR_MS, step_hours: c.windowStepMs / HOUR_MS }
        : null,
    uploads_closed_at: c.uploadsClosedAt,
    items_total: s.total,
    items_awaiting_residuals: s.counts.awaiting_residuals,
    items_no_residuals: s.counts.no_residuals,
    items_done: s.counts.done,
    items_failed: s.counts.failed,
    items_pending: s.counts.pending,
    items_running: s.counts.running,
    items_cancelled: s.counts.cancelled,
    model_fingerprint: c.modelFingerprint,
    created_at: c.createdAt,
    started_at: c.startedAt,
    finished_at: c.finishedAt,
    replicas: s.replicas.map((r) => ({ replica: r.replica, items_done: r.itemsDone, cpu_s: cpuS(r.cpuMs) })),
  };
}

function reportJson(r: CampaignReport) {
  return {
    campaign_id: r.campaign.campaignId,
    state: r.campaign.state,
    homogeneous: r.homogeneous,
    model_fingerprint: r.campaign.modelFingerprint,
    fingerprints: r.fingerprints.map((f) => ({ fingerprint: f.fingerprint, station_days: f.stationDays })),
    exceptions: r.exceptions.map((e) => ({
      station_id: e.stationId,
      day: e.day,
      ...(e.keptFromMs !== undefined ? { kept_from: isoSecond(e.keptFromMs) } : {}),
      ...(e.keptToMs !== undefined ? { kept_to: isoSecond(e.keptToMs) } : {}),
      reason: e.reason,
      ...(e.fingerprint ? { fingerprint: e.fingerprint } : {}),
    })),
    items: { total: r.total, ...r.counts },
    throughput: {
      station_days_per_s: r.elapsedS ? r.counts.done / r.elapsedS : null,
      elapsed_s: r.elapsedS,
      per_replica: r.replicas.map((w) => ({
        replica: w.replica,
        items_done: w.itemsDone,
        cpu_s: cpuS(w.cpuMs),
        station_days_per_cpu_s: w.cpuMs > 0 ? w.itemsDone / (w.cpuMs / 1000) : null,
      })),
    },
  };
}

const campaignsRoute: FastifyPluginAsyncZod = async (app) => {
  app.post(
    '/v1/campaigns',
    {
      schema: {
        summary: 'Submit a reprocessing campaign: one option set over the residuals of stations and days (or windows)',
        description: [
          '`residuals: "deposited"` (default): one item per station-day with residuals deposited (PUT /v1/stations/{station_id}/residuals/{day}) in [start_date, end_date] for the stations (all stations with deposits when omitted).',
          '`residuals: "uploaded"`: one item per named station and day, awaiting its residuals (PUT /v1/campaigns/{campaign_id}/residuals/{station_id}/{day}); each runs as soon as they have arrived.',
          '`window`: station-windows instead of station-days; each item estimates from its whole window and stores its centre `step_hours`.',
          'Every item is estimated as by POST /v1/stations/{station_id}/zwd-estimates with `options` and the station\'s stored met, on any replica, and stored under the source "zwd-estimates" with the campaign\'s fingerprint, exactly once per epoch.',
          '202 with the campaign; 400 naming the field for bad input; 422 when no station-day in the span has deposited residuals.',
        ].join(' '),
        tags: ['campaigns'],
        body: campaignBody,
        response: { 202: campaignResponse, 400: problemSchema, 422: problemSchema, ...problems },
      },
    },
    async (request, reply) => {
      const body = request.body;
      const wetMapping = (body.options as Record<string, unknown>).wet_mapping as MappingModelKey;
      if (MAPPING_MODELS[wetMapping]?.requiresCoefficients) {
        throw new HttpProblem(
          400,
          `options.wet_mapping: ${wetMapping} needs coefficients per epoch, which a campaign does not carry; choose another mapping function`,
          [
            {
              field: 'options.wet_mapping',
              message: `${wetMapping} needs vmf1_coefficients; a campaign takes mapping functions without coefficients`,
            },
          ],
        );
      }
      // No a-priori ZHD is sent with deposits: the standard atmosphere's, as the estimation without apriori.zhd_m.
      const { model_fingerprint } = provenance(zwdModels(toOptionValues(body.options), 'standard-atmosphere'));
      const status = await app.campaigns.submit({
        name: body.name ?? null,
        stations: body.stations,
        startDate: body.start_date,
        endDate: body.end_date,
        optionsJson: JSON.stringify(body.options),
        modelFingerprint: model_fingerprint,
        source: DEFAULT_ESTIMATE_SOURCE,
        inputKind: RESIDUAL_INPUTS[body.residuals],
        window: body.window ? windowFromHours(body.window.length_hours, body.window.step_hours) : null,
      });
      request.auditDetail = { records: status.total };
      return reply.code(202).send(campaignJson(status));
    },
  );

  app.get(
    '/v1/campaigns',
    {
      schema: {
        summary: 'The campaigns, newest first, with their progress',
        tags: ['campaigns'],
        response: { 200: campaignListResponse, ...problems },
      },
    },
    async () => ({ campaigns: (await app.campaigns.list()).map(campaignJson) }),
  );

  app.get(
    '/v1/campaigns/:campaign_id',
    {
      schema: {
        summary: "A campaign's progress: items by state, work per replica",
        tags: ['campaigns'],
        params: campaignParams,
        response: { 200: campaignResponse, ...problems },
      },
    },
    async (request) => {
      const status = await app.campaigns.status(request.params.campaign_id);
      if (!status) throw noCampaign(request.params.campaign_id);
      return campaignJson(status);
    },
  );

  app.post(
    '/v1/campaigns/:campaign_id/cancel',
    {
      schema: {
        summary: 'Cancel a campaign',
        description:
          'Pending items are not started; running ones finish or are abandoned without storing anything. 409 when the campaign has already finished.',
        tags: ['campaigns'],
        params: campaignParams,
        response: { 200: campaignResponse, 409: problemSchema, ...problems },
      },
    },
    async (request) => {
      const id = request.params.campaign_id;
      const status = await app.campaigns.cancel(id);
      if (!status) throw noCampaign(id);
      if (status.campaign.state === 'finished') {
        throw new HttpProblem(409, `campaign "${id}" finished at ${status.campaign.finishedAt}; nothing to cancel`, [
          { field: 'params.campaign_id', message: 'the campaign has finished' },
        ]);
      }
      return campaignJson(status);
    },
  );

  app.get(
    '/v1/campaigns/:campaign_id/report',
    {
      schema: {
        summary: "A campaign's report: homogeneity of its results in the archive, exceptions, throughput",
        description:
          "Reads back the fingerprints the archive holds now for every station-day the campaign did: homogeneous when all carry the campaign's fingerprint; a station-day re-estimated later with other options (or gone) is an exception, as is a failed item.",
        tags: ['campaigns'],
        params: campaignParams,
        response: { 200: campaignReportResponse, ...problems },
      },
    },
    async (request) => {
      const report = await app.campaigns.report(request.params.campaign_id);
      if (!report) throw noCampaign(request.params.campaign_id);
      return reportJson(report);
    },
  );

  // The upload keeps JSON and Arrow bodies as bytes for the worker, in a scope of its own (as the deposit does).
  await app.register(async (scope) => {
    keepJsonBodiesAsBytes(scope);
    scope.withTypeProvider<import('fastify-type-provider-zod').ZodTypeProvider>().put(
      '/v1/campaigns/:campaign_id/residuals/:station_id/:day',
      {
        bodyLimit: ZWD_BODY_LIMIT_BYTES,
        schema: {
          summary: 'Upload the residuals of one station-day to a campaign of uploaded residuals',
          description: [
            'The body as for PUT /v1/stations/{station_id}/residuals/{day} (JSON objects or column arrays, text/csv, Arrow IPC), with the same rules and stored form; kept with the campaign, not in the station archive.',
            'Items whose days have all arrived are queued at once (`items_ready`). The same observations again answer 200 with the same sha256; other observations replace the day while no item reading it has started (409 after).',
            `400 naming params.day outside the span or params.station_id not in the campaign; 409 for a campaign of deposited residuals, a campaign that ended or whose uploads were closed. Up to ${MAX_OBSERVATIONS} observations; body limit ${ZWD_BODY_LIMIT_BYTES} bytes.`,
          ].join(' '),
          tags: ['campaigns'],
          params: campaignUploadParams,
          body: residualDepositBody,
          response: {
            200: campaignUploadResponse,
            201: campaignUploadResponse,
            ...problems,
            400: problemSchema,
            409: problemSchema,
            413: problemSchema,
            415: problemSchema,
          },
        },
        validatorCompiler: bodyInWorkerValidator,
      },
      async (request, reply) => {
        const { campaign_id: campaignId, station_id: stationId, day } = request.params;
        // The campaign, the span and the station first: a misdirected upload is refused before its body is read.
        await app.campaigns.uploadTarget(campaignId, stationId, day);
        const raw = rawBodyOf(request);
        const read = await app.compute.run('residual-deposit-read', { ...raw, day }, transferOf(raw));
        const answer = await app.campaigns.upload(campaignId, stationId, day, read);
        request.auditDetail = { source: 'campaign-residuals', records: read.observationCount };
        return reply.code(answer.created ? 201 : 200).send({
          campaign_id: campaignId,
          station_id: stationId,
          day,
          observation_count: answer.day.observationCount,
          sha256: answer.day.sha256,
          stored_bytes: answer.day.storedBytes,
          items_ready: answer.itemsReady,
        });
      },
    );
  });

  app.get(
    '/v1/campaigns/:campaign_id/residuals',
    {
      schema: {
        summary: 'The station-days uploaded to a campaign, with the sha256 of each (what a resumed upload skips)',
        tags: ['campaigns'],
        params: campaignParams,
        response: { 200: campaignUploadListResponse, ...problems },
      },
    },
    async (request) => {
      const days = await app.campaigns.listUploads(request.params.campaign_id);
      if (!days) throw noCampaign(request.params.campaign_id);
      return {
        campaign_id: request.params.campaign_id,
        days: days.map((d) => ({
          station_id: d.stationId,
          day: d.day,
          observation_count: d.observationCount,
          sha256: d.sha256,
          stored_bytes: d.storedBytes,
          stored_at: d.storedAt,
        })),
      };
    },
  );

  app.post(
    '/v1/campaigns/:campaign_id/uploads-complete',
    {
      schema: {
        summary: "Close a campaign's uploads: nothing more will come",
        description:
          'Items with some of their days uploaded run with what has arrived; items with none end as no_residuals and the report lists them. Later uploads are refused (409). 409 for a campaign of deposited residuals.',
        tags: ['campaigns'],
        params: campaignParams,
        response: { 200: campaignResponse, 409: problemSchema, ...problems },
      },
    },
    async (request) => {
      const status = await app.campaigns.closeUploads(request.params.campaign_id);
      if (!status) throw noCampaign(request.params.campaign_id);
      return campaignJson(status);
    },
  );
};

export default campaignsRoute;
