import { describe, expect, it } from 'vitest';
import {
  column,
  columnTemperatureK,
  evenHeightsM,
  GENERATOR_RD,
  ruleVapourPressureHpa,
  stretchedHeightsM,
  USSA_M0,
  USSA_RSTAR,
  ussaGravity,
} from '../../../scripts/generators/us-standard-atmosphere-1976.js';
import { computeProfileDelays } from '../../../src/domain/profile/profile-delays.js';
import { simpson, toDomainLevels } from '../../helpers/profiles.js';
import { DEG, MM } from '../../helpers/units.js';

/** Saastamoinen ZHD in the form of Davis et al. (1985), IERS Conventions (2010) eq. 9.11 (constant from memory; docs/constants.md). */
const saastamoinenZhdM = (pressureHpa: number, latitudeDeg: number, heightM: number) =>
  (0.0022768 * pressureHpa) / (1 - 0.00266 * Math.cos(2 * latitudeDeg * DEG) - 0.28e-6 * heightM);

/** A dry U.S. Standard Atmosphere 1976 column, levels every km from 0 to 86 km (generator). */
const DRY_USSA = toDomainLevels(column(evenHeightsM(1000, 0, 86_000)));

describe('dry U.S. Standard Atmosphere 1976 column against Saastamoinen (Davis et al. 1985; IERS 2010 eq. 9.11)', () => {
  // Same k1 as Saastamoinen's constant (Thayer 1974, 77.604 K/hPa), same Rd. What is left is gravity:
  // Saastamoinen's g_m = 9.784 (1 − 0.00266 cos 2φ − 0.28e-6 H) m/s² is a fit to the gravity at the
  // column's centroid, while the integral uses WGS84 normal gravity at the heights of this column
  // (and the standard's hydrostatics use its own inverse-square gravity). We reach 0.08 mm or better
  // at every latitude and height below; the issue asks for a few millimetres.
  const TOLERANCE = 0.5 * MM;
  it.each([
    [0, 0],
    [30, 0],
    [45, 0],
    [60, 0],
    [90, 0],
    [45, 2000],
    [0, 5000],
    [-60, 5000],
  ])('latitude %d°, site height %d m', (latitudeDeg, heightM) => {
    const r = computeProfileDelays({ latitudeRad: latitudeDeg * DEG, siteHeightM: heightM, levels: DRY_USSA, constants: 'thayer-1974' });
    expect(Math.abs(r.zhdM - saastamoinenZhdM(r.column.surfacePressureHpa, latitudeDeg, heightM))).toBeLessThan(TOLERANCE);
    expect(r.zwdM).toBe(0);
    expect(r.pwvMm).toBe(0);
    expect(r.tmK).toBeNull();
  });

  it('the mean gravity of the column is within 0.01 % of Saastamoinen’s g_m at 45° (9.784 m/s²; we reach 0.0044 %)', () => {
    const r = computeProfileDelays({ latitudeRad: 45 * DEG, siteHeightM: 0, levels: DRY_USSA });
    expect(Math.abs(r.meanGravityM_S2 / 9.784 - 1)).toBeLessThan(1e-4);
  });

  it('integrating N_h over the heights gives the same ZHD as the pressure form (the standard is in hydrostatic balance; 0.1 mm)', () => {
    const r = computeProfileDelays({ latitudeRad: 45.5 * DEG, siteHeightM: 0, levels: DRY_USSA });
    expect(Math.abs(r.zhdHeightIntegralM - r.zhdM)).toBeLessThan(0.1 * MM);
    expect(r.warnings).toEqual([]);
  });
});

