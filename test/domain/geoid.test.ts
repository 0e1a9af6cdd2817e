import { describe, expect, it } from 'vitest';
import { geoidUndulationM, siteHeights } from '../../src/domain/geometry/geoid.js';
import { M } from '../helpers/units.js';

describe("EGM96 geoid undulation against NGA test points (the check values distributed with NGA's EGM96 interpolation program, from memory)", () => {
  // latitude [deg], longitude [deg east, 0..360], N [m] from the spherical-harmonic synthesis.
  // The 15′ grid with bilinear interpolation differs from the synthesis by a few cm (common practice);
  // a tolerance of 0.1 m still catches a swapped latitude/longitude, a sign or a wrong grid row (metres).
  it.each([
    [38.628155, 269.779155, -31.629],
    [-14.621217, 305.021114, -2.966],
    [46.874319, 102.448729, -43.572],
    [-23.617446, 133.874712, 15.868],
    [38.625473, 359.9995, 50.065],
    [-0.466744, 0.0023, 17.33],
  ])('at (%f, %f) N = %f m (±0.1 m)', (lat, lon, expected) => {
    expect(Math.abs(geoidUndulationM(lat, lon) - expected)).toBeLessThan(0.1 * M);
    // the same point with a longitude in −180..180
    expect(Math.abs(geoidUndulationM(lat, lon > 180 ? lon - 360 : lon) - expected)).toBeLessThan(0.1 * M);
  });

  it('is 13.6 m at the North Pole and −29.5 m at the South Pole, whatever the longitude (EGM96, from memory)', () => {
    for (const lon of [0, 90, -135]) {
      expect(Math.abs(geoidUndulationM(90, lon) - 13.61)).toBeLessThan(0.05 * M);
      expect(Math.abs(geoidUndulationM(-90, lon) - -29.53)).toBeLessThan(0.05 * M);
    }
  });

  it('stays within the known extremes of EGM96, about −107 m (Indian Ocean) to +86 m (New Guinea) (from memory)', () => {
    for (let lat = -90; lat <= 90; lat += 7.5) {
      for (let lon = -180; lon < 180; lon += 7.5) {
        const n = geoidUndulationM(lat, lon);
        expect(n).toBeGreaterThan(-108);
        expect(n).toBeLessThan(87);
      }
    }
  });

  it('gives the height above sea level as h − N', () => {
    const h = siteHeights(46.874319, 102.448729, 1500);
    expect(h.geoidUndulationM).toBeCloseTo(geoidUndulationM(46.874319, 102.448729), 12);
    expect(h.aboveSeaLevelM).toBeCloseTo(1500 - h.geoidUndulationM, 9);
    expect(h.ellipsoidalM).toBe(1500);
  });

  it('refuses a latitude outside −90..90° with the field named', () => {
    expect(() => geoidUndulationM(91, 0)).toThrow(/−90..90/);
    expect(() => geoidUndulationM(Number.NaN, 0)).toThrow(/latitude/);
  });
});
