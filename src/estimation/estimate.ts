/**
 * Zenith wet delay (and gradient) estimation from residuals with random-walk constraints: the entry
 * point. Plain data in, plain data out (types.ts), so it can run in a worker thread.
 *
 *   design.ts          grouping by epoch, node layout, partial derivatives, weights
 *   least-squares.ts   per-epoch bias elimination, constraints, one solution, residuals and σ_v
 *   frontal-ldl.ts     linear-time LDLᵀ and selected inverse (formal variances and covariances)
 *   outliers.ts        Pope's τ for screening
 *   correlated-noise.ts residual autocorrelation per satellite arc, variance inflation
 *
 * The loop: solve; re-estimate the observation weights (variance components) until they settle;
 * screen for outliers and re-solve; then inflate the formal variances for the time-correlated
 * noise and report the nodes on round UTC epochs (docs/zwd-estimation.md, "Formal errors").
 */

import { ModelDomainError } from '../domain/errors.js';
import { epochInformation, kernelFactor, noiseInflation, type NoiseInflation } from './correlated-noise.js';
import {
  buildDesign,
  initialWeighting,
  typedObservationColumns,
  locate,
  nodeEpochMs,
  satelliteColumnLength,
  satelliteName,
  setWeights,
  type Design,
  type NodeLayout,
} from './design.js';
import { EpochStateSolver, hasEpochStates } from './epoch-states.js';
import { SingularParameterError } from './frontal-ldl.js';
import { epochStateRejectionWindowMs, nodeRejectionWindowMs, rejectionCandidates } from './outliers.js';
import { MIN_TESTABLE_REDUNDANCY, parameterLayout, solveOnce, type ParameterLayout, type Solution } from './least-squares.js';
import { selectInPlace } from './order-statistics.js';
import { threadArrays, type ArraySource } from './reused-arrays.js';
import { screenedSolution } from './screening.js';
import { screeningBound, varianceComponents } from './variance-components.js';
import type {
  ElevationBandStatistics,
  EpochEstimate,
  GradientNodeEstimate,
  EstimationInput,
  RejectedObservation,
  TypedEstimationInput,
  ZwdEstimationOutput,
  ZwdNodeEstimate,
} from './types.js';

/** Niell (1996) fitted the mapping functions from 3° elevation up [rad]. */
const MAPPING_FIT_LOWEST_ELEVATION_RAD = (3 * Math.PI) / 180;

/** Re-weightings of the variance-component estimation at most (each costs a solution). */
export const MAX_REWEIGHTINGS = 4;
/** Relative change of an observation variance component below which the weights are kept (variance-components.ts). */
export { REWEIGHTING_TOLERANCE } from './variance-components.js';
/** Elevation band edges of the diagnostic [deg]. */
export const ELEVATION_BAND_EDGES_DEG = [0, 5, 7, 10, 15, 20, 30, 45, 60, 90.000001] as const;
/** A band whose normalised residual RMS exceeds this gets a warning (its weights are too optimistic). */
export const BAND_RMS_WARNING = 1.5;
/** ... or whose rejections exceed this share of its observations. */
export const BAND_REJECTION_WARNING = 0.02;

/**
 * @throws ModelDomainError 400 for inconsistent input (duplicate (epoch, satellite), too many
 *         nodes), 422 when no observation is above the cutoff or a node is not determined
 */
