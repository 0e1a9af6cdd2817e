/**
 * A realistic simulated day of GNSS residuals with a known troposphere (issue 10), for checking
 * that the ZWD estimator's formal errors hold under realistic conditions.
 *
 * Independent of src/ (it must not share code with what it checks): orbits, look angles, noise
 * and truth are written here; the seeded generator, the Niell wet mapping (Niell 1996 Table 3) and
 * the Chen & Herring gradient mapping come from scripts/synthetic-residuals.ts, which is itself
 * independent of src/.
 *
 * - Sky: four constellations on circular orbits with the nominal (from memory) constellation
 *   figures: GPS 26 560 km, 55°, 6 planes × 5; GLONASS 25 510 km, 64.8°, 3 planes × 8; Galileo
 *   29 600 km, 56°, 3 planes × 8; BeiDou MEO 27 906 km, 55°, 3 planes × 8. Periods from Kepler's
 *   third law with GM = 3.986004418e14 m³/s² (IERS Conventions 2010, from memory). Earth rotation
 *   7.2921151467e-5 rad/s. 28–37 satellites above 7° at a mid-latitude site (checked in the test).
 * - Truth ("realistic"): ZWD = 0.12 m + 25 mm diurnal + an 80 mm front (a tanh step whose 12–88 %
 *   rise takes 2 h) + a 3 mm/√h random walk; north gradient 1 mm + 0.3 mm diurnal, east −0.3 mm
 *   + 0.2 mm diurnal − a 0.9 mm Gaussian pulse (σ = 30 min) at the front. ("random-walk"): ZWD
 *   and gradients pure random walks with given q (the estimator's own prior).
 * - Epoch clocks: 100 km + a random walk of 30 m per epoch + uniform ±1 km per epoch.
 * - Noise: σ_i² = a² + σ0²/sin²e (a = 0 by default); a share c of the variance is AR(1) per satellite arc with correlation
 *   time τ (exp(−Δt/τ) between samples of one arc), the rest white.
 * - Wet mapping: Niell (1996), or VMF1 (Boehm, Werl & Schuh 2006: Marini form with the caller's
 *   aw, b = 0.00146, c = 0.04391; from memory, as in docs/constants.md) with aw changing
 *   linearly over the day.
 * - Gross errors: ±(8..30) σ_i on distinct (epoch, satellite) pairs.
 * - A gap: no epochs in [gapStartS, gapEndS).
 */

import { chenHerringMapping, gaussian, mulberry32, niellWetMapping } from '../../scripts/synthetic-residuals.js';

const DEG = Math.PI / 180;
const GM = 3.986004418e14;
const EARTH_ROTATION_RAD_S = 7.2921151467e-5;
const WGS84_A = 6_378_137;
const WGS84_F = 1 / 298.257223563;

export interface Constellation {
  name: string;
  prefix: string;
  radiusM: number;
  inclinationDeg: number;
  planes: number;
  perPlane: number;
}

export const CONSTELLATIONS: Record<'gps' | 'glonass' | 'galileo' | 'beidou', Constellation> = {
  gps: { name: 'GPS', prefix: 'G', radiusM: 26_560_000, inclinationDeg: 55, planes: 6, perPlane: 5 },
  glonass: { name: 'GLONASS', prefix: 'R', radiusM: 25_510_000, inclinationDeg: 64.8, planes: 3, perPlane: 8 },
  galileo: { name: 'Galileo', prefix: 'E', radiusM: 29_600_000, inclinationDeg: 56, planes: 3, perPlane: 8 },
  beidou: { name: 'BeiDou MEO', prefix: 'C', radiusM: 27_906_000, inclinationDeg: 55, planes: 3, perPlane: 8 },
};