describe('extension above the top (hydrostatic, so exact for the ZHD whatever its temperature)', () => {
  it.each([12_000, 20_000, 40_000])('the standard cut at %d m gives the ZHD of the full 86 km column within 0.05 mm', (topM) => {
    const full = computeProfileDelays({ latitudeRad: 45 * DEG, siteHeightM: 0, levels: DRY_USSA });
    const cut = computeProfileDelays({
      latitudeRad: 45 * DEG,
      siteHeightM: 0,
      levels: toDomainLevels(column(evenHeightsM(1000, 0, topM))),
    });
    expect(Math.abs(cut.zhdM - full.zhdM)).toBeLessThan(0.05 * MM);
    // and the extension's share is 1e-6 k1 Rd P_top / g_m (Davis et al. 1985 eq. 10 applied to the part
    // above the top), with g_m the standard's gravity one scale height (≈ 6.5 km) above the top, within 0.1 %
    const expected = (1e-6 * 77.6 * 287.0464 * cut.topExtension.topPressureHpa) / ussaGravity(topM + cut.topExtension.scaleHeightM);
    expect(Math.abs(cut.topExtension.zhdM / expected - 1)).toBeLessThan(1e-3);
  });
});

describe('closed form: an isothermal layer at saturation (common practice)', () => {
  // 0 °C throughout, heights 0–12 km every 500 m; e = e_w(0 °C) = 6.112 hPa (WMO-No. 8 Magnus value)
  // from 0 to 2000 m, 0 from 2500 m up (linear in the layer between). Pressure from the isothermal
  // hydrostatic equation with g0. Then, independently of any numerical integration:
  //   PWV = ρv (2000 + 500/2) m / ρw,  ρv = e/(Rv T);   ZWD = 1e-6 (k2′ e/T + k3 e/T²) · 2250 m;   Tm = T.
  const tK = 273.15;
  const eHpa = 6.112;
  const heights = evenHeightsM(500, 0, 12_000);
  const levels = heights.map((z) => ({
    heightM: z,
    pressureHpa: 1000 * Math.exp((-9.80665 * z) / (287.0464 * tK)),
    temperatureC: 0,
    vapourPressureHpa: z <= 2000 ? eHpa : 0,
  }));
  const r = computeProfileDelays({ latitudeRad: 45 * DEG, siteHeightM: 0, levels, constants: 'bevis-1994' });
  const thicknessM = 2000 + 500 / 2;
  it('PWV = ρv · thickness / ρw (Rv = 461.5 J/(kg K), Bevis et al. 1994)', () => {
    const expectedMm = ((((100 * eHpa) / (461.5 * tK)) * thicknessM) / 1000) * 1000;
    expect(Math.abs(r.pwvMm - expectedMm)).toBeLessThan(1e-9);
    expect(expectedMm).toBeCloseTo(10.91, 2);
  });
  it('ZWD = 1e-6 (k2′ e/T + k3 e/T²) · thickness with Bevis et al. (1994): k2′ = 70.4 − 0.622 · 77.6, k3 = 3.739e5', () => {
    const k2Prime = 70.4 - (287.0464 / 461.5) * 77.6;
    const expectedM = 1e-6 * ((k2Prime * eHpa) / tK + (3.739e5 * eHpa) / (tK * tK)) * thicknessM;
    expect(Math.abs(r.zwdM - expectedM)).toBeLessThan(1e-9);
  });
  it('Tm equals the layer temperature', () => {
    expect(Math.abs(r.tmK! - tK)).toBeLessThan(1e-9);
  });
});

