import { describe, expect, it } from 'vitest';
import { reducePressureHpa, reduceTemperatureC } from '../../src/domain/meteo/height-reduction.js';
import { enhancementFactor, saturationVapourPressureHpa, vapourPressureFromDewpointHpa } from '../../src/domain/meteo/saturation.js';
import { standardAtmosphere } from '../../src/domain/meteo/standard-atmosphere.js';
import { resolveSurfaceMet } from '../../src/domain/meteo/surface-met.js';

describe('saturation vapour pressure over water, WMO-No. 8 (2008) Annex 4.B', () => {
  // Handbook values: CRC Handbook of Chemistry and Physics, 73rd ed.; IAPWS (Wagner & Pruß) — docs/constants.md.
  // The Magnus form is stated to agree with them to about 0.3 % between 0 and 30 °C.
  it.each([
    [0, 6.1129, 6.1121],
    [10, 12.281, 12.281],
    [20, 23.388, 23.392],
    [30, 42.455, 42.469],
  ])(
    'at %s °C agrees with the CRC table (%s hPa) and IAPWS (%s hPa) to 0.35 per cent (measured: 0.31 per cent at 30 °C; the source says about 0.3 per cent)',
    (t, crc, iapws) => {
      const e = saturationVapourPressureHpa(t);
      expect(Math.abs(e - crc) / crc).toBeLessThan(0.0035);
      expect(Math.abs(e - iapws) / iapws).toBeLessThan(0.0035);
    },
  );

  it('is 6.112 hPa at 0 °C exactly, the Magnus constant (WMO-No. 8)', () => {
    expect(saturationVapourPressureHpa(0)).toBe(6.112);
  });

  it('refuses temperatures outside −45..60 °C, the formula’s stated range', () => {
    expect(() => saturationVapourPressureHpa(-50)).toThrow(/-45..60/);
    expect(() => saturationVapourPressureHpa(61)).toThrow(/-45..60/);
  });

  it('has an enhancement factor of about 1.004 at 1000 hPa (WMO-No. 8, from memory)', () => {
    expect(enhancementFactor(1000)).toBeCloseTo(1.0016 + 3.15e-3 - 0.074e-3, 10);
    expect(enhancementFactor(1000)).toBeGreaterThan(1.004);
    expect(enhancementFactor(1000)).toBeLessThan(1.005);
  });

  it('a dew point equal to the temperature means saturation (definition)', () => {
    expect(vapourPressureFromDewpointHpa(12, 1000)).toBeCloseTo(enhancementFactor(1000) * saturationVapourPressureHpa(12), 12);
  });
});

describe('standard atmosphere (Berg 1948 form) against the U.S. Standard Atmosphere 1976', () => {
  // U.S. Standard Atmosphere (1976), geometric altitude (docs/constants.md, computed from the defining constants).
  it.each([
    [0, 1013.25],
    [1000, 898.76],
    [2000, 795.01],
    [5000, 540.48],
    [8000, 356.51], // USSA 1976 at 8 km geometric (from memory)
  ])('pressure at %s m is within 0.3 per cent of %s hPa', (h, p) => {
    expect(Math.abs(standardAtmosphere(h).pressureHpa - p) / p).toBeLessThan(0.003);
  });

  it('temperature falls at 6.5 K/km from 18 °C at sea level (Berg 1948 form with T0 = 18 °C, from memory)', () => {
    expect(standardAtmosphere(0).temperatureC).toBeCloseTo(18, 10);
    expect(standardAtmosphere(2000).temperatureC).toBeCloseTo(18 - 13, 10);
  });

  it('relative humidity is 50 % at sea level and decays as exp(−6.396e-4 h) (from memory)', () => {
    expect(standardAtmosphere(0).relativeHumidityPct).toBe(50);
    expect(standardAtmosphere(1000).relativeHumidityPct).toBeCloseTo(50 * Math.exp(-0.6396), 10);
  });

  it('refuses heights outside −500..9000 m', () => {
    expect(() => standardAtmosphere(9500)).toThrow(/-500..9000/);
  });
});

describe('reduction of met from the sensor height to the site height', () => {
  it('pressure follows the hypsometric equation: about 1.2 hPa per 10 m near sea level (common practice)', () => {
    const p = reducePressureHpa(1013.25, 15, 10);
    expect(1013.25 - p).toBeGreaterThan(1.1);
    expect(1013.25 - p).toBeLessThan(1.3);
  });

  it('agrees with the U.S. Standard Atmosphere 1976 over 1000 m (898.76 hPa at 1 km from 1013.25 hPa, 15 °C at 0 m) to 0.1 hPa', () => {
    expect(Math.abs(reducePressureHpa(1013.25, 15, 1000) - 898.76)).toBeLessThan(0.1);
  });

  it('temperature falls 6.5 K per km (U.S. Standard Atmosphere 1976 lapse rate)', () => {
    expect(reduceTemperatureC(15, 1000)).toBeCloseTo(8.5, 10);
  });

  it('says which values were measured, reduced or defaulted', () => {
    const measured = resolveSurfaceMet(100, { pressureHpa: 1000, temperatureC: 10, relativeHumidityPct: 70 });
    expect(measured.source).toEqual({ pressure: 'measured', temperature: 'measured', humidity: 'measured' });
    expect(measured.warnings).toEqual([]);
    const reduced = resolveSurfaceMet(100, { pressureHpa: 1000, temperatureC: 10, relativeHumidityPct: 70, heightM: 90 });
    expect(reduced.source).toEqual({ pressure: 'reduced', temperature: 'reduced', humidity: 'reduced' });
    expect(reduced.pressureHpa).toBeLessThan(1000);
    const defaulted = resolveSurfaceMet(100, { pressureHpa: 1000 });
    expect(defaulted.source).toEqual({ pressure: 'measured', temperature: 'standard-atmosphere', humidity: 'standard-atmosphere' });
    expect(defaulted.warnings).toHaveLength(2);
  });

  it('keeps relative humidity across the height difference (documented assumption)', () => {
    const r = resolveSurfaceMet(0, { pressureHpa: 1000, temperatureC: 20, relativeHumidityPct: 60, heightM: 50 });
    const rhAtSite = (100 * r.vapourPressureHpa) / (enhancementFactor(r.pressureHpa) * saturationVapourPressureHpa(r.temperatureC));
    expect(rhAtSite).toBeCloseTo(60, 9);
  });
});
