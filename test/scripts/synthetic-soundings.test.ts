import { describe, expect, it } from 'vitest';
import { DEMO_NETWORK, truthSeries } from '../../scripts/synthetic/network.js';
import { syntheticSounding } from '../../scripts/synthetic/soundings.js';
import { computeProfileDelays } from '../../src/domain/profile/profile-delays.js';
import { DEG } from '../helpers/units.js';

const T0 = Date.UTC(2026, 2, 14, 12);

describe('invented soundings consistent with the station truth (scripts/synthetic/soundings.ts)', () => {
  // Two independent integrations: the generator's trapezoid rule over its own vapour pressures, and the
  // service's shells from relative humidity (WMO-No. 8 with the enhancement factor, ~0.4 % more vapour).
  it.each(DEMO_NETWORK.map((s) => [s.stationId, s] as const))(
    '%s: the service integrates the generator’s PWV within 1 %, and that is the truth within 4 sounding-error σ',
    (_, station) => {
      const truth = truthSeries(station, T0, 1, 1, 7)[0]!;
      const sounding = syntheticSounding(station, truth, { seed: 3 });
      const levels = sounding.body.levels.map((l) => ({
        heightM: l.height_m,
        pressureHpa: l.pressure_hpa,
        temperatureC: l.temperature_c,
        relativeHumidityPct: l.relative_humidity_pct,
      }));
      const r = computeProfileDelays({ latitudeRad: station.latitudeDeg * DEG, siteHeightM: station.heightM, levels });
      expect(Math.abs(r.pwvMm - sounding.pwvMm)).toBeLessThan(0.01 * sounding.pwvMm);
      expect(Math.abs(sounding.pwvMm - truth.pwvMm)).toBeLessThan(4 * 0.03 * truth.pwvMm);
    },
  );
  it('humidity stops above humidityTopHpa', () => {
    const station = DEMO_NETWORK[0]!;
    const s = syntheticSounding(station, truthSeries(station, T0, 1, 1, 7)[0]!, { seed: 3, humidityTopHpa: 400 });
    expect(s.body.levels.filter((l) => l.relative_humidity_pct === undefined).every((l) => l.pressure_hpa < 400)).toBe(true);
    expect(s.body.levels.at(-1)!.relative_humidity_pct).toBeUndefined();
  });
});
