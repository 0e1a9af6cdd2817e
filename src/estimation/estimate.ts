/**
 * Zenith wet delay (and gradient) estimation from residuals with random-walk constraints: the entry
 * point. Plain data in, plain data out (types.ts), so it can run in a worker thread.
 *
 *   design.ts        grouping by epoch, node layout, partial derivatives, weights
 *   least-squares.ts per-epoch bias elimination, constraints, one solution, residuals and σ_v
 *   frontal-ldl.ts   linear-time LDLᵀ and selected inverse (formal variances and covariances)
 *   outliers.ts      Pope's τ for screening
 */

import { ModelDomainError } from '../domain/errors.js';
import { buildDesign, nodeEpochMs, type Design } from './design.js';
import { SingularParameterError } from './frontal-ldl.js';
import { rejectionCandidates } from './outliers.js';
import { parameterLayout, solveOnce, type ParameterLayout, type Solution } from './least-squares.js';
import type {
  EpochEstimate,
  GradientNodeEstimate,
  RejectedObservation,
  ZwdEstimationInput,
  ZwdEstimationOutput,
  ZwdNodeEstimate,
} from './types.js';

/** Niell (1996) fitted the mapping functions from 3° elevation up [rad]. */
const MAPPING_FIT_LOWEST_ELEVATION_RAD = (3 * Math.PI) / 180;

/**
 * @throws ModelDomainError 400 for inconsistent input (duplicate (epoch, satellite), too many
 *         nodes), 422 when no observation is above the cutoff or a node is not determined
 */
export function estimateZwd(input: ZwdEstimationInput): ZwdEstimationOutput {
  checkColumns(input);
  const { options } = input;
  const design = buildDesign(input);
  const layout = parameterLayout(design);
  const used = new Uint8Array(design.residualM.length).fill(1);
  const rejected: RejectedObservation[] = [];
  const warnings: string[] = [];
  let screeningComplete = true;
  let solutions = 0;
  let solution: Solution;
  let varianceFactor: number | null;
  let degreesOfFreedom: number;
  let unknowns: number;

  for (;;) {
    solution = solveNamed(design, layout, input, used);
    solutions++;
    unknowns = layout.parameters + (options.epochBias ? solution.epochsUsed : 0);
    degreesOfFreedom = solution.observationsUsed + solution.constraints - unknowns;
    varianceFactor = degreesOfFreedom > 0 ? solution.weightedSquareSum / degreesOfFreedom : null;
    if (options.outlierThreshold === null) break;
    const candidates = rejectionCandidates(
      design,
      solution,
      used,
      varianceFactor === null ? 1 : Math.sqrt(varianceFactor),
      options.outlierThreshold,
      options.outlierRejection,
      options.zwd.intervalS,
    );
    if (candidates.length === 0) break;
    if (rejected.length >= options.maxRejections) {
      screeningComplete = false;
      warnings.push(
        `outlier screening stopped after ${rejected.length} rejections (options.max_rejections); ${candidates.length > 1 ? 'normalised residuals' : 'a normalised residual'} up to ${Math.abs(candidates[0]!.normalizedResidual).toFixed(1)} remain above ${options.outlierThreshold}: check sigma0_m and the residuals`,
      );
      break;
    }
    for (const c of candidates.slice(0, options.maxRejections - rejected.length)) {
      const i = design.inputIndex[c.index]!;
      rejected.push({
        index: i,
        epochMs: input.observations.epochMs[i]!,
        satellite: input.observations.satellite[i]!,
        residualM: input.observations.residualM[i]!,
        fittedResidualM: solution.fittedResidualM[c.index]!,
        normalizedResidual: c.normalizedResidual,
      });
      used[c.index] = 0;
    }
  }

  const sigmaScale = options.scaleSigmas && varianceFactor !== null ? Math.sqrt(varianceFactor) : 1;
  if (varianceFactor === null) {
    warnings.push('no degrees of freedom (one observation per epoch with epoch_bias on, or as many unknowns as observations): the variance factor is not estimable and formal errors are not scaled');
  }
  let low = 0;
  for (let s = 0; s < used.length; s++) if (used[s] && design.elevationRad[s]! < MAPPING_FIT_LOWEST_ELEVATION_RAD) low++;
  if (low > 0) warnings.push(`${low} observations below 3° were used: the Niell mapping functions are fitted from 3° up and are extrapolated there`);

  return {
    zwdNodes: zwdNodes(design, layout, solution, sigmaScale),
    gradientNodes: gradientNodes(design, layout, solution, sigmaScale),
    epochs: epochEstimates(design, layout, solution, used, sigmaScale),
    rejected,
    statistics: {
      observationsTotal: input.observations.epochMs.length,
      observationsBelowCutoff: design.observationsBelowCutoff,
      observationsUsed: solution.observationsUsed,
      observationsRejected: rejected.length,
      epochs: design.epochMs.length,
      zwdNodes: layout.zwdCount,
      gradientNodes: layout.gradientCount,
      unknowns,
      constraints: solution.constraints,
      degreesOfFreedom,
      rmsM: Math.sqrt(solution.residualSquareSumM2 / solution.observationsUsed),
      varianceFactor,
      sigmaScale,
      solutions,
      screeningComplete,
    },
    warnings,
  };
}

