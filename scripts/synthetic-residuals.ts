/**
 * Synthetic GNSS residuals with a known troposphere, for the ZWD estimator's tests and benchmarks.
 *
 * Independent of src/ on purpose (it must not share code with what it checks): its own seeded
 * PRNG, orbits, site geometry and mapping functions.
 *
 * - Sky: circular orbits of radius 26 560 km, inclination 55°, period half a sidereal day
 *   (43 082 s), six planes 60° apart in right ascension with four satellites each (a GPS-like
 *   constellation; common practice). Earth rotation ω_E = 7.2921151467e-5 rad/s (WGS84, NIMA
 *   TR8350.2, from memory). Site on the WGS84 ellipsoid; elevation above the ellipsoid tangent plane.
 * - Truth: ZWD correction δw and gradients G_N, G_E as random walks sampled at the estimator's
 *   nodes T0 + jΔ and linear in between (so the truth lies in the estimator's model and the formal
 *   errors describe the actual errors); first node given, steps N(0, q²Δ[h]).
 * - Epoch biases: independent, uniform in ±bias_amplitude (a receiver clock offset of ~1 ms is
 *   300 km).
 * - Noise: N(0, σ_i²), σ_i = σ0 / sin e (the estimator's "elevation" weighting).
 * - Gross errors: a chosen number of observations get ±(12..20) σ_i added, at most one per epoch.
 * - Mapping: Niell (1996) wet, Marini continued fraction, coefficients of Niell (1996) Table 3
 *   (docs/constants.md, confirmed); gradients Chen & Herring (1997) m_g = 1/(sin e tan e + 0.0032).
 *
 * CLI: `npx tsx scripts/synthetic-residuals.ts --help` lists the options (--start, --hours, --out, ...);
 * it writes a request body for POST /v1/zwd-estimates (JSON), or the observation table (CSV).
 */

import { type CliSpec, epochOption, numberOption, runCli, UsageError, writeOutput } from './cli.js';
import { mulberry32 } from '../src/seeded-random.js';

export const ORBIT_RADIUS_M = 26_560_000;
export const ORBIT_INCLINATION_RAD = (55 * Math.PI) / 180;
/** Half a sidereal day [s]: 86 164.0905 / 2. */
export const ORBIT_PERIOD_S = 43_082.045;
export const EARTH_ROTATION_RAD_S = 7.2921151467e-5;
const WGS84_A = 6_378_137;
const WGS84_F = 1 / 298.257223563;
const DEG = Math.PI / 180;

/** Mulberry32, the project's one seeded generator (src/seeded-random.ts). */
export { mulberry32 };

/** Standard normal deviates by the Box–Muller transform (Box & Muller 1958). */
export function gaussian(uniform: () => number): () => number {
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    const u1 = 1 - uniform();
    const u2 = uniform();
    const r = Math.sqrt(-2 * Math.log(u1));
    spare = r * Math.sin(2 * Math.PI * u2);
    return r * Math.cos(2 * Math.PI * u2);
  };
}

/** Niell (1996) Table 3 wet coefficients at 15°, 30°, 45°, 60°, 75° (docs/constants.md, confirmed). */
const NIELL_WET_TABLE = {
  a: [5.8021897e-4, 5.6794847e-4, 5.8118019e-4, 5.9727542e-4, 6.1641693e-4],
  b: [1.4275268e-3, 1.5138625e-3, 1.4572752e-3, 1.5007428e-3, 1.7599082e-3],
  c: [4.3472961e-2, 4.672951e-2, 4.3908931e-2, 4.4626982e-2, 5.4736038e-2],
};

/** Niell wet mapping factor at |latitude| [deg] and elevation [rad]; linear in latitude, constant outside 15..75°. */
export function niellWetMapping(latitudeDeg: number, elevationRad: number): number {
  const lat = Math.min(Math.max(Math.abs(latitudeDeg), 15), 75);
  const i = Math.min(Math.floor((lat - 15) / 15), 3);
  const t = (lat - 15 - 15 * i) / 15;
  const at = (col: number[]) => col[i]! + t * (col[i + 1]! - col[i]!);
  const a = at(NIELL_WET_TABLE.a);
  const b = at(NIELL_WET_TABLE.b);
  const c = at(NIELL_WET_TABLE.c);
  const s = Math.sin(elevationRad);
  return (1 + a / (1 + b / (1 + c))) / (s + a / (s + b / (s + c)));
}

