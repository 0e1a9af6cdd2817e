/**
 * One campaign item (a station-day) on one replica: claim it, read its residuals and the station's
 * stored met, estimate (in the worker pool, through `estimate`), and store the results with the
 * campaign's source in the transaction that marks the item done (the guard of CampaignStore). A
 * redelivered item that is already done does nothing; one whose claim was taken over or whose
 * campaign was cancelled stores nothing.
 */

import { randomUUID } from 'node:crypto';
import { dayStartMs } from '../../formats/residual-day-form.js';
import type { CampaignStore } from '../../storage/campaigns/campaign-store.js';
import type { ResidualStore } from '../../storage/campaigns/residual-store.js';
import type { WorkItem } from '../../storage/campaigns/work-queue.js';
import type { DelayRow, Repository, Station, StoredModelSet } from '../../storage/repository.js';
import { GuardRefusedError } from '../../storage/sql-executor.js';
import { storedMetAtAntenna, type MetColumns } from '../station-met.js';

const DAY_MS = 86_400_000;
/** Stored met is read this far around the day [ms] (as the station estimation reads 1 day around its observations). */
const MET_MARGIN_MS = DAY_MS;

export interface ItemEstimateInput {
  /** The compact stored form of the day's residuals. */
  residuals: Uint8Array;
  day: string;
  /** The campaign's options as the API's JSON. */
  options: unknown;
  site: Pick<Station, 'latitudeDeg' | 'longitudeDeg' | 'heightM'>;
  storedMet: MetColumns | undefined;
  source: string;
}

export type ItemEstimate = { ok: true; rows: DelayRow[]; modelSet: StoredModelSet } | { ok: false; reason: string };

export interface RunnerDeps {
  repository: Repository;
  campaigns: CampaignStore;
  residuals: ResidualStore;
  /** The estimation of one day; `{ok: false}` for a day the estimator refuses; a throw = try again later. */
  estimate(input: ItemEstimateInput): Promise<ItemEstimate>;
  replica: string;
  /** Process CPU time [ms] (process.cpuUsage), for the CPU per item. */
  cpuMs?: () => number;
}

export type ItemOutcome = 'done' | 'failed' | 'cancelled' | 'skipped' | 'lost';

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
    outcome = await estimateAndStore(
      item,
      token,
      campaign.optionsJson,
      campaign.source,
      deps,
      () => (cpu() - cpuStart) / Math.max(1, inFlight),
    );
  } finally {
    inFlight--;
  }
  await campaigns.finishIfComplete(item.campaignId, new Date().toISOString());
  return outcome;
}

async function estimateAndStore(
  item: WorkItem,
  token: string,
  optionsJson: string,
  source: string,
  deps: RunnerDeps,
  cpuSoFar: () => number,
): Promise<ItemOutcome> {
  const { campaigns, repository } = deps;
  const fail = async (reason: string) =>
    (await campaigns.finishWithout(item.campaignId, item, token, 'failed', reason, cpuSoFar())) ? 'failed' : 'lost';
  const deposit = await deps.residuals.get(item.stationId, item.day);
  if (!deposit) return fail('no residuals deposited for this station-day (deleted after the campaign was submitted)');
  const station = await repository.getStation(item.stationId);
  if (!station) return fail('the station does not exist any more');
  const storedMet = await metAround(repository, station, item.day);
  const estimate = await deps.estimate({
    residuals: deposit.data,
    day: item.day,
    options: JSON.parse(optionsJson) as unknown,
    site: station,
    storedMet,
    source,
  });
  if (!estimate.ok) return fail(estimate.reason);
  const guard = campaigns.doneGuard(item.campaignId, item, token, {
    residualSha256: deposit.sha256,
    modelFingerprint: estimate.modelSet.modelFingerprint,
    cpuMs: cpuSoFar(),
    finishedAtMs: Date.now(),
  });
  try {
    await repository.writeDelays(item.stationId, estimate.rows, estimate.modelSet, guard);
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

/** The station's stored met from a day before to a day after the station-day, at the antenna height. */
async function metAround(repository: Repository, station: Station, day: string): Promise<MetColumns | undefined> {
  const start = dayStartMs(day);
  const rows = await repository.readMet(station.stationId, { fromMs: start - MET_MARGIN_MS, toMs: start + DAY_MS + MET_MARGIN_MS });
  const met = storedMetAtAntenna(station, rows);
  return met.epochMs.length > 0 ? met : undefined;
}
