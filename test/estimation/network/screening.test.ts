/**
 * Screening across the network keeps each epoch's reduced system between solutions and reduces
 * again only the epochs with a rejection (reduced-epochs.ts). Reference: a fresh solution of the
 * same data with the rejected observations removed from the input and screening off (nothing
 * cached; an independent run of the assembly): both are the least-squares solution of the same
 * observations, so they agree to rounding.
 */

import { describe, expect, it } from 'vitest';
import { estimateNetwork } from '../../../src/estimation/network/estimate-network.js';
import type { NetworkEstimationInput } from '../../../src/estimation/network/types.js';
import { networkOptions, simulateNetwork, stationAt, toNetworkInput } from './network-simulator.js';

const M = 1;
/** Same arithmetic up to rounding of sums in another order. */
const TOL = 1e-9 * M;

function withoutObservations(input: NetworkEstimationInput, drop: Set<number>): NetworkEstimationInput {
  const o = input.observations;
  const keep = o.epochMs.flatMap((_, i) => (drop.has(i) ? [] : [i]));
  const pick = <T>(c: readonly T[]) => keep.map((i) => c[i]!);
  return {
    ...input,
    observations: {
      station: pick(o.station),
      epochMs: pick(o.epochMs),
      satellite: pick(o.satellite),
      elevationRad: pick(o.elevationRad),
      azimuthRad: pick(o.azimuthRad),
      residualM: pick(o.residualM),
    },
    options: { ...input.options, outlierThreshold: null },
  };
}

describe('screening with reduced epochs kept between solutions', () => {
  it('the final solution equals a fresh solution without the rejected observations (ZWD, σ, relative σ, variance factor)', () => {
    const sim = simulateNetwork({
      seed: 81,
      stations: [
        stationAt('HOLLOWAY', 50, 6, 0, 0),
        stationAt('IVYBRIDGE', 50, 6, 120, 45),
        stationAt('JUNIPER', 50, 6, 180, 200),
        stationAt('KESTREL', 50, 6, 90, 300),
      ],
      startIso: '2026-03-03T00:00:00Z',
      durationS: 3 * 3600,
      samplingS: 60,
      minElevationDeg: 7,
      sigma0M: 0.003,
      satellitesPerPlane: 6,
      zwd: { intervalS: 600, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.05 },
      gradients: { intervalS: 3600, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
      commonOffsetM: 0,
      receiverClockAmplitudeM: 1000,
      satelliteClockAmplitudeM: 1000,
      grossErrors: 12,
    });
    const input = toNetworkInput(sim, networkOptions({ zwd: { intervalS: 600, randomWalkMPerSqrtH: 0.01, aprioriSigmaM: 0.5 } }));
    const screened = estimateNetwork(input);
    expect(screened.statistics.solutions).toBeGreaterThan(2);
    expect(screened.statistics.observationsRejected).toBeGreaterThanOrEqual(10);
    const rejected = new Set(screened.stations.flatMap((s) => s.rejected.map((r) => r.index)));
    const fresh = estimateNetwork(withoutObservations(input, rejected));
    expect(fresh.statistics.solutions).toBe(1);
    expect(fresh.statistics.observationsUsed).toBe(screened.statistics.observationsUsed);
    expect(Math.abs(fresh.statistics.varianceFactor! - screened.statistics.varianceFactor!)).toBeLessThan(1e-9);
    screened.stations.forEach((st, s) => {
      const other = fresh.stations[s]!;
      st.zwdNodes.forEach((n, j) => {
        expect(Math.abs(n.correctionM - other.zwdNodes[j]!.correctionM)).toBeLessThan(TOL);
        expect(Math.abs(n.sigmaM - other.zwdNodes[j]!.sigmaM)).toBeLessThan(TOL);
      });
      st.epochs.forEach((e, k) => expect(Math.abs(e.relativeSigmaM - other.epochs[k]!.relativeSigmaM)).toBeLessThan(TOL));
    });
  });
});
