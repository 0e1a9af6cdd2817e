/**
 * Generator of synthetic station data with a known truth, for the demo, the tests and the
 * benchmarks. It imports nothing from src/: the physics it needs is written out here from the
 * published formulas, so data made here can check the service's code independently.
 *
 * Truth per epoch t (UTC):
 *   P(t)   surface pressure at the met sensor [hPa]: a base value from the height (Berg 1948 form,
 *          1013.25 (1 − 2.26e-5 h)^5.225) plus a synoptic wave and the semi-diurnal tide;
 *   T(t)   air temperature [°C]: a seasonal and a diurnal cycle;
 *   RH(t)  relative humidity [%];
 *   PWV(t) precipitable water [mm]: a smooth positive series;
 * and the ZTD that goes with them:
 *   ZHD = 0.0022768 P / (1 − 0.00266 cos 2φ − 0.28e-6 H)         (IERS Conventions 2010, eq. 9.11)
 *   Tm  = 70.2 + 0.72 Ts                                         (Bevis et al. 1992)
 *   Π   = 1e6 / (ρw Rv (k3/Tm + k2')), ρw = 1000, Rv = 461.5, k3 = 3739 K²/Pa, k2' = 0.221 K/Pa  (Bevis et al. 1994)
 *   ZWD = PWV / Π,  ZTD = ZHD + ZWD
 * The met sensor sits at the antenna height here (met_height_m = height_m), so no reduction enters.
 *
 * Random parts come from a seeded generator (mulberry32), so the same seed gives the same data.
 */

export interface SyntheticStation {
  stationId: string;
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  heightM: number;
  description: string;
}

/** An invented network: the names and places do not exist. */
export const DEMO_NETWORK: SyntheticStation[] = [
  {
    stationId: 'QUILL',
    name: 'Quillmarsh Fen',
    latitudeDeg: 52.137,
    longitudeDeg: 5.214,
    heightM: 48.3,
    description: 'Invented lowland station (demo data)',
  },
  {
    stationId: 'BRACK',
    name: 'Brackenwold Ridge',
    latitudeDeg: 47.52,
    longitudeDeg: 11.08,
    heightM: 1312.7,
    description: 'Invented mountain station (demo data)',
  },
  {
    stationId: 'SALTM',
    name: 'Saltmere Point',
    latitudeDeg: 38.74,
    longitudeDeg: -9.61,
    heightM: 92.0,
    description: 'Invented coastal station (demo data)',
  },
];

// One seeded generator for all synthetic data (scripts/synthetic-residuals.ts), re-exported here.
export { mulberry32 } from '../synthetic-residuals.js';
import { mulberry32 } from '../synthetic-residuals.js';

/** Standard normal deviate from a uniform generator (Box–Muller). */
export function gaussian(random: () => number): number {
  const u = Math.max(random(), 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

export interface TruthRecord {
  epochMs: number;
  pressureHpa: number;
  temperatureC: number;
  relativeHumidityPct: number;
  pwvMm: number;
  zhdM: number;
  zwdM: number;
  ztdM: number;
  tmK: number;
  conversionFactor: number;
}

const DEG = Math.PI / 180;

export function saastamoinenZhdM(pressureHpa: number, latitudeDeg: number, heightM: number): number {
  return (0.0022768 * pressureHpa) / (1 - 0.00266 * Math.cos(2 * latitudeDeg * DEG) - 0.28e-6 * heightM);
}
export function bevisTmK(temperatureC: number): number {
  return 70.2 + 0.72 * (temperatureC + 273.15);
}
export function bevisConversionFactor(tmK: number): number {
  return 1e6 / (1000 * 461.5 * (3739 / tmK + 0.221));
}

/** The truth at regular epochs for one station. */
export function truthSeries(station: SyntheticStation, startMs: number, count: number, stepMs: number, seed = 1): TruthRecord[] {
  const random = mulberry32(seed);
  const phase = random() * 2 * Math.PI;
  const baseP = 1013.25 * Math.pow(1 - 2.26e-5 * station.heightM, 5.225);
  const out: TruthRecord[] = new Array(count);
  for (let i = 0; i < count; i++) {
    const epochMs = startMs + i * stepMs;
    const days = epochMs / 86_400_000;
    const hourAngle = 2 * Math.PI * (days % 1);
    const pressureHpa = baseP + 8 * Math.sin((2 * Math.PI * days) / 5.3 + phase) + 1.2 * Math.cos(2 * hourAngle);
    const temperatureC = 10 - 0.0065 * station.heightM + 8 * Math.sin((2 * Math.PI * (days - 110)) / 365.25) + 5 * Math.sin(hourAngle - 2);
    const relativeHumidityPct = 70 - 15 * Math.sin(hourAngle - 2);
    const pwvMm = 14 + 6 * Math.sin((2 * Math.PI * days) / 3.7 + phase) + 2 * Math.sin(hourAngle);
    const zhdM = saastamoinenZhdM(pressureHpa, station.latitudeDeg, station.heightM);
    const tmK = bevisTmK(temperatureC);
    const conversionFactor = bevisConversionFactor(tmK);
    const zwdM = pwvMm / 1000 / conversionFactor;
    out[i] = { epochMs, pressureHpa, temperatureC, relativeHumidityPct, pwvMm, zhdM, zwdM, ztdM: zhdM + zwdM, tmK, conversionFactor };
  }
  return out;
}

/** Rounds as a met sensor reports: 0.1 hPa, 0.1 °C, 0.1 %. */
export const round1 = (v: number) => Math.round(v * 10) / 10;
