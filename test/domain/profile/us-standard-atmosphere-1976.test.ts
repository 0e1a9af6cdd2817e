/**
 * The generator of U.S. Standard Atmosphere 1976 columns (scripts/generators) against the standard's
 * published values, so that the tests that use it compare src/ against the standard itself.
 */
import { describe, expect, it } from 'vitest';
import {
  column,
  evenHeightsM,
  geometricFromGeopotentialM,
  humidPressureHpa,
  ussa1976,
} from '../../../scripts/generators/us-standard-atmosphere-1976.js';
import { HPA } from '../../helpers/units.js';

describe('U.S. Standard Atmosphere 1976, geometric altitudes (docs/constants.md, computed from the defining constants)', () => {
  // [altitude m, pressure hPa, temperature K]; pressures given to 0.01 hPa, temperatures to 0.001 K.
  const TABLE: [number, number, number][] = [
    [0, 1013.25, 288.15],
    [1000, 898.76, 281.651],
    [2000, 795.01, 275.154],
    [5000, 540.48, 255.676],
    [10_000, 265.0, 223.252],
  ];
  it.each(TABLE)('%d m: %f hPa, %f K', (z, pressureHpa, temperatureK) => {
    const s = ussa1976(z);
    expect(Math.abs(s.pressureHpa - pressureHpa)).toBeLessThan(0.006 * HPA); // rounding of the published value
    expect(Math.abs(s.temperatureK - temperatureK)).toBeLessThan(0.0006);
  });
});

describe('U.S. Standard Atmosphere 1976, layer bases in geopotential altitude (Table 4 of the standard, from memory)', () => {
  // [H m', pressure Pa, temperature K]
  const BASES: [number, number, number][] = [
    [11_000, 22_632.06, 216.65],
    [20_000, 5474.889, 216.65],
    [32_000, 868.0187, 228.65],
    [47_000, 110.9063, 270.65],
    [51_000, 66.93887, 270.65],
    [71_000, 3.95642, 214.65],
  ];
  it.each(BASES)("%d m': %f Pa, %f K", (h, pressurePa, temperatureK) => {
    const s = ussa1976(geometricFromGeopotentialM(h));
    expect(Math.abs(s.pressureHpa * 100 - pressurePa) / pressurePa).toBeLessThan(2e-6);
    expect(Math.abs(s.temperatureK - temperatureK)).toBeLessThan(1e-6);
  });
});

describe('generator: hydrostatic integration of the humid column', () => {
  it('with no humidity reproduces the standard’s pressures (the same hydrostatic equation, integrated numerically)', () => {
    const heights = evenHeightsM(2000, 0, 30_000);
    const integrated = humidPressureHpa(heights, { surfaceRelativeHumidityPct: 0 });
    heights.forEach((z, i) => expect(Math.abs(integrated[i]! - ussa1976(z).pressureHpa) / ussa1976(z).pressureHpa).toBeLessThan(1e-8));
  });

  it('with humidity the pressure aloft is above the dry standard’s (moist air is lighter, so pressure falls more slowly: virtual temperature, common practice)', () => {
    const humid = column([0, 3000], { surfaceRelativeHumidityPct: 80 });
    expect(humid[0]!.pressureHpa).toBe(1013.25);
    expect(humid[1]!.pressureHpa).toBeGreaterThan(ussa1976(3000).pressureHpa); // lighter air: pressure falls more slowly
    expect(humid[1]!.pressureHpa - ussa1976(3000).pressureHpa).toBeLessThan(2 * HPA);
  });
});
