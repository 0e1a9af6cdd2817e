import { describe, expect, it } from 'vitest';
import { DEG } from '../../src/domain/constants.js';
import { zenithHydrostaticDelayM } from '../../src/domain/zenith/hydrostatic.js';
import { askneNordiusWetDelayM, saastamoinenWetDelayM } from '../../src/domain/zenith/wet.js';
import { MM } from '../helpers/units.js';

describe('Saastamoinen hydrostatic delay, IERS Conventions (2010) eq. 9.11 (Davis et al. 1985)', () => {
  // ZHD = 0.0022768 P / (1 − 0.00266 cos 2φ − 0.28e-6 H), written out here from the Conventions (from memory).
  const iers = (pHpa: number, latDeg: number, hM: number) => (0.0022768 * pHpa) / (1 - 0.00266 * Math.cos(2 * latDeg * DEG) - 0.28e-6 * hM);

  it('is about 2.3 m at sea level, 45°, 1013.25 hPa (common practice)', () => {
    expect(zenithHydrostaticDelayM(1013.25, 45 * DEG, 0)).toBeCloseTo(2.3, 1);
  });

  it.each([
    [1013.25, 45, 0],
    [1013.25, 0, 0],
    [1013.25, 90, 0],
    [700, -33, 3000],
    [300, 60, 9000],
    [1100, -80, -400],
  ])('matches the formula of eq. 9.11 at P=%s hPa, φ=%s°, H=%s m to 0.001 mm', (p, lat, h) => {
    expect(Math.abs(zenithHydrostaticDelayM(p, lat * DEG, h) - iers(p, lat, h))).toBeLessThan(0.001 * MM);
  });

  it('its constant 0.0022768 m/hPa is 1e-6 k1 Rd / g_m with k1 = 77.604 K/hPa, Rd = 287.0464 J/(kg K), g_m = 9.784 m/s² (docs/constants.md)', () => {
    const perHpa = zenithHydrostaticDelayM(1, 45 * DEG, 0); // cos 90° = 0, H = 0: the bare constant
    expect(perHpa).toBeCloseTo((1e-6 * 77.604 * 287.0464) / 9.784, 7);
  });

  it('grows by about 2.3 mm per hPa (common practice)', () => {
    const d = zenithHydrostaticDelayM(1001, 45 * DEG, 0) - zenithHydrostaticDelayM(1000, 45 * DEG, 0);
    expect(d).toBeGreaterThan(2.27 * MM);
    expect(d).toBeLessThan(2.29 * MM);
  });

  it('is larger at the equator than at the poles for the same pressure (gravity is smaller there; common practice)', () => {
    expect(zenithHydrostaticDelayM(1013.25, 0, 0)).toBeGreaterThan(zenithHydrostaticDelayM(1013.25, 90 * DEG, 0));
    // ratio (1 + 0.00266)/(1 − 0.00266) − 1 ≈ 0.53 %, eq. 9.11
    const ratio = zenithHydrostaticDelayM(1013.25, 0, 0) / zenithHydrostaticDelayM(1013.25, 90 * DEG, 0);
    expect(ratio).toBeCloseTo(1.00266 / 0.99734, 9);
  });
});

describe('Saastamoinen (1972) wet delay, ZWD = 0.002277 (1255/T + 0.05) e (from memory)', () => {
  it('gives about 0.15 m for 15 hPa at 15 °C (common practice: ZWD in mm ≈ 10 × e in hPa at mid temperatures)', () => {
    const zwd = saastamoinenWetDelayM(288.15, 15);
    expect(zwd).toBeCloseTo(0.002277 * (1255 / 288.15 + 0.05) * 15, 12);
    expect(zwd).toBeGreaterThan(0.14);
    expect(zwd).toBeLessThan(0.16);
  });

  it('is zero for dry air and rejects a negative vapour pressure', () => {
    expect(saastamoinenWetDelayM(288.15, 0)).toBe(0);
    expect(() => saastamoinenWetDelayM(288.15, -1)).toThrow(/vapour pressure/);
  });
});

describe('Askne & Nordius (1987) wet delay with λ = 3 and a 6.5 K/km lapse rate', () => {
  // ZWD = 1e-6 (k2' + k3/Tm) Rd e / (g_m (λ+1)), Tm = T (1 − β Rd/(g_m (λ+1))); Bevis et al. (1994) k's (from memory).
  it('follows the written-out formula', () => {
    const T = 293.15;
    const e = 20; // hPa
    const tm = T * (1 - (0.0065 * 287.0464) / (9.784 * 4));
    const expected = (1e-6 * (0.221 + 3739 / tm) * 287.0464 * (e * 100)) / (9.784 * 4);
    expect(askneNordiusWetDelayM(T, e)).toBeCloseTo(expected, 12);
  });

  it('agrees with Saastamoinen within 5 % for typical surface conditions (common practice: the two differ by a few per cent)', () => {
    for (const [T, e] of [
      [273.15, 5],
      [288.15, 12],
      [298.15, 25],
      [303.15, 35],
    ] as const) {
      const a = askneNordiusWetDelayM(T, e);
      const s = saastamoinenWetDelayM(T, e);
      expect(Math.abs(a - s) / s).toBeLessThan(0.05);
    }
  });
});
