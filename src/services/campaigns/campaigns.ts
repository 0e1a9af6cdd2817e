/**
 * Reprocessing campaigns, in domain terms: submit (station-days or station-windows over a span, one
 * option set and its fingerprint; residuals deposited in the archive or uploaded with the campaign),
 * uploads and their close, the state with its counts, cancel, the sweep that queues items whose job was
 * never sent, and the report with its homogeneity check against what the archive holds now. The items
 * run through a WorkQueue (src/storage/campaigns/work-queue.ts) and runItem (campaign-runner.ts) on
 * every replica.
 */

import { randomUUID } from 'node:crypto';
import { MAX_CAMPAIGN_ITEMS, MAX_CAMPAIGN_STATIONS } from '../../limits.js';
import type { CampaignUploadStore } from '../../storage/campaigns/campaign-upload-store.js';
import type {
  CampaignRecord,
  CampaignStore,
  InputKind,
  ItemRecord,
  ItemState,
  ReplicaWork,
  StationDay,
} from '../../storage/campaigns/campaign-store.js';
import { ITEM_STATES } from '../../storage/campaigns/campaign-store.js';
import type { ResidualDayInfo, ResidualStore } from '../../storage/campaigns/residual-store.js';
import type { WorkItem, WorkQueue } from '../../storage/campaigns/work-queue.js';
import type { Repository } from '../../storage/repository.js';
import { CallerError } from '../caller-error.js';
import { daysOverlapping, itemSpans, keyAtEpoch, spanMs, spanOfKey, type ItemSpan, type WindowSpec } from './item-windows.js';

/** The window spec of a campaign record (null = station-days). */
export const windowOf = (c: CampaignRecord): WindowSpec | null =>
  c.windowLengthMs !== null && c.windowStepMs !== null ? { lengthMs: c.windowLengthMs, stepMs: c.windowStepMs } : null;

/** The span of one item of a campaign. */
export const itemSpanOf = (c: CampaignRecord, key: string): ItemSpan => spanOfKey(key, c.startDate, c.endDate, windowOf(c));

/**
 * The days whose residuals an item reads: every day its window touches (deposits), or those within
 * the campaign's span (uploads: only days of the span are taken).
 */
export function inputDaysOf(c: CampaignRecord, key: string): string[] {
  const span = itemSpanOf(c, key);
  const days = daysOverlapping(span.fromMs, span.toMs);
  return c.inputKind === 'upload' ? days.filter((d) => d >= c.startDate && d <= c.endDate) : days;
}

export interface UploadAnswer {
  day: ResidualDayInfo;
  /** 201 new, 200 the same bytes again or a replacement before any item used the day. */
  created: boolean;
  /** Items that became pending (queued) with this upload. */
  itemsReady: number;
}
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
  /** Deposited in the archive, or uploaded to the campaign after submission. */
  inputKind: InputKind;
  /** Station-windows; null = station-days. */
  window: WindowSpec | null;
}

export interface CampaignStatus {
  campaign: CampaignRecord;
  counts: Record<ItemState, number>;
  total: number;
  replicas: ReplicaWork[];
}

