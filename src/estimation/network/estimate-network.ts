/**
 * Network ZWD estimation: the entry point. Zero-difference residuals of several stations, ZWD and
 * gradients per station with the random-walk model of the single-station estimator, and
 *
 * - satelliteClocks "estimated": per epoch one clock per receiver and per satellite, eliminated
 *   epoch by epoch from the normal equations (epoch-clocks.ts). This gives the same troposphere
 *   estimates and covariances as double differences weighted with their full covariance (common
 *   practice; checked in test/estimation/network/equivalence.test.ts). The clocks have one datum
 *   defect per connected group of stations and epoch, fixed by one reference receiver clock; the
 *   troposphere does not depend on it. Satellites seen by one station at an epoch carry no
 *   information and are dropped (counted); so is an epoch with one station.
 * - satelliteClocks "known" (precise point positioning): the network splits into independent
 *   single-station problems, and each is solved by the single-station estimator itself
 *   (point-positioning.ts): the same defaults (states at every epoch, variance components,
 *   correlated-noise inflation), the same numbers.
 *
 * A network of one station is solved as in the "known" case (satellite clocks cannot be estimated
 * from one station), with a warning when "estimated" was asked for.
 *
 * With satellite clocks estimated the network solution uses piecewise-linear nodes: the caller's
 * with parametrisation "nodes", else (states at every epoch asked, the default) nodes of at most
 * 300 s (ZWD) and 1 800 s (gradients) that divide the output spacing (networkModelOptions); the
 * random walk's variance between and on the nodes is added to every σ (interpolation-variance.ts),
 * and the result states the parametrisation (output.parametrisation → models, fingerprint).
 *
 * Outlier screening across the network (estimated clocks): Pope's τ with the network's variance
 * factor; in "one-per-window" mode the candidates of one iteration are at least the window apart
 * within a station (outliers.ts) and never at the same epoch as another candidate (a gross error
 * leaks through the satellite clock into the other stations' residuals of that epoch).
 */

import { ModelDomainError } from '../../domain/errors.js';
import { geodeticToEcef, type Ecef } from '../../domain/geometry/topocentric.js';
import { nodeEpochMs, nodeLayout, type NodeLayout } from '../design.js';
import { SingularParameterError } from '../frontal-ldl.js';
import { MIN_TESTABLE_REDUNDANCY } from '../least-squares.js';
import { nodeRejectionWindowMs } from '../outliers.js';
import type { GradientNodeEstimate, RejectedObservation } from '../types.js';
import { buildNetworkDesign, stationDesigns, type NetworkDesign, type StationSubset } from './network-design.js';
import { screenedSolution } from '../screening.js';
import { MAX_REWEIGHTINGS, nearestEpoch } from '../estimate.js';
import { initialWeighting, setWeights } from '../design.js';
import { screeningBound, varianceComponents } from '../variance-components.js';
import { noiseInflation, type NoiseInflation } from '../correlated-noise.js';
import { interpolationVariance } from './interpolation-variance.js';
import { median } from './median.js';
import { pointPositioning, pooledStatistics } from './point-positioning.js';
import { ReducedEpochCache } from './reduced-epochs.js';
import { solveNetworkOnce, stationLayout, type NetworkSolution } from './network-solve.js';
import type {
  NetworkCommonMode,
  NetworkParametrisation,
  NetworkEpochEstimate,
  NetworkEstimationInput,
  NetworkEstimationOutput,
  NetworkStationResult,
} from './types.js';

/** Niell (1996) fitted the mapping functions from 3° elevation up [rad]. */
const MAPPING_FIT_LOWEST_ELEVATION_RAD = (3 * Math.PI) / 180;
/** GNSS orbit height for the nadir-angle extent (GPS: 26 560 km radius − 6 371 km ≈ 20 200 km) [m]. */
const GNSS_ORBIT_HEIGHT_M = 20_200_000;
const EARTH_MEAN_RADIUS_M = 6_371_000;

interface SubProblem {
  net: NetworkDesign;
  used: Uint8Array[];
  solution: NetworkSolution;
  rejected: RejectedObservation[][];
  varianceFactor: number | null;
  degreesOfFreedom: number;
  unknowns: number;
  /** 1: the formal errors are those of the final weights (re-estimated when scaleSigmas is on). */
  sigmaScale: number;
  weighting: { constantM: number; elevationM: number; givenSigmaScale: number };
  solutions: number;
  screeningComplete: boolean;
  warnings: string[];
}

/**
 * @throws ModelDomainError 400 for inconsistent input (unknown or duplicate station, duplicate
 *         (station, epoch, satellite), unknown reference station), 422 when a station has nothing
 *         above the cutoff or a node is not determined
 */
