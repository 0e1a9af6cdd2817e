/**
 * The soundings table (migration 2) ↔ SoundingRow / StoredSounding, shared by both backends. Warnings
 * are stored as a JSON array; PostgreSQL returns BIGINT as a string (Number() is exact here).
 */

import type { SoundingRow, StoredSounding } from './repository.js';

/** Columns of a listed sounding, in the order soundingFromArray reads them (profile_json last, only for one). */
export const SOUNDING_SELECT =
  'epoch_ms, zhd_m, zwd_m, ztd_m, pwv_mm, tm_k, last_humidity_pressure_hpa, levels, warnings_json, model_fingerprint, stored_at';
export const SOUNDING_WITH_PROFILE_SELECT = `${SOUNDING_SELECT}, profile_json`;

/** Columns written, in the order of soundingValues. */
export const SOUNDING_COLUMNS = ['station_id', ...SOUNDING_SELECT.split(', '), 'profile_json'] as const;

export const soundingFromArray = (r: unknown[]): SoundingRow => ({
  epochMs: Number(r[0]),
  zhdM: r[1] as number,
  zwdM: r[2] as number,
  ztdM: r[3] as number,
  pwvMm: r[4] as number,
  tmK: r[5] as number | null,
  lastHumidityPressureHpa: r[6] as number | null,
  levels: Number(r[7]),
  warnings: JSON.parse(r[8] as string) as string[],
  modelFingerprint: r[9] as string,
  storedAt: r[10] as string,
});

export const storedSoundingFromArray = (r: unknown[]): StoredSounding => ({ ...soundingFromArray(r), profileJson: r[11] as string });

/** Bound values of an insert, in the order of SOUNDING_COLUMNS. */
export function soundingValues(stationId: string, s: StoredSounding): unknown[] {
  return [
    stationId,
    s.epochMs,
    s.zhdM,
    s.zwdM,
    s.ztdM,
    s.pwvMm,
    s.tmK,
    s.lastHumidityPressureHpa,
    s.levels,
    JSON.stringify(s.warnings),
    s.modelFingerprint,
    s.storedAt,
    s.profileJson,
  ];
}

/** The upsert of one sounding; `p(n)` writes the n-th placeholder of the dialect. */
export function soundingUpsertSql(p: (n: number) => string): string {
  const updates = SOUNDING_COLUMNS.slice(2).map((c) => `${c} = excluded.${c}`);
  return (
    `INSERT INTO soundings (${SOUNDING_COLUMNS.join(', ')}) VALUES (${SOUNDING_COLUMNS.map((_, i) => p(i + 1)).join(', ')}) ` +
    `ON CONFLICT (station_id, epoch_ms) DO UPDATE SET ${updates.join(', ')}`
  );
}