/** Chen & Herring (1997) gradient mapping factor, C = 0.0032. */
export function chenHerringMapping(elevationRad: number): number {
  return 1 / (Math.sin(elevationRad) * Math.tan(elevationRad) + 0.0032);
}

export interface RandomWalkTruth {
  intervalS: number;
  randomWalkMPerSqrtH: number;
  /** Value at the first node [m] (north, east for gradients). */
  initialM: number;
}

export interface SyntheticOptions {
  seed: number;
  startIso: string;
  durationS: number;
  samplingS: number;
  latitudeDeg: number;
  longitudeDeg: number;
  heightM: number;
  /** Lowest elevation generated [deg]. */
  minElevationDeg: number;
  sigma0M: number;
  zwd: RandomWalkTruth;
  /**
   * A given ZWD truth instead of the random walk: node values [m] at zwd.intervalS from the start
   * (at least durationS / intervalS + 1 of them), e.g. a station's own truth minus the a-priori.
   */
  zwdTruthNodesM?: readonly number[];
  gradients: (RandomWalkTruth & { initialEastM: number }) | null;
  biasAmplitudeM: number;
  /** Stretches [start, end) in seconds after the start without observations. */
  gaps: Array<[number, number]>;
  grossErrors: number;
  /** Satellites per plane (6 planes). */
  satellitesPerPlane: number;
}

export const DEFAULT_SYNTHETIC: SyntheticOptions = {
  seed: 1,
  startIso: '2026-03-14T00:00:00Z',
  durationS: 6 * 3600,
  samplingS: 30,
  latitudeDeg: 46.2,
  longitudeDeg: 7.4,
  heightM: 520,
  minElevationDeg: 3,
  sigma0M: 0.003,
  zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, initialM: 0.08 },
  gradients: { intervalS: 21600, randomWalkMPerSqrtH: 0.001, initialM: 0.0006, initialEastM: -0.0004 },
  biasAmplitudeM: 300_000,
  gaps: [],
  grossErrors: 0,
  satellitesPerPlane: 4,
};

export interface SyntheticObservations {
  epochMs: number[];
  satellite: string[];
  elevationDeg: number[];
  azimuthDeg: number[];
  residualM: number[];
  /** σ_i used for the noise [m]. */
  sigmaM: number[];
}

export interface SyntheticTruth {
  firstEpochMs: number;
  zwdIntervalMs: number;
  zwdNodesM: number[];
  gradientIntervalMs: number;
  northNodesM: number[];
  eastNodesM: number[];
  /** Bias per epoch, keyed by epoch [ms]. */
  biasM: Map<number, number>;
}

export interface SyntheticData {
  observations: SyntheticObservations;
  truth: SyntheticTruth;
  /** Indices (into observations) that carry a gross error. */
  grossErrorIndices: number[];
}

/** Piecewise-linear value at t from nodes t0 + jΔ. */
export function piecewiseLinear(nodes: readonly number[], firstEpochMs: number, intervalMs: number, epochMs: number): number {
  if (nodes.length === 1) return nodes[0]!;
  const u = (epochMs - firstEpochMs) / intervalMs;
  const j = Math.min(Math.max(Math.floor(u), 0), nodes.length - 2);
  const alpha = u - j;
  return (1 - alpha) * nodes[j]! + alpha * nodes[j + 1]!;
}

export const truthZwdAt = (truth: SyntheticTruth, epochMs: number) =>
  piecewiseLinear(truth.zwdNodesM, truth.firstEpochMs, truth.zwdIntervalMs, epochMs);
export const truthNorthAt = (truth: SyntheticTruth, epochMs: number) =>
  truth.northNodesM.length ? piecewiseLinear(truth.northNodesM, truth.firstEpochMs, truth.gradientIntervalMs, epochMs) : 0;
export const truthEastAt = (truth: SyntheticTruth, epochMs: number) =>
  truth.eastNodesM.length ? piecewiseLinear(truth.eastNodesM, truth.firstEpochMs, truth.gradientIntervalMs, epochMs) : 0;

