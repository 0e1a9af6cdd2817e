/**
 * The residual deposits (migration 4, table residual_days): one row per station-day holding the
 * compact stored form (src/formats/residual-day-form.ts) and its digest. Works on either backend
 * through the repository's SqlExecutor.
 */

import type { SqlExecutor } from '../sql-executor.js';

export interface ResidualDayInfo {
  stationId: string;
  day: string;
  observationCount: number;
  sha256: string;
  storedBytes: number;
  /** ISO 8601 UTC. */
  storedAt: string;
}

export interface ResidualDayData extends ResidualDayInfo {
  data: Uint8Array;
}

interface DayRow {
  station_id: string;
  day: string;
  observation_count: number | string;
  sha256: string;
  stored_bytes: number | string;
  stored_at: string;
  data?: Uint8Array;
}

const INFO_COLUMNS = 'station_id, day, observation_count, sha256, stored_bytes, stored_at';

const toInfo = (r: DayRow): ResidualDayInfo => ({
  stationId: r.station_id,
  day: r.day,
  observationCount: Number(r.observation_count),
  sha256: r.sha256,
  storedBytes: Number(r.stored_bytes),
  storedAt: r.stored_at,
});

export class ResidualStore {
  constructor(private readonly sql: SqlExecutor) {}

  /** Stores (or replaces) a station-day; `created` tells which. The station must exist (the caller checks). */
  async put(info: Omit<ResidualDayInfo, 'storedBytes'>, data: Uint8Array): Promise<{ created: boolean }> {
    const existed = await this.sql.all('SELECT 1 FROM residual_days WHERE station_id = ? AND day = ?', [info.stationId, info.day]);
    await this.sql.batch([
      {
        sql: `INSERT INTO residual_days (${INFO_COLUMNS}, data) VALUES (?, ?, ?, ?, ?, ?, ?)
              ON CONFLICT (station_id, day) DO UPDATE SET observation_count = excluded.observation_count, sha256 = excluded.sha256,
                stored_bytes = excluded.stored_bytes, stored_at = excluded.stored_at, data = excluded.data`,
        params: [info.stationId, info.day, info.observationCount, info.sha256, data.byteLength, info.storedAt, Buffer.from(data)],
      },
    ]);
    return { created: existed.length === 0 };
  }

  /** The station's deposits in [start, end] (days inclusive; open ends when absent), by day. */
  async list(stationId: string, start?: string, end?: string): Promise<ResidualDayInfo[]> {
    const rows = await this.sql.all<DayRow>(
      `SELECT ${INFO_COLUMNS} FROM residual_days WHERE station_id = ? AND day >= ? AND day <= ? ORDER BY day`,
      [stationId, start ?? '0000-00-00', end ?? '9999-99-99'],
    );
    return rows.map(toInfo);
  }

  /** Every station-day in [start, end] of the given stations (all stations when absent), by station then day. */
  async listMany(start: string, end: string, stationIds?: readonly string[]): Promise<ResidualDayInfo[]> {
    const rows = await this.sql.all<DayRow>(
      `SELECT ${INFO_COLUMNS} FROM residual_days WHERE day >= ? AND day <= ? ORDER BY station_id, day`,
      [start, end],
    );
    const wanted = stationIds ? new Set(stationIds) : undefined;
    return rows.filter((r) => !wanted || wanted.has(r.station_id)).map(toInfo);
  }

  async get(stationId: string, day: string): Promise<ResidualDayData | null> {
    const rows = await this.sql.all<DayRow>(`SELECT ${INFO_COLUMNS}, data FROM residual_days WHERE station_id = ? AND day = ?`, [
      stationId,
      day,
    ]);
    const r = rows[0];
    return r ? { ...toInfo(r), data: r.data! } : null;
  }

  async delete(stationId: string, day: string): Promise<boolean> {
    const [changed] = await this.sql.batch([
      { sql: 'DELETE FROM residual_days WHERE station_id = ? AND day = ?', params: [stationId, day] },
    ]);
    return changed! > 0;
  }
}
