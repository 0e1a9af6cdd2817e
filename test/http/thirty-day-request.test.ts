/**
 * 30 days of data in one request (issue 14: "30 days of data can be sent in one request"): 30 GPS-like
 * days (one constellation of 30 satellites at 30 s, 7–11 in view, test/helpers/gps-like-days.ts: ~826 000
 * observations, ~73 MB as columns JSON) are accepted through HTTP and answered with one series entry per
 * epoch of the request; 33 days (over MAX_OBSERVATIONS) are refused with a 413 naming `observations`
 * while most of the body is still unsent. Expected counts come from the generated data (the distinct
 * epochs sent), not from the service. Slow (a 30-day estimation): its own timeout of 120 s.
 */

import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../src/http/app.js';
import { MAX_OBSERVATIONS, ZWD_BODY_LIMIT_BYTES } from '../../src/limits.js';
import { columnsJson, gpsLikeColumns } from '../helpers/gps-like-days.js';

/** Every observation counts (the sky is generated down to 5°), so the series has one entry per distinct epoch. */
const OPTIONS = { options: { elevation_cutoff_deg: 5 } };

describe('POST /v1/zwd-estimates with 30 days of GPS-like data', () => {
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

  it('30 days as columns JSON: accepted and answered, one series entry per epoch sent', async () => {
    const month = gpsLikeColumns(30);
    expect(month.count).toBeGreaterThan(790_000); // 30 days of 7–11 satellites at 30 s
    expect(month.count).toBeLessThanOrEqual(MAX_OBSERVATIONS);
    const body = columnsJson(month, OPTIONS);
    expect(body.byteLength).toBeGreaterThan(64 * 1024 * 1024); // over the earlier body limit
    expect(body.byteLength).toBeLessThanOrEqual(ZWD_BODY_LIMIT_BYTES);
    const epochs = new Set(month.columns.epoch);
    const res = await fetch(`http://127.0.0.1:${port}/v1/zwd-estimates?shape=columns&fields=epoch,ztd_m`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body,
    });
    const answer = (await res.json()) as { series: { epoch: string[]; ztd_m: number[] } };
    expect(res.status).toBe(200);
    expect(answer.series.epoch.length).toBe(epochs.size);
    expect(answer.series.epoch[0]).toBe(month.columns.epoch[0]);
    expect(answer.series.epoch.at(-1)).toBe(month.columns.epoch.at(-1));
    // ZTD = a-priori ZHD 2.2 m + ZWD of a mid-latitude summer (0.05–0.4 m; common practice), at every epoch.
    for (const ztd of answer.series.ztd_m) expect(ztd).toBeGreaterThan(2.2);
    expect(Math.max(...answer.series.ztd_m)).toBeLessThan(2.7);
  }, 120_000);

  it('33 days (over MAX_OBSERVATIONS): 413 naming observations before the body is sent in full', async () => {
    const over = gpsLikeColumns(33);
    expect(over.count).toBeGreaterThan(MAX_OBSERVATIONS);
    // Observations first, so that the count passes the limit inside the body; sent in pieces, a client stopping on the answer.
    const bytes = columnsJson(over, OPTIONS);
    const r = await new Promise<{ status: number; body: string; sent: number }>((resolve, reject) => {
      let sent = 0;
      let answered = false;
      const req = http.request(
        { port, host: '127.0.0.1', method: 'POST', path: '/v1/zwd-estimates', headers: { 'content-type': 'application/json' } },
        (res) => {
          answered = true;
          const parts: Buffer[] = [];
          res.on('data', (c: Buffer) => parts.push(c));
          res.on('end', () => {
            req.destroy();
            resolve({ status: res.statusCode!, body: Buffer.concat(parts).toString(), sent });
          });
        },
      );
      req.on('error', (err) => (answered ? undefined : reject(err)));
      const piece = 256 * 1024;
      const more = () => {
        while (!answered && sent < bytes.length) {
          const chunk = bytes.subarray(sent, sent + piece);
          sent += chunk.length;
          if (!req.write(chunk)) return void req.once('drain', more);
        }
        if (!answered) req.end();
      };
      more();
    });
    expect(r.status).toBe(413);
    const problem = JSON.parse(r.body) as { errors: { field: string; message: string }[] };
    expect(problem.errors[0]!.field).toBe('observations');
    expect(problem.errors[0]!.message).toContain(`more than ${MAX_OBSERVATIONS} observations`);
    // The count passes the limit inside the first column (epoch, about a third of the bytes).
    expect(r.sent).toBeLessThan(bytes.length * 0.5);
  }, 120_000);
});
