/**
 * Satellite clocks known (precise point positioning): the network splits into independent
 * single-station problems (issue 12, common practice), so each station's result must equal the
 * single-station estimator's (src/estimation/estimate.ts) for that station's data and options.
 */

import { describe, expect, it } from 'vitest';
import { estimateNetwork } from '../../../src/estimation/network/estimate-network.js';
import { estimateZwd } from '../../../src/estimation/estimate.js';
import type { ZwdEstimationInput } from '../../../src/estimation/types.js';
import type { NetworkEstimationOptions } from '../../../src/estimation/network/types.js';
import { DEFAULT_ZWD_OPTIONS } from '../../../src/services/zwd-options.js';
import { toEstimatorOptions } from '../../../src/services/zwd-estimation.js';
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

function stationInput(s: NetworkSim, name: string, options: NetworkEstimationOptions, withSigmas: boolean): ZwdEstimationInput {
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

function expectSameAsSingleStation(s: NetworkSim, options: NetworkEstimationOptions, withSigmas = false) {
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
    // Every warning of the single-station solution reaches the network result, naming the station.
    for (const w of single.warnings) expect(net.warnings).toContain(`station ${r.station}: ${w}`);
  }
  return net;
}

/** The single-station route's default options (src/services/zwd-options.ts), satellite clocks known. */
function routeDefaults(): NetworkEstimationOptions {
  return { ...toEstimatorOptions(DEFAULT_ZWD_OPTIONS), satelliteClocks: 'known', referenceStation: null, commonModeSigmaThresholdM: 0.005 };
}

describe('point positioning: satellite clocks known = independent single-station solutions (issue 12)', () => {
  // The network with satellite clocks known runs the single-station estimator per station, so any
  // options give the same numbers: the simulator's "nodes" options and the route's defaults.
  it('equals estimateZwd per station, with gross errors screened', () => {
    const s = sim(11, 9);
    const net = expectSameAsSingleStation(s, networkOptions({ satelliteClocks: 'known' }));
    expect(net.statistics.observationsRejected).toBeGreaterThanOrEqual(9);
  });

  it('with the single-station route defaults (states at every epoch, variance components, correlated-noise inflation): equal, and no note that the network differs', () => {
    const s = sim(14, 4);
    const options = routeDefaults();
    expect(options.parametrisation).toBe('every-epoch');
    expect(options.correlatedNoise).toBe(true);
    expect(options.scaleSigmas).toBe(true);
    const net = expectSameAsSingleStation(s, options);
    expect(net.warnings.join(' ')).not.toMatch(/piecewise-linear nodes|not inflated|not re-estimated/);
    // Relative σ of independent stations: σ² = σ_s² + σ_ref² at common epochs (common practice).
    const ref = net.stations.find((r) => r.station === net.referenceStation)!;
    for (const r of net.stations) {
      r.epochs.forEach((e, k) => {
        const expected = r === ref ? 0 : Math.hypot(e.sigmaM, ref.epochs[k]!.sigmaM);
        expect(Math.abs(e.relativeSigmaM - expected)).toBeLessThan(TOL);
      });
    }
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
    const options: NetworkEstimationOptions = { ...routeDefaults(), satelliteClocks: 'estimated' };
    const net = estimateNetwork(toNetworkInput(one, options));
    expect(net.satelliteClocks).toBe('known');
    expect(net.warnings.join(' ')).toMatch(/one station/);
    const single = estimateZwd(stationInput(one, 'ALDER', options, false));
    expect(net.stations[0]!.zwdNodes.length).toBe(single.zwdNodes.length);
    net.stations[0]!.zwdNodes.forEach((n, j) => {
      expect(Math.abs(n.correctionM - single.zwdNodes[j]!.correctionM)).toBeLessThan(TOL);
      expect(Math.abs(n.sigmaM - single.zwdNodes[j]!.sigmaM)).toBeLessThan(TOL);
    });
    expect(net.warnings.join(' ')).not.toMatch(/piecewise-linear nodes/);
  });
});
