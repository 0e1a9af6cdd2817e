/**
 * The benchmark days of bench/json-read.bench.ts as columns JSON bodies of POST /v1/zwd-estimates, built as
 * bench/columns.bench.ts builds them (test/helpers/realistic-sky.ts, seed 11, 30 s): the GPS-like day (30
 * satellites, 7–11 in view, 26 452 observations, 25 gross errors) and the four-constellation day (28–38 in
 * view, 100 gross errors).
 */

import { dayRequest } from '../test/helpers/gps-like-days.js';

export const DAYS = {
  gps: { name: 'GPS-like day', constellations: ['gps'] as const, grossErrors: 25 },
  four: { name: 'four-constellation day', constellations: ['gps', 'glonass', 'galileo', 'beidou'] as const, grossErrors: 100 },
};

export function dayBody(day: keyof typeof DAYS): Uint8Array<ArrayBuffer> {
  const { constellations, grossErrors } = DAYS[day];
  const { rest, columns } = dayRequest({ grossErrors, constellations: [...constellations] });
  return new Uint8Array(Buffer.from(JSON.stringify({ ...rest, observations: columns })));
}
