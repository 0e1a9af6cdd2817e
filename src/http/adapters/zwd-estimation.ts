/**
 * Adapters of the ZWD estimation between the API shape (snake_case, unit suffixes, degrees, ISO
 * epochs) and the domain shape of src/services/zwd-estimation.ts (camelCase, SI, radians, ms).
 */

import { DEG } from '../../domain/constants.js';
import type { Site } from '../../domain/site.js';
import type { MetColumns } from '../../services/station-met.js';
import { warningTexts } from '../../services/warnings.js';
import type { EpochEstimate, ObservationColumns, TypedObservationColumns, ZwdObservationColumns } from '../../estimation/types.js';
import { satelliteName } from '../../estimation/design.js';
import type { EpochMetResult, EpochZwd, ZwdEstimationRequest, ZwdEstimationResult } from '../../services/zwd-estimation.js';
import { GRADIENTS_GROUP, ZWD_OPTIONS, type OptionSpec, type ZwdOptionValues } from '../../services/zwd-options.js';
import { isoEpochText } from '../../formats/iso-epoch-text.js';
import { isoEpochMs } from '../../formats/iso-epoch.js';
import type { ZwdEstimatesResponse, ZwdEstimationBody } from '../schemas/zwd-estimates.js';
import type { ColumnSpec } from '../columns.js';
import type { JsonColumnsBody } from '../../formats/json-columns-reader.js';
import { numberRangeOf } from '../schemas/common.js';

/** An epoch's text in answers: toISOString's, without a Date per epoch (iso-epoch-text.ts). */
const iso = isoEpochText;

/** options (validated, defaults applied) → domain option values, entry by entry of the table. */
export function toOptionValues(options: ZwdEstimationBody['options']): ZwdOptionValues {
  const o = options as Record<string, unknown> & { gradients: Record<string, unknown> | null };
  const values: Record<string, unknown> = { gradients: o.gradients !== null };
  for (const spec of ZWD_OPTIONS as readonly OptionSpec[]) {
    values[spec.key] = spec.group === GRADIENTS_GROUP.name ? (o.gradients?.[spec.name] ?? spec.default) : o[spec.name];
  }
  return values as ZwdOptionValues;
}

type ObservationObjects = Extract<ZwdEstimationBody['observations'], readonly unknown[]>;

/** Observations as objects (validated) → domain columns (ms, radians). */
export function observationsFromObjects(list: ObservationObjects): ZwdObservationColumns {
  const n = list.length;
  const epochMs = new Array<number>(n);
  const satellite = new Array<string>(n);
  const elevationRad = new Array<number>(n);
  const azimuthRad = new Array<number>(n);
  const residualM = new Array<number>(n);
  let sigmaM: (number | null)[] | undefined;
  for (let i = 0; i < n; i++) {
    const obs = list[i]!;
    epochMs[i] = Date.parse(obs.epoch);
    satellite[i] = obs.satellite;
    elevationRad[i] = obs.elevation_deg * DEG;
    azimuthRad[i] = obs.azimuth_deg * DEG;
    residualM[i] = obs.residual_m;
    if (obs.sigma_m !== undefined) {
      sigmaM ??= new Array<number | null>(n).fill(null);
      sigmaM[i] = obs.sigma_m;
    }
  }
  return { epochMs, satellite, elevationRad, azimuthRad, residualM, sigmaM };
}

/**
 * Observations as column arrays (checked by src/http/columns.ts) → domain columns. An epoch text is
 * parsed once, however many satellites share it.
 */
