/**
 * Campaigns and their items (migrations 5 and 6): one item per station-day or station-window (its key
 * in the column `day`: the day, or the start of the window's kept part; src/services/campaigns/item-windows.ts)
 * with its state
 *
 *   awaiting_residuals (a campaign with uploaded residuals: not all of the item's days have arrived)
 *           → pending (queued; ready_at_ms says since when, queued_at_ms when its job was sent)
 *           | no_residuals (the uploads were closed without any of its days)
 *   pending → running (claimed by a replica with a fresh token; a redelivered item is claimed again)
 *           → done (by the guard statement inside the transaction that stores its results: exactly once)
 *           | failed (the estimation refused the day; the reason is kept)
 *           | cancelled (the campaign was cancelled before the item was done).
 *
 * A claim, the guard and every state change name the claim token, so a replica that was presumed dead
 * (its queue job expired and went to another replica) can neither mark done nor store anything.
 * Works on either backend through the repository's SqlExecutor.
 */

import type { GuardStatement, SqlExecutor, SqlStatement } from '../sql-executor.js';

export type CampaignState = 'queued' | 'running' | 'finished' | 'cancelled';
export type ItemState = 'awaiting_residuals' | 'pending' | 'running' | 'done' | 'failed' | 'cancelled' | 'no_residuals';
export const ITEM_STATES: readonly ItemState[] = [
  'awaiting_residuals',
  'pending',
  'running',
  'done',
  'failed',
  'cancelled',
  'no_residuals',
];
/** Where the residuals of a campaign's items come from. */
export type InputKind = 'deposits' | 'upload';

export interface CampaignRecord {
  campaignId: string;
  name: string | null;
  state: CampaignState;
  startDate: string;
  endDate: string;
  /** The estimation options as the API's JSON (validated, defaults applied). */
  optionsJson: string;
  modelFingerprint: string;
  /** Source name of the stored delay series. */
  source: string;
  inputKind: InputKind;
  /** Station-windows: length and step [ms]; null = station-days. */
  windowLengthMs: number | null;
  windowStepMs: number | null;
  /** When the uploads were closed (POST …/uploads-complete); null while they are open or for deposits. */
  uploadsClosedAt: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

export interface StationDay {
  stationId: string;
  day: string;
}

export interface ItemRecord extends StationDay {
  state: ItemState;
  attempts: number;
  replica: string | null;
  residualSha256: string | null;
  modelFingerprint: string | null;
  reason: string | null;
  cpuMs: number | null;
}

export interface ReplicaWork {
  replica: string;
  itemsDone: number;
  cpuMs: number;
}

const CAMPAIGN_COLUMNS =
  'campaign_id, name, state, start_date, end_date, options_json, model_fingerprint, source, created_at, started_at, finished_at, ' +
  'input_kind, window_length_ms, window_step_ms, uploads_closed_at';
/** Items inserted per statement (SQLite binds at most 32 766 parameters; 5 each). */
const ITEM_CHUNK = 500;
const ACTIVE = "('queued', 'running')";
/** Item states that keep a campaign from finishing. */
const OPEN = "('awaiting_residuals', 'pending', 'running')";

type Row = Record<string, unknown>;
const str = (v: unknown) => (v === null || v === undefined ? null : String(v as string | number));
const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

const toCampaign = (r: Row): CampaignRecord => ({
  campaignId: String(r.campaign_id),
  name: str(r.name),
  state: r.state as CampaignState,
  startDate: String(r.start_date),
  endDate: String(r.end_date),
  optionsJson: String(r.options_json),
  modelFingerprint: String(r.model_fingerprint),
  source: String(r.source),
  createdAt: String(r.created_at),
  startedAt: str(r.started_at),
  finishedAt: str(r.finished_at),
  inputKind: (str(r.input_kind) ?? 'deposits') as InputKind,
  windowLengthMs: num(r.window_length_ms),
  windowStepMs: num(r.window_step_ms),
  uploadsClosedAt: str(r.uploads_closed_at),
});

const toItem = (r: Row): ItemRecord => ({
  stationId: String(r.station_id),
  day: String(r.day),
  state: r.state as ItemState,
  attempts: Number(r.attempts),
  replica: str(r.replica),
  residualSha256: str(r.residual_sha256),
  modelFingerprint: str(r.model_fingerprint),
  reason: str(r.reason),
  cpuMs: num(r.cpu_ms),
});

const itemKey = 'campaign_id = ? AND station_id = ? AND day = ?';

export class CampaignStore {
  constructor(private readonly sql: SqlExecutor) {}

