/**
 * `observationsNearby` of a node counts the same thing in the network as in the single-station
 * estimator (src/estimation/estimate.ts, the reference here): the used observations strictly within
 * one node interval of the node, |t − node| < Δ. With 60-s data and 300-s nodes the epochs on the
 * neighbouring nodes sit exactly at |t − node| = Δ, so a count with ≤ differs from this one.
 */

import { describe, expect, it } from 'vitest';
import { estimateNetwork } from '../../../src/estimation/network/estimate-network.js';
import { estimateZwd } from '../../../src/estimation/estimate.js';
import { networkOptions, smallNetwork, stationAt, toNetworkInput } from './network-simulator.js';

describe('observations near a node: the network counts as the single-station estimator', () => {
  it('agrees node by node for every station (satellite clocks estimated, no screening)', () => {
    const sim = smallNetwork(
      17,
      [stationAt('ALDER', 47.1, 8.2, 0, 0), stationAt('BRISK', 47.1, 8.2, 60, 60), stationAt('COVE', 47.1, 8.2, 80, 200)],
      1,
    );
    const options = networkOptions({ outlierThreshold: null, parametrisation: 'nodes', correlatedNoise: false, scaleSigmas: false });
    const net = estimateNetwork(toNetworkInput(sim, options));
    expect(net.satelliteClocks).toBe('estimated');
    // The observations the network uses: above the cutoff and of a satellite another station sees at that epoch.
    const o = sim.observations;
    const above = o.epochMs.map((_, i) => o.elevationRad[i]! >= options.elevationCutoffRad);
    const seenBy = new Map<string, number>();
    o.epochMs.forEach((t, i) => above[i] && seenBy.set(`${t} ${o.satellite[i]}`, (seenBy.get(`${t} ${o.satellite[i]}`) ?? 0) + 1));
    for (const r of net.stations) {
      const idx = o.station.flatMap((st, i) =>
        st === r.station && above[i] && seenBy.get(`${o.epochMs[i]} ${o.satellite[i]}`)! >= 2 ? [i] : [],
      );
      const single = estimateZwd({
        latitudeRad: sim.stations.find((s) => s.name === r.station)!.latitudeRad,
        observations: {
          epochMs: idx.map((i) => o.epochMs[i]!),
          satellite: idx.map((i) => o.satellite[i]!),
          elevationRad: idx.map((i) => o.elevationRad[i]!),
          azimuthRad: idx.map((i) => o.azimuthRad[i]!),
          residualM: idx.map((i) => o.residualM[i]!),
        },
        options,
      });
      expect(r.statistics.observationsUsed).toBe(idx.length);
      expect(r.zwdNodes.map((n) => n.epochMs)).toEqual(single.zwdNodes.map((n) => n.epochMs));
      expect(r.zwdNodes.map((n) => n.observationsNearby)).toEqual(single.zwdNodes.map((n) => n.observationsNearby));
      expect(r.gradientNodes.map((n) => n.observationsNearby)).toEqual(single.gradientNodes.map((n) => n.observationsNearby));
    }
  });
});