export function observationsFromColumns(c: Record<string, ArrayLike<unknown> | undefined>): ZwdObservationColumns {
  const epochs = c.epoch as string[];
  const n = epochs.length;
  const epochMs = new Array<number>(n);
  let lastText = '';
  let lastMs = NaN;
  for (let i = 0; i < n; i++) {
    const text = epochs[i]!;
    if (text !== lastText) {
      lastText = text;
      lastMs = Date.parse(text);
    }
    epochMs[i] = lastMs;
  }
  const radians = (column: ArrayLike<unknown>) => {
    const out = new Array<number>(n);
    for (let i = 0; i < n; i++) out[i] = (column[i] as number) * DEG;
    return out;
  };
  const sent = c.sigma_m as ArrayLike<number | null> | undefined;
  const sigma = sent && (Array.isArray(sent) ? (sent as (number | null)[]) : Array.from(sent));
  return {
    epochMs,
    satellite: c.satellite as string[],
    elevationRad: radians(c.elevation_deg!),
    azimuthRad: radians(c.azimuth_deg!),
    residualM: Array.isArray(c.residual_m) ? (c.residual_m as number[]) : Array.from(c.residual_m as ArrayLike<number>),
    sigmaM: sigma?.some((v) => v !== null) ? sigma : undefined,
  };
}

/** The columns of an observation as the column checks see them (columns.ts ColumnSpec). */
interface ObservationColumnSpecs {
  epoch: ColumnSpec;
  satellite: ColumnSpec;
  elevation_deg: ColumnSpec;
  azimuth_deg: ColumnSpec;
  residual_m: ColumnSpec;
  sigma_m: ColumnSpec;
}

type NumberColumn = ArrayLike<unknown>;
const isNumberColumn = (v: unknown): v is NumberColumn => Array.isArray(v) || v instanceof Float64Array;

/**
 * A number column checked against its range and scaled in one loop, or undefined at the first value
 * that is not a number in range (null passes where `nullable`, and stays null).
 */
function scaledColumn(column: NumberColumn, spec: ColumnSpec, scale: number, nullable: boolean): (number | null)[] | undefined {
  const range = numberRangeOf(spec.schema);
  if (!range) return undefined;
  const { min, max, exclusiveMin } = range;
  const n = column.length;
  const out = new Array<number | null>(n);
  for (let i = 0; i < n; i++) {
    const v = column[i];
    if (typeof v === 'number' && (exclusiveMin ? v > min : v >= min) && v <= max) out[i] = scale === 1 ? v : v * scale;
    else if (v === null && nullable) out[i] = null;
    else return undefined;
  }
  return out;
}

/**
 * A text column checked by its schema once per run of equal values (epochs repeat on every satellite
 * of an epoch) and once per distinct value (satellite names), or undefined at the first invalid value.
 */
const NONE = Symbol('no value yet');

function checkedTextColumn(column: unknown, spec: ColumnSpec): string[] | undefined {
  if (!Array.isArray(column)) return undefined;
  const valid = new Set<string>();
  let last: unknown = NONE;
  for (let i = 0; i < column.length; i++) {
    const v: unknown = column[i];
    if (v === last) continue;
    if (typeof v !== 'string') return undefined;
    last = v;
    if (valid.has(v)) continue;
    if (!spec.accepts(v)) return undefined;
    if (valid.size < 100_000) valid.add(v);
  }
  return column as string[];
}

/**
 * Observations as column arrays, checked and converted to domain columns in one loop per column, when
 * every check passes: the columns of `specs` and no other, each an array of 1..maxRows values of one
 * length, every value valid by its row schema (numbers by their range, epochs and satellites by their
 * schema once per distinct text). Anything else answers undefined, and the caller runs the full check
 * (src/http/columns.ts readColumns), whose errors name the column and the row. So this never accepts
 * what readColumns refuses, and gives the columns observationsFromColumns gives (issue 14: the check
 * through a closure per value, then a second pass to convert, were ~6 ms of a GPS-like day's 26 000
 * observations).
 */
