/**
 * The ZWD estimation as a use case, in domain shapes (camelCase, SI units; angles of the
 * observations in radians): request → a-priori delays → estimateZwd (src/estimation) → met
 * interpolated to the epochs → ZHD, ZWD, Tm, PWV per epoch → models, fingerprint and warnings.
 * Free of HTTP: the adapters in src/http turn API bodies into ZwdEstimationRequest and
 * ZwdEstimationResult into API answers; the station route stores delayColumns(result).
 */

import { DEG } from '../domain/constants.js';
import { ModelDomainError } from '../domain/errors.js';
import { GEOID_MODEL_NAME, siteHeights } from '../domain/geometry/geoid.js';
import { GRADIENT_MODELS } from '../domain/gradients/gradient-mapping.js';
import { MAPPING_MODELS, type MappingModelKey } from '../domain/mapping/registry.js';
import { interpolateSeries, type InterpolationQuality, type TimedValue } from '../domain/meteo/met-interpolation.js';
import { standardAtmosphere } from '../domain/meteo/standard-atmosphere.js';
import { MODEL_NAMES, provenance, type ModelSet } from '../domain/provenance.js';
import type { Site } from '../domain/site.js';
import { conversionFactor } from '../domain/water-vapour/conversion.js';
import { precipitableWaterFromSurfaceMet } from '../domain/water-vapour/precipitable-water.js';
import { zenithHydrostaticDelayM } from '../domain/zenith/hydrostatic.js';
import { estimateZwd } from '../estimation/estimate.js';
import { typedObservationColumns } from '../estimation/design.js';
import { threadArrays } from '../estimation/reused-arrays.js';
import type {
  EpochEstimate,
  WetMappingChoice,
  ZwdEstimationOptions,
  ZwdEstimationOutput,
  ObservationColumns,
  TypedObservationColumns,
} from '../estimation/types.js';
import { STORED_ZTD_RANGE_M, STORED_ZWD_RANGE_M } from '../limits.js';
import { CallerError } from './caller-error.js';
import {
  azimuthUnitWarning,
  elevationUnitGuard,
  guardResidualUnit,
  negativeZwdWarning,
  relativeHumidityUnitWarning,
} from './unit-guards.js';
import type { MetColumns } from './station-met.js';
import { checkAnswerSize, earliest, latest } from './answer-size.js';
import { collapseByCode, warning, type Warning } from './warnings.js';
import { optionModels, type ZwdOptionValues } from './zwd-options.js';

export interface ZwdEstimationRequest {
  site: Site;
  observations: ObservationColumns;
  /** The a-priori delays the residuals were formed with [m]; absent ZHD = standard atmosphere, absent ZWD = 0. */
  apriori: { zhdM?: number | undefined; zwdM?: number | undefined };
  /** Surface met at the site height, in any order (a repeated epoch is refused, naming `met.<index>`). */
  met?: MetColumns | undefined;
  /** Relative humidities of the met records as sent [%] (not needed for PWV; checked for their unit only). */
  metRelativeHumidityPct?: (number | null)[] | undefined;
  /**
   * VMF1 a coefficients per epoch, for options.wetMapping "vmf1": linear in time between the given
   * epochs, which must bracket every observation epoch; aw maps the wet delay (ah is not used by
   * the estimator, which maps the wet delay only).
   */
  vmf1Coefficients?: { epochMs: number[]; ah: number[]; aw: number[] } | undefined;
  options: ZwdOptionValues;
}

export type MetQuality = 'measured' | 'interpolated' | 'missing';

/**
 * Where the hydrostatic delay behind an epoch's `zwdM` comes from (one definition of the series'
 * ZWD: ZTD − ZHD, see EpochZwd):
 * - "met": Saastamoinen ZHD of the surface pressure, measured or interpolated within met_max_gap_s;
 * - "met-bridged": an epoch without met (a gap longer than met_max_gap_s, or beyond the met
 *   records) when the request has met: the pressure interpolated linearly across the gap, or held
 *   from the nearest record beyond the records, so that the ZWD stays continuous where ZTD is;
 * - "apriori": a request without met: the a-priori ZHD the residuals were formed with.
 */
