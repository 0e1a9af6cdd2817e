/**
 * What a small network cannot see (issue 12, common practice): seen from a GNSS satellite the whole
 * Earth spans about ±14° of nadir angle, so for a network a few hundred kilometres wide the rays to
 * one satellite leave in almost the same direction and the network-mean ZWD is nearly inseparable
 * from the satellite clocks; only differences between stations are well determined. Distant stations
 * restore the absolute level. Seeded simulation (network-simulator.ts) with a known truth and a
 * common offset of 5 cm added to every station's ZWD.
 */

import { describe, expect, it } from 'vitest';
import { estimateNetwork } from '../../../src/estimation/network/estimate-network.js';
import type { NetworkEstimationOutput } from '../../../src/estimation/network/types.js';
import {
  networkOptions,
  simulateNetwork,
  stationAt,
  toNetworkInput,
  truthZwd,
  type NetworkSim,
  type SimStation,
} from './network-simulator.js';

const MM = 1e-3;
const CM = 1e-2;
const OFFSET = 5 * CM;
const CENTRE = [45.5, 10.5] as const;
/** A 300-km regional network: a centre and four stations 150 km away (invented names and places). */
const REGIONAL: SimStation[] = [
  stationAt('HOLM', ...CENTRE, 0, 0),
  stationAt('IVYBANK', ...CENTRE, 150, 45),
  stationAt('JUNIPER', ...CENTRE, 150, 135),
  stationAt('KESTREL', ...CENTRE, 150, 225),
  stationAt('LARKSPUR', ...CENTRE, 150, 315),
];
/** Three distant stations, 2 400–5 700 km from the centre. */
const DISTANT: SimStation[] = [
  stationAt('MOORFIELD', ...CENTRE, 2400, 300),
  stationAt('NETHERBY', ...CENTRE, 4000, 190),
  stationAt('OAKRIDGE', ...CENTRE, 5700, 80),
];

function simulate(stations: SimStation[]): NetworkSim {
  return simulateNetwork({
    seed: 31,
    stations,
    startIso: '2026-07-01T06:00:00Z',
    durationS: 3600,
    samplingS: 60,
    minElevationDeg: 3,
    sigma0M: 0.003,
    satellitesPerPlane: 5,
    zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.03 },
    gradients: { intervalS: 21600, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
    commonOffsetM: OFFSET,
    receiverClockAmplitudeM: 300_000,
    satelliteClockAmplitudeM: 300_000,
    grossErrors: 0,
  });
}

interface AtEpoch {
  error: number;
  sigma: number;
  relativeError: number;
  relativeSigma: number;
}

/** Errors against the truth at the middle epoch, absolute and relative to the reference station. */
function middleEpoch(sim: NetworkSim, out: NetworkEstimationOutput): AtEpoch[] {
  const epochs = out.stations[0]!.epochs;
  const t = epochs[Math.floor(epochs.length / 2)]!.epochMs;
  const ref = out.stations.findIndex((r) => r.station === out.referenceStation);
  const err = (s: number) => out.stations[s]!.epochs.find((e) => e.epochMs === t)!.correctionM - truthZwd(sim, s, t);
  return out.stations.map((r, s) => {
    const e = r.epochs.find((x) => x.epochMs === t)!;
    return { error: err(s), sigma: e.sigmaM, relativeError: err(s) - err(ref), relativeSigma: e.relativeSigmaM };
  });
}

describe('300-km network, 1 h of 60-s data, gradients estimated, +5 cm common offset', () => {
  const sim = simulate(REGIONAL);
  const out = estimateNetwork(toNetworkInput(sim, networkOptions({ outlierThreshold: null })));
  const at = middleEpoch(sim, out);
  const meanError = at.reduce((a, x) => a + x.error, 0) / at.length;
  const meanSigma = out.commonMode.meanZwdSigmaClocksEstimatedM!;

  it('reports an absolute level σ of the size of the offset (≥ offset/2), far above the σ with satellite clocks known, and warns', () => {
    expect(meanSigma).toBeGreaterThan(OFFSET / 2);
    expect(out.commonMode.meanZwdSigmaClocksKnownM).toBeLessThan(1 * MM);
    expect(out.commonMode.extentKm).toBeGreaterThan(290);
    expect(out.commonMode.extentKm).toBeLessThan(310);
    // 300 km seen from 20 200 km: about 300/20 200 rad = 0.85° (common practice).
    expect(out.commonMode.extentNadirDeg).toBeGreaterThan(0.8);
    expect(out.commonMode.extentNadirDeg).toBeLessThan(0.9);
    expect(out.warnings.join(' ')).toMatch(/absolute ZWD level is poorly determined/);
    for (const x of at) expect(x.sigma).toBeGreaterThan(OFFSET / 2);
    // The network mean moves with the clocks (common practice: that is what "absorbed" means).
    expect(out.commonMode.correlationWithClocks!).toBeLessThan(-0.99);
  });

  it('does not determine the offset: the estimate cannot be told from "no offset" at 2σ, and the errors stay within 3σ', () => {
    expect(Math.abs(meanError + OFFSET)).toBeLessThan(2 * meanSigma);
    for (const x of at) expect(Math.abs(x.error)).toBeLessThan(3 * x.sigma);
  });

  it('determines the ZWD differences: within 2σ, σ of 1–3 mm', () => {
    for (const x of at.filter((a) => a.relativeSigma > 0)) {
      expect(Math.abs(x.relativeError)).toBeLessThan(2 * x.relativeSigma);
      expect(x.relativeSigma).toBeGreaterThan(1 * MM);
      expect(x.relativeSigma).toBeLessThan(3 * MM);
    }
  });
});

describe('the same plus three stations 2 400–5 700 km away', () => {
  const sim = simulate([...REGIONAL, ...DISTANT]);
  const out = estimateNetwork(toNetworkInput(sim, networkOptions({ outlierThreshold: null })));
  const at = middleEpoch(sim, out);
  const meanError = at.reduce((a, x) => a + x.error, 0) / at.length;
  const meanSigma = out.commonMode.meanZwdSigmaClocksEstimatedM!;

  it('recovers the offset within 2σ with σ about 1 mm, and gives no common-mode warning', () => {
    expect(meanSigma).toBeGreaterThan(0.3 * MM);
    expect(meanSigma).toBeLessThan(2 * MM);
    expect(Math.abs(meanError)).toBeLessThan(2 * meanSigma);
    expect(out.warnings.join(' ')).not.toMatch(/absolute ZWD level/);
    expect(out.commonMode.extentNadirDeg).toBeGreaterThan(10);
    expect(Math.abs(out.commonMode.correlationWithClocks!)).toBeLessThan(0.9);
  });

  it('errors within 3σ for every station, absolute and relative', () => {
    for (const x of at) {
      expect(Math.abs(x.error)).toBeLessThan(3 * x.sigma);
      if (x.relativeSigma > 0) expect(Math.abs(x.relativeError)).toBeLessThan(3 * x.relativeSigma);
    }
    // The regional stations' absolute σ: a few millimetres at most (it was ≥ 25 mm without the distant stations).
    for (const x of at.slice(0, REGIONAL.length)) expect(x.sigma).toBeLessThan(3 * MM);
  });
});