export function checkedObservationColumns(raw: unknown, specs: ObservationColumnSpecs, maxRows: number): ZwdObservationColumns | undefined {
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) return undefined;
  const c = raw as Record<string, unknown>;
  for (const key in c) if (!Object.hasOwn(specs, key)) return undefined;
  const { epoch, satellite, elevation_deg, azimuth_deg, residual_m, sigma_m } = c;
  if (!Array.isArray(epoch) || !isNumberColumn(elevation_deg) || !isNumberColumn(azimuth_deg) || !isNumberColumn(residual_m))
    return undefined;
  if (!Array.isArray(satellite) || (sigma_m !== undefined && !isNumberColumn(sigma_m))) return undefined;
  const n = epoch.length;
  if (n < 1 || n > maxRows) return undefined;
  if (satellite.length !== n || elevation_deg.length !== n || azimuth_deg.length !== n || residual_m.length !== n) return undefined;
  if (sigma_m !== undefined && sigma_m.length !== n) return undefined;
  const elevationRad = scaledColumn(elevation_deg, specs.elevation_deg, DEG, false);
  const azimuthRad = elevationRad && scaledColumn(azimuth_deg, specs.azimuth_deg, DEG, false);
  const residualM = azimuthRad && scaledColumn(residual_m, specs.residual_m, 1, false);
  const sigma = residualM && sigma_m !== undefined ? scaledColumn(sigma_m, specs.sigma_m, 1, true) : undefined;
  if (!residualM || (sigma_m !== undefined && !sigma)) return undefined;
  const epochs = checkedTextColumn(epoch, specs.epoch);
  const satellites = epochs && checkedTextColumn(satellite, specs.satellite);
  if (!satellites) return undefined;
  const epochMs = new Array<number>(n);
  let lastText = '';
  let lastMs = NaN;
  for (let i = 0; i < n; i++) {
    const text = epochs![i]!;
    if (text !== lastText) {
      lastText = text;
      lastMs = Date.parse(text);
    }
    epochMs[i] = lastMs;
  }
  let anySigma = false;
  if (sigma) for (let i = 0; i < n && !anySigma; i++) anySigma = sigma[i] !== null;
  return {
    epochMs,
    satellite: satellites,
    elevationRad: elevationRad as number[],
    azimuthRad: azimuthRad as number[],
    residualM: residualM as number[],
    sigmaM: anySigma ? sigma : undefined,
  };
}

/**
 * The numeric columns of a one-pass read (src/formats/json-columns-reader.ts, every value checked there) in
 * domain units, taking the reader's columns over: epochs parsed once per distinct text, the angles scaled to
 * radians in place, residuals and σ (NaN for a row without one; absent when no row has one) as they are. The
 * read's numbers must not be used after. Satellites are left to the caller (names or indices).
 */
export function domainNumbersOfRead(read: JsonColumnsBody): Omit<TypedObservationColumns, 'satellite'> {
  const n = read.rows;
  const epochs = read.texts.epoch!;
  const msOf = new Float64Array(epochs.distinct.length);
  for (let k = 0; k < msOf.length; k++) msOf[k] = isoEpochMs(epochs.distinct[k]!); // Date.parse's value
  const epochMs = new Float64Array(n);
  for (let i = 0; i < n; i++) epochMs[i] = msOf[epochs.index[i]!]!;
  const { elevation_deg: elevationRad, azimuth_deg: azimuthRad, residual_m: residualM, sigma_m: sigma } = read.numbers;
  for (let i = 0; i < n; i++) {
    elevationRad![i]! *= DEG;
    azimuthRad![i]! *= DEG;
  }
  let anySigma = false;
  if (sigma) for (let i = 0; i < n && !anySigma; i++) anySigma = !Number.isNaN(sigma[i]!);
  return { epochMs, elevationRad: elevationRad!, azimuthRad: azimuthRad!, residualM: residualM!, sigmaM: anySigma ? sigma : undefined };
}

/**
 * Observation columns read in one pass from the JSON body → the estimator's typed columns (domainNumbersOfRead,
 * no copy of the numbers; issue 14: arrays of them were ~1.3 ms and 0.8 MB of garbage a GPS-like day) and the
 * satellites as the reader's indices into its distinct names (no name per observation). The read must not be
 * used after.
 */