export function estimateZwd(given: EstimationInput): ZwdEstimationOutput {
  checkColumns(given);
  const input: TypedEstimationInput = { ...given, observations: typedObservationColumns(given.observations) };
  const { options } = input;
  // The per-observation and per-epoch arrays are the thread's reused ones (reused-arrays.ts): none of them
  // is part of the output.
  const arrays = threadArrays;
  const design = buildDesign(input, arrays);
  const layout = parameterLayout(design);
  const used = arrays.uint8('estimate.used', design.residualM.length).fill(1);
  const rejected: RejectedObservation[] = [];
  const rejectedDesign: number[] = [];
  const warnings: string[] = [...design.parametrisationNotes];
  let weighting = initialWeighting(options);
  let givenScale = 1;
  let reweightings = 0;
  // States at every epoch (the default): the block tridiagonal solver, its arrays reused from solution to solution.
  const epochStates = hasEpochStates(design) ? new EpochStateSolver(design, options, arrays) : null;
  const unknownsOf = (s: Solution) => layout.parameters + (options.epochBias ? s.epochsUsed : 0);

  // Each pass (screening.ts): solve; re-estimate the observation weights (variance components, from
  // the observations that are not rejection candidates) and reject this pass's candidates; re-solve
  // while either changed anything.
  const screened = screenedSolution(
    {
      solve: () => solveNamed(design, layout, input, used, epochStates),
      varianceFactor: (s) => {
        const dof = s.observationsUsed + s.constraints - unknownsOf(s);
        return dof > 0 ? s.weightedSquareSum / dof : null;
      },
      candidates: (s, sigmaZero) =>
        rejectionCandidates(design, s, used, sigmaZero, options.outlierThreshold!, options.outlierRejection, () =>
          rejectionWindowMs(input, design, layout, s, arrays),
        ),
      normalizedResidual: (c) => c.normalizedResidual,
      reject: (c, s) => {
        const i = design.inputIndex[c.index]!;
        rejected.push({
          index: i,
          epochMs: input.observations.epochMs[i]!,
          satellite: satelliteName(input.observations.satellite, i),
          residualM: input.observations.residualM[i]!,
          fittedResidualM: s.fittedResidualM[c.index]!,
          normalizedResidual: c.normalizedResidual,
        });
        rejectedDesign.push(c.index);
        used[c.index] = 0;
      },
      reweight: (s, varianceFactor) => {
        if (!options.scaleSigmas || reweightings >= MAX_REWEIGHTINGS || varianceFactor === null) return false;
        const next = varianceComponents(
          [{ design, fittedResidualM: s.fittedResidualM, residualVarianceM2: s.residualVarianceM2, used }],
          options.weighting,
          weighting,
          givenScale,
          screeningBound(options.outlierThreshold, varianceFactor),
        );
        if (!next.changed) return false;
        weighting = next.weighting;
        givenScale = next.givenScale;
        setWeights(design, weighting.a, weighting.b, givenScale);
        reweightings++;
        return true;
      },
    },
    options.outlierThreshold,
    options.maxRejections,
  );
  warnings.push(...screened.warnings);
  const { solution, varianceFactor, solutions, screeningComplete } = screened;
  const unknowns = unknownsOf(solution);
  const degreesOfFreedom = solution.observationsUsed + solution.constraints - unknowns;
  if (options.scaleSigmas && reweightings >= MAX_REWEIGHTINGS) {
    warnings.push(
      `the observation variance components did not settle within ${MAX_REWEIGHTINGS} re-weightings: formal errors may be off by a few per cent`,
    );
  }
  if (varianceFactor === null) {
    warnings.push(
      'no degrees of freedom (one observation per epoch with epoch_bias on, or as many unknowns as observations): the variance factor is not estimable and the weights are not re-estimated',
    );
  }
  // Elevations from the input (the design does not copy them): the same values.
  const elevationRad = input.observations.elevationRad;
  let low = 0;
  for (let s = 0; s < used.length; s++) if (used[s] && elevationRad[design.inputIndex[s]!]! < MAPPING_FIT_LOWEST_ELEVATION_RAD) low++;
  if (low > 0)
    warnings.push(`${low} observations below 3° were used: the mapping functions are fitted from 3° up and are extrapolated there`);

  const noise = noiseInflation(input.options, design, solution, used, layout.gradientCount > 0, arrays);
  const bands = elevationBands(design, elevationRad, solution, used, rejectedDesign);
  for (const b of bands) {
    const name = `${((b.lowerRad * 180) / Math.PI).toFixed(0)}–${Math.min(90, (b.upperRad * 180) / Math.PI).toFixed(0)}°`;
    const total = b.observationsUsed + b.observationsRejected;
    if (b.normalisedRms !== null && b.normalisedRms > BAND_RMS_WARNING) {
      warnings.push(
        `residuals at ${name} are ${b.normalisedRms.toFixed(1)} times their expected size: the weighting underrates the noise there (try options.weighting "elevation-components")`,
      );
    } else if (total > 0 && b.observationsRejected > BAND_REJECTION_WARNING * total && b.observationsRejected > 2) {
      warnings.push(
        `${b.observationsRejected} of ${total} observations at ${name} were rejected (${((100 * b.observationsRejected) / total).toFixed(1)} %): more than gross errors explain; check the weighting there`,
      );
    }
  }
  const perEpoch = usedPerEpoch(design, used);
  const zwdOut = zwdNodes(input, design, solution, perEpoch, noise);
  const gradientOut = gradientNodes(input, design, layout, solution, perEpoch, noise);

  return {
    zwdNodes: zwdOut,
    gradientNodes: gradientOut,
    epochs: epochEstimates(design, layout, solution, perEpoch, noise),
    rejected,
    statistics: {
      observationsTotal: input.observations.epochMs.length,
      observationsBelowCutoff: design.observationsBelowCutoff,
      observationsUsed: solution.observationsUsed,
      observationsRejected: rejected.length,
      epochs: design.epochMs.length,
      zwdNodes: design.zwdOutput.count,
      gradientNodes: design.gradientOutput?.count ?? 0,
      unknowns,
      constraints: solution.constraints,
      degreesOfFreedom,
      rmsM: Math.sqrt(solution.residualSquareSumM2 / solution.observationsUsed),
      varianceFactor,
      sigmaScale: 1,
      solutions,
      screeningComplete,
      weightingConstantM: weighting.a,
      weightingElevationM: weighting.b,
      elevationBands: bands,
      noiseCorrelation: noise.statistics,
      zwdNodesWithoutData: zwdOut.filter((n) => n.observationsNearby === 0).length,
      gradientNodesWithoutData: gradientOut.filter((n) => n.observationsNearby === 0).length,
    },
    warnings,
  };
}

