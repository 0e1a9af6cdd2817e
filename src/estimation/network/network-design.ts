/**
 * The network's observations arranged for the solver: one single-station Design per station
 * (../design.ts: cutoff, weights, Niell wet and Chen & Herring gradient partials; the same model as
 * the single-station estimator), node layouts common to all stations, and per network epoch the
 * list of (station, observation, satellite) entries grouped by satellite.
 *
 * Clock-free residuals: the estimates of ZWD and gradients do not change when anything that lies in
 * the span of the clock parameters is added to the residuals (a value per station and epoch, or per
 * satellite and epoch). Before the normal equations are formed, the residuals of each epoch are
 * therefore reduced by two sweeps of weighted means (per station, then per satellite), so clock
 * biases of hundreds of kilometres cost no digits in the sums (the single-station code centres its
 * sums for the same reason). The receiver-clock part removed is kept to report the clocks.
 */

import { ModelDomainError } from '../../domain/errors.js';
import { buildDesign, locate, nodeLayout, type Design, type NodeLayout } from '../design.js';
import type { ZwdEstimationOptions } from '../types.js';

export interface StationDesign {
  name: string;
  /** Station index in the network input. */
  index: number;
  design: Design;
  /** Network input index of each design observation. */
  networkIndex: Int32Array;
  /** Network epoch of each station epoch. */
  networkEpoch: Int32Array;
  /** Residuals with the clock-like means removed (module comment) [m]. */
  reducedResidualM: Float64Array;
  /** Receiver-clock part removed from the residuals, per station epoch [m]. */
  receiverShiftM: Float64Array;
  /** First parameter id of the station. */
  parameterOffset: number;
}

export interface NetworkDesign {
  stations: StationDesign[];
  zwd: NodeLayout;
  gradients: NodeLayout | null;
  /** Parameters per station: ZWD nodes, north nodes, east nodes. */
  stationParameters: number;
  epochMs: Float64Array;
  zwdInterval: Int32Array;
  zwdAlpha: Float64Array;
  gradientInterval: Int32Array;
  gradientAlpha: Float64Array;
  /** Entries of epoch k are [entryStart[k], entryStart[k+1]), sorted by satellite, then station. */
  entryStart: Int32Array;
  entryStation: Int32Array;
  /** Design index (within the station's design) of the entry. */
  entryObservation: Int32Array;
  entrySatellite: Int32Array;
  satellites: string[];
  receiverClocks: boolean;
  satelliteClocks: boolean;
}

export interface StationSubset {
  name: string;
  index: number;
  latitudeRad: number;
  /** Network input indices of the station's observations. */
  observations: number[];
}

export interface NetworkColumns {
  epochMs: number[];
  satellite: string[];
  elevationRad: number[];
  azimuthRad: number[];
  residualM: number[];
  sigmaM?: (number | null)[] | undefined;
}

/**
 * A one-station network keeps its station's own node layout (it starts at the station's first
 * epoch, as in the single-station estimator); several stations share one layout over all epochs.
 * @param given the stations' designs when already built (stationDesigns), in the order of subsets
 * @throws ModelDomainError 422 naming the station when none of its observations is above the cutoff
 */
