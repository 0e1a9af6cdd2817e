/**
 * Satellite clocks known (precise point positioning): the network splits into independent
 * single-station problems (issue 12, common practice), so each station's result must equal the
 * single-station estimator's (src/estimation/estimate.ts) for that station's data and options.
 */

import { describe, expect, it } from 'vitest';
import { estimateNetwork } from '../../../src/estimation/network/estimate-network.js';
import { estimateZwd } from '../../../src/estimation/estimate.js';
import type { ZwdEstimationInput } from '../../../src/estimation/types.js';
import { networkOptions, simulateNetwork, stationAt, toNetworkInput, type NetworkSim } from './network-simulator.js';

const M = 1;
/** Same arithmetic up to rounding (issue 12: "to 1e-9 m"). */
const TOL = 1e-9 * M;

function sim(seed: number, grossErrors: number): NetworkSim {
  return simulateNetwork({
    seed,
    stations: [stationAt('ALDER', 47.1, 8.2, 0, 0), stationAt('BRISK', 47.1, 8.2, 120, 60), stationAt('COVE', 47.1, 8.2, 150, 200)],
    startIso: '2026-05-04T00:00:00Z',
    durationS: 3 * 3600,
    samplingS: 60,
    minElevationDeg: 3,
    sigma0M: 0.003,
    satellitesPerPlane: 5,
    zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.05 },
    gradients: { intervalS: 3600, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
    commonOffsetM: 0,
    receiverClockAmplitudeM: 300_000,
    satelliteClockAmplitudeM: 0,
    grossErrors,
  });
}

function stationInput(s: NetworkSim, name: string, options: ReturnType<typeof networkOptions>, withSigmas: boolean): ZwdEstimationInput {
  const o = s.observations;
  const idx = o.station.flatMap((st, i) => (st === name ? [i] : []));
  return {
    latitudeRad: s.stations.find((st) => st.name === name)!.latitudeRad,
    observations: {
      epochMs: idx.map((i) => o.epochMs[i]!),
      satellite: idx.map((i) => o.satellite[i]!),
      elevationRad: idx.map((i) => o.elevationRad[i]!),
      azimuthRad: idx.map((i) => o.azimuthRad[i]!),
      residualM: idx.map((i) => o.residualM[i]!),
      ...(withSigmas ? { sigmaM: idx.map((i) => o.sigmaM[i]!) } : {}),
    },
    options,
  };
}

function expectSameAsSingleStation(s: NetworkSim, options: ReturnType<typeof networkOptions>, withSigmas = false) {
  const net = estimateNetwork(toNetworkInput(s, options, withSigmas));
  expect(net.satelliteClocks).toBe('known');
  for (const r of net.stations) {
    const single = estimateZwd(stationInput(s, r.station, options, withSigmas));
    expect(r.zwdNodes.length).toBe(single.zwdNodes.length);
    r.zwdNodes.forEach((n, j) => {
      expect(n.epochMs).toBe(single.zwdNodes[j]!.epochMs);
      expect(Math.abs(n.correctionM - single.zwdNodes[j]!.correctionM)).toBeLessThan(TOL);
      expect(Math.abs(n.sigmaM - single.zwdNodes[j]!.sigmaM)).toBeLessThan(TOL);
    });
    r.gradientNodes.forEach((g, l) => {
      expect(Math.abs(g.northM - single.gradientNodes[l]!.northM)).toBeLessThan(TOL);
      expect(Math.abs(g.eastSigmaM - single.gradientNodes[l]!.eastSigmaM)).toBeLessThan(TOL);
    });
    expect(r.epochs.length).toBe(single.epochs.length);
    r.epochs.forEach((e, k) => {
      const o = single.epochs[k]!;
      expect(e.epochMs).toBe(o.epochMs);
      expect(Math.abs(e.correctionM - o.correctionM)).toBeLessThan(TOL);
      expect(Math.abs(e.sigmaM - o.sigmaM)).toBeLessThan(TOL);
      expect(Math.abs(e.northGradientM! - o.northGradientM!)).toBeLessThan(TOL);
      expect(Math.abs(e.eastGradientSigmaM! - o.eastGradientSigmaM!)).toBeLessThan(TOL);
      // Receiver clock = the single-station epoch bias (±300 km: 1e-9 relative).
      expect(Math.abs(e.epochBiasM! - o.epochBiasM!)).toBeLessThan(1e-6);
      expect(e.observationsUsed).toBe(o.observationsUsed);
    });
    expect(r.rejected.map((x) => x.satellite + x.epochMs)).toEqual(single.rejected.map((x) => x.satellite + x.epochMs));
    r.rejected.forEach((x, i) => expect(Math.abs(x.normalizedResidual - single.rejected[i]!.normalizedResidual)).toBeLessThan(1e-6));
    expect(r.statistics.observationsUsed).toBe(single.statistics.observationsUsed);
  }
  return net;
}

describe('point positioning: satellite clocks known = independent single-station solutions (issue 12)', () => {
  // Options: the single-station "nodes" parametrisation without correlated-noise inflation and
  // without variance-component re-weighting (scale_sigmas), which the network estimator does not have.
  it('equals estimateZwd per station, with gross errors screened', () => {
    const s = sim(11, 9);
    const net = expectSameAsSingleStation(s, networkOptions({ satelliteClocks: 'known' }));
    expect(net.statistics.observationsRejected).toBeGreaterThanOrEqual(9);
  });

  it('equals estimateZwd per station without gradients, one-per-solution screening, given sigmas', () => {
    const s = sim(12, 3);
    expectSameAsSingleStation(s, networkOptions({ satelliteClocks: 'known', gradients: null, outlierRejection: 'one-per-solution' }), true);
  });

  it('a network of one station with satellite clocks "estimated" equals the single-station solution, with a warning', () => {
    const s = sim(13, 0);
    const one: NetworkSim = { ...s, stations: [s.stations[0]!] };
    const keep = s.observations.station.flatMap((st, i) => (st === 'ALDER' ? [i] : []));
    const o = s.observations;
    one.observations = {
      station: keep.map((i) => o.station[i]!),
      epochMs: keep.map((i) => o.epochMs[i]!),
      satellite: keep.map((i) => o.satellite[i]!),
      elevationRad: keep.map((i) => o.elevationRad[i]!),
      azimuthRad: keep.map((i) => o.azimuthRad[i]!),
      residualM: keep.map((i) => o.residualM[i]!),
      sigmaM: keep.map((i) => o.sigmaM[i]!),
    };
    const options = networkOptions({ satelliteClocks: 'estimated' });
    const net = estimateNetwork(toNetworkInput(one, options));
    expect(net.satelliteClocks).toBe('known');
    expect(net.warnings.join(' ')).toMatch(/one station/);
    const single = estimateZwd(stationInput(one, 'ALDER', options, false));
    net.stations[0]!.zwdNodes.forEach((n, j) => expect(Math.abs(n.correctionM - single.zwdNodes[j]!.correctionM)).toBeLessThan(TOL));
  });
});
