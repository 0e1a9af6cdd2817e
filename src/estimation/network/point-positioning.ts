/**
 * The network with satellite clocks known (precise point positioning): the residuals were formed
 * with the satellite clocks of a global solution, so nothing links the stations and the network
 * splits into independent single-station problems (common practice; issue 12). Each station is
 * therefore solved by the single-station estimator itself (../estimate.ts) with the caller's
 * options — the same defaults (a random-walk state at every epoch with round-UTC output nodes,
 * variance components, correlated-noise inflation), the same screening, the same numbers — and
 * only the network's shape is added: input indices of the network, σ relative to the reference
 * station (addKnownRelative in estimate-network.ts) and pooled statistics.
 */

import { ModelDomainError } from '../../domain/errors.js';
import { estimateZwd } from '../estimate.js';
import type { ZwdEstimationOutput, ZwdEstimationStatistics } from '../types.js';
import type { StationSubset } from './network-design.js';
import { median } from './median.js';
import type { NetworkEstimationInput, NetworkEstimationStatistics, NetworkStationResult } from './types.js';

export interface PointPositioningStation {
  result: NetworkStationResult;
  output: ZwdEstimationOutput;
}

/**
 * One station's data through the single-station estimator.
 * @throws ModelDomainError from estimateZwd, the station named in the message (422 when nothing is
 *         above the cutoff or a node is not determined; 400 for a duplicate (epoch, satellite))
 */
export function pointPositioning(input: NetworkEstimationInput, subset: StationSubset): PointPositioningStation {
  const o = input.observations;
  const pick = <T>(c: readonly T[]) => subset.observations.map((i) => c[i]!);
  // Numbers straight into the Float64Arrays the estimator reads (no second copy there); σ null → NaN.
  const pickNumbers = (c: readonly (number | null)[]) => Float64Array.from(subset.observations, (i) => c[i] ?? Number.NaN);
  let output: ZwdEstimationOutput;
  try {
    output = estimateZwd({
      latitudeRad: subset.latitudeRad,
      observations: {
        epochMs: pickNumbers(o.epochMs),
        satellite: pick(o.satellite),
        elevationRad: pickNumbers(o.elevationRad),
        azimuthRad: pickNumbers(o.azimuthRad),
        residualM: pickNumbers(o.residualM),
        sigmaM: o.sigmaM ? pickNumbers(o.sigmaM) : undefined,
      },
      options: input.options,
    });
  } catch (err) {
    if (!(err instanceof ModelDomainError)) throw err;
    // The field refers to the station's own columns: the network's index, and the station named.
    const field = err.status === 400 ? networkField(err.field, subset) : 'observations';
    throw new ModelDomainError(field, `station ${subset.name}: ${err.message}`, err.status);
  }
  const s = output.statistics;
  const result: NetworkStationResult = {
    station: subset.name,
    zwdNodes: output.zwdNodes.map((n) => ({ ...n, relativeSigmaM: null })),
    gradientNodes: output.gradientNodes,
    epochs: output.epochs.map((e) => ({ ...e, relativeSigmaM: Number.NaN })),
    rejected: output.rejected.map((r) => ({ ...r, index: subset.observations[r.index]! })),
    statistics: {
      observationsTotal: s.observationsTotal,
      observationsBelowCutoff: s.observationsBelowCutoff,
      observationsSingleStationSatellite: 0,
      observationsUsed: s.observationsUsed,
      observationsRejected: s.observationsRejected,
      epochs: s.epochs,
    },
    medianSigmaM: median(output.epochs.map((e) => e.sigmaM)) ?? Number.NaN,
    medianRelativeSigmaM: Number.NaN,
  };
  return { result, output };
}

/** "observations.<i>…" of the station's columns → the same observation in the network's columns. */
function networkField(field: string, subset: StationSubset): string {
  const m = /^observations\.(\d+)(.*)$/.exec(field);
  return m ? `observations.${subset.observations[Number(m[1])]}${m[2]}` : field;
}

/**
 * The network statistics of independent stations: counts summed; the variance factor pooled
 * (Σ σ̂0²·dof / Σ dof, i.e. the weighted square sums over the degrees of freedom); the RMS over all
 * used observations; sigmaScale as the single-station estimator reports it (1: the formal errors
 * follow from the re-weighted observations).
 */
export function pooledStatistics(
  stations: readonly ZwdEstimationStatistics[],
  network: { stations: number; epochs: number; clockUnknowns: number },
): NetworkEstimationStatistics {
  const sum = (f: (s: ZwdEstimationStatistics) => number) => stations.reduce((n, s) => n + f(s), 0);
  const dof = sum((s) => s.degreesOfFreedom);
  const pooledDof = sum((s) => (s.varianceFactor === null ? 0 : s.degreesOfFreedom));
  const used = sum((s) => s.observationsUsed);
  return {
    stations: network.stations,
    epochs: network.epochs,
    observationsTotal: sum((s) => s.observationsTotal),
    observationsUsed: used,
    observationsRejected: sum((s) => s.observationsRejected),
    observationsSingleStationSatellite: 0,
    singleStationSatellites: 0,
    singleStationEpochs: 0,
    unknowns: sum((s) => s.unknowns),
    clockUnknowns: network.clockUnknowns,
    constraints: sum((s) => s.constraints),
    degreesOfFreedom: dof,
    rmsM: Math.sqrt(sum((s) => s.rmsM * s.rmsM * s.observationsUsed) / used),
    varianceFactor: pooledDof > 0 ? sum((s) => (s.varianceFactor ?? 0) * s.degreesOfFreedom) / pooledDof : null,
    sigmaScale: stations.length === 1 ? stations[0]!.sigmaScale : 1,
    solutions: sum((s) => s.solutions),
    screeningComplete: stations.every((s) => s.screeningComplete),
  };
}