export type ZhdSource = 'met' | 'met-bridged' | 'apriori';

/**
 * The ZWD of one epoch of the series, with one meaning at every epoch: ZWD = ZTD − ZHD, the ZHD
 * from the surface pressure wherever the request has met (bridged across met gaps), else the
 * a-priori ZHD. Continuous wherever ZTD is (a met gap no longer switches to a-priori ZWD + δw,
 * which jumped by the difference between the a-priori and the measured ZHD).
 */
export interface EpochZwd {
  zwdM: number;
  zhdM: number;
  zhdSource: ZhdSource;
}

/** What met gives at one epoch of the series; null members where met is missing. */
export interface EpochMetResult {
  met: MetQuality;
  zhdM: number | null;
  /** ZTD − ZHD(measured pressure) [m]. */
  zwdM: number | null;
  tmK: number | null;
  pwvMm: number | null;
  /** From the formal error of δw only [mm]. */
  pwvSigmaMm: number | null;
  /** Including the Tm regression uncertainty [mm]. */
  pwvTotalSigmaMm: number | null;
}

export interface ZwdEstimationResult {
  estimate: ZwdEstimationOutput;
  aprioriZhdM: number;
  aprioriZwdM: number;
  zhdSource: 'caller' | 'standard-atmosphere';
  /** EGM96 geoid undulation N at the site [m]: the standard atmosphere and the mapping function get h − N. */
  geoidUndulationM: number;
  /** One per estimate.epochs entry; null when the request has no met. */
  epochMet: EpochMetResult[] | null;
  /** One per estimate.epochs entry: the series' ZWD with one meaning (EpochZwd). */
  epochZwd: EpochZwd[];
  /** Epochs whose ZHD was bridged across a met gap (zhdSource "met-bridged"). */
  bridgedEpochs: number;
  models: ModelSet;
  modelFingerprint: string;
  warnings: Warning[];
}

/** The option values as the estimator's options (angles in radians). */
export function toEstimatorOptions(o: ZwdOptionValues): ZwdEstimationOptions {
  return {
    zwd: { intervalS: o.zwdIntervalS, randomWalkMPerSqrtH: o.zwdRandomWalkMPerSqrtH, aprioriSigmaM: o.zwdAprioriSigmaM },
    gradients: o.gradients
      ? { intervalS: o.gradientIntervalS, randomWalkMPerSqrtH: o.gradientRandomWalkMPerSqrtH, aprioriSigmaM: o.gradientAprioriSigmaM }
      : null,
    epochBias: o.epochBias,
    weighting: o.weighting,
    sigma0M: o.sigma0M,
    elevationCutoffRad: o.elevationCutoffDeg * DEG,
    outlierThreshold: o.outlierThreshold,
    outlierRejection: o.outlierRejection,
    maxRejections: o.maxRejections,
    scaleSigmas: o.scaleSigmas,
    sigmaConstantM: o.sigmaConstantM ?? undefined,
    parametrisation: o.parametrisation,
    correlatedNoise: o.correlatedNoise,
    wetMapping: { model: o.wetMapping as MappingModelKey },
  };
}