/** Window of "one-per-window" screening (outliers.ts) [ms]. */
function rejectionWindowMs(
  input: TypedEstimationInput,
  design: Design,
  layout: ParameterLayout,
  solution: Solution,
  arrays: ArraySource,
): number {
  const { options } = input;
  // Piecewise-linear ZWD nodes: the ZWD interval decides (as before issue 10).
  if (design.zwd.regular) return nodeRejectionWindowMs(options.zwd.intervalS);
  const epochs = design.epochMs.length;
  if (epochs < 2) return 0;
  const samplingMs = design.samplingMs;
  const hours = samplingMs / 3_600_000;
  const withGradients = layout.gradientCount > 0;
  const zwdQ = options.zwd.randomWalkMPerSqrtH === null ? null : options.zwd.randomWalkMPerSqrtH ** 2 * hours;
  const gradientQ = options.gradients?.randomWalkMPerSqrtH == null ? null : options.gradients.randomWalkMPerSqrtH ** 2 * hours;
  const gradientStates = withGradients && !design.gradients!.regular;
  const lw = arrays.float64('rejectionWindow.zwd', epochs);
  const ln = arrays.float64('rejectionWindow.north', gradientStates ? epochs : 0);
  const le = arrays.float64('rejectionWindow.east', gradientStates ? epochs : 0);
  const information = new Float64Array(3);
  let count = 0;
  for (let k = 0; k < epochs; k++) {
    epochInformation(solution, k, withGradients, information);
    if (!(information[0]! > 0)) continue;
    lw[count] = kernelFactor(information[0]!, zwdQ);
    if (gradientStates) {
      ln[count] = kernelFactor(information[1]!, gradientQ);
      le[count] = kernelFactor(information[2]!, gradientQ);
    }
    count++;
  }
  const median = (xs: Float64Array) => selectInPlace(xs, count, Math.floor(count / 2));
  const lambdas = [lw, ln, le].filter((xs) => xs.length > 0 && count > 0).map(median);
  return epochStateRejectionWindowMs(lambdas, samplingMs);
}

/**
 * Post-fit residuals and rejections per elevation band.
 * @param elevationRad the input's elevations [rad] (indexed through design.inputIndex)
 */