function checkColumns(input: ZwdEstimationInput): void {
  const o = input.observations;
  const n = o.epochMs.length;
  for (const [name, column] of [
    ['satellite', o.satellite],
    ['elevation', o.elevationRad],
    ['azimuth', o.azimuthRad],
    ['residual', o.residualM],
    ...(o.sigmaM ? [['sigma', o.sigmaM] as const] : []),
  ] as const) {
    if (column.length !== n) throw new Error(`observation column ${name} has ${column.length} entries, epochs ${n}`);
  }
  if (n === 0) throw new ModelDomainError('observations', 'at least one observation is needed', 400);
}

function solveNamed(design: Design, layout: ParameterLayout, input: ZwdEstimationInput, used: Uint8Array): Solution {
  try {
    return solveOnce(design, input.options, used);
  } catch (err) {
    if (!(err instanceof SingularParameterError)) throw err;
    throw new ModelDomainError('observations', singularMessage(design, layout, input, used, err.parameter), 422);
  }
}

/** Which node is undetermined, how many observations touch it, and which constraint could fix it. */
function singularMessage(design: Design, layout: ParameterLayout, input: ZwdEstimationInput, used: Uint8Array, parameter: number): string {
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

function zwdNodes(design: Design, layout: ParameterLayout, solution: Solution, scale: number): ZwdNodeEstimate[] {
  const out: ZwdNodeEstimate[] = new Array(layout.zwdCount);
  for (let j = 0; j < layout.zwdCount; j++) {
    out[j] = { epochMs: nodeEpochMs(design.zwd, j), correctionM: solution.x[j]!, sigmaM: Math.sqrt(solution.inverse.diagonal[j]!) * scale };
  }
  return out;
}

function gradientNodes(design: Design, layout: ParameterLayout, solution: Solution, scale: number): GradientNodeEstimate[] {
  const out: GradientNodeEstimate[] = new Array(layout.gradientCount);
  for (let l = 0; l < layout.gradientCount; l++) {
    const n = layout.northOffset + l;
    const e = layout.eastOffset + l;
    out[l] = {
      epochMs: nodeEpochMs(design.gradients!, l),
      northM: solution.x[n]!,
      eastM: solution.x[e]!,
      northSigmaM: Math.sqrt(solution.inverse.diagonal[n]!) * scale,
      eastSigmaM: Math.sqrt(solution.inverse.diagonal[e]!) * scale,
    };
  }
  return out;
}

/** Value and standard deviation of (1 − α) x_p + α x_q, with the covariance of the two nodes. */
function interpolate(solution: Solution, p: number, q: number, alpha: number, scale: number): { value: number; sigma: number } {
  if (q < 0) return { value: solution.x[p]!, sigma: Math.sqrt(solution.inverse.diagonal[p]!) * scale };
  const b = 1 - alpha;
  const variance =
    b * b * solution.inverse.diagonal[p]! + 2 * alpha * b * solution.inverse.get(p, q) + alpha * alpha * solution.inverse.diagonal[q]!;
  return { value: b * solution.x[p]! + alpha * solution.x[q]!, sigma: Math.sqrt(Math.max(variance, 0)) * scale };
}

function epochEstimates(design: Design, layout: ParameterLayout, solution: Solution, used: Uint8Array, scale: number): EpochEstimate[] {
  const epochs = design.epochMs.length;
  const out: EpochEstimate[] = new Array(epochs);
  for (let k = 0; k < epochs; k++) {
    const j = design.zwdInterval[k]!;
    const w = interpolate(solution, j, layout.zwdCount > 1 ? j + 1 : -1, design.zwdAlpha[k]!, scale);
    let north = null;
    let east = null;
    if (layout.gradientCount > 0) {
      const l = design.gradientInterval[k]!;
      const two = layout.gradientCount > 1;
      north = interpolate(solution, layout.northOffset + l, two ? layout.northOffset + l + 1 : -1, design.gradientAlpha[k]!, scale);
      east = interpolate(solution, layout.eastOffset + l, two ? layout.eastOffset + l + 1 : -1, design.gradientAlpha[k]!, scale);
    }
    let count = 0;
    for (let s = design.epochStart[k]!; s < design.epochStart[k + 1]!; s++) count += used[s]!;
    const bias = solution.biasM[k]!;
    out[k] = {
      epochMs: design.epochMs[k]!,
      correctionM: w.value,
      sigmaM: w.sigma,
      northGradientM: north?.value ?? null,
      eastGradientM: east?.value ?? null,
      northGradientSigmaM: north?.sigma ?? null,
      eastGradientSigmaM: east?.sigma ?? null,
      epochBiasM: Number.isNaN(bias) ? null : bias,
      observationsUsed: count,
    };
  }
  return out;
}
