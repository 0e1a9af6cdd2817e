/**
 * Turns the synthetic generator's observations into the estimator's plain input, with the
 * estimator options the tests use (the defaults of the HTTP API unless overridden).
 */

import type { SyntheticData } from '../../scripts/synthetic-residuals.js';
import type { ZwdEstimationInput, ZwdEstimationOptions } from '../../src/estimation/types.js';
import type { Sky } from './realistic-sky.js';

const DEG = Math.PI / 180;

export const TEST_OPTIONS: ZwdEstimationOptions = {
  zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, aprioriSigmaM: 0.5 },
  gradients: { intervalS: 21600, randomWalkMPerSqrtH: 0.001, aprioriSigmaM: 0.01 },
  epochBias: true,
  weighting: 'elevation',
  sigma0M: 0.003,
  elevationCutoffRad: 7 * DEG,
  outlierThreshold: 4,
  outlierRejection: 'one-per-window',
  maxRejections: 1000,
  scaleSigmas: false,
};

export function toEstimationInput(
  data: SyntheticData,
  latitudeDeg: number,
  options: Partial<ZwdEstimationOptions> = {},
  withSigmas = false,
): ZwdEstimationInput {
  const o = data.observations;
  return {
    latitudeRad: latitudeDeg * DEG,
    observations: {
      epochMs: o.epochMs.slice(),
      satellite: o.satellite.slice(),
      elevationRad: o.elevationDeg.map((e) => e * DEG),
      azimuthRad: o.azimuthDeg.map((a) => a * DEG),
      residualM: o.residualM.slice(),
      ...(withSigmas ? { sigmaM: o.sigmaM.slice() } : {}),
    },
    options: structuredClone({ ...TEST_OPTIONS, ...options }),
  };
}

/** The HTTP API's defaults (TEST_OPTIONS mirrors them) with scale_sigmas on, as the route sends them. */
export const REALISTIC_OPTIONS: ZwdEstimationOptions = { ...TEST_OPTIONS, scaleSigmas: true };

/** A realistic-sky simulation (test/helpers/realistic-sky.ts) as the estimator's input. */
export function skyInput(sky: Sky, options: Partial<ZwdEstimationOptions> = {}): ZwdEstimationInput {
  return {
    latitudeRad: sky.options.latitudeDeg * DEG,
    heightM: sky.options.heightM,
    observations: {
      epochMs: sky.epochMs,
      satellite: sky.satellite,
      elevationRad: sky.elevationRad,
      azimuthRad: sky.azimuthRad,
      residualM: sky.residualM,
    },
    options: structuredClone({ ...REALISTIC_OPTIONS, ...options }),
  };
}