export function estimateNetwork(input: NetworkEstimationInput): NetworkEstimationOutput {
  const { stations, observations: obs, options } = input;
  checkInput(input);
  const stationIndex = new Map(stations.map((s, i) => [s.name, i]));
  const subsets: StationSubset[] = stations.map((s, i) => ({ name: s.name, index: i, latitudeRad: s.latitudeRad, observations: [] }));
  for (let i = 0; i < obs.epochMs.length; i++) subsets[stationIndex.get(obs.station[i]!)!]!.observations.push(i);
  const empty = subsets.filter((s) => s.observations.length === 0).map((s) => s.name);
  if (empty.length > 0) {
    throw new ModelDomainError(
      'stations',
      `station${empty.length > 1 ? 's' : ''} ${empty.join(', ')} ha${empty.length > 1 ? 've' : 's'} no observations: remove ${empty.length > 1 ? 'them' : 'it'} from stations or send observations`,
      400,
    );
  }
  const ecef = stations.map((s) => geodeticToEcef(s.latitudeRad, s.longitudeRad, s.heightM));
  const reference = referenceStation(input, ecef);
  const warnings: string[] = [];
  const estimated = options.satelliteClocks === 'estimated' && stations.length > 1;
  if (options.satelliteClocks === 'estimated' && stations.length === 1) {
    warnings.push(
      'a network of one station: satellite clocks cannot be estimated from one station, so they were taken as known (the single-station solution)',
    );
  }
  // With the clocks estimated: the model's nodes (networkModelOptions), stated in the result.
  const model = networkModelOptions(options);

  let results: NetworkStationResult[];
  let commonMode: NetworkCommonMode;
  let statistics: NetworkEstimationOutput['statistics'];
  const geometry = networkExtent(ecef);

  if (estimated) {
    const modelInput = { ...input, options: model };
    const designs = stationDesigns(obs, subsets, model);
    const problem = solveWithScreening(buildNetworkDesign(obs, subsets, model, true, designs), modelInput, reference);
    warnings.push(...problem.warnings);
    // The same data with the satellite clocks known, for the common-mode comparison.
    const known = subsets.map((sub, s) => {
      const net = buildNetworkDesign(obs, [sub], model, false, [designs[s]!]);
      return { net, solution: solveNamed(net, model, [problem.used[s]!], 0) };
    });
    const noise = stationNoise(problem, modelInput);
    results = stationResults(problem, reference, noise, model, options);
    const singles = singleStationCounts(problem.net);
    const meanFactor = meanNoiseFactorPerEpoch(problem.net, noise);
    const missing = missingVariance(problem.net, model);
    // The stations' random walks between the nodes are independent: Σ_s m / S² = m / S on the mean.
    const meanEstimated = median(
      problem.solution.epochs.map((e, k) =>
        Math.sqrt(e.meanVariance * meanFactor[k]! * problem.sigmaScale ** 2 + missing.zwd(problem.net.zwdAlpha[k]!) / stations.length),
      ),
    );
    const meanKnown = knownMeanSigma(
      known.map(({ net, solution }, s) => {
        const st = net.stations[0]!;
        return Array.from(st.design.epochMs, (t, ks) => ({
          epochMs: t,
          sigmaM: Math.sqrt(
            solution.epochs[st.networkEpoch[ks]!]!.variance[0]! * noise[s]!.zwd[ks]! * problem.sigmaScale ** 2 +
              missing.zwd(net.zwdAlpha[st.networkEpoch[ks]!]!),
          ),
        }));
      }),
    );
    commonMode = {
      meanZwdSigmaClocksEstimatedM: meanEstimated,
      meanZwdSigmaClocksKnownM: meanKnown,
      correlationWithClocks: median(problem.solution.epochs.map((e) => e.meanClockCorrelation)),
      ...geometry,
    };
    statistics = {
      stations: stations.length,
      epochs: problem.net.epochMs.length,
      observationsTotal: obs.epochMs.length,
      observationsUsed: problem.solution.observationsUsed,
      observationsRejected: problem.rejected.reduce((n, r) => n + r.length, 0),
      observationsSingleStationSatellite: singles.observations,
      singleStationSatellites: singles.pairs,
      singleStationEpochs: singles.epochs,
      unknowns: problem.unknowns,
      clockUnknowns: problem.solution.clockUnknowns,
      constraints: problem.solution.constraints,
      degreesOfFreedom: problem.degreesOfFreedom,
      rmsM: Math.sqrt(problem.solution.residualSquareSumM2 / problem.solution.observationsUsed),
      varianceFactor: problem.varianceFactor,
      sigmaScale: problem.sigmaScale,
      weighting: problem.weighting,
      solutions: problem.solutions,
      screeningComplete: problem.screeningComplete,
    };
    if (singles.pairs > 0) {
      warnings.push(
        `${singles.observations} observations of ${singles.pairs} (epoch, satellite) pairs seen by one station only were not used: with satellite clocks estimated they carry no information`,
      );
    }
    for (const r of results) {
      if (r.statistics.observationsUsed === 0) {
        warnings.push(
          `station ${r.station} shares no satellite with another station at any epoch: with satellite clocks estimated its observations carry no information, and its values are the a-priori constraints only`,
        );
      }
    }
    if (singles.epochs > 0)
      warnings.push(`${singles.epochs} epochs with observations of one station only carry no information with satellite clocks estimated`);
    if (meanEstimated !== null && meanEstimated > options.commonModeSigmaThresholdM) {
      warnings.push(
        `the absolute ZWD level is poorly determined: σ of the network-mean ZWD is ${(meanEstimated * 1000).toFixed(1)} mm (threshold ${(options.commonModeSigmaThresholdM * 1000).toFixed(1)} mm; ${(meanKnown * 1000).toFixed(1)} mm with satellite clocks known). The network spans ${geometry.extentKm.toFixed(0)} km, ${geometry.extentNadirDeg.toFixed(2)}° of nadir angle seen from the satellites: only ZWD differences between stations are well determined; add distant stations or use known satellite clocks`,
      );
    }
  } else {
    const known = subsets.map((sub) => pointPositioning(input, sub));
    results = known.map((k) => k.result);
    addKnownRelative(results, reference);
    known.forEach((k) => warnings.push(...k.output.warnings.map((w) => `station ${k.result.station}: ${w}`)));
    const meanKnown = knownMeanSigma(results.map((r) => r.epochs));
    commonMode = { meanZwdSigmaClocksEstimatedM: null, meanZwdSigmaClocksKnownM: meanKnown, correlationWithClocks: null, ...geometry };
    statistics = pooledStatistics(
      known.map((k) => k.output.statistics),
      {
        stations: stations.length,
        epochs: new Set(results.flatMap((r) => r.epochs.map((e) => e.epochMs))).size,
        clockUnknowns: options.epochBias ? results.reduce((n, r) => n + r.epochs.filter((e) => e.observationsUsed > 0).length, 0) : 0,
      },
    );
  }
  return {
    referenceStation: stations[reference]!.name,
    satelliteClocks: estimated ? 'estimated' : 'known',
    parametrisation: estimated ? networkParametrisation(model) : null,
    stations: results,
    commonMode,
    statistics,
    warnings,
  };
}

