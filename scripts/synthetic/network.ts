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
 *   PWV(t) precipitable water [mm]: a smooth positive series around the station's mean (demoMeanPwvMm);
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
  /** Seed of the station's truth (and of its noise, seed + 100). */
  seed?: number;
}

/**
 * The invented demo network. What is invented: every station id and name (no place of that name
 * exists; any likeness is chance), the heights, and all values (made here from a known truth).
 * What is not: the coordinates are points on land picked by hand across Europe, well inland (a test
 * checks each against the Natural Earth land polygons of world-atlas: test/scripts/demo-network.test.ts);
 * they are real places on the map, but no station stands there.
 * The first three (QUILL, BRACK, SALTM) carry the met fixtures of fixtures/demo/ and the README examples.
 */
export const DEMO_NETWORK: SyntheticStation[] = [
  {
    stationId: 'QUILL',
    name: 'Quillmarsh Fen',
    latitudeDeg: 52.137,
    longitudeDeg: 5.214,
    heightM: 48.3,
    description: 'Invented lowland station (demo data)',
    seed: 11,
  },
  {
    stationId: 'BRACK',
    name: 'Brackenwold Ridge',
    latitudeDeg: 47.52,
    longitudeDeg: 11.08,
    heightM: 1312.7,
    description: 'Invented mountain station (demo data)',
    seed: 12,
  },
  {
    stationId: 'SALTM',
    name: 'Saltmere Point',
    latitudeDeg: 39.05,
    longitudeDeg: -9.2,
    heightM: 92.0,
    description: 'Invented near-coast station (demo data)',
    seed: 13,
  },
  ...(
    [
      // id, invented name, latitude [deg], longitude [deg], ellipsoidal height [m] (invented), seed
      ['ORVEL', 'Orvelle Brook', 48.85, 2.0, 180, 100],
      ['TAMBR', 'Tambrecourt', 47.0, 4.5, 450, 101],
      ['CRAUX', 'Crauxmont Heights', 45.5, 3.0, 900, 102],
      ['VESTO', 'Vestonac Fields', 44.0, 1.5, 250, 103],
      ['PELIV', 'Pelivaux Marsh', 46.5, -0.5, 150, 104],
      ['GARRO', 'Garronde Hills', 43.8, 5.5, 600, 105],
      ['MESCA', 'Mescalar Plateau', 40.5, -4.0, 800, 106],
      ['ZURDE', 'Zurdeña Flats', 41.7, -1.0, 350, 107],
      ['OLVAN', 'Olvanes Ridge', 38.0, -4.0, 500, 108],
      ['BRIEZ', 'Briezo Uplands', 42.5, -6.0, 900, 109],
      ['TARVO', 'Tarvoa Downs', 39.5, -7.5, 400, 110],
      ['HOLMB', 'Holmbrach Forest', 50.5, 10.0, 400, 111],
      ['WENDL', 'Wendlitz Heath', 52.0, 12.5, 100, 112],
      ['KARST', 'Karstenau Vale', 49.0, 8.5, 160, 113],
      ['RUHLO', 'Ruhlonk Meadow', 51.0, 7.0, 150, 114],
      ['MOORV', 'Moorvelde', 53.0, 9.0, 60, 115],
      ['LUBNA', 'Lubnava Hills', 50.0, 15.0, 300, 116],
      ['DREVO', 'Drevolin Valley', 49.0, 17.5, 300, 117],
      ['PIASK', 'Piaskowno Plain', 52.0, 19.5, 180, 118],
      ['ZAGRO', 'Zagrobie Fields', 50.5, 22.0, 250, 119],
      ['TISZO', 'Tiszorna Steppe', 47.5, 19.0, 160, 120],
      ['MURAV', 'Muravesh Lowland', 46.0, 21.0, 150, 121],
      ['CIRPA', 'Cirpaneni Pass', 45.5, 25.0, 900, 122],
      ['BELOS', 'Belostran Hills', 44.0, 21.0, 300, 123],
      ['SAVNI', 'Savnik Terrace', 46.2, 14.5, 350, 124],
      ['POLTA', 'Poltaresca', 45.0, 11.5, 70, 125],
      ['UMBRO', 'Umbrasca Ridge', 43.0, 12.5, 500, 126],
      ['IRPAL', 'Irpalo Uplands', 41.0, 15.0, 600, 127],
      ['AARWI', 'Aarwil Plateau', 47.0, 8.0, 550, 128],
      ['SKOGR', 'Skogrund Lakes', 59.5, 15.0, 150, 129],
      ['FJELM', 'Fjelmo Heights', 62.0, 10.0, 700, 130],
      ['JARVU', 'Järvunen Woods', 62.5, 27.0, 150, 131],
      ['FELLS', 'Fellsgarth Moor', 54.5, -2.5, 400, 132],
      ['ASHWY', 'Ashwyke Vale', 52.3, -1.5, 150, 133],
      ['BALLY', 'Ballycorran Bog', 53.0, -8.0, 120, 134],
      ['GLENM', 'Glenmorva Braes', 56.5, -4.0, 400, 135],
      ['STEPK', 'Stepkovo Plain', 48.5, 31.0, 250, 136],
    ] as const
  ).map(([stationId, name, latitudeDeg, longitudeDeg, heightM, seed]) => ({
    stationId,
    name,
    latitudeDeg,
    longitudeDeg,
    heightM,
    description: 'Invented station (demo data)',
    seed,
  })),
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

/**
 * Mean PWV of a station's truth [mm]: drier to the north and with height (an invented but
 * plausible climatology: about 22 mm at 40° N near sea level, 11 mm at 62° N and 700 m).
 */
export function demoMeanPwvMm(station: Pick<SyntheticStation, 'latitudeDeg' | 'heightM'>): number {
  return 30 * Math.exp(-station.heightM / 2000) * (1 - (station.latitudeDeg - 35) / 60);
}

/** The truth at regular epochs for one station: PWV = mean · (1 + 0.4 synoptic wave + 0.12 diurnal). */
export function truthSeries(station: SyntheticStation, startMs: number, count: number, stepMs: number, seed = 1): TruthRecord[] {
  const random = mulberry32(seed);
  const phase = random() * 2 * Math.PI;
  const baseP = 1013.25 * Math.pow(1 - 2.26e-5 * station.heightM, 5.225);
  const meanPwv = demoMeanPwvMm(station);
  // A synoptic wave that travels eastward across the network: its phase falls by 2π over 40° of longitude.
  const wave = (-2 * Math.PI * station.longitudeDeg) / 40;
  const out: TruthRecord[] = new Array(count);
  for (let i = 0; i < count; i++) {
    const epochMs = startMs + i * stepMs;
    const days = epochMs / 86_400_000;
    const hourAngle = 2 * Math.PI * (days % 1);
    const pressureHpa = baseP + 8 * Math.sin((2 * Math.PI * days) / 5.3 + phase) + 1.2 * Math.cos(2 * hourAngle);
    const temperatureC = 10 - 0.0065 * station.heightM + 8 * Math.sin((2 * Math.PI * (days - 110)) / 365.25) + 5 * Math.sin(hourAngle - 2);
    const relativeHumidityPct = 70 - 15 * Math.sin(hourAngle - 2);
    const pwvMm = meanPwv * (1 + 0.4 * Math.sin((2 * Math.PI * days) / 3.7 + phase + wave) + 0.12 * Math.sin(hourAngle));
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
