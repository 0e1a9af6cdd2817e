/**
 * Plain-data input and output of the zenith wet delay estimator (estimate.ts).
 *
 * Everything here is structured-cloneable (numbers, strings, arrays, plain objects; no class
 * instances, no closures), so the estimator can run in a worker thread and hand its result back.
 * Units are in the names: epochs in milliseconds since 1970-01-01T00:00Z (UTC), angles in radians,
 * delays and sigmas in metres.
 */

import type { MappingModelKey } from '../domain/mapping/registry.js';

/** Observations as columns: element i of every array belongs to observation i. */
export interface ZwdObservationColumns {
  /** Epoch of each observation [ms since 1970, UTC]. Any order; observations are grouped by epoch. */
  epochMs: number[];
  /** Satellite identifier; (epoch, satellite) pairs must be unique. */
  satellite: string[];
  /** Vacuum elevation (0, π/2] [rad]. */
  elevationRad: number[];
  /** Azimuth from north through east [rad]. */
  azimuthRad: number[];
  /** Residual formed with the a-priori troposphere [m]. */
  residualM: number[];
  /** Standard deviation of the residual [m], > 0; null (or absent array) → from the weighting scheme. */
  sigmaM?: (number | null)[] | undefined;
}

/**
 * The same columns as Float64Arrays, σ NaN where the caller gave none: what the estimator reads (an array
 * input is copied into these once, design.ts typedObservationColumns), so that its loops read one element
 * kind at each site; the JSON reader's and a prepared request's columns arrive in this form without a copy.
 */
export interface TypedObservationColumns {
  epochMs: Float64Array;
  /** A name per observation, or (the JSON reader's and a prepared request's) an index into the distinct names. */
  satellite: readonly string[] | IndexedSatellites;
  elevationRad: Float64Array;
  azimuthRad: Float64Array;
  residualM: Float64Array;
  sigmaM: Float64Array | undefined;
}

/**
 * Satellites as indices into their distinct names (the JSON reader's interned texts): no name per observation,
 * and the design numbers the satellites from the indices instead of looking every name up (issue 14).
 */
export interface IndexedSatellites {
  /** names[index[i]] is the satellite of observation i. */
  index: Uint32Array;
  names: readonly string[];
}

/** Node spacing and random-walk constraints of one piecewise-linear parameter (ZWD or a gradient component). */
export interface PiecewiseLinearSettings {
  /** Node spacing Δ [s], > 0. */
  intervalS: number;
  /** Random-walk density q [m/√h]: x_{j+1} − x_j = 0 ± q √(Δ/1 h); null = no constraint between nodes. */
  randomWalkMPerSqrtH: number | null;
  /** A-priori constraint on the first node x_0 = 0 ± σ [m]; null = none. */
  aprioriSigmaM: number | null;
}

/**
 * σ_i of an observation without its own sigma:
 * - "elevation": σ0/sin e;
 * - "uniform": σ0;
 * - "elevation-components": σ² = a² + b²/sin²e with b = σ0 and a = sigmaConstantM (both
 *   re-estimated from the residuals when scaleSigmas is on, variance-component estimation).
 */
export type WeightingScheme = 'elevation' | 'uniform' | 'elevation-components';

/**
 * Where the random-walk states sit:
 * - "every-epoch" (default): a state of ZWD and of each gradient component at every epoch with
 *   observations, random walk between consecutive epochs (weight 1/(q² Δt)); the nodes of the
 *   output are the states interpolated to round UTC epochs T = jΔ with the Brownian-bridge variance.
 *   The random-walk model is then exact at every epoch, whatever Δ is.
 * - "nodes": piecewise-linear between nodes on round UTC epochs T = jΔ (the older model; the
 *   variation of the truth between nodes is not in the formal errors).
 */
export type Parametrisation = 'every-epoch' | 'nodes';

