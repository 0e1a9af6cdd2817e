/**
 * Child process of bench/network.bench.ts: simulates a network (argument 1: stations, argument 2:
 * hours, 30 s sampling, about 18 satellites in view) and runs the network estimator once in a fresh
 * process; prints JSON with the time of the estimation and the peak resident set size.
 */

import { resourceUsage } from 'node:process';
import { estimateNetwork } from '../src/estimation/network/estimate-network.js';
import { networkOptions, simulateNetwork, stationAt, toNetworkInput } from '../test/estimation/network/network-simulator.js';

const stations = Number(process.argv[2] ?? 10);
const hours = Number(process.argv[3] ?? 24);
const screening = (process.argv[4] ?? 'on') === 'on';
// "default": the route's defaults (states at every epoch asked → the network's model nodes of
// 300 s / 1 800 s, correlated-noise inflation, variance components); "nodes-6h": the network's model
// before (the caller's 300-s ZWD and 6-h gradient nodes), for comparisons in the same conditions.
const model = process.argv[5] ?? 'default';
// Stations on rings around an invented centre, up to 600 km out (all see mostly the same sky).
const list = Array.from({ length: stations }, (_, i) =>
  stationAt(`B${String(i).padStart(3, '0')}`, 48, 11, i === 0 ? 0 : 100 + ((i * 37) % 500), (i * 137.5) % 360),
);
const sim = simulateNetwork({
  seed: 61,
  stations: list,
  startIso: '2026-10-01T00:00:00Z',
  durationS: hours * 3600,
  samplingS: 30,
  minElevationDeg: 7,
  sigma0M: 0.003,
  satellitesPerPlane: 9,
  zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.05 },
  gradients: { intervalS: 21_600, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
  commonOffsetM: 0,
  receiverClockAmplitudeM: 300_000,
  satelliteClockAmplitudeM: 300_000,
  grossErrors: Math.round((stations * hours) / 4),
});
const input = toNetworkInput(
  sim,
  networkOptions({
    scaleSigmas: true,
    correlatedNoise: true,
    outlierThreshold: screening ? 4 : null,
    parametrisation: model === 'nodes-6h' ? 'nodes' : 'every-epoch',
  }),
);
const rssBeforeMb = process.memoryUsage().rss / 1e6;
const cpu0 = process.cpuUsage();
const started = performance.now();
const out = estimateNetwork(input);
const elapsedMs = performance.now() - started;
const cpu = process.cpuUsage(cpu0);
const cpuMs = (cpu.user + cpu.system) / 1000;
process.stdout.write(
  JSON.stringify({
    stations,
    hours,
    screening,
    model,
    parametrisation: out.parametrisation?.statement ?? null,
    observations: out.statistics.observationsTotal,
    epochs: out.statistics.epochs,
    solutions: out.statistics.solutions,
    rejected: out.statistics.observationsRejected,
    unknowns: out.statistics.unknowns,
    rssBeforeMb,
    maxRssMb: resourceUsage().maxRSS / 1e3,
    elapsedMs,
    cpuMs,
  }) + '\n',
);
