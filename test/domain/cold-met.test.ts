import { describe, expect, it } from 'vitest';
import { geoidUndulationM } from '../../src/domain/geometry/geoid.js';
import { saturationVapourPressureHpa } from '../../src/domain/meteo/saturation.js';
import { resolveSurfaceMet } from '../../src/domain/meteo/surface-met.js';
import { aprioriZenithDelays } from '../../src/domain/zenith/apriori.js';
import { DEG, MM } from '../helpers/units.js';

// An invented high-plateau winter site.
const site = { latitudeDeg: -75.1, longitudeDeg: 123.3, heightM: 3250 };

describe('ZHD at every temperature the API accepts (Saastamoinen/Davis needs only pressure; IERS 2010 eq. 9.11)', () => {
  it.each([-45.5, -60, -75, -90])('at %f °C the ZHD is eq. 9.11 of the pressure, and the wet part is extrapolated with a warning', (t) => {
    const z = aprioriZenithDelays(site, { pressureHpa: 650, temperatureC: t, relativeHumidityPct: 70 }, 'saastamoinen');
    const zhd = (0.0022768 * 650) / (1 - 0.00266 * Math.cos(2 * site.latitudeDeg * DEG) - 0.28e-6 * site.heightM); // eq. 9.11 written out
    expect(Math.abs(z.zhdM - zhd)).toBeLessThan(0.001 * MM);
    // e_w(−45 °C) = 0.11 hPa (WMO-No. 8 formula), so the wet delay is below 2 mm (Saastamoinen 1972, from memory)
    expect(z.zwdM).toBeGreaterThanOrEqual(0);
    expect(z.zwdM).toBeLessThan(2 * MM);
    expect(z.met.warnings.join(' ')).toMatch(/below the -45 °C validity .* extrapolated/);
  });

  it('a dew point of −80 °C is extrapolated the same way, and the standard-atmosphere humidity too', () => {
    const d = aprioriZenithDelays(site, { pressureHpa: 650, temperatureC: -50, dewpointC: -80 }, 'askne-nordius');
    expect(d.zwdM).toBeLessThan(0.1 * MM);
    const s = aprioriZenithDelays(site, { pressureHpa: 650, temperatureC: -70 }, 'saastamoinen');
    expect(s.met.source.humidity).toBe('standard-atmosphere');
    expect(s.zwdM).toBeLessThan(1 * MM);
  });

  it('the saturation formula itself still refuses below −45 °C unless told to extrapolate (WMO-No. 8 states −45..60 °C)', () => {
    expect(() => saturationVapourPressureHpa(-50)).toThrow(/-45..60/);
    expect(saturationVapourPressureHpa(-50, 'temperature_c', 'extrapolate')).toBeCloseTo(
      6.112 * Math.exp((17.62 * -50) / (243.12 - 50)),
      12,
    );
  });

  it('met resolution warns once and keeps the pressure as measured', () => {
    const m = resolveSurfaceMet(2000, { pressureHpa: 700, temperatureC: -88, relativeHumidityPct: 50 });
    expect(m.pressureHpa).toBe(700);
    expect(m.warnings).toHaveLength(1);
  });
});

describe('the standard atmosphere is taken at the height above sea level (h − N, EGM96)', () => {
  it('a site on the geoid gets the sea-level pressure of Berg (1948), 1013.25 hPa, whatever its ellipsoidal height', () => {
    const lat = 10;
    const lon = 77; // N ≈ −90 m south of India (EGM96 low, from memory)
    const n = geoidUndulationM(lat, lon);
    expect(n).toBeLessThan(-80);
    const z = aprioriZenithDelays({ latitudeDeg: lat, longitudeDeg: lon, heightM: n }, undefined, 'saastamoinen');
    expect(z.met.pressureHpa).toBeCloseTo(1013.25, 9);
    expect(z.geoidUndulationM).toBe(n);
  });
});
