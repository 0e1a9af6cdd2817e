import { describe, expect, it } from 'vitest';
import { DEG } from '../../src/domain/constants.js';
import { chenHerringGradientMapping, GRADIENT_MODELS } from '../../src/domain/gradients/gradient-mapping.js';
import { chaoModel } from '../../src/domain/mapping/chao.js';
import { cosecantModel } from '../../src/domain/mapping/cosecant.js';
import { niellModel } from '../../src/domain/mapping/niell.js';
import { MAPPING_MODELS } from '../../src/domain/mapping/registry.js';
import { elevationSines } from '../../src/domain/mapping/elevation-sines.js';
import { vmf1Model } from '../../src/domain/mapping/vmf1.js';

// The normalised continued fraction of Marini (1972) as Niell (1996) writes it, eq. 4 (docs/constants.md).
const f = (e: number, a: number, b: number, c: number) =>
  (1 + a / (1 + b / (1 + c))) / (Math.sin(e) + a / (Math.sin(e) + b / (Math.sin(e) + c)));

const niell = (latDeg: number, doy: number, heightM = 0) => niellModel.prepare({ latitudeRad: latDeg * DEG, heightM, dayOfYear: doy });

describe('Niell (1996) mapping functions against the published coefficient table (Table 3, confirmed in docs/constants.md)', () => {
  // Transcribed here independently of src/: 45° row, and the height-correction coefficients.
  const AVG_45 = { a: 1.2465397e-3, b: 2.9288445e-3, c: 63.721774e-3 };
  const AMP_45 = { a: 2.6523662e-5, b: 3.0160779e-5, c: 4.3497037e-5 };
  const WET_45 = { a: 5.8118019e-4, b: 1.4572752e-3, c: 4.3908931e-2 };
  const WET_75 = { a: 6.1641693e-4, b: 1.7599082e-3, c: 5.4736038e-2 };
  const AVG_15 = { a: 1.2769934e-3, b: 2.9153695e-3, c: 62.610505e-3 };
  const HT = { a: 2.53e-5, b: 5.49e-3, c: 1.14e-3 };
  const elevations = [3, 5, 7, 10, 15, 20, 30, 50, 70, 90].map((d) => d * DEG);

  it('hydrostatic at 45°N on day 28 (seasonal cosine = 1: average − amplitude) equals the table’s continued fraction to 1e-12', () => {
    const m = niell(45, 28);
    for (const e of elevations) {
      expect(m.hydrostatic(e)).toBeCloseTo(f(e, AVG_45.a - AMP_45.a, AVG_45.b - AMP_45.b, AVG_45.c - AMP_45.c), 12);
    }
  });

  it('hydrostatic at 45°N on day 28 + 365.25/2 (cosine = −1: average + amplitude)', () => {
    const m = niell(45, 28 + 365.25 / 2);
    for (const e of elevations) {
      expect(m.hydrostatic(e)).toBeCloseTo(f(e, AVG_45.a + AMP_45.a, AVG_45.b + AMP_45.b, AVG_45.c + AMP_45.c), 12);
    }
  });

  it('has no seasonal term at 15° and below (amplitudes 0) and is constant below 15° (confirmed)', () => {
    for (const lat of [0, 7.5, 15]) {
      expect(niell(lat, 100).hydrostatic(5 * DEG)).toBeCloseTo(f(5 * DEG, AVG_15.a, AVG_15.b, AVG_15.c), 12);
    }
  });

  it('wet at 45° and, held constant above 75°, at 80° and 90°', () => {
    for (const e of elevations) {
      expect(niell(45, 200).wet(e)).toBeCloseTo(f(e, WET_45.a, WET_45.b, WET_45.c), 12);
      expect(niell(80, 200).wet(e)).toBeCloseTo(f(e, WET_75.a, WET_75.b, WET_75.c), 12);
      expect(niell(-90, 200).wet(e)).toBeCloseTo(f(e, WET_75.a, WET_75.b, WET_75.c), 12);
    }
  });

  it('interpolates linearly in |latitude| between table rows (37.5° is the mean of the 30° and 45° coefficients)', () => {
    const WET_30 = { a: 5.6794847e-4, b: 1.5138625e-3, c: 4.672951e-2 };
    const mid = { a: (WET_30.a + WET_45.a) / 2, b: (WET_30.b + WET_45.b) / 2, c: (WET_30.c + WET_45.c) / 2 };
    expect(niell(37.5, 1).wet(5 * DEG)).toBeCloseTo(f(5 * DEG, mid.a, mid.b, mid.c), 12);
  });

  it('adds the height correction (1/sin e − f(e; a_ht, b_ht, c_ht)) · H[km] to the hydrostatic factor only', () => {
    const e = 5 * DEG;
    const dm = (1 / Math.sin(e) - f(e, HT.a, HT.b, HT.c)) * 2; // H = 2 km
    expect(niell(45, 28, 2000).hydrostatic(e) - niell(45, 28, 0).hydrostatic(e)).toBeCloseTo(dm, 12);
    expect(niell(45, 28, 2000).wet(e)).toBe(niell(45, 28, 0).wet(e));
  });
});