export function buildNetworkDesign(
  columns: NetworkColumns,
  subsets: StationSubset[],
  options: ZwdEstimationOptions,
  satelliteClocks: boolean,
  given?: readonly Design[],
): NetworkDesign {
  const designs: Design[] = given ? [...given] : stationDesigns(columns, subsets, options);

  // Network epochs and the common node layout.
  const allEpochs = new Set<number>();
  for (const d of designs) for (const t of d.epochMs) allEpochs.add(t);
  const epochMs = Float64Array.from([...allEpochs].sort((a, b) => a - b));
  const epochIndex = new Map<number, number>();
  epochMs.forEach((t, k) => epochIndex.set(t, k));
  const first = epochMs[0]!;
  const last = epochMs[epochMs.length - 1]!;
  const zwd = subsets.length === 1 ? designs[0]!.zwd : nodeLayout(first, last, options.zwd.intervalS, 'options.zwd_interval_s');
  const gradients = options.gradients
    ? subsets.length === 1
      ? designs[0]!.gradients
      : nodeLayout(first, last, options.gradients.intervalS, 'options.gradients.interval_s')
    : null;
  const epochs = epochMs.length;
  const zwdInterval = new Int32Array(epochs);
  const zwdAlpha = new Float64Array(epochs);
  const gradientInterval = new Int32Array(epochs);
  const gradientAlpha = new Float64Array(epochs);
  for (let k = 0; k < epochs; k++) {
    const z = locate(zwd, epochMs[k]!);
    zwdInterval[k] = z.interval;
    zwdAlpha[k] = z.alpha;
    if (gradients) {
      const g = locate(gradients, epochMs[k]!);
      gradientInterval[k] = g.interval;
      gradientAlpha[k] = g.alpha;
    }
  }
  const stationParameters = zwd.count + 2 * (gradients?.count ?? 0);

  // Entries per network epoch, grouped by satellite.
  const satelliteId = new Map<string, number>();
  const counts = new Int32Array(epochs + 1);
  const stations: StationDesign[] = designs.map((design, s) => {
    const sub = subsets[s]!;
    const networkEpoch = Int32Array.from(design.epochMs, (t) => epochIndex.get(t)!);
    for (let k = 0; k < networkEpoch.length; k++) counts[networkEpoch[k]! + 1]! += design.epochStart[k + 1]! - design.epochStart[k]!;
    for (const i of design.inputIndex) {
      const sat = columns.satellite[sub.observations[i]!]!;
      if (!satelliteId.has(sat)) satelliteId.set(sat, satelliteId.size);
    }
    return {
      name: sub.name,
      index: sub.index,
      design,
      networkIndex: Int32Array.from(design.inputIndex, (i) => sub.observations[i]!),
      networkEpoch,
      reducedResidualM: Float64Array.from(design.residualM),
      receiverShiftM: new Float64Array(design.epochMs.length),
      parameterOffset: s * stationParameters,
    };
  });
  for (let k = 0; k < epochs; k++) counts[k + 1]! += counts[k]!;
  const total = counts[epochs]!;
  const entryStation = new Int32Array(total);
  const entryObservation = new Int32Array(total);
  const entrySatellite = new Int32Array(total);
  const fill = counts.slice();
  stations.forEach((st, s) => {
    const d = st.design;
    for (let k = 0; k < st.networkEpoch.length; k++) {
      const ke = st.networkEpoch[k]!;
      for (let i = d.epochStart[k]!; i < d.epochStart[k + 1]!; i++) {
        const e = fill[ke]!++;
        entryStation[e] = s;
        entryObservation[e] = i;
        entrySatellite[e] = satelliteId.get(columns.satellite[st.networkIndex[i]!]!)!;
      }
    }
  });
  // Each epoch's entries are in station order (filled station by station); a stable counting sort by
  // satellite makes them satellite, then station.
  const K = satelliteId.size;
  const bucket = new Int32Array(K + 1);
  const scratch = { station: new Int32Array(0), observation: new Int32Array(0), satellite: new Int32Array(0) };
  for (let k = 0; k < epochs; k++) {
    const a = counts[k]!;
    const b = counts[k + 1]!;
    const m = b - a;
    if (scratch.station.length < m) {
      scratch.station = new Int32Array(2 * m);
      scratch.observation = new Int32Array(2 * m);
      scratch.satellite = new Int32Array(2 * m);
    }
    bucket.fill(0);
    for (let e = a; e < b; e++) bucket[entrySatellite[e]! + 1]!++;
    for (let c = 0; c < K; c++) bucket[c + 1]! += bucket[c]!;
    for (let e = a; e < b; e++) {
      const u = bucket[entrySatellite[e]!]!++;
      scratch.station[u] = entryStation[e]!;
      scratch.observation[u] = entryObservation[e]!;
      scratch.satellite[u] = entrySatellite[e]!;
    }
    entryStation.set(scratch.station.subarray(0, m), a);
    entryObservation.set(scratch.observation.subarray(0, m), a);
    entrySatellite.set(scratch.satellite.subarray(0, m), a);
  }

  const net: NetworkDesign = {
    stations,
    zwd,
    gradients,
    stationParameters,
    epochMs,
    zwdInterval,
    zwdAlpha,
    gradientInterval,
    gradientAlpha,
    entryStart: counts,
    entryStation,
    entryObservation,
    entrySatellite,
    satellites: [...satelliteId.keys()],
    receiverClocks: options.epochBias,
    satelliteClocks,
  };
  reduceClockLikeParts(net);
  return net;
}