function randomWalk(normal: () => number, truth: RandomWalkTruth, initialM: number, durationS: number): number[] {
  const count = Math.max(1, Math.ceil(durationS / truth.intervalS - 1e-9) + 1);
  const stepSigma = truth.randomWalkMPerSqrtH * Math.sqrt(truth.intervalS / 3600);
  const nodes = [initialM];
  for (let j = 1; j < count; j++) nodes.push(nodes[j - 1]! + stepSigma * normal());
  return nodes;
}

/** Site-to-satellite elevation and azimuth [rad] for a satellite position in ECEF [m]. */
function lookAngles(site: { x: number; y: number; z: number; lat: number; lon: number }, sat: [number, number, number]) {
  const dx = sat[0] - site.x;
  const dy = sat[1] - site.y;
  const dz = sat[2] - site.z;
  const sl = Math.sin(site.lat);
  const cl = Math.cos(site.lat);
  const so = Math.sin(site.lon);
  const co = Math.cos(site.lon);
  const east = -so * dx + co * dy;
  const north = -sl * co * dx - sl * so * dy + cl * dz;
  const up = cl * co * dx + cl * so * dy + sl * dz;
  const elevation = Math.atan2(up, Math.hypot(east, north));
  let azimuth = Math.atan2(east, north);
  if (azimuth < 0) azimuth += 2 * Math.PI;
  return { elevation, azimuth };
}

export function generateSyntheticResiduals(overrides: Partial<SyntheticOptions> = {}): SyntheticData {
  const o: SyntheticOptions = { ...DEFAULT_SYNTHETIC, ...overrides };
  const uniform = mulberry32(o.seed);
  const normal = gaussian(uniform);
  const startMs = Date.parse(o.startIso);

  const e2 = WGS84_F * (2 - WGS84_F);
  const lat = o.latitudeDeg * DEG;
  const lon = o.longitudeDeg * DEG;
  const nRad = WGS84_A / Math.sqrt(1 - e2 * Math.sin(lat) ** 2);
  const site = {
    x: (nRad + o.heightM) * Math.cos(lat) * Math.cos(lon),
    y: (nRad + o.heightM) * Math.cos(lat) * Math.sin(lon),
    z: (nRad * (1 - e2) + o.heightM) * Math.sin(lat),
    lat,
    lon,
  };

  const zwdNodes = o.zwdTruthNodesM ? [...o.zwdTruthNodesM] : randomWalk(normal, o.zwd, o.zwd.initialM, o.durationS);
  const northNodes = o.gradients ? randomWalk(normal, o.gradients, o.gradients.initialM, o.durationS) : [];
  const eastNodes = o.gradients ? randomWalk(normal, o.gradients, o.gradients.initialEastM, o.durationS) : [];
  const truth: SyntheticTruth = {
    firstEpochMs: startMs,
    zwdIntervalMs: o.zwd.intervalS * 1000,
    zwdNodesM: zwdNodes,
    gradientIntervalMs: (o.gradients?.intervalS ?? 0) * 1000,
    northNodesM: northNodes,
    eastNodesM: eastNodes,
    biasM: new Map(),
  };

  const obs: SyntheticObservations = { epochMs: [], satellite: [], elevationDeg: [], azimuthDeg: [], residualM: [], sigmaM: [] };
  const meanMotion = (2 * Math.PI) / ORBIT_PERIOD_S;
  const epochCount = Math.floor(o.durationS / o.samplingS) + 1;
  const planes = 6;
  for (let k = 0; k < epochCount; k++) {
    const tS = k * o.samplingS;
    if (o.gaps.some(([a, b]) => tS >= a && tS < b)) continue;
    const epochMs = startMs + tS * 1000;
    const bias = (2 * uniform() - 1) * o.biasAmplitudeM;
    truth.biasM.set(epochMs, bias);
    const zwd = truthZwdAt(truth, epochMs);
    const gn = truthNorthAt(truth, epochMs);
    const ge = truthEastAt(truth, epochMs);
    const theta = EARTH_ROTATION_RAD_S * tS;
    for (let p = 0; p < planes; p++) {
      const raan = (p * 2 * Math.PI) / planes;
      for (let q = 0; q < o.satellitesPerPlane; q++) {
        const u = (q * 2 * Math.PI) / o.satellitesPerPlane + p * 15 * DEG + meanMotion * tS;
        const ci = Math.cos(ORBIT_INCLINATION_RAD);
        const xi = ORBIT_RADIUS_M * (Math.cos(u) * Math.cos(raan) - Math.sin(u) * ci * Math.sin(raan));
        const yi = ORBIT_RADIUS_M * (Math.cos(u) * Math.sin(raan) + Math.sin(u) * ci * Math.cos(raan));
        const zi = ORBIT_RADIUS_M * Math.sin(u) * Math.sin(ORBIT_INCLINATION_RAD);
        const sat: [number, number, number] = [
          xi * Math.cos(theta) + yi * Math.sin(theta),
          -xi * Math.sin(theta) + yi * Math.cos(theta),
          zi,
        ];
        const { elevation, azimuth } = lookAngles(site, sat);
        if (elevation < o.minElevationDeg * DEG) continue;
        const sigma = o.sigma0M / Math.sin(elevation);
        const mg = chenHerringMapping(elevation);
        const signal = niellWetMapping(o.latitudeDeg, elevation) * zwd + mg * (Math.cos(azimuth) * gn + Math.sin(azimuth) * ge) + bias;
        obs.epochMs.push(epochMs);
        obs.satellite.push(`S${String(p * o.satellitesPerPlane + q + 1).padStart(2, '0')}`);
        obs.elevationDeg.push(elevation / DEG);
        obs.azimuthDeg.push(azimuth / DEG);
        obs.residualM.push(signal + sigma * normal());
        obs.sigmaM.push(sigma);
      }
    }
  }

  // Gross errors: distinct epochs, elevations of 10° and more (so no cutoff drops them).
  const grossErrorIndices: number[] = [];
  const hitEpochs = new Set<number>();
  let guard = 0;
  while (grossErrorIndices.length < o.grossErrors && guard++ < 100_000) {
    const i = Math.floor(uniform() * obs.epochMs.length);
    if (hitEpochs.has(obs.epochMs[i]!) || obs.elevationDeg[i]! < 10) continue;
    hitEpochs.add(obs.epochMs[i]!);
    const size = (12 + 8 * uniform()) * obs.sigmaM[i]! * (uniform() < 0.5 ? -1 : 1);
    obs.residualM[i]! += size;
    grossErrorIndices.push(i);
  }
  grossErrorIndices.sort((a, b) => a - b);
  return { observations: obs, truth, grossErrorIndices };
}

