import { describe, expect, it } from 'vitest';
import { column, evenHeightsM, ussa1976 } from '../../../scripts/generators/us-standard-atmosphere-1976.js';
import { ModelDomainError } from '../../../src/domain/errors.js';
import { gravityAtLatitude } from '../../../src/domain/profile/gravity.js';
import { columnFromSite, interpolateInLayer, validateLevels, type ProfileLevelInput } from '../../../src/domain/profile/levels.js';
import { toDomainLevels } from '../../helpers/profiles.js';
import { DEG, HPA } from '../../helpers/units.js';

const gravity = gravityAtLatitude(45 * DEG);
const standard = () => toDomainLevels(column(evenHeightsM(2000, 0, 30_000), { surfaceRelativeHumidityPct: 60 }));

function fieldOf(levels: ProfileLevelInput[]): string {
  try {
    validateLevels(levels, gravity, 0, []);
  } catch (err) {
    expect(err).toBeInstanceOf(ModelDomainError);
    expect((err as ModelDomainError).status).toBe(400);
    return (err as ModelDomainError).field;
  }
  throw new Error('no error');
}

describe('interpolation between levels against the U.S. Standard Atmosphere 1976 (generator, defining equations)', () => {
  // Levels 2 km apart; the standard at the heights in between is the truth.
  const levels = validateLevels(toDomainLevels(column(evenHeightsM(2000, 0, 30_000))), gravity, 0, []);
  // Power law in T: exact for a constant lapse rate in geopotential height; the standard's layers are
  // linear in geopotential, not geometric, height, which leaves up to 2e-5 of P (0.02 hPa).
  // Interpolating exponentially in height instead would be off by up to 1.2 hPa in these layers.
  it.each([500, 1000, 3300, 9100, 12_700, 21_000, 29_000])('pressure at %d m within 0.03 hPa (hydrostatic power law)', (z) => {
    const i = Math.floor(z / 2000);
    expect(Math.abs(interpolateInLayer(levels, i, z).pressureHpa - ussa1976(z).pressureHpa)).toBeLessThan(0.03 * HPA);
  });
  it('the same check fails for exponential interpolation in height (so the check can tell the two apart)', () => {
    const z = 1000;
    const exponential = Math.sqrt(ussa1976(0).pressureHpa * ussa1976(2000).pressureHpa);
    expect(Math.abs(exponential - ussa1976(z).pressureHpa)).toBeGreaterThan(0.5 * HPA);
  });
  it.each([500, 3300, 9100])(
    'temperature at %d m is linear in height (the standard’s lapse rate is constant inside these layers; within 0.01 K)',
    (z) => {
      const i = Math.floor(z / 2000);
      expect(Math.abs(interpolateInLayer(levels, i, z).temperatureK - ussa1976(z).temperatureK)).toBeLessThan(0.01);
    },
  );
  it('vapour pressure is exponential in height (geometric mean at mid-layer) and linear when one level is dry', () => {
    const c = {
      heightM: Float64Array.of(0, 1000, 2000),
      pressureHpa: Float64Array.of(1000, 900, 800),
      temperatureK: Float64Array.of(290, 284, 278),
      vapourPressureHpa: Float64Array.of(16, 4, 0),
    };
    expect(interpolateInLayer(c, 0, 500).vapourPressureHpa).toBeCloseTo(8, 12);
    expect(interpolateInLayer(c, 1, 1500).vapourPressureHpa).toBeCloseTo(2, 12);
  });
});

