/**
 * The slant task's work arrays are kept from one request to the next (src/http/tasks/apriori-batch.ts,
 * REUSED_WORK_DIRECTIONS): an answer must not depend on the requests before it. Common practice for reused
 * buffers: the same request gives the same bytes before and after other requests of other sizes and models,
 * in every answer shape, and a batch above the reused size (arrays of its own) gives the bytes of the same
 * directions sent as two smaller batches.
 */

import { describe, expect, it } from 'vitest';
import { tableFromIPC } from 'apache-arrow';
import type { AnswerShape } from '../../src/http/answer-shape.js';
import { handleSlantDelaysRequest, type BatchTaskInput } from '../../src/http/tasks/apriori-batch.js';

const site = { latitude_deg: -33.4, longitude_deg: 151.2, height_m: 35 };
const met = { pressure_hpa: 1009.1, temperature_c: 22.4, relative_humidity_pct: 58 };
const directions = (n: number, seed: number) => ({
  elevation_deg: Array.from({ length: n }, (_, i) => 3 + ((i * 7919 + seed) % 8700) / 100),
  azimuth_deg: Array.from({ length: n }, (_, i) => (i * 37 + seed) % 360),
});
const body = (n: number, seed: number, model = 'niell') =>
  new TextEncoder().encode(JSON.stringify({ site, epoch: '2026-01-05T00:00:00Z', met, model, directions: directions(n, seed) }));

async function answer(input: BatchTaskInput): Promise<Buffer> {
  const outcome = await handleSlantDelaysRequest(input);
  if (!outcome.ok) throw new Error(outcome.error.detail);
  return Buffer.from(outcome.output.json);
}

const SHAPES: BatchTaskInput['answer'][] = [
  { shape: 'rows', format: 'json', fields: undefined },
  { shape: 'columns', format: 'json', fields: undefined },
  { shape: 'rows', format: 'arrow', fields: undefined },
];

describe('slant answers do not depend on the requests before them (reused work arrays)', () => {
  for (const shape of SHAPES) {
    it(`${shape!.format} ${shape!.shape}: the same bytes before and after requests of other sizes and models`, async () => {
      const first = await answer({ body: body(500, 1), answer: shape });
      await answer({ body: body(9000, 2, 'chao'), answer: shape });
      await answer({ body: body(3, 3), answer: shape });
      expect((await answer({ body: body(500, 1), answer: shape })).equals(first)).toBe(true);
    });
  }

  it('a batch above the reused size: the values of the same directions sent in two halves', async () => {
    const n = 20_000;
    const all = directions(n, 5);
    const request = (d: { elevation_deg: number[]; azimuth_deg: number[] }) =>
      new TextEncoder().encode(JSON.stringify({ site, epoch: '2026-01-05T00:00:00Z', met, directions: d }));
    const arrow: AnswerShape = { shape: 'rows', format: 'arrow', fields: ['total_m'] };
    const whole = tableFromIPC(await answer({ body: request(all), answer: arrow }))
      .getChild('total_m')!
      .toArray() as Float64Array;
    const half = (from: number, to: number) => ({
      elevation_deg: all.elevation_deg.slice(from, to),
      azimuth_deg: all.azimuth_deg.slice(from, to),
    });
    const a = tableFromIPC(await answer({ body: request(half(0, n / 2)), answer: arrow }))
      .getChild('total_m')!
      .toArray() as Float64Array;
    const b = tableFromIPC(await answer({ body: request(half(n / 2, n)), answer: arrow }))
      .getChild('total_m')!
      .toArray() as Float64Array;
    expect(whole.length).toBe(n);
    expect(Array.from(whole)).toEqual([...a, ...b]);
  });
});