describe('humid columns against the generator’s truth (U.S. Standard Atmosphere 1976 with a humidity rule)', () => {
  // 100 levels from 0 to 30 km; the truth is the generator's continuous e(z), T(z) integrated with
  // Simpson's rule in 1.5 m steps. The code sees only the 100 levels and interpolates between them.
  const heights = stretchedHeightsM(100, 0, 30_000);
  const options = { surfaceRelativeHumidityPct: 70 };
  const r = computeProfileDelays({ latitudeRad: 45 * DEG, siteHeightM: 0, levels: toDomainLevels(column(heights, options)) });
  const e = (z: number) => ruleVapourPressureHpa(z, options);
  const t = (z: number) => columnTemperatureK(z, options);
  const rv = USSA_RSTAR / 0.01801528; // the generator's gas constant of water vapour, 461.52 J/(kg K)
  const integral = (f: (z: number) => number) => simpson(f, 0, 10_000) + simpson(f, 10_000, 16_000, 4000);

  it('PWV within 0.2 %', () => {
    const truthMm = integral((z) => (100 * e(z)) / (rv * t(z)));
    expect(Math.abs(r.pwvMm / truthMm - 1)).toBeLessThan(2e-3);
  });
  it('PWV by the meteorological pressure integral (1/(ρw g)) ∫q dP of the same truth, within 0.3 %', () => {
    // q = ε e / (P − (1 − ε) e), dP = −ρ g dz with the generator's density: an independent formula.
    const epsilon = 0.01801528 / USSA_M0;
    const levels = column(evenHeightsM(10, 0, 16_000), options);
    let qdp = 0;
    for (let i = 0; i + 1 < levels.length; i++) {
      const q = (k: number) =>
        (epsilon * levels[k]!.vapourPressureHpa) / (levels[k]!.pressureHpa - (1 - epsilon) * levels[k]!.vapourPressureHpa);
      const g = ussaGravity((levels[i]!.heightM + levels[i + 1]!.heightM) / 2);
      qdp += (0.5 * (q(i) + q(i + 1)) * (levels[i]!.pressureHpa - levels[i + 1]!.pressureHpa) * 100) / g;
    }
    expect(Math.abs(r.pwvMm / qdp - 1)).toBeLessThan(3e-3);
  });
  it('ZWD within 0.2 % (Bevis et al. 1994 constants)', () => {
    const k2Prime = 70.4 - (GENERATOR_RD / rv) * 77.6;
    const truthM = 1e-6 * integral((z) => (k2Prime * e(z)) / t(z) + (3.739e5 * e(z)) / t(z) ** 2);
    expect(Math.abs(r.zwdM / truthM - 1)).toBeLessThan(2e-3);
  });
  it('Tm within 0.1 K', () => {
    const truthK = integral((z) => e(z) / t(z)) / integral((z) => e(z) / t(z) ** 2);
    expect(Math.abs(r.tmK! - truthK)).toBeLessThan(0.1);
  });
});

describe('Tm plausibility for realistic columns', () => {
  // Common practice: Tm lies between the surface temperature and about 30 K below it; Bevis et al.
  // (1992) fit Tm = 70.2 + 0.72 Ts with an rms scatter of 4.74 K (from memory; docs/constants.md):
  // we ask for agreement within 3 × 4.74 K.
  it.each([
    [-15, 70, 0],
    [0, 30, 0],
    [0, 70, 0],
    [0, 95, 0],
    [0, 70, 1500],
    [15, 80, 0],
  ])('temperature offset %d K, surface RH %d %%, site %d m', (temperatureOffsetK, rh, siteM) => {
    const levels = toDomainLevels(column(stretchedHeightsM(80, 0, 30_000), { surfaceRelativeHumidityPct: rh, temperatureOffsetK }));
    const r = computeProfileDelays({ latitudeRad: 45 * DEG, siteHeightM: siteM, levels });
    const ts = r.column.surfaceTemperatureK;
    expect(r.tmK!).toBeLessThan(ts);
    expect(r.tmK!).toBeGreaterThan(ts - 30);
    expect(Math.abs(r.tmK! - (70.2 + 0.72 * ts))).toBeLessThan(3 * 4.74);
  });
});

describe('compressibility (Owens 1967 factors)', () => {
  it('leaves the ZHD unchanged (it depends on density only) and raises the ZWD by a few hundredths of a per cent (Zw⁻¹ − 1 ≈ 7e-4 at the surface, less aloft)', () => {
    const levels = toDomainLevels(column(stretchedHeightsM(60, 0, 30_000), { surfaceRelativeHumidityPct: 70 }));
    const ideal = computeProfileDelays({ latitudeRad: 45 * DEG, siteHeightM: 0, levels });
    const real = computeProfileDelays({ latitudeRad: 45 * DEG, siteHeightM: 0, levels, compressibility: true });
    expect(real.zhdM).toBe(ideal.zhdM);
    expect(real.zwdM / ideal.zwdM - 1).toBeGreaterThan(2e-4);
    expect(real.zwdM / ideal.zwdM - 1).toBeLessThan(8e-4);
  });
});
