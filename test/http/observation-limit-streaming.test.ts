/**
 * The observation limit checked while the body arrives (issue 14 item 3): a body over MAX_OBSERVATIONS
 * is refused with a 413 naming the limit before it has been sent in full, for JSON objects, JSON column
 * arrays, CSV and an Arrow IPC stream; the counters (src/http/row-count.ts) never count more rows than
 * the full readers do (the reference: the row count of the generated body, and apache-arrow's own reader).
 * Memory is measured in bench/estimation-memory (RSS), not here.
 */

import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { RecordBatchStreamWriter, tableFromArrays, tableFromIPC, tableToIPC, type Table } from 'apache-arrow';
import { Readable } from 'node:stream';
import Fastify, { type FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../src/http/app.js';
import { FEWEST_JSON_OBSERVATION_BYTES, ownsBuffer, rawBodyOf, readEstimationBodies } from '../../src/http/raw-body.js';
import { columnSpecsOf, readColumns } from '../../src/http/columns.js';
import { HttpProblem } from '../../src/http/problem.js';
import { zwdObservationSchema } from '../../src/http/schemas/zwd-estimates.js';
import { arrowRowCounter, csvRowCounter, jsonRowCounter, type RowCounter } from '../../src/http/row-count.js';
import { MAX_OBSERVATIONS } from '../../src/limits.js';

const ARROW = 'application/vnd.apache.arrow.stream';
const site = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const row = { epoch: '2026-06-21T06:30:00Z', satellite: 'G05', elevation_deg: 40.5, azimuth_deg: 120, residual_m: 0.0123 };

/** Feeds `text` to a counter in chunks of `size` bytes (chunk edges anywhere, also inside strings and escapes). */
function countIn(counter: RowCounter, bytes: Uint8Array, size: number): number {
  for (let at = 0; at < bytes.length; at += size) counter.push(bytes.subarray(at, at + size));
  return counter.rows;
}
const utf8 = (text: string) => new TextEncoder().encode(text);

describe('row counters: the rows of the body, whatever the chunking', () => {
  const objects = Array.from({ length: 1234 }, (_, i) => ({ ...row, satellite: i % 7 ? 'G05' : 'E"1\\}' }));
  const met = Array.from({ length: 50 }, () => ({ epoch: row.epoch, pressure_hpa: 950, temperature_c: 10 }));
  for (const size of [1, 7, 4096]) {
    it(`JSON objects and columns, met and option arrays beside them not counted (chunks of ${size} bytes)`, () => {
      const asObjects = JSON.stringify({ site, met, options: { zwd_interval_s: 900 }, observations: objects });
      expect(countIn(jsonRowCounter(), utf8(asObjects), size)).toBe(1234);
      const columns = Object.fromEntries(Object.keys(row).map((k) => [k, objects.map((o) => o[k as keyof typeof row])]));
      expect(countIn(jsonRowCounter(), utf8(JSON.stringify({ met, observations: columns, site })), size)).toBe(1234);
    });
    it(`JSON columns pretty-printed, strings with brackets, commas and escapes in them (chunks of ${size} bytes)`, () => {
      const tricky = ['G]1', 'E,2', 'R[3', 'C{4}', 'J\\"5'];
      const columns = {
        satellite: objects.map((_, i) => tricky[i % tricky.length]!),
        epoch: objects.map((o) => o.epoch),
        elevation_deg: objects.map((_, i) => 5 + (i % 80) + 1e-13 * i),
        residual_m: objects.map((_, i) => -1.5e-3 * i),
      };
      // The reference: the length of the columns as JSON.parse reads them back.
      const body = JSON.stringify({ options: { gradients: { interval_s: 3600 } }, observations: columns, met }, null, 2);
      expect((JSON.parse(body) as { observations: { epoch: unknown[] } }).observations.epoch).toHaveLength(1234);
      expect(countIn(jsonRowCounter(), utf8(body), size)).toBe(1234);
    });
    it(`CSV data lines (chunks of ${size} bytes)`, () => {
      const csv =
        ['epoch,satellite,elevation_deg,azimuth_deg,residual_m', ...objects.map((o) => Object.values(o).join(','))].join('\n') + '\n';
      expect(countIn(csvRowCounter(), utf8(csv), size)).toBe(1234);
    });
  }
  it('Arrow: the lengths of the record batches, several batches, read back by apache-arrow itself', () => {
    const batch = (n: number) =>
      tableFromArrays({ elevation_deg: Float64Array.from({ length: n }, () => 40), residual_m: new Float64Array(n) }) as Table;
    const writer = new RecordBatchStreamWriter();
    for (const n of [1000, 2500, 17]) for (const b of batch(n).batches) writer.write(b);
    writer.finish();
    const bytes = writer.toUint8Array(true);
    expect(tableFromIPC(bytes).numRows).toBe(3517);
    for (const size of [3, 64, 100_000]) expect(countIn(arrowRowCounter(), bytes, size)).toBe(3517);
  });
});

describe('POST /v1/zwd-estimates over the observation limit: 413 before the body is sent in full', () => {
  let app: FastifyInstance;
  let port: number;
  beforeAll(async () => {
    app = await buildApp();
    await app.listen({ port: 0, host: '127.0.0.1' });
    port = (app.server.address() as AddressInfo).port;
  });
  afterAll(async () => {
    await app.close();
  });

  /**
   * Streams `head`, then `piece` again and again (up to `pieces` times) without a Content-Length, and
   * reports the answer and how many bytes had been written when it came.
   */
  function stream(
    type: string,
    head: Uint8Array,
    piece: Uint8Array,
    pieces: number,
    query = '',
  ): Promise<{ status: number; body: string; sent: number; total: number }> {
    return new Promise((resolve, reject) => {
      let sent = 0;
      let answered = false;
      const req = http.request(
        { port, host: '127.0.0.1', method: 'POST', path: `/v1/zwd-estimates${query}`, headers: { 'content-type': type } },
        (res) => {
          answered = true; // what a client does on an early answer: stop sending
          const parts: Buffer[] = [];
          res.on('data', (c: Buffer) => parts.push(c));
          res.on('end', () => {
            req.destroy();
            resolve({ status: res.statusCode!, body: Buffer.concat(parts).toString(), sent, total: head.length + piece.length * pieces });
          });
        },
      );
      req.on('error', (err) => (answered ? undefined : reject(err)));
      req.write(head);
      sent += head.length;
      let n = 0;
      const more = () => {
        while (!answered && n < pieces) {
          n++;
          sent += piece.length;
          if (!req.write(piece)) return void req.once('drain', more);
        }
        if (!answered) req.end();
      };
      more();
    });
  }

  const pieces = Math.ceil((MAX_OBSERVATIONS * 3) / 1000); // three times the limit, in pieces of 1 000 rows
  const expectRefusedEarly = (r: { status: number; body: string; sent: number; total: number }) => {
    expect(r.status).toBe(413);
    expect(JSON.parse(r.body).errors[0]).toMatchObject({ field: 'observations' });
    expect(JSON.parse(r.body).errors[0].message).toContain(`more than ${MAX_OBSERVATIONS} observations`);
    expect(r.sent).toBeLessThan(r.total * 0.6); // the answer came while most of the body was still unsent
  };

  it('JSON objects', async () => {
    const piece = utf8(Array.from({ length: 1000 }, () => JSON.stringify(row) + ',').join(''));
    expectRefusedEarly(await stream('application/json', utf8(`{"site":${JSON.stringify(site)},"observations":[`), piece, pieces));
  });

  it('JSON column arrays', async () => {
    const piece = utf8(Array.from({ length: 1000 }, () => '"2026-06-21T06:30:00Z",').join(''));
    expectRefusedEarly(await stream('application/json', utf8(`{"site":${JSON.stringify(site)},"observations":{"epoch":[`), piece, pieces));
  });

  it('CSV', async () => {
    const piece = utf8(Array.from({ length: 1000 }, () => Object.values(row).join(',') + '\n').join(''));
    const head = utf8('epoch,satellite,elevation_deg,azimuth_deg,residual_m\n');
    // CSV takes the site from the query.
    const query = `?latitude_deg=${site.latitude_deg}&longitude_deg=${site.longitude_deg}&height_m=${site.height_m}`;
    expectRefusedEarly(await stream('text/csv', head, piece, pieces, query));
  });

  it('Arrow IPC stream (record batches of 1 000 rows)', async () => {
    const table = tableFromArrays({ elevation_deg: Float64Array.from({ length: 1000 }, () => 40) }) as Table;
    const whole = tableToIPC(table, 'stream');
    // The stream's schema message, then its record batch message again and again (the end marker never comes).
    const schemaEnd = arrowSchemaLength(whole);
    const batch = whole.subarray(schemaEnd, whole.length - 8);
    // Ten times the limit: a batch is only ~8 kB, and the loopback socket buffers a few MB ahead of the server.
    expectRefusedEarly(await stream(ARROW, whole.subarray(0, schemaEnd), batch, pieces * 10));
  });
});

/** Bytes of the first message (the schema) of an Arrow IPC stream: marker, length, metadata (no body). */
function arrowSchemaLength(bytes: Uint8Array): number {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  return 8 + view.getInt32(4, true);
}

describe('JSON bodies too short to hold more than the limit are not counted (the boundary)', () => {
  // The smallest valid observation in column arrays: the shortest date-time z.iso.datetime accepts
  // (ISO 8601 / RFC 3339 need seconds with a "Z"; from the zod schema itself below), a one-character
  // satellite (the schema's minimum), one-digit numbers.
  const specs = columnSpecsOf(zwdObservationSchema.shape);
  const smallest = { epoch: '2026-03-14T12:00:00Z', satellite: 'G', elevation_deg: 9, azimuth_deg: 0, residual_m: 0 };

  it('the fewest bytes per observation, derived from the schema, are no more than the smallest valid observation takes', () => {
    expect(FEWEST_JSON_OBSERVATION_BYTES).toBe(33); // 23 + 4 + 3 × 2, counted by hand from the schema (common practice)
    for (const shorter of ['2026-03-14T12:00Z', '2026-03-14T12Z', '2026-03-14T12:00+01', '20260314T120000Z'])
      expect(zwdObservationSchema.shape.epoch.safeParse(shorter).success, shorter).toBe(false);
    expect(zwdObservationSchema.safeParse(smallest).success).toBe(true);
    // R of them as columns (the reference: JSON.stringify and the body schema): at least R × the fewest bytes.
    for (const rows of [1, 2, 1000]) {
      const columns = Object.fromEntries(Object.entries(smallest).map(([k, v]) => [k, Array.from({ length: rows }, () => v)]));
      const body = JSON.stringify({ site, observations: columns });
      // The worker's full column check (src/http/columns.ts readColumns) accepts them.
      const read = readColumns(
        (JSON.parse(body) as { observations: unknown }).observations,
        'observations',
        specs,
        MAX_OBSERVATIONS,
        'observations',
      );
      expect(read.ok).toBe(true);
      expect(body.length).toBeGreaterThanOrEqual(rows * FEWEST_JSON_OBSERVATION_BYTES);
      expect(JSON.stringify(columns).length).toBeLessThan(rows * FEWEST_JSON_OBSERVATION_BYTES + 100); // and not far above: a tight bound
    }
  });

  // A small app with the estimation bodies' reader and a limit of 100 observations: the boundary is 101 × 33 bytes.
  let app: FastifyInstance;
  const maxRows = 100;
  const countFrom = (maxRows + 1) * FEWEST_JSON_OBSERVATION_BYTES;
  beforeAll(async () => {
    app = Fastify();
    await app.register(async (scope) => {
      readEstimationBodies(scope, maxRows);
      scope.post('/echo', async (request, reply) => {
        try {
          const { body } = rawBodyOf(request);
          // JSON arrives as the chunks it came in, each its own buffer (moved to the worker as they are).
          if (!Array.isArray(body) || !body.every(ownsBuffer)) throw new Error('not movable chunks');
          return { bytes: Buffer.concat(body).length };
        } catch (err) {
          if (!(err instanceof HttpProblem)) throw err;
          return reply.code(err.status).send({ errors: err.errors });
        }
      });
    });
    await app.ready();
  });
  afterAll(async () => {
    await app.close();
  });
  /** A column of `rows` one-digit values, padded with spaces to exactly `length` bytes. */
  const bodyOf = (rows: number, length: number) => {
    const text = `{"observations":{"residual_m":[${Array.from({ length: rows }, () => '0').join(',')}]}}`;
    expect(text.length).toBeLessThanOrEqual(length);
    return text + ' '.repeat(length - text.length);
  };
  const post = (payload: string, chunked = false) =>
    app.inject({
      method: 'POST',
      url: '/echo',
      headers: { 'content-type': 'application/json', ...(chunked ? { 'transfer-encoding': 'chunked' } : {}) },
      payload: chunked ? Readable.from([Buffer.from(payload)]) : payload,
    });

  it('one byte below the boundary: not counted (the body reaches the handler, which leaves the check to the worker)', async () => {
    const r = await post(bodyOf(2 * maxRows, countFrom - 1));
    expect(r.statusCode).toBe(200);
    expect(r.json()).toEqual({ bytes: countFrom - 1 });
  });
  it('at the boundary: counted and refused with the 413 naming observations, as before', async () => {
    const r = await post(bodyOf(maxRows + 1, countFrom));
    expect(r.statusCode).toBe(413);
    expect(r.json().errors[0]).toMatchObject({ field: 'observations' });
    expect(r.json().errors[0].message).toContain(`more than ${maxRows} observations (counted while reading`);
  });
  it('at the boundary with the limit itself: counted, not refused', async () => {
    expect((await post(bodyOf(maxRows, countFrom))).statusCode).toBe(200);
  });
  it('without a Content-Length: counted whatever its length', async () => {
    const r = await post(bodyOf(2 * maxRows, countFrom - 1), true);
    expect(r.statusCode).toBe(413);
  });
});
