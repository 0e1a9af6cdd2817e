/**
 * Child process of bench/network.bench.ts: simulates a network (argument 1: stations, argument 2:
 * hours, 30 s sampling, about 18 satellites in view) and runs the network estimator once in a fresh
 * process; prints JSON with the time of the estimation and the peak resident set size.
 */

import { resourceUsage } from 'node:process';
import { estimateNetwork } from '../src/estimation/network/estimate-network.js';
import { networkOptions, toNetworkInput } from '../test/estimation/network/network-simulator.js';
import { benchNetwork, benchStations } from './bench-network.js';

const stations = Number(process.argv[2] ?? 10);
const hours = Number(process.argv[3] ?? 24);
const screening = (process.argv[4] ?? 'on') === 'on';
// "default": the route's defaults (states at every epoch asked → the network's model nodes of
// 300 s / 1 800 s, correlated-noise inflation, variance components); "nodes-6h": the network's model
// before (the caller's 300-s ZWD and 6-h gradient nodes), for comparisons in the same conditions.
const model = process.argv[5] ?? 'default';
const sim = benchNetwork(benchStations(stations), '2026-10-01T00:00:00Z', hours * 3600);
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
