/**
 * Variance components with satellite clocks estimated (scaleSigmas, the single-station default):
 * one set of observation-weight components for the whole network, re-estimated from every
 * station's residuals until they settle, as the single-station estimator does
 * (src/estimation/variance-components.ts).
 *
 * References: the simulator's own noise (σ0 = 3 mm, elevation weighting: its known truth), and a
 * fresh network solution with the final weights given as options (no re-weighting): the
 * re-weighted solution must equal it, which also checks that the kept reduced epochs were scaled
 * or formed again correctly.
 */

import { describe, expect, it } from 'vitest';
import { estimateNetwork } from '../../../src/estimation/network/estimate-network.js';
import { REWEIGHTING_TOLERANCE } from '../../../src/estimation/variance-components.js';
import type { NetworkEstimationOptions } from '../../../src/estimation/network/types.js';
import { networkOptions, smallNetwork, stationAt, toNetworkInput } from './network-simulator.js';

const MM = 0.001;
/** The simulator's observation noise: σ = σ0/sin e with σ0 = 3 mm (network-simulator.ts). */
const TRUE_SIGMA0_M = 3 * MM;
/** Same arithmetic up to rounding (a different order of the same sums). */
const SAME = 1e-9;

const sim = smallNetwork(
  29,
  [
    stationAt('ALDER', 47.1, 8.2, 0, 0),
    stationAt('BRISK', 47.1, 8.2, 90, 60),
    stationAt('COVE', 47.1, 8.2, 140, 200),
    stationAt('DUNE', 47.1, 8.2, 120, 300),
  ],
  2,
);

function expectSameSolution(a: ReturnType<typeof estimateNetwork>, b: ReturnType<typeof estimateNetwork>) {
  a.stations.forEach((r, s) => {
    const o = b.stations[s]!;
    r.zwdNodes.forEach((n, j) => {
      expect(Math.abs(n.correctionM - o.zwdNodes[j]!.correctionM)).toBeLessThan(SAME);
      expect(Math.abs(n.sigmaM / o.zwdNodes[j]!.sigmaM - 1)).toBeLessThan(SAME);
    });
    r.epochs.forEach((e, k) => expect(Math.abs(e.relativeSigmaM / o.epochs[k]!.relativeSigmaM - 1 || 0)).toBeLessThan(1e-6));
  });
}

describe('variance components with satellite clocks estimated (scaleSigmas)', () => {
  const base: Partial<NetworkEstimationOptions> = { parametrisation: 'nodes', correlatedNoise: false, outlierThreshold: 4 };

  it('"elevation": σ0 given twice too large is re-estimated near the simulated 3 mm, the variance factor ends near 1', () => {
    const out = estimateNetwork(toNetworkInput(sim, networkOptions({ ...base, sigma0M: 2 * TRUE_SIGMA0_M, scaleSigmas: true })));
    expect(out.satelliteClocks).toBe('estimated');
    expect(out.statistics.solutions).toBeGreaterThan(1);
    const b = out.statistics.weighting!.elevationM;
    // Noise of the estimate: ~2 000 residuals, σ of a variance estimate √(2/n) ≈ 3 %; 10 % leaves room.
    expect(Math.abs(b / TRUE_SIGMA0_M - 1)).toBeLessThan(0.1);
    expect(out.statistics.weighting!.constantM).toBe(0);
    expect(Math.abs(out.statistics.varianceFactor! - 1)).toBeLessThan(2 * REWEIGHTING_TOLERANCE);
    expect(out.statistics.sigmaScale).toBe(1);
    expect(out.warnings.some((w) => w.includes('variance factor') || w.includes('re-estimated'))).toBe(false);
    // Equal to the solution with the final σ0 given and no re-weighting (reduced epochs scaled, not formed again).
    const given = estimateNetwork(toNetworkInput(sim, networkOptions({ ...base, sigma0M: b, scaleSigmas: false })));
    expectSameSolution(out, given);
    // scaleSigmas off: the weights stay as given, the variance factor shows the 2× (≈ 1/4).
    const fixed = estimateNetwork(toNetworkInput(sim, networkOptions({ ...base, sigma0M: 2 * TRUE_SIGMA0_M, scaleSigmas: false })));
    expect(fixed.statistics.weighting!.elevationM).toBe(2 * TRUE_SIGMA0_M);
    expect(fixed.statistics.varianceFactor!).toBeLessThan(0.3);
  });

  it('"elevation-components": both components re-estimated (reduced epochs formed again); equal to the solution with them given', () => {
    const out = estimateNetwork(
      toNetworkInput(
        sim,
        networkOptions({
          ...base,
          weighting: 'elevation-components',
          sigma0M: 2 * TRUE_SIGMA0_M,
          sigmaConstantM: 2 * MM,
          scaleSigmas: true,
        }),
      ),
    );
    const w = out.statistics.weighting!;
    expect(w.constantM).not.toBe(2 * MM);
    // The simulated noise has no constant part: b carries it (within 10 %), a is small beside it.
    expect(Math.abs(w.elevationM / TRUE_SIGMA0_M - 1)).toBeLessThan(0.1);
    expect(w.constantM).toBeLessThan(w.elevationM);
    const given = estimateNetwork(
      toNetworkInput(
        sim,
        networkOptions({
          ...base,
          weighting: 'elevation-components',
          sigma0M: w.elevationM,
          sigmaConstantM: w.constantM,
          scaleSigmas: false,
        }),
      ),
    );
    expectSameSolution(out, given);
  });
});