export interface SkyOptions {
  seed: number;
  startIso: string;
  durationS: number;
  samplingS: number;
  latitudeDeg: number;
  longitudeDeg: number;
  heightM: number;
  /** Lowest elevation generated [deg] (the estimator's cutoff may be higher). */
  minElevationDeg: number;
  constellations: Array<keyof typeof CONSTELLATIONS>;
  sigma0M: number;
  /** Elevation-independent part a of the noise, σ² = a² + σ0²/sin²e [m] (0: σ0/sin e). */
  sigmaConstantM: number;
  /** Wet mapping: Niell (default) or VMF1 with aw varying linearly over the day (aw at start, at end). */
  vmf1Aw: [number, number] | null;
  /** Share of the noise variance that is AR(1) per satellite arc [0..1]. */
  correlatedShare: number;
  correlationTimeS: number;
  grossErrors: number;
  /** Stretch without epochs [s after the start]; null = none. */
  gap: [number, number] | null;
  truth:
    | { kind: 'realistic'; frontCentreS: number; randomWalkMPerSqrtH: number }
    | { kind: 'random-walk'; zwdMPerSqrtH: number; gradientMPerSqrtH: number };
}

export const REALISTIC_DAY: SkyOptions = {
  seed: 1,
  startIso: '2026-06-21T00:00:00Z',
  durationS: 86_400,
  samplingS: 30,
  latitudeDeg: 47.3,
  longitudeDeg: 8.6,
  heightM: 450,
  minElevationDeg: 5,
  constellations: ['gps', 'glonass', 'galileo', 'beidou'],
  sigma0M: 0.003,
  sigmaConstantM: 0,
  vmf1Aw: null,
  correlatedShare: 0.7,
  correlationTimeS: 600,
  grossErrors: 100,
  gap: [15 * 3600, 16 * 3600],
  truth: { kind: 'realistic', frontCentreS: 10 * 3600, randomWalkMPerSqrtH: 0.003 },
};

export interface Sky {
  options: SkyOptions;
  epochMs: number[];
  satellite: string[];
  elevationRad: number[];
  azimuthRad: number[];
  residualM: number[];
  /** Indices of the observations with a gross error. */
  grossErrors: Set<number>;
  /** Satellites above minElevationDeg per epoch (min, max). */
  inView: { min: number; max: number };
  /** Truth at any instant of the day (linear between the 30 s truth samples) [m]. */
  zwdAt(epochMs: number): number;
  northAt(epochMs: number): number;
  eastAt(epochMs: number): number;
}

/** Truth sampled every TRUTH_STEP_S, including the gap. */
const TRUTH_STEP_S = 30;