describe('validation: errors name the level and the field (issue 6)', () => {
  it('pressure must decrease with height', () => {
    const levels = standard();
    levels[12]!.pressureHpa = levels[11]!.pressureHpa;
    expect(fieldOf(levels)).toBe('levels.12.pressure_hpa');
  });
  it('height must increase', () => {
    const levels = standard();
    levels[5]!.heightM = levels[4]!.heightM! - 1;
    expect(fieldOf(levels)).toBe('levels.5.height_m');
  });
  it('exactly one humidity quantity per level', () => {
    const two = standard();
    two[3]!.dewpointC = -20;
    expect(fieldOf(two)).toBe('levels.3.vapour_pressure_hpa'); // the second of the two, in the documented order
    expect(() => validateLevels(two, gravity, 0, [])).toThrow(/got dewpoint_c and vapour_pressure_hpa/);
    const none = standard();
    delete none[4]!.vapourPressureHpa;
    expect(fieldOf(none)).toBe('levels.4');
  });
  it('exactly one height per level', () => {
    const levels = standard();
    levels[2]!.geopotentialHeightM = 4000;
    expect(fieldOf(levels)).toBe('levels.2.geopotential_height_m');
  });
  it('the top must reach 10 000 m', () => {
    const levels = toDomainLevels(column(evenHeightsM(1000, 0, 9000)));
    expect(fieldOf(levels)).toBe('levels.9.height_m');
  });
  it('a dew point above the temperature, or a vapour pressure above saturation, is refused', () => {
    const dew = standard();
    delete dew[1]!.vapourPressureHpa;
    dew[1]!.dewpointC = dew[1]!.temperatureC + 1;
    expect(fieldOf(dew)).toBe('levels.1.dewpoint_c');
    const vapour = standard();
    vapour[0]!.vapourPressureHpa = 40; // saturation at 15 °C is 17 hPa
    expect(fieldOf(vapour)).toBe('levels.0.vapour_pressure_hpa');
  });
  it('at least 5 levels', () => {
    expect(fieldOf(standard().slice(0, 4))).toBe('levels');
  });
  it('warns when heights do not fit pressures and temperatures (hypsometric equation)', () => {
    const levels = standard();
    levels[6]!.heightM = levels[6]!.heightM! + 400; // 12 000 → 12 400 m: layers 5–6 and 6–7 off by 20 %
    const warnings: string[] = [];
    validateLevels(levels, gravity, 0, warnings);
    expect(warnings.join('\n')).toMatch(/levels 5–6, 6–7/);
  });
});

describe('the column starts at the site height', () => {
  const levels = validateLevels(toDomainLevels(column(evenHeightsM(500, 0, 20_000))), gravity, 0, []);
  it('levels below the site are dropped and the bottom is interpolated (U.S. Standard Atmosphere 1976 at 1730 m within 0.01 hPa)', () => {
    const warnings: string[] = [];
    const c = columnFromSite(levels, 1730, warnings);
    expect(c.heightM[0]).toBe(1730);
    expect(c.levelsBelowSite).toBe(4);
    expect(Math.abs(c.pressureHpa[0]! - ussa1976(1730).pressureHpa)).toBeLessThan(0.01 * HPA);
    expect(warnings[0]).toMatch(/4 levels below the site/);
  });
  it('a profile starting above the site is extended down with −6.5 K/km and hypsometric pressure (the standard’s own troposphere: within 0.02 hPa over 300 m)', () => {
    const above = validateLevels(toDomainLevels(column(evenHeightsM(500, 1000, 20_000))), gravity, 0, []);
    const c = columnFromSite(above, 700, []);
    expect(c.extendedDownM).toBe(300);
    expect(Math.abs(c.pressureHpa[0]! - ussa1976(700).pressureHpa)).toBeLessThan(0.02 * HPA);
    expect(Math.abs(c.temperatureK[0]! - ussa1976(700).temperatureK)).toBeLessThan(0.01);
  });
  it('the site must lie below the top', () => {
    expect(() => columnFromSite(levels, 20_000, [])).toThrow(/must lie below the top level/);
  });
  it('but not by more than 1000 m', () => {
    const above = validateLevels(toDomainLevels(column(evenHeightsM(500, 1500, 20_000))), gravity, 0, []);
    expect(() => columnFromSite(above, 0, [])).toThrow(/extended down to the site by at most 1000 m/);
  });
});
