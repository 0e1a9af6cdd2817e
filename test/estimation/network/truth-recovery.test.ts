/**
 * Truth recovery (issue 12): a seeded 10-station, 1-day simulation (a regional cluster and distant
 * stations, σ0 = 3 mm with σ0/sin e weighting and gross errors as in the single-station validation)
 * with satellite and receiver clocks estimated. The ZWD differences to the reference station must
 * have a normalised estimation error squared (NEES, mean of (error/σ)²) in 0.5–2: the formal errors
 * describe the actual errors (common practice for a consistency check). The truth is a random walk at
 * every epoch, so the 1-h nodes' missing variance (interpolation-variance.ts) is part of the check.
 */

import { describe, expect, it } from 'vitest';
import { estimateNetwork } from '../../../src/estimation/network/estimate-network.js';
import { networkOptions, simulateNetwork, stationAt, toNetworkInput, truthZwd } from './network-simulator.js';

const C = [50.2, 4.6] as const;

describe('10 stations, 1 day, clocks estimated: NEES of ZWD differences to the reference station', () => {
  const sim = simulateNetwork({
    seed: 41,
    stations: [
      stationAt('PENROSE', ...C, 0, 0),
      stationAt('QUARRY', ...C, 120, 20),
      stationAt('RUSHMERE', ...C, 180, 100),
      stationAt('SALTCOTE', ...C, 90, 170),
      stationAt('TARNWICK', ...C, 200, 250),
      stationAt('UPLANDS', ...C, 140, 320),
      stationAt('VALEHEAD', ...C, 600, 60),
      stationAt('WESTHOLT', ...C, 2100, 230),
      stationAt('YARROWBY', ...C, 3500, 120),
      stationAt('ZEALCOMBE', ...C, 5200, 290),
    ],
    startIso: '2026-09-10T00:00:00Z',
    durationS: 86_400,
    samplingS: 120,
    minElevationDeg: 3,
    sigma0M: 0.003,
    satellitesPerPlane: 5,
    // The truth is a random walk at every epoch (the estimator's own prior), not piecewise linear on
    // the estimator's nodes: its variation between the 1-h nodes must be in the formal errors.
    zwd: { intervalS: 120, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.05 },
    gradients: { intervalS: 120, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
    commonOffsetM: 0,
    receiverClockAmplitudeM: 300_000,
    satelliteClockAmplitudeM: 300_000,
    grossErrors: 20,
  });
  const out = estimateNetwork(
    toNetworkInput(
      sim,
      networkOptions({
        referenceStation: 'PENROSE',
        zwd: { intervalS: 3600, randomWalkMPerSqrtH: 0.01, aprioriSigmaM: 0.5 },
        scaleSigmas: true,
        // The route's default: the network solves on nodes of at most 300 s (ZWD) and 1 800 s
        // (gradients) and reports the 1-h output nodes from them.
        parametrisation: 'every-epoch',
      }),
    ),
  );

  it('NEES of node differences in 0.5–2; absolute NEES too', () => {
    const ref = 0;
    let nees = 0;
    let neesAbs = 0;
    let n = 0;
    let nAbs = 0;
    out.stations.forEach((st, s) => {
      st.zwdNodes.forEach((node, j) => {
        const err = node.correctionM - truthZwd(sim, s, node.epochMs);
        neesAbs += (err / node.sigmaM) ** 2;
        nAbs++;
        if (s === ref) return;
        const errRef = out.stations[ref]!.zwdNodes[j]!.correctionM - truthZwd(sim, ref, node.epochMs);
        nees += ((err - errRef) / node.relativeSigmaM!) ** 2;
        n++;
      });
    });
    nees /= n;
    neesAbs /= nAbs;
    expect(n).toBe(9 * 25);
    expect(nees).toBeGreaterThan(0.5);
    expect(nees).toBeLessThan(2);
    expect(neesAbs).toBeGreaterThan(0.5);
    expect(neesAbs).toBeLessThan(2);
  });

  it('flags the injected gross errors (false alarms within what Gaussian noise gives at k = 4) and keeps the variance factor near 1', () => {
    const rejected = new Set(out.stations.flatMap((s) => s.rejected.map((r) => r.index)));
    const caught = sim.grossErrorIndices.filter((i) => rejected.has(i)).length;
    // A gross error on a satellite that no other station sees at that epoch carries no information and is dropped instead.
    const dropped = sim.grossErrorIndices.length - caught;
    expect(dropped).toBeLessThanOrEqual(2);
    // Gaussian noise alone puts |τ| above k = 4 with probability 2 Φ(−4) = 6.33e-5 (normal tables);
    // the false alarms are then Poisson with λ = that × the observations used (about 4 here): at
    // most its 99.9 % quantile (common practice).
    const lambda = 6.33e-5 * out.statistics.observationsUsed;
    expect(rejected.size - caught).toBeLessThanOrEqual(poissonQuantile(lambda, 0.999));
    expect(out.statistics.varianceFactor!).toBeGreaterThan(0.9);
    expect(out.statistics.varianceFactor!).toBeLessThan(1.1);
  });
});

/** Smallest c with P(X ≤ c) ≥ p for X ~ Poisson(λ). */
function poissonQuantile(lambda: number, p: number): number {
  let term = Math.exp(-lambda);
  let sum = term;
  let c = 0;
  while (sum < p) {
    c++;
    term *= lambda / c;
    sum += term;
  }
  return c;
}
