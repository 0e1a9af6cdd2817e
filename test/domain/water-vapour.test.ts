import { describe, expect, it } from 'vitest';
import { DEG } from '../../src/domain/constants.js';
import { conversionFactor } from '../../src/domain/water-vapour/conversion.js';
import { bevisMeanTemperatureK } from '../../src/domain/water-vapour/mean-temperature.js';
import {
  negativeWetDelayWarning,
  precipitableWater,
  precipitableWaterFromSurfaceMet,
  tmExtrapolatedWarning,
} from '../../src/domain/water-vapour/precipitable-water.js';
import { zenithHydrostaticDelayM } from '../../src/domain/zenith/hydrostatic.js';

describe('conversion factor Π of Bevis et al. (1994)', () => {
  // Values computed from Π = 1e6/(ρw Rv (k3/Tm + k2')) with the Bevis (1994) constants (docs/constants.md).
  it.each([
    [250, 0.1428],
    [270, 0.154],
    [280, 0.1596],
    [290, 0.1652],
  ])('Tm = %s K gives Π = %s (±0.0001)', (tm, pi) => {
    expect(Math.abs(conversionFactor(tm) - pi)).toBeLessThan(0.0001);
  });

  it('is 0.15–0.16 for realistic Tm: 1 mm of PWV is about 6.5 mm of ZWD (common practice)', () => {
    const pi = conversionFactor(bevisMeanTemperatureK(288.15));
    expect(pi).toBeGreaterThan(0.15);
    expect(pi).toBeLessThan(0.16);
    expect(1 / pi).toBeCloseTo(6.4, 0);
  });
});

describe('Tm of Bevis et al. (1992), 70.2 + 0.72 Ts (from memory)', () => {
  it('is 277.67 K at Ts = 288.15 K', () => {
    expect(bevisMeanTemperatureK(288.15)).toBeCloseTo(70.2 + 0.72 * 288.15, 12);
  });
});

describe('precipitable water from a total delay and surface met', () => {
  const lat = 50 * DEG;
  const h = 200;

  it('splits ZTD with the Saastamoinen ZHD of the measured pressure, then PWV = Π ZWD', () => {
    const r = precipitableWater({ ztdM: 2.45, pressureHpa: 990, temperatureC: 12 }, lat, h);
    const zhd = zenithHydrostaticDelayM(990, lat, h);
    expect(r.zhdM).toBeCloseTo(zhd, 12);
    expect(r.zwdM).toBeCloseTo(2.45 - zhd, 12);
    expect(r.pwvMm).toBeCloseTo(conversionFactor(70.2 + 0.72 * 285.15) * (2.45 - zhd) * 1000, 9);
  });

  it('propagates σ_ZTD, σ_P and σ_Tm to first order (checked by finite differences)', () => {
    const input = { ztdM: 2.4, ztdSigmaM: 0.004, pressureHpa: 1000, pressureSigmaHpa: 0.5, tmK: 270, tmSigmaK: 3 };
    const r = precipitableWater(input, lat, h);
    const pwv = (ztd: number, p: number, tm: number) => precipitableWater({ ztdM: ztd, pressureHpa: p, tmK: tm }, lat, h).pwvMm;
    const d = 1e-6;
    const dZtd = (pwv(2.4 + d, 1000, 270) - pwv(2.4 - d, 1000, 270)) / (2 * d);
    const dP = (pwv(2.4, 1000 + d, 270) - pwv(2.4, 1000 - d, 270)) / (2 * d);
    const dTm = (pwv(2.4, 1000, 270 + d) - pwv(2.4, 1000, 270 - d)) / (2 * d);
    expect(r.sigmaBudget.delayMm!).toBeCloseTo(Math.abs(dZtd) * 0.004, 5);
    expect(r.sigmaBudget.pressureMm).toBeCloseTo(Math.abs(dP) * 0.5, 5);
    expect(r.sigmaBudget.tmMm).toBeCloseTo(Math.abs(dTm) * 3, 5);
    // the total also holds the ZHD-model and refractivity terms (test/domain/pwv-sigma-budget.test.ts)
    const b = r.sigmaBudget;
    expect(r.pwvSigmaMm).toBeCloseTo(Math.hypot(b.delayMm!, b.pressureMm, b.zhdModelMm, b.temperatureMm, b.tmMm, b.refractivityMm), 12);
    expect(r.pwvSigmaMm).toBeGreaterThan(Math.hypot(dZtd * 0.004, dP * 0.5, dTm * 3));
    // 4 mm of ZTD is about 0.6 mm of PWV (common practice: ratio ≈ 1/6.5)
    expect(Math.abs(dZtd * 0.004 - 0.62)).toBeLessThan(0.03);
  });

  it('carries the 4.74 K scatter of the Bevis regression when Tm comes from the surface temperature', () => {
    const r = precipitableWater({ zwdM: 0.2, temperatureC: 20 }, lat, h);
    expect(r.tmSigmaK).toBe(4.74);
    // Π varies about in proportion to Tm, so σ_PWV/PWV ≈ σ_Tm/Tm ≈ 4.74/281 ≈ 1.7 % (derived from Bevis 1994 eq. 6)
    expect(r.pwvSigmaMm / r.pwvMm).toBeGreaterThan(0.012);
    expect(r.pwvSigmaMm / r.pwvMm).toBeLessThan(0.017);
  });

  it('never defaults the pressure that decides the answer, nor the temperature', () => {
    expect(() => precipitableWater({ ztdM: 2.4, temperatureC: 10 }, lat, h, 'records.2')).toThrow(/pressure/);
    expect(() => precipitableWater({ zwdM: 0.1 }, lat, h)).toThrow(/needs temperature_c .* or tm_k/);
  });
});

describe('precipitableWaterFromSurfaceMet, the series path: the same numbers as precipitableWater (the single definition)', () => {
  // Its results feed the station PWV retrieval; they must be bit-identical to the checked function above.
  const LAT_RAD = 47.1 * DEG;
  const HEIGHT_M = 512.3;
  it.each([
    [2.4731, 0.0042, 990.6, 23.5],
    [2.3, null, 955.2, -12.4],
    [2.1, 0.004, 991.4, 22.9], // negative ZWD → warning
    [2.4, 0.02, 1012.0, 51.0], // Ts = 324 K, above the Bevis fit data (240..320 K) → warning
  ])('ZTD %s m, σ %s m, P %s hPa, T %s °C', (ztdM, ztdSigmaM, pressureHpa, temperatureC) => {
    const series = precipitableWaterFromSurfaceMet(ztdM, ztdSigmaM, pressureHpa, temperatureC, LAT_RAD, HEIGHT_M);
    const single = precipitableWater(
      { ztdM, ztdSigmaM: ztdSigmaM ?? undefined, pressureHpa, temperatureC },
      LAT_RAD,
      HEIGHT_M,
      'records.7',
    );
    const { warnings, ...numbers } = single;
    expect(series).toEqual({ ...numbers, wetDelayNegative: series.zwdM < 0, tmExtrapolated: series.tmExtrapolated });
    const texts = [
      ...(series.wetDelayNegative ? [negativeWetDelayWarning(series.zwdM, 'records.7')] : []),
      ...(series.tmExtrapolated ? [tmExtrapolatedWarning(temperatureC, 'records.7')] : []),
    ];
    expect(texts).toEqual(warnings);
  });
});
