/**
 * Digests of the estimators' whole outputs on fixed inputs, for changes that must not move a bit (storage
 * types, arrays shared or dropped, passes reordered without reordering a sum): the benchmark days (the
 * GPS-like day and the four-constellation day of bench/estimation.bench.ts) with the default options and
 * the variants whose storage differs (caller's sigmas, some of them, none; input out of epoch order;
 * piecewise-linear nodes; no gradients; no epoch biases; the other weighting schemes and screening mode),
 * and two small networks (the network estimator shares the design, the variance components and the
 * correlated-noise step). A digest is SHA-256 of the output as JSON, numbers as their shortest round-trip
 * text (so bit for bit), non-finite numbers as strings.
 *
 * The cases take the estimators as arguments, so that the same cases run against an older source tree
 * (`git archive <commit> src | tar -x -C <dir>`, then import its estimate.ts) to record the expected digests.
 */

import { createHash } from 'node:crypto';
import { generateSyntheticResiduals } from '../../scripts/synthetic-residuals.js';
import type { estimateZwd as EstimateZwd } from '../../src/estimation/estimate.js';
import type { estimateNetwork as EstimateNetwork } from '../../src/estimation/network/estimate-network.js';
import type { ZwdEstimationInput } from '../../src/estimation/types.js';
import { networkOptions, smallNetwork, stationAt, toNetworkInput } from '../estimation/network/network-simulator.js';
import { simulateSky } from './realistic-sky.js';
import { skyInput, toEstimationInput } from './synthetic-input.js';

/** SHA-256 (hex) of a value as JSON, numbers bit for bit (shortest round-trip text), NaN and ±Infinity as strings. */
export function outputDigest(value: unknown): string {
  const text = JSON.stringify(value, (_key, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? String(v) : v));
  return createHash('sha256').update(text).digest('hex');
}

/** The input's observations in another order (a fixed permutation: index k·7919 mod n, 7919 prime). */
function shuffled(input: ZwdEstimationInput): ZwdEstimationInput {
  const n = input.observations.epochMs.length;
  const order = Array.from({ length: n }, (_, k) => (k * 7919) % n);
  const pick = <T>(column: readonly T[]) => order.map((i) => column[i]!);
  const o = input.observations;
  return {
    ...input,
    observations: {
      epochMs: pick(o.epochMs),
      satellite: pick(o.satellite),
      elevationRad: pick(o.elevationRad),
      azimuthRad: pick(o.azimuthRad),
      residualM: pick(o.residualM),
      ...(o.sigmaM ? { sigmaM: pick(o.sigmaM) } : {}),
    },
  };
}

/** Each satellite renamed per hour of the day (`G07-13`): an arc per hour, and on a GPS-like day more than 256 names. */
export function namedPerHour(input: ZwdEstimationInput): ZwdEstimationInput {
  const o = input.observations;
  return {
    ...input,
    observations: { ...o, satellite: o.satellite.map((name, i) => `${name}-${Math.floor(o.epochMs[i]! / 3_600_000) % 24}`) },
  };
}

/** Named cases: each runs an estimator on its input and returns the output. */
export function digestCases(estimateZwd: typeof EstimateZwd, estimateNetwork: typeof EstimateNetwork): Record<string, () => unknown> {
  const gps = simulateSky({ seed: 11, durationS: 86_400, grossErrors: 25, constellations: ['gps'] });
  const generated = generateSyntheticResiduals({ durationS: 86_400, latitudeDeg: 46.2 });
  const withSigmas = (options = {}) => toEstimationInput(generated, 46.2, { scaleSigmas: true, ...options }, true);
  return {
    'GPS-like day, defaults': () => estimateZwd(skyInput(gps)),
    'four-constellation day, defaults': () => estimateZwd(skyInput(simulateSky({ seed: 11, durationS: 86_400, grossErrors: 100 }))),
    'GPS-like day, one-per-solution screening': () =>
      estimateZwd(skyInput(gps, { outlierRejection: 'one-per-solution', maxRejections: 10 })),
    'GPS-like day, elevation-components': () => estimateZwd(skyInput(gps, { weighting: 'elevation-components' })),
    'GPS-like day, uniform weights': () => estimateZwd(skyInput(gps, { weighting: 'uniform' })),
    'GPS-like day, nodes': () => estimateZwd(skyInput(gps, { parametrisation: 'nodes' })),
    'GPS-like day, no gradients': () => estimateZwd(skyInput(gps, { gradients: null })),
    'GPS-like day, no epoch biases': () => estimateZwd(skyInput(gps, { epochBias: false })),
    'GPS-like day, out of epoch order': () => estimateZwd(shuffled(skyInput(gps))),
    'GPS-like day, a satellite name per hour (more than 256 names)': () => estimateZwd(namedPerHour(skyInput(gps))),
    'generated day, no sigmas': () => estimateZwd(toEstimationInput(generated, 46.2, { scaleSigmas: true })),
    "generated day, caller's sigmas": () => estimateZwd(withSigmas()),
    "generated day, caller's sigmas, elevation-components": () => estimateZwd(withSigmas({ weighting: 'elevation-components' })),
    "generated day, a third without caller's sigmas": () => {
      const input = withSigmas();
      input.observations.sigmaM = input.observations.sigmaM!.map((s, k) => (k % 3 === 0 ? null : s));
      return estimateZwd(input);
    },
    'network of three, nodes, gross errors': () => {
      const stations = [stationAt('A', 46.8, 9.1, 0, 0), stationAt('B', 46.8, 9.1, 120, 40), stationAt('C', 46.8, 9.1, 90, 200)];
      return estimateNetwork(toNetworkInput(smallNetwork(3, stations, 6, { grossErrors: 4 }), networkOptions({ scaleSigmas: true })));
    },
    "network of two, every epoch, correlated noise, caller's sigmas": () => {
      const stations = [stationAt('A', 46.8, 9.1, 0, 0), stationAt('B', 46.8, 9.1, 120, 40)];
      const options = networkOptions({ scaleSigmas: true, parametrisation: 'every-epoch', correlatedNoise: true });
      return estimateNetwork(toNetworkInput(smallNetwork(4, stations, 6, { grossErrors: 3 }), options, true));
    },
  };
}
