/**
 * Plain-data input and output of the network estimator (estimate-network.ts). Structured-cloneable,
 * SI units in the names (epochs in ms since 1970 UTC, angles in rad, delays in m), like ../types.ts.
 */

import type {
  EpochEstimate,
  GradientNodeEstimate,
  NoiseCorrelationStatistics,
  RejectedObservation,
  ZwdEstimationOptions,
  ZwdNodeEstimate,
} from '../types.js';

export interface NetworkStation {
  /** Unique name; observations refer to it. */
  name: string;
  /** Geodetic latitude [rad] (Niell wet mapping coefficients, network geometry). */
  latitudeRad: number;
  /** Longitude [rad], east positive (network geometry only). */
  longitudeRad: number;
  /** Ellipsoidal height [m] (network geometry only). */
  heightM: number;
}

/** The single-station columns plus the station of each observation. */
export interface NetworkObservationColumns {
  station: string[];
  epochMs: number[];
  satellite: string[];
  elevationRad: number[];
  azimuthRad: number[];
  residualM: number[];
  sigmaM?: (number | null)[] | undefined;
}

/**
 * "estimated": one clock per satellite and epoch, pre-eliminated (the network solution; needs two
 * or more stations); "known": the residuals were formed with satellite clocks of a global solution
 * (precise point positioning): the network splits into independent single-station solutions.
 */
export type SatelliteClockHandling = 'estimated' | 'known';

export interface NetworkEstimationOptions extends ZwdEstimationOptions {
  satelliteClocks: SatelliteClockHandling;
  /** Station the relative ZWD refers to; null = the station closest to the network's centroid. */
  referenceStation: string | null;
  /** A warning is given when σ of the network-mean ZWD (median over epochs) exceeds this [m]. */
  commonModeSigmaThresholdM: number;
}

export interface NetworkEstimationInput {
  stations: NetworkStation[];
  observations: NetworkObservationColumns;
  options: NetworkEstimationOptions;
}

export interface NetworkEpochEstimate extends EpochEstimate {
  /**
   * σ of δw(t) − δw_ref(t), the ZWD relative to the reference station [m]; 0 for the reference; NaN
   * when the reference has no value then.
   */
  relativeSigmaM: number;
}

export interface NetworkNodeEstimate extends ZwdNodeEstimate {
  /** σ of x_node − x_ref node [m]; null when the reference station has no node at that epoch. */
  relativeSigmaM: number | null;
}

export interface NetworkStationStatistics {
  observationsTotal: number;
  observationsBelowCutoff: number;
  /** Observations of a satellite that no other station saw at that epoch: no clock information, not used. */
  observationsSingleStationSatellite: number;
  observationsUsed: number;
  observationsRejected: number;
  epochs: number;
  /**
   * The station's residual autocorrelation and the mean variance inflation of its formal errors
   * (correlated-noise.ts; satellite clocks estimated); null when switched off; absent when the
   * station was solved alone (its single-station statistics carry it).
   */
  noiseCorrelation?: NoiseCorrelationStatistics | null | undefined;
}

export interface NetworkStationResult {
  station: string;
  zwdNodes: NetworkNodeEstimate[];
  gradientNodes: GradientNodeEstimate[];
  epochs: NetworkEpochEstimate[];
  /** Rejected observations; `index` refers to the network input columns. */
  rejected: RejectedObservation[];
  statistics: NetworkStationStatistics;
  /** Median over the station's epochs of σ(δw) [m] (the absolute level). */
  medianSigmaM: number;
  /** Median over the station's epochs of σ(δw − δw_ref) [m]. */
  medianRelativeSigmaM: number;
}

export interface NetworkCommonMode {
  /** Median over epochs of σ of the network-mean ZWD with the satellite clocks estimated [m]. */
  meanZwdSigmaClocksEstimatedM: number | null;
  /** The same with the satellite clocks known (independent stations) [m]. */
  meanZwdSigmaClocksKnownM: number;
  /**
   * Median over epochs of the correlation of the network-mean ZWD with the epoch's mean clock term
   * (mean over the used observations of receiver + satellite clock: independent of the clock
   * datum); near ±1 when the common mode is absorbed by the clocks; null when satellite clocks are known.
   */
  correlationWithClocks: number | null;
  /** Largest distance between two stations (chord) [km]. */
  extentKm: number;
  /** Largest angle between the directions to two stations, seen from a GNSS satellite 20 200 km above the centroid [deg]. */
  extentNadirDeg: number;
}

export interface NetworkEstimationStatistics {
  stations: number;
  epochs: number;
  observationsTotal: number;
  observationsUsed: number;
  observationsRejected: number;
  /** Observations dropped because their satellite was seen by one station only at that epoch. */
  observationsSingleStationSatellite: number;
  /** (epoch, satellite) pairs dropped for that reason. */
  singleStationSatellites: number;
  /** Epochs at which one station only had observations (no information with satellite clocks estimated). */
  singleStationEpochs: number;
  /** Node parameters + clocks (receiver and satellite, minus one datum clock per connected epoch group). */
  unknowns: number;
  clockUnknowns: number;
  constraints: number;
  degreesOfFreedom: number;
  rmsM: number;
  varianceFactor: number | null;
  sigmaScale: number;
  /**
   * The observation weighting of the final solution with satellite clocks estimated: σ² = a² + b²/sin²e
   * (a = constantM, b = elevationM) and the factor on the variances of caller-given sigmas, after
   * variance components when scaleSigmas is on (the options' values otherwise); absent when every
   * station was solved alone (its own weighting is in its single-station solution).
   */
  weighting?: { constantM: number; elevationM: number; givenSigmaScale: number } | undefined;
  solutions: number;
  screeningComplete: boolean;
}

/** What the network solution with satellite clocks estimated solved with (estimate-network.ts, networkModelOptions). */
export interface NetworkParametrisation {
  /** Spacing of the model's piecewise-linear ZWD nodes [s] (divides the output spacing). */
  zwdNodeIntervalS: number;
  /** The same for the gradients [s]; null without gradients. */
  gradientNodeIntervalS: number | null;
  /** One line for the result's models (and so its fingerprint). */
  statement: string;
}

export interface NetworkEstimationOutput {
  referenceStation: string;
  satelliteClocks: SatelliteClockHandling;
  /** The model of the joint solution (satellite clocks estimated); null when every station was solved alone. */
  parametrisation: NetworkParametrisation | null;
  stations: NetworkStationResult[];
  commonMode: NetworkCommonMode;
  statistics: NetworkEstimationStatistics;
  warnings: string[];
}
