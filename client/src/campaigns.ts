/**
 * Reprocessing campaigns: submit (`POST /v1/campaigns`), follow until finished or cancelled (polling
 * `GET /v1/campaigns/{campaign_id}`), cancel (`POST …/cancel`), close the uploads of a campaign of
 * uploaded residuals (`POST …/uploads-complete`; the uploads themselves: residual-deposit.ts with
 * `campaignId`), list, and fetch the report (`GET …/report`). Types generated from the OpenAPI
 * document (api-types.ts).
 */

import type { Answer } from './api.js';
import type { paths } from './api-types.js';
import { SILENT, type Progress } from './progress.js';
import { segment, type Service } from './service.js';

export const CAMPAIGN_STATES = ['queued', 'running', 'finished', 'cancelled'] as const;
export type CampaignState = (typeof CAMPAIGN_STATES)[number];

/** The states after which a campaign no longer changes. */
export const FINAL_STATES: ReadonlySet<CampaignState> = new Set(['finished', 'cancelled']);

/**
 * Body of `POST /v1/campaigns`: stations (absent = every station with deposits in the span; required with
 * residuals "uploaded"), start_date and end_date (YYYY-MM-DD, inclusive), the estimation options,
 * `residuals` ("deposited" or "uploaded") and an optional `window` ({length_hours, step_hours}).
 */
export type CampaignRequest = NonNullable<paths['/v1/campaigns']['post']['requestBody']>['content']['application/json'];
export type CampaignSubmitted = Answer<'/v1/campaigns', 'post'>;
export type CampaignStatus = Answer<'/v1/campaigns/{campaign_id}', 'get'>;
export type CampaignReport = Answer<'/v1/campaigns/{campaign_id}/report', 'get'>;

const campaignPath = (id: string) => `/v1/campaigns/${segment(id)}`;

export function submitCampaign(service: Service, request: CampaignRequest): Promise<CampaignSubmitted> {
  return service.json('POST', '/v1/campaigns', { json: request });
}

export function campaignStatus(service: Service, campaignId: string): Promise<CampaignStatus> {
  return service.json('GET', campaignPath(campaignId));
}

export async function listCampaigns(service: Service): Promise<Answer<'/v1/campaigns', 'get'>['campaigns']> {
  return (await service.json<Answer<'/v1/campaigns', 'get'>>('GET', '/v1/campaigns')).campaigns;
}

export function cancelCampaign(service: Service, campaignId: string): Promise<CampaignStatus> {
  return service.json('POST', `${campaignPath(campaignId)}/cancel`);
}

/** Nothing more will be uploaded: items with some input run with it, the others end as no_residuals. */
export function closeCampaignUploads(service: Service, campaignId: string): Promise<CampaignStatus> {
  return service.json('POST', `${campaignPath(campaignId)}/uploads-complete`);
}

export function campaignReport(service: Service, campaignId: string): Promise<CampaignReport> {
  return service.json('GET', `${campaignPath(campaignId)}/report`);
}

export interface FollowOptions {
  /** Time between two polls [ms]; default 2000. */
  intervalMs?: number;
  progress?: Progress;
  /** Stops following (not the campaign) when aborted; the last status is returned. */
  signal?: AbortSignal;
}

/** Polls the campaign until it is finished or cancelled (or `signal` aborts); returns the last status. */
export async function followCampaign(service: Service, campaignId: string, options: FollowOptions = {}): Promise<CampaignStatus> {
  const progress = options.progress ?? SILENT;
  const intervalMs = options.intervalMs ?? 2000;
  let status = await campaignStatus(service, campaignId);
  progress.start(status.items_total, `campaign ${campaignId}`);
  try {
    for (;;) {
      progress.update(status.items_done + status.items_failed + status.items_no_residuals, describe(status), status.items_total);
      if (FINAL_STATES.has(status.state) || options.signal?.aborted) return status;
      await sleep(intervalMs, options.signal);
      status = await campaignStatus(service, campaignId);
    }
  } finally {
    progress.stop(`campaign ${campaignId}: ${describe(status)}`);
  }
}

/** "running: 12 done, 1 failed, 3 running, 24 pending" (+ ", 5 awaiting residuals, 1 without residuals" when there are). */
export function describe(status: CampaignStatus): string {
  const uploads = [
    status.items_awaiting_residuals ? `${status.items_awaiting_residuals} awaiting residuals` : '',
    status.items_no_residuals ? `${status.items_no_residuals} without residuals` : '',
  ].filter(Boolean);
  return (
    `${status.state}: ${status.items_done} done, ${status.items_failed} failed, ` +
    `${status.items_running} running, ${status.items_pending} pending${uploads.length ? `, ${uploads.join(', ')}` : ''}`
  );
}

function sleep(ms: number, signal?: AbortSignal): Promise<void> {
  return new Promise((resolve) => {
    const timer = setTimeout(resolve, ms);
    signal?.addEventListener(
      'abort',
      () => {
        clearTimeout(timer);
        resolve();
      },
      { once: true },
    );
  });
}
