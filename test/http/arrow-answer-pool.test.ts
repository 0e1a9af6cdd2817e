/**
 * Arrow answers are written into pooled buffers, handed back when the response has left
 * (src/http/answer-shape.ts releasePooledBytes, src/http/batch-body.ts). Common practice for reused buffers:
 * answers sent at the same time over separate connections, of different sizes, each hold exactly the bytes of
 * the same request sent alone (the reuse of a released buffer itself: test/http/arrow-stream-bytes.test.ts).
 */

import { tableFromIPC } from 'apache-arrow';
import { describe, expect, it } from 'vitest';
import { useApp } from '../helpers/app.js';
import { slantArrowRequest } from '../helpers/slant-arrow-request.js';

const ARROW = 'application/vnd.apache.arrow.stream';
const base = {
  site: { latitude_deg: 61.2, longitude_deg: -149.9, height_m: 40 },
  epoch: '2026-11-02T18:00:00Z',
  met: { pressure_hpa: 1002.5, temperature_c: -4.1, relative_humidity_pct: 80 },
};

/** An Arrow request of n directions (the rest of the request in the metadata "request"). */
const arrowRequest = (n: number) => slantArrowRequest(n, base);

const binaryParser = (res: import('superagent').Response, done: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const parts: Buffer[] = [];
  stream.on('data', (c: Buffer) => parts.push(c));
  stream.on('end', () => done(null, Buffer.concat(parts)));
};

describe('Arrow answers in pooled buffers', () => {
  const api = useApp();
  const post = async (n: number) =>
    (
      await api()
        .post('/v1/slant-delays')
        .set('content-type', ARROW)
        .set('accept', ARROW)
        .buffer(true)
        .parse(binaryParser)
        .send(arrowRequest(n))
        .expect(200)
    ).body as Buffer;

  it('answers sent together, of different sizes, hold the bytes of each request sent alone', async () => {
    const sizes = [4000, 1500, 4000, 7000, 20, 1500];
    const alone: Buffer[] = [];
    for (const n of sizes) alone.push(await post(n));
    for (let round = 0; round < 3; round++) {
      const together = await Promise.all(sizes.map((n) => post(n)));
      together.forEach((bytes, i) => expect(bytes.equals(alone[i]!)).toBe(true));
    }
    expect(tableFromIPC(alone[3]!).numRows).toBe(7000);
  });
});
