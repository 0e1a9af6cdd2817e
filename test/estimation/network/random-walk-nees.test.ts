/**
 * Honest σ with the satellite clocks estimated (issue 12 with issue 10's random-walk truth): the
 * truth of every station is a random walk at every epoch with the estimator's own densities
 * (ZWD 10 mm/√h, gradients 1 mm/√h), sampled by the seeded simulator (network-simulator.ts, which
 * shares no code with src/estimation), and the network solves on piecewise-linear nodes. The
 * normalised estimation error squared (NEES, mean of (error/σ)²; 1 for honest formal errors, 0.5–2
 * accepted: common practice for a consistency check) of ZWD per epoch, of ZWD differences to the
 * reference station per epoch, of the gradients per epoch and of the ZWD output nodes, at three
 * node spacings and with the route's default (nodes of at most 300 s / 1 800 s, output every hour).
 *
 * The network: four stations within 160 km and two 2 400 and 4 100 km away (so the absolute level
 * is determined), 12 h of 60-s data, ±300 km clocks, two seeds pooled per case.
 */

import { describe, expect, it } from 'vitest';
import { piecewiseLinear } from '../../../scripts/synthetic-residuals.js';
import { provenance } from '../../../src/domain/provenance.js';
import { estimateNetwork } from '../../../src/estimation/network/estimate-network.js';
import type { NetworkEstimationOptions } from '../../../src/estimation/network/types.js';
import { networkModels } from '../../../src/services/network-estimation.js';
import { DEFAULT_ZWD_OPTIONS } from '../../../src/services/zwd-options.js';
import { networkOptions, simulateNetwork, stationAt, toNetworkInput, truthZwd, type NetworkSim } from './network-simulator.js';

const C = [52.3, 7.9] as const;
const SAMPLING_S = 60;
const HOURS = 12;