/** Wet mapping function of the estimator: a key of src/domain/mapping/registry.ts. */
export interface WetMappingChoice {
  /** "niell" (default), "vmf1" (needs coefficients), "chao", "cosecant". */
  model: MappingModelKey;
  /**
   * Per-epoch coefficients (VMF1 aw, and ah for completeness), linear in time between the given
   * epochs, held constant outside them; required by models with requiresCoefficients.
   */
  coefficients?: { epochMs: number[]; ah: number[]; aw: number[] } | undefined;
}

export type OutlierRejectionMode = 'one-per-solution' | 'one-per-window';

export interface ZwdEstimationOptions {
  zwd: PiecewiseLinearSettings;
  /** null: no gradients estimated. */
  gradients: PiecewiseLinearSettings | null;
  /** One free bias per epoch (receiver clock and other common terms), pre-eliminated. */
  epochBias: boolean;
  /** σ_i = sigma0/sin e ("elevation") or sigma0 ("uniform") when an observation has no own sigma. */
  weighting: WeightingScheme;
  /** σ0 [m], > 0. */
  sigma0M: number;
  /** Observations below this elevation are not used [rad]. */
  elevationCutoffRad: number;
  /** Reject while the largest |normalised residual| exceeds k; null = no screening. */
  outlierThreshold: number | null;
  /**
   * "one-per-solution": reject only the largest |τ| and re-solve (the textbook loop);
   * "one-per-window": also reject, in the same iteration, the largest |τ| of every stretch of time
   * at least outlierWindowS away from the others (see outliers.ts). Both end with no |τ| above k.
   */
  outlierRejection: OutlierRejectionMode;
  /** Screening stops (with a warning) after this many rejections. */
  maxRejections: number;
  /**
   * Variance-component estimation of the observation weights: the observation sigmas (σ0, or a and
   * b of "elevation-components") are re-estimated from the residuals and the solution repeated, so
   * that the observations' variance factor is 1; the random-walk and a-priori constraints keep
   * their stated sigmas (they are not scaled). false: the weights as given.
   */
  scaleSigmas: boolean;
  /** Default "every-epoch". */
  parametrisation?: Parametrisation | undefined;
  /** a of "elevation-components" [m], ≥ 0; default sigma0M/3 (a starting value when estimated). */
  sigmaConstantM?: number | undefined;
  /**
   * Estimate the residuals' time correlation per satellite arc and inflate the formal errors by it
   * (correlated-noise.ts). Default true.
   */
  correlatedNoise?: boolean | undefined;
  /** Default { model: "niell" }. */
  wetMapping?: WetMappingChoice | undefined;
}

export interface ZwdEstimationInput {
  /** Geodetic latitude of the site [rad], for the Niell wet mapping coefficients. */
  latitudeRad: number;
  /** Site height [m], for mapping functions that use it (default 0). */
  heightM?: number | undefined;
  observations: ZwdObservationColumns;
  options: ZwdEstimationOptions;
}

/** Observation columns either way: arrays (tests, the network estimator, parsed JSON) or Float64Arrays (the JSON reader's). */
export type ObservationColumns = ZwdObservationColumns | TypedObservationColumns;

/** ZwdEstimationInput with columns either way: what estimateZwd and buildDesign take. */
export interface EstimationInput extends Omit<ZwdEstimationInput, 'observations'> {
  observations: ObservationColumns;
}

/** ZwdEstimationInput with typed columns: what the estimator reads. */
export interface TypedEstimationInput extends Omit<ZwdEstimationInput, 'observations'> {
  observations: TypedObservationColumns;
}

export interface ZwdNodeEstimate {
  epochMs: number;
  /** Estimated correction δw to the a-priori ZWD at the node [m]. */
  correctionM: number;
  /** Formal standard deviation [m]. */
  sigmaM: number;
  /** Used observations within one node interval of the node; 0 = the value comes from the random walk alone. */
  observationsNearby: number;
}

export interface GradientNodeEstimate {
  epochMs: number;
  northM: number;
  eastM: number;
  northSigmaM: number;
  eastSigmaM: number;
  /** Used observations within one node interval of the node; 0 = from the random walk alone. */
  observationsNearby: number;
}

