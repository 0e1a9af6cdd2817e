/**
 * Bad input of the network estimator (issue 12): a clear answer for each case, a 4xx naming the
 * field where the caller must change something, a count where data are dropped.
 */

import { describe, expect, it } from 'vitest';
import { ModelDomainError } from '../../../src/domain/errors.js';
import { estimateNetwork } from '../../../src/estimation/network/estimate-network.js';
import type { NetworkEstimationInput } from '../../../src/estimation/network/types.js';
import { networkOptions, simulateNetwork, stationAt, toNetworkInput } from './network-simulator.js';

const DEG = Math.PI / 180;

function base(): NetworkEstimationInput {
  const sim = simulateNetwork({
    seed: 51,
    stations: [stationAt('ASHGROVE', 52, 1, 0, 0), stationAt('BRAMBLE', 52, 1, 100, 90), stationAt('CINDERFORD', 52, 1, 100, 200)],
    startIso: '2026-02-02T00:00:00Z',
    durationS: 1800,
    samplingS: 120,
    minElevationDeg: 7,
    sigma0M: 0.003,
    satellitesPerPlane: 5,
    zwd: { intervalS: 900, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.05 },
    gradients: null,
    commonOffsetM: 0,
    receiverClockAmplitudeM: 1000,
    satelliteClockAmplitudeM: 1000,
    grossErrors: 0,
  });
  return toNetworkInput(sim, networkOptions({ outlierThreshold: null, gradients: null }));
}

function expectProblem(input: NetworkEstimationInput, field: string, status: number, message: RegExp) {
  try {
    estimateNetwork(input);
  } catch (err) {
    expect(err).toBeInstanceOf(ModelDomainError);
    const e = err as ModelDomainError;
    expect(e.field).toBe(field);
    expect(e.status).toBe(status);
    expect(e.message).toMatch(message);
    return;
  }
  throw new Error('no error');
}

describe('bad input', () => {
  it('a station in observations that is not in stations: 400 naming the observation and the known stations', () => {
    const input = base();
    input.observations.station[7] = 'NOWHERE';
    expectProblem(input, 'observations.7.station', 400, /NOWHERE is not in stations \(known: ASHGROVE, BRAMBLE, CINDERFORD\)/);
  });

  it('duplicate station names, a station without observations, an unknown reference station, a duplicate observation: 400', () => {
    const dupName = base();
    dupName.stations[2] = { ...dupName.stations[2]!, name: 'ASHGROVE' };
    expectProblem(dupName, 'stations.2.name', 400, /duplicate station name ASHGROVE/);
    const idle = base();
    idle.stations.push({ name: 'DORMANT', latitudeRad: 0.9, longitudeRad: 0.02, heightM: 10 });
    expectProblem(idle, 'stations', 400, /DORMANT has no observations/);
    const ref = base();
    ref.options.referenceStation = 'ELSEWHERE';
    expectProblem(ref, 'options.reference_station', 400, /ELSEWHERE is not in stations/);
    const dup = base();
    const o = dup.observations;
    for (const c of [o.station, o.epochMs, o.satellite, o.elevationRad, o.azimuthRad, o.residualM] as unknown[][]) c.push(c[3]);
    expectProblem(dup, `observations.${o.epochMs.length - 1}`, 400, /also observations\.3/);
  });

  it('a satellite seen by one station at an epoch: dropped with a count, and the result equals the solution without it', () => {
    const input = base();
    const o = input.observations;
    const clean = estimateNetwork(input);
    // One more satellite, seen by BRAMBLE only, at the second epoch.
    const t = [...new Set(o.epochMs)].sort((a, b) => a - b)[1]!;
    for (const [c, v] of [
      [o.station, 'BRAMBLE'],
      [o.epochMs, t],
      [o.satellite, 'R99'],
      [o.elevationRad, 35 * DEG],
      [o.azimuthRad, 1],
      [o.residualM, 123.4],
    ] as [unknown[], unknown][])
      c.push(v);
    const out = estimateNetwork(input);
    expect(out.statistics.singleStationSatellites).toBe(clean.statistics.singleStationSatellites + 1);
    expect(out.stations[1]!.statistics.observationsSingleStationSatellite).toBe(
      clean.stations[1]!.statistics.observationsSingleStationSatellite + 1,
    );
    expect(out.warnings.join(' ')).toMatch(/seen by one station only were not used/);
    out.stations.forEach((st, s) =>
      st.zwdNodes.forEach((n, j) => expect(Math.abs(n.correctionM - clean.stations[s]!.zwdNodes[j]!.correctionM)).toBeLessThan(1e-12)),
    );
  });

  it('an epoch with one station: counted, warned, and it adds no information', () => {
    const input = base();
    const o = input.observations;
    const clean = estimateNetwork(input);
    const last = Math.max(...o.epochMs);
    const lone = last + 60_000;
    const cols = [o.station, o.epochMs, o.satellite, o.elevationRad, o.azimuthRad, o.residualM] as unknown[][];
    const ash = o.station.flatMap((s, i) => (s === 'ASHGROVE' && o.epochMs[i] === last ? [i] : []));
    for (const i of ash) cols.forEach((c, k) => c.push(k === 1 ? lone : c[i]));
    const out = estimateNetwork(input);
    expect(out.statistics.singleStationEpochs).toBe(1);
    expect(out.warnings.join(' ')).toMatch(/1 epochs with observations of one station only/);
    expect(out.statistics.observationsUsed).toBe(clean.statistics.observationsUsed);
    expect(out.stations[0]!.epochs.at(-1)!.observationsUsed).toBe(0);
  });

  it('a station that shares no satellite with the others: a warning, values from the constraints only (σ ≈ the a-priori 0.5 m)', () => {
    const input = base();
    const o = input.observations;
    o.satellite.forEach((sat, i) => {
      if (o.station[i] === 'CINDERFORD') o.satellite[i] = `X${sat}`;
    });
    const out = estimateNetwork(input);
    expect(out.warnings.join(' ')).toMatch(/CINDERFORD shares no satellite/);
    expect(out.stations[2]!.zwdNodes[0]!.sigmaM).toBeGreaterThan(0.4);
  });
});