/** Models and settings of a result: two series are comparable only when the fingerprints match. */
export function zwdModels(options: ZwdOptionValues, zhdSource: 'caller' | 'standard-atmosphere'): ModelSet {
  return {
    estimator:
      options.parametrisation === 'every-epoch'
        ? 'least squares, random-walk states at every epoch (nodes on round UTC epochs with Brownian-bridge variance), epoch biases pre-eliminated, observation variance components, formal errors inflated for residual time correlation per satellite arc'
        : 'least squares, piecewise-linear nodes on round UTC epochs, random-walk constraints, epoch biases pre-eliminated, observation variance components',
    mapping:
      `${options.wetMapping}: ${MAPPING_MODELS[options.wetMapping as MappingModelKey].citation} wet, at the site latitude` +
      (MAPPING_MODELS[options.wetMapping as MappingModelKey].requiresCoefficients ? ', a_w of vmf1_coefficients linear in time' : ''),
    gradient_mapping: options.gradients ? `chen-herring: ${GRADIENT_MODELS['chen-herring']!.citation}` : 'none',
    apriori_zhd:
      zhdSource === 'caller' ? 'caller' : `${MODEL_NAMES.zhd} with ${MODEL_NAMES.standardAtmosphere} at the height above sea level`,
    geoid: GEOID_MODEL_NAME,
    zhd: MODEL_NAMES.zhd,
    zwd_definition: 'ztd - zhd(surface pressure; bridged linearly across met gaps, held beyond the records), else ztd - apriori zhd',
    tm: MODEL_NAMES.tm,
    conversion: MODEL_NAMES.conversion,
    pwv_sigma_budget: MODEL_NAMES.pwvSigmaBudget,
    outlier_statistic: 'pope-1976 tau = v / (sigma0_hat sigma_v)',
    ...optionModels(options),
  };
}

const iso = (ms: number) => new Date(ms).toISOString();

/** Met sorted by epoch (a repeated epoch is a 400 naming both records), interpolated to the epochs. */
function interpolateMet(met: MetColumns, epochsMs: readonly number[], maxGapS: number) {
  const order = met.epochMs.map((_, i) => i).sort((a, b) => met.epochMs[a]! - met.epochMs[b]! || a - b);
  for (let k = 1; k < order.length; k++) {
    if (met.epochMs[order[k]!] === met.epochMs[order[k - 1]!]) {
      const a = Math.min(order[k - 1]!, order[k]!);
      const b = Math.max(order[k - 1]!, order[k]!);
      throw new ModelDomainError(`met.${b}`, `duplicate met epoch ${iso(met.epochMs[b]!)}: also met.${a}; each epoch may appear once`, 400);
    }
  }
  const maxGapMs = maxGapS * 1000;
  const pressureRecords = order.map((i) => ({ epochMs: met.epochMs[i]!, value: met.pressureHpa[i]! }));
  return {
    pressure: interpolateSeries(pressureRecords, epochsMs, maxGapMs),
    bridgedPressure: bridgePressure(pressureRecords, epochsMs),
    temperature: interpolateSeries(
      order.map((i) => ({ epochMs: met.epochMs[i]!, value: met.temperatureC[i]! })),
      epochsMs,
      maxGapMs,
    ),
  };
}

/**
 * Pressure at every epoch for the ZHD of the series' ZWD (EpochZwd): linear between the records
 * around the epoch whatever the gap, the nearest record's value before the first and after the last
 * record [hPa]. Pressure changes by a few hPa a day (common practice), so a bridged ZHD is good to a
 * few mm over hours; the epochs are flagged ("met-bridged") and counted in a warning.
 */
function bridgePressure(records: readonly TimedValue[], epochsMs: readonly number[]): number[] {
  const inside = interpolateSeries(records, epochsMs, Number.POSITIVE_INFINITY);
  return inside.map((p, k) => p.value ?? (epochsMs[k]! < records[0]!.epochMs ? records[0]! : records[records.length - 1]!).value);
}

const quality = (p: InterpolationQuality, t: InterpolationQuality): MetQuality =>
  p === 'measured' && t === 'measured' ? 'measured' : 'interpolated';

const MISSING: EpochMetResult = { met: 'missing', zhdM: null, zwdM: null, tmK: null, pwvMm: null, pwvSigmaMm: null, pwvTotalSigmaMm: null };