export function simulateSky(overrides: Partial<SkyOptions> = {}): Sky {
  const o: SkyOptions = { ...REALISTIC_DAY, ...overrides };
  const uniform = mulberry32(o.seed * 7919 + 17);
  const normal = gaussian(uniform);
  const startMs = Date.parse(o.startIso);

  // Truth series.
  const steps = Math.ceil(o.durationS / TRUTH_STEP_S) + 1;
  const zwd = new Float64Array(steps);
  const north = new Float64Array(steps);
  const east = new Float64Array(steps);
  const day = 86_400;
  if (o.truth.kind === 'realistic') {
    const { frontCentreS, randomWalkMPerSqrtH } = o.truth;
    const rwStep = randomWalkMPerSqrtH * Math.sqrt(TRUTH_STEP_S / 3600);
    // tanh step: 0.5 (1 + tanh(t/T)) goes from 12 % to 88 % over t = ±T, so T = 1 h for 2 h.
    const frontT = 3600;
    let walk = 0;
    for (let k = 0; k < steps; k++) {
      const t = k * TRUTH_STEP_S;
      if (k > 0) walk += rwStep * normal();
      const phase = (2 * Math.PI * t) / day;
      zwd[k] = 0.12 + 0.025 * Math.sin(phase - 1.2) + 0.08 * 0.5 * (1 + Math.tanh((t - frontCentreS) / frontT)) + walk;
      north[k] = 0.001 + 0.0003 * Math.cos(phase);
      east[k] = -0.0003 + 0.0002 * Math.sin(phase) - 0.0009 * Math.exp(-0.5 * ((t - frontCentreS) / 1800) ** 2);
    }
  } else {
    const zs = o.truth.zwdMPerSqrtH * Math.sqrt(TRUTH_STEP_S / 3600);
    const gs = o.truth.gradientMPerSqrtH * Math.sqrt(TRUTH_STEP_S / 3600);
    zwd[0] = 0.1;
    north[0] = 0.0005;
    east[0] = -0.0005;
    for (let k = 1; k < steps; k++) {
      zwd[k] = zwd[k - 1]! + zs * normal();
      north[k] = north[k - 1]! + gs * normal();
      east[k] = east[k - 1]! + gs * normal();
    }
  }
  const sampler = (series: Float64Array) => (epochMs: number) => {
    const u = (epochMs - startMs) / 1000 / TRUTH_STEP_S;
    const k = Math.min(Math.max(Math.floor(u), 0), steps - 2);
    const f = u - k;
    return series[k]! * (1 - f) + series[k + 1]! * f;
  };
  const zwdAt = sampler(zwd);
  const northAt = sampler(north);
  const eastAt = sampler(east);

  // Site.
  const e2 = WGS84_F * (2 - WGS84_F);
  const lat = o.latitudeDeg * DEG;
  const lon = o.longitudeDeg * DEG;
  const nRad = WGS84_A / Math.sqrt(1 - e2 * Math.sin(lat) ** 2);
  const site = [
    (nRad + o.heightM) * Math.cos(lat) * Math.cos(lon),
    (nRad + o.heightM) * Math.cos(lat) * Math.sin(lon),
    (nRad * (1 - e2) + o.heightM) * Math.sin(lat),
  ] as const;

  // Satellites: Walker-like phasing, random start phase of each constellation.
  interface Sat {
    id: string;
    radius: number;
    inclination: number;
    raan: number;
    u0: number;
    meanMotion: number;
  }
  const sats: Sat[] = [];
  for (const key of o.constellations) {
    const c = CONSTELLATIONS[key];
    const meanMotion = Math.sqrt(GM / c.radiusM ** 3);
    const offset = 2 * Math.PI * uniform();
    for (let p = 0; p < c.planes; p++) {
      for (let q = 0; q < c.perPlane; q++) {
        sats.push({
          id: `${c.prefix}${String(p * c.perPlane + q + 1).padStart(2, '0')}`,
          radius: c.radiusM,
          inclination: c.inclinationDeg * DEG,
          raan: (2 * Math.PI * p) / c.planes + offset / 3,
          u0: offset + (2 * Math.PI * q) / c.perPlane + (2 * Math.PI * p) / (c.planes * c.perPlane),
          meanMotion,
        });
      }
    }
  }

  const out: Sky = {
    options: o,
    epochMs: [],
    satellite: [],
    elevationRad: [],
    azimuthRad: [],
    residualM: [],
    grossErrors: new Set(),
    inView: { min: Infinity, max: 0 },
    zwdAt,
    northAt,
    eastAt,
  };
  const sl = Math.sin(lat);
  const cl = Math.cos(lat);
  const so = Math.sin(lon);
  const co = Math.cos(lon);
  const arState = new Map<string, { tS: number; u: number }>();
  const sigmaOf: number[] = [];
  const epochCount = Math.floor(o.durationS / o.samplingS) + 1;
  let clock = 100_000;
  const ar = Math.sqrt(o.correlatedShare);
  const white = Math.sqrt(1 - o.correlatedShare);
  for (let k = 0; k < epochCount; k++) {
    const tS = k * o.samplingS;
    clock += 30 * normal();
    if (o.gap && tS >= o.gap[0] && tS < o.gap[1]) continue;
    const epochMs = startMs + tS * 1000;
    const bias = clock + 1000 * (2 * uniform() - 1);
    const w = zwdAt(epochMs);
    const gn = northAt(epochMs);
    const ge = eastAt(epochMs);
    const theta = EARTH_ROTATION_RAD_S * tS;
    let visible = 0;
    for (const s of sats) {
      const u = s.u0 + s.meanMotion * tS;
      const ci = Math.cos(s.inclination);
      const xi = s.radius * (Math.cos(u) * Math.cos(s.raan) - Math.sin(u) * ci * Math.sin(s.raan));
      const yi = s.radius * (Math.cos(u) * Math.sin(s.raan) + Math.sin(u) * ci * Math.cos(s.raan));
      const zi = s.radius * Math.sin(u) * Math.sin(s.inclination);
      const dx = xi * Math.cos(theta) + yi * Math.sin(theta) - site[0];
      const dy = -xi * Math.sin(theta) + yi * Math.cos(theta) - site[1];
      const dz = zi - site[2];
      const eastC = -so * dx + co * dy;
      const northC = -sl * co * dx - sl * so * dy + cl * dz;
      const up = cl * co * dx + cl * so * dy + sl * dz;
      const elevation = Math.atan2(up, Math.hypot(eastC, northC));
      if (elevation < o.minElevationDeg * DEG) continue;
      let azimuth = Math.atan2(eastC, northC);
      if (azimuth < 0) azimuth += 2 * Math.PI;
      if (elevation >= 7 * DEG) visible++;
      // AR(1) state of the satellite's arc.
      const prev = arState.get(s.id);
      let state: number;
      if (prev && tS - prev.tS <= 2 * o.samplingS + 1e-9) {
        const phi = Math.exp(-(tS - prev.tS) / o.correlationTimeS);
        state = phi * prev.u + Math.sqrt(1 - phi * phi) * normal();
      } else {
        state = normal();
      }
      arState.set(s.id, { tS, u: state });
      const sigma = Math.sqrt(o.sigmaConstantM ** 2 + (o.sigma0M / Math.sin(elevation)) ** 2);
      const noise = sigma * (ar * state + white * normal());
      const mg = chenHerringMapping(elevation);
      out.epochMs.push(epochMs);
      out.satellite.push(s.id);
      out.elevationRad.push(elevation);
      out.azimuthRad.push(azimuth);
      const mw = o.vmf1Aw ? vmf1Wet(vmf1AwAt(o, tS), elevation) : niellWetMapping(o.latitudeDeg, elevation);
      out.residualM.push(mw * w + mg * (Math.cos(azimuth) * gn + Math.sin(azimuth) * ge) + bias + noise);
      sigmaOf.push(sigma);
    }
    out.inView.min = Math.min(out.inView.min, visible);
    out.inView.max = Math.max(out.inView.max, visible);
  }

  // Gross errors on distinct observations at or above 7°.
  let guard = 0;
  while (out.grossErrors.size < o.grossErrors && guard++ < 1_000_000) {
    const i = Math.floor(uniform() * out.epochMs.length);
    if (out.grossErrors.has(i) || out.elevationRad[i]! < 7 * DEG) continue;
    out.grossErrors.add(i);
    out.residualM[i]! += (8 + 22 * uniform()) * sigmaOf[i]! * (uniform() < 0.5 ? -1 : 1);
  }
  return out;
}

/** VMF1 aw of the simulated day at t seconds after the start (linear from start to end value). */
export function vmf1AwAt(o: SkyOptions, tS: number): number {
  const [a0, a1] = o.vmf1Aw!;
  return a0 + ((a1 - a0) * tS) / o.durationS;
}

/** VMF1 wet mapping factor, Marini's continued fraction with b = 0.00146, c = 0.04391. */
export function vmf1Wet(aw: number, elevationRad: number): number {
  const b = 0.00146;
  const c = 0.04391;
  const s = Math.sin(elevationRad);
  return (1 + aw / (1 + b / (1 + c))) / (s + aw / (s + b / (s + c)));
}