/** The synthetic observations as a request body for POST /v1/zwd-estimates. */
export function toRequestBody(data: SyntheticData, o: Partial<SyntheticOptions> = {}) {
  const opts = { ...DEFAULT_SYNTHETIC, ...o };
  const obs = data.observations;
  return {
    site: { latitude_deg: opts.latitudeDeg, longitude_deg: opts.longitudeDeg, height_m: opts.heightM },
    observations: obs.epochMs.map((t, i) => ({
      epoch: new Date(t).toISOString(),
      satellite: obs.satellite[i]!,
      elevation_deg: Number(obs.elevationDeg[i]!.toFixed(6)),
      azimuth_deg: Number(obs.azimuthDeg[i]!.toFixed(6)),
      residual_m: Number(obs.residualM[i]!.toFixed(5)),
    })),
  };
}

/** The synthetic observations as a CSV table (header epoch,satellite,elevation_deg,azimuth_deg,residual_m). */
export function toCsv(data: SyntheticData): string {
  const obs = data.observations;
  const lines = ['epoch,satellite,elevation_deg,azimuth_deg,residual_m'];
  for (let i = 0; i < obs.epochMs.length; i++) {
    lines.push(
      `${new Date(obs.epochMs[i]!).toISOString()},${obs.satellite[i]},${obs.elevationDeg[i]!.toFixed(6)},${obs.azimuthDeg[i]!.toFixed(6)},${obs.residualM[i]!.toFixed(5)}`,
    );
  }
  return lines.join('\n') + '\n';
}