function elevationBands(
  design: Design,
  elevationRad: Float64Array,
  solution: Solution,
  used: Uint8Array,
  rejectedDesign: readonly number[],
): ElevationBandStatistics[] {
  const edges = ELEVATION_BAND_EDGES_DEG.map((d) => (d * Math.PI) / 180);
  const nb = edges.length - 1;
  const count = new Float64Array(nb);
  const sumV2 = new Float64Array(nb);
  const sumTau2 = new Float64Array(nb);
  const tested = new Float64Array(nb);
  const rejectedCount = new Float64Array(nb);
  // The band of an elevation: the last lower edge at or below it (the first band takes anything below
  // 5°, the last anything above 60°). Guessed from the whole degrees (the edges are whole degrees), then
  // settled by the comparisons with the edges in radians: no unpredictable branch per observation, as a
  // bisection of the edges had (a tenth of the estimator's own cost once).
  const bandOfDegree = new Int32Array(91);
  for (let d = 0, b = 0; d <= 90; d++) {
    while (b + 1 < nb && d >= ELEVATION_BAND_EDGES_DEG[b + 1]!) b++;
    bandOfDegree[d] = b;
  }
  const degreesPerRad = 180 / Math.PI;
  const band = (e: number) => {
    const d = Math.floor(e * degreesPerRad);
    let b = d >= 0 && d <= 90 ? bandOfDegree[d]! : 0;
    while (b + 1 < nb && e >= edges[b + 1]!) b++;
    while (b > 0 && !(e >= edges[b]!)) b--;
    return b;
  };
  for (let s = 0; s < used.length; s++) {
    if (!used[s]) continue;
    const b = band(elevationRad[design.inputIndex[s]!]!);
    const v = solution.fittedResidualM[s]!;
    count[b]!++;
    sumV2[b]! += v * v;
    const qv = solution.residualVarianceM2[s]!;
    if (qv > MIN_TESTABLE_REDUNDANCY * Math.sqrt(design.observationVarianceM2[s]!) ** 2) {
      sumTau2[b]! += (v * v) / qv;
      tested[b]!++;
    }
  }
  for (const s of rejectedDesign) rejectedCount[band(elevationRad[design.inputIndex[s]!]!)]!++;
  const out: ElevationBandStatistics[] = [];
  for (let b = 0; b < nb; b++) {
    if (count[b] === 0 && rejectedCount[b] === 0) continue;
    out.push({
      lowerRad: edges[b]!,
      upperRad: Math.min(edges[b + 1]!, Math.PI / 2),
      observationsUsed: count[b]!,
      observationsRejected: rejectedCount[b]!,
      rmsM: count[b]! > 0 ? Math.sqrt(sumV2[b]! / count[b]!) : null,
      normalisedRms: tested[b]! > 0 ? Math.sqrt(sumTau2[b]! / tested[b]!) : null,
    });
  }
  return out;
}

function checkColumns(input: EstimationInput): void {
  const o = input.observations;
  const n = o.epochMs.length;
  for (const [name, column] of [
    ['satellite', { length: satelliteColumnLength(o.satellite) }],
    ['elevation', o.elevationRad],
    ['azimuth', o.azimuthRad],
    ['residual', o.residualM],
    ...(o.sigmaM ? [['sigma', o.sigmaM] as const] : []),
  ] as const) {
    if (column.length !== n) throw new Error(`observation column ${name} has ${column.length} entries, epochs ${n}`);
  }
  if (n === 0) throw new ModelDomainError('observations', 'at least one observation is needed', 400);
}

function solveNamed(
  design: Design,
  layout: ParameterLayout,
  input: TypedEstimationInput,
  used: Uint8Array,
  epochStates: EpochStateSolver | null,
): Solution {
  try {
    // The block tridiagonal solver returns null on a small pivot: the frontal solver then names the
    // undetermined parameter.
    return epochStates?.solve(used) ?? solveOnce(design, input.options, used);
  } catch (err) {
    if (!(err instanceof SingularParameterError)) throw err;
    throw new ModelDomainError('observations', singularMessage(design, layout, input, used, err.parameter), 422);
  }
}

/** Which node is undetermined, how many observations touch it, and which constraint could fix it. */
function singularMessage(
  design: Design,
  layout: ParameterLayout,
  input: TypedEstimationInput,
  used: Uint8Array,
  parameter: number,
): string {
  const { options } = input;
  const isZwd = parameter < layout.zwdCount;
  const isNorth = !isZwd && parameter < layout.eastOffset;
  const node = isZwd ? parameter : isNorth ? parameter - layout.northOffset : parameter - layout.eastOffset;
  const nodes = isZwd ? design.zwd : design.gradients!;
  const name = isZwd ? 'zenith wet delay' : isNorth ? 'north gradient' : 'east gradient';
  let touching = 0;
  for (let k = 0; k < design.epochMs.length; k++) {
    const interval = isZwd ? design.zwdInterval[k]! : design.gradientInterval[k]!;
    const alpha = isZwd ? design.zwdAlpha[k]! : design.gradientAlpha[k]!;
    const weight = interval === node ? 1 - alpha : interval + 1 === node ? alpha : 0;
    if (weight === 0) continue;
    for (let s = design.epochStart[k]!; s < design.epochStart[k + 1]!; s++) if (used[s]) touching++;
  }
  const settings = isZwd ? options.zwd : options.gradients!;
  const prefix = isZwd ? 'options.zwd_' : 'options.gradients.';
  const loose = [
    settings.randomWalkMPerSqrtH === null ? `${prefix}random_walk_m_per_sqrt_h is null` : '',
    settings.aprioriSigmaM === null ? `${prefix}apriori_sigma_m is null` : '',
  ].filter(Boolean);
  const why =
    touching === 0
      ? 'no observation touches it'
      : `${touching} observations touch it, but they do not separate it from the other unknowns${options.epochBias ? ' (with epoch_bias on, the epochs need satellites at different elevations to tell the wet delay from the bias)' : ''}`;
  return `the system is singular: the ${name} node ${node} at ${new Date(nodeEpochMs(nodes, node)).toISOString()} is not determined: ${why}${loose.length ? `, and ${loose.join(' and ')}` : ''}. Add observations or constraints (random walk, a-priori sigma)`;
}