function checkInput(input: NetworkEstimationInput): void {
  const { stations, observations: o, options } = input;
  if (stations.length === 0) throw new ModelDomainError('stations', 'at least one station is needed', 400);
  const names = new Map<string, number>();
  stations.forEach((s, i) => {
    const other = names.get(s.name);
    if (other !== undefined)
      throw new ModelDomainError(
        `stations.${i}.name`,
        `duplicate station name ${s.name} (also stations.${other}); names must be unique`,
        400,
      );
    names.set(s.name, i);
  });
  const n = o.epochMs.length;
  for (const [name, column] of [
    ['station', o.station],
    ['satellite', o.satellite],
    ['elevation', o.elevationRad],
    ['azimuth', o.azimuthRad],
    ['residual', o.residualM],
    ...(o.sigmaM ? [['sigma', o.sigmaM] as const] : []),
  ] as const) {
    if (column.length !== n) throw new Error(`observation column ${name} has ${column.length} entries, epochs ${n}`);
  }
  if (n === 0) throw new ModelDomainError('observations', 'at least one observation is needed', 400);
  const stationOf = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const s = names.get(o.station[i]!);
    if (s === undefined) {
      throw new ModelDomainError(
        `observations.${i}.station`,
        `station ${o.station[i]} is not in stations (known: ${[...names.keys()].slice(0, 10).join(', ')}${names.size > 10 ? ', …' : ''}); add it to stations with its site`,
        400,
      );
    }
    stationOf[i] = s;
  }
  checkDuplicates(o, stationOf, stations.length);
  if (options.referenceStation !== null && !names.has(options.referenceStation)) {
    throw new ModelDomainError(
      'options.reference_station',
      `reference station ${options.referenceStation} is not in stations; name one of them or leave it out (the most central station is taken)`,
      400,
    );
  }
}

/**
 * 400 for a (station, epoch, satellite) that appears twice, naming the first repeat in input order.
 * Linear in the observations: a stable counting sort by (station, epoch) and, within each group, a
 * stamp per satellite (no key strings: 2.6 M observations cost a few tens of milliseconds).
 */
function checkDuplicates(o: NetworkEstimationInput['observations'], stationOf: Int32Array, stations: number): void {
  const n = stationOf.length;
  const epochId = new Map<number, number>();
  const satelliteId = new Map<string, number>();
  const epochOf = new Int32Array(n);
  const satelliteOf = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    let e = epochId.get(o.epochMs[i]!);
    if (e === undefined) epochId.set(o.epochMs[i]!, (e = epochId.size));
    let k = satelliteId.get(o.satellite[i]!);
    if (k === undefined) satelliteId.set(o.satellite[i]!, (k = satelliteId.size));
    epochOf[i] = e;
    satelliteOf[i] = k;
  }
  const epochs = epochId.size;
  const groups = stations * epochs;
  const start = new Int32Array(groups + 1);
  for (let i = 0; i < n; i++) start[stationOf[i]! * epochs + epochOf[i]! + 1]!++;
  for (let g = 0; g < groups; g++) start[g + 1]! += start[g]!;
  const fill = start.slice(0, groups);
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[fill[stationOf[i]! * epochs + epochOf[i]!]!++] = i;
  const stampGroup = new Int32Array(satelliteId.size).fill(-1);
  const stampIndex = new Int32Array(satelliteId.size);
  let first = -1;
  let other = -1;
  for (let g = 0; g < groups; g++) {
    for (let u = start[g]!; u < start[g + 1]!; u++) {
      const i = order[u]!;
      const k = satelliteOf[i]!;
      if (stampGroup[k] === g) {
        if (first < 0 || i < first) [first, other] = [i, stampIndex[k]!];
      } else {
        stampGroup[k] = g;
        stampIndex[k] = i;
      }
    }
  }
  if (first >= 0) {
    throw new ModelDomainError(
      `observations.${first}`,
      `duplicate observation: station ${o.station[first]}, satellite ${o.satellite[first]} at ${new Date(o.epochMs[first]!).toISOString()} is also observations.${other}; each (station, epoch, satellite) may appear once`,
      400,
    );
  }
}

/** Longest ZWD node spacing of the network model when the caller asked for states at every epoch [s]. */
export const NETWORK_ZWD_NODE_MAX_S = 300;
/** Longest gradient node spacing of the network model when the caller asked for states at every epoch [s]. */
export const NETWORK_GRADIENT_NODE_MAX_S = 1800;

/**
 * The options the network solves with, satellite clocks estimated (docs/network-estimation.md,
 * "Model"). States at every epoch ("every-epoch", the default) are replaced by piecewise-linear
 * nodes whose spacing divides the caller's output spacing Δ and is at most NETWORK_ZWD_NODE_MAX_S
 * (ZWD) or NETWORK_GRADIENT_NODE_MAX_S (gradients): Δ / ⌈Δ / max⌉, so every output node on a round
 * UTC epoch jΔ is a model node. With "nodes" the caller's spacings are the model's.
 */
export function networkModelOptions(options: NetworkEstimationInput['options']): NetworkEstimationInput['options'] {
  if (options.parametrisation === 'nodes') return options;
  const divide = (intervalS: number, maxS: number) => intervalS / Math.ceil(intervalS / maxS - 1e-9);
  return {
    ...options,
    parametrisation: 'nodes',
    zwd: { ...options.zwd, intervalS: divide(options.zwd.intervalS, NETWORK_ZWD_NODE_MAX_S) },
    gradients: options.gradients
      ? { ...options.gradients, intervalS: divide(options.gradients.intervalS, NETWORK_GRADIENT_NODE_MAX_S) }
      : null,
  };
}

