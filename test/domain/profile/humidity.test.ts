import { describe, expect, it } from 'vitest';
import { EPSILON } from '../../../src/domain/profile/constants.js';
import {
  moistSaturationVapourPressureHpa,
  profileEnhancementFactor,
  vapourPressureOfLevelHpa,
} from '../../../src/domain/profile/humidity.js';
import { HPA } from '../../helpers/units.js';

describe('humidity quantities of a level → vapour pressure', () => {
  it('saturation over water at 20 °C, 1000 hPa: CRC Handbook 23.388 hPa (73rd ed.; docs/constants.md) times f(p) ≈ 1.0047 (WMO-No. 8, from memory), within the 0.3 % of the Magnus form', () => {
    const e = vapourPressureOfLevelHpa('relative_humidity_pct', 100, 20, 1000);
    expect(Math.abs(e / (23.388 * 1.0047) - 1)).toBeLessThan(0.003);
  });

  it('a dew point equal to the temperature gives saturation; 50 % relative humidity half of it', () => {
    expect(vapourPressureOfLevelHpa('dewpoint_c', 12, 12, 850)).toBeCloseTo(moistSaturationVapourPressureHpa(12, 850), 12);
    expect(vapourPressureOfLevelHpa('relative_humidity_pct', 50, 12, 850)).toBeCloseTo(moistSaturationVapourPressureHpa(12, 850) / 2, 12);
  });

  it('specific humidity: 10 g/kg at 1000 hPa is about 16 hPa (common practice), and inverts the definition q = ε e / (p − (1 − ε) e) (Wallace & Hobbs 2006 §3.5)', () => {
    const e = vapourPressureOfLevelHpa('specific_humidity_kg_kg', 0.01, 20, 1000);
    expect(Math.abs(e - 16.0)).toBeLessThan(0.1 * HPA);
    expect((EPSILON * e) / (1000 - (1 - EPSILON) * e)).toBeCloseTo(0.01, 12);
  });

  it('below −45 °C the WMO formula is continued without a jump (extrapolated, documented)', () => {
    const justAbove = moistSaturationVapourPressureHpa(-45 + 1e-7, 300);
    const justBelow = moistSaturationVapourPressureHpa(-45 - 1e-7, 300);
    expect(Math.abs(justAbove - justBelow) / justAbove).toBeLessThan(1e-7); // slope 11 %/K · 2e-7 K = 2e-8
    // ≈ 0.02 hPa at −60 °C over supercooled water (common practice; Murphy & Koop 2005 give about 0.0195 hPa, from memory)
    expect(Math.abs(moistSaturationVapourPressureHpa(-60, 200) - 0.0195)).toBeLessThan(0.001);
  });

  it('the enhancement factor is WMO’s down to 50 hPa and 1 above the 50 hPa level (where the fit falls below 1)', () => {
    expect(profileEnhancementFactor(1000)).toBeCloseTo(1.0016 + 3.15e-3 - 0.074 / 1000, 12);
    expect(profileEnhancementFactor(50)).toBeGreaterThan(1);
    expect(profileEnhancementFactor(30)).toBe(1);
  });
});