/** ZHD, ZWD, Tm and PWV per epoch from the interpolated met; per-epoch warnings by code. */
function metPerEpoch(
  site: Site,
  metColumns: MetColumns | undefined,
  metMaxGapS: number,
  epochs: readonly EpochEstimate[],
  ztdM: (k: number) => number,
  perEpoch: Warning[],
): { epochMet: EpochMetResult[]; bridgedZhdM: (number | null)[] } | null {
  if (!metColumns || metColumns.epochMs.length === 0) return null;
  const latitudeRad = site.latitudeDeg * DEG;
  const met = interpolateMet(
    metColumns,
    epochs.map((e) => e.epochMs),
    metMaxGapS,
  );
  const bridgedZhdM: (number | null)[] = epochs.map(() => null);
  const epochMet = epochs.map((e, k) => {
    const p = met.pressure[k]!;
    const t = met.temperature[k]!;
    if (p.value === null || t.value === null) {
      bridgedZhdM[k] = zenithHydrostaticDelayM(met.bridgedPressure[k]!, latitudeRad, site.heightM);
      return MISSING;
    }
    const pwv = precipitableWaterFromSurfaceMet(ztdM(k), e.sigmaM, p.value, t.value, latitudeRad, site.heightM);
    if (pwv.wetDelayNegative) {
      perEpoch.push(
        warning('negative-wet-delay', 'series.zwd_m: wet delay is negative (ZTD below the hydrostatic delay); PWV is negative too'),
      );
    }
    if (pwv.tmExtrapolated) {
      perEpoch.push(
        warning(
          'tm-extrapolated',
          'series.temperature_c: the temperature is outside the data of the Bevis Tm regression; Tm is extrapolated',
        ),
      );
    }
    return {
      met: quality(p.quality, t.quality),
      zhdM: pwv.zhdM,
      zwdM: pwv.zwdM,
      tmK: pwv.tmK,
      pwvMm: pwv.pwvMm,
      pwvSigmaMm: conversionFactor(pwv.tmK) * e.sigmaM * 1000,
      pwvTotalSigmaMm: pwv.pwvSigmaMm,
    };
  });
  return { epochMet, bridgedZhdM };
}

/**
 * @throws ModelDomainError 400/422 (a repeated met epoch; the estimator's singular systems and limits)
 */
export function runZwdEstimation(request: ZwdEstimationRequest): ZwdEstimationResult {
  const { site, options } = request;
  // Float64Arrays from here on (the HTTP adapters' as they are, arrays copied once): one element kind in every loop.
  const observations = typedObservationColumns(request.observations);
  checkAnswerSize(observations.epochMs, options);
  const latitudeRad = site.latitudeDeg * DEG;
  const warnings: Warning[] = [];
  guardObservations(observations, warnings, request.metRelativeHumidityPct);
  const wetMapping = wetMappingChoice(request, observations.epochMs);
  // The standard atmosphere and the mapping functions are defined on heights above mean sea level.
  const heights = siteHeights(site.latitudeDeg, site.longitudeDeg, site.heightM);
  const zhdSource = request.apriori.zhdM === undefined ? ('standard-atmosphere' as const) : ('caller' as const);
  const aprioriZhdM =
    request.apriori.zhdM ?? zenithHydrostaticDelayM(standardAtmosphere(heights.aboveSeaLevelM).pressureHpa, latitudeRad, site.heightM);
  const aprioriZwdM = request.apriori.zwdM ?? 0;
  if (zhdSource === 'standard-atmosphere') {
    warnings.push(
      warning(
        'apriori-zhd-defaulted',
        `apriori.zhd_m not given: ${aprioriZhdM.toFixed(4)} m (Saastamoinen ZHD of the standard atmosphere at ${heights.aboveSeaLevelM.toFixed(1)} m above sea level, EGM96 N = ${heights.geoidUndulationM.toFixed(2)} m) used for ztd_m; give the ZHD the residuals were formed with`,
      ),
    );
  }

  guardResidualUnit(observations.epochMs, observations.residualM);
  const estimate = estimateZwd({
    latitudeRad,
    heightM: heights.aboveSeaLevelM,
    observations,
    options: { ...toEstimatorOptions(options), wetMapping },
  });
  warnings.push(...estimate.warnings.map((text) => warning('estimator', text)));

  const ztdM = (k: number) => aprioriZhdM + aprioriZwdM + estimate.epochs[k]!.correctionM;
  const series = seriesZwd(site, request.met, options.metMaxGapS, estimate.epochs, ztdM, aprioriZhdM);
  warnings.push(...series.warnings);
  const { models, model_fingerprint } = provenance(zwdModels(options, zhdSource));
  return {
    estimate,
    aprioriZhdM,
    aprioriZwdM,
    zhdSource,
    geoidUndulationM: heights.geoidUndulationM,
    epochMet: series.epochMet,
    epochZwd: series.epochZwd,
    bridgedEpochs: series.bridgedEpochs,
    models,
    modelFingerprint: model_fingerprint,
    warnings,
  };
}