function randomWalkNetwork(seed: number): NetworkSim {
  return simulateNetwork({
    seed,
    stations: [
      stationAt('AMBERLEY', ...C, 0, 0),
      stationAt('BROCKHOLE', ...C, 130, 40),
      stationAt('CRANMOOR', ...C, 160, 150),
      stationAt('DAWLISH', ...C, 110, 260),
      stationAt('EASTERBY', ...C, 2400, 100),
      stationAt('FOXLEY', ...C, 4100, 250),
    ],
    startIso: '2026-03-02T00:00:00Z',
    durationS: HOURS * 3600,
    samplingS: SAMPLING_S,
    minElevationDeg: 3,
    sigma0M: 0.003,
    satellitesPerPlane: 5,
    // Nodes at every epoch of the simulation: the truth is the random walk itself.
    zwd: { intervalS: SAMPLING_S, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.05 },
    gradients: { intervalS: SAMPLING_S, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
    commonOffsetM: 0,
    receiverClockAmplitudeM: 300_000,
    satelliteClockAmplitudeM: 300_000,
    grossErrors: 0,
  });
}

interface Nees {
  absolute: number;
  relative: number;
  gradients: number;
  nodes: number;
}

function neesOf(sims: NetworkSim[], options: Partial<NetworkEstimationOptions>): Nees {
  const sum = { absolute: 0, relative: 0, gradients: 0, nodes: 0 };
  const count = { absolute: 0, relative: 0, gradients: 0, nodes: 0 };
  for (const sim of sims) {
    const out = estimateNetwork(
      toNetworkInput(sim, networkOptions({ referenceStation: 'AMBERLEY', outlierThreshold: null, scaleSigmas: false, ...options })),
    );
    const truthGradient = (nodes: number[], t: number) => piecewiseLinear(nodes, sim.firstEpochMs, SAMPLING_S * 1000, t);
    const refError = new Map(out.stations[0]!.epochs.map((e) => [e.epochMs, e.correctionM - truthZwd(sim, 0, e.epochMs)]));
    const endMs = sim.firstEpochMs + HOURS * 3_600_000;
    out.stations.forEach((st, s) => {
      const truth = sim.truth[s]!;
      for (const e of st.epochs) {
        const error = e.correctionM - truthZwd(sim, s, e.epochMs);
        sum.absolute += (error / e.sigmaM) ** 2;
        count.absolute++;
        if (s > 0) {
          sum.relative += ((error - refError.get(e.epochMs)!) / e.relativeSigmaM) ** 2;
          count.relative++;
        }
        sum.gradients +=
          ((e.northGradientM! - truthGradient(truth.northNodesM, e.epochMs)) / e.northGradientSigmaM!) ** 2 +
          ((e.eastGradientM! - truthGradient(truth.eastNodesM, e.epochMs)) / e.eastGradientSigmaM!) ** 2;
        count.gradients += 2;
      }
      for (const n of st.zwdNodes) {
        if (n.epochMs < sim.firstEpochMs || n.epochMs > endMs) continue;
        sum.nodes += ((n.correctionM - truthZwd(sim, s, n.epochMs)) / n.sigmaM) ** 2;
        count.nodes++;
      }
    });
  }
  return {
    absolute: sum.absolute / count.absolute,
    relative: sum.relative / count.relative,
    gradients: sum.gradients / count.gradients,
    nodes: sum.nodes / count.nodes,
  };
}

function expectHonest(nees: Nees): void {
  for (const value of Object.values(nees)) {
    expect(value).toBeGreaterThan(0.5);
    expect(value).toBeLessThan(2);
  }
}

describe('random-walk truth, satellite clocks estimated: NEES in 0.5–2', () => {
  const sims = [randomWalkNetwork(5), randomWalkNetwork(6)];
  const spacing = (zwdS: number, gradientS: number): Partial<NetworkEstimationOptions> => ({
    parametrisation: 'nodes',
    zwd: { intervalS: zwdS, randomWalkMPerSqrtH: 0.01, aprioriSigmaM: 0.5 },
    gradients: { intervalS: gradientS, randomWalkMPerSqrtH: 0.001, aprioriSigmaM: 0.01 },
  });

  it('5-min ZWD nodes, 30-min gradient nodes', () => {
    expectHonest(neesOf(sims, spacing(300, 1800)));
  });

  it('15-min ZWD and gradient nodes', () => {
    expectHonest(neesOf(sims, spacing(900, 900)));
  });

  it('1-h ZWD and gradient nodes (the random walk between nodes is most of σ)', () => {
    const nees = neesOf(sims, spacing(3600, 3600));
    expectHonest(nees);
  });

  it('nodes at every epoch (60 s, a random-walk state at every epoch): nothing added, and honest', () => {
    expectHonest(neesOf(sims, spacing(SAMPLING_S, SAMPLING_S)));
  });

  it('the default (states at every epoch asked): nodes of 300 s / 1 800 s, hourly and 6-hourly output nodes', () => {
    expectHonest(
      neesOf(sims, {
        parametrisation: 'every-epoch',
        zwd: { intervalS: 3600, randomWalkMPerSqrtH: 0.01, aprioriSigmaM: 0.5 },
        gradients: { intervalS: 21_600, randomWalkMPerSqrtH: 0.001, aprioriSigmaM: 0.01 },
      }),
    );
  });
});

describe('the result states its parametrisation', () => {
  it('states at every epoch asked: model nodes every 300 s (ZWD) and 1 800 s (gradients), named in the result, no warning', () => {
    const sim = randomWalkNetwork(7);
    const out = estimateNetwork(toNetworkInput(sim, networkOptions({ outlierThreshold: null, parametrisation: 'every-epoch' })));
    expect(out.parametrisation).toMatchObject({ zwdNodeIntervalS: 300, gradientNodeIntervalS: 1800 });
    expect(out.parametrisation!.statement).toContain('ZWD every 300 s, gradients every 1800 s');
    expect(out.parametrisation!.statement).toContain('network-interpolation-variance-1');
    expect(out.warnings.filter((w) => /every epoch|parametrisation/.test(w))).toEqual([]);
    // Output nodes on the caller's spacing (6 h for the gradients), taken from the 30-min model nodes.
    expect(out.stations[0]!.gradientNodes.map((g) => new Date(g.epochMs).toISOString())).toEqual([
      '2026-03-02T00:00:00.000Z',
      '2026-03-02T06:00:00.000Z',
      '2026-03-02T12:00:00.000Z',
    ]);
  });

  it('"nodes" asked: the caller\'s spacings are the model\'s; an output spacing not a multiple of 1 800 s is divided evenly', () => {
    const sim = randomWalkNetwork(7);
    const nodes = estimateNetwork(toNetworkInput(sim, networkOptions({ outlierThreshold: null, parametrisation: 'nodes' })));
    expect(nodes.parametrisation).toMatchObject({ zwdNodeIntervalS: 300, gradientNodeIntervalS: 21_600 });
    const odd = estimateNetwork(
      toNetworkInput(
        sim,
        networkOptions({
          outlierThreshold: null,
          parametrisation: 'every-epoch',
          zwd: { intervalS: 450, randomWalkMPerSqrtH: 0.01, aprioriSigmaM: 0.5 },
          gradients: { intervalS: 5400, randomWalkMPerSqrtH: 0.001, aprioriSigmaM: 0.01 },
        }),
      ),
    );
    expect(odd.parametrisation).toMatchObject({ zwdNodeIntervalS: 225, gradientNodeIntervalS: 1800 });
    expect(odd.stations[0]!.zwdNodes[1]!.epochMs - odd.stations[0]!.zwdNodes[0]!.epochMs).toBe(450_000);
  });
});

describe('the models and fingerprint of a network result name the parametrisation', () => {
  it('the estimator line carries the statement, and the old 6-h gradient model has another fingerprint', () => {
    const sim = randomWalkNetwork(7);
    const statementOf = (parametrisation: 'nodes' | 'every-epoch') =>
      estimateNetwork(toNetworkInput(sim, networkOptions({ outlierThreshold: null, parametrisation }))).parametrisation;
    const every = statementOf('every-epoch');
    const nodes = statementOf('nodes');
    const modelsOf = (p: typeof every) => provenance(networkModels(DEFAULT_ZWD_OPTIONS, 'estimated', ['caller'], p));
    expect(modelsOf(every).models.estimator).toContain(every!.statement);
    expect(modelsOf(every).model_fingerprint).not.toBe(modelsOf(nodes).model_fingerprint);
  });
});
