/**
 * The ZWD estimation as a use case, in domain shapes (camelCase, SI units; angles of the
 * observations in radians): request → a-priori delays → estimateZwd (src/estimation) → met
 * interpolated to the epochs → ZHD, ZWD, Tm, PWV per epoch → models, fingerprint and warnings.
 * Free of HTTP: the adapters in src/http turn API bodies into ZwdEstimationRequest and
 * ZwdEstimationResult into API answers; the station route stores delayColumns(result).
 */

import { DEG } from '../domain/constants.js';
import { ModelDomainError } from '../domain/errors.js';
import { GRADIENT_MODELS } from '../domain/gradients/gradient-mapping.js';
import { MAPPING_MODELS, type MappingModelKey } from '../domain/mapping/registry.js';
import { interpolateSeries, type InterpolationQuality } from '../domain/meteo/met-interpolation.js';
import { standardAtmosphere } from '../domain/meteo/standard-atmosphere.js';
import { MODEL_NAMES, provenance, type ModelSet } from '../domain/provenance.js';
import type { Site } from '../domain/site.js';
import { conversionFactor } from '../domain/water-vapour/conversion.js';
import { precipitableWaterFromSurfaceMet } from '../domain/water-vapour/precipitable-water.js';
import { zenithHydrostaticDelayM } from '../domain/zenith/hydrostatic.js';
import { estimateZwd } from '../estimation/estimate.js';
import type { ZwdEstimationOptions, ZwdEstimationOutput, ZwdObservationColumns } from '../estimation/types.js';
import { STORED_ZTD_RANGE_M } from '../limits.js';
import { CallerError } from './caller-error.js';
import { guardResidualUnit, negativeZwdWarning } from './unit-guards.js';
import type { MetColumns } from './station-met.js';
import { checkAnswerSize } from './answer-size.js';
import { collapseByCode, warning, type Warning } from './warnings.js';
import { optionModels, type ZwdOptionValues } from './zwd-options.js';

export interface ZwdEstimationRequest {
  site: Site;
  observations: ZwdObservationColumns;
  /** The a-priori delays the residuals were formed with [m]; absent ZHD = standard atmosphere, absent ZWD = 0. */
  apriori: { zhdM?: number | undefined; zwdM?: number | undefined };
  /** Surface met at the site height, in any order (a repeated epoch is refused, naming `met.<index>`). */
  met?: MetColumns | undefined;
  options: ZwdOptionValues;
}

export type MetQuality = 'measured' | 'interpolated' | 'missing';

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
  /** One per estimate.epochs entry; null when the request has no met. */
  epochMet: EpochMetResult[] | null;
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
    mapping: `${options.wetMapping}: ${MAPPING_MODELS[options.wetMapping as MappingModelKey].citation} wet, at the site latitude`,
    gradient_mapping: options.gradients ? `chen-herring: ${GRADIENT_MODELS['chen-herring']!.citation}` : 'none',
    apriori_zhd: zhdSource === 'caller' ? 'caller' : `${MODEL_NAMES.zhd} with ${MODEL_NAMES.standardAtmosphere}`,
    zhd: MODEL_NAMES.zhd,
    tm: MODEL_NAMES.tm,
    conversion: MODEL_NAMES.conversion,
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
  return {
    pressure: interpolateSeries(
      order.map((i) => ({ epochMs: met.epochMs[i]!, value: met.pressureHpa[i]! })),
      epochsMs,
      maxGapMs,
    ),
    temperature: interpolateSeries(
      order.map((i) => ({ epochMs: met.epochMs[i]!, value: met.temperatureC[i]! })),
      epochsMs,
      maxGapMs,
    ),
  };
}

const quality = (p: InterpolationQuality, t: InterpolationQuality): MetQuality =>
  p === 'measured' && t === 'measured' ? 'measured' : 'interpolated';

const MISSING: EpochMetResult = { met: 'missing', zhdM: null, zwdM: null, tmK: null, pwvMm: null, pwvSigmaMm: null, pwvTotalSigmaMm: null };

