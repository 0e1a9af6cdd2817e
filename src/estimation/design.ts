/**
 * The observation model of the ZWD estimator, without the solver:
 *
 *   r_i = m_w(e_i) δw(t_k) + m_g(e_i) [cos a_i G_N(t_k) + sin a_i G_E(t_k)] + b_k + ε_i
 *
 * - m_w: the wet mapping function of options.wetMapping (default Niell (1996) at the site latitude;
 *   VMF1 with per-epoch coefficients; domain/mapping/registry.ts);
 * - m_g: Chen & Herring (1997) gradient mapping, C = 0.0032 (domain/gradients/gradient-mapping.ts);
 * - δw, G_N, G_E random walks with a state at every epoch ("every-epoch", default), or piecewise
 *   linear between nodes jΔ on round UTC epochs ("nodes") (node layout below);
 * - b_k one bias per epoch (pre-eliminated by the normal-equation code);
 * - σ_i = sigma_m, else σ² = a² + b²/sin²e (setWeights; "elevation": a = 0, b = σ0; "uniform":
 *   a = σ0, b = 0); weight 1/σ_i².
 *
 * This file groups observations by epoch, lays out the nodes and computes the partial derivatives.
 */

import { ModelDomainError } from '../domain/errors.js';
import { chenHerringGradientMapping } from '../domain/gradients/gradient-mapping.js';
import { DEFAULT_MAPPING_MODEL, MAPPING_MODELS } from '../domain/mapping/registry.js';
import { fractionalDayOfYear } from '../domain/time.js';
import { selectInPlace } from './order-statistics.js';
import { FRESH_ARRAYS, type ArraySource } from './reused-arrays.js';
import type {
  EstimationInput,
  IndexedSatellites,
  ObservationColumns,
  TypedEstimationInput,
  TypedObservationColumns,
  ZwdEstimationInput,
} from './types.js';

/** Largest number of nodes of one parameter; more is a request error (interval too short for the span). */
export const MAX_NODES = 200_000;

/**
 * Node epochs of one parameter family: regular nodes jΔ on round UTC epochs ("nodes", and the
 * output nodes of "every-epoch"), or one state per epoch ("every-epoch").
 */
export interface NodeLayout {
  /** Node epochs [ms], increasing. */
  nodeMs: Float64Array;
  /** Nominal spacing Δ [ms] (the option; the actual spacing of "every-epoch" states varies). */
  intervalMs: number;
  /** J + 1. */
  count: number;
  /** True when nodeMs[j] = first + jΔ (locate() then needs no search). */
  regular: boolean;
}

/**
 * Regular nodes on round UTC epochs: the first node is the last multiple of Δ since
 * 1970-01-01T00:00Z at or before the first epoch (so 300 s nodes sit at :00, :05, …, 1 h nodes on
 * the hour, whatever the first observation), the last the first multiple at or after the last
 * epoch. A relative tolerance of 1e-9 Δ keeps an epoch that falls on a node (up to rounding) from
 * adding a node.
 *
 * @param firstEpochMs first epoch [ms]  @param lastEpochMs last epoch [ms]  @param intervalS Δ [s], > 0
 */
export function nodeLayout(firstEpochMs: number, lastEpochMs: number, intervalS: number, field: string): NodeLayout {
  const intervalMs = intervalS * 1000;
  const first = Math.floor(firstEpochMs / intervalMs + 1e-9) * intervalMs;
  const j = nodeCount(firstEpochMs, lastEpochMs, intervalS) - 1;
  if (j + 1 > MAX_NODES) {
    throw new ModelDomainError(
      field,
      `${intervalS} s over the ${((lastEpochMs - firstEpochMs) / 3_600_000).toFixed(1)} h of observations needs ${j + 1} nodes; at most ${MAX_NODES} are allowed: use a longer interval`,
      400,
    );
  }
  const nodeMs = new Float64Array(j + 1);
  for (let i = 0; i <= j; i++) nodeMs[i] = first + i * intervalMs;
  return { nodeMs, intervalMs, count: j + 1, regular: true };
}

/** Nodes of nodeLayout for the epochs firstEpochMs..lastEpochMs [ms] at Δ = intervalS [s], without building them. */
export function nodeCount(firstEpochMs: number, lastEpochMs: number, intervalS: number): number {
  const intervalMs = intervalS * 1000;
  const first = Math.floor(firstEpochMs / intervalMs + 1e-9) * intervalMs;
  return Math.max(0, Math.ceil((lastEpochMs - first) / intervalMs - 1e-9)) + 1;
}