/** The statement of what produced the numbers (the model's node spacings), for the result's models. */
function networkParametrisation(model: NetworkEstimationInput['options']): NetworkParametrisation {
  const z = model.zwd.intervalS;
  const g = model.gradients?.intervalS ?? null;
  return {
    zwdNodeIntervalS: z,
    gradientNodeIntervalS: g,
    statement: `piecewise-linear nodes on round UTC epochs (ZWD every ${z} s${g === null ? '' : `, gradients every ${g} s`}), random-walk constraints; the random walk's variance between and on the nodes, q² Δ (0.0866 − 0.166 u + 1.464 u²) with u = α (1 − α), added to every σ (none when every epoch is a node; network-interpolation-variance-1)`,
  };
}

/**
 * The factor c by which every observation weight changes when the weighting goes from (a, b,
 * given scale) to the next, or null when the weights change by different factors: with only one
 * component in use ("elevation": a = 0; "uniform": b = 0) and the given sigmas (if any) scaled
 * alike, every weight 1/σ² changes by the same factor, and the kept reduced epochs are scaled
 * instead of being formed again.
 */
function uniformWeightFactor(
  now: { a: number; b: number },
  nowGiven: number,
  next: { a: number; b: number },
  nextGiven: number,
  net: NetworkDesign,
): number | null {
  const ratios: number[] = [];
  if (now.a > 0 || next.a > 0) ratios.push(now.a > 0 ? (now.a / next.a) ** 2 : Number.NaN);
  if (now.b > 0 || next.b > 0) ratios.push(now.b > 0 ? (now.b / next.b) ** 2 : Number.NaN);
  const anyGiven = net.stations.some((st) => st.design.givenSigmaM !== null);
  if (anyGiven) ratios.push(nowGiven / nextGiven);
  if (ratios.length === 0 || ratios.some((r) => !Number.isFinite(r))) return null;
  return ratios.every((r) => Math.abs(r / ratios[0]! - 1) < 1e-12) ? ratios[0]! : null;
}

/** The caller's reference station, or the one closest to the centroid of all stations. */
function referenceStation(input: NetworkEstimationInput, ecef: Ecef[]): number {
  if (input.options.referenceStation !== null) return input.stations.findIndex((s) => s.name === input.options.referenceStation);
  const c = ecef.reduce((a, p) => ({ xM: a.xM + p.xM / ecef.length, yM: a.yM + p.yM / ecef.length, zM: a.zM + p.zM / ecef.length }), {
    xM: 0,
    yM: 0,
    zM: 0,
  });
  let best = 0;
  let bestD = Infinity;
  ecef.forEach((p, i) => {
    const d = Math.hypot(p.xM - c.xM, p.yM - c.yM, p.zM - c.zM);
    if (d < bestD) {
      bestD = d;
      best = i;
    }
  });
  return best;
}

/**
 * Largest chord between two stations [km], and the largest angle between the directions to two
 * stations seen from a satellite GNSS_ORBIT_HEIGHT_M above the centroid [deg] (the whole Earth
 * spans about ±14° seen from such a satellite; common practice).
 */
export function networkExtent(ecef: Ecef[]): { extentKm: number; extentNadirDeg: number } {
  const c = ecef.reduce((a, p) => ({ xM: a.xM + p.xM / ecef.length, yM: a.yM + p.yM / ecef.length, zM: a.zM + p.zM / ecef.length }), {
    xM: 0,
    yM: 0,
    zM: 0,
  });
  const norm = Math.hypot(c.xM, c.yM, c.zM) || 1;
  const r = EARTH_MEAN_RADIUS_M + GNSS_ORBIT_HEIGHT_M;
  const sat = { xM: (c.xM / norm) * r, yM: (c.yM / norm) * r, zM: (c.zM / norm) * r };
  let chord = 0;
  let angle = 0;
  for (let i = 0; i < ecef.length; i++) {
    for (let j = 0; j < i; j++) {
      const a = ecef[i]!;
      const b = ecef[j]!;
      chord = Math.max(chord, Math.hypot(a.xM - b.xM, a.yM - b.yM, a.zM - b.zM));
      const u = [a.xM - sat.xM, a.yM - sat.yM, a.zM - sat.zM];
      const v = [b.xM - sat.xM, b.yM - sat.yM, b.zM - sat.zM];
      const cos = (u[0]! * v[0]! + u[1]! * v[1]! + u[2]! * v[2]!) / (Math.hypot(...u) * Math.hypot(...v));
      angle = Math.max(angle, Math.acos(Math.min(1, cos)));
    }
  }
  return { extentKm: chord / 1000, extentNadirDeg: (angle * 180) / Math.PI };
}

function solveNamed(
  net: NetworkDesign,
  options: NetworkEstimationInput['options'],
  used: Uint8Array[],
  reference: number,
  cache?: ReducedEpochCache,
): NetworkSolution {
  try {
    return solveNetworkOnce(net, options, used, reference, cache);
  } catch (err) {
    if (!(err instanceof SingularParameterError)) throw err;
    const P = net.stationParameters;
    const s = Math.floor(err.parameter / P);
    const layout = stationLayout(net);
    const j = err.parameter - s * P;
    const [name, node, nodes] =
      j < layout.zwdCount
        ? ['zenith wet delay', j, net.zwd]
        : j < layout.eastOffset
          ? ['north gradient', j - layout.northOffset, net.gradients!]
          : ['east gradient', j - layout.eastOffset, net.gradients!];
    throw new ModelDomainError(
      'observations',
      `the system is singular: the ${name} node ${node} of station ${net.stations[s]!.name} at ${new Date(nodeEpochMs(nodes, node)).toISOString()} is not determined by the observations and constraints${net.satelliteClocks ? ' (with satellite clocks estimated, a station needs satellites that other stations see at the same epochs)' : ''}. Add observations or constraints (random walk, a-priori sigma)`,
      422,
    );
  }
}