/** ZHD, ZWD, Tm and PWV per epoch from the interpolated met; per-epoch warnings by code. */
function metPerEpoch(
  request: ZwdEstimationRequest,
  output: ZwdEstimationOutput,
  ztdM: (k: number) => number,
  perEpoch: Warning[],
): EpochMetResult[] | null {
  if (!request.met) return null;
  const { site } = request;
  const latitudeRad = site.latitudeDeg * DEG;
  const met = interpolateMet(
    request.met,
    output.epochs.map((e) => e.epochMs),
    request.options.metMaxGapS,
  );
  return output.epochs.map((e, k) => {
    const p = met.pressure[k]!;
    const t = met.temperature[k]!;
    if (p.value === null || t.value === null) return MISSING;
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
}

/**
 * @throws ModelDomainError 400/422 (a repeated met epoch; the estimator's singular systems and limits)
 */
export function runZwdEstimation(request: ZwdEstimationRequest): ZwdEstimationResult {
  const { site, options } = request;
  checkAnswerSize(request.observations.epochMs, options);
  const latitudeRad = site.latitudeDeg * DEG;
  const warnings: Warning[] = [];
  const zhdSource = request.apriori.zhdM === undefined ? ('standard-atmosphere' as const) : ('caller' as const);
  const aprioriZhdM =
    request.apriori.zhdM ?? zenithHydrostaticDelayM(standardAtmosphere(site.heightM).pressureHpa, latitudeRad, site.heightM);
  const aprioriZwdM = request.apriori.zwdM ?? 0;
  if (zhdSource === 'standard-atmosphere') {
    warnings.push(
      warning(
        'apriori-zhd-defaulted',
        `apriori.zhd_m not given: ${aprioriZhdM.toFixed(4)} m (Saastamoinen ZHD of the standard atmosphere at ${site.heightM} m) used for ztd_m; give the ZHD the residuals were formed with`,
      ),
    );
  }

  guardResidualUnit(request.observations.epochMs, request.observations.residualM);
  const estimate = estimateZwd({
    latitudeRad,
    heightM: request.site.heightM,
    observations: request.observations,
    options: toEstimatorOptions(options),
  });
  warnings.push(...estimate.warnings.map((text) => warning('estimator', text)));

  const perEpoch: Warning[] = [];
  const epochMet = metPerEpoch(request, estimate, (k) => aprioriZhdM + aprioriZwdM + estimate.epochs[k]!.correctionM, perEpoch);
  warnings.push(...collapseByCode(perEpoch));
  const missingMet = epochMet ? epochMet.filter((m) => m.met === 'missing').length : 0;
  if (missingMet > 0) {
    warnings.push(
      warning(
        'met-missing',
        `${missingMet} of ${estimate.epochs.length} epochs have no met (outside the met records or in a gap longer than ${options.metMaxGapS} s): no ZHD or PWV there, zwd_m = a-priori ZWD + correction`,
      ),
    );
  }
  const negative = negativeZwdWarning(estimate.epochs.map((e, k) => epochMet?.[k]?.zwdM ?? aprioriZwdM + e.correctionM));
  if (negative) warnings.push(negative);
  const { models, model_fingerprint } = provenance(zwdModels(options, zhdSource));
  return { estimate, aprioriZhdM, aprioriZwdM, zhdSource, epochMet, models, modelFingerprint: model_fingerprint, warnings };
}

/**
 * The stored form of a result, as columns (cheap to hand back from a worker thread): per epoch
 * ZTD = a-priori ZHD + a-priori ZWD + δw with σ_ZTD = σ_δw (the a-priori ZHD is a fixed value), ZWD
 * (from met where there is met) with the same σ, gradients and their sigmas (NaN = none).
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
  const epochs = result.estimate.epochs;
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
    c.ztdM[k] = result.aprioriZhdM + result.aprioriZwdM + e.correctionM;
    c.sigmaM[k] = e.sigmaM;
    c.zwdM[k] = result.epochMet?.[k]?.zwdM ?? result.aprioriZwdM + e.correctionM;
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
