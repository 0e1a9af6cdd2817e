/**
 * The slant-delays and mapping-factors routes read their bodies themselves (src/http/batch-body.ts readBatchBodies: a
 * declared body copied into a pooled buffer as it arrives, handed back once read). Compared with fastify's own
 * `parseAs: 'buffer'` reader, which the precipitable-water route still uses (the same body limit, 32 MiB, and the
 * same error handler):
 * the refusals of a body over the limit are the same answers; a body sent without a Content-Length (chunked) is
 * answered as the same body with one; and requests of different sizes and forms sent together, on pooled
 * buffers reused between them, each get the bytes of the same request sent alone (common practice for reused
 * buffers).
 */

import { request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { describe, expect, it } from 'vitest';
import Fastify from 'fastify';
import { readBatchBodies } from '../../src/http/batch-body.js';
import { BATCH_BODY_LIMIT_BYTES } from '../../src/limits.js';
import { useListeningApp } from '../helpers/app.js';
import { slantArrowRequest } from '../helpers/slant-arrow-request.js';

const ARROW = 'application/vnd.apache.arrow.stream';
const base = {
  site: { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 },
  epoch: '2026-06-21T06:30:00Z',
  met: { pressure_hpa: 965.3, temperature_c: 18.2, relative_humidity_pct: 61 },
};

const servicePort = useListeningApp();

interface Sent {
  path: string;
  headers: Record<string, string | number>;
  /** Written in pieces of this size (a chunked body when no Content-Length is set). */
  pieces: Uint8Array[];
}

/** One request on its own connection: the status and the answer's bytes (a closed connection ends it too). */
function send({ path, headers, pieces }: Sent): Promise<{ status: number; body: Buffer }> {
  return new Promise((resolve, reject) => {
    const req = httpRequest(
      { host: '127.0.0.1', port: servicePort(), path, method: 'POST', headers: { connection: 'close', ...headers } },
      (res) => {
        const parts: Buffer[] = [];
        res.on('data', (c: Buffer) => parts.push(c));
        res.on('end', () => resolve({ status: res.statusCode!, body: Buffer.concat(parts) }));
      },
    );
    // The server may answer and close before the whole body is written: that is the answer under test.
    req.on('error', (err: NodeJS.ErrnoException) => (err.code === 'EPIPE' || err.code === 'ECONNRESET' ? undefined : reject(err)));
    const write = (i: number) => {
      if (i === pieces.length) return void req.end();
      if (req.write(pieces[i]!)) write(i + 1);
      else req.once('drain', () => write(i + 1));
    };
    write(0);
  });
}

const json = (body: unknown) => new TextEncoder().encode(JSON.stringify(body));
const columnsBody = (n: number) =>
  json({
    ...base,
    directions: {
      elevation_deg: Array.from({ length: n }, (_, i) => 3 + ((i * 7 + n) % 87)),
      azimuth_deg: Array.from({ length: n }, (_, i) => (i * 37 + n) % 360),
    },
  });
const mappingBody = (n: number) =>
  json({ site: base.site, epoch: base.epoch, elevations_deg: Array.from({ length: n }, (_, i) => 3 + (i % 87)) });
const pwvBody = (n: number) =>
  json({
    site: base.site,
    records: Array.from({ length: n }, (_, i) => ({ epoch: base.epoch, ztd_m: 2.4 + i * 1e-4, pressure_hpa: 965.3 })),
  });

const arrowBody = (n: number) => slantArrowRequest(n, base);

/** A problem answer without its `instance` (the path, which differs between the routes). */
const problem = (body: Buffer) => ({ ...(JSON.parse(body.toString('utf8')) as object), instance: undefined });

/** The bytes in pieces of `size` (the last one shorter). */
const inPieces = (bytes: Uint8Array, size: number) =>
  Array.from({ length: Math.ceil(bytes.length / size) }, (_, i) => bytes.subarray(i * size, (i + 1) * size));

describe('slant-delays and mapping-factors bodies read into pooled buffers, against fastify`s reader (precipitable-water)', () => {
  it('a declared Content-Length over the limit: the same 413 from all three, before the body is read', async () => {
    const headers = { 'content-type': 'application/json', 'content-length': BATCH_BODY_LIMIT_BYTES + 1 };
    const slant = await send({ path: '/v1/slant-delays', headers, pieces: [columnsBody(10)] });
    const mapping = await send({ path: '/v1/mapping-factors', headers, pieces: [mappingBody(10)] });
    const fastifys = await send({ path: '/v1/precipitable-water', headers, pieces: [pwvBody(10)] });
    expect(slant.status).toBe(413);
    for (const read of [slant, mapping]) {
      expect(read.status).toBe(fastifys.status);
      expect(problem(read.body)).toEqual(problem(fastifys.body));
    }
  });

  it('a chunked body growing past the limit: the same 413 from both', async () => {
    const filler = new Uint8Array(1024 * 1024).fill(0x20); // spaces: valid JSON whitespace
    const pieces = (head: Uint8Array) => [head.subarray(0, head.length - 1), ...Array.from({ length: 33 }, () => filler)];
    const headers = { 'content-type': 'application/json', 'transfer-encoding': 'chunked' };
    const slant = await send({ path: '/v1/slant-delays', headers, pieces: pieces(columnsBody(10)) });
    const mapping = await send({ path: '/v1/mapping-factors', headers, pieces: pieces(mappingBody(10)) });
    const fastifys = await send({ path: '/v1/precipitable-water', headers, pieces: pieces(pwvBody(10)) });
    expect(slant.status).toBe(413);
    for (const read of [slant, mapping]) {
      expect(read.status).toBe(fastifys.status);
      expect(problem(read.body)).toEqual(problem(fastifys.body));
    }
  });

  it('a chunked body (no Content-Length) gets the answer of the same body with one, JSON and Arrow', async () => {
    for (const [path, type, body] of [
      ['/v1/slant-delays?shape=columns', 'application/json', columnsBody(3000)],
      ['/v1/slant-delays', ARROW, arrowBody(3000)],
      ['/v1/mapping-factors', 'application/json', mappingBody(9000)],
    ] as const) {
      const declared = await send({ path, headers: { 'content-type': type, 'content-length': body.length }, pieces: [body] });
      const chunked = await send({ path, headers: { 'content-type': type, 'transfer-encoding': 'chunked' }, pieces: inPieces(body, 7000) });
      expect(declared.status).toBe(200);
      expect(chunked.status).toBe(200);
      expect(chunked.body.equals(declared.body)).toBe(true);
    }
  });

  it('requests of different sizes and forms sent together each get the bytes of the request sent alone', async () => {
    const requests = [4000, 9000, 1500, 12000, 20, 9000].flatMap((n): Sent[] => [
      { path: '/v1/slant-delays?shape=columns', headers: { 'content-type': 'application/json' }, pieces: inPieces(columnsBody(n), 40_000) },
      { path: '/v1/slant-delays', headers: { 'content-type': ARROW, accept: ARROW }, pieces: inPieces(arrowBody(n), 40_000) },
      { path: '/v1/mapping-factors', headers: { 'content-type': 'application/json' }, pieces: inPieces(mappingBody(n), 40_000) },
    ]);
    const declared = requests.map((r) => ({
      ...r,
      headers: { ...r.headers, 'content-length': r.pieces.reduce((s, p) => s + p.length, 0) },
    }));
    const alone: { status: number; body: Buffer }[] = [];
    for (const r of declared) alone.push(await send(r));
    expect(alone.every((a) => a.status === 200)).toBe(true);
    for (let round = 0; round < 3; round++) {
      const together = await Promise.all(declared.map(send));
      // Arrow answers carry the same rows and metadata; their bytes are compared as they are.
      together.forEach((answer, i) => expect(answer.body.equals(alone[i]!.body)).toBe(true));
    }
  });
});

describe('readBatchBodies: a body is its own until the route hands it back', () => {
  it('bodies held across an await while others arrive keep their bytes (a route that never releases them)', async () => {
    const held = Fastify();
    readBatchBodies(held);
    held.post('/echo', async (request) => {
      await new Promise((r) => setTimeout(r, 60)); // other bodies arrive meanwhile, each into a pooled buffer
      return { first: (request.body as Buffer).readUInt32LE(0), sum: (request.body as Buffer).reduce((s, b) => s + b, 0) };
    });
    await held.listen({ port: 0, host: '127.0.0.1' });
    const heldPort = (held.server.address() as AddressInfo).port;
    try {
      const bodies = [70_000, 90_000, 70_000, 150_000, 90_000].map((size, i) => new Uint8Array(size).fill(i + 1));
      const answers = await Promise.all(
        bodies.map(async (body, i) => {
          await new Promise((r) => setTimeout(r, 15 * i));
          const res = await fetch(`http://127.0.0.1:${heldPort}/echo`, { method: 'POST', body, headers: { 'content-type': ARROW } });
          return res.json();
        }),
      );
      answers.forEach((answer, i) => expect(answer).toEqual({ first: (i + 1) * 0x01010101, sum: (i + 1) * bodies[i]!.length }));
    } finally {
      await held.close();
    }
  });
});
