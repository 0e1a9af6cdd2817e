/**
 * Seeded simulation of zero-difference residuals of a GNSS network with a known truth, for the
 * network estimator's tests and benchmark. Independent of src/estimation: its own orbits and
 * geometry; the mapping functions and the PRNG come from scripts/synthetic-residuals.ts (which
 * shares no code with src/ either).
 *
 * - Sky: circular orbits, radius 26 560 km, inclination 55°, period half a sidereal day, six planes
 *   60° apart (GPS-like; common practice); `satellitesPerPlane` 4–5 gives 8–12 satellites in view,
 *   9 about 18 (a multi-GNSS sky).
 * - Truth per station: δw and gradients piecewise linear between nodes T0 + jΔ with random-walk
 *   steps N(0, q²Δ[h]) (the estimator's model), plus a common offset added to every station's δw.
 * - Clocks: per epoch, receiver clocks uniform in ±receiverClockAmplitudeM, satellite clocks uniform
 *   in ±satelliteClockAmplitudeM.
 * - Noise N(0, σ²), σ = σ0/sin e; optional gross errors of ±(12..20) σ at distinct epochs.
 */

import {
  chenHerringMapping,
  EARTH_ROTATION_RAD_S,
  gaussian,
  mulberry32,
  niellWetMapping,
  ORBIT_INCLINATION_RAD,
  ORBIT_PERIOD_S,
  ORBIT_RADIUS_M,
  piecewiseLinear,
} from '../../../scripts/synthetic-residuals.js';
import type { NetworkEstimationInput, NetworkEstimationOptions, NetworkStation } from '../../../src/estimation/network/types.js';

const DEG = Math.PI / 180;
const WGS84_A = 6_378_137;
const WGS84_F = 1 / 298.257223563;

export interface SimStation {
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  heightM: number;
}

export interface NetworkSimOptions {
  seed: number;
  stations: SimStation[];
  startIso: string;
  durationS: number;
  samplingS: number;
  minElevationDeg: number;
  sigma0M: number;
  satellitesPerPlane: number;
  zwd: { intervalS: number; randomWalkMPerSqrtH: number; initialSigmaM: number };
  gradients: { intervalS: number; randomWalkMPerSqrtH: number; initialSigmaM: number } | null;
  commonOffsetM: number;
  receiverClockAmplitudeM: number;
  satelliteClockAmplitudeM: number;
  grossErrors: number;
}

export interface StationTruth {
  zwdNodesM: number[];
  northNodesM: number[];
  eastNodesM: number[];
}

export interface NetworkSim {
  stations: NetworkStation[];
  observations: NetworkEstimationInput['observations'] & { sigmaM: number[] };
  truth: StationTruth[];
  firstEpochMs: number;
  options: NetworkSimOptions;
  grossErrorIndices: number[];
}

/** Truth δw of station s at an epoch [m] (including the common offset). */
export function truthZwd(sim: NetworkSim, s: number, epochMs: number): number {
  return piecewiseLinear(sim.truth[s]!.zwdNodesM, sim.firstEpochMs, sim.options.zwd.intervalS * 1000, epochMs) + sim.options.commonOffsetM;
}

/** A station `distanceKm` from (lat, lon) towards azimuth `azimuthDeg` (spherical Earth, R = 6371 km). */
export function stationAt(name: string, latDeg: number, lonDeg: number, distanceKm: number, azimuthDeg: number, heightM = 300): SimStation {
  const d = distanceKm / 6371;
  const lat = latDeg * DEG;
  const az = azimuthDeg * DEG;
  const lat2 = Math.asin(Math.sin(lat) * Math.cos(d) + Math.cos(lat) * Math.sin(d) * Math.cos(az));
  const lon2 = lonDeg * DEG + Math.atan2(Math.sin(az) * Math.sin(d) * Math.cos(lat), Math.cos(d) - Math.sin(lat) * Math.sin(lat2));
  return { name, latitudeDeg: lat2 / DEG, longitudeDeg: lon2 / DEG, heightM };
}

function randomWalkNodes(normal: () => number, count: number, intervalS: number, q: number, initialSigma: number): number[] {
  const step = q * Math.sqrt(intervalS / 3600);
  const nodes = [initialSigma * normal()];
  for (let j = 1; j < count; j++) nodes.push(nodes[j - 1]! + step * normal());
  return nodes;
}

