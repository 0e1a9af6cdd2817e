/**
 * Residuals uploaded with a campaign (migration 6, table campaign_residual_days): one row per
 * (campaign, station, day) in the stored form of the deposits (src/formats/residual-day-form.ts).
 * They belong to the campaign (deleted with it) and never replace a station's deposits.
 */

import type { SqlExecutor } from '../sql-executor.js';
import type { ResidualDayData, ResidualDayInfo } from './residual-store.js';

type Row = Record<string, unknown>;

const INFO_COLUMNS = 'station_id, day, observation_count, sha256, stored_bytes, stored_at';

const toInfo = (r: Row): ResidualDayInfo => ({
  stationId: String(r.station_id),
  day: String(r.day),
  observationCount: Number(r.observation_count),
  sha256: String(r.sha256),
  storedBytes: Number(r.stored_bytes),
  storedAt: String(r.stored_at),
});

export class CampaignUploadStore {
  constructor(private readonly sql: SqlExecutor) {}

  /** Stores (or replaces) an uploaded station-day of the campaign; `created` tells which. */
  async put(campaignId: string, info: Omit<ResidualDayInfo, 'storedBytes'>, data: Uint8Array): Promise<{ created: boolean }> {
    const existed = await this.sql.all('SELECT 1 FROM campaign_residual_days WHERE campaign_id = ? AND station_id = ? AND day = ?', [
      campaignId,
      info.stationId,
      info.day,
    ]);
    await this.sql.batch([
      {
        sql: `INSERT INTO campaign_residual_days (campaign_id, ${INFO_COLUMNS}, data) VALUES (?, ?, ?, ?, ?, ?, ?, ?)
              ON CONFLICT (campaign_id, station_id, day) DO UPDATE SET observation_count = excluded.observation_count,
                sha256 = excluded.sha256, stored_bytes = excluded.stored_bytes, stored_at = excluded.stored_at, data = excluded.data`,
        params: [
          campaignId,
          info.stationId,
          info.day,
          info.observationCount,
          info.sha256,
          data.byteLength,
          info.storedAt,
          Buffer.from(data),
        ],
      },
    ]);
    return { created: existed.length === 0 };
  }

  /** The campaign's uploaded station-days (of one station when given), by station then day. */
  async list(campaignId: string, stationId?: string): Promise<ResidualDayInfo[]> {
    const rows = await this.sql.all(
      `SELECT ${INFO_COLUMNS} FROM campaign_residual_days WHERE campaign_id = ?${stationId ? ' AND station_id = ?' : ''} ORDER BY station_id, day`,
      stationId ? [campaignId, stationId] : [campaignId],
    );
    return rows.map(toInfo);
  }

  async get(campaignId: string, stationId: string, day: string): Promise<ResidualDayData | null> {
    const rows = await this.sql.all(
      `SELECT ${INFO_COLUMNS}, data FROM campaign_residual_days WHERE campaign_id = ? AND station_id = ? AND day = ?`,
      [campaignId, stationId, day],
    );
    const r = rows[0];
    return r ? { ...toInfo(r), data: r.data as Uint8Array } : null;
  }
}