function solveWithScreening(net: NetworkDesign, input: NetworkEstimationInput, reference: number): SubProblem {
  const { options } = input;
  const obs = input.observations;
  const S = net.stations.length;
  const used = net.stations.map((st) => new Uint8Array(st.design.residualM.length).fill(1));
  const rejected: RejectedObservation[][] = net.stations.map(() => []);
  const layout = stationLayout(net);
  const unknownsOf = (s: NetworkSolution) => S * layout.parameters + s.clockUnknowns;
  // Several solutions only when screening or re-weighting: then keep the reduced epochs between them.
  const cache = options.outlierThreshold === null && !options.scaleSigmas ? undefined : new ReducedEpochCache(net.epochMs.length);
  let weighting = initialWeighting(options);
  let givenScale = 1;
  let reweightings = 0;
  const screened = screenedSolution(
    {
      solve: () => solveNamed(net, options, used, reference, cache),
      varianceFactor: (s) => {
        const dof = s.observationsUsed + s.constraints - unknownsOf(s);
        return dof > 0 ? s.weightedSquareSum / dof : null;
      },
      candidates: (s, sigmaZero) =>
        networkCandidates(net, s, sigmaZero, options.outlierThreshold!, options.outlierRejection, options.zwd.intervalS),
      normalizedResidual: (c) => c.tau,
      reject: (c, s) => {
        const i = net.stations[c.station]!.networkIndex[c.index]!;
        rejected[c.station]!.push({
          index: i,
          epochMs: obs.epochMs[i]!,
          satellite: obs.satellite[i]!,
          residualM: obs.residualM[i]!,
          fittedResidualM: s.fittedResidualM[c.station]![c.index]!,
          normalizedResidual: c.tau,
        });
        used[c.station]![c.index] = 0;
        cache?.invalidate(networkEpochOf(net, c.station, c.index));
      },
      // Variance components as in the single-station estimator (estimate.ts), one set for the whole
      // network, estimated from every station's residuals and σ_v.
      reweight: (s, varianceFactor) => {
        if (!options.scaleSigmas || reweightings >= MAX_REWEIGHTINGS || varianceFactor === null) return false;
        const next = varianceComponents(
          net.stations.map((st, k) => ({
            design: st.design,
            fittedResidualM: s.fittedResidualM[k]!,
            residualVarianceM2: s.residualVarianceM2[k]!,
            used: s.included[k]!,
          })),
          options.weighting,
          weighting,
          givenScale,
          screeningBound(options.outlierThreshold, varianceFactor),
        );
        if (!next.changed) return false;
        const factor = uniformWeightFactor(weighting, givenScale, next.weighting, next.givenScale, net);
        weighting = next.weighting;
        givenScale = next.givenScale;
        for (const st of net.stations) setWeights(st.design, weighting.a, weighting.b, givenScale);
        if (factor === null) cache?.clear();
        else cache?.scaleWeights(factor);
        reweightings++;
        return true;
      },
    },
    options.outlierThreshold,
    options.maxRejections,
  );
  const { solution, varianceFactor, solutions, screeningComplete } = screened;
  const warnings = [...screened.warnings];
  const unknowns = unknownsOf(solution);
  const degreesOfFreedom = solution.observationsUsed + solution.constraints - unknowns;
  // The weights were re-estimated (scaleSigmas): the formal errors are those of the final weights,
  // as in the single-station estimator.
  const sigmaScale = 1;
  if (varianceFactor === null) {
    warnings.push(
      'no degrees of freedom (one observation per epoch with epoch_bias on, or as many unknowns as observations): the variance factor is not estimable and the weights are not re-estimated',
    );
  }
  let low = 0;
  net.stations.forEach((st, s) => {
    for (let i = 0; i < st.design.residualM.length; i++)
      if (solution.included[s]![i] && obs.elevationRad[st.networkIndex[i]!]! < MAPPING_FIT_LOWEST_ELEVATION_RAD) low++;
  });
  if (low > 0)
    warnings.push(`${low} observations below 3° were used: the Niell mapping functions are fitted from 3° up and are extrapolated there`);
  return {
    net,
    used,
    solution,
    rejected,
    varianceFactor,
    degreesOfFreedom,
    unknowns,
    sigmaScale,
    weighting: { constantM: weighting.a, elevationM: weighting.b, givenSigmaScale: givenScale },
    solutions,
    screeningComplete,
    warnings,
  };
}

/** Network epoch of design observation i of station s (binary search in the station's epoch starts). */
function networkEpochOf(net: NetworkDesign, s: number, i: number): number {
  const st = net.stations[s]!;
  const start = st.design.epochStart;
  let lo = 0;
  let hi = st.design.epochMs.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (start[mid]! <= i) lo = mid;
    else hi = mid - 1;
  }
  return st.networkEpoch[lo]!;
}

interface Candidate {
  station: number;
  index: number;
  tau: number;
}

/** Rejection candidates across the network (module comment); largest |τ| first. */
function networkCandidates(
  net: NetworkDesign,
  solution: NetworkSolution,
  sigmaZero: number,
  threshold: number,
  mode: 'one-per-solution' | 'one-per-window',
  zwdIntervalS: number,
): Candidate[] {
  const above: Candidate[] = [];
  net.stations.forEach((st, s) => {
    for (let i = 0; i < st.design.residualM.length; i++) {
      if (!solution.included[s]![i]) continue;
      const sigma = Math.sqrt(st.design.observationVarianceM2[i]!);
      const qv = solution.residualVarianceM2[s]![i]!;
      if (!(qv > MIN_TESTABLE_REDUNDANCY * sigma * sigma)) continue;
      const tau = solution.fittedResidualM[s]![i]! / (sigmaZero * Math.sqrt(qv));
      if (Math.abs(tau) > threshold) above.push({ station: s, index: i, tau });
    }
  });
  if (above.length === 0) return [];
  above.sort((a, b) => Math.abs(b.tau) - Math.abs(a.tau) || a.station - b.station || a.index - b.index);
  if (mode === 'one-per-solution') return [above[0]!];
  // Greedy in decreasing |τ| (outliers.ts): taken when no taken candidate of the same station is
  // within the window and none of any station is at the same epoch.
  const windowMs = nodeRejectionWindowMs(zwdIntervalS);
  const epochOf = net.stations.map((st) => {
    const out = new Int32Array(st.design.residualM.length);
    for (let k = 0; k + 1 < st.design.epochStart.length; k++)
      out.fill(st.networkEpoch[k]!, st.design.epochStart[k]!, st.design.epochStart[k + 1]!);
    return out;
  });
  const takenMs = net.stations.map(() => [] as number[]);
  const takenEpochs = new Set<number>();
  const out: Candidate[] = [];
  for (const c of above) {
    const k = epochOf[c.station]![c.index]!;
    const t = net.epochMs[k]!;
    if (takenEpochs.has(k) || takenMs[c.station]!.some((u) => Math.abs(u - t) < windowMs)) continue;
    takenMs[c.station]!.push(t);
    takenEpochs.add(k);
    out.push(c);
  }
  return out;
}