export interface EpochEstimate {
  epochMs: number;
  /** δw(t) interpolated between the adjacent nodes [m]. */
  correctionM: number;
  /** Formal standard deviation of δw(t), with the covariance of the adjacent nodes [m]. */
  sigmaM: number;
  northGradientM: number | null;
  eastGradientM: number | null;
  northGradientSigmaM: number | null;
  eastGradientSigmaM: number | null;
  /** Estimated epoch bias b_k [m]; null when epoch_bias is off or no observation of the epoch is left. */
  epochBiasM: number | null;
  /** Observations of this epoch used in the final solution. */
  observationsUsed: number;
}

export interface RejectedObservation {
  /** Index into the input columns. */
  index: number;
  epochMs: number;
  satellite: string;
  /** The residual as given [m]. */
  residualM: number;
  /** Post-fit residual v_i when it was rejected [m]. */
  fittedResidualM: number;
  /** v_i / (σ̂0 σ_v_i) when it was rejected (Pope's τ), signed. */
  normalizedResidual: number;
}

export interface ZwdEstimationStatistics {
  observationsTotal: number;
  observationsBelowCutoff: number;
  observationsUsed: number;
  observationsRejected: number;
  epochs: number;
  zwdNodes: number;
  gradientNodes: number;
  /** Node values plus one bias per epoch with observations (when epoch_bias is on). */
  unknowns: number;
  /** Random-walk and a-priori constraints (pseudo-observations). */
  constraints: number;
  /** observations used + constraints − unknowns. */
  degreesOfFreedom: number;
  /** Root mean square of the post-fit residuals of the used observations [m]. */
  rmsM: number;
  /** σ̂0² = (vᵀPv + constraint residuals) / degrees of freedom; null when that is 0. */
  varianceFactor: number | null;
  /**
   * The factor the formal errors were multiplied with: 1. Since issue 10 the variance factor
   * re-weights the observations (variance components, scaleSigmas) and the formal errors follow
   * from the re-solved system; the random-walk prior is never scaled. Kept for the API.
   */
  sigmaScale: number;
  /** Solutions computed (1 + rejections). */
  solutions: number;
  /** false when screening stopped at maxRejections with residuals above the threshold left. */
  screeningComplete: boolean;
  /** The weights in the final solution: σ² = a² + b²/sin²e (b only: "elevation"; a only: "uniform") [m]. */
  weightingConstantM: number;
  weightingElevationM: number;
  /** Post-fit residuals and rejections per elevation band (a diagnostic of the weighting). */
  elevationBands: ElevationBandStatistics[];
  /** Time correlation of the residuals and what it did to the formal errors; null when not estimated. */
  noiseCorrelation: NoiseCorrelationStatistics | null;
  /** Output nodes with no used observation within one interval (ZWD, gradients). */
  zwdNodesWithoutData: number;
  gradientNodesWithoutData: number;
}

export interface ElevationBandStatistics {
  /** [lowerRad, upperRad) of the band [rad]. */
  lowerRad: number;
  upperRad: number;
  observationsUsed: number;
  observationsRejected: number;
  /** RMS of the post-fit residuals of the used observations [m]; null without any. */
  rmsM: number | null;
  /** RMS of v_i/σ_v_i (≈ 1 when the weights fit this band) [-]; null without any. */
  normalisedRms: number | null;
}

export interface NoiseCorrelationStatistics {
  /** Sampling interval the lags are counted in [s]. */
  samplingS: number;
  /** Autocorrelation of the normalised residuals at lag 1, 2, … (pooled over satellite arcs), up to the first insignificant lag. */
  autocorrelation: number[];
  /** Mean factor the ZWD and gradient variances were multiplied with over the epochs [-]. */
  zwdVarianceInflation: number;
  gradientVarianceInflation: number;
}

export interface ZwdEstimationOutput {
  zwdNodes: ZwdNodeEstimate[];
  gradientNodes: GradientNodeEstimate[];
  epochs: EpochEstimate[];
  rejected: RejectedObservation[];
  statistics: ZwdEstimationStatistics;
  warnings: string[];
}
