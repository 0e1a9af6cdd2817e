import { describe, expect, it } from 'vitest';
import { inverseCompressibilityDry, inverseCompressibilityWet } from '../../../src/domain/profile/compressibility.js';
import {
  hydrostaticRefractivity,
  k2PrimeKPerHpa,
  REFRACTIVITY_CONSTANT_SETS,
  totalRefractivity,
  wetRefractivity,
} from '../../../src/domain/profile/refractivity.js';

/** Published constant sets, typed here from the sources (all from memory; docs/constants.md). [k1 K/hPa, k2 K/hPa, k3 K²/hPa] */
const PUBLISHED = {
  // Smith & Weintraub (1953), Proc. IRE 41, 1035–1037, as tabulated by Bevis et al. (1994) Table 1.
  'smith-weintraub-1953': [77.61, 72, 3.75e5],
  // Thayer (1974), Radio Sci. 9, 803–807.
  'thayer-1974': [77.604, 64.79, 3.776e5],
  // Bevis et al. (1994), J. Appl. Meteorol. 33, 379–386, Table 1 weighted mean.
  'bevis-1994': [77.6, 70.4, 3.739e5],
  // Rüeger (2002), FIG XXII Congress, "best average" (375 ppm CO2).
  'rueger-2002-best-average': [77.689, 71.2952, 3.75463e5],
} as const;

describe('refractivity constant sets against their publications', () => {
  it.each(Object.entries(PUBLISHED))('%s', (key, [k1, k2, k3]) => {
    const set = REFRACTIVITY_CONSTANT_SETS[key as keyof typeof REFRACTIVITY_CONSTANT_SETS];
    expect(set.k1KPerHpa).toBe(k1);
    expect(set.k2KPerHpa).toBe(k2);
    expect(set.k3K2PerHpa).toBe(k3);
  });

  it('offers exactly these four sets', () => {
    expect(Object.keys(REFRACTIVITY_CONSTANT_SETS).sort()).toEqual(Object.keys(PUBLISHED).sort());
  });
});

describe('every set against the two-term formula N = 77.6 P/T + 3.73e5 e/T² (Smith & Weintraub 1953; common practice, e.g. Bean & Dutton, Radio Meteorology, 1966, from memory)', () => {
  // The three-term sets and the two-term formula differ by (k2 − k1) e/T and the spread of k3: a few
  // tenths of an N-unit for these conditions. A wrong digit in any constant moves N by ≥ 1 N-unit.
  const TOLERANCE_N = 0.6;
  const CONDITIONS = [
    { pressureHpa: 1013.25, temperatureK: 288.15, vapourPressureHpa: 0 },
    { pressureHpa: 1000, temperatureK: 293.15, vapourPressureHpa: 20 },
    { pressureHpa: 1005, temperatureK: 303.15, vapourPressureHpa: 35 },
    { pressureHpa: 500, temperatureK: 253.15, vapourPressureHpa: 1 },
  ];
  for (const [key, set] of Object.entries(REFRACTIVITY_CONSTANT_SETS)) {
    it.each(CONDITIONS)(
      `${key}: P $pressureHpa hPa, T $temperatureK K, e $vapourPressureHpa hPa`,
      ({ pressureHpa, temperatureK, vapourPressureHpa }) => {
        const twoTerm = (77.6 * pressureHpa) / temperatureK + (3.73e5 * vapourPressureHpa) / temperatureK ** 2;
        expect(Math.abs(totalRefractivity(set, pressureHpa, vapourPressureHpa, temperatureK) - twoTerm)).toBeLessThan(TOLERANCE_N);
      },
    );
  }
});

describe('hydrostatic/wet split of Davis et al. (1985), Radio Sci. 20, 1593–1607, eqs. 5–7', () => {
  it('k2′ = k2 − ε k1 is 22.1 K/hPa for Bevis et al. (1994) (published with the set, from memory)', () => {
    expect(Math.abs(k2PrimeKPerHpa(REFRACTIVITY_CONSTANT_SETS['bevis-1994']) - 22.1)).toBeLessThan(0.1);
  });

  it('k2′ is 17 ± 10 K/hPa for Thayer’s constants (the value Davis et al. 1985 use, from memory)', () => {
    expect(Math.abs(k2PrimeKPerHpa(REFRACTIVITY_CONSTANT_SETS['thayer-1974']) - 17)).toBeLessThan(1);
  });

  it('N_h + N_w equals the three-term N, with and without compressibility (the split only moves ε k1 e/T)', () => {
    const set = REFRACTIVITY_CONSTANT_SETS['rueger-2002-best-average'];
    for (const [zd, zw] of [
      [1, 1],
      [1.0006, 1.0009],
    ] as const) {
      const n = totalRefractivity(set, 990, 18, 295, zd, zw);
      expect(hydrostaticRefractivity(set, 990, 18, 295, zd, zw) + wetRefractivity(set, 18, 295, zw)).toBeCloseTo(n, 10);
    }
  });

  it('1e-6 k1 Rd / g_m with Thayer’s k1 is Saastamoinen’s 0.0022768 m/hPa (IERS Conventions 2010 eq. 9.11; docs/constants.md)', () => {
    const zhdPerHpa = (1e-6 * REFRACTIVITY_CONSTANT_SETS['thayer-1974'].k1KPerHpa * 287.0464) / 9.784;
    expect(Math.abs(zhdPerHpa - 0.0022768)).toBeLessThan(5e-8);
  });
});

describe('inverse compressibility factors, Owens (1967) as quoted by Thayer (1974)', () => {
  /**
   * Compressibility factor of dry air from the CIPM-2007 formula for the density of air (Picard et al.
   * 2008, Metrologia 45, 149–155; coefficients from memory), an independent determination.
   */
  function cipmDryZ(pressureHpa: number, temperatureK: number): number {
    const p = pressureHpa * 100;
    const t = temperatureK - 273.15;
    const a0 = 1.58123e-6,
      a1 = -2.9331e-8,
      a2 = 1.1043e-10,
      d = 1.83e-11;
    return 1 - (p / temperatureK) * (a0 + a1 * t + a2 * t * t) + ((p * p) / (temperatureK * temperatureK)) * d;
  }
  it.each([
    [1013.25, 273.15],
    [1013.25, 293.15],
    [800, 263.15],
    [300, 230],
  ])('dry air at %f hPa, %f K agrees with 1/Z of CIPM-2007 within 1e-5', (p, t) => {
    expect(Math.abs(inverseCompressibilityDry(p, t) - 1 / cipmDryZ(p, t))).toBeLessThan(1e-5);
  });

  it('water vapour at 10 hPa, 10 °C departs from the ideal gas by about 6e-4 (second virial coefficient of water ≈ −1.4 L/mol near 283 K, from memory)', () => {
    const virial = 1 / (1 + (-1.4e-3 * 1000) / (8.314 * 283.15)); // 1/Z with Z = 1 + B e/(R T)
    expect(Math.abs(inverseCompressibilityWet(10, 283.15) - 1 - (virial - 1)) / (virial - 1)).toBeLessThan(0.3);
  });
});
