/**
 * Mapping between database rows (snake_case columns) and the repository's types, shared by both
 * backends. PostgreSQL returns BIGINT as a string; Number() is exact for epochs (< 2^53 ms).
 */

import type { DelayRow, MetRow, Station, StationBox, SurfaceMetRow, ZenithDelayRow } from './repository.js';

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

/**
 * The condition of Repository.listStationsInBox on the stations table, one text for both dialects
 * (`p(n)`: the n-th placeholder, 1-based; bind stationsInBoxParams). Longitudes above 180 are taken as
 * lon − 360, as the network routes' insideBox does; the crossing of 180° decides the form of the test.
 */
export function stationsInBoxWhere(p: (n: number) => string, box: StationBox): string {
  const lon = 'CASE WHEN longitude_deg > 180 THEN longitude_deg - 360 ELSE longitude_deg END';
  const lonTest = box.westDeg <= box.eastDeg ? `${lon} >= ${p(3)} AND ${lon} <= ${p(4)}` : `(${lon} >= ${p(3)} OR ${lon} <= ${p(4)})`;
  return `deleted_at IS NULL AND latitude_deg >= ${p(1)} AND latitude_deg <= ${p(2)} AND ${lonTest}`;
}

/** The values of stationsInBoxWhere's placeholders 1..4. */
export const stationsInBoxParams = (box: StationBox): number[] => [box.southDeg, box.northDeg, box.westDeg, box.eastDeg];

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

/** The two series tables (migrations.ts, version 4: clustered by station, source, epoch). */
export type SeriesTable = 'met_records' | 'delay_records';

/** What reads select from: delay rows carry a segment id, the view delay_rows joins the fingerprint back. */
export const READ_RELATION: Record<SeriesTable, string> = { met_records: 'met_records', delay_records: 'delay_rows' };

/** Per (station, source) envelopes of the epochs: met_series, delay_segments (one per fingerprint). */
export const ENVELOPE_TABLE: Record<SeriesTable, 'met_series' | 'delay_segments'> = {
  met_records: 'met_series',
  delay_records: 'delay_segments',
};

const placeholder = (dialect: 'sqlite' | 'postgres') => (n: number) => (dialect === 'sqlite' ? '?' : `$${n}`);

/**
 * SQL of the sources of a station whose envelope meets [from, to], in ascending order (bound: station,
 * from, to). A read without a source probes each of them: the rows are clustered by source first.
 */
export function sourcesSql(table: SeriesTable, dialect: 'sqlite' | 'postgres'): string {
  const p = placeholder(dialect);
  return (
    `SELECT DISTINCT source FROM ${ENVELOPE_TABLE[table]} WHERE station_id = ${p(1)} AND last_epoch_ms >= ${p(2)} ` +
    `AND first_epoch_ms <= ${p(3)} ORDER BY source`
  );
}

/**
 * SQL of a one-station, one-source time-range read, ordered by epoch, bounds inclusive (bound: station,
 * source, from, to): one range of the primary key (station_id, source, epoch_ms). `table` and `columns`
 * are this module's constants, never caller input.
 */
export function rangeReadSql(table: SeriesTable, columns: string, dialect: 'sqlite' | 'postgres'): string {
  const p = placeholder(dialect);
  return (
    `SELECT ${columns} FROM ${READ_RELATION[table]} WHERE station_id = ${p(1)} AND source = ${p(2)} ` +
    `AND epoch_ms BETWEEN ${p(3)} AND ${p(4)} ORDER BY epoch_ms`
  );
}

/**
 * SQL that widens the envelope of one (station, source) — for delays of one (station, source,
 * fingerprint) segment — to cover [first, last], creating it when missing. Bound: station, source,
 * [fingerprint,] first, last. The delay form returns segment_id.
 */
