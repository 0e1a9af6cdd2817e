import { describe, expect, it } from 'vitest';
import { geodeticToEcef, lookAngles, normaliseAzimuthDeg, normaliseAzimuthRad } from '../../src/domain/geometry/topocentric.js';
import { chenHerringGradientMapping, GRADIENT_MODELS } from '../../src/domain/gradients/gradient-mapping.js';
import { belowMappingFit, checkMappingElevation } from '../../src/domain/mapping/elevation-range.js';
import { niellModel } from '../../src/domain/mapping/niell.js';
import { assumedHeightReferenceWarning, vmf1Model } from '../../src/domain/mapping/vmf1.js';
import { DEG, MM } from '../helpers/units.js';

// The normalised continued fraction of Marini (1972) as Niell (1996) writes it, eq. 4 (docs/constants.md).
const f = (e: number, a: number, b: number, c: number) =>
  (1 + a / (1 + b / (1 + c))) / (Math.sin(e) + a / (Math.sin(e) + b / (Math.sin(e) + c)));

/** ZHD of a station 500 m above sea level, about 955 hPa (IERS 2010 eq. 9.11, common practice) [m]. */
const ZHD_500_M = 2.18;

describe("VMF1 (Boehm et al. 2006): Niell's height correction only for coefficients that refer to sea level", () => {
  const context = { latitudeRad: 46 * DEG, heightM: 500, dayOfYear: 200 };
  const ah = 0.00124;
  const aw = 0.00061;
  const site = vmf1Model.prepare({ ...context, coefficients: { ah, aw, heightReference: 'site' } });
  const seaLevel = vmf1Model.prepare({ ...context, coefficients: { ah, aw, heightReference: 'sea-level' } });
  const assumed = vmf1Model.prepare({ ...context, coefficients: { ah, aw } });

  it('coefficients at the site: the hydrostatic factor is the bare continued fraction (b = 0.0029, VMF1 c), no height term', () => {
    const atSeaLevelHeight = vmf1Model.prepare({ ...context, heightM: 0, coefficients: { ah, aw, heightReference: 'sea-level' } });
    for (const e of [3, 5, 7, 15, 40, 90].map((d) => d * DEG)) {
      // at H = 0 the correction vanishes, so both must agree; a site model that still corrected would not
      expect(site.hydrostatic(e)).toBeCloseTo(atSeaLevelHeight.hydrostatic(e), 14);
      expect(site.wet(e)).toBeCloseTo(f(e, aw, 0.00146, 0.04391), 14);
    }
  });

  it.each([
    // issue 10's figures for a station at 500 m: 24 mm of slant at 5°, 11 mm at 7° (Niell 1996 eq. 6 double-counted)
    [5, 24],
    [7, 11],
  ])('the double count removed for site coefficients is %i° → %i mm of slant at 500 m (±1 mm)', (elevationDeg, mm) => {
    const e = elevationDeg * DEG;
    const slantDifferenceM = (seaLevel.hydrostatic(e) - site.hydrostatic(e)) * ZHD_500_M;
    expect(Math.abs(slantDifferenceM - mm * MM)).toBeLessThan(1 * MM);
  });

  it('the default is "sea-level" (the grids; the behaviour before the choice existed) and the caller is warned', () => {
    expect(assumed.hydrostatic(5 * DEG)).toBe(seaLevel.hydrostatic(5 * DEG));
    expect(assumedHeightReferenceWarning({ ah, aw })).toMatch(/height_reference not given: "sea-level" assumed/);
    expect(assumedHeightReferenceWarning({ ah, aw, heightReference: 'site' })).toBeNull();
    expect(assumedHeightReferenceWarning(undefined)).toBeNull();
  });

  it('records which height correction was applied (models entry)', () => {
    expect(vmf1Model.heightCorrection({ ah, aw, heightReference: 'site' })).toMatch(/^none/);
    expect(vmf1Model.heightCorrection({ ah, aw })).toMatch(/niell-1996.*sea level/);
    expect(niellModel.heightCorrection()).toMatch(/above sea level/);
  });
});