/** One state per epoch ("every-epoch"). */
export function epochStateLayout(epochMs: Float64Array, intervalS: number): NodeLayout {
  return { nodeMs: epochMs, intervalMs: intervalS * 1000, count: epochMs.length, regular: false };
}

export const nodeEpochMs = (layout: NodeLayout, j: number): number => layout.nodeMs[j]!;

/**
 * Interval j (nodes j and j+1) holding an epoch, and the weight α of node j+1:
 * x(t) = (1 − α) x_j + α x_{j+1}. With a single node, j = 0 and α = 0. Outside the nodes, the
 * nearest interval with α < 0 or α > 1 (callers that extrapolate check for it).
 */
export function locate(layout: NodeLayout, epochMs: number): { interval: number; alpha: number } {
  if (layout.count === 1) return { interval: 0, alpha: 0 };
  const t = layout.nodeMs;
  let interval: number;
  if (layout.regular) {
    interval = Math.min(Math.max(Math.floor((epochMs - t[0]!) / layout.intervalMs), 0), layout.count - 2);
  } else {
    let lo = 0;
    let hi = layout.count - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (t[mid]! <= epochMs) lo = mid;
      else hi = mid;
    }
    interval = lo;
  }
  return { interval, alpha: (epochMs - t[interval]!) / (t[interval + 1]! - t[interval]!) };
}

/**
 * Observations above the cutoff, sorted by epoch, with everything the normal equations need: 53 bytes
 * per observation up to 256 satellites (61 with caller's sigmas). What the solutions do not read (the elevation, the
 * satellite names, the epochs as given) stays in the input, reached through inputIndex; the weight and
 * σ_i are one column, their variance.
 */
export interface Design {
  /** Input index of each used observation, in epoch order. */
  inputIndex: Int32Array;
  /** Observations of epoch k are [epochStart[k], epochStart[k+1]). */
  epochStart: Int32Array;
  epochMs: Float64Array;
  residualM: Float64Array;
  /**
   * σ_i² [m²]. The weight is 1/σ_i² and σ_i = √σ_i², computed where they are read: the same doubles as
   * columns of each would hold (setWeights derives both from this one number), at 8 bytes an observation
   * instead of 16 (columns of both measured no faster: within 1 %, issue 14).
   */
  observationVarianceM2: Float64Array;
  /** Counts the setWeights calls on this design: a solver's epoch sums of another revision are stale (epoch-states.ts). */
  weightsRevision: number;
  /** σ_i given by the caller [m], NaN where the weighting scheme gives it; null when no observation has its own σ. */
  givenSigmaM: Float64Array | null;
  /** Wet mapping factor m_w(e) of the chosen model [-]. */
  wetMapping: Float64Array;
  /** m_g(e) cos a and m_g(e) sin a [-]. */
  northMapping: Float64Array;
  eastMapping: Float64Array;
  /** sin²e of each observation [-] (the elevation weighting and the variance components, computed once). */
  sinElevationSquared: Float64Array;
  /**
   * Satellite of each observation as an index 0..satelliteCount−1 (in order of first appearance in the input),
   * in the narrowest array that holds satelliteCount (one byte for up to 256 satellites: four constellations).
   */
  satelliteIndex: Uint8Array | Uint16Array | Int32Array;
  satelliteCount: number;
  /** Median spacing of consecutive epochs [ms] (NaN with fewer than two epochs). */
  samplingMs: number;
  /** The states of the solution (every epoch, or the regular nodes). */
  zwd: NodeLayout;
  gradients: NodeLayout | null;
  /** The nodes of the output: regular, on round UTC epochs. */
  zwdOutput: NodeLayout;
  gradientOutput: NodeLayout | null;
  /** Warnings about the parametrisation (a family that fell back to nodes). */
  parametrisationNotes: string[];
  /** Per epoch: interval and node-(j+1) weight in each layout. */
  zwdInterval: Int32Array;
  zwdAlpha: Float64Array;
  gradientInterval: Int32Array;
  gradientAlpha: Float64Array;
  observationsBelowCutoff: number;
}

/**
 * @param arrays where the design's typed arrays come from (reused-arrays.ts): the single-station estimator
 *        passes the thread's reused ones; the design must then not outlive its estimation
 * @throws ModelDomainError 422 when no observation is above the cutoff, 400 for a duplicate
 *         (epoch, satellite) pair or too many nodes
 */