export function envelopeSql(table: SeriesTable, dialect: 'sqlite' | 'postgres'): string {
  const p = placeholder(dialect);
  const [least, greatest] = dialect === 'sqlite' ? ['MIN', 'MAX'] : ['LEAST', 'GREATEST'];
  const t = ENVELOPE_TABLE[table];
  const widen =
    `DO UPDATE SET first_epoch_ms = ${least}(${t}.first_epoch_ms, excluded.first_epoch_ms), ` +
    `last_epoch_ms = ${greatest}(${t}.last_epoch_ms, excluded.last_epoch_ms)`;
  return table === 'met_records'
    ? `INSERT INTO met_series (station_id, source, first_epoch_ms, last_epoch_ms) VALUES (${p(1)}, ${p(2)}, ${p(3)}, ${p(4)}) ` +
        `ON CONFLICT (station_id, source) ${widen}`
    : `INSERT INTO delay_segments (station_id, source, model_fingerprint, first_epoch_ms, last_epoch_ms) ` +
        `VALUES (${p(1)}, ${p(2)}, ${p(3)}, ${p(4)}, ${p(5)}) ON CONFLICT (station_id, source, model_fingerprint) ${widen} RETURNING segment_id`;
}

/** The first and last epoch of each source of `rows` [ms], by source in ascending order. */
export function epochEnvelopes(rows: readonly { epochMs: number; source: string }[]): Map<string, [number, number]> {
  const out = new Map<string, [number, number]>();
  for (const r of rows) {
    const e = out.get(r.source);
    if (!e) out.set(r.source, [r.epochMs, r.epochMs]);
    else {
      if (r.epochMs < e[0]) e[0] = r.epochMs;
      if (r.epochMs > e[1]) e[1] = r.epochMs;
    }
  }
  return new Map([...out].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
}

/**
 * Longest shared range of a many-station delay read that goes through the epoch index [ms]: a network
 * read at one epoch or over one hour (interval=PT1H). Longer ranges read per station, where the primary
 * key gives each station's rows in one walk.
 */
export const NETWORK_EPOCH_READ_MAX_MS = 3_600_000;
/** Fewest stations for which the epoch index pays: below it, per-station probes read fewer rows. */
export const NETWORK_EPOCH_READ_MIN_STATIONS = 50;

/** Whether a many-station read is a network read of one short range, for the epoch index. */
export function sharedShortRange(ranges: readonly { fromMs: number; toMs: number }[]): boolean {
  if (ranges.length < NETWORK_EPOCH_READ_MIN_STATIONS) return false;
  const { fromMs, toMs } = ranges[0]!;
  return toMs - fromMs <= NETWORK_EPOCH_READ_MAX_MS && ranges.every((r) => r.fromMs === fromMs && r.toMs === toMs);
}

/**
 * SQL of the delay rows of every station in [from, to] through the epoch index delay_records_epoch
 * (bound: from, to[, source]), station_id first, ordered by station then (epoch, source).
 */
export function networkEpochReadSql(columns: string, bySource: boolean, dialect: 'sqlite' | 'postgres'): string {
  const p = placeholder(dialect);
  return (
    `SELECT station_id, ${columns} FROM delay_rows WHERE epoch_ms BETWEEN ${p(1)} AND ${p(2)}` +
    `${bySource ? ` AND source = ${p(3)}` : ''} ORDER BY station_id, epoch_ms, source`
  );
}

/**
 * Merges raw rows of several sources, each list ordered by epoch and the lists in ascending source
 * order, into one list ordered by (epoch, source): the order every read of the Repository promises.
 * `epochAt` is the column of the epoch in a row.
 */
export function mergeSources(lists: readonly unknown[][][], epochAt: number): unknown[][] {
  if (lists.length === 1) return lists[0]!;
  const out: unknown[][] = [];
  const next = lists.map(() => 0);
  for (;;) {
    let best = -1;
    let bestMs = Infinity;
    for (let k = 0; k < lists.length; k++) {
      const row = lists[k]![next[k]!];
      // Strictly less: on equal epochs the earlier list (the smaller source) goes first.
      if (row !== undefined && Number(row[epochAt]) < bestMs) {
        best = k;
        bestMs = Number(row[epochAt]);
      }
    }
    if (best < 0) return out;
    out.push(lists[best]![next[best]!++]!);
  }
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