describe('Niell (1996) mapping functions: properties', () => {
  it('are 1 at zenith (normalised continued fraction)', () => {
    for (const lat of [-80, -45, 0, 30, 60]) {
      const m = niell(lat, 150, 500);
      expect(m.hydrostatic(90 * DEG)).toBeCloseTo(1, 12);
      expect(m.wet(90 * DEG)).toBeCloseTo(1, 12);
    }
  });

  it('are about 10 at 5° elevation (common practice); hydrostatic ≈ 10.15 and wet ≈ 10.75 at mid latitudes (from memory)', () => {
    const m = niell(45, 180);
    expect(m.hydrostatic(5 * DEG)).toBeGreaterThan(10.0);
    expect(m.hydrostatic(5 * DEG)).toBeLessThan(10.3);
    expect(m.wet(5 * DEG)).toBeGreaterThan(10.6);
    expect(m.wet(5 * DEG)).toBeLessThan(10.9);
  });

  it('decrease monotonically with elevation from 1° to 90°', () => {
    const m = niell(52, 300, 1200);
    let prevH = Infinity;
    let prevW = Infinity;
    for (let d = 1; d <= 90; d += 0.25) {
      const h = m.hydrostatic(d * DEG);
      const w = m.wet(d * DEG);
      expect(h).toBeLessThan(prevH);
      expect(w).toBeLessThan(prevW);
      prevH = h;
      prevW = w;
    }
  });

  it('are symmetric between hemispheres with a half-year shift (Niell 1996; from memory)', () => {
    for (const lat of [20, 45, 70]) {
      for (const doy of [1, 100, 200, 300]) {
        const north = niell(lat, doy);
        const south = niell(-lat, doy - 365.25 / 2);
        expect(south.hydrostatic(6 * DEG)).toBeCloseTo(north.hydrostatic(6 * DEG), 12);
      }
    }
  });

  it('are continuous across the table latitudes', () => {
    for (const lat of [15, 30, 45, 60, 75]) {
      const below = niell(lat - 1e-9, 75).hydrostatic(3 * DEG);
      const above = niell(lat + 1e-9, 75).hydrostatic(3 * DEG);
      expect(Math.abs(below - above)).toBeLessThan(1e-9);
    }
  });

  it('stay below the cosecant (the flat-earth limit; common practice)', () => {
    const m = niell(45, 1);
    for (const d of [3, 5, 10, 30, 60]) expect(m.hydrostatic(d * DEG)).toBeLessThan(1 / Math.sin(d * DEG));
  });
});

describe('VMF1 (Boehm, Werl & Schuh 2006) with caller-supplied a coefficients (b, c from memory)', () => {
  it('uses b = 0.0029 and the seasonal c of the paper for the hydrostatic part, b = 0.00146, c = 0.04391 for the wet part', () => {
    const ah = 0.00121;
    const aw = 0.00058;
    const lat = 45 * DEG;
    const doy = 28; // cos term = 1: c = 0.062 + (0.005 + 0.001)(1 − cos φ) in the north
    const c = 0.062 + (0.005 + 0.001) * (1 - Math.cos(lat));
    const m = vmf1Model.prepare({ latitudeRad: lat, heightM: 0, dayOfYear: doy, coefficients: { ah, aw } });
    expect(m.hydrostatic(7 * DEG)).toBeCloseTo(f(7 * DEG, ah, 0.0029, c), 12);
    expect(m.wet(7 * DEG)).toBeCloseTo(f(7 * DEG, aw, 0.00146, 0.04391), 12);
  });

  it('with typical a coefficients stays within 1 % of Niell at 5° (common practice: the two differ by tenths of a per cent on average)', () => {
    const v = vmf1Model.prepare({ latitudeRad: 45 * DEG, heightM: 0, dayOfYear: 180, coefficients: { ah: 0.00123, aw: 0.00058 } });
    const n = niell(45, 180);
    expect(Math.abs(v.hydrostatic(5 * DEG) / n.hydrostatic(5 * DEG) - 1)).toBeLessThan(0.01);
  });

  it('refuses to run without coefficients', () => {
    expect(() => vmf1Model.prepare({ latitudeRad: 0, heightM: 0, dayOfYear: 1 })).toThrow(/coefficients/);
  });
});