/** The per-epoch part of a result that met decides: what seriesZwd returns. */
export interface SeriesZwd {
  /** One per epoch; null when there is no met. */
  epochMet: EpochMetResult[] | null;
  /** One per epoch: the series' ZWD with one meaning (EpochZwd). */
  epochZwd: EpochZwd[];
  /** Epochs whose ZHD was bridged across a met gap (zhdSource "met-bridged"). */
  bridgedEpochs: number;
  /** Per-epoch warnings collapsed by code, the met-missing count and the negative-ZWD warning, in that order. */
  warnings: Warning[];
}

/**
 * ZHD, ZWD, Tm and PWV at every estimated epoch of one station's series, from its surface met
 * (interpolated within `metMaxGapS`, the pressure bridged across longer gaps) or, without met, from
 * the a-priori ZHD: the one definition of the series' `zwd_m` (EpochZwd), shared by the
 * single-station estimation and every station of a network estimation.
 * @param ztdM ZTD at epoch k [m] (a-priori ZHD + a-priori ZWD + δw)
 * @throws ModelDomainError 400 naming `met.<i>` for a repeated met epoch
 */
export function seriesZwd(
  site: Site,
  met: MetColumns | undefined,
  metMaxGapS: number,
  epochs: readonly EpochEstimate[],
  ztdM: (k: number) => number,
  aprioriZhdM: number,
): SeriesZwd {
  const warnings: Warning[] = [];
  const perEpoch: Warning[] = [];
  const fromMet = metPerEpoch(site, met, metMaxGapS, epochs, ztdM, perEpoch);
  warnings.push(...collapseByCode(perEpoch));
  const epochZwd: EpochZwd[] = epochs.map((_, k) => {
    const m = fromMet?.epochMet[k];
    if (m && m.zhdM !== null) return { zwdM: m.zwdM!, zhdM: m.zhdM, zhdSource: 'met' };
    const bridged = fromMet?.bridgedZhdM[k];
    if (bridged != null) return { zwdM: ztdM(k) - bridged, zhdM: bridged, zhdSource: 'met-bridged' };
    return { zwdM: ztdM(k) - aprioriZhdM, zhdM: aprioriZhdM, zhdSource: 'apriori' };
  });
  const bridgedEpochs = epochZwd.filter((z) => z.zhdSource === 'met-bridged').length;
  if (bridgedEpochs > 0) {
    warnings.push(
      warning(
        'met-missing',
        `${bridgedEpochs} of ${epochs.length} epochs have no met (outside the met records or in a gap longer than ${metMaxGapS} s): no PWV there; their zwd_m = ztd_m − ZHD of the pressure bridged linearly across the gap (held from the nearest record beyond the records), flagged met "missing" and zhd_source "met-bridged"`,
      ),
    );
  }
  const zwdM = new Float64Array(epochZwd.length);
  for (let k = 0; k < epochZwd.length; k++) zwdM[k] = epochZwd[k]!.zwdM;
  const negative = negativeZwdWarning(zwdM);
  if (negative) warnings.push(negative);
  return { epochMet: fromMet?.epochMet ?? null, epochZwd, bridgedEpochs, warnings };
}

/** Unit guards on the request (unit-guards.ts): refusals throw, warnings are added to `warnings`. */
function guardObservations(
  observations: TypedObservationColumns,
  warnings: Warning[],
  metRelativeHumidityPct: ZwdEstimationRequest['metRelativeHumidityPct'],
): void {
  const { elevationRad, azimuthRad } = observations;
  // The angles in degrees, one column after the other in one typed array (8 bytes an observation), instead
  // of a new array of numbers per column; the thread's reused one (the guards keep nothing of it).
  const degrees = threadArrays.float64('guards.degrees', elevationRad.length);
  const toDeg = (v: Float64Array) => {
    for (let i = 0; i < v.length; i++) degrees[i] = v[i]! / DEG;
    return degrees;
  };
  elevationUnitGuard(toDeg(elevationRad), { field: 'observations', refuseElevations: true });
  const azimuth = azimuthUnitWarning(toDeg(azimuthRad), 'observations');
  if (azimuth) warnings.push(azimuth);
  if (metRelativeHumidityPct) {
    const rh = relativeHumidityUnitWarning('met.relative_humidity_pct', metRelativeHumidityPct);
    if (rh) warnings.push(rh);
  }
}

