/**
 * The observation model of the ZWD estimator, without the solver:
 *
 *   r_i = m_w(e_i) δw(t_k) + m_g(e_i) [cos a_i G_N(t_k) + sin a_i G_E(t_k)] + b_k + ε_i
 *
 * - m_w: Niell (1996) wet mapping function at the site latitude (domain/mapping/niell.ts);
 * - m_g: Chen & Herring (1997) gradient mapping, C = 0.0032 (domain/gradients/gradient-mapping.ts);
 * - δw, G_N, G_E piecewise linear between nodes T0 + jΔ, j = 0..J (node layout below);
 * - b_k one bias per epoch (pre-eliminated by the normal-equation code);
 * - σ_i = sigma_m, else σ0/sin e ("elevation") or σ0 ("uniform"); weight 1/σ_i².
 *
 * This file groups observations by epoch, lays out the nodes and computes the partial derivatives.
 */

import { ModelDomainError } from '../domain/errors.js';
import { chenHerringGradientMapping } from '../domain/gradients/gradient-mapping.js';
import { marini } from '../domain/mapping/continued-fraction.js';
import { niellWetCoefficients } from '../domain/mapping/niell.js';
import type { ZwdEstimationInput } from './types.js';

/** Largest number of nodes of one parameter; more is a request error (interval too short for the span). */
export const MAX_NODES = 200_000;

/** Nodes T0 + jΔ, j = 0..count−1. */
export interface NodeLayout {
  firstEpochMs: number;
  intervalMs: number;
  /** J + 1. */
  count: number;
}

/**
 * J is the smallest integer with T0 + JΔ ≥ last epoch (one node for a single epoch). A relative
 * tolerance of 1e-9 Δ keeps an epoch that falls on a node (up to rounding) from adding a node.
 *
 * @param firstEpochMs T0 [ms]  @param lastEpochMs last epoch [ms]  @param intervalS Δ [s], > 0
 */
export function nodeLayout(firstEpochMs: number, lastEpochMs: number, intervalS: number, field: string): NodeLayout {
  const intervalMs = intervalS * 1000;
  const spanIntervals = (lastEpochMs - firstEpochMs) / intervalMs;
  const j = Math.max(0, Math.ceil(spanIntervals - 1e-9));
  if (j + 1 > MAX_NODES) {
    throw new ModelDomainError(
      field,
      `${intervalS} s over the ${((lastEpochMs - firstEpochMs) / 3_600_000).toFixed(1)} h of observations needs ${j + 1} nodes; at most ${MAX_NODES} are allowed: use a longer interval`,
      400,
    );
  }
  return { firstEpochMs, intervalMs, count: j + 1 };
}

export const nodeEpochMs = (layout: NodeLayout, j: number): number => layout.firstEpochMs + j * layout.intervalMs;

/**
 * Interval j (nodes j and j+1) holding an epoch, and the weight α of node j+1:
 * x(t) = (1 − α) x_j + α x_{j+1}. With a single node, j = 0 and α = 0.
 */
export function locate(layout: NodeLayout, epochMs: number): { interval: number; alpha: number } {
  if (layout.count === 1) return { interval: 0, alpha: 0 };
  const u = (epochMs - layout.firstEpochMs) / layout.intervalMs;
  const interval = Math.min(Math.max(Math.floor(u), 0), layout.count - 2);
  return { interval, alpha: u - interval };
}

/** Observations above the cutoff, sorted by epoch, with everything the normal equations need. */
export interface Design {
  /** Input index of each used observation, in epoch order. */
  inputIndex: Int32Array;
  /** Observations of epoch k are [epochStart[k], epochStart[k+1]). */
  epochStart: Int32Array;
  epochMs: Float64Array;
  residualM: Float64Array;
  /** 1/σ_i² [1/m²]. */
  weight: Float64Array;
  sigmaM: Float64Array;
  /** Niell wet mapping factor m_w(e) [-]. */
  wetMapping: Float64Array;
  /** m_g(e) cos a and m_g(e) sin a [-]. */
  northMapping: Float64Array;
  eastMapping: Float64Array;
  elevationRad: Float64Array;
  zwd: NodeLayout;
  gradients: NodeLayout | null;
  /** Per epoch: interval and node-(j+1) weight in each layout. */
  zwdInterval: Int32Array;
  zwdAlpha: Float64Array;
  gradientInterval: Int32Array;
  gradientAlpha: Float64Array;
  observationsBelowCutoff: number;
}

/**
 * @throws ModelDomainError 422 when no observation is above the cutoff, 400 for a duplicate
 *         (epoch, satellite) pair or too many nodes
 */
