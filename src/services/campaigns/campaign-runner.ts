/**
 * One campaign item (a station-day or a station-window) on one replica: claim it, read its residuals
 * (deposited in the archive, or uploaded with the campaign; every day its window touches) and the
 * station's stored met, estimate (in the worker pool, through `estimate`), and store the results of its
 * kept part (item-windows.ts) with the campaign's source in the transaction that marks the item done
 * (the guard of CampaignStore). A redelivered item that is already done does nothing; one whose claim
 * was taken over or whose campaign was cancelled stores nothing.
 */

import { createHash, randomUUID } from 'node:crypto';
import type { CampaignUploadStore } from '../../storage/campaigns/campaign-upload-store.js';
import type { CampaignRecord, CampaignStore } from '../../storage/campaigns/campaign-store.js';
import type { ResidualDayData, ResidualStore } from '../../storage/campaigns/residual-store.js';
import type { WorkItem } from '../../storage/campaigns/work-queue.js';
import type { DelayRow, Repository, Station, StoredModelSet } from '../../storage/repository.js';
import { GuardRefusedError } from '../../storage/sql-executor.js';
import { storedMetAtAntenna, type MetColumns } from '../station-met.js';
import { inputDaysOf, itemSpanOf } from './campaigns.js';

const DAY_MS = 86_400_000;
/** Stored met is read this far around the item's window [ms] (as the station estimation reads 1 day around its observations). */
const MET_MARGIN_MS = DAY_MS;

export interface ItemEstimateInput {
  /** The compact stored form of each day's residuals the item reads, in day order. */
  residuals: { day: string; data: Uint8Array }[];
  /** Only observations in [fromMs, toMs) are estimated from (the item's window). */
  fromMs: number;
  toMs: number;
  /** The epochs it stores: [keepFromMs, keepToMs); none there = no input for this item. */
  keepFromMs: number;
  keepToMs: number;
  /** The campaign's options as the API's JSON. */
  options: unknown;
  site: Pick<Station, 'latitudeDeg' | 'longitudeDeg' | 'heightM'>;
  storedMet: MetColumns | undefined;
  source: string;
}

export type ItemEstimate =
  | { ok: true; rows: DelayRow[]; modelSet: StoredModelSet }
  /** `noInput`: no observation in the item's kept part (nothing to estimate there; not a failure of the estimator). */
  | { ok: false; reason: string; noInput?: boolean };

export interface RunnerDeps {
  repository: Repository;
  campaigns: CampaignStore;
  residuals: ResidualStore;
  uploads: CampaignUploadStore;
  /** The estimation of one day; `{ok: false}` for a day the estimator refuses; a throw = try again later. */
  estimate(input: ItemEstimateInput): Promise<ItemEstimate>;
  replica: string;
  /** Process CPU time [ms] (process.cpuUsage), for the CPU per item. */
  cpuMs?: () => number;
}

export type ItemOutcome = 'done' | 'failed' | 'no_residuals' | 'cancelled' | 'skipped' | 'lost';

const processCpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

/** Items in flight on this process: the CPU time of an interval is shared among them. */
let inFlight = 0;

export async function runItem(item: WorkItem, deps: RunnerDeps): Promise<ItemOutcome> {
  const { campaigns } = deps;
  const campaign = await campaigns.get(item.campaignId);
  if (!campaign) return 'skipped';
  const token = randomUUID();
  if (!(await campaigns.claim(item.campaignId, item, token, deps.replica, new Date().toISOString()))) return 'skipped';
  const cpu = deps.cpuMs ?? processCpuMs;
  const cpuStart = cpu();
  inFlight++;
  let outcome: ItemOutcome;
  try {
    outcome = await estimateAndStore(item, token, campaign, deps, () => (cpu() - cpuStart) / Math.max(1, inFlight));
  } finally {
    inFlight--;
  }
  await campaigns.finishIfComplete(item.campaignId, new Date().toISOString());
  return outcome;
}

async function estimateAndStore(
  item: WorkItem,
  token: string,
  campaign: CampaignRecord,
  deps: RunnerDeps,
  cpuSoFar: () => number,
): Promise<ItemOutcome> {
  const { campaigns, repository } = deps;
  const fail = async (reason: string) =>
    (await campaigns.finishWithout(item.campaignId, item, token, 'failed', reason, cpuSoFar())) ? 'failed' : 'lost';
  const span = itemSpanOf(campaign, item.day);
  const inputs: ResidualDayData[] = [];
  for (const day of inputDaysOf(campaign, item.day)) {
    const found =
      campaign.inputKind === 'upload'
        ? await deps.uploads.get(item.campaignId, item.stationId, day)
        : await deps.residuals.get(item.stationId, day);
    if (found) inputs.push(found);
  }
  if (inputs.length === 0) {
    return fail(
      campaign.inputKind === 'upload'
        ? 'no residuals uploaded for this item'
        : 'no residuals deposited for this station-day (deleted after the campaign was submitted)',
    );
  }
  const station = await repository.getStation(item.stationId);
  if (!station) return fail('the station does not exist any more');
  const storedMet = await metAround(repository, station, span.fromMs, span.toMs);
  const estimate = await deps.estimate({
    residuals: inputs.map((d) => ({ day: d.day, data: d.data })),
    fromMs: span.fromMs,
    toMs: span.toMs,
    keepFromMs: span.keepFromMs,
    keepToMs: span.keepToMs,
    options: JSON.parse(campaign.optionsJson) as unknown,
    site: station,
    storedMet,
    source: campaign.source,
  });
  if (!estimate.ok && estimate.noInput) {
    const ended = await campaigns.finishWithout(item.campaignId, item, token, 'no_residuals', estimate.reason, cpuSoFar());
    return ended ? 'no_residuals' : 'lost';
  }
  if (!estimate.ok) return fail(estimate.reason);
  // Only the kept part is stored: the margins of a window belong to its neighbours (item-windows.ts).
  const rows = estimate.rows.filter((r) => r.epochMs >= span.keepFromMs && r.epochMs < span.keepToMs);
  const guard = campaigns.doneGuard(item.campaignId, item, token, {
    // One day: its digest; several: the digest of their digests in day order.
    residualSha256:
      inputs.length === 1
        ? inputs[0]!.sha256
        : createHash('sha256')
            .update(inputs.map((d) => `${d.day}:${d.sha256}`).join('\n'))
            .digest('hex'),
    modelFingerprint: estimate.modelSet.modelFingerprint,
    cpuMs: cpuSoFar(),
    finishedAtMs: Date.now(),
  });
  try {
    await repository.writeDelays(item.stationId, rows, estimate.modelSet, guard);
    return 'done';
  } catch (err) {
    if (!(err instanceof GuardRefusedError)) throw err;
    // Nothing was stored: the claim was taken over (this replica was presumed dead) or the campaign was cancelled.
    const abandoned = await campaigns.finishWithout(
      item.campaignId,
      item,
      token,
      'cancelled',
      'campaign cancelled while the item ran; nothing stored',
      cpuSoFar(),
    );
    return abandoned ? 'cancelled' : 'lost';
  }
}

/** The station's stored met from a day before to a day after the item's window, at the antenna height. */
async function metAround(repository: Repository, station: Station, fromMs: number, toMs: number): Promise<MetColumns | undefined> {
  const rows = await repository.readMet(station.stationId, { fromMs: fromMs - MET_MARGIN_MS, toMs: toMs + MET_MARGIN_MS });
  const met = storedMetAtAntenna(station, rows);
  return met.epochMs.length > 0 ? met : undefined;
}
