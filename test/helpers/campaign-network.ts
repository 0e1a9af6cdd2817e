/**
 * An invented network for the campaign tests and benchmark: stations named CAMP01, CAMP02 … on land-free
 * made-up coordinates, and for each station-day the residuals of the committed synthetic generator
 * (scripts/synthetic-residuals.ts) with a known ZWD truth, as a deposit body.
 */

import { generateSyntheticResiduals, toRequestBody, type SyntheticData } from '../../scripts/synthetic-residuals.js';

export interface InventedStation {
  id: string;
  body: { name: string; latitude_deg: number; longitude_deg: number; height_m: number };
}

export function inventedStations(count: number): InventedStation[] {
  return Array.from({ length: count }, (_, k) => ({
    id: `CAMP${String(k + 1).padStart(2, '0')}`,
    body: {
      name: `Invented station ${k + 1}`,
      latitude_deg: 40 + (k % 10) * 1.5,
      longitude_deg: 5 + Math.floor(k / 10) * 2,
      height_m: 200 + 37 * k,
    },
  }));
}

export interface StationDayData {
  data: SyntheticData;
  body: { observations: ReturnType<typeof toRequestBody>['observations'] };
}

/** One station-day of residuals: `hours` from 00:00 UTC at `samplingS`, seeded by station and day. */
export function stationDay(station: InventedStation, stationIndex: number, day: string, hours: number, samplingS: number): StationDayData {
  const seed = stationIndex * 1000 + Number(day.slice(8, 10));
  const data = generateSyntheticResiduals({
    seed,
    startIso: `${day}T00:00:00Z`,
    durationS: hours * 3600 - samplingS,
    samplingS,
    latitudeDeg: station.body.latitude_deg,
    longitudeDeg: station.body.longitude_deg,
    heightM: station.body.height_m,
  });
  return { data, body: { observations: toRequestBody(data).observations } };
}

export const REPLICA_KEY = 'campaign-test-key-0123456789';

/** A JSON request to a replica with the admin key; the answer's status and body. */
export async function call(baseUrl: string, method: string, path: string, body?: unknown): Promise<{ status: number; body: any }> {
  const r = await fetch(`${baseUrl}${path}`, {
    method,
    headers: { authorization: `Bearer ${REPLICA_KEY}`, ...(body !== undefined ? { 'content-type': 'application/json' } : {}) },
    ...(body !== undefined ? { body: JSON.stringify(body) } : {}),
  });
  const text = await r.text();
  return { status: r.status, body: text ? JSON.parse(text) : null };
}

/** The environment of a replica on PostgreSQL (schema of its own), with the admin key and a name. */
export function replicaEnv(
  databaseUrl: string,
  schema: string,
  dataDir: string,
  name: string,
  itemTimeoutS: number,
): Record<string, string> {
  return {
    TROPODELAY_DATABASE_URL: databaseUrl,
    TROPODELAY_PG_SCHEMA: schema,
    TROPODELAY_DATA_DIR: dataDir,
    TROPODELAY_API_KEYS: `admin:admin:${REPLICA_KEY}`,
    TROPODELAY_REPLICA_NAME: name,
    TROPODELAY_CAMPAIGN_ITEM_TIMEOUT_S: String(itemTimeoutS),
    TROPODELAY_ESTIMATION_WORKERS: '1',
  };
}

/** Creates the stations and deposits `days` of residuals for each through one replica. */
export async function depositNetwork(
  baseUrl: string,
  stations: readonly InventedStation[],
  days: readonly string[],
  hours: number,
  samplingS: number,
) {
  const deposited = new Map<string, StationDayData>();
  for (const [k, s] of stations.entries()) {
    const put = await call(baseUrl, 'PUT', `/v1/stations/${s.id}`, s.body);
    if (put.status !== 201 && put.status !== 200) throw new Error(`station ${s.id}: ${put.status} ${JSON.stringify(put.body)}`);
    for (const day of days) {
      const d = stationDay(s, k, day, hours, samplingS);
      const r = await call(baseUrl, 'PUT', `/v1/stations/${s.id}/residuals/${day}`, d.body);
      if (r.status !== 201) throw new Error(`deposit ${s.id} ${day}: ${r.status} ${JSON.stringify(r.body)}`);
      deposited.set(`${s.id}|${day}`, d);
    }
  }
  return deposited;
}

/** `count` consecutive UTC days from `first` (YYYY-MM-DD). */
export function consecutiveDays(first: string, count: number): string[] {
  const start = Date.parse(`${first}T00:00:00Z`);
  return Array.from({ length: count }, (_, k) => new Date(start + k * 86_400_000).toISOString().slice(0, 10));
}