export function typedObservationsFromJsonColumns(read: JsonColumnsBody): TypedObservationColumns {
  const satellites = read.texts.satellite!;
  return { ...domainNumbersOfRead(read), satellite: { index: satellites.index, names: satellites.distinct } };
}

/**
 * The same as arrays of numbers, σ null for a row without one (the network estimator's columns): the values
 * checkedObservationColumns gives for the parsed body. The read must not be used after.
 */
export function observationsFromJsonColumns(read: JsonColumnsBody): ZwdObservationColumns {
  const t = typedObservationsFromJsonColumns(read);
  const sigma = t.sigmaM;
  return {
    epochMs: Array.from(t.epochMs),
    satellite: Array.from({ length: read.rows }, (_, i) => satelliteName(t.satellite, i)),
    elevationRad: Array.from(t.elevationRad),
    azimuthRad: Array.from(t.azimuthRad),
    residualM: Array.from(t.residualM),
    sigmaM: sigma && Array.from(sigma, (v) => (Number.isNaN(v) ? null : v)),
  };
}

/**
 * The validated body (site from the body or the station) and its observations in domain columns → the
 * domain request. `storedMet` serves when the body has no met.
 */
export function toZwdRequest(
  site: Site,
  body: Omit<ZwdEstimationBody, 'observations'>,
  observations: ObservationColumns,
  storedMet?: MetColumns,
): ZwdEstimationRequest {
  const met: MetColumns | undefined = body.met
    ? {
        epochMs: body.met.map((r) => Date.parse(r.epoch)),
        pressureHpa: body.met.map((r) => r.pressure_hpa),
        temperatureC: body.met.map((r) => r.temperature_c),
      }
    : storedMet && storedMet.epochMs.length > 0
      ? storedMet
      : undefined;
  return {
    site,
    observations,
    apriori: { zhdM: body.apriori?.zhd_m, zwdM: body.apriori?.zwd_m },
    met,
    metRelativeHumidityPct: body.met?.map((r) => r.relative_humidity_pct ?? null),
    vmf1Coefficients: body.vmf1_coefficients && {
      epochMs: body.vmf1_coefficients.map((r) => Date.parse(r.epoch)),
      ah: body.vmf1_coefficients.map((r) => r.a_h),
      aw: body.vmf1_coefficients.map((r) => r.a_w),
    },
    options: toOptionValues(body.options),
  };
}

/**
 * One epoch of a series in the API shape (the single-station series, and every station's series of a
 * network answer): δw, the ZWD of its one definition (EpochZwd), gradients, ZTD, and with met the
 * met quality, ZHD, Tm and PWV with its σ.
 */
export function seriesEntryOf(e: EpochEstimate, zwd: EpochZwd, m: EpochMetResult | undefined, aprioriZtdM: number) {
  const base = {
    epoch: iso(e.epochMs),
    correction_m: e.correctionM,
    zwd_m: zwd.zwdM,
    zhd_source: zwd.zhdSource,
    sigma_m: e.sigmaM,
    north_gradient_m: e.northGradientM,
    east_gradient_m: e.eastGradientM,
    north_gradient_sigma_m: e.northGradientSigmaM,
    east_gradient_sigma_m: e.eastGradientSigmaM,
    epoch_bias_m: e.epochBiasM,
    observations: e.observationsUsed,
    ztd_m: aprioriZtdM + e.correctionM,
  };
  if (!m) return base;
  if (m.met === 'missing') return { ...base, met: m.met, zhd_m: zwd.zhdM };
  return {
    ...base,
    met: m.met,
    zhd_m: m.zhdM!,
    tm_k: m.tmK!,
    pwv_mm: m.pwvMm!,
    pwv_sigma_mm: m.pwvSigmaMm!,
    pwv_total_sigma_mm: m.pwvTotalSigmaMm!,
  };
}

