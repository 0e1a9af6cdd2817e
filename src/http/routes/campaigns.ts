/**
 * Reprocessing campaigns (src/services/campaigns): submit, list, progress, cancel, report. The items
 * run on every replica (plugins/campaigns.ts).
 */

import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { MAPPING_MODELS, type MappingModelKey } from '../../domain/mapping/registry.js';
import { provenance } from '../../domain/provenance.js';
import type { CampaignReport, CampaignStatus } from '../../services/campaigns/campaigns.js';
import { zwdModels } from '../../services/zwd-estimation.js';
import { toOptionValues } from '../adapters/zwd-estimation.js';
import { HttpProblem } from '../problem.js';
import { campaignBody, campaignListResponse, campaignParams, campaignReportResponse, campaignResponse } from '../schemas/campaigns.js';
import { problemSchema } from '../schemas/common.js';
import { DEFAULT_ESTIMATE_SOURCE } from '../schemas/station-zwd-estimates.js';

const problems = { 401: problemSchema, 403: problemSchema, 404: problemSchema, 503: problemSchema };

const noCampaign = (id: string) =>
  new HttpProblem(404, `no campaign "${id}"; GET /v1/campaigns lists them`, [{ field: 'params.campaign_id', message: 'no such campaign' }]);

const cpuS = (ms: number) => Math.round(ms) / 1000;

function campaignJson(s: CampaignStatus) {
  const c = s.campaign;
  return {
    campaign_id: c.campaignId,
    name: c.name,
    state: c.state,
    start_date: c.startDate,
    end_date: c.endDate,
    items_total: s.total,
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
        summary: 'Submit a reprocessing campaign: one option set over the deposited residuals of stations and days',
        description: [
          'One item per station-day with residuals deposited (PUT /v1/stations/{station_id}/residuals/{day}) in [start_date, end_date] for the stations (all stations with deposits when omitted).',
          'Every item is estimated as by POST /v1/stations/{station_id}/zwd-estimates with `options` and the station\'s stored met, on any replica, and stored under the source "zwd-estimates" with the campaign\'s fingerprint, exactly once.',
          '202 with the campaign; 400 naming the field for bad input; 422 when no station-day in the span has residuals.',
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
};

export default campaignsRoute;