/** Used observations per epoch (the node counts and the epoch estimates). */
function usedPerEpoch(design: Design, used: Uint8Array): Int32Array {
  const out = new Int32Array(design.epochMs.length);
  for (let k = 0; k < out.length; k++) for (let s = design.epochStart[k]!; s < design.epochStart[k + 1]!; s++) out[k]! += used[s]!;
  return out;
}

/** Index of the epoch nearest to t (epochs sorted). */
export function nearestEpoch(epochMs: Float64Array, t: number): number {
  let lo = 0;
  let hi = epochMs.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (epochMs[mid]! <= t) lo = mid;
    else hi = mid;
  }
  return Math.abs(epochMs[hi]! - t) < Math.abs(epochMs[lo]! - t) ? hi : lo;
}

/** For each output node, the used observations within one interval of it. */
function observationsNearby(design: Design, nodes: NodeLayout, perEpoch: Int32Array): number[] {
  const out: number[] = [];
  let lo = 0;
  let hi = 0;
  let inside = 0;
  for (let j = 0; j < nodes.count; j++) {
    const t = nodes.nodeMs[j]!;
    while (hi < perEpoch.length && design.epochMs[hi]! < t + nodes.intervalMs) inside += perEpoch[hi++]!;
    while (lo < hi && design.epochMs[lo]! <= t - nodes.intervalMs) inside -= perEpoch[lo++]!;
    out.push(inside);
  }
  return out;
}

/**
 * Value and variance of a family at an output node from the states: between two states the
 * straight line plus the Brownian-bridge variance q² (t_b − t_a) α (1 − α) of a random walk tied
 * at both states (every-epoch states; for "nodes" α = 0); before the first or after the last state
 * the end state plus q² |t − t_end| (random-walk extrapolation). The correlated-noise factor of the
 * nearest epoch multiplies the part that comes from the states.
 *
 * @param offset parameter id of the family's first state
 * @param inflation per-epoch variance factors of the family
 */
function atNode(
  design: Design,
  states: NodeLayout,
  offset: number,
  q: number | null,
  solution: Solution,
  t: number,
  inflation: Float64Array,
): { value: number; variance: number } {
  const { interval: j, alpha } = locate(states, t);
  const factor = inflation[nearestEpoch(design.epochMs, t)]!;
  const qq = q === null ? Infinity : q * q;
  if (states.count === 1 || alpha < 0 || alpha > 1) {
    const end = states.count === 1 ? 0 : alpha < 0 ? j : j + 1;
    const dtH = Math.abs(t - states.nodeMs[end]!) / 3_600_000;
    return { value: solution.x[offset + end]!, variance: solution.inverse.diagonal[offset + end]! * factor + (dtH > 0 ? qq * dtH : 0) };
  }
  const w = interpolate(solution, offset + j, offset + j + 1, alpha);
  const spanH = (states.nodeMs[j + 1]! - states.nodeMs[j]!) / 3_600_000;
  const bridge = !states.regular && alpha > 0 && alpha < 1 ? qq * spanH * alpha * (1 - alpha) : 0;
  return { value: w.value, variance: w.variance * factor + bridge };
}

/** @param perEpoch used observations per epoch (usedPerEpoch) */
function zwdNodes(
  input: TypedEstimationInput,
  design: Design,
  solution: Solution,
  perEpoch: Int32Array,
  noise: NoiseInflation,
): ZwdNodeEstimate[] {
  const nearby = observationsNearby(design, design.zwdOutput, perEpoch);
  return Array.from({ length: design.zwdOutput.count }, (_, j) => {
    const t = design.zwdOutput.nodeMs[j]!;
    const w = atNode(design, design.zwd, 0, input.options.zwd.randomWalkMPerSqrtH, solution, t, noise.zwd);
    return { epochMs: t, correctionM: w.value, sigmaM: Math.sqrt(w.variance), observationsNearby: nearby[j]! };
  });
}

