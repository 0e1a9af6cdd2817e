/**
 * Plain-data input and output of the zenith wet delay estimator (estimate.ts).
 *
 * Everything here is structured-cloneable (numbers, strings, arrays, plain objects; no class
 * instances, no closures), so the estimator can run in a worker thread and hand its result back.
 * Units are in the names: epochs in milliseconds since 1970-01-01T00:00Z (UTC), angles in radians,
 * delays and sigmas in metres.
 */

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

/** Node spacing and random-walk constraints of one piecewise-linear parameter (ZWD or a gradient component). */
export interface PiecewiseLinearSettings {
  /** Node spacing Δ [s], > 0. */
  intervalS: number;
  /** Random-walk density q [m/√h]: x_{j+1} − x_j = 0 ± q √(Δ/1 h); null = no constraint between nodes. */
  randomWalkMPerSqrtH: number | null;
  /** A-priori constraint on the first node x_0 = 0 ± σ [m]; null = none. */
  aprioriSigmaM: number | null;
}

export type WeightingScheme = 'elevation' | 'uniform';

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
  /** Multiply formal errors by √(variance factor) (when the degrees of freedom are > 0). */
  scaleSigmas: boolean;
}

export interface ZwdEstimationInput {
  /** Geodetic latitude of the site [rad], for the Niell wet mapping coefficients. */
  latitudeRad: number;
  observations: ZwdObservationColumns;
  options: ZwdEstimationOptions;
}

export interface ZwdNodeEstimate {
  epochMs: number;
  /** Estimated correction δw to the a-priori ZWD at the node [m]. */
  correctionM: number;
  /** Formal standard deviation [m]. */
  sigmaM: number;
}

export interface GradientNodeEstimate {
  epochMs: number;
  northM: number;
  eastM: number;
  northSigmaM: number;
  eastSigmaM: number;
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
  /** The factor the formal errors were multiplied with (√variance factor, or 1). */
  sigmaScale: number;
  /** Solutions computed (1 + rejections). */
  solutions: number;
  /** false when screening stopped at maxRejections with residuals above the threshold left. */
  screeningComplete: boolean;
}

export interface ZwdEstimationOutput {
  zwdNodes: ZwdNodeEstimate[];
  gradientNodes: GradientNodeEstimate[];
  epochs: EpochEstimate[];
  rejected: RejectedObservation[];
  statistics: ZwdEstimationStatistics;
  warnings: string[];
}

