/**
 * Precipitable water for the stored delay series of a station, from its stored met series.
 *
 * For each delay row (epoch t, ZTD):
 *  1. pressure and temperature at t, interpolated linearly in time from the met records
 *     (src/domain/meteo/met-interpolation.ts: never across a gap longer than maxMetGapMs, default
 *     3 h, never extrapolated);
 *  2. reduced from the met sensor height to the antenna height when the station gives met_height_m
 *     (src/domain/meteo/height-reduction.ts: hypsometric pressure, −6.5 K/km);
 *  3. ZHD (Saastamoinen/Davis), ZWD = ZTD − ZHD, Tm (Bevis 1992), PWV = Π(Tm)·ZWD (Bevis 1994) and
 *     σ_PWV, by src/domain/water-vapour/precipitable-water.ts.
 *
 * No pressure (or no temperature) → no PWV (null), never a defaulted value.
 *
 * Quality flag per record, most severe first:
 *   met-missing          pressure or temperature missing at t (no record within the gap limit): no PWV
 *   delay-sigma-large    ztd_sigma_m > maxZtdSigmaM (default 10 mm)
 *   delay-sigma-unknown  the delay row has no ztd_sigma_m: PWV given, pwv_sigma_mm null
 *   met-interpolated     pressure or temperature interpolated between two records
 *   ok                   met records at t itself, sigma known and small
 */

import { DEG } from '../domain/constants.js';
import {
  DEFAULT_MAX_MET_GAP_MS,
  interpolateSeries,
  type InterpolationQuality,
  type TimedValue,
} from '../domain/meteo/met-interpolation.js';
import { MODEL_NAMES, provenance } from '../domain/provenance.js';
import {
  negativeWetDelayWarning,
  precipitableWaterFromSurfaceMet,
  tmExtrapolatedWarning,
} from '../domain/water-vapour/precipitable-water.js';
import { zenithHydrostaticDelayM } from '../domain/zenith/hydrostatic.js';
import type { Station, SurfaceMetRow, ZenithDelayRow } from '../storage/repository.js';
import { antennaReduction } from './station-met.js';

/** ztd_sigma_m above this flags "delay-sigma-large" [m] (our choice: 10 mm of ZTD ≈ 1.5 mm of PWV). */
export const DEFAULT_MAX_ZTD_SIGMA_M = 0.01;

export const PWV_QUALITY_FLAGS = ['met-missing', 'delay-sigma-large', 'delay-sigma-unknown', 'met-interpolated', 'ok'] as const;
export type PwvQuality = (typeof PWV_QUALITY_FLAGS)[number];

/**
 * Codes of the warnings that concern one record, for the `warnings` column of the CSV answers (the
 * JSON answer says the same in its `warnings` texts): the record's quality when that quality raises
 * a warning (met-missing, delay-sigma-large, delay-sigma-unknown), wet-delay-negative (ZTD below the
 * ZHD, so PWV < 0) and tm-extrapolated (surface temperature outside the data of the Bevis Tm fit).
 */
export const PWV_RECORD_WARNING_CODES = [
  'met-missing',
  'delay-sigma-large',
  'delay-sigma-unknown',
  'wet-delay-negative',
  'tm-extrapolated',
] as const;
export type PwvRecordWarning = (typeof PWV_RECORD_WARNING_CODES)[number];
const WARNING_QUALITIES: readonly PwvQuality[] = ['met-missing', 'delay-sigma-large', 'delay-sigma-unknown'];

/** The record's warning codes joined by ";" (empty when none), the cell of the CSV `warnings` column. */
export function recordWarningCell(r: Pick<StationPwvRecord, 'quality' | 'retrievalWarnings'>): string {
  const quality = WARNING_QUALITIES.includes(r.quality);
  if (r.retrievalWarnings.length === 0) return quality ? r.quality : '';
  return (quality ? [r.quality, ...r.retrievalWarnings] : r.retrievalWarnings).join(';');
}

export interface StationPwvRecord {
  epochMs: number;
  source: string;
  modelFingerprint: string;
  ztdM: number;
  ztdSigmaM: number | null;
  pressureHpa: number | null;
  temperatureC: number | null;
  zhdM: number | null;
  zwdM: number | null;
  zwdSigmaM: number | null;
  tmK: number | null;
  tmSigmaK: number | null;
  conversionFactor: number | null;
  pwvMm: number | null;
  pwvSigmaMm: number | null;
  quality: PwvQuality;
  pressureQuality: InterpolationQuality;
  temperatureQuality: InterpolationQuality;
  /** Warnings of the PWV computation for this record (no quality codes; see recordWarningCell). */
  retrievalWarnings: readonly PwvRecordWarning[];
}