/**
 * The estimator's wet mapping: the option's model; VMF1 with the request's per-epoch coefficients,
 * which must bracket every observation epoch (a 400 naming `vmf1_coefficients` otherwise: the
 * estimator would hold the end values, an extrapolation nobody asked for).
 */
function wetMappingChoice(request: ZwdEstimationRequest, observationEpochMs: Float64Array): WetMappingChoice {
  const model = request.options.wetMapping as MappingModelKey;
  const c = request.vmf1Coefficients;
  if (!MAPPING_MODELS[model].requiresCoefficients) {
    if (c) {
      throw CallerError.field(
        400,
        'vmf1_coefficients',
        `given, but options.wet_mapping is "${model}"; send options.wet_mapping "vmf1" to use them`,
      );
    }
    return { model };
  }
  if (!c || c.epochMs.length === 0) {
    throw CallerError.field(
      400,
      'vmf1_coefficients',
      `options.wet_mapping "${model}" needs per-epoch coefficients: vmf1_coefficients [{epoch, a_h, a_w}] spanning the observations, in a JSON body (a text/csv request cannot carry them)`,
    );
  }
  const order = c.epochMs.map((_, i) => i).sort((a, b) => c.epochMs[a]! - c.epochMs[b]! || a - b);
  for (let k = 1; k < order.length; k++) {
    if (c.epochMs[order[k]!] === c.epochMs[order[k - 1]!]) {
      const [a, b] = [Math.min(order[k - 1]!, order[k]!), Math.max(order[k - 1]!, order[k]!)];
      throw CallerError.field(
        400,
        `vmf1_coefficients.${b}`,
        `duplicate epoch ${iso(c.epochMs[b]!)}: also vmf1_coefficients.${a}; each epoch may appear once`,
      );
    }
  }
  const first = c.epochMs[order[0]!]!;
  const last = c.epochMs[order[order.length - 1]!]!;
  const obsFirst = earliest(observationEpochMs);
  const obsLast = latest(observationEpochMs);
  if (obsFirst < first || obsLast > last) {
    throw CallerError.field(
      400,
      'vmf1_coefficients',
      `the coefficients span ${iso(first)} to ${iso(last)}, the observations ${iso(obsFirst)} to ${iso(obsLast)}: coefficients are interpolated linearly in time, never extrapolated; give coefficients at or before the first and at or after the last observation`,
    );
  }
  return { model, coefficients: { epochMs: c.epochMs, ah: c.ah, aw: c.aw } };
}

/**
 * The stored form of a result, as columns (cheap to hand back from a worker thread): per epoch
 * ZTD = a-priori ZHD + a-priori ZWD + δw with σ_ZTD = σ_δw (the a-priori ZHD is a fixed value), ZWD
 * (the series' one definition, EpochZwd) with the same σ, gradients and their sigmas (NaN = none).
 */
export interface DelayColumns {
  epochMs: Float64Array;
  ztdM: Float64Array;
  sigmaM: Float64Array;
  zwdM: Float64Array;
  northGradientM: Float64Array;
  eastGradientM: Float64Array;
  northGradientSigmaM: Float64Array;
  eastGradientSigmaM: Float64Array;
}

export function delayColumns(result: ZwdEstimationResult): DelayColumns {
  return delayColumnsOfEpochs(result.estimate.epochs, result.aprioriZhdM + result.aprioriZwdM, (k) => result.epochZwd[k]!.zwdM);
}

