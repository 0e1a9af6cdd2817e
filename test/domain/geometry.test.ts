import LatLonNvector from 'geodesy/latlon-nvector-ellipsoidal.js';
import { Cartesian } from 'geodesy/latlon-ellipsoidal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DEG } from '../../src/domain/constants.js';
import { geodeticToEcef, lookAngles } from '../../src/domain/geometry/topocentric.js';

const GNSS_ORBIT_RADIUS_M = 26_560e3; // about 26 560 km (common practice)
// A fixed seed keeps CI deterministic; change it locally to explore other cases.
const FC = { numRuns: 200, seed: 20261201 };

describe('site-to-satellite geometry', () => {
  it('a GNSS satellite at zero elevation is seen from the geocentre at a nadir angle of about 14° (common practice)', () => {
    // Put the satellite on the site's horizon, due north, at GNSS orbit radius (spherical-earth picture).
    const lat = 0;
    const site = geodeticToEcef(lat, 0, 0);
    const r = Math.hypot(site.xM, site.yM, site.zM);
    const along = Math.sqrt(GNSS_ORBIT_RADIUS_M ** 2 - r ** 2);
    const look = lookAngles(lat, 0, site, { xM: r, yM: 0, zM: along });
    expect(Math.abs(look.elevationRad / DEG)).toBeLessThan(0.01);
    expect(look.nadirRad / DEG).toBeGreaterThan(13.5);
    expect(look.nadirRad / DEG).toBeLessThan(14.2);
  });

  it('WGS84 ECEF of a point agrees with the geodesy package (independent reference) to 1 mm', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -89.9, max: 89.9, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        fc.double({ min: -500, max: 9000, noNaN: true }),
        (lat, lon, h) => {
          const ours = geodeticToEcef(lat * DEG, lon * DEG, h);
          const ref = new LatLonNvector(lat, lon, h).toCartesian();
          expect(Math.abs(ours.xM - ref.x)).toBeLessThan(1e-3);
          expect(Math.abs(ours.yM - ref.y)).toBeLessThan(1e-3);
          expect(Math.abs(ours.zM - ref.z)).toBeLessThan(1e-3);
        },
      ),
      FC,
    );
  });

  it('azimuth and elevation agree with the geodesy package’s NED delta (bearing, elevation) to 1e-5° (0.04″; the package takes asin(−down/length), which loses digits near the zenith)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -85, max: 85, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        fc.double({ min: -1, max: 1, noNaN: true }),
        fc.double({ min: -1, max: 1, noNaN: true }),
        fc.double({ min: 0.1, max: 1, noNaN: true }),
        (lat, lon, e, n, u) => {
          const site = geodeticToEcef(lat * DEG, lon * DEG, 100);
          // A satellite 20 000 km away in a random upward direction (built in ENU, rotated to ECEF).
          const len = Math.hypot(e, n, u);
          const [E, N, U] = [(e / len) * 2e7, (n / len) * 2e7, (u / len) * 2e7];
          const sl = Math.sin(lat * DEG),
            cl = Math.cos(lat * DEG),
            so = Math.sin(lon * DEG),
            co = Math.cos(lon * DEG);
          const sat = {
            xM: site.xM - so * E - sl * co * N + cl * co * U,
            yM: site.yM + co * E - sl * so * N + cl * so * U,
            zM: site.zM + cl * N + sl * U,
          };
          const ours = lookAngles(lat * DEG, lon * DEG, site, sat);
          const satLatLon = new Cartesian(sat.xM, sat.yM, sat.zM).toLatLon();
          const delta = new LatLonNvector(lat, lon, 100).deltaTo(new LatLonNvector(satLatLon.lat, satLatLon.lon, satLatLon.height));
          expect(Math.abs(ours.elevationRad / DEG - delta.elevation)).toBeLessThan(1e-5);
          // Azimuth is undefined at zenith: compare it where the horizontal component is not tiny.
          if (Math.hypot(E, N) > 1e3) {
            const dAz = Math.abs(((ours.azimuthRad / DEG - delta.bearing + 540) % 360) - 180);
            expect(dAz).toBeLessThan(1e-5);
          }
        },
      ),
      FC,
    );
  });
});