export function simulateNetwork(o: NetworkSimOptions): NetworkSim {
  const uniform = mulberry32(o.seed);
  const normal = gaussian(uniform);
  const startMs = Date.parse(o.startIso);
  const e2 = WGS84_F * (2 - WGS84_F);
  const sites = o.stations.map((st) => {
    const lat = st.latitudeDeg * DEG;
    const lon = st.longitudeDeg * DEG;
    const n = WGS84_A / Math.sqrt(1 - e2 * Math.sin(lat) ** 2);
    return {
      x: (n + st.heightM) * Math.cos(lat) * Math.cos(lon),
      y: (n + st.heightM) * Math.cos(lat) * Math.sin(lon),
      z: (n * (1 - e2) + st.heightM) * Math.sin(lat),
      sl: Math.sin(lat),
      cl: Math.cos(lat),
      so: Math.sin(lon),
      co: Math.cos(lon),
    };
  });
  const nodes = (interval: number) => Math.max(1, Math.ceil(o.durationS / interval - 1e-9) + 1);
  const truth: StationTruth[] = o.stations.map(() => ({
    zwdNodesM: randomWalkNodes(normal, nodes(o.zwd.intervalS), o.zwd.intervalS, o.zwd.randomWalkMPerSqrtH, o.zwd.initialSigmaM),
    northNodesM: o.gradients
      ? randomWalkNodes(
          normal,
          nodes(o.gradients.intervalS),
          o.gradients.intervalS,
          o.gradients.randomWalkMPerSqrtH,
          o.gradients.initialSigmaM,
        )
      : [],
    eastNodesM: o.gradients
      ? randomWalkNodes(
          normal,
          nodes(o.gradients.intervalS),
          o.gradients.intervalS,
          o.gradients.randomWalkMPerSqrtH,
          o.gradients.initialSigmaM,
        )
      : [],
  }));
  const obs: NetworkSim['observations'] = {
    station: [],
    epochMs: [],
    satellite: [],
    elevationRad: [],
    azimuthRad: [],
    residualM: [],
    sigmaM: [],
  };
  const meanMotion = (2 * Math.PI) / ORBIT_PERIOD_S;
  const planes = 6;
  const satCount = planes * o.satellitesPerPlane;
  const epochCount = Math.floor(o.durationS / o.samplingS) + 1;
  const ci = Math.cos(ORBIT_INCLINATION_RAD);
  const si = Math.sin(ORBIT_INCLINATION_RAD);
  const sat = new Float64Array(3 * satCount);
  for (let k = 0; k < epochCount; k++) {
    const tS = k * o.samplingS;
    const epochMs = startMs + tS * 1000;
    const theta = EARTH_ROTATION_RAD_S * tS;
    for (let p = 0; p < planes; p++) {
      const raan = (p * 2 * Math.PI) / planes;
      for (let q = 0; q < o.satellitesPerPlane; q++) {
        const u = (q * 2 * Math.PI) / o.satellitesPerPlane + p * 15 * DEG + meanMotion * tS;
        const xi = ORBIT_RADIUS_M * (Math.cos(u) * Math.cos(raan) - Math.sin(u) * ci * Math.sin(raan));
        const yi = ORBIT_RADIUS_M * (Math.cos(u) * Math.sin(raan) + Math.sin(u) * ci * Math.cos(raan));
        const zi = ORBIT_RADIUS_M * Math.sin(u) * si;
        const i = p * o.satellitesPerPlane + q;
        sat[3 * i] = xi * Math.cos(theta) + yi * Math.sin(theta);
        sat[3 * i + 1] = -xi * Math.sin(theta) + yi * Math.cos(theta);
        sat[3 * i + 2] = zi;
      }
    }
    const satClock = Array.from({ length: satCount }, () => (2 * uniform() - 1) * o.satelliteClockAmplitudeM);
    o.stations.forEach((st, s) => {
      const site = sites[s]!;
      const rc = (2 * uniform() - 1) * o.receiverClockAmplitudeM;
      const zwd = truthZwd({ truth, firstEpochMs: startMs, options: o } as NetworkSim, s, epochMs);
      const gn = o.gradients ? piecewiseLinear(truth[s]!.northNodesM, startMs, o.gradients.intervalS * 1000, epochMs) : 0;
      const ge = o.gradients ? piecewiseLinear(truth[s]!.eastNodesM, startMs, o.gradients.intervalS * 1000, epochMs) : 0;
      for (let i = 0; i < satCount; i++) {
        const dx = sat[3 * i]! - site.x;
        const dy = sat[3 * i + 1]! - site.y;
        const dz = sat[3 * i + 2]! - site.z;
        const east = -site.so * dx + site.co * dy;
        const north = -site.sl * site.co * dx - site.sl * site.so * dy + site.cl * dz;
        const up = site.cl * site.co * dx + site.cl * site.so * dy + site.sl * dz;
        const elevation = Math.atan2(up, Math.hypot(east, north));
        if (elevation < o.minElevationDeg * DEG) continue;
        let azimuth = Math.atan2(east, north);
        if (azimuth < 0) azimuth += 2 * Math.PI;
        const sigma = o.sigma0M / Math.sin(elevation);
        const signal =
          niellWetMapping(st.latitudeDeg, elevation) * zwd +
          chenHerringMapping(elevation) * (Math.cos(azimuth) * gn + Math.sin(azimuth) * ge) +
          rc +
          satClock[i]!;
        obs.station.push(st.name);
        obs.epochMs.push(epochMs);
        obs.satellite.push(`G${String(i + 1).padStart(2, '0')}`);
        obs.elevationRad.push(elevation);
        obs.azimuthRad.push(azimuth);
        obs.residualM.push(signal + sigma * normal());
        obs.sigmaM.push(sigma);
      }
    });
  }
  const grossErrorIndices: number[] = [];
  const hit = new Set<number>();
  let guard = 0;
  while (grossErrorIndices.length < o.grossErrors && guard++ < 100_000) {
    const i = Math.floor(uniform() * obs.epochMs.length);
    if (hit.has(obs.epochMs[i]!) || obs.elevationRad[i]! < 15 * DEG) continue;
    hit.add(obs.epochMs[i]!);
    obs.residualM[i]! += (12 + 8 * uniform()) * obs.sigmaM[i]! * (uniform() < 0.5 ? -1 : 1);
    grossErrorIndices.push(i);
  }
  grossErrorIndices.sort((a, b) => a - b);
  return {
    stations: o.stations.map((st) => ({
      name: st.name,
      latitudeRad: st.latitudeDeg * DEG,
      longitudeRad: st.longitudeDeg * DEG,
      heightM: st.heightM,
    })),
    observations: obs,
    truth,
    firstEpochMs: startMs,
    options: o,
    grossErrorIndices,
  };
}