/**
 * The stored form of an estimated series (single station, or one station of a network): ZTD = the a-priori
 * ZTD + δw per epoch, ZWD from `zwdAt(k)` (the one definition of the series' `zwd_m`), gradients NaN where
 * none were estimated.
 */
export function delayColumnsOfEpochs(epochs: readonly EpochEstimate[], aprioriZtdM: number, zwdAt: (k: number) => number): DelayColumns {
  const n = epochs.length;
  const c: DelayColumns = {
    epochMs: new Float64Array(n),
    ztdM: new Float64Array(n),
    sigmaM: new Float64Array(n),
    zwdM: new Float64Array(n),
    northGradientM: new Float64Array(n),
    eastGradientM: new Float64Array(n),
    northGradientSigmaM: new Float64Array(n),
    eastGradientSigmaM: new Float64Array(n),
  };
  for (let k = 0; k < n; k++) {
    const e = epochs[k]!;
    c.epochMs[k] = e.epochMs;
    c.ztdM[k] = aprioriZtdM + e.correctionM;
    c.sigmaM[k] = e.sigmaM;
    c.zwdM[k] = zwdAt(k);
    c.northGradientM[k] = e.northGradientM ?? Number.NaN;
    c.eastGradientM[k] = e.eastGradientM ?? Number.NaN;
    c.northGradientSigmaM[k] = e.northGradientSigmaM ?? Number.NaN;
    c.eastGradientSigmaM[k] = e.eastGradientSigmaM ?? Number.NaN;
  }
  return c;
}

/**
 * A station estimation stores only what a direct deposit would accept: every ZTD within
 * STORED_ZTD_RANGE_M (src/limits.ts, the deposit's own range). Otherwise a 422 naming the first
 * epochs outside it, and nothing is stored. A ZTD of tens of metres means residuals in millimetres
 * or another unit mistake, never weather.
 */
export function checkStorableDelays(c: DelayColumns): void {
  const [min, max] = STORED_ZTD_RANGE_M;
  const bad: number[] = [];
  for (let k = 0; k < c.ztdM.length; k++) {
    const v = c.ztdM[k]!;
    if (!(v >= min && v <= max)) bad.push(k);
  }
  if (bad.length === 0) return;
  const shown = bad.slice(0, 5).map((k) => `${new Date(c.epochMs[k]!).toISOString()} (${c.ztdM[k]!.toFixed(3)} m)`);
  const message =
    `estimated ZTD outside the stored range [${min}, ${max}] m at ${bad.length} epochs: ${shown.join(', ')}${bad.length > 5 ? ', ...' : ''}; ` +
    'nothing stored. Residuals in millimetres instead of metres, or an a-priori far from the site, give this; check residual_m and apriori';
  throw CallerError.field(422, 'observations', message);
}

/**
 * The ZWD a station estimation stores, by the deposit's own rule (STORED_ZWD_RANGE_M, src/limits.ts,
 * 0..1 m): a series whose median ZWD is clearly negative (negativeZwdWarning: residuals of the
 * opposite sign) is a 422 and nothing is stored; single epochs outside the range (a ZWD a little
 * below 0 in a dry atmosphere, within its σ) keep their ZTD, and their ZWD is not stored (NaN here,
 * null in the archive), with a warning counting them.
 * @returns the warnings to add to the answer
 */
export function checkStorableZwd(c: DelayColumns): Warning[] {
  const negative = negativeZwdWarning(c.zwdM);
  if (negative) throw CallerError.field(422, 'observations', `${negative.text}; nothing stored`);
  const [min, max] = STORED_ZWD_RANGE_M;
  let dropped = 0;
  for (let k = 0; k < c.zwdM.length; k++) {
    const v = c.zwdM[k]!;
    if (v >= min && v <= max) continue;
    c.zwdM[k] = Number.NaN;
    dropped++;
  }
  if (dropped === 0) return [];
  return [
    warning(
      'zwd-not-stored',
      `${dropped} of ${c.zwdM.length} epochs have a ZWD outside the stored range [${min}, ${max}] m (a direct deposit would refuse it): their ZTD is stored, their ZWD is not (null in the archive)`,
    ),
  ];
}
