/**
 * Clocks pre-eliminated epoch by epoch = double differences with their full covariance = all
 * clocks as explicit parameters (issue 12 "Equivalence"; common practice: the double differences
 * are one way of eliminating the clocks). References: test/estimation/network/dense-network.ts
 * (ml-matrix, no code shared with src/estimation). Tolerances from the issue: 1e-6 m in ZWD, 1 % in σ.
 */

import { describe, expect, it } from 'vitest';
import { estimateNetwork } from '../../../src/estimation/network/estimate-network.js';
import type { NetworkEstimationInput, NetworkEstimationOutput } from '../../../src/estimation/network/types.js';
import { denseDoubleDifference, denseZeroDifference, type DenseNetworkResult } from './dense-network.js';
import { networkOptions, simulateNetwork, stationAt, toNetworkInput, type NetworkSim } from './network-simulator.js';

const M = 1;
const ZWD_TOL = 1e-6 * M;
const SIGMA_REL_TOL = 0.01;
const DEG = Math.PI / 180;

function smallNetwork(seed: number, stations: number, hours: number, clockAmplitudeM = 300_000): NetworkSim {
  const all = [
    stationAt('ALDER', 46.8, 9.1, 0, 0),
    stationAt('BRISK', 46.8, 9.1, 140, 30),
    stationAt('COVE', 46.8, 9.1, 110, 160),
    stationAt('DUNMERE', 46.8, 9.1, 150, 280),
    stationAt('ELMSTEAD', 46.8, 9.1, 90, 220),
  ];
  return simulateNetwork({
    seed,
    stations: all.slice(0, stations),
    startIso: '2026-06-20T10:00:00Z',
    durationS: hours * 3600,
    samplingS: 120,
    minElevationDeg: 3,
    sigma0M: 0.003,
    satellitesPerPlane: 5,
    zwd: { intervalS: 900, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.05 },
    gradients: { intervalS: 1800, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
    commonOffsetM: 0.02,
    receiverClockAmplitudeM: clockAmplitudeM,
    satelliteClockAmplitudeM: clockAmplitudeM,
    grossErrors: 0,
  });
}

/** Keeps satellites seen (above the cutoff) by every station at the epoch; then leaves `lonely` of them to one station only. */
function commonSatellitesOnly(
  input: NetworkEstimationInput,
  lonely: number,
): { input: NetworkEstimationInput; lonelyObservations: number } {
  const o = input.observations;
  const S = input.stations.length;
  const seen = new Map<string, number>();
  o.epochMs.forEach((t, i) => {
    if (o.elevationRad[i]! >= input.options.elevationCutoffRad)
      seen.set(`${t}/${o.satellite[i]}`, (seen.get(`${t}/${o.satellite[i]}`) ?? 0) + 1);
  });
  const epochs = [...new Set(o.epochMs)].sort((a, b) => a - b);
  // At `lonely` epochs, one common satellite keeps only the first station's observation.
  const lonelyKeys = new Set<string>();
  for (let e = 3; e < epochs.length && lonelyKeys.size < lonely; e += 2) {
    const t = epochs[e]!;
    const i = o.epochMs.findIndex((tt, ii) => tt === t && seen.get(`${t}/${o.satellite[ii]}`) === S && o.elevationRad[ii]! > 20 * DEG);
    if (i >= 0) lonelyKeys.add(`${t}/${o.satellite[i]}`);
  }
  const keep: number[] = [];
  o.epochMs.forEach((t, i) => {
    const key = `${t}/${o.satellite[i]}`;
    if (o.elevationRad[i]! < input.options.elevationCutoffRad || seen.get(key) !== S) return;
    if (lonelyKeys.has(key) && o.station[i] !== input.stations[0]!.name) return;
    keep.push(i);
  });
  const pick = <T>(c: T[]) => keep.map((i) => c[i]!);
  return {
    input: {
      ...input,
      observations: {
        station: pick(o.station),
        epochMs: pick(o.epochMs),
        satellite: pick(o.satellite),
        elevationRad: pick(o.elevationRad),
        azimuthRad: pick(o.azimuthRad),
        residualM: pick(o.residualM),
      },
    },
    lonelyObservations: lonelyKeys.size,
  };
}

function expectEqual(
  net: NetworkEstimationOutput,
  dense: Omit<DenseNetworkResult, 'tau' | 'varianceFactor' | 'degreesOfFreedom' | 'clockCorrelation'>,
) {
  net.stations.forEach((st, s) => {
    st.zwdNodes.forEach((n, j) => {
      expect(Math.abs(n.correctionM - dense.zwdM[s]![j]!)).toBeLessThan(ZWD_TOL);
      expect(Math.abs(n.sigmaM / dense.zwdSigmaM[s]![j]! - 1)).toBeLessThan(SIGMA_REL_TOL);
      if (s > 0) expect(Math.abs(n.relativeSigmaM! / dense.relativeSigmaM[s]![j]! - 1)).toBeLessThan(SIGMA_REL_TOL);
    });
    st.gradientNodes.forEach((g, l) => {
      expect(Math.abs(g.northM - dense.northM[s]![l]!)).toBeLessThan(ZWD_TOL);
      expect(Math.abs(g.northSigmaM / dense.northSigmaM[s]![l]! - 1)).toBeLessThan(SIGMA_REL_TOL);
    });
  });
  const sorted = dense.meanSigmaM.slice().sort((a, b) => a - b);
  const h = Math.floor(sorted.length / 2);
  const median = sorted.length % 2 ? sorted[h]! : (sorted[h - 1]! + sorted[h]!) / 2;
  expect(Math.abs(net.commonMode.meanZwdSigmaClocksEstimatedM! / median - 1)).toBeLessThan(SIGMA_REL_TOL);
}

describe('double differences with their full covariance (dense, ml-matrix)', () => {
  it('4 stations, 1 h: equal to 1e-6 m and 1 % in σ, also relative σ and the σ of the network mean; lonely satellites dropped with a count', () => {
    const sim = smallNetwork(21, 4, 1);
    const { input, lonelyObservations } = commonSatellitesOnly(
      toNetworkInput(sim, networkOptions({ outlierThreshold: null, referenceStation: 'ALDER' })),
      4,
    );
    expect(lonelyObservations).toBe(4);
    const net = estimateNetwork(input);
    expect(net.statistics.singleStationSatellites).toBe(4);
    expect(net.statistics.observationsSingleStationSatellite).toBe(4);
    expect(net.stations[0]!.statistics.observationsSingleStationSatellite).toBe(4);
    expectEqual(net, denseDoubleDifference(input, 0));
  });

  it('3 stations, 2 h, without gradients: equal', () => {
    const sim = smallNetwork(22, 3, 2);
    const { input } = commonSatellitesOnly(
      toNetworkInput(sim, networkOptions({ outlierThreshold: null, gradients: null, referenceStation: 'ALDER' })),
      0,
    );
    expectEqual(estimateNetwork(input), denseDoubleDifference(input, 0));
  });
});

// The dense zero-difference reference carries the clocks as unknowns, so with ±300 km clocks it
// loses digits itself (3e-6 m measured against the double differences' 1e-8 m): its tests use ±1 km clocks,
// and a separate test shows the estimator's troposphere does not move with the clocks.
describe('all clocks as explicit parameters (dense zero differences, ml-matrix)', () => {
  it('5 stations, 1 h, every satellite as seen (partly shared, some by one station): equal, variance factor and degrees of freedom too', () => {
    const sim = smallNetwork(23, 5, 1, 1000);
    const input = toNetworkInput(sim, networkOptions({ outlierThreshold: null, referenceStation: 'ALDER' }));
    const dense = denseZeroDifference(input, 0);
    const net = estimateNetwork(input);
    expectEqual(net, dense);
    expect(net.statistics.degreesOfFreedom).toBe(dense.degreesOfFreedom);
    // The common-mode diagnostic: correlation of the network mean with the mean clock term (datum-free).
    expect(Math.abs(net.commonMode.correlationWithClocks! - dense.clockCorrelation)).toBeLessThan(1e-6);
    expect(Math.abs(dense.clockCorrelation)).toBeGreaterThan(0.5);
    expect(Math.abs(net.statistics.varianceFactor! / dense.varianceFactor - 1)).toBeLessThan(1e-6);
  });

  it('the normalised residual of the first rejection equals the dense largest |τ| (σ_v through both clock eliminations)', () => {
    const sim = smallNetwork(24, 4, 1, 1000);
    const input = toNetworkInput(sim, networkOptions({ outlierThreshold: null, referenceStation: 'ALDER' }));
    // A gross error of 0.05 m on one observation at 40°+.
    const o = input.observations;
    const i = o.elevationRad.findIndex((e, k) => e > 40 * DEG && k > 200);
    o.residualM[i]! += 0.05;
    const dense = denseZeroDifference(input, 0);
    let best = -1;
    dense.tau.forEach((t, k) => {
      if (!Number.isNaN(t) && (best < 0 || Math.abs(t) > Math.abs(dense.tau[best]!))) best = k;
    });
    expect(best).toBe(i);
    const screened = estimateNetwork({
      ...input,
      options: { ...input.options, outlierThreshold: 1e-6, outlierRejection: 'one-per-solution', maxRejections: 1 },
    });
    const first = screened.stations.flatMap((s) => s.rejected)[0]!;
    expect(first.index).toBe(i);
    expect(Math.abs(first.normalizedResidual / dense.tau[i]! - 1)).toBeLessThan(1e-6);
  });
});

describe('clock invariance (common practice: anything in the span of the clocks leaves the troposphere unchanged)', () => {
  it('±300 km clocks and no clocks give the same ZWD to 1e-8 m and the same σ', () => {
    const options = networkOptions({ outlierThreshold: null, referenceStation: 'ALDER' });
    const big = estimateNetwork(toNetworkInput(smallNetwork(25, 5, 1, 300_000), options));
    const none = estimateNetwork(toNetworkInput(smallNetwork(25, 5, 1, 0), options));
    big.stations.forEach((st, s) =>
      st.zwdNodes.forEach((n, j) => {
        expect(Math.abs(n.correctionM - none.stations[s]!.zwdNodes[j]!.correctionM)).toBeLessThan(1e-8 * M);
        expect(Math.abs(n.sigmaM / none.stations[s]!.zwdNodes[j]!.sigmaM - 1)).toBeLessThan(1e-9);
      }),
    );
  });
});