/** Estimator options of the tests: the API defaults (test/helpers/synthetic-input.ts) plus the network's. */
export function networkOptions(overrides: Partial<NetworkEstimationOptions> = {}): NetworkEstimationOptions {
  return {
    zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, aprioriSigmaM: 0.5 },
    gradients: { intervalS: 21600, randomWalkMPerSqrtH: 0.001, aprioriSigmaM: 0.01 },
    epochBias: true,
    weighting: 'elevation',
    sigma0M: 0.003,
    elevationCutoffRad: 7 * DEG,
    outlierThreshold: 4,
    outlierRejection: 'one-per-window',
    maxRejections: 1000,
    scaleSigmas: false,
    parametrisation: 'nodes',
    correlatedNoise: false,
    satelliteClocks: 'estimated',
    referenceStation: null,
    commonModeSigmaThresholdM: 0.005,
    ...overrides,
  };
}

export function toNetworkInput(sim: NetworkSim, options: NetworkEstimationOptions, withSigmas = false): NetworkEstimationInput {
  const o = sim.observations;
  return {
    stations: sim.stations,
    observations: {
      station: o.station.slice(),
      epochMs: o.epochMs.slice(),
      satellite: o.satellite.slice(),
      elevationRad: o.elevationRad.slice(),
      azimuthRad: o.azimuthRad.slice(),
      residualM: o.residualM.slice(),
      ...(withSigmas ? { sigmaM: o.sigmaM.slice() } : {}),
    },
    options,
  };
}

/**
 * A small regional network for the estimator's unit tests: 60-s data from 3° up, σ0 = 3 mm, five
 * satellites per plane, 300-s ZWD nodes (10 mm/√h), 1-h gradient nodes, clocks ±300 km, no common
 * offset and no gross errors unless given.
 */
export function smallNetwork(seed: number, stations: SimStation[], hours: number, overrides: Partial<NetworkSimOptions> = {}): NetworkSim {
  return simulateNetwork({
    seed,
    stations,
    startIso: '2026-05-04T00:00:00Z',
    durationS: hours * 3600,
    samplingS: 60,
    minElevationDeg: 3,
    sigma0M: 0.003,
    satellitesPerPlane: 5,
    zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.05 },
    gradients: { intervalS: 3600, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
    commonOffsetM: 0,
    receiverClockAmplitudeM: 300_000,
    satelliteClockAmplitudeM: 300_000,
    grossErrors: 0,
    ...overrides,
  });
}

/** Seeded standard normal numbers (the generator's own mulberry32 and Gaussian). */
export function seededNormals(seed: number): () => number {
  return gaussian(mulberry32(seed));
}
