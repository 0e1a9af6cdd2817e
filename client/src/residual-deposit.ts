/**
 * Deposits a station's observation residuals from an observation CSV of many days (the table of
 * `POST /v1/zwd-estimates`: epoch, satellite, elevation_deg, azimuth_deg, residual_m, sigma_m?) as
 * station-days: one idempotent `PUT /v1/stations/{station_id}/residuals/{day}` per UTC day, its body the
 * day's rows as CSV. With `campaignId` the days go to that campaign of uploaded residuals instead
 * (`PUT /v1/campaigns/{campaign_id}/residuals/{station_id}/{day}`, listed by `GET …/residuals`); days
 * outside the campaign's span are not sent (counted as `daysOutsideSpan`).
 *
 * Resuming. The service answers each deposit with the sha256 of its stored (canonical) form and lists the
 * deposited days with theirs (`GET /v1/stations/{station_id}/residuals`). The client does not rebuild the
 * canonical form itself; it keeps a resume state next to the input (upload-state.ts) with, per day, the
 * sha256 of the body it sent and the service's sha256 of what it stored. A day is skipped on a rerun only
 * when both still match: the body cut from the file is byte for byte the one accepted, and the service
 * still holds what it stored then (not replaced or deleted since). Every other day is sent; a day sent but
 * not recorded (the process killed between the answer and the state write) is sent again and replaces
 * itself with the same content.
 */

import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import type { Answer } from './api.js';
import { partText, splitCsvByDay } from './day-split.js';
import { SILENT, type Progress } from './progress.js';
import { segment, type Service } from './service.js';
import { defaultStatePath, sha256Hex, UploadState } from './upload-state.js';

/** Answer of `PUT /v1/stations/{station_id}/residuals/{day}`. */
export type ResidualDayAnswer = Answer<'/v1/stations/{station_id}/residuals/{day}', 'put'>;

/** One entry of `GET /v1/stations/{station_id}/residuals`. */
export type ResidualDayListing = Answer<'/v1/stations/{station_id}/residuals', 'get'>['days'][number];

/** Answer of `PUT /v1/campaigns/{campaign_id}/residuals/{station_id}/{day}`. */
export type CampaignUploadAnswer = Answer<'/v1/campaigns/{campaign_id}/residuals/{station_id}/{day}', 'put'>;

export interface ResidualDepositOptions {
  stationId: string;
  /** Upload to this campaign of uploaded residuals instead of depositing in the station archive. */
  campaignId?: string | undefined;
  /** Observation CSV (header with an `epoch` column; any number of days). */
  file: string;
  /** Resume state file; default `<file>.tropo-state.json`. */
  statePath?: string;
  /** Send every day even when the service holds it already. */
  force?: boolean;
  progress?: Progress;
}

export type DayOutcome = 'sent' | 'skipped';

export interface ResidualDepositResult {
  stationId: string;
  statePath: string;
  daysTotal: number;
  daysSent: number;
  daysSkipped: number;
  /** Campaign uploads: days of the file outside the campaign's span (not sent). */
  daysOutsideSpan: number;
  /** Campaign uploads: items that became ready (queued) with the days sent. */
  itemsReady: number;
  observationsSent: number;
  days: Array<{ day: string; outcome: DayOutcome; observationCount: number; sha256: string; storedBytes?: number }>;
}

/** The station's days uploaded to a campaign, by day. */
export async function listCampaignUploads(
  service: Service,
  campaignId: string,
  stationId: string,
): Promise<Map<string, ResidualDayListing>> {
  const answer = await service.json<Answer<'/v1/campaigns/{campaign_id}/residuals', 'get'>>(
    'GET',
    `/v1/campaigns/${segment(campaignId)}/residuals`,
  );
  return new Map(answer.days.filter((d) => d.station_id === stationId).map((d) => [d.day, d]));
}

/** The station's deposited days, by day. */
export async function listResidualDays(service: Service, stationId: string): Promise<Map<string, ResidualDayListing>> {
  const answer = await service.json<Answer<'/v1/stations/{station_id}/residuals', 'get'>>(
    'GET',
    `/v1/stations/${segment(stationId)}/residuals`,
  );
  return new Map(answer.days.map((d) => [d.day, d]));
}

