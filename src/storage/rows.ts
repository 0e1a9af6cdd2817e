/**
 * Mapping between database rows (snake_case columns) and the repository's types, shared by both
 * backends. PostgreSQL returns BIGINT as a string; Number() is exact for epochs (< 2^53 ms).
 */

import type { DelayRow, MetRow, Station } from './repository.js';

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

export interface MetDbRow {
  epoch_ms: number | string;
  source: string;
  pressure_hpa: number | null;
  temperature_c: number | null;
  relative_humidity_pct: number | null;
  dewpoint_c: number | null;
  vapour_pressure_hpa: number | null;
}

export const toMetRow = (r: MetDbRow): MetRow => ({
  epochMs: Number(r.epoch_ms),
  source: r.source,
  pressureHpa: r.pressure_hpa,
  temperatureC: r.temperature_c,
  relativeHumidityPct: r.relative_humidity_pct,
  dewpointC: r.dewpoint_c,
  vapourPressureHpa: r.vapour_pressure_hpa,
});

export const metValues = (r: MetRow) => [r.pressureHpa, r.temperatureC, r.relativeHumidityPct, r.dewpointC, r.vapourPressureHpa];

export interface DelayDbRow {
  epoch_ms: number | string;
  source: string;
  ztd_m: number;
  ztd_sigma_m: number | null;
  zwd_m: number | null;
  zwd_sigma_m: number | null;
  north_gradient_m: number | null;
  east_gradient_m: number | null;
  north_gradient_sigma_m: number | null;
  east_gradient_sigma_m: number | null;
  model_fingerprint: string;
}

export const toDelayRow = (r: DelayDbRow): DelayRow => ({
  epochMs: Number(r.epoch_ms),
  source: r.source,
  ztdM: r.ztd_m,
  ztdSigmaM: r.ztd_sigma_m,
  zwdM: r.zwd_m,
  zwdSigmaM: r.zwd_sigma_m,
  northGradientM: r.north_gradient_m,
  eastGradientM: r.east_gradient_m,
  northGradientSigmaM: r.north_gradient_sigma_m,
  eastGradientSigmaM: r.east_gradient_sigma_m,
  modelFingerprint: r.model_fingerprint,
});

export const delayValues = (r: DelayRow) => [
  r.ztdM,
  r.ztdSigmaM,
  r.zwdM,
  r.zwdSigmaM,
  r.northGradientM,
  r.eastGradientM,
  r.northGradientSigmaM,
  r.eastGradientSigmaM,
  r.modelFingerprint,
];

/** Model sets are stored as canonical JSON (sorted keys, as provenance() returns them). */
export const MET_SELECT = 'epoch_ms, source, pressure_hpa, temperature_c, relative_humidity_pct, dewpoint_c, vapour_pressure_hpa';
export const DELAY_SELECT =
  'epoch_ms, source, ztd_m, ztd_sigma_m, zwd_m, zwd_sigma_m, north_gradient_m, east_gradient_m, north_gradient_sigma_m, east_gradient_sigma_m, model_fingerprint';