export function buildDesign(given: EstimationInput, arrays: ArraySource = FRESH_ARRAYS): Design {
  const input: TypedEstimationInput = { ...given, observations: typedObservationColumns(given.observations) };
  const obs = input.observations;
  const { options } = input;
  const n = obs.epochMs.length;

  // All observations in epoch order (stable sort: ties keep the input order; null: the input order
  // is the epoch order); duplicates are checked on all of them, then those below the cutoff are
  // dropped (and counted). Typed arrays and counted loops (no per-observation pushes): this runs once
  // per request over every observation. No index array for sorted input, and the kept ones counted
  // before they are listed, so that the arrays of all observations are only the satellite indices.
  let sorted = true;
  for (let i = 1; i < n && sorted; i++) sorted = obs.epochMs[i - 1]! <= obs.epochMs[i]!;
  let all: Int32Array | null = null;
  if (!sorted) {
    const order = new Array<number>(n);
    for (let i = 0; i < n; i++) order[i] = i;
    order.sort((a, b) => obs.epochMs[a]! - obs.epochMs[b]!);
    all = Int32Array.from(order);
  }
  const satellites = satelliteIndices(obs.satellite, arrays);
  checkDuplicates(input, all, satellites);
  const cutoff = options.elevationCutoffRad;
  let m = 0;
  for (let i = 0; i < n; i++) if (obs.elevationRad[i]! >= cutoff) m++;
  const belowCutoff = n - m;
  if (m === 0) {
    throw new ModelDomainError(
      'observations',
      `none of the ${n} observations is at or above the elevation cutoff (${((options.elevationCutoffRad * 180) / Math.PI).toFixed(2)}°); lower options.elevation_cutoff_deg or send higher observations`,
      422,
    );
  }
  const inputIndex = arrays.int32('design.inputIndex', m);
  for (let a = 0, s = 0; a < n; a++) {
    const i = all === null ? a : all[a]!;
    if (obs.elevationRad[i]! >= cutoff) inputIndex[s++] = i;
  }

  // The epochs counted, then listed (no arrays grown by push).
  let epochs = 0;
  for (let s = 0; s < m; s++) if (s === 0 || obs.epochMs[inputIndex[s]!] !== obs.epochMs[inputIndex[s - 1]!]) epochs++;
  const epochStarts = arrays.int32('design.epochStart', epochs + 1);
  const epochMsAll = arrays.float64('design.epochMs', epochs);
  for (let s = 0, k = 0; s < m; s++) {
    const t = obs.epochMs[inputIndex[s]!]!;
    if (s === 0 || t !== epochMsAll[k - 1]) {
      epochStarts[k] = s;
      epochMsAll[k++] = t;
    }
  }
  epochStarts[epochs] = m;

  const wetAt = wetMappingPerEpoch(input, epochMsAll);
  const residualM = arrays.float64('design.residualM', m);
  const observationVarianceM2 = arrays.float64('design.observationVarianceM2', m);
  let givenSigmaM: Float64Array | null = null;
  const wetMapping = arrays.float64('design.wetMapping', m);
  const northMapping = arrays.float64('design.northMapping', m);
  const eastMapping = arrays.float64('design.eastMapping', m);
  const sinElevationSquared = arrays.float64('design.sinElevationSquared', m);
  const satelliteIndex = satelliteIndexArray(satellites.count, m, arrays);
  for (let k = 0; k < epochs; k++) {
    const wet = wetAt(k);
    for (let s = epochStarts[k]!; s < epochStarts[k + 1]!; s++) wetMapping[s] = wet(obs.elevationRad[inputIndex[s]!]!);
  }
  for (let s = 0; s < m; s++) {
    const i = inputIndex[s]!;
    const e = obs.elevationRad[i]!;
    // Allocated at the first σ the caller gave (NaN-filled: the weighting scheme's), so a request without any has none.
    if (obs.sigmaM !== undefined && !Number.isNaN(obs.sigmaM[i]!))
      (givenSigmaM ??= arrays.float64('design.givenSigmaM', m).fill(Number.NaN))[s] = obs.sigmaM[i]!;
    residualM[s] = obs.residualM[i]!;
    const mg = chenHerringGradientMapping(e);
    northMapping[s] = mg * Math.cos(obs.azimuthRad[i]!);
    eastMapping[s] = mg * Math.sin(obs.azimuthRad[i]!);
    const sinE = Math.sin(e);
    sinElevationSquared[s] = sinE * sinE;
    satelliteIndex[s] = satellites.index[i]!;
  }

  const { a, b } = initialWeighting(options);
  const weights = { sinElevationSquared, givenSigmaM, observationVarianceM2, weightsRevision: 0 };
  setWeights(weights, a, b, 1);

  const first = epochMsAll[0]!;
  const last = epochMsAll[epochs - 1]!;
  const parametrisation = options.parametrisation ?? 'every-epoch';
  const zwdOutput = nodeLayout(first, last, options.zwd.intervalS, 'options.zwd_interval_s');
  const gradientOutput = options.gradients ? nodeLayout(first, last, options.gradients.intervalS, 'options.gradients.interval_s') : null;
  // Every-epoch states need a random walk to tie consecutive epochs; a family without one keeps
  // piecewise-linear nodes (and says so).
  const notes: string[] = [];
  const everyEpoch = (settings: { randomWalkMPerSqrtH: number | null }, name: string) => {
    if (parametrisation !== 'every-epoch') return false;
    if (settings.randomWalkMPerSqrtH !== null) return true;
    notes.push(
      `${name} has no random walk: it is piecewise linear between its nodes (parametrisation "nodes"), and its variation between nodes is not in the formal errors`,
    );
    return false;
  };
  const zwd = everyEpoch(options.zwd, 'the ZWD') ? epochStateLayout(epochMsAll, options.zwd.intervalS) : zwdOutput;
  const gradients =
    gradientOutput && everyEpoch(options.gradients!, 'each gradient component')
      ? epochStateLayout(epochMsAll, options.gradients!.intervalS)
      : gradientOutput;
  const zwdInterval = arrays.int32('design.zwdInterval', epochs);
  const zwdAlpha = arrays.float64('design.zwdAlpha', epochs);
  const gradientInterval = arrays.int32('design.gradientInterval', epochs);
  const gradientAlpha = arrays.float64('design.gradientAlpha', epochs);
  for (let k = 0; k < epochs; k++) {
    placeEpoch(zwd, k, epochMsAll[k]!, zwdInterval, zwdAlpha);
    if (gradients) placeEpoch(gradients, k, epochMsAll[k]!, gradientInterval, gradientAlpha);
  }

  return {
    inputIndex,
    epochStart: epochStarts,
    epochMs: epochMsAll,
    residualM,
    observationVarianceM2,
    weightsRevision: weights.weightsRevision,
    givenSigmaM,
    wetMapping,
    northMapping,
    eastMapping,
    sinElevationSquared,
    satelliteIndex,
    satelliteCount: satellites.count,
    samplingMs: medianSpacingMs(epochMsAll),
    zwd,
    gradients,
    zwdOutput,
    gradientOutput,
    parametrisationNotes: notes,
    zwdInterval,
    zwdAlpha,
    gradientInterval,
    gradientAlpha,
    observationsBelowCutoff: belowCutoff,
  };
}