function interpolated(x: Float64Array, diag: Float64Array, adj: Float64Array, p: number, two: boolean, alpha: number, scale: number) {
  if (!two) return { value: x[p]!, sigma: Math.sqrt(diag[p]!) * scale };
  const b = 1 - alpha;
  const variance = b * b * diag[p]! + 2 * alpha * b * adj[p]! + alpha * alpha * diag[p + 1]!;
  return { value: b * x[p]! + alpha * x[p + 1]!, sigma: Math.sqrt(Math.max(variance, 0)) * scale };
}

/**
 * Correlated-noise inflation per station (correlated-noise.ts, as the single-station estimator):
 * the residual autocorrelation of the station's satellite arcs, and per epoch the information of
 * its 3×3 block of the reduced epoch matrix (clocks eliminated). Variance factors per station epoch.
 */
function stationNoise(problem: SubProblem, input: NetworkEstimationInput): NoiseInflation[] {
  const { net, solution } = problem;
  return net.stations.map((st, s) =>
    noiseInflation(
      input.options,
      st.design,
      { fittedResidualM: solution.fittedResidualM[s]!, epochNormal: solution.epochNormal[s]! },
      solution.included[s]!,
      net.gradients !== null,
    ),
  );
}

/**
 * Per network epoch, the factor on the variance of the network mean: (mean over the stations of
 * √f_s)², f_s the ZWD factor of station s at its nearest epoch. Exact when the factors are equal
 * (Cov(s, t) scaled by √(f_s f_t)); otherwise the covariances are weighted alike.
 */
function meanNoiseFactorPerEpoch(net: NetworkDesign, noise: NoiseInflation[]): Float64Array {
  const out = new Float64Array(net.epochMs.length);
  for (let k = 0; k < net.epochMs.length; k++) {
    let sum = 0;
    net.stations.forEach((st, s) => (sum += Math.sqrt(noise[s]!.zwd[nearestEpoch(st.design.epochMs, net.epochMs[k]!)]!)));
    out[k] = (sum / net.stations.length) ** 2;
  }
  return out;
}

/**
 * σ² of x_s − x_r with both variances inflated (factors f_s, f_r) and their covariance by √(f_s f_r):
 * the covariance follows from the white-noise variances, v_s + v_r − relative = 2 Cov.
 */
function inflatedRelative(vs: number, vr: number, relative: number, fs: number, fr: number): number {
  const cov = (vs + vr - relative) / 2;
  return Math.max(fs * vs + fr * vr - 2 * Math.sqrt(fs * fr) * cov, 0);
}