/**
 * The single-station design of every station (../design.ts), with regular nodes (the network solver
 * works with the single-station "nodes" parametrisation). The network code does not change a
 * design, so one set serves the network and the per-station comparison solutions.
 * @throws ModelDomainError 422 naming the station when none of its observations is above the cutoff
 */
export function stationDesigns(columns: NetworkColumns, subsets: StationSubset[], options: ZwdEstimationOptions): Design[] {
  const stationOptions: ZwdEstimationOptions = { ...options, parametrisation: 'nodes' };
  return subsets.map((st) => {
    const pick = <T>(c: readonly T[]) => st.observations.map((i) => c[i]!);
    // Numbers straight into the Float64Arrays the estimator reads (no second copy there); σ null → NaN.
    const pickNumbers = (c: readonly (number | null)[]) => Float64Array.from(st.observations, (i) => c[i] ?? Number.NaN);
    try {
      return buildDesign({
        latitudeRad: st.latitudeRad,
        observations: {
          epochMs: pickNumbers(columns.epochMs),
          satellite: pick(columns.satellite),
          elevationRad: pickNumbers(columns.elevationRad),
          azimuthRad: pickNumbers(columns.azimuthRad),
          residualM: pickNumbers(columns.residualM),
          sigmaM: columns.sigmaM ? pickNumbers(columns.sigmaM) : undefined,
        },
        options: stationOptions,
      });
    } catch (err) {
      if (err instanceof ModelDomainError && err.status === 422) {
        throw new ModelDomainError('observations', `station ${st.name}: ${err.message}`, 422);
      }
      throw err;
    }
  });
}

/** Two sweeps of weighted means per (station, epoch) and per (satellite, epoch); see the module comment. */
function reduceClockLikeParts(net: NetworkDesign): void {
  const S = net.stations.length;
  const stationEpoch = net.stations.map(() => 0);
  const sumW = new Float64Array(Math.max(S, net.satellites.length));
  const sumWR = new Float64Array(sumW.length);
  const epochOfStation = new Int32Array(S);
  const cursor = net.stations.map(() => 0);
  for (let k = 0; k < net.epochMs.length; k++) {
    const a = net.entryStart[k]!;
    const b = net.entryStart[k + 1]!;
    for (let s = 0; s < S; s++) {
      const st = net.stations[s]!;
      epochOfStation[s] = cursor[s]! < st.networkEpoch.length && st.networkEpoch[cursor[s]!] === k ? cursor[s]!++ : -1;
      stationEpoch[s] = epochOfStation[s]!;
    }
    for (let sweep = 0; sweep < 2; sweep++) {
      for (const [enabled, key] of [
        [net.receiverClocks, net.entryStation],
        [net.satelliteClocks, net.entrySatellite],
      ] as const) {
        if (!enabled) continue;
        for (let e = a; e < b; e++) {
          sumW[key[e]!] = 0;
          sumWR[key[e]!] = 0;
        }
        for (let e = a; e < b; e++) {
          const st = net.stations[net.entryStation[e]!]!;
          const i = net.entryObservation[e]!;
          const w = 1 / st.design.observationVarianceM2[i]!;
          sumW[key[e]!]! += w;
          sumWR[key[e]!]! += w * st.reducedResidualM[i]!;
        }
        for (let e = a; e < b; e++) {
          const st = net.stations[net.entryStation[e]!]!;
          const i = net.entryObservation[e]!;
          st.reducedResidualM[i]! -= sumWR[key[e]!]! / sumW[key[e]!]!;
        }
        if (key === net.entryStation) {
          for (let s = 0; s < S; s++) {
            if (epochOfStation[s]! >= 0 && sumW[s]! > 0) net.stations[s]!.receiverShiftM[epochOfStation[s]!]! += sumWR[s]! / sumW[s]!;
            sumW[s] = 0;
            sumWR[s] = 0;
          }
        }
      }
    }
  }
}