/**
 * Interval and node-(j+1) weight of epoch k (at tMs) in a layout, written to interval[k] and alpha[k]. States at
 * every epoch: epoch k is state k (the last epoch: interval K − 2 at α = 1), what locate's bisection finds,
 * without it (and without an object per epoch).
 */
function placeEpoch(layout: NodeLayout, k: number, tMs: number, interval: Int32Array, alpha: Float64Array): void {
  if (layout.regular || layout.count < 2) {
    const at = locate(layout, tMs);
    interval[k] = at.interval;
    alpha[k] = at.alpha;
  } else if (k + 1 < layout.count) {
    interval[k] = k;
    alpha[k] = 0;
  } else {
    interval[k] = k - 1;
    alpha[k] = 1;
  }
}

/**
 * Starting weights σ² = a² + b²/sin²e of the scheme: "elevation" a = 0, b = σ0; "uniform" a = σ0,
 * b = 0; "elevation-components" a = sigmaConstantM (default σ0/3, common practice), b = σ0.
 */
export function initialWeighting(options: ZwdEstimationInput['options']): { a: number; b: number } {
  if (options.weighting === 'uniform') return { a: options.sigma0M, b: 0 };
  if (options.weighting === 'elevation') return { a: 0, b: options.sigma0M };
  return { a: options.sigmaConstantM ?? options.sigma0M / 3, b: options.sigma0M };
}

