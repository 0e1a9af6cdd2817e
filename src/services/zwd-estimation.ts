/**
 * Glue between the HTTP body of a ZWD estimation and the estimator: request body → plain domain
 * input → estimateZwd → response object, with the a-priori delays, met interpolation, ZTD/ZHD/PWV
 * per epoch and provenance. No fastify here: the station archive runs the same function for
 * POST /v1/stations/{station_id}/zwd-estimates, and estimateZwd itself can run in a worker.
 */

import { DEG } from '../domain/constants.js';
import { ModelDomainError } from '../domain/errors.js';
import { GRADIENT_MODELS } from '../domain/gradients/gradient-mapping.js';
import { interpolateSeries, type Interpolated } from '../domain/meteo/met-interpolation.js';
import { standardAtmosphere } from '../domain/meteo/standard-atmosphere.js';
import { MODEL_NAMES, provenance, type ModelSet } from '../domain/provenance.js';
import { conversionFactor } from '../domain/water-vapour/conversion.js';
import { precipitableWater } from '../domain/water-vapour/precipitable-water.js';
import { zenithHydrostaticDelayM } from '../domain/zenith/hydrostatic.js';
import { estimateZwd } from '../estimation/estimate.js';
import { MIN_REJECTION_WINDOW_INTERVALS, MIN_REJECTION_WINDOW_S } from '../estimation/outliers.js';
import type { ZwdEstimationInput, ZwdEstimationOutput } from '../estimation/types.js';
import type { ZwdEstimatesResponse, ZwdEstimationBody } from '../http/schemas/zwd-estimates.js';

export interface ZwdSite {
  latitude_deg: number;
  longitude_deg: number;
  height_m: number;
}

const iso = (ms: number) => new Date(ms).toISOString();

/** The body's options as the estimator's plain options. */
export function toEstimationInput(site: ZwdSite, body: ZwdEstimationBody): ZwdEstimationInput {
  const o = body.options;
  const n = body.observations.length;
  const epochMs = new Array<number>(n);
  const satellite = new Array<string>(n);
  const elevationRad = new Array<number>(n);
  const azimuthRad = new Array<number>(n);
  const residualM = new Array<number>(n);
  let sigmaM: (number | null)[] | undefined;
  body.observations.forEach((obs, i) => {
    epochMs[i] = Date.parse(obs.epoch);
    satellite[i] = obs.satellite;
    elevationRad[i] = obs.elevation_deg * DEG;
    azimuthRad[i] = obs.azimuth_deg * DEG;
    residualM[i] = obs.residual_m;
    if (obs.sigma_m !== undefined) {
      sigmaM ??= new Array<number | null>(n).fill(null);
      sigmaM[i] = obs.sigma_m;
    }
  });
  return {
    latitudeRad: site.latitude_deg * DEG,
    observations: { epochMs, satellite, elevationRad, azimuthRad, residualM, sigmaM },
    options: {
      zwd: { intervalS: o.zwd_interval_s, randomWalkMPerSqrtH: o.zwd_random_walk_m_per_sqrt_h, aprioriSigmaM: o.zwd_apriori_sigma_m },
      gradients: o.gradients && {
        intervalS: o.gradients.interval_s,
        randomWalkMPerSqrtH: o.gradients.random_walk_m_per_sqrt_h,
        aprioriSigmaM: o.gradients.apriori_sigma_m,
      },
      epochBias: o.epoch_bias,
      weighting: o.weighting,
      sigma0M: o.sigma0_m,
      elevationCutoffRad: o.elevation_cutoff_deg * DEG,
      outlierThreshold: o.outlier_threshold,
      outlierRejection: o.outlier_rejection,
      maxRejections: o.max_rejections,
      scaleSigmas: o.scale_sigmas,
    },
  };
}