/**
 * Deposits every day of the file that the service does not hold yet as the state file recorded it (see
 * the module comment). A day the service refuses stops the deposit with its error; the days before it
 * stay deposited and recorded, so the rerun after the fix starts there.
 * @throws InputFileError when the file has no epoch column or an epoch that is not ISO 8601 (nothing sent)
 */
export async function depositResiduals(service: Service, options: ResidualDepositOptions): Promise<ResidualDepositResult> {
  const split = splitCsvByDay(readFileSync(options.file, 'utf8'), basename(options.file), 'refuse');
  const statePath = options.statePath ?? defaultStatePath(options.file);
  const state = UploadState.load(statePath, 'residuals');
  const progress = options.progress ?? SILENT;
  const campaignId = options.campaignId;
  // The state keeps a campaign's uploads apart from the station's deposits.
  const stateKey = campaignId === undefined ? options.stationId : `campaign:${campaignId}/${options.stationId}`;
  let parts = split.parts;
  let daysOutsideSpan = 0;
  if (campaignId !== undefined) {
    const campaign = await service.json<Answer<'/v1/campaigns/{campaign_id}', 'get'>>('GET', `/v1/campaigns/${segment(campaignId)}`);
    parts = split.parts.filter((p) => p.day >= campaign.start_date && p.day <= campaign.end_date);
    daysOutsideSpan = split.parts.length - parts.length;
  }
  const stored = options.force
    ? new Map<string, ResidualDayListing>()
    : campaignId === undefined
      ? await listResidualDays(service, options.stationId)
      : await listCampaignUploads(service, campaignId, options.stationId);
  const result: ResidualDepositResult = {
    stationId: options.stationId,
    statePath,
    daysTotal: parts.length,
    daysSent: 0,
    daysSkipped: 0,
    daysOutsideSpan,
    itemsReady: 0,
    observationsSent: 0,
    days: [],
  };
  const label = campaignId === undefined ? `residuals ${options.stationId}` : `campaign ${campaignId} ${options.stationId}`;
  const path = (day: string) =>
    campaignId === undefined
      ? `/v1/stations/${segment(options.stationId)}/residuals/${day}`
      : `/v1/campaigns/${segment(campaignId)}/residuals/${segment(options.stationId)}/${day}`;
  progress.start(parts.length, label);
  let done = 0;
  try {
    for (const part of parts) {
      const body = partText(split, part);
      const bodySha256 = sha256Hex(body);
      const remembered = state.get(stateKey, part.day);
      const held = stored.get(part.day);
      if (remembered && held && remembered.bodySha256 === bodySha256 && remembered.serviceSha256 === held.sha256) {
        result.daysSkipped++;
        result.days.push({ day: part.day, outcome: 'skipped', observationCount: held.observation_count, sha256: held.sha256 });
        progress.update(++done, `${part.day} already deposited`);
        continue;
      }
      const answer = await service.json<ResidualDayAnswer | CampaignUploadAnswer>('PUT', path(part.day), {
        body,
        contentType: 'text/csv',
      });
      if ('items_ready' in answer) result.itemsReady += answer.items_ready;
      state.record(stateKey, part.day, {
        bodySha256,
        serviceSha256: answer.sha256,
        count: answer.observation_count,
        acceptedAt: new Date().toISOString(),
      });
      result.daysSent++;
      result.observationsSent += answer.observation_count;
      result.days.push({
        day: part.day,
        outcome: 'sent',
        observationCount: answer.observation_count,
        sha256: answer.sha256,
        storedBytes: answer.stored_bytes,
      });
      progress.update(++done, `${part.day} ${answer.observation_count} observations`);
    }
  } finally {
    progress.stop(
      `${label}: ${result.daysSent} day(s) sent (${result.observationsSent} observations), ${result.daysSkipped} already held` +
        (daysOutsideSpan ? `, ${daysOutsideSpan} outside the campaign's span` : ''),
    );
  }
  return result;
}
