/**
 * The simulated network of the network benchmarks (bench/network-run.child.ts in-process,
 * bench/network-day.child.ts through HTTP), so that both measure the same data: stations on rings
 * around an invented centre, up to 600 km out (all see mostly the same sky), 30-s data, about 18
 * satellites in view (six planes of nine, 7° cutoff), clocks of 300 km, a gross error per 4 station-hours.
 */

import { simulateNetwork, stationAt, type SimStation } from '../test/estimation/network/network-simulator.js';

/** `count` invented stations B000, B001, … */
export const benchStations = (count: number): SimStation[] =>
  Array.from({ length: count }, (_, i) =>
    stationAt(`B${String(i).padStart(3, '0')}`, 48, 11, i === 0 ? 0 : 100 + ((i * 37) % 500), (i * 137.5) % 360),
  );

/** The stations' residuals from `startIso` over `durationS` seconds (seed 61). */
export function benchNetwork(stations: SimStation[], startIso: string, durationS: number) {
  return simulateNetwork({
    seed: 61,
    stations,
    startIso,
    durationS,
    samplingS: 30,
    minElevationDeg: 7,
    sigma0M: 0.003,
    satellitesPerPlane: 9,
    zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.05 },
    gradients: { intervalS: 21_600, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
    commonOffsetM: 0,
    receiverClockAmplitudeM: 300_000,
    satelliteClockAmplitudeM: 300_000,
    grossErrors: Math.round((stations.length * durationS) / 3600 / 4),
  });
}