/**
 * σ_i² = a² + b²/sin²e_i for observations without their own sigma; the caller's σ_i times √scale
 * for the others (scale: the observations' variance factor of the caller's sigmas).
 */
export function setWeights(
  d: Pick<Design, 'sinElevationSquared' | 'givenSigmaM' | 'observationVarianceM2' | 'weightsRevision'>,
  a: number,
  b: number,
  givenScale: number,
): void {
  const givenSigmaM = d.givenSigmaM;
  const out = d.observationVarianceM2;
  for (let s = 0; s < out.length; s++) {
    const given = givenSigmaM === null ? Number.NaN : givenSigmaM[s]!;
    const variance = Number.isNaN(given) ? a * a + (b * b) / d.sinElevationSquared[s]! : given * given * givenScale;
    out[s] = variance;
  }
  d.weightsRevision++;
}

/**
 * The chosen wet mapping function (src/domain/mapping/registry.ts) per epoch: models without
 * coefficients are prepared once; models with coefficients (VMF1 aw) once per epoch, with the
 * coefficients interpolated linearly in time (held constant outside the given epochs).
 */
function wetMappingPerEpoch(input: TypedEstimationInput, epochMs: Float64Array): (k: number) => (elevationRad: number) => number {
  const choice = input.options.wetMapping ?? { model: DEFAULT_MAPPING_MODEL };
  const model = MAPPING_MODELS[choice.model];
  if (!model) {
    throw new ModelDomainError(
      'options.wet_mapping',
      `unknown mapping function "${String(choice.model)}"; one of ${Object.keys(MAPPING_MODELS).join(', ')}`,
      400,
    );
  }
  const context = (ms: number) => ({
    latitudeRad: input.latitudeRad,
    heightM: input.heightM ?? 0,
    dayOfYear: fractionalDayOfYear(new Date(ms)),
  });
  if (!model.requiresCoefficients) {
    const evaluator = model.prepare(context(epochMs[0]!));
    const wet = (e: number) => evaluator.wet(e);
    return () => wet;
  }
  const c = choice.coefficients;
  if (!c || c.epochMs.length === 0 || c.aw.length !== c.epochMs.length || c.ah.length !== c.epochMs.length) {
    throw new ModelDomainError(
      'options.wet_mapping.coefficients',
      `mapping function "${choice.model}" needs per-epoch coefficients (epochs, ah, aw of equal length, at least one)`,
      400,
    );
  }
  const order = c.epochMs.map((_, i) => i).sort((p, q) => c.epochMs[p]! - c.epochMs[q]!);
  const times = order.map((i) => c.epochMs[i]!);
  const at = (column: number[], ms: number) => {
    if (ms <= times[0]!) return column[order[0]!]!;
    if (ms >= times[times.length - 1]!) return column[order[order.length - 1]!]!;
    let j = 0;
    while (times[j + 1]! < ms) j++;
    const f = (ms - times[j]!) / (times[j + 1]! - times[j]!);
    return column[order[j]!]! * (1 - f) + column[order[j + 1]!]! * f;
  };
  return (k) => {
    const ms = epochMs[k]!;
    const evaluator = model.prepare({ ...context(ms), coefficients: { ah: at(c.ah, ms), aw: at(c.aw, ms) } });
    return (e: number) => evaluator.wet(e);
  };
}

/** Median spacing of consecutive epochs [ms]; NaN with fewer than two. */
function medianSpacingMs(epochMs: Float64Array): number {
  if (epochMs.length < 2) return Number.NaN;
  const d = new Float64Array(epochMs.length - 1);
  for (let k = 1; k < epochMs.length; k++) d[k - 1] = epochMs[k]! - epochMs[k - 1]!;
  return selectInPlace(d, d.length, Math.floor(d.length / 2));
}

/** An array of `length` satellite indices 0..count−1, of the narrowest type that holds them. */
function satelliteIndexArray(count: number, length: number, arrays: ArraySource): Uint8Array | Uint16Array | Int32Array {
  if (count <= 1 << 8) return arrays.uint8('design.satelliteIndex', length);
  return count <= 1 << 16 ? arrays.uint16('design.satelliteIndex', length) : arrays.int32('design.satelliteIndex', length);
}

/** The satellite of observation i by name. */
export function satelliteName(satellite: readonly string[] | IndexedSatellites, i: number): string {
  return 'names' in satellite ? satellite.names[satellite.index[i]!]! : satellite[i]!;
}