  /**
   * The campaign and its items, in one transaction: pending (ready now, not yet queued) for deposits,
   * awaiting_residuals for uploads.
   */
  async create(c: CampaignRecord, items: readonly StationDay[], nowMs = Date.now()): Promise<void> {
    const initial: ItemState = c.inputKind === 'upload' ? 'awaiting_residuals' : 'pending';
    const readyAt = initial === 'pending' ? nowMs : null;
    const statements: SqlStatement[] = [
      {
        sql: `INSERT INTO campaigns (${CAMPAIGN_COLUMNS}) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
        params: [
          c.campaignId,
          c.name,
          c.state,
          c.startDate,
          c.endDate,
          c.optionsJson,
          c.modelFingerprint,
          c.source,
          c.createdAt,
          null,
          null,
          c.inputKind,
          c.windowLengthMs,
          c.windowStepMs,
          null,
        ],
      },
    ];
    for (let at = 0; at < items.length; at += ITEM_CHUNK) {
      const chunk = items.slice(at, at + ITEM_CHUNK);
      statements.push({
        sql: `INSERT INTO campaign_items (campaign_id, station_id, day, state, ready_at_ms) VALUES ${chunk.map(() => '(?, ?, ?, ?, ?)').join(', ')}`,
        params: chunk.flatMap((i) => [c.campaignId, i.stationId, i.day, initial, readyAt]),
      });
    }
    await this.sql.batch(statements);
  }

  async get(campaignId: string): Promise<CampaignRecord | null> {
    const rows = await this.sql.all(`SELECT ${CAMPAIGN_COLUMNS} FROM campaigns WHERE campaign_id = ?`, [campaignId]);
    return rows[0] ? toCampaign(rows[0]) : null;
  }

  /** Every campaign, newest first. */
  async list(): Promise<CampaignRecord[]> {
    return (await this.sql.all(`SELECT ${CAMPAIGN_COLUMNS} FROM campaigns ORDER BY created_at DESC, campaign_id`)).map(toCampaign);
  }

  /** Items per state. */
  async counts(campaignId: string): Promise<Record<ItemState, number>> {
    const counts = Object.fromEntries(ITEM_STATES.map((state) => [state, 0])) as Record<ItemState, number>;
    const rows = await this.sql.all('SELECT state, COUNT(*) AS n FROM campaign_items WHERE campaign_id = ? GROUP BY state', [campaignId]);
    for (const r of rows) counts[r.state as ItemState] = Number(r.n);
    return counts;
  }

  /** Items done per replica, with the CPU time they took. */
  async replicas(campaignId: string): Promise<ReplicaWork[]> {
    const rows = await this.sql.all(
      `SELECT replica, COUNT(*) AS n, SUM(cpu_ms) AS cpu FROM campaign_items WHERE campaign_id = ? AND state = 'done'
       GROUP BY replica ORDER BY replica`,
      [campaignId],
    );
    return rows.map((r) => ({ replica: String(r.replica), itemsDone: Number(r.n), cpuMs: Number(r.cpu ?? 0) }));
  }

  async items(campaignId: string): Promise<ItemRecord[]> {
    const rows = await this.sql.all(
      `SELECT station_id, day, state, attempts, replica, residual_sha256, model_fingerprint, reason, cpu_ms
       FROM campaign_items WHERE campaign_id = ? ORDER BY station_id, day`,
      [campaignId],
    );
    return rows.map(toItem);
  }

  /** The campaign's items of one station in these states. */
  async itemsOfStation(campaignId: string, stationId: string, states: readonly ItemState[]): Promise<ItemRecord[]> {
    const rows = await this.sql.all(
      `SELECT station_id, day, state, attempts, replica, residual_sha256, model_fingerprint, reason, cpu_ms
       FROM campaign_items WHERE campaign_id = ? AND station_id = ? AND state IN (${states.map(() => '?').join(', ')}) ORDER BY day`,
      [campaignId, stationId, ...states],
    );
    return rows.map(toItem);
  }

  /**
   * Awaiting items become pending (ready now): false for an item that was no longer awaiting (another
   * upload or the close made it ready first). One statement per item, in one transaction.
   */
  async makeReady(campaignId: string, items: readonly StationDay[], nowMs = Date.now()): Promise<StationDay[]> {
    if (items.length === 0) return [];
    const changed = await this.sql.batch(
      items.map((i) => ({
        sql: `UPDATE campaign_items SET state = 'pending', ready_at_ms = ? WHERE ${itemKey} AND state = 'awaiting_residuals'`,
        params: [nowMs, campaignId, i.stationId, i.day],
      })),
    );
    return items.filter((_, k) => changed[k]! > 0);
  }

  /** Records that the jobs of these items were sent to the queue. */
  async markQueued(campaignId: string, items: readonly StationDay[] | 'all pending', nowMs = Date.now()): Promise<void> {
    if (items === 'all pending') {
      await this.sql.batch([
        {
          sql: "UPDATE campaign_items SET queued_at_ms = ? WHERE campaign_id = ? AND state = 'pending' AND queued_at_ms IS NULL",
          params: [nowMs, campaignId],
        },
      ]);
      return;
    }
    for (let at = 0; at < items.length; at += ITEM_CHUNK) {
      await this.sql.batch(
        items.slice(at, at + ITEM_CHUNK).map((i) => ({
          sql: `UPDATE campaign_items SET queued_at_ms = ? WHERE ${itemKey} AND queued_at_ms IS NULL`,
          params: [nowMs, campaignId, i.stationId, i.day],
        })),
      );
    }
  }

  /**
   * Pending items of active campaigns whose job was never recorded as sent, ready for longer than
   * `graceMs` (a submitting or uploading replica died between its commit and the queue send): the
   * sweep queues them. At most `limit`.
   */
  async unqueuedItems(nowMs: number, graceMs: number, limit: number): Promise<(StationDay & { campaignId: string })[]> {
    const rows = await this.sql.all(
      `SELECT i.campaign_id, i.station_id, i.day FROM campaign_items i JOIN campaigns c ON c.campaign_id = i.campaign_id
       WHERE i.state = 'pending' AND i.queued_at_ms IS NULL AND (i.ready_at_ms IS NULL OR i.ready_at_ms <= ?) AND c.state IN ${ACTIVE}
       ORDER BY c.created_at, i.station_id, i.day LIMIT ${Math.max(1, Math.floor(limit))}`,
      [nowMs - graceMs],
    );
    return rows.map((r) => ({ campaignId: String(r.campaign_id), stationId: String(r.station_id), day: String(r.day) }));
  }

  /**
   * Closes the uploads of a campaign: later uploads are refused; the awaiting items named in `ready`
   * become pending, every other awaiting item becomes no_residuals. False when the campaign was not
   * active or its uploads were closed already.
   */
  async closeUploads(campaignId: string, ready: readonly StationDay[], nowIso: string, nowMs = Date.now()): Promise<boolean> {
    const statements: SqlStatement[] = [
      {
        sql: `UPDATE campaigns SET uploads_closed_at = ? WHERE campaign_id = ? AND state IN ${ACTIVE} AND uploads_closed_at IS NULL`,
        params: [nowIso, campaignId],
      },
      ...ready.map((i) => ({
        sql: `UPDATE campaign_items SET state = 'pending', ready_at_ms = ? WHERE ${itemKey} AND state = 'awaiting_residuals'`,
        params: [nowMs, campaignId, i.stationId, i.day],
      })),
      {
        sql: "UPDATE campaign_items SET state = 'no_residuals', reason = ? WHERE campaign_id = ? AND state = 'awaiting_residuals'",
        params: ['no residuals were uploaded for this item before the uploads were closed', campaignId],
      },
    ];
    const [closed] = await this.sql.batch(statements);
    return closed! > 0;
  }

  /** Items not finished (pending or running) of campaigns still active: what a restarted single-process queue takes up again. */
  async unfinishedItems(): Promise<(StationDay & { campaignId: string })[]> {
    const rows = await this.sql.all(
      `SELECT i.campaign_id, i.station_id, i.day FROM campaign_items i JOIN campaigns c ON c.campaign_id = i.campaign_id
       WHERE c.state IN ${ACTIVE} AND i.state IN ('pending', 'running') ORDER BY c.created_at, i.station_id, i.day`,
    );
    return rows.map((r) => ({ campaignId: String(r.campaign_id), stationId: String(r.station_id), day: String(r.day) }));
  }

  /**
   * Claims an item for `replica` under a fresh token: pending, or running under an earlier claim (a
   * redelivery after that replica died or its job expired), of a campaign still active. False when the
   * item is done, failed or cancelled (a redelivered item that was finished does nothing).
   */
  async claim(campaignId: string, item: StationDay, token: string, replica: string, nowIso: string): Promise<boolean> {
    const [started, claimed] = await this.sql.batch([
      {
        sql: "UPDATE campaigns SET state = 'running', started_at = ? WHERE campaign_id = ? AND state = 'queued'",
        params: [nowIso, campaignId],
      },
      {
        sql: `UPDATE campaign_items SET state = 'running', attempts = attempts + 1, claim_token = ?, replica = ?
              WHERE ${itemKey} AND state IN ('pending', 'running')
                AND EXISTS (SELECT 1 FROM campaigns c WHERE c.campaign_id = campaign_items.campaign_id AND c.state IN ${ACTIVE})`,
        params: [token, replica, campaignId, item.stationId, item.day],
      },
    ]);
    void started;
    return claimed! > 0;
  }

  /**
   * The statement that marks a claimed item done, run first in the transaction that stores its results
   * (Repository.writeDelays): it changes no row, and so nothing is stored, when another claim took the
   * item over, the item is no longer running, or the campaign was cancelled.
   */
  doneGuard(
    campaignId: string,
    item: StationDay,
    token: string,
    done: { residualSha256: string; modelFingerprint: string; cpuMs: number; finishedAtMs: number },
  ): GuardStatement {
    return {
      sql: `UPDATE campaign_items SET state = 'done', residual_sha256 = ?, model_fingerprint = ?, cpu_ms = ?, finished_at_ms = ?, reason = NULL
            WHERE ${itemKey} AND state = 'running' AND claim_token = ?
              AND EXISTS (SELECT 1 FROM campaigns c WHERE c.campaign_id = campaign_items.campaign_id AND c.state IN ${ACTIVE})`,
      params: [done.residualSha256, done.modelFingerprint, done.cpuMs, done.finishedAtMs, campaignId, item.stationId, item.day, token],
    };
  }

  /** A claimed item ends without results: failed (with the reason) or cancelled (abandoned). False when the claim was lost. */
  async finishWithout(
    campaignId: string,
    item: StationDay,
    token: string,
    state: 'failed' | 'cancelled' | 'no_residuals',
    reason: string,
    cpuMs: number,
  ): Promise<boolean> {
    const [changed] = await this.sql.batch([
      {
        sql: `UPDATE campaign_items SET state = ?, reason = ?, cpu_ms = ?, finished_at_ms = ? WHERE ${itemKey} AND state = 'running' AND claim_token = ?`,
        params: [state, reason, cpuMs, Date.now(), campaignId, item.stationId, item.day, token],
      },
    ]);
    return changed! > 0;
  }

  /** Marks the campaign finished when no item is pending or running any more. */
  async finishIfComplete(campaignId: string, nowIso: string): Promise<void> {
    await this.sql.batch([
      {
        sql: `UPDATE campaigns SET state = 'finished', finished_at = ?
              WHERE campaign_id = ? AND state IN ${ACTIVE}
                AND NOT EXISTS (SELECT 1 FROM campaign_items i WHERE i.campaign_id = ? AND i.state IN ${OPEN})`,
        params: [nowIso, campaignId, campaignId],
      },
    ]);
  }

  /**
   * Cancels an active campaign: its pending items are cancelled; running ones are abandoned by their replicas.
   * False when it was not active.
   */
  async cancel(campaignId: string, nowIso: string): Promise<boolean> {
    const [changed] = await this.sql.batch([
      {
        sql: `UPDATE campaigns SET state = 'cancelled', finished_at = ? WHERE campaign_id = ? AND state IN ${ACTIVE}`,
        params: [nowIso, campaignId],
      },
      {
        sql: "UPDATE campaign_items SET state = 'cancelled', reason = 'campaign cancelled' WHERE campaign_id = ? AND state IN ('pending', 'awaiting_residuals')",
        params: [campaignId],
      },
    ]);
    return changed! > 0;
  }
}