function stationResults(
  problem: SubProblem,
  reference: number,
  noise: NoiseInflation[],
  model: NetworkEstimationInput['options'],
  options: NetworkEstimationInput['options'],
): NetworkStationResult[] {
  const { net, solution, sigmaScale: scale } = problem;
  const refDesign = net.stations[reference]!.design;
  const refNoise = noise[reference]!;
  const layout = stationLayout(net);
  const P = layout.parameters;
  const x = solution.x;
  const diag = solution.inverseDiagonal;
  const adj = solution.adjacentCovariance;
  const singleCounts = singleStationCounts(net).perStation;
  const missing = missingVariance(net, model);
  // The output nodes: on the caller's spacings, each a model node or beyond the model's ends.
  const first = net.epochMs[0]!;
  const last = net.epochMs[net.epochMs.length - 1]!;
  const zwdOut = outputNodes(net.zwd, nodeLayout(first, last, options.zwd.intervalS, 'options.zwd_interval_s'));
  const gradientOut =
    net.gradients && options.gradients
      ? outputNodes(net.gradients, nodeLayout(first, last, options.gradients.intervalS, 'options.gradients.interval_s'))
      : null;
  const zq2 = (model.zwd.randomWalkMPerSqrtH ?? Number.POSITIVE_INFINITY) ** 2;
  const gq2 = (model.gradients?.randomWalkMPerSqrtH ?? Number.POSITIVE_INFINITY) ** 2;
  /** Random-walk variance q² |t − end| of an output node beyond the model's ends [m²]. */
  const beyond = (q2: number, dtH: number) => (dtH > 0 ? q2 * dtH : 0);
  /**
   * Included observations of station s strictly within one node interval of each node
   * (|t − node| < Δ, as the single-station estimator counts them: an epoch on the neighbouring node
   * does not count).
   */
  const nearby = (s: number, nodes: Float64Array, intervalMs: number) => {
    const out = new Array<number>(nodes.length).fill(0);
    const d = net.stations[s]!.design;
    for (let ks = 0; ks < d.epochMs.length; ks++) {
      let n = 0;
      for (let i = d.epochStart[ks]!; i < d.epochStart[ks + 1]!; i++) n += solution.included[s]![i]!;
      if (n === 0) continue;
      const t = d.epochMs[ks]!;
      for (let j = 0; j < nodes.length; j++) if (Math.abs(nodes[j]! - t) < intervalMs) out[j]! += n;
    }
    return out;
  };
  return net.stations.map((st, s) => {
    const zwdNearby = nearby(s, zwdOut.nodeMs, options.zwd.intervalS * 1000);
    const gradientNearby = gradientOut ? nearby(s, gradientOut.nodeMs, options.gradients!.intervalS * 1000) : [];
    const o = s * P;
    const ro = reference * P;
    const d = st.design;
    const f = noise[s]!;
    const zwdNodes = Array.from({ length: zwdOut.nodeMs.length }, (_, i) => {
      const t = zwdOut.nodeMs[i]!;
      const j = zwdOut.modelNode[i]!;
      const far = beyond(zq2, zwdOut.beyondH[i]!);
      const fs = f.zwd[nearestEpoch(d.epochMs, t)]!;
      const fr = refNoise.zwd[nearestEpoch(refDesign.epochMs, t)]!;
      const cov = solution.nodeCovarianceWithReference[s]![j]!;
      const rel = s === reference ? 0 : inflatedRelative(diag[o + j]!, diag[ro + j]!, diag[o + j]! + diag[ro + j]! - 2 * cov, fs, fr);
      // The random walk's missing variance on a node (α = 0; beyond the model's ends the random
      // walk from the end node), each station's own and independent.
      const m = missing.zwd(0) + far;
      return {
        epochMs: t,
        correctionM: x[o + j]!,
        sigmaM: Math.sqrt(diag[o + j]! * fs * scale * scale + m),
        relativeSigmaM: Number.isNaN(rel) ? null : s === reference ? 0 : Math.sqrt(rel * scale * scale + 2 * m),
        observationsNearby: zwdNearby[i]!,
      };
    });
    const gradientNodes: GradientNodeEstimate[] = Array.from({ length: gradientOut?.nodeMs.length ?? 0 }, (_, i) => {
      const l = gradientOut!.modelNode[i]!;
      const n = o + layout.northOffset + l;
      const e = o + layout.eastOffset + l;
      const t = gradientOut!.nodeMs[i]!;
      const near = nearestEpoch(d.epochMs, t);
      const m = missing.gradient(0) + beyond(gq2, gradientOut!.beyondH[i]!);
      return {
        epochMs: t,
        northM: x[n]!,
        eastM: x[e]!,
        northSigmaM: Math.sqrt(diag[n]! * f.north[near]! * scale * scale + m),
        eastSigmaM: Math.sqrt(diag[e]! * f.east[near]! * scale * scale + m),
        observationsNearby: gradientNearby[i]!,
      };
    });
    const epochs: NetworkEpochEstimate[] = Array.from({ length: d.epochMs.length }, (_, ks) => {
      const k = st.networkEpoch[ks]!;
      const w = interpolated(x, diag, adj, o + net.zwdInterval[k]!, layout.zwdCount > 1, net.zwdAlpha[k]!, scale);
      let north = null;
      let east = null;
      if (layout.gradientCount > 0) {
        const l = net.gradientInterval[k]!;
        const two = layout.gradientCount > 1;
        north = interpolated(x, diag, adj, o + layout.northOffset + l, two, net.gradientAlpha[k]!, scale);
        east = interpolated(x, diag, adj, o + layout.eastOffset + l, two, net.gradientAlpha[k]!, scale);
      }
      let count = 0;
      for (let i = d.epochStart[ks]!; i < d.epochStart[ks + 1]!; i++) count += solution.included[s]![i]!;
      const ec = solution.epochs[k]!;
      const bias = solution.receiverClockM[s]![ks]!;
      const vs = Math.max(ec.variance[s]!, 0);
      const fs = f.zwd[ks]!;
      const fr = refNoise.zwd[nearestEpoch(refDesign.epochMs, d.epochMs[ks]!)]!;
      const vr = Math.max(ec.variance[reference]!, 0);
      // The reference station may have no epoch here (its variance is then not kept): its factor alone.
      const relative = Number.isNaN(vr) ? ec.relativeVariance[s]! * fs : inflatedRelative(vs, vr, ec.relativeVariance[s]!, fs, fr);
      // The random walk between the nodes (interpolation-variance.ts): the station's own and, for
      // the relative σ, the reference's (independent, at the same α: the node layout is common).
      const mw = missing.zwd(net.zwdAlpha[k]!);
      const mg = layout.gradientCount > 0 ? missing.gradient(net.gradientAlpha[k]!) : 0;
      return {
        epochMs: d.epochMs[ks]!,
        correctionM: w.value,
        sigmaM: Math.sqrt(vs * fs * scale * scale + mw),
        relativeSigmaM: s === reference ? 0 : Math.sqrt(relative * scale * scale + 2 * mw),
        northGradientM: north?.value ?? null,
        eastGradientM: east?.value ?? null,
        northGradientSigmaM: north ? Math.sqrt(north.sigma ** 2 * f.north[ks]! + mg) : null,
        eastGradientSigmaM: east ? Math.sqrt(east.sigma ** 2 * f.east[ks]! + mg) : null,
        epochBiasM: Number.isNaN(bias) ? null : bias,
        observationsUsed: count,
      };
    });
    const belowCutoff = d.observationsBelowCutoff;
    const singles = singleCounts[s]!;
    return {
      station: st.name,
      zwdNodes,
      gradientNodes,
      epochs,
      rejected: problem.rejected[s]!,
      statistics: {
        observationsTotal: d.residualM.length + belowCutoff,
        observationsBelowCutoff: belowCutoff,
        observationsSingleStationSatellite: singles,
        observationsUsed: solution.included[s]!.reduce((n, v) => n + v, 0),
        observationsRejected: problem.rejected[s]!.length,
        epochs: d.epochMs.length,
        noiseCorrelation: f.statistics,
      },
      medianSigmaM: median(epochs.map((e) => e.sigmaM)) ?? Number.NaN,
      medianRelativeSigmaM: median(epochs.map((e) => e.relativeSigmaM)) ?? Number.NaN,
    };
  });
}