function gradientNodes(
  input: TypedEstimationInput,
  design: Design,
  layout: ParameterLayout,
  solution: Solution,
  perEpoch: Int32Array,
  noise: NoiseInflation,
): GradientNodeEstimate[] {
  if (!design.gradientOutput || !design.gradients || !input.options.gradients) return [];
  const nearby = observationsNearby(design, design.gradientOutput, perEpoch);
  const q = input.options.gradients.randomWalkMPerSqrtH;
  return Array.from({ length: design.gradientOutput.count }, (_, l) => {
    const t = design.gradientOutput!.nodeMs[l]!;
    const n = atNode(design, design.gradients!, layout.northOffset, q, solution, t, noise.north);
    const e = atNode(design, design.gradients!, layout.eastOffset, q, solution, t, noise.east);
    return {
      epochMs: t,
      northM: n.value,
      eastM: e.value,
      northSigmaM: Math.sqrt(n.variance),
      eastSigmaM: Math.sqrt(e.variance),
      observationsNearby: nearby[l]!,
    };
  });
}

/** Value and variance of (1 − α) x_p + α x_q, with the covariance of the two nodes. */
function interpolate(solution: Solution, p: number, q: number, alpha: number): { value: number; variance: number } {
  return { value: interpolatedValue(solution, p, q, alpha), variance: interpolatedVariance(solution, p, q, alpha) };
}

/** (1 − α) x_p + α x_q; x_p alone when q < 0. */
function interpolatedValue(solution: Solution, p: number, q: number, alpha: number): number {
  return q < 0 ? solution.x[p]! : (1 - alpha) * solution.x[p]! + alpha * solution.x[q]!;
}

/** Variance of (1 − α) x_p + α x_q (not below 0), with the covariance of the two nodes; that of x_p when q < 0. */
function interpolatedVariance(solution: Solution, p: number, q: number, alpha: number): number {
  if (q < 0) return solution.inverse.diagonal[p]!;
  const b = 1 - alpha;
  const variance =
    b * b * solution.inverse.diagonal[p]! + 2 * alpha * b * solution.inverse.get(p, q) + alpha * alpha * solution.inverse.diagonal[q]!;
  return Math.max(variance, 0);
}

function epochEstimates(
  design: Design,
  layout: ParameterLayout,
  solution: Solution,
  perEpoch: Int32Array,
  noise: NoiseInflation,
): EpochEstimate[] {
  const epochs = design.epochMs.length;
  const out: EpochEstimate[] = new Array(epochs);
  // Values and variances straight into the epoch's object (no object per interpolation: ~0.4 MB a GPS-like day).
  const withGradients = layout.gradientCount > 0;
  const two = layout.gradientCount > 1;
  for (let k = 0; k < epochs; k++) {
    const j = design.zwdInterval[k]!;
    const q = layout.zwdCount > 1 ? j + 1 : -1;
    const alpha = design.zwdAlpha[k]!;
    const l = design.gradientInterval[k]!;
    const beta = design.gradientAlpha[k]!;
    const n = layout.northOffset + l;
    const e = layout.eastOffset + l;
    const bias = solution.biasM[k]!;
    out[k] = {
      epochMs: design.epochMs[k]!,
      correctionM: interpolatedValue(solution, j, q, alpha),
      sigmaM: Math.sqrt(interpolatedVariance(solution, j, q, alpha) * noise.zwd[k]!),
      northGradientM: withGradients ? interpolatedValue(solution, n, two ? n + 1 : -1, beta) : null,
      eastGradientM: withGradients ? interpolatedValue(solution, e, two ? e + 1 : -1, beta) : null,
      northGradientSigmaM: withGradients ? Math.sqrt(interpolatedVariance(solution, n, two ? n + 1 : -1, beta) * noise.north[k]!) : null,
      eastGradientSigmaM: withGradients ? Math.sqrt(interpolatedVariance(solution, e, two ? e + 1 : -1, beta) * noise.east[k]!) : null,
      epochBiasM: Number.isNaN(bias) ? null : bias,
      observationsUsed: perEpoch[k]!,
    };
  }
  return out;
}
