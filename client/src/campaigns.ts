/**
 * Reprocessing campaigns: submit (`POST /v1/campaigns`), follow until finished or cancelled (polling
 * `GET /v1/campaigns/{campaign_id}`), cancel (`POST …/cancel`), list, and fetch the report
 * (`GET …/report`). Shapes written against the interface of issue 14 (the routes of the campaigns work).
 */

import { SILENT, type Progress } from './progress.js';
import { segment, type Service } from './service.js';

export const CAMPAIGN_STATES = ['queued', 'running', 'finished', 'cancelled'] as const;
export type CampaignState = (typeof CAMPAIGN_STATES)[number];

/** The states after which a campaign no longer changes. */
export const FINAL_STATES: ReadonlySet<CampaignState> = new Set(['finished', 'cancelled']);

export interface CampaignRequest {
  name?: string;
  /** Station ids; absent = every station with deposits in the span. */
  stations?: string[];
  /** YYYY-MM-DD, inclusive. */
  start_date: string;
  end_date: string;
  /** The single-station estimation options (as in `POST /v1/zwd-estimates`). */
  options: Record<string, unknown>;
}

export interface CampaignSubmitted {
  campaign_id: string;
  state: CampaignState;
  items_total: number;
  model_fingerprint: string;
  created_at: string;
}

export interface CampaignStatus extends CampaignSubmitted {
  name?: string | null;
  items_done: number;
  items_failed: number;
  items_pending: number;
  items_running: number;
  started_at?: string | null;
  finished_at?: string | null;
  replicas?: Array<{ replica: string; items_done: number; cpu_s: number }>;
}

export interface CampaignReport {
  campaign_id: string;
  state: CampaignState;
  homogeneous: boolean;
  model_fingerprint: string;
  fingerprints: Array<{ fingerprint: string; station_days: number }>;
  exceptions: Array<{ station_id: string; day: string; reason: string; fingerprint?: string }>;
  items: { total: number; done: number; failed: number; cancelled: number };
  throughput: { station_days_per_s: number; per_replica: unknown[] };
}

const campaignPath = (id: string) => `/v1/campaigns/${segment(id)}`;

export function submitCampaign(service: Service, request: CampaignRequest): Promise<CampaignSubmitted> {
  return service.json('POST', '/v1/campaigns', { json: request });
}

export function campaignStatus(service: Service, campaignId: string): Promise<CampaignStatus> {
  return service.json('GET', campaignPath(campaignId));
}

export async function listCampaigns(service: Service): Promise<CampaignStatus[]> {
  return (await service.json<{ campaigns: CampaignStatus[] }>('GET', '/v1/campaigns')).campaigns;
}

export function cancelCampaign(service: Service, campaignId: string): Promise<CampaignStatus> {
  return service.json('POST', `${campaignPath(campaignId)}/cancel`);
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
      progress.update(status.items_done + status.items_failed, describe(status), status.items_total);
      if (FINAL_STATES.has(status.state) || options.signal?.aborted) return status;
      await sleep(intervalMs, options.signal);
      status = await campaignStatus(service, campaignId);
    }
  } finally {
    progress.stop(`campaign ${campaignId}: ${describe(status)}`);
  }
}

/** "running: 12 done, 1 failed, 3 running, 24 pending" */
export function describe(status: CampaignStatus): string {
  return (
    `${status.state}: ${status.items_done} done, ${status.items_failed} failed, ` +
    `${status.items_running} running, ${status.items_pending} pending`
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