/**
 * The output nodes (caller's spacing, round UTC epochs) against the model's nodes: each output node
 * inside the model's span is a model node (the model spacing divides the output spacing:
 * networkModelOptions); one before the first or after the last model node takes the end node
 * and the random walk over the distance (beyondH > 0), as the single-station estimator
 * extrapolates beyond its states.
 */
function outputNodes(model: NodeLayout, output: NodeLayout): { nodeMs: Float64Array; modelNode: Int32Array; beyondH: Float64Array } {
  const n = output.count;
  const modelNode = new Int32Array(n);
  const beyondH = new Float64Array(n);
  const firstMs = model.nodeMs[0]!;
  const lastMs = model.nodeMs[model.count - 1]!;
  for (let i = 0; i < n; i++) {
    const t = output.nodeMs[i]!;
    if (t <= firstMs || model.count === 1) {
      modelNode[i] = 0;
      beyondH[i] = Math.abs(firstMs - t) / 3_600_000;
    } else if (t >= lastMs) {
      modelNode[i] = model.count - 1;
      beyondH[i] = (t - lastMs) / 3_600_000;
    } else {
      const j = Math.round((t - firstMs) / model.intervalMs);
      if (Math.abs(model.nodeMs[j]! - t) > 1e-6 * model.intervalMs) {
        throw new Error(`output node ${new Date(t).toISOString()} is not a model node (model spacing ${model.intervalMs} ms)`);
      }
      modelNode[i] = j;
    }
  }
  return { nodeMs: output.nodeMs, modelNode, beyondH };
}

/**
 * The variance the piecewise-linear model leaves out of the random walk (interpolation-variance.ts)
 * at fraction α of a ZWD or gradient interval [m²]; 0 without a random walk, with one node, or when
 * every epoch is a node (a state at every epoch).
 */
function missingVariance(
  net: NetworkDesign,
  options: NetworkEstimationInput['options'],
): { zwd: (alpha: number) => number; gradient: (alpha: number) => number } {
  // Every epoch on a node (nodes at the sampling interval): the model is the random walk at every
  // epoch itself, and nothing is missing.
  const onNodes = (alpha: Float64Array) => alpha.every((a) => a < 1e-9 || a > 1 - 1e-9);
  const zwdSpanH = net.zwd.count > 1 && !onNodes(net.zwdAlpha) ? net.zwd.intervalMs / 3_600_000 : 0;
  const gradientSpanH = net.gradients && net.gradients.count > 1 && !onNodes(net.gradientAlpha) ? net.gradients.intervalMs / 3_600_000 : 0;
  const zq = options.zwd.randomWalkMPerSqrtH;
  const gq = options.gradients?.randomWalkMPerSqrtH ?? null;
  return {
    zwd: (alpha) => interpolationVariance(zq, zwdSpanH, alpha),
    gradient: (alpha) => interpolationVariance(gq, gradientSpanH, alpha),
  };
}

/** Satellites seen by one station at an epoch (all observations taken as used), and epochs with one station. */
function singleStationCounts(net: NetworkDesign): { observations: number; pairs: number; epochs: number; perStation: number[] } {
  const perStation = net.stations.map(() => 0);
  let pairs = 0;
  let epochs = 0;
  if (!net.satelliteClocks) return { observations: 0, pairs: 0, epochs: 0, perStation };
  for (let k = 0; k < net.epochMs.length; k++) {
    const a = net.entryStart[k]!;
    const b = net.entryStart[k + 1]!;
    const stationsHere = new Set<number>();
    for (let e = a; e < b;) {
      let f = e;
      while (f < b && net.entrySatellite[f] === net.entrySatellite[e]) f++;
      if (f - e === 1) {
        pairs++;
        perStation[net.entryStation[e]!]!++;
      }
      for (let x = e; x < f; x++) stationsHere.add(net.entryStation[x]!);
      e = f;
    }
    if (stationsHere.size === 1) epochs++;
  }
  return { observations: pairs, pairs, epochs, perStation };
}

/**
 * σ of the network-mean ZWD with the satellite clocks known (independent stations): median over
 * the epochs at which every station has an epoch of √(Σ σ_s²)/S.
 */
function knownMeanSigma(perStation: readonly (readonly { epochMs: number; sigmaM: number }[])[]): number {
  const byEpoch = new Map<number, { sum: number; count: number }>();
  for (const epochs of perStation) {
    for (const { epochMs, sigmaM } of epochs) {
      const e = byEpoch.get(epochMs) ?? { sum: 0, count: 0 };
      e.sum += sigmaM * sigmaM;
      e.count++;
      byEpoch.set(epochMs, e);
    }
  }
  const S = perStation.length;
  const values = [...byEpoch.values()].filter((e) => e.count === S).map((e) => Math.sqrt(e.sum) / S);
  return median(values) ?? Number.NaN;
}

/** Satellite clocks known: stations are independent, σ²(δw_s − δw_ref) = σ_s² + σ_ref² at common epochs. */
function addKnownRelative(results: NetworkStationResult[], reference: number): void {
  const ref = results[reference]!;
  const refEpoch = new Map(ref.epochs.map((e) => [e.epochMs, e.sigmaM]));
  const refNode = new Map(ref.zwdNodes.map((n) => [n.epochMs, n.sigmaM]));
  results.forEach((r, s) => {
    for (const e of r.epochs) {
      const v = refEpoch.get(e.epochMs);
      e.relativeSigmaM = s === reference ? 0 : v === undefined ? Number.NaN : Math.hypot(e.sigmaM, v);
    }
    for (const n of r.zwdNodes) {
      const v = refNode.get(n.epochMs);
      n.relativeSigmaM = s === reference ? 0 : v === undefined ? null : Math.hypot(n.sigmaM, v);
    }
    r.medianRelativeSigmaM = median(r.epochs.map((e) => e.relativeSigmaM)) ?? Number.NaN;
  });
}