export function buildDesign(input: ZwdEstimationInput): Design {
  const obs = input.observations;
  const { options } = input;
  const n = obs.epochMs.length;

  // All observations in epoch order (stable sort: ties keep the input order); duplicates are
  // checked on all of them, then those below the cutoff are dropped (and counted).
  const all = Array.from({ length: n }, (_, i) => i);
  all.sort((a, b) => obs.epochMs[a]! - obs.epochMs[b]!);
  checkDuplicates(input, all);
  const kept: number[] = [];
  let belowCutoff = 0;
  for (const i of all) {
    if (obs.elevationRad[i]! < options.elevationCutoffRad) belowCutoff++;
    else kept.push(i);
  }
  if (kept.length === 0) {
    throw new ModelDomainError(
      'observations',
      `none of the ${n} observations is at or above the elevation cutoff (${((options.elevationCutoffRad * 180) / Math.PI).toFixed(2)}°); lower options.elevation_cutoff_deg or send higher observations`,
      422,
    );
  }
  const m = kept.length;
  const inputIndex = Int32Array.from(kept);

  const epochStarts: number[] = [];
  const epochTimes: number[] = [];
  for (let s = 0; s < m; s++) {
    const t = obs.epochMs[inputIndex[s]!]!;
    if (s === 0 || t !== epochTimes[epochTimes.length - 1]) {
      epochStarts.push(s);
      epochTimes.push(t);
    }
  }
  epochStarts.push(m);

  const wet = niellWetCoefficients(input.latitudeRad);
  const residualM = new Float64Array(m);
  const weight = new Float64Array(m);
  const sigmaM = new Float64Array(m);
  const wetMapping = new Float64Array(m);
  const northMapping = new Float64Array(m);
  const eastMapping = new Float64Array(m);
  const elevationRad = new Float64Array(m);
  for (let s = 0; s < m; s++) {
    const i = inputIndex[s]!;
    const e = obs.elevationRad[i]!;
    const sinE = Math.sin(e);
    const given = obs.sigmaM?.[i];
    const sigma = given ?? (options.weighting === 'elevation' ? options.sigma0M / sinE : options.sigma0M);
    residualM[s] = obs.residualM[i]!;
    sigmaM[s] = sigma;
    weight[s] = 1 / (sigma * sigma);
    wetMapping[s] = marini(sinE, wet.a, wet.b, wet.c);
    const mg = chenHerringGradientMapping(e);
    northMapping[s] = mg * Math.cos(obs.azimuthRad[i]!);
    eastMapping[s] = mg * Math.sin(obs.azimuthRad[i]!);
    elevationRad[s] = e;
  }

  const epochs = epochTimes.length;
  const first = epochTimes[0]!;
  const last = epochTimes[epochs - 1]!;
  const zwd = nodeLayout(first, last, options.zwd.intervalS, 'options.zwd_interval_s');
  const gradients = options.gradients ? nodeLayout(first, last, options.gradients.intervalS, 'options.gradients.interval_s') : null;
  const zwdInterval = new Int32Array(epochs);
  const zwdAlpha = new Float64Array(epochs);
  const gradientInterval = new Int32Array(epochs);
  const gradientAlpha = new Float64Array(epochs);
  for (let k = 0; k < epochs; k++) {
    const z = locate(zwd, epochTimes[k]!);
    zwdInterval[k] = z.interval;
    zwdAlpha[k] = z.alpha;
    if (gradients) {
      const g = locate(gradients, epochTimes[k]!);
      gradientInterval[k] = g.interval;
      gradientAlpha[k] = g.alpha;
    }
  }

  return {
    inputIndex,
    epochStart: Int32Array.from(epochStarts),
    epochMs: Float64Array.from(epochTimes),
    residualM,
    weight,
    sigmaM,
    wetMapping,
    northMapping,
    eastMapping,
    elevationRad,
    zwd,
    gradients,
    zwdInterval,
    zwdAlpha,
    gradientInterval,
    gradientAlpha,
    observationsBelowCutoff: belowCutoff,
  };
}

/** A satellite observed twice at one epoch is a caller's mistake (400), named by both indices. */
function checkDuplicates(input: ZwdEstimationInput, sortedByEpoch: readonly number[]): void {
  const { epochMs, satellite } = input.observations;
  const seen = new Map<string, number>();
  let currentEpoch = Number.NaN;
  for (const i of sortedByEpoch) {
    if (epochMs[i] !== currentEpoch) {
      currentEpoch = epochMs[i]!;
      seen.clear();
    }
    const sat = satellite[i]!;
    const other = seen.get(sat);
    if (other !== undefined) {
      const [a, b] = other < i ? [other, i] : [i, other];
      throw new ModelDomainError(
        `observations.${b}`,
        `duplicate observation: satellite ${sat} at ${new Date(currentEpoch).toISOString()} is also observations.${a}; each (epoch, satellite) pair may appear once`,
        400,
      );
    }
    seen.set(sat, i);
  }
}
