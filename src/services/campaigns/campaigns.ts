/**
 * Reprocessing campaigns, in domain terms: submit (the station-days with deposited residuals in a span,
 * one option set and its fingerprint), the state with its counts, cancel, and the report with its
 * homogeneity check against what the archive holds now. The items run through a WorkQueue
 * (src/storage/campaigns/work-queue.ts) and runItem (campaign-runner.ts) on every replica.
 */

import { randomUUID } from 'node:crypto';
import { dayStartMs } from '../../formats/residual-day-form.js';
import { MAX_CAMPAIGN_ITEMS } from '../../limits.js';
import type { CampaignRecord, CampaignStore, ItemRecord, ItemState, ReplicaWork } from '../../storage/campaigns/campaign-store.js';
import type { ResidualStore } from '../../storage/campaigns/residual-store.js';
import type { WorkQueue } from '../../storage/campaigns/work-queue.js';
import type { Repository } from '../../storage/repository.js';
import { CallerError } from '../caller-error.js';

const DAY_MS = 86_400_000;

export interface CampaignRequest {
  name: string | null;
  /** Absent: every station with deposits in the span. */
  stations: readonly string[] | undefined;
  startDate: string;
  endDate: string;
  /** The estimation options as the API's JSON (validated, defaults applied). */
  optionsJson: string;
  /** The fingerprint every result of the campaign should carry. */
  modelFingerprint: string;
  /** Source name of the stored delay series. */
  source: string;
}

export interface CampaignStatus {
  campaign: CampaignRecord;
  counts: Record<ItemState, number>;
  total: number;
  replicas: ReplicaWork[];
}

export interface CampaignException {
  stationId: string;
  day: string;
  reason: string;
  fingerprint?: string;
}

export interface CampaignReport extends CampaignStatus {
  homogeneous: boolean;
  fingerprints: { fingerprint: string; stationDays: number }[];
  exceptions: CampaignException[];
  /** Seconds from the first claim to the end (or now, while running); null before any item started. */
  elapsedS: number | null;
}

export class CampaignService {
  constructor(
    private readonly repository: Repository,
    private readonly store: CampaignStore,
    private readonly residuals: ResidualStore,
    private readonly queue: WorkQueue,
  ) {}

  /**
   * Creates the campaign with one item per deposited station-day, then queues the items.
   * @throws CallerError 400 (end before start, unknown station, too many items), 422 (no station-day has residuals)
   */
  async submit(request: CampaignRequest): Promise<CampaignStatus> {
    if (request.endDate < request.startDate) {
      throw CallerError.field(
        400,
        'end_date',
        `${request.endDate} is before start_date ${request.startDate}; the span is inclusive, end_date ≥ start_date`,
      );
    }
    if (request.stations) await this.checkStations(request.stations);
    const days = await this.residuals.listMany(request.startDate, request.endDate, request.stations);
    if (days.length === 0) {
      throw CallerError.field(
        422,
        request.stations ? 'stations' : 'start_date',
        `no station-day ${request.stations ? 'of these stations ' : ''}has residuals deposited from ${request.startDate} to ${request.endDate}; deposit them with PUT /v1/stations/{station_id}/residuals/{day}`,
      );
    }
    if (days.length > MAX_CAMPAIGN_ITEMS) {
      throw CallerError.field(
        400,
        'end_date',
        `${days.length} station-days in the span; a campaign takes at most ${MAX_CAMPAIGN_ITEMS}: split the span`,
      );
    }
    const campaign: CampaignRecord = {
      campaignId: randomUUID(),
      name: request.name,
      state: 'queued',
      startDate: request.startDate,
      endDate: request.endDate,
      optionsJson: request.optionsJson,
      modelFingerprint: request.modelFingerprint,
      source: request.source,
      createdAt: new Date().toISOString(),
      startedAt: null,
      finishedAt: null,
    };
    const items = days.map((d) => ({ stationId: d.stationId, day: d.day }));
    await this.store.create(campaign, items);
    await this.queue.enqueue(items.map((i) => ({ campaignId: campaign.campaignId, ...i })));
    return (await this.status(campaign.campaignId))!;
  }

  private async checkStations(stations: readonly string[]): Promise<void> {
    const known = new Set((await this.repository.listStations()).map((s) => s.stationId));
    const errors = stations
      .map((id, i) => ({ id, i }))
      .filter(({ id }) => !known.has(id))
      .map(({ id, i }) => ({ field: `stations.${i}`, message: `no station "${id}"; create it with PUT /v1/stations/${id}` }));
    if (errors.length) throw new CallerError(400, `${errors[0]!.field}: ${errors[0]!.message}`, errors);
  }