/** Shared by the records without a warning of their own (most of them): no array per record. */
const NO_WARNINGS: readonly PwvRecordWarning[] = Object.freeze([]);

export interface StationPwvOptions {
  maxMetGapMs?: number;
  maxZtdSigmaM?: number;
}

const MAX_WARNINGS = 20;

/** The models of the retrieval itself, for its provenance. */
export function retrievalProvenance(maxMetGapMs: number) {
  return provenance({
    zhd: MODEL_NAMES.zhd,
    tm: MODEL_NAMES.tm,
    conversion: MODEL_NAMES.conversion,
    pwv_sigma_budget: MODEL_NAMES.pwvSigmaBudget,
    met_interpolation: 'linear in time, no extrapolation',
    max_met_gap_s: maxMetGapMs / 1000,
    met_reduction: 'hypsometric pressure, -6.5 K/km',
  });
}

/** One value per epoch from met rows sorted by (epoch, source): the first non-null at each epoch. */
function series(met: readonly SurfaceMetRow[], pick: (r: SurfaceMetRow) => number | null): TimedValue[] {
  const out: TimedValue[] = [];
  for (const r of met) {
    const v = pick(r);
    if (v === null) continue;
    if (out.length && out[out.length - 1]!.epochMs === r.epochMs) continue;
    out.push({ epochMs: r.epochMs, value: v });
  }
  return out;
}

/**
 * The part of a series (sorted by epoch) that interpolation at the sorted `epochsMs` can touch: from
 * the last value at or before the first epoch to the first value at or after the last one. The
 * interpolation of a slice of epochs on it is the interpolation on the whole series, at a cost in
 * proportion to the slice.
 */
