/**
 * The benchmark days of bench/json-read.bench.ts as columns JSON bodies of POST /v1/zwd-estimates, built as
 * bench/columns.bench.ts builds them (test/helpers/realistic-sky.ts, seed 11, 30 s): the GPS-like day (30
 * satellites, 7–11 in view, 26 452 observations, 25 gross errors) and the four-constellation day (28–38 in
 * view, 100 gross errors).
 */

import { DEG } from '../src/domain/constants.js';
import { simulateSky } from '../test/helpers/realistic-sky.js';
import { skyInput } from '../test/helpers/synthetic-input.js';

export const DAYS = {
  gps: { name: 'GPS-like day', constellations: ['gps'] as const, grossErrors: 25 },
  four: { name: 'four-constellation day', constellations: ['gps', 'glonass', 'galileo', 'beidou'] as const, grossErrors: 100 },
};

export function dayBody(day: keyof typeof DAYS): Uint8Array<ArrayBuffer> {
  const { constellations, grossErrors } = DAYS[day];
  const input = skyInput(simulateSky({ seed: 11, durationS: 86_400, grossErrors, constellations: [...constellations] }));
  const o = input.observations;
  const iso = new Map<number, string>();
  const epoch = o.epochMs.map((ms) => iso.get(ms) ?? (iso.set(ms, new Date(ms).toISOString()), iso.get(ms)!));
  const body = {
    site: { latitude_deg: input.latitudeRad / DEG, longitude_deg: 7.4, height_m: input.heightM ?? 500 },
    apriori: { zhd_m: 2.2 },
    observations: {
      epoch,
      satellite: o.satellite,
      elevation_deg: o.elevationRad.map((e) => e / DEG),
      azimuth_deg: o.azimuthRad.map((a) => a / DEG),
      residual_m: o.residualM,
    },
  };
  return new Uint8Array(Buffer.from(JSON.stringify(body)));
}
