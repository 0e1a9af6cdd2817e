import { describe, expect, it } from 'vitest';
import { DEG } from '../../src/domain/constants.js';
import { chenHerringGradientMapping, GRADIENT_MODELS } from '../../src/domain/gradients/gradient-mapping.js';
import { niellModel } from '../../src/domain/mapping/niell.js';
import { allocateSlantBatch, computeSlantDelays, zeroGradientTerm } from '../../src/domain/slant.js';

const mapping = niellModel.prepare({ latitudeRad: 47.5 * DEG, heightM: 420, dayOfYear: 172.3 });
const chenHerring = GRADIENT_MODELS['chen-herring']!;

/** Azimuths [rad]: every 0.1° of [0°, 360°], 360° itself, −0, and doubles on both sides of π, 3π/2 and 2π. */
function azimuthsAround(): number[] {
  const around = (x: number) => [
    x,
    x - 1e-6,
    x + 1e-6,
    x - 1e-6 * (1 + 1e-9),
    x + 1e-6 * (1 + 1e-9),
    x * (1 - 2 ** -52),
    x * (1 + 2 ** -52),
  ];
  return [
    ...Array.from({ length: 3601 }, (_, i) => i * 0.1 * DEG),
    360 * DEG,
    -0,
    0,
    ...around(Math.PI),
    ...around(1.5 * Math.PI),
    ...around(2 * Math.PI),
    ...around(Math.PI / 2),
    -0.5,
    -4,
    7,
    13.5,
    1e7,
  ];
}

describe('IERS Conventions (2010) eq. 9.12 with the gradient term of eq. 9.14: slant = m_h ZHD + m_w ZWD + m_g (G_N cos a + G_E sin a)', () => {
  // The expected values are the equation evaluated per direction with the single-elevation functions.
  const elevationsRad = Float64Array.from([3, 5, 7, 10, 20, 45, 89.9, 90, 30, 60], (d) => d * DEG);
  const azimuthsRad = Float64Array.from([0, 37, 90, 135, 180, 200, 270, 300, 359.9, 360], (d) => d * DEG);

  for (const zenith of [
    { zhdM: 2.25, zwdM: 0.12, northGradientM: 0.0005, eastGradientM: -0.0003 },
    { zhdM: 2.25, zwdM: 0.12, northGradientM: 0, eastGradientM: 0 },
  ]) {
    it(`agrees to 1e-12 m with the equation (G_N ${zenith.northGradientM} m, G_E ${zenith.eastGradientM} m)`, () => {
      const out = computeSlantDelays(mapping, chenHerring, zenith, elevationsRad, azimuthsRad, allocateSlantBatch(elevationsRad.length));
      elevationsRad.forEach((e, i) => {
        const a = azimuthsRad[i]!;
        const gradientM = chenHerringGradientMapping(e) * (zenith.northGradientM * Math.cos(a) + zenith.eastGradientM * Math.sin(a));
        const totalM = mapping.hydrostatic(e) * zenith.zhdM + mapping.wet(e) * zenith.zwdM + gradientM;
        expect(out.gradientM[i]!).toBeCloseTo(gradientM, 12);
        expect(out.totalM[i]!).toBeCloseTo(totalM, 12);
      });
    });
  }
});

describe('without gradients: the azimuth term bit for bit as 0 · cos a + 0 · sin a (IEEE 754 signed zeros)', () => {
  // The sign of the zero is visible in an Arrow answer (its float64 bits), so it must be what the general
  // formula gives: −0 where cos a < 0 and sin a < 0 (IEEE 754-2008 §6.3: +0 · x is −0 for x < 0; +0 + −0 is +0).
  const written = (a: number) => 0 * Math.cos(a) + 0 * Math.sin(a);

  it('zeroGradientTerm equals the formula for every 0.1° and at the quadrant edges (Object.is: the sign included)', () => {
    const azimuths = azimuthsAround();
    const differing = azimuths.filter((a) => !Object.is(zeroGradientTerm(a), written(a)));
    expect(differing).toEqual([]);
    // Both zeros occur: the comparison above is not between two constants.
    expect(azimuths.some((a) => Object.is(written(a), -0))).toBe(true);
    expect(azimuths.some((a) => Object.is(written(a), 0))).toBe(true);
    expect(Number.isNaN(zeroGradientTerm(Number.NaN))).toBe(true);
  });

  it('computeSlantDelays: gradient and total columns bit for bit those of the formula with cos and sin', () => {
    const azimuthsRad = Float64Array.from(azimuthsAround());
    const n = azimuthsRad.length;
    const elevationsRad = Float64Array.from({ length: n }, (_, i) => (3 + (87 * i) / n) * DEG);
    elevationsRad[n - 1] = 90 * DEG; // the zenith: m_g is exactly 0 there
    const zenith = { zhdM: 2.25, zwdM: 0.12, northGradientM: 0, eastGradientM: 0 };
    const out = computeSlantDelays(mapping, chenHerring, zenith, elevationsRad, azimuthsRad, allocateSlantBatch(n));
    for (let i = 0; i < n; i++) {
      const gradientM = out.mappingGradient[i]! * written(azimuthsRad[i]!);
      expect(Object.is(out.gradientM[i], gradientM), `gradient at ${azimuthsRad[i]} rad`).toBe(true);
      expect(Object.is(out.totalM[i], out.hydrostaticM[i]! + out.wetM[i]! + gradientM)).toBe(true);
    }
  });

  it('a gradient given as −0 takes the general formula (its products differ in sign from those of +0)', () => {
    const a = Float64Array.from([10 * DEG]);
    const e = Float64Array.from([30 * DEG]);
    const out = computeSlantDelays(
      mapping,
      chenHerring,
      { zhdM: 2.25, zwdM: 0.12, northGradientM: -0, eastGradientM: -0 },
      e,
      a,
      allocateSlantBatch(1),
    );
    expect(Object.is(out.gradientM[0], -0)).toBe(true); // −0 · cos a + −0 · sin a = −0 + −0 in the first quadrant
  });
});