export interface CampaignException {
  stationId: string;
  /** The item's day, or (windows) the day its kept part starts. */
  day: string;
  /** Windows: the item's kept part [from, to) [ms]. */
  keptFromMs?: number;
  keptToMs?: number;
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
    private readonly uploads: CampaignUploadStore,
  ) {}

  /**
   * Creates the campaign with its items, then queues those that are ready. Deposits: one item per
   * station-day with a deposit (station-windows: per window whose kept part touches a deposited day).
   * Uploads: one item per named station and day (or window), awaiting its residuals.
   * @throws CallerError 400 (end before start, unknown station, too many items, uploads without stations),
   *   422 (no station-day has residuals)
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
    const spans = itemSpans(request.startDate, request.endDate, request.window);
    const items = request.inputKind === 'upload' ? this.uploadItems(request, spans) : await this.depositItems(request, spans);
    if (items.length > MAX_CAMPAIGN_ITEMS) {
      throw CallerError.field(
        400,
        'end_date',
        `${items.length} items (${request.window ? 'station-windows' : 'station-days'}) in the span; a campaign takes at most ${MAX_CAMPAIGN_ITEMS}: split the span`,
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
      inputKind: request.inputKind,
      windowLengthMs: request.window?.lengthMs ?? null,
      windowStepMs: request.window?.stepMs ?? null,
      uploadsClosedAt: null,
      createdAt: new Date().toISOString(),
      startedAt: null,
      finishedAt: null,
    };
    await this.store.create(campaign, items);
    if (request.inputKind === 'deposits') {
      // A replica that dies here leaves the items pending and unqueued: the sweep queues them.
      await this.queue.enqueue(items.map((i) => ({ campaignId: campaign.campaignId, ...i })));
      await this.store.markQueued(campaign.campaignId, 'all pending');
    }
    return (await this.status(campaign.campaignId))!;
  }

  private uploadItems(request: CampaignRequest, spans: readonly ItemSpan[]): StationDay[] {
    if (!request.stations) {
      throw CallerError.field(
        400,
        'stations',
        `required when residuals is "uploaded": name the 1..${MAX_CAMPAIGN_STATIONS} stations whose residuals you will upload to the campaign`,
      );
    }
    return request.stations.flatMap((stationId) => spans.map((s) => ({ stationId, day: s.key })));
  }

  private async depositItems(request: CampaignRequest, spans: readonly ItemSpan[]): Promise<StationDay[]> {
    const days = await this.residuals.listMany(request.startDate, request.endDate, request.stations);
    if (days.length === 0) {
      throw CallerError.field(
        422,
        request.stations ? 'stations' : 'start_date',
        `no station-day ${request.stations ? 'of these stations ' : ''}has residuals deposited from ${request.startDate} to ${request.endDate}; deposit them with PUT /v1/stations/{station_id}/residuals/{day}`,
      );
    }
    if (!request.window) return days.map((d) => ({ stationId: d.stationId, day: d.day }));
    // A window is an item when a deposited day of its station touches its kept part.
    const depositedDays = new Map<string, Set<string>>();
    for (const d of days) {
      let set = depositedDays.get(d.stationId);
      if (!set) depositedDays.set(d.stationId, (set = new Set()));
      set.add(d.day);
    }
    const items: StationDay[] = [];
    for (const [stationId, set] of depositedDays) {
      for (const s of spans) {
        if (daysOverlapping(s.keepFromMs, s.keepToMs).some((d) => set.has(d))) items.push({ stationId, day: s.key });
      }
    }
    return items;
  }

  /**
   * Stores one uploaded station-day of a campaign of uploads, and queues the items it completes (every
   * day they read has arrived). The same bytes again answer as before; other bytes replace the day only
   * while no item reading it has started.
   * @throws CallerError 404 (no campaign), 409 (deposits campaign, not active, uploads closed, day already used),
   *   400 (station not in the campaign, day outside the span)
   */
  async upload(
    campaignId: string,
    stationId: string,
    day: string,
    encoded: { bytes: Uint8Array; sha256: string; observationCount: number },
  ): Promise<UploadAnswer> {
    const { campaign, touching } = await this.uploadTarget(campaignId, stationId, day);
    const before = await this.uploads.get(campaignId, stationId, day);
    if (before && before.sha256 === encoded.sha256) {
      return { day: before, created: false, itemsReady: 0 };
    }
    const used = touching.filter((i) => i.state !== 'awaiting_residuals' && i.state !== 'pending');
    if (before && used.length > 0) {
      throw CallerError.field(
        409,
        'params.day',
        `item ${used[0]!.day} of ${stationId} has already ${used[0]!.state === 'running' ? 'started' : 'ended'} with the residuals uploaded before (sha256 ${before.sha256}); they can no longer be replaced`,
      );
    }
    const info = { stationId, day, observationCount: encoded.observationCount, sha256: encoded.sha256, storedAt: new Date().toISOString() };
    const { created } = await this.uploads.put(campaignId, info, encoded.bytes);
    const uploaded = new Set((await this.uploads.list(campaignId, stationId)).map((d) => d.day));
    const complete = touching
      .filter((i) => i.state === 'awaiting_residuals' && inputDaysOf(campaign, i.day).every((d) => uploaded.has(d)))
      .map((i) => ({ stationId, day: i.day }));
    const ready = await this.store.makeReady(campaignId, complete);
    await this.queueItems(campaignId, ready);
    return { day: { ...info, storedBytes: encoded.bytes.byteLength }, created, itemsReady: ready.length };
  }

  /**
   * Where an upload goes: the campaign (of uploads, active, uploads open), the day within its span, the
   * station one of its own, and the items reading that day. The route checks this before reading the body.
   * @throws CallerError as upload()
   */
  async uploadTarget(campaignId: string, stationId: string, day: string): Promise<{ campaign: CampaignRecord; touching: ItemRecord[] }> {
    const campaign = await this.store.get(campaignId);
    if (!campaign) throw CallerError.field(404, 'params.campaign_id', `no campaign "${campaignId}"; GET /v1/campaigns lists them`);
    if (campaign.inputKind !== 'upload') {
      throw CallerError.field(
        409,
        'params.campaign_id',
        'this campaign reads residuals deposited in the archive; deposit with PUT /v1/stations/{station_id}/residuals/{day}, or submit a campaign with "residuals": "uploaded"',
      );
    }
    if (campaign.state === 'finished' || campaign.state === 'cancelled' || campaign.uploadsClosedAt !== null) {
      throw CallerError.field(
        409,
        'params.campaign_id',
        campaign.uploadsClosedAt !== null
          ? `the campaign's uploads were closed at ${campaign.uploadsClosedAt}; submit a new campaign for more residuals`
          : `the campaign is ${campaign.state}; it takes no more uploads`,
      );
    }
    if (day < campaign.startDate || day > campaign.endDate) {
      throw CallerError.field(
        400,
        'params.day',
        `${day} is outside the campaign's span ${campaign.startDate} … ${campaign.endDate} (inclusive)`,
      );
    }
    const touching = await this.itemsReading(campaign, stationId, day);
    if (touching.length === 0) {
      throw CallerError.field(400, 'params.station_id', `station "${stationId}" is not one of the campaign's stations`);
    }
    return { campaign, touching };
  }

  /** The campaign's items of this station that read `day`. */
  private async itemsReading(campaign: CampaignRecord, stationId: string, day: string): Promise<ItemRecord[]> {
    const items = await this.store.itemsOfStation(campaign.campaignId, stationId, ITEM_STATES);
    return items.filter((i) => inputDaysOf(campaign, i.day).includes(day));
  }

  private async queueItems(campaignId: string, items: readonly StationDay[]): Promise<void> {
    if (items.length === 0) return;
    // A replica that dies between makeReady and here leaves them pending and unqueued: the sweep queues them.
    await this.queue.enqueue(items.map((i) => ({ campaignId, ...i })));
    await this.store.markQueued(campaignId, items);
  }

  /** The station-days uploaded to a campaign; null when there is no campaign. */
  async listUploads(campaignId: string): Promise<ResidualDayInfo[] | null> {
    if (!(await this.store.get(campaignId))) return null;
    return this.uploads.list(campaignId);
  }

  /**
   * Closes a campaign's uploads: items with some of their days uploaded run with what has arrived; the
   * others end as no_residuals (the report lists them). Closing again answers the campaign again.
   * @throws CallerError 409 for a campaign of deposits
   */
  async closeUploads(campaignId: string): Promise<CampaignStatus | null> {
    const campaign = await this.store.get(campaignId);
    if (!campaign) return null;
    if (campaign.inputKind !== 'upload') {
      throw CallerError.field(409, 'params.campaign_id', 'this campaign reads deposited residuals; it has no uploads to close');
    }
    const uploaded = new Map<string, Set<string>>();
    for (const d of await this.uploads.list(campaignId)) {
      let set = uploaded.get(d.stationId);
      if (!set) uploaded.set(d.stationId, (set = new Set()));
      set.add(d.day);
    }
    const awaiting = (await this.store.items(campaignId)).filter((i) => i.state === 'awaiting_residuals');
    const ready = awaiting
      .filter((i) => inputDaysOf(campaign, i.day).some((d) => uploaded.get(i.stationId)?.has(d)))
      .map((i) => ({ stationId: i.stationId, day: i.day }));
    await this.store.closeUploads(campaignId, ready, new Date().toISOString());
    await this.queueItems(campaignId, ready);
    await this.store.finishIfComplete(campaignId, new Date().toISOString());
    return this.status(campaignId);
  }

  /**
   * Queues the pending items whose job was never recorded as sent (the replica that made them ready
   * died before the queue send), ready for longer than `graceMs`. A job sent twice does no harm (the
   * claim and the guard make the results exactly once). Returns the items queued.
   */
  async sweepUnqueued(graceMs: number, limit = 10_000): Promise<WorkItem[]> {
    const items = await this.store.unqueuedItems(Date.now(), graceMs, limit);
    if (items.length === 0) return [];
    await this.queue.enqueue(items);
    const byCampaign = new Map<string, StationDay[]>();
    for (const i of items) {
      let list = byCampaign.get(i.campaignId);
      if (!list) byCampaign.set(i.campaignId, (list = []));
      list.push({ stationId: i.stationId, day: i.day });
    }
    for (const [campaignId, list] of byCampaign) await this.store.markQueued(campaignId, list);
    return items;
  }

  private async checkStations(stations: readonly string[]): Promise<void> {
    const known = await this.repository.getStations(stations);
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
    const where = (item: ItemRecord) => {
      if (!windowOf(campaign)) return { stationId: item.stationId, day: item.day };
      const span = itemSpanOf(campaign, item.day);
      return { stationId: item.stationId, day: item.day.slice(0, 10), keptFromMs: span.keepFromMs, keptToMs: span.keepToMs };
    };
    for (const item of items) {
      if (item.state === 'failed') exceptions.push({ ...where(item), reason: `failed: ${item.reason ?? 'unknown'}` });
      if (item.state === 'no_residuals') exceptions.push({ ...where(item), reason: `no input: ${item.reason ?? 'no residuals'}` });
      if (item.state === 'awaiting_residuals') {
        exceptions.push({
          ...where(item),
          reason: `no input yet: waiting for the residuals of ${inputDaysOf(campaign, item.day).join(', ')}`,
        });
      }
      if (item.state !== 'done') continue;
      const fingerprints = stored.get(`${item.stationId}|${item.day}`) ?? new Set<string>();
      for (const f of fingerprints) perFingerprint.set(f, (perFingerprint.get(f) ?? 0) + 1);
      if (fingerprints.size === 0) {
        exceptions.push({
          ...where(item),
          reason: `no stored results under source "${campaign.source}" any more (deleted after the campaign)`,
        });
      }
      for (const f of fingerprints) {
        if (f === campaign.modelFingerprint) continue;
        exceptions.push({
          ...where(item),
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

  /**
   * station|item key → the fingerprints of the stored delay rows of the item's kept part (its UTC day
   * for station-days) under the campaign's source.
   */
  private async storedFingerprints(campaign: CampaignRecord, done: readonly ItemRecord[]): Promise<Map<string, Set<string>>> {
    const out = new Map<string, Set<string>>();
    const stations = [...new Set(done.map((i) => i.stationId))];
    const span = spanMs(campaign.startDate, campaign.endDate);
    const fromMs = span.fromMs;
    const toMs = span.toMs - 1;
    const window = windowOf(campaign);
    const wanted = new Set(done.map((i) => `${i.stationId}|${i.day}`));
    for (let at = 0; at < stations.length; at += 100) {
      const ranges = stations.slice(at, at + 100).map((stationId) => ({ stationId, fromMs, toMs }));
      const rows = await this.repository.readZenithDelaysMany(ranges, campaign.source);
      for (const [stationId, list] of rows) {
        for (const r of list) {
          const key = `${stationId}|${keyAtEpoch(r.epochMs, campaign.startDate, campaign.endDate, window)}`;
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