describe('comparison mapping functions', () => {
  it('Chao (1972): 1/(sin e + a/(tan e + b)) with dry a=0.00143, b=0.0445 (from memory)', () => {
    const m = chaoModel.prepare({ latitudeRad: 0, heightM: 0, dayOfYear: 1 });
    const e = 10 * DEG;
    expect(m.hydrostatic(e)).toBeCloseTo(1 / (Math.sin(e) + 0.00143 / (Math.tan(e) + 0.0445)), 12);
    expect(m.hydrostatic(90 * DEG)).toBeCloseTo(1, 12);
    expect(Math.abs(m.hydrostatic(e) / niell(45, 180).hydrostatic(e) - 1)).toBeLessThan(0.01); // agree within 1 % at 10° (common practice)
  });

  it('cosecant is 1/sin e', () => {
    const m = cosecantModel.prepare({ latitudeRad: 0, heightM: 0, dayOfYear: 1 });
    expect(m.wet(30 * DEG)).toBeCloseTo(2, 12);
  });

  it('every registered model answers 1 at zenith and more than 5 at 10° (common practice)', () => {
    for (const model of Object.values(MAPPING_MODELS)) {
      const m = model.prepare({ latitudeRad: 0.7, heightM: 0, dayOfYear: 50, coefficients: { ah: 0.0012, aw: 0.0006 } });
      expect(m.hydrostatic(Math.PI / 2)).toBeCloseTo(1, 9);
      expect(m.wet(10 * DEG)).toBeGreaterThan(5);
    }
  });
});

describe('gradient mapping functions', () => {
  it('Chen & Herring (1997): 1/(sin e tan e + 0.0032) (C from IERS Conventions 2010, from memory)', () => {
    const e = 10 * DEG;
    expect(chenHerringGradientMapping(e)).toBeCloseTo(1 / (Math.sin(e) * Math.tan(e) + 0.0032), 12);
    expect(chenHerringGradientMapping(90 * DEG)).toBeLessThan(1e-12);
  });

  it('the tilting form m_h(e) cot e agrees with Chen & Herring within 1 % at and above 30° (common practice)', () => {
    const tilt = GRADIENT_MODELS['tilting']!.prepare(niell(45, 180));
    for (const d of [30, 45, 60, 75]) {
      expect(Math.abs(tilt(d * DEG) / chenHerringGradientMapping(d * DEG) - 1)).toBeLessThan(0.01);
    }
  });
});

describe('batch forms (mapBatch) against the published forms, for every registered model', () => {
  // The batch loops are separate code written for speed (src/domain/slant.ts); each must give what the
  // single-elevation functions give, which the blocks above check against Niell's Table 3, VMF1, Chao
  // and Chen & Herring. Site heights 0 and 1.2 km, both VMF1 height references.
  const elevationsRad = Float64Array.from([1.5, 3, 5, 7, 10, 20, 45, 89.9, 90], (d) => d * DEG);
  const contexts = [
    { latitudeRad: 0.7, heightM: 0, dayOfYear: 50, coefficients: { ah: 0.0012, aw: 0.0006, heightReference: 'site' as const } },
    {
      latitudeRad: -1.1,
      heightM: 1200,
      dayOfYear: 300.5,
      coefficients: { ah: 0.00125, aw: 0.0005, heightReference: 'sea-level' as const },
    },
  ];

  it('mapping functions: hydrostatic and wet bit for bit the single-elevation forms (Object.is)', () => {
    for (const model of Object.values(MAPPING_MODELS)) {
      for (const context of contexts) {
        const m = model.prepare(context);
        const h = new Float64Array(elevationsRad.length);
        const w = new Float64Array(elevationsRad.length);
        m.mapBatch(elevationsRad, elevationSines(elevationsRad, new Float64Array(elevationsRad.length)), h, w);
        elevationsRad.forEach((e, i) => {
          expect(Object.is(h[i], m.hydrostatic(e)), `${model.key} hydrostatic at ${e / DEG}°`).toBe(true);
          expect(Object.is(w[i], m.wet(e)), `${model.key} wet at ${e / DEG}°`).toBe(true);
        });
      }
    }
  });

  // Chen & Herring's batch writes sin e tan e as s²/√(1 − s²) (one transcendental call fewer): equal to 1e-12;
  // every other gradient model bit for bit.
  const gradientDigits: Record<string, number> = { 'chen-herring': 12 };

  it('gradient mapping: equal to the single-elevation form (bit for bit but Chen & Herring), 0 at the zenith', () => {
    const mapping = niell(45, 180, 400);
    const h = new Float64Array(elevationsRad.length);
    const sines = elevationSines(elevationsRad, new Float64Array(elevationsRad.length));
    mapping.mapBatch(elevationsRad, sines, h, new Float64Array(elevationsRad.length));
    for (const model of Object.values(GRADIENT_MODELS)) {
      const g = new Float64Array(elevationsRad.length);
      model.mapBatch(elevationsRad, sines, h, g);
      const single = model.prepare(mapping);
      const digits = gradientDigits[model.key];
      elevationsRad.forEach((e, i) => {
        if (digits === undefined) expect(Object.is(g[i], single(e)), `${model.key} at ${e / DEG}°`).toBe(true);
        else expect(g[i]!, `${model.key} at ${e / DEG}°`).toBeCloseTo(single(e), digits);
      });
      expect(g.at(-1)).toBe(0);
    }
  });
});