describe('Niell (1996) height correction from the height above sea level: a 50 m geoid undulation matters', () => {
  it("moves a 5° slant by about 2.5 mm (issue 10's figure, ZHD 2.3 m; ±0.2 mm)", () => {
    const context = { latitudeRad: 47 * DEG, dayOfYear: 100 };
    const ellipsoidal = niellModel.prepare({ ...context, heightM: 350 });
    const seaLevel = niellModel.prepare({ ...context, heightM: 300 }); // N = 50 m
    const slantDifferenceM = (ellipsoidal.hydrostatic(5 * DEG) - seaLevel.hydrostatic(5 * DEG)) * 2.3;
    expect(Math.abs(slantDifferenceM - 2.5 * MM)).toBeLessThan(0.2 * MM);
  });
});

describe('the gradient mapping factor at the zenith (Chen & Herring 1997; tilting): exactly 0, not 6e-17', () => {
  it('chen-herring and tilting give 0 at 90°, and stay continuous just below', () => {
    expect(chenHerringGradientMapping(90 * DEG)).toBe(0);
    const tilting = GRADIENT_MODELS.tilting!.prepare(niellModel.prepare({ latitudeRad: 0.8, heightM: 0, dayOfYear: 10 }));
    expect(tilting(90 * DEG)).toBe(0);
    expect(chenHerringGradientMapping(89.999 * DEG)).toBeLessThan(2e-5); // ≈ cot e for e → 90° (common practice)
    expect(chenHerringGradientMapping(89.999 * DEG)).toBeGreaterThan(0);
  });
});

describe('azimuths in [0, 360)', () => {
  it('turns 360° (and 2π) into 0 and keeps everything else', () => {
    expect(normaliseAzimuthDeg(360)).toBe(0);
    expect(normaliseAzimuthDeg(359.5)).toBe(359.5);
    expect(normaliseAzimuthDeg(-0.5)).toBe(359.5);
    expect(normaliseAzimuthRad(2 * Math.PI)).toBe(0);
    expect(normaliseAzimuthRad(-1e-17)).toBe(0); // −1e-17 + 2π rounds to 2π
  });

  it('keeps every azimuth of [0, 360) bit for bit (−0 included) and wraps the others (common practice)', () => {
    const inRange = [
      -0,
      0,
      5e-324,
      1e-300,
      0.1,
      90,
      179.99999999999997,
      359.99999999999994,
      ...Array.from({ length: 3600 }, (_, i) => i / 10 + 0.01),
    ];
    for (const a of inRange) expect(Object.is(normaliseAzimuthDeg(a), a), `${a}`).toBe(true);
    expect(normaliseAzimuthDeg(720.25)).toBe(0.25);
    expect(normaliseAzimuthDeg(-90)).toBe(270);
    expect(normaliseAzimuthDeg(-1e-300)).toBe(0); // −1e-300 + 360 rounds to 360
  });

  it('look angles to a point due north at a hair west of the meridian stay below 360°', () => {
    const lat = 10 * DEG;
    const site = geodeticToEcef(lat, 0, 0);
    const north = geodeticToEcef(lat + 1 * DEG, -1e-15, 0);
    const look = lookAngles(lat, 0, site, north);
    expect(look.azimuthRad).toBeGreaterThanOrEqual(0);
    expect(look.azimuthRad).toBeLessThan(2 * Math.PI);
    expect(look.azimuthRad / DEG).not.toBe(360);
  });
});

describe('elevation range of the mapping functions (Niell 1996: fitted from 3°)', () => {
  it('an elevation of 3° computed with a rounding error of the last bits is not below 3°', () => {
    expect(belowMappingFit(3)).toBe(false);
    expect(belowMappingFit(2.9999999999999996)).toBe(false);
    expect(belowMappingFit(2.999)).toBe(true);
  });

  it('refuses elevations below 1° with a 400 naming the field (Infinity would be serialised as null)', () => {
    expect(() => checkMappingElevation(0.5, 'directions.0.elevation_deg')).toThrow(/below 1°/);
    expect(() => checkMappingElevation(1e-310, 'x')).toThrow(/below 1°/);
    expect(() => checkMappingElevation(1, 'x')).not.toThrow();
  });
});