/** Models and settings of a result: two series are comparable only when the fingerprints match. */
export function zwdModels(body: ZwdEstimationBody, zhdSource: 'caller' | 'standard-atmosphere'): ModelSet {
  const o = body.options;
  return {
    estimator: 'least squares, piecewise-linear nodes, random-walk constraints, epoch biases pre-eliminated',
    mapping: 'niell: Niell (1996) wet, at the site latitude',
    gradient_mapping: o.gradients ? `chen-herring: ${GRADIENT_MODELS['chen-herring']!.citation}` : 'none',
    apriori_zhd: zhdSource === 'caller' ? 'caller' : `${MODEL_NAMES.zhd} with ${MODEL_NAMES.standardAtmosphere}`,
    zhd: MODEL_NAMES.zhd,
    tm: MODEL_NAMES.tm,
    conversion: MODEL_NAMES.conversion,
    zwd_interval_s: o.zwd_interval_s,
    zwd_random_walk_m_per_sqrt_h: o.zwd_random_walk_m_per_sqrt_h,
    zwd_apriori_sigma_m: o.zwd_apriori_sigma_m,
    gradient_interval_s: o.gradients?.interval_s ?? null,
    gradient_random_walk_m_per_sqrt_h: o.gradients?.random_walk_m_per_sqrt_h ?? null,
    gradient_apriori_sigma_m: o.gradients?.apriori_sigma_m ?? null,
    epoch_bias: o.epoch_bias,
    weighting: o.weighting,
    sigma0_m: o.sigma0_m,
    elevation_cutoff_deg: o.elevation_cutoff_deg,
    outlier_threshold: o.outlier_threshold,
    outlier_statistic: 'pope-1976 tau = v / (sigma0_hat sigma_v)',
    outlier_rejection:
      o.outlier_rejection === 'one-per-window'
        ? `one-per-window (max(${MIN_REJECTION_WINDOW_INTERVALS} intervals, ${MIN_REJECTION_WINDOW_S} s))`
        : 'one-per-solution',
    max_rejections: o.max_rejections,
    scale_sigmas: o.scale_sigmas,
    met_max_gap_s: o.met_max_gap_s,
  };
}

interface MetAtEpochs {
  pressure: Interpolated[];
  temperature: Interpolated[];
}

/** Met records sorted by epoch (duplicates are a 400), interpolated to the series epochs. */
function interpolateMet(body: ZwdEstimationBody, epochsMs: number[]): MetAtEpochs | null {
  if (!body.met) return null;
  const records = body.met.map((r, i) => ({ i, epochMs: Date.parse(r.epoch), r }));
  records.sort((a, b) => a.epochMs - b.epochMs);
  for (let k = 1; k < records.length; k++) {
    if (records[k]!.epochMs === records[k - 1]!.epochMs) {
      const [a, b] = [records[k - 1]!.i, records[k]!.i].sort((x, y) => x - y);
      throw new ModelDomainError(`met.${b}`, `duplicate met epoch ${iso(records[k]!.epochMs)}: also met.${a}; each epoch may appear once`, 400);
    }
  }
  const maxGapMs = body.options.met_max_gap_s * 1000;
  return {
    pressure: interpolateSeries(records.map((x) => ({ epochMs: x.epochMs, value: x.r.pressure_hpa })), epochsMs, maxGapMs),
    temperature: interpolateSeries(records.map((x) => ({ epochMs: x.epochMs, value: x.r.temperature_c })), epochsMs, maxGapMs),
  };
}

/** Repeated per-epoch warnings become one line with a count. */
function collapseWarnings(lines: string[]): string[] {
  const counts = new Map<string, number>();
  for (const l of lines) counts.set(l, (counts.get(l) ?? 0) + 1);
  return [...counts].map(([l, c]) => (c > 1 ? `${l} (${c} epochs)` : l));
}

/**
 * @param site the station (deg, m)
 * @param body validated body (zwdEstimationBody)
 * @throws ModelDomainError 400/422 (the error handler turns it into a problem response)
 */
