/**
 * The station PWV retrieval in slices (stationPwvRetrieval, used by the paged station-year read)
 * gives the records and warnings of the retrieval in one piece, whatever the slice boundaries: met
 * gaps, interpolated epochs and missing values placed right at and around the boundaries. The
 * one-piece retrieval itself is checked against Saastamoinen/Bevis in test/http/station-precipitable-water.test.ts.
 */

import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { stationPrecipitableWater, stationPwvRetrieval } from '../../src/services/station-pwv.js';
import type { Station, SurfaceMetRow, ZenithDelayRow } from '../../src/storage/repository.js';

const STATION: Station = {
  stationId: 'FNX-1',
  name: 'Fenwick Nab (invented)',
  latitudeDeg: 51.2,
  longitudeDeg: -1.4,
  heightM: 140,
  metHeightM: 131,
  description: null,
  createdAt: '2026-01-01T00:00:00.000Z',
  updatedAt: '2026-01-01T00:00:00.000Z',
};
const T0 = Date.UTC(2026, 5, 1);
const MIN = 60_000;

function data() {
  const u = mulberry32(424_242);
  // Delays every 5 min; met every 10 min with holes (gaps longer than 3 h at 40..80 and at 95..99) and nulls.
  const delays: ZenithDelayRow[] = Array.from({ length: 120 }, (_, i) => ({
    epochMs: T0 + i * 5 * MIN,
    source: 'q',
    ztdM: 2.2 + 0.1 * u(),
    ztdSigmaM: i % 17 === 0 ? null : i % 23 === 0 ? 0.02 : 0.004,
    modelFingerprint: 'a1b2c3d4e5f60718',
  }));
  const met: SurfaceMetRow[] = [];
  for (let k = -2; k < 62; k++) {
    const i = 2 * k;
    if ((i >= 40 && i < 80) || (i >= 95 && i < 99)) continue;
    met.push({ epochMs: T0 + i * 5 * MIN, source: 'm', pressureHpa: k % 7 === 3 ? null : 990 + 5 * u(), temperatureC: 8 + 10 * u() });
  }
  return { delays, met };
}

describe('stationPwvRetrieval in slices equals the retrieval in one piece', () => {
  const { delays, met } = data();
  const whole = stationPrecipitableWater(STATION, delays, met, { maxMetGapMs: 3 * 3600_000 });
  it('has the cases that matter: measured, interpolated, missing met, unknown and large sigmas', () => {
    const qualities = new Set(whole.records.map((r) => r.quality));
    expect([...qualities].sort()).toEqual(['delay-sigma-large', 'delay-sigma-unknown', 'met-interpolated', 'met-missing', 'ok']);
  });
  for (const size of [1, 2, 3, 7, 16, 41, 119, 120]) {
    it(`slices of ${size}`, () => {
      const retrieval = stationPwvRetrieval(STATION, delays, met, { maxMetGapMs: 3 * 3600_000 });
      const records = [];
      for (let start = 0; start < delays.length; start += size)
        records.push(...retrieval.records(start, Math.min(delays.length, start + size)));
      expect(records).toEqual(whole.records);
      expect(retrieval.warnings()).toEqual(whole.warnings);
    });
  }
});