/** The command line: options, their defaults and the help text (`--help`). */
export const SYNTHETIC_CLI: CliSpec = {
  command: 'npx tsx scripts/synthetic-residuals.ts',
  summary:
    'Synthetic GNSS residuals with a known random-walk ZWD and gradients (seeded, reproducible) at an invented site\n' +
    `(${DEFAULT_SYNTHETIC.latitudeDeg}° N, ${DEFAULT_SYNTHETIC.longitudeDeg}° E, ${DEFAULT_SYNTHETIC.heightM} m): a JSON request body for POST /v1/zwd-estimates, or with --csv\n` +
    'the observation table. Writes to --out, else to standard output.',
  options: {
    start: { type: 'string', value: 'EPOCH', description: 'first epoch, ISO 8601 with a zone', default: DEFAULT_SYNTHETIC.startIso },
    hours: { type: 'string', value: 'HOURS', description: 'length of the series [h], 0.01..240', default: '6' },
    sampling: { type: 'string', value: 'SECONDS', description: 'sampling interval [s], 1..3600', default: '30' },
    seed: { type: 'string', value: 'N', description: 'seed of the generator (integer)', default: '1' },
    gross: { type: 'string', value: 'N', description: 'number of gross errors (12..20 sigma) to add', default: '0' },
    bias: {
      type: 'string',
      value: 'METRES',
      description: 'epoch biases uniform in +-METRES',
      default: String(DEFAULT_SYNTHETIC.biasAmplitudeM),
    },
    csv: { type: 'boolean', description: 'write the CSV table (epoch,satellite,elevation_deg,azimuth_deg,residual_m) instead of JSON' },
    station: {
      type: 'boolean',
      description: 'JSON body for POST /v1/stations/{station_id}/zwd-estimates: no site (the station is the site)',
    },
    'apriori-zhd': { type: 'string', value: 'METRES', description: 'put apriori.zhd_m into the JSON body' },
    'zwd-interval': { type: 'string', value: 'SECONDS', description: 'put options.zwd_interval_s into the JSON body' },
    out: { type: 'string', value: 'FILE', description: 'file to write (its folder is created); without it, standard output' },
  },
  examples: [
    'npx tsx scripts/synthetic-residuals.ts --hours 0.5 --csv --out residuals.csv',
    'npx tsx scripts/synthetic-residuals.ts --station --start 2026-07-10T00:30:00Z --hours 1 --apriori-zhd 2.2546 --zwd-interval 900 --out zwd-body.json',
  ],
};

/** The file or text the command line writes for its parsed options. */
export function syntheticCliOutput(values: Record<string, string | boolean | undefined>): string {
  const options: Partial<SyntheticOptions> = {
    seed: numberOption(values, 'seed', 0, 2 ** 32 - 1),
    startIso: new Date(epochOption(values, 'start')).toISOString(),
    durationS: numberOption(values, 'hours', 0.01, 240) * 3600,
    samplingS: numberOption(values, 'sampling', 1, 3600),
    biasAmplitudeM: numberOption(values, 'bias', 0, 1e9),
    grossErrors: numberOption(values, 'gross', 0, 10_000),
  };
  const data = generateSyntheticResiduals(options);
  if (values.csv) {
    if (values.station || values['apriori-zhd'] !== undefined || values['zwd-interval'] !== undefined) {
      throw new UsageError(
        '--station, --apriori-zhd and --zwd-interval shape the JSON body; with --csv put them in the query of the request',
      );
    }
    return toCsv(data);
  }
  const { site, ...rest } = toRequestBody(data, options);
  const body: Record<string, unknown> = values.station ? { ...rest } : { site, ...rest };
  if (values['apriori-zhd'] !== undefined) body.apriori = { zhd_m: numberOption(values, 'apriori-zhd', 0, 3) };
  if (values['zwd-interval'] !== undefined) body.options = { zwd_interval_s: numberOption(values, 'zwd-interval', 30, 86_400) };
  return JSON.stringify(body) + '\n';
}

if (import.meta.url === `file://${process.argv[1]}`) {
  runCli(SYNTHETIC_CLI, (values) => writeOutput(syntheticCliOutput(values), values.out));
}
