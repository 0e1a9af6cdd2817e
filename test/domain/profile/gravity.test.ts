import { describe, expect, it } from 'vitest';
import { geometricFromGeopotentialM, USSA_G0 } from '../../../scripts/generators/us-standard-atmosphere-1976.js';
import { gaussianRadiusM } from '../../../src/domain/geometry/earth-radius.js';
import { geometricHeightFromGeopotentialM, gravityAtLatitude, normalGravityOnEllipsoid } from '../../../src/domain/profile/gravity.js';
import { DEG, M, MM } from '../../helpers/units.js';

describe('WGS84 normal gravity, NIMA TR8350.2 (2000) Table 3.4 (from memory)', () => {
  it('γe = 9.7803253359 m/s² at the equator, γp = 9.8321849379 m/s² at the poles', () => {
    expect(Math.abs(normalGravityOnEllipsoid(0) - 9.7803253359)).toBeLessThan(1e-9);
    expect(Math.abs(normalGravityOnEllipsoid(90 * DEG) - 9.8321849379)).toBeLessThan(1e-9);
    expect(Math.abs(normalGravityOnEllipsoid(-90 * DEG) - 9.8321849379)).toBeLessThan(1e-9);
  });

  it('free-air gradient −0.3086 mGal/m at mid latitude (common practice)', () => {
    const g = gravityAtLatitude(45 * DEG);
    const gradientMgalPerM = (g.at(100) - g.at(0)) / 100 / 1e-5;
    expect(Math.abs(gradientMgalPerM + 0.3086)).toBeLessThan(0.0005);
  });

  it('at 100 km gravity is about 3 % below its surface value (inverse square: (R/(R+h))² = 0.969, common practice)', () => {
    const g = gravityAtLatitude(45 * DEG);
    expect(Math.abs(g.at(100_000) / g.surfaceM_S2 - (6_371_000 / 6_471_000) ** 2)).toBeLessThan(1e-3);
  });
});

describe('geopotential → geometric height against the U.S. Standard Atmosphere 1976 definition Z = r0 H / (r0 − H)', () => {
  // The standard's r0 = 6 356 766 m was chosen for the latitude where gravity at sea level is g0;
  // with WGS84 normal gravity that latitude is 45.50° (γ(45.50°) = 9.80665 m/s²).
  const latitudeRad = 45.4996 * DEG;
  const gravity = gravityAtLatitude(latitudeRad);
  it('γ = g0 at 45.50°', () => {
    expect(Math.abs(gravity.surfaceM_S2 - USSA_G0)).toBeLessThan(1e-6);
  });
  it.each([
    [1000, 1 * MM],
    [10_000, 5 * MM],
    [30_000, 2 * 0.01 * M],
    [80_000, 0.1 * M],
  ])("H = %d m' agrees within %f m", (h, tolerance) => {
    expect(Math.abs(geometricHeightFromGeopotentialM(h, gravity) - geometricFromGeopotentialM(h))).toBeLessThan(tolerance);
  });
  it('at the equator gravity is weaker, so the same geopotential lies higher (by about 0.27 %, the ratio of g0 to γe)', () => {
    const equator = geometricHeightFromGeopotentialM(10_000, gravityAtLatitude(0));
    expect(Math.abs(equator / geometricFromGeopotentialM(10_000) - USSA_G0 / 9.7803253359)).toBeLessThan(2e-4);
  });
});

describe('Gaussian mean radius of curvature R = sqrt(M N) (Torge & Müller 2012; WGS84, NIMA TR8350.2 Table 3.3, from memory)', () => {
  it('equals the semi-minor axis b = 6 356 752.3142 m at the equator and the polar radius of curvature a²/b = 6 399 593.6258 m at the poles', () => {
    expect(Math.abs(gaussianRadiusM(0) - 6_356_752.3142)).toBeLessThan(1 * MM);
    expect(Math.abs(gaussianRadiusM(90 * DEG) - 6_399_593.6258)).toBeLessThan(1 * MM);
  });
});
