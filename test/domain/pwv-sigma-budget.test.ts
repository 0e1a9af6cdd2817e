import { describe, expect, it } from 'vitest';
import { BEVIS_1994 } from '../../src/domain/constants.js';
import { conversionFactor } from '../../src/domain/water-vapour/conversion.js';
import { precipitableWater, precipitableWaterFromSurfaceMet } from '../../src/domain/water-vapour/precipitable-water.js';
import { DEG } from '../helpers/units.js';

/**
 * Every term of the σ_PWV budget against a central finite difference of the PWV function itself:
 * term = |∂PWV/∂x| · σ_x, with σ_x the documented default (or the caller's value). A wrong
 * derivative, a wrong default or a term left out shows up as a mismatch.
 */
const LAT = 52 * DEG;
const H = 80;
const pwv = (input: Parameters<typeof precipitableWater>[0]) => precipitableWater(input, LAT, H).pwvMm;
const derivative = (g: (x: number) => number, x: number, step: number) => (g(x + step) - g(x - step)) / (2 * step);

describe('σ_PWV budget, term by term, by finite differences', () => {
  const base = { ztdM: 2.41, ztdSigmaM: 0.006, pressureHpa: 1003.2, temperatureC: 14.5 };
  const r = precipitableWater(base, LAT, H);

  it('delay: |∂PWV/∂ZTD| · ztd_sigma_m (6 mm of ZTD ≈ 0.9 mm of PWV, common practice)', () => {
    const d = derivative((x) => pwv({ ...base, ztdM: x }), base.ztdM, 1e-6);
    expect(r.sigmaBudget.delayMm!).toBeCloseTo(Math.abs(d) * 0.006, 6);
    expect(r.sigmaBudget.delayMm!).toBeGreaterThan(0.85);
    expect(r.sigmaBudget.delayMm!).toBeLessThan(1.0);
  });

  it('pressure: |∂PWV/∂P| · 0.5 hPa (the default; a barometer of 0.5 hPa is ≈ 1.1 mm of ZHD, common practice)', () => {
    const d = derivative((x) => pwv({ ...base, pressureHpa: x }), base.pressureHpa, 1e-4);
    expect(r.sigmaBudget.pressureMm).toBeCloseTo(Math.abs(d) * 0.5, 6);
    expect(r.sigmaBudget.defaulted).toContain('pressure_sigma_hpa');
    const given = precipitableWater({ ...base, pressureSigmaHpa: 2 }, LAT, H);
    expect(given.sigmaBudget.pressureMm).toBeCloseTo(Math.abs(d) * 2, 6);
    expect(given.sigmaBudget.defaulted).not.toContain('pressure_sigma_hpa');
  });

  it('ZHD model: the ±0.0000005 m/hPa of the Saastamoinen constant (IERS 2010 eq. 9.11, from memory); ZHD ∝ P, so |∂PWV/∂P| · P · 2.2e-4', () => {
    const d = derivative((x) => pwv({ ...base, pressureHpa: x }), base.pressureHpa, 1e-4);
    expect(r.sigmaBudget.zhdModelMm).toBeCloseTo(Math.abs(d) * base.pressureHpa * (0.0000005 / 0.0022768), 6);
    // 0.5 mm of a 2.3 m ZHD is about 0.08 mm of PWV (1/6.5, common practice)
    expect(r.sigmaBudget.zhdModelMm).toBeGreaterThan(0.06);
    expect(r.sigmaBudget.zhdModelMm).toBeLessThan(0.09);
  });

  it('surface temperature: |∂PWV/∂Ts| · 0.5 K (the default), through Tm = 70.2 + 0.72 Ts', () => {
    // ∂PWV/∂Ts through Tm only: a caller's Tm perturbed by 0.72 dTs (the regression's slope, Bevis 1992, from memory)
    const tm0 = 70.2 + 0.72 * (base.temperatureC + 273.15);
    const dTm = derivative((x) => pwv({ ztdM: base.ztdM, pressureHpa: base.pressureHpa, tmK: x }), tm0, 1e-4);
    const dTs = derivative((x) => pwv({ ...base, temperatureC: x }), base.temperatureC, 1e-4);
    expect(dTs).toBeCloseTo(0.72 * dTm, 6);
    expect(r.sigmaBudget.temperatureMm).toBeCloseTo(Math.abs(dTs) * 0.5, 6);
    expect(r.sigmaBudget.defaulted).toContain('temperature_sigma_k');
  });

  it("Tm: |∂PWV/∂Tm| · 4.74 K for the Bevis regression (Bevis 1992, from memory) and · 2 K for a caller's tm_k without σ", () => {
    const tm0 = 70.2 + 0.72 * (base.temperatureC + 273.15);
    const dTm = derivative((x) => pwv({ ztdM: base.ztdM, pressureHpa: base.pressureHpa, tmK: x }), tm0, 1e-4);
    expect(r.sigmaBudget.tmMm).toBeCloseTo(Math.abs(dTm) * 4.74, 6);
    const caller = precipitableWater({ ztdM: base.ztdM, ztdSigmaM: 0.006, pressureHpa: base.pressureHpa, tmK: tm0 }, LAT, H);
    expect(caller.sigmaBudget.tmMm).toBeCloseTo(Math.abs(dTm) * 2, 6);
    expect(caller.tmSigmaK).toBe(2);
    expect(caller.sigmaBudget.defaulted).toContain('tm_sigma_k');
    expect(caller.sigmaBudget.temperatureMm).toBe(0);
  });

  it("refractivity: ZWD · hypot(∂Π/∂k2' · 2.2 K/hPa, ∂Π/∂k3 · 0.012e5 K²/hPa) (Bevis et al. 1994, from memory); ≈ 0.35 % of PWV", () => {
    const tm = r.tmK;
    const dK2 = derivative((x) => conversionFactor(tm, { ...BEVIS_1994, k2prime_K_per_hPa: x }), BEVIS_1994.k2prime_K_per_hPa, 1e-3);
    const dK3 = derivative((x) => conversionFactor(tm, { ...BEVIS_1994, k3_K2_per_hPa: x }), BEVIS_1994.k3_K2_per_hPa, 1);
    const expected = Math.abs(r.zwdM) * Math.hypot(dK2 * 2.2, dK3 * 0.012e5) * 1000;
    expect(r.sigmaBudget.refractivityMm).toBeCloseTo(expected, 6);
    expect(r.sigmaBudget.refractivityMm / r.pwvMm).toBeGreaterThan(0.003);
    expect(r.sigmaBudget.refractivityMm / r.pwvMm).toBeLessThan(0.004);
  });

  it('the total is the root sum of squares of the terms, and never 0 for a realistic record', () => {
    const b = r.sigmaBudget;
    expect(r.pwvSigmaMm).toBeCloseTo(Math.hypot(b.delayMm!, b.pressureMm, b.zhdModelMm, b.temperatureMm, b.tmMm, b.refractivityMm), 12);
    const noSigmas = precipitableWater({ ztdM: 2.41, pressureHpa: 1003.2, temperatureC: 14.5 }, LAT, H);
    expect(noSigmas.delaySigmaKnown).toBe(false);
    expect(noSigmas.sigmaBudget.delayMm).toBeNull();
    expect(noSigmas.pwvSigmaMm).toBeGreaterThan(0.2); // Tm, pressure, ZHD model and k terms remain
  });

  it('a ZWD given directly carries no pressure or ZHD-model terms (no ZHD was subtracted)', () => {
    const z = precipitableWater({ zwdM: 0.15, zwdSigmaM: 0.005, pressureHpa: 1000, temperatureC: 10 }, LAT, H);
    expect(z.sigmaBudget.pressureMm).toBe(0);
    expect(z.sigmaBudget.zhdModelMm).toBe(0);
    expect(z.sigmaBudget.defaulted).not.toContain('pressure_sigma_hpa');
  });

  it('the series path (stored ZTD and met) has the same budget as the single-record function', () => {
    const series = precipitableWaterFromSurfaceMet(2.41, 0.006, 1003.2, 14.5, LAT, H);
    expect(series.pwvSigmaMm).toBe(r.pwvSigmaMm);
    expect(series.sigmaBudget).toEqual(r.sigmaBudget);
    const unknown = precipitableWaterFromSurfaceMet(2.41, null, 1003.2, 14.5, LAT, H);
    expect(unknown.delaySigmaKnown).toBe(false);
  });
});