  async status(campaignId: string): Promise<CampaignStatus | null> {
    const campaign = await this.store.get(campaignId);
    if (!campaign) return null;
    const counts = await this.store.counts(campaignId);
    const total = Object.values(counts).reduce((a, b) => a + b, 0);
    return { campaign, counts, total, replicas: await this.store.replicas(campaignId) };
  }

  async list(): Promise<CampaignStatus[]> {
    const out: CampaignStatus[] = [];
    for (const c of await this.store.list()) out.push((await this.status(c.campaignId))!);
    return out;
  }

  /** Cancels the campaign (pending items are not started); null when there is none. */
  async cancel(campaignId: string): Promise<CampaignStatus | null> {
    if (!(await this.store.get(campaignId))) return null;
    await this.store.cancel(campaignId, new Date().toISOString());
    return this.status(campaignId);
  }

  /**
   * The report: items by state, and the fingerprints the archive holds now for every station-day the
   * campaign did (read back, so that a later re-estimation with other options shows), with the exceptions:
   * failed items (their reason), and done station-days whose stored results carry another fingerprint
   * or are gone. Homogeneous: every done station-day holds results of the campaign's fingerprint only.
   */
  async report(campaignId: string): Promise<CampaignReport | null> {
    const status = await this.status(campaignId);
    if (!status) return null;
    const { campaign } = status;
    const items = await this.store.items(campaignId);
    const stored = await this.storedFingerprints(
      campaign,
      items.filter((i) => i.state === 'done'),
    );
    const perFingerprint = new Map<string, number>();
    const exceptions: CampaignException[] = [];
    for (const item of items) {
      if (item.state === 'failed')
        exceptions.push({ stationId: item.stationId, day: item.day, reason: `failed: ${item.reason ?? 'unknown'}` });
      if (item.state !== 'done') continue;
      const fingerprints = stored.get(`${item.stationId}|${item.day}`) ?? new Set<string>();
      for (const f of fingerprints) perFingerprint.set(f, (perFingerprint.get(f) ?? 0) + 1);
      if (fingerprints.size === 0) {
        exceptions.push({
          stationId: item.stationId,
          day: item.day,
          reason: `no stored results under source "${campaign.source}" any more (deleted after the campaign)`,
        });
      }
      for (const f of fingerprints) {
        if (f === campaign.modelFingerprint) continue;
        exceptions.push({
          stationId: item.stationId,
          day: item.day,
          reason:
            item.modelFingerprint !== null && item.modelFingerprint !== campaign.modelFingerprint
              ? `estimated with fingerprint ${item.modelFingerprint}, not the campaign's ${campaign.modelFingerprint} (a replica of another release)`
              : `stored results carry fingerprint ${f}, not the campaign's ${campaign.modelFingerprint}: re-estimated with other options or models after this campaign`,
          fingerprint: f,
        });
      }
    }
    const fingerprints = [...perFingerprint]
      .map(([fingerprint, stationDays]) => ({ fingerprint, stationDays }))
      .sort((a, b) => b.stationDays - a.stationDays);
    const homogeneous =
      fingerprints.every((f) => f.fingerprint === campaign.modelFingerprint) &&
      !exceptions.some((e) => e.fingerprint !== undefined || e.reason.startsWith('no stored'));
    const startMs = campaign.startedAt ? Date.parse(campaign.startedAt) : NaN;
    const endMs = campaign.finishedAt ? Date.parse(campaign.finishedAt) : Date.now();
    return {
      ...status,
      homogeneous,
      fingerprints,
      exceptions,
      elapsedS: Number.isNaN(startMs) ? null : Math.max(0, endMs - startMs) / 1000,
    };
  }

  /** station|day → the fingerprints of the stored delay rows of that UTC day under the campaign's source. */
  private async storedFingerprints(campaign: CampaignRecord, done: readonly ItemRecord[]): Promise<Map<string, Set<string>>> {
    const out = new Map<string, Set<string>>();
    const stations = [...new Set(done.map((i) => i.stationId))];
    const fromMs = dayStartMs(campaign.startDate);
    const toMs = dayStartMs(campaign.endDate) + DAY_MS - 1;
    const wanted = new Set(done.map((i) => `${i.stationId}|${i.day}`));
    for (let at = 0; at < stations.length; at += 100) {
      const ranges = stations.slice(at, at + 100).map((stationId) => ({ stationId, fromMs, toMs }));
      const rows = await this.repository.readZenithDelaysMany(ranges, campaign.source);
      for (const [stationId, list] of rows) {
        for (const r of list) {
          const key = `${stationId}|${new Date(r.epochMs).toISOString().slice(0, 10)}`;
          if (!wanted.has(key)) continue;
          let set = out.get(key);
          if (!set) out.set(key, (set = new Set()));
          set.add(r.modelFingerprint);
        }
      }
    }
    return out;
  }
}