export async function runZwdEstimation(site: ZwdSite, body: ZwdEstimationBody): Promise<ZwdEstimatesResponse> {
  const latitudeRad = site.latitude_deg * DEG;
  const warnings: string[] = [];
  const zhdSource = body.apriori?.zhd_m === undefined ? ('standard-atmosphere' as const) : ('caller' as const);
  const aprioriZhdM = body.apriori?.zhd_m ?? zenithHydrostaticDelayM(standardAtmosphere(site.height_m).pressureHpa, latitudeRad, site.height_m);
  const aprioriZwdM = body.apriori?.zwd_m ?? 0;
  if (zhdSource === 'standard-atmosphere') {
    warnings.push(
      `apriori.zhd_m not given: ${aprioriZhdM.toFixed(4)} m (Saastamoinen ZHD of the standard atmosphere at ${site.height_m} m) used for ztd_m; give the ZHD the residuals were formed with`,
    );
  }

  const output: ZwdEstimationOutput = estimateZwd(toEstimationInput(site, body));
  warnings.push(...output.warnings);

  const epochsMs = output.epochs.map((e) => e.epochMs);
  const met = interpolateMet(body, epochsMs);
  const perEpochWarnings: string[] = [];
  let missingMet = 0;
  const series = output.epochs.map((e, k) => {
    const ztdM = aprioriZhdM + aprioriZwdM + e.correctionM;
    const base = {
      epoch: iso(e.epochMs),
      correction_m: e.correctionM,
      zwd_m: aprioriZwdM + e.correctionM,
      sigma_m: e.sigmaM,
      north_gradient_m: e.northGradientM,
      east_gradient_m: e.eastGradientM,
      north_gradient_sigma_m: e.northGradientSigmaM,
      east_gradient_sigma_m: e.eastGradientSigmaM,
      epoch_bias_m: e.epochBiasM,
      observations: e.observationsUsed,
      ztd_m: ztdM,
    };
    if (!met) return base;
    const p = met.pressure[k]!;
    const t = met.temperature[k]!;
    if (p.value === null || t.value === null) {
      missingMet++;
      return { ...base, met: 'missing' as const };
    }
    const pwv = precipitableWater({ ztdM, ztdSigmaM: e.sigmaM, pressureHpa: p.value, temperatureC: t.value }, latitudeRad, site.height_m, 'series');
    // Per-epoch numbers are dropped so that repeated warnings collapse into one line with a count.
    perEpochWarnings.push(...pwv.warnings.map((w) => w.replace(/: wet delay -?[\d.]+ mm/, ': wet delay').replace(/: -?[\d.]+ °C is/, ': the temperature is')));
    return {
      ...base,
      met: p.quality === 'measured' && t.quality === 'measured' ? ('measured' as const) : ('interpolated' as const),
      zhd_m: pwv.zhdM!,
      zwd_m: pwv.zwdM,
      tm_k: pwv.tmK,
      pwv_mm: pwv.pwvMm,
      pwv_sigma_mm: conversionFactor(pwv.tmK) * e.sigmaM * 1000,
      pwv_total_sigma_mm: pwv.pwvSigmaMm,
    };
  });
  warnings.push(...collapseWarnings(perEpochWarnings));
  if (missingMet > 0) {
    warnings.push(
      `${missingMet} of ${series.length} epochs have no met (outside the met records or in a gap longer than ${body.options.met_max_gap_s} s): no ZHD or PWV there, zwd_m = a-priori ZWD + correction`,
    );
  }

  const s = output.statistics;
  return {
    zwd_nodes: output.zwdNodes.map((n) => ({ epoch: iso(n.epochMs), correction_m: n.correctionM, zwd_m: aprioriZwdM + n.correctionM, sigma_m: n.sigmaM })),
    gradient_nodes: output.gradientNodes.map((g) => ({
      epoch: iso(g.epochMs),
      north_m: g.northM,
      east_m: g.eastM,
      north_sigma_m: g.northSigmaM,
      east_sigma_m: g.eastSigmaM,
    })),
    series,
    rejected: output.rejected.map((r) => ({
      index: r.index,
      epoch: iso(r.epochMs),
      satellite: r.satellite,
      residual_m: r.residualM,
      fitted_residual_m: r.fittedResidualM,
      normalized_residual: r.normalizedResidual,
    })),
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
    },
    apriori: { zhd_m: aprioriZhdM, zwd_m: aprioriZwdM, zhd_source: zhdSource },
    ...provenance(zwdModels(body, zhdSource)),
    warnings,
  };
}