/** Observations in a satellite column. */
export function satelliteColumnLength(satellite: readonly string[] | IndexedSatellites): number {
  return 'names' in satellite ? satellite.index.length : satellite.length;
}

/** Each observation's satellite as an index in order of first appearance, and the number of satellites. */
function satelliteIndices(satellite: readonly string[] | IndexedSatellites, arrays: ArraySource): { index: Int32Array; count: number } {
  if ('names' in satellite) return renumberedSatellites(satellite, arrays);
  const index = arrays.int32('design.satelliteOfInput', satellite.length);
  const ids = new Map<string, number>();
  for (let i = 0; i < satellite.length; i++) {
    let id = ids.get(satellite[i]!);
    if (id === undefined) {
      id = ids.size;
      ids.set(satellite[i]!, id);
    }
    index[i] = id;
  }
  return { index, count: ids.size };
}

/**
 * Indices into names renumbered in order of first appearance (the numbers the names would get): one look-up
 * per distinct name (a name listed twice is one satellite) and a typed-array read per observation.
 */
function renumberedSatellites(satellite: IndexedSatellites, arrays: ArraySource): { index: Int32Array; count: number } {
  const given = satellite.index;
  const firstOfName = new Map<string, number>();
  const canonical = satellite.names.map((name, k) => firstOfName.get(name) ?? (firstOfName.set(name, k), k));
  const index = arrays.int32('design.satelliteOfInput', given.length);
  const ids = arrays.int32('design.satelliteOfName', canonical.length).fill(-1);
  let count = 0;
  for (let i = 0; i < given.length; i++) {
    const name = canonical[given[i]!]!;
    let id = ids[name]!;
    if (id < 0) id = ids[name] = count++;
    index[i] = id;
  }
  return { index, count };
}

/**
 * The columns as Float64Arrays: those given as Float64Arrays as they are (the HTTP adapters', no copy),
 * arrays copied once, σ null → NaN. The estimator's loops then read one element kind at each site
 * (V8 deoptimises element reads that see both arrays and typed arrays).
 */
export function typedObservationColumns(o: ObservationColumns): TypedObservationColumns {
  const typed = (c: Float64Array | readonly number[]) => (c instanceof Float64Array ? c : Float64Array.from(c));
  let sigmaM: Float64Array | undefined;
  if (o.sigmaM instanceof Float64Array) sigmaM = o.sigmaM;
  else if (o.sigmaM) {
    const sent = o.sigmaM;
    sigmaM = new Float64Array(sent.length);
    for (let i = 0; i < sent.length; i++) sigmaM[i] = sent[i] ?? Number.NaN;
  }
  return {
    epochMs: typed(o.epochMs),
    satellite: o.satellite,
    elevationRad: typed(o.elevationRad),
    azimuthRad: typed(o.azimuthRad),
    residualM: typed(o.residualM),
    sigmaM,
  };
}

/**
 * A satellite observed twice at one epoch is a caller's mistake (400), named by both indices.
 * @param sortedByEpoch input indices in epoch order; null when the input is in epoch order
 */
function checkDuplicates(
  input: TypedEstimationInput,
  sortedByEpoch: Int32Array | null,
  satellites: { index: Int32Array; count: number },
): void {
  const { epochMs, satellite } = input.observations;
  // Per satellite: the epoch (by its running number) and the observation where it was last seen.
  const seenInEpoch = new Int32Array(satellites.count).fill(-1);
  const seenAt = new Int32Array(satellites.count);
  let currentEpoch = Number.NaN;
  let epochNumber = -1;
  for (let r = 0; r < epochMs.length; r++) {
    const i = sortedByEpoch === null ? r : sortedByEpoch[r]!;
    if (epochMs[i] !== currentEpoch) {
      currentEpoch = epochMs[i]!;
      epochNumber++;
    }
    const id = satellites.index[i]!;
    if (seenInEpoch[id] === epochNumber) {
      const other = seenAt[id]!;
      const [a, b] = other < i ? [other, i] : [i, other];
      throw new ModelDomainError(
        `observations.${b}`,
        `duplicate observation: satellite ${satelliteName(satellite, i)} at ${new Date(currentEpoch).toISOString()} is also observations.${a}; each (epoch, satellite) pair may appear once`,
        400,
      );
    }
    seenInEpoch[id] = epochNumber;
    seenAt[id] = i;
  }
}
