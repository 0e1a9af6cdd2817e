/**
 * Mapping between database rows (snake_case columns) and the repository's types, shared by both
 * backends. PostgreSQL returns BIGINT as a string; Number() is exact for epochs (< 2^53 ms).
 */

import type { DelayRow, MetRow, Station, SurfaceMetRow, ZenithDelayRow } from './repository.js';

export interface StationDbRow {
  station_id: string;
  name: string;
  latitude_deg: number;
  longitude_deg: number;
  height_m: number;
  met_height_m: number | null;
  description: string | null;
  created_at: string;
  updated_at: string;
}

export const toStation = (r: StationDbRow): Station => ({
  stationId: r.station_id,
  name: r.name,
  latitudeDeg: r.latitude_deg,
  longitudeDeg: r.longitude_deg,
  heightM: r.height_m,
  metHeightM: r.met_height_m,
  description: r.description,
  createdAt: r.created_at,
  updatedAt: r.updated_at,
});

/** Model sets are stored as canonical JSON (sorted keys, as provenance() returns them). */
export const MET_SELECT = 'epoch_ms, source, pressure_hpa, temperature_c, relative_humidity_pct, dewpoint_c, vapour_pressure_hpa';
export const DELAY_SELECT =
  'epoch_ms, source, ztd_m, ztd_sigma_m, zwd_m, zwd_sigma_m, north_gradient_m, east_gradient_m, north_gradient_sigma_m, east_gradient_sigma_m, model_fingerprint';

/** Rows as arrays in the column order of MET_SELECT / DELAY_SELECT (fewer allocations on big reads). */
export type MetArrayRow = [number | string, string, number | null, number | null, number | null, number | null, number | null];
export const metFromArray = (r: MetArrayRow): MetRow => ({
  epochMs: Number(r[0]),
  source: r[1],
  pressureHpa: r[2],
  temperatureC: r[3],
  relativeHumidityPct: r[4],
  dewpointC: r[5],
  vapourPressureHpa: r[6],
});

export const delayFromArray = (r: unknown[]): DelayRow => ({
  epochMs: Number(r[0]),
  source: r[1] as string,
  ztdM: r[2] as number,
  ztdSigmaM: r[3] as number | null,
  zwdM: r[4] as number | null,
  zwdSigmaM: r[5] as number | null,
  northGradientM: r[6] as number | null,
  eastGradientM: r[7] as number | null,
  northGradientSigmaM: r[8] as number | null,
  eastGradientSigmaM: r[9] as number | null,
  modelFingerprint: r[10] as string,
});

/** Narrow reads for the PWV retrieval: the columns of SurfaceMetRow / ZenithDelayRow, in this order. */
export const SURFACE_MET_SELECT = 'epoch_ms, source, pressure_hpa, temperature_c';
export const ZENITH_DELAY_SELECT = 'epoch_ms, source, ztd_m, ztd_sigma_m, model_fingerprint';

export const surfaceMetFromArray = (r: unknown[]): SurfaceMetRow => ({
  epochMs: Number(r[0]),
  source: r[1] as string,
  pressureHpa: r[2] as number | null,
  temperatureC: r[3] as number | null,
});

export const zenithDelayFromArray = (r: unknown[]): ZenithDelayRow => ({
  epochMs: Number(r[0]),
  source: r[1] as string,
  ztdM: r[2] as number,
  ztdSigmaM: r[3] as number | null,
  modelFingerprint: r[4] as string,
});

/**
 * SQL of a one-station time-range read, ordered by (epoch, source), bounds inclusive, optionally of
 * one source. `table` and `columns` are this module's constants, never caller input; the values are
 * bound parameters: `?` for SQLite, `$1..$4` for PostgreSQL.
 */
export function rangeReadSql(
  table: 'met_records' | 'delay_records',
  columns: string,
  bySource: boolean,
  dialect: 'sqlite' | 'postgres',
): string {
  const p = (n: number) => (dialect === 'sqlite' ? '?' : `$${n}`);
  const source = bySource ? ` AND source = ${p(4)}` : '';
  return `SELECT ${columns} FROM ${table} WHERE station_id = ${p(1)} AND epoch_ms BETWEEN ${p(2)} AND ${p(3)}${source} ORDER BY epoch_ms, source`;
}

/** Rows of a many-station read (`station_id` first, then `columns`) grouped by station, in read order. */
export function groupByStation<T>(rows: readonly unknown[][], toRow: (r: unknown[]) => T): Map<string, T[]> {
  const out = new Map<string, T[]>();
  let currentId: string | undefined;
  let current: T[] = [];
  for (const r of rows) {
    const id = r[0] as string;
    if (id !== currentId) {
      currentId = id;
      current = out.get(id) ?? [];
      out.set(id, current);
    }
    current.push(toRow(r.slice(1)));
  }
  return out;
}
