/**
 * One non-default value per estimation option (by the table's domain key), in the forms the four
 * entry points take it, and the estimator options these values must become, written out by hand
 * (not derived from the code under test). A new option without an entry here fails the tests.
 */

import { DEFAULT_ZWD_OPTIONS, ZWD_OPTIONS, type OptionSpec } from '../../src/services/zwd-options.js';
import type { ZwdEstimationOptions } from '../../src/estimation/types.js';

export const NON_DEFAULT: Record<string, number | boolean | string> = {
  zwdIntervalS: 600,
  zwdRandomWalkMPerSqrtH: 0.02,
  zwdAprioriSigmaM: 0.3,
  gradientIntervalS: 7200,
  gradientRandomWalkMPerSqrtH: 0.002,
  gradientAprioriSigmaM: 0.02,
  epochBias: false,
  weighting: 'uniform',
  sigma0M: 0.004,
  elevationCutoffDeg: 10,
  outlierThreshold: 5,
  outlierRejection: 'one-per-solution',
  maxRejections: 50,
  scaleSigmas: false,
  metMaxGapS: 600,
};

export const SPECS = ZWD_OPTIONS as readonly OptionSpec[];

/** The JSON `options` object. */
export function jsonOptions(): Record<string, unknown> {
  const top: Record<string, unknown> = {};
  const gradients: Record<string, unknown> = {};
  for (const s of SPECS) (s.group === 'gradients' ? gradients : top)[s.name] = NON_DEFAULT[s.key];
  return { ...top, gradients };
}

/** The text/csv query parameters. */
export function queryOptions(): Record<string, string> {
  return Object.fromEntries(SPECS.map((s) => [s.flatName, String(NON_DEFAULT[s.key])]));
}

/** What the estimator must be called with (angles in radians). */
export const EXPECTED_ESTIMATOR_OPTIONS: ZwdEstimationOptions = {
  zwd: { intervalS: 600, randomWalkMPerSqrtH: 0.02, aprioriSigmaM: 0.3 },
  gradients: { intervalS: 7200, randomWalkMPerSqrtH: 0.002, aprioriSigmaM: 0.02 },
  epochBias: false,
  weighting: 'uniform',
  sigma0M: 0.004,
  elevationCutoffRad: (10 * Math.PI) / 180,
  outlierThreshold: 5,
  outlierRejection: 'one-per-solution',
  maxRejections: 50,
  scaleSigmas: false,
};

/** The settings `models` must record, by flatName (outlier_rejection as its model text). */
export const EXPECTED_MODEL_SETTINGS: Record<string, number | boolean | string> = {
  zwd_interval_s: 600,
  zwd_random_walk_m_per_sqrt_h: 0.02,
  zwd_apriori_sigma_m: 0.3,
  gradient_interval_s: 7200,
  gradient_random_walk_m_per_sqrt_h: 0.002,
  gradient_apriori_sigma_m: 0.02,
  epoch_bias: false,
  weighting: 'uniform',
  sigma0_m: 0.004,
  elevation_cutoff_deg: 10,
  outlier_threshold: 5,
  outlier_rejection: 'one-per-solution',
  max_rejections: 50,
  scale_sigmas: false,
  met_max_gap_s: 600,
};

export { DEFAULT_ZWD_OPTIONS };