function around(values: readonly TimedValue[], epochsMs: readonly number[]): readonly TimedValue[] {
  if (epochsMs.length === 0) return [];
  // First index whose epoch is > t (binary search).
  const after = (t: number) => {
    let lo = 0;
    let hi = values.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (values[mid]!.epochMs <= t) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  const from = Math.max(0, after(epochsMs[0]!) - 1);
  // Up to and including the first value after the last epoch (the right neighbour of an interpolation).
  return values.slice(from, after(epochsMs[epochsMs.length - 1]!) + 1);
}

/**
 * @param station the station (coordinates [deg, m], met sensor height [m])
 * @param delays delay rows sorted by epoch
 * @param met met rows sorted by (epoch, source), covering the delay epochs ± the gap limit
 */
export function stationPrecipitableWater(
  station: Station,
  delays: readonly ZenithDelayRow[],
  met: readonly SurfaceMetRow[],
  options: StationPwvOptions = {},
): { records: StationPwvRecord[]; warnings: string[] } {
  const retrieval = stationPwvRetrieval(station, delays, met, options);
  const records = retrieval.records(0, delays.length);
  return { records, warnings: retrieval.warnings() };
}

/**
 * The retrieval of stationPrecipitableWater in slices, for a caller that yields to the event loop
 * between them (the station PWV read of a station-year): `records(start, end)` computes the records
 * of delays[start..end) — call it for consecutive slices from 0 to delays.length, each once — and
 * `warnings()`, after the last slice, gives the warnings of all of them. The interpolation of the
 * met series to the delay epochs is done once, here (linear in the number of rows).
 */
export interface StationPwvRetrieval {
  records(start: number, end: number): StationPwvRecord[];
  warnings(): string[];
}

export function stationPwvRetrieval(
  station: Station,
  delays: readonly ZenithDelayRow[],
  met: readonly SurfaceMetRow[],
  options: StationPwvOptions = {},
): StationPwvRetrieval {
  const maxMetGapMs = options.maxMetGapMs ?? DEFAULT_MAX_MET_GAP_MS;
  const maxZtdSigmaM = options.maxZtdSigmaM ?? DEFAULT_MAX_ZTD_SIGMA_M;
  const latRad = station.latitudeDeg * DEG;
  const reduce = antennaReduction(station);
  const dHeightM = reduce.dHeightM;

  const pressureSeries = series(met, (r) => r.pressureHpa);
  const temperatureSeries = series(met, (r) => r.temperatureC);

  const warnings: string[] = [];
  let extraWarnings = 0;
  const counts: Record<PwvQuality, number> = {
    'met-missing': 0,
    'delay-sigma-large': 0,
    'delay-sigma-unknown': 0,
    'met-interpolated': 0,
    ok: 0,
  };
  const slice = (start: number, end: number): StationPwvRecord[] => {
    const epochs = new Array<number>(end - start);
    for (let i = start; i < end; i++) epochs[i - start] = delays[i]!.epochMs;
    const pressures = interpolateSeries(around(pressureSeries, epochs), epochs, maxMetGapMs);
    const temperatures = interpolateSeries(around(temperatureSeries, epochs), epochs, maxMetGapMs);
    const records = new Array<StationPwvRecord>(end - start);
    for (let i = start; i < end; i++) {
      const d = delays[i]!;
      const p = pressures[i - start]!;
      const t = temperatures[i - start]!;
      const record: StationPwvRecord = {
        epochMs: d.epochMs,
        source: d.source,
        modelFingerprint: d.modelFingerprint,
        ztdM: d.ztdM,
        ztdSigmaM: d.ztdSigmaM,
        pressureHpa: null,
        temperatureC: null,
        zhdM: null,
        zwdM: null,
        zwdSigmaM: null,
        tmK: null,
        tmSigmaK: null,
        conversionFactor: null,
        pwvMm: null,
        pwvSigmaMm: null,
        quality: 'met-missing',
        pressureQuality: p.quality,
        temperatureQuality: t.quality,
        retrievalWarnings: NO_WARNINGS,
      };
      records[i - start] = record;
      if (p.value === null || t.value === null) {
        counts['met-missing']++;
        if (t.value !== null) record.temperatureC = reduce.temperatureC(t.value);
        // ZHD still follows from a pressure taken at the antenna height itself.
        if (p.value !== null && dHeightM === 0) {
          record.pressureHpa = p.value;
          record.zhdM = zenithHydrostaticDelayM(p.value, latRad, station.heightM);
          record.zwdM = d.ztdM - record.zhdM;
        }
        continue;
      }
      const pressureHpa = reduce.pressureHpa(p.value, t.value);
      const temperatureC = reduce.temperatureC(t.value);
      const res = precipitableWaterFromSurfaceMet(d.ztdM, d.ztdSigmaM, pressureHpa, temperatureC, latRad, station.heightM);
      // Warning texts only for the first MAX_WARNINGS (the field prefix makes each one a new string).
      if (res.wetDelayNegative) {
        if (warnings.length < MAX_WARNINGS) warnings.push(negativeWetDelayWarning(res.zwdM, `records.${i}`));
        else extraWarnings++;
      }
      if (res.tmExtrapolated) {
        if (warnings.length < MAX_WARNINGS) warnings.push(tmExtrapolatedWarning(temperatureC, `records.${i}`));
        else extraWarnings++;
      }
      if (res.wetDelayNegative || res.tmExtrapolated) {
        record.retrievalWarnings = [
          ...(res.wetDelayNegative ? (['wet-delay-negative'] as const) : []),
          ...(res.tmExtrapolated ? (['tm-extrapolated'] as const) : []),
        ];
      }
      const sigmaKnown = d.ztdSigmaM !== null;
      const quality: PwvQuality =
        sigmaKnown && d.ztdSigmaM! > maxZtdSigmaM
          ? 'delay-sigma-large'
          : !sigmaKnown
            ? 'delay-sigma-unknown'
            : p.quality === 'interpolated' || t.quality === 'interpolated'
              ? 'met-interpolated'
              : 'ok';
      counts[quality]++;
      record.pressureHpa = pressureHpa;
      record.temperatureC = temperatureC;
      record.zhdM = res.zhdM;
      record.zwdM = res.zwdM;
      record.zwdSigmaM = sigmaKnown ? res.zwdSigmaM : null;
      record.tmK = res.tmK;
      record.tmSigmaK = res.tmSigmaK;
      record.conversionFactor = res.conversionFactor;
      record.pwvMm = res.pwvMm;
      record.pwvSigmaMm = sigmaKnown ? res.pwvSigmaMm : null;
      record.quality = quality;
    }
    return records;
  };

  const allWarnings = (): string[] => {
    if (extraWarnings > 0) warnings.push(`… and ${extraWarnings} more warnings of the same kinds`);
    if (counts['met-missing'] > 0) {
      warnings.push(
        `${counts['met-missing']} of ${delays.length} record(s) have no PWV: no pressure or temperature record within ${maxMetGapMs / 1000} s on both sides of their epoch (quality "met-missing")`,
      );
    }
    if (counts['delay-sigma-unknown'] > 0) {
      warnings.push(
        `${counts['delay-sigma-unknown']} record(s) have no ztd_sigma_m: their pwv_sigma_mm is null (quality "delay-sigma-unknown")`,
      );
    }
    if (counts['delay-sigma-large'] > 0) {
      warnings.push(`${counts['delay-sigma-large']} record(s) have ztd_sigma_m above ${maxZtdSigmaM} m (quality "delay-sigma-large")`);
    }
    return warnings;
  };
  return { records: slice, warnings: allWarnings };
}