/** The domain result → the API answer of POST /v1/zwd-estimates. */
export function zwdEstimatesResponseOf(r: ZwdEstimationResult, extraWarnings: readonly string[] = []): ZwdEstimatesResponse {
  const { estimate: out, aprioriZwdM } = r;
  const aprioriZtdM = r.aprioriZhdM + aprioriZwdM;
  return {
    zwd_nodes: out.zwdNodes.map((n) => ({
      epoch: iso(n.epochMs),
      correction_m: n.correctionM,
      zwd_m: aprioriZwdM + n.correctionM,
      sigma_m: n.sigmaM,
      observations_nearby: n.observationsNearby,
    })),
    gradient_nodes: out.gradientNodes.map((g) => ({
      epoch: iso(g.epochMs),
      north_m: g.northM,
      east_m: g.eastM,
      north_sigma_m: g.northSigmaM,
      east_sigma_m: g.eastSigmaM,
      observations_nearby: g.observationsNearby,
    })),
    series: out.epochs.map((e, k) => seriesEntryOf(e, r.epochZwd[k]!, r.epochMet?.[k], aprioriZtdM)),
    rejected: out.rejected.map((x) => ({
      index: x.index,
      epoch: iso(x.epochMs),
      satellite: x.satellite,
      residual_m: x.residualM,
      fitted_residual_m: x.fittedResidualM,
      normalized_residual: x.normalizedResidual,
    })),
    ...zwdAnswerSummaryOf(r, extraWarnings),
  };
}

/** The answer's members after its tables (zwdEstimatesResponseOf's), for JSON.stringify. */
export function zwdAnswerSummaryOf(r: ZwdEstimationResult, extraWarnings: readonly string[] = []) {
  const s = r.estimate.statistics;
  return {
    statistics: {
      observations_total: s.observationsTotal,
      observations_below_cutoff: s.observationsBelowCutoff,
      observations_used: s.observationsUsed,
      observations_rejected: s.observationsRejected,
      epochs: s.epochs,
      zwd_nodes: s.zwdNodes,
      gradient_nodes: s.gradientNodes,
      unknowns: s.unknowns,
      constraints: s.constraints,
      degrees_of_freedom: s.degreesOfFreedom,
      rms_m: s.rmsM,
      variance_factor: s.varianceFactor,
      sigma_scale: s.sigmaScale,
      solutions: s.solutions,
      screening_complete: s.screeningComplete,
      weighting_constant_m: s.weightingConstantM,
      weighting_elevation_m: s.weightingElevationM,
      elevation_bands: s.elevationBands.map((b) => ({
        // Band edges are whole degrees: rounded to 1e-6° so that 15° does not print as 14.999999999999998.
        lower_deg: Math.round((b.lowerRad / DEG) * 1e6) / 1e6,
        upper_deg: Math.round((b.upperRad / DEG) * 1e6) / 1e6,
        observations_used: b.observationsUsed,
        observations_rejected: b.observationsRejected,
        rms_m: b.rmsM,
        normalised_rms: b.normalisedRms,
      })),
      noise_correlation: s.noiseCorrelation && {
        sampling_s: s.noiseCorrelation.samplingS,
        autocorrelation: s.noiseCorrelation.autocorrelation,
        zwd_variance_inflation: s.noiseCorrelation.zwdVarianceInflation,
        gradient_variance_inflation: s.noiseCorrelation.gradientVarianceInflation,
      },
      zwd_nodes_without_data: s.zwdNodesWithoutData,
      gradient_nodes_without_data: s.gradientNodesWithoutData,
    },
    apriori: { zhd_m: r.aprioriZhdM, zwd_m: r.aprioriZwdM, zhd_source: r.zhdSource },
    geoid_undulation_m: r.geoidUndulationM,
    models: r.models,
    model_fingerprint: r.modelFingerprint,
    warnings: [...warningTexts(r.warnings), ...extraWarnings],
  };
}
