/**
 * Campaigns and their items (migration 4): one item per station-day with its state
 *
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
export type ItemState = 'pending' | 'running' | 'done' | 'failed' | 'cancelled';

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
  'campaign_id, name, state, start_date, end_date, options_json, model_fingerprint, source, created_at, started_at, finished_at';
/** Items inserted per statement (SQLite binds at most 32 766 parameters; 4 each). */
const ITEM_CHUNK = 500;
const ACTIVE = "('queued', 'running')";

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

  /** The campaign and its pending items, in one transaction. */
  async create(c: CampaignRecord, items: readonly StationDay[]): Promise<void> {
    const statements: SqlStatement[] = [
      {
        sql: `INSERT INTO campaigns (${CAMPAIGN_COLUMNS}) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
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
        ],
      },
    ];
    for (let at = 0; at < items.length; at += ITEM_CHUNK) {
      const chunk = items.slice(at, at + ITEM_CHUNK);
      statements.push({
        sql: `INSERT INTO campaign_items (campaign_id, station_id, day, state) VALUES ${chunk.map(() => "(?, ?, ?, 'pending')").join(', ')}`,
        params: chunk.flatMap((i) => [c.campaignId, i.stationId, i.day]),
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
    const counts: Record<ItemState, number> = { pending: 0, running: 0, done: 0, failed: 0, cancelled: 0 };
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
    state: 'failed' | 'cancelled',
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
                AND NOT EXISTS (SELECT 1 FROM campaign_items i WHERE i.campaign_id = ? AND i.state IN ('pending', 'running'))`,
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
        sql: "UPDATE campaign_items SET state = 'cancelled', reason = 'campaign cancelled' WHERE campaign_id = ? AND state = 'pending'",
        params: [campaignId],
      },
    ]);
    return changed! > 0;
  }
}
