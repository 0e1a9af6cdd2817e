/**
 * JSON series uploads (met records, delay deposits) above OFFLOAD_BODY_BYTES are parsed and checked in
 * the worker pool (src/http/tasks/json-upload.ts), smaller ones by fastify's parser on the event loop.
 * Both sides of the threshold must give the same answers, byte for byte, and store the same rows. The
 * comparison uses one JSON document sent twice: compact (under the threshold) and followed by
 * whitespace (above it; trailing whitespace is allowed by RFC 8259 §2, so it is the same document and
 * every error position inside it is the same). Which path ran is read from the metrics
 * (tropodelay_compute_duration_seconds_count{task=...}, counted for every run). Rows come from a seeded
 * generator; station names are invented.
 */

import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { OFFLOAD_BODY_BYTES } from '../../src/limits.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const STATION = { name: 'Harrowdene Flats (invented)', latitude_deg: 53.4, longitude_deg: -2.1, height_m: 96.5 };
const T0 = Date.UTC(2026, 6, 1);
const iso = (ms: number) => new Date(ms).toISOString();
const u = mulberry32(31_337);

const metRecords = Array.from({ length: 300 }, (_, i) => ({
  epoch: iso(T0 + i * 300_000),
  pressure_hpa: Math.round((995 + 10 * u()) * 100) / 100,
  temperature_c: Math.round((12 + 8 * u()) * 100) / 100,
  relative_humidity_pct: Math.round((40 + 50 * u()) * 10) / 10,
}));
metRecords[17] = { ...metRecords[17]!, pressure_hpa: 4000 }; // out of range: rejected
metRecords[40] = { ...metRecords[40]!, epoch: metRecords[39]!.epoch }; // duplicate epoch: rejected
const delayRecords = Array.from({ length: 300 }, (_, i) => ({
  epoch: iso(T0 + i * 300_000),
  ztd_m: Math.round((2.3 + 0.1 * u()) * 1e5) / 1e5,
  ztd_sigma_m: 0.004,
}));
delayRecords[5] = { ...delayRecords[5]!, ztd_m: 9 }; // out of the stored range: rejected

/** The document compact (on the loop) and padded above the threshold (in the pool). */
const bothSides = (json: string) => {
  expect(json.length).toBeLessThanOrEqual(OFFLOAD_BODY_BYTES);
  return { loop: json, pool: json + ' '.repeat(OFFLOAD_BODY_BYTES + 1 - json.length) + '\n' };
};

const CASES: { name: string; path: 'met' | 'delays'; body: string }[] = [
  { name: 'met records with bad ones', path: 'met', body: JSON.stringify({ records: metRecords, source: 'mast-h' }) },
  { name: 'met records, source from the query', path: 'met', body: JSON.stringify({ records: metRecords.slice(0, 50) }) },
  { name: 'met: no good record', path: 'met', body: JSON.stringify({ records: [{ epoch: iso(T0), pressure_hpa: 5 }] }) },
  { name: 'met: a syntax error inside', path: 'met', body: `{"records": [${JSON.stringify(metRecords[0])}, x]}` },
  { name: 'met: an unknown envelope key', path: 'met', body: JSON.stringify({ records: metRecords.slice(0, 3), sorce: 'x' }) },
  { name: 'met: records not an array', path: 'met', body: JSON.stringify({ records: { a: 1 } }) },
  { name: 'met: a __proto__ key', path: 'met', body: `{"records": [], "__proto__": {"polluted": true}}` },
  {
    name: 'delays with a bad one',
    path: 'delays',
    body: JSON.stringify({ records: delayRecords, source: 'sol-h', models: { mapping: 'niell' } }),
  },
  { name: 'delays: no source', path: 'delays', body: JSON.stringify({ records: delayRecords.slice(0, 3) }) },
  { name: 'delays: a constructor.prototype key', path: 'delays', body: `{"records": [], "source": "s", "constructor": {"prototype": {}}}` },
];

for (const backend of BACKENDS) {
  describe(`JSON uploads give the same answers on both sides of OFFLOAD_BODY_BYTES (${backend.name})`, () => {
    const { api, auth } = useArchiveApp(backend, { maxReadRangeDays: 30 });
    const tasksRun = async (task: string) => {
      const m = new RegExp(`tropodelay_compute_duration_seconds_count\\{task="${task}"\\} (\\d+)`).exec(
        (await api().get('/metrics').expect(200)).text,
      );
      return m ? Number(m[1]) : 0;
    };
    const post = (station: string, path: string, body: string) =>
      api()
        .post(`/v1/stations/${station}/${path}?${path === 'met' ? 'source=query-src' : ''}`)
        .set('authorization', auth)
        .set('content-type', 'application/json')
        .send(body);
    const read = async (station: string, path: string) =>
      (
        await api()
          .get(`/v1/stations/${station}/${path}`)
          .query({ from: iso(T0), to: iso(T0 + 2 * 86_400_000) })
          .expect(200)
      ).text;

    CASES.forEach((c, k) => {
      it(`${c.name}: the same status, answer and stored rows`, async () => {
        const [a, b] = [`LOOP-${k}`, `POOL-${k}`];
        for (const id of [a, b]) await api().put(`/v1/stations/${id}`).set('authorization', auth).send(STATION).expect(201);
        const task = c.path === 'met' ? 'met-json-upload-read' : 'delay-deposit-read';
        const { loop, pool } = bothSides(c.body);
        const before = await tasksRun(task);
        const onLoop = await post(a, c.path, loop);
        expect(await tasksRun(task)).toBe(before); // fastify's parser, on the loop
        const inPool = await post(b, c.path, pool);
        expect(await tasksRun(task)).toBe(before + 1); // the worker
        expect(inPool.status).toBe(onLoop.status);
        expect(inPool.headers['content-type']).toBe(onLoop.headers['content-type']);
        // Problems name the request path (`instance`), which differs by the station id only.
        expect(inPool.text.replaceAll(b, a)).toBe(onLoop.text);
        expect((await read(b, c.path)).replaceAll(b, a)).toBe(await read(a, c.path));
        if (c.name === 'met records with bad ones') {
          expect(onLoop.body).toMatchObject({ inserted: 298, rejected_count: 2, source: 'mast-h' });
          expect(onLoop.body.rejected.map((r: { index: number }) => r.index)).toEqual([17, 40]);
        }
        if (c.name === 'met records, source from the query')
          expect(onLoop.body).toMatchObject({ inserted: 48, rejected_count: 2, source: 'query-src' });
        if (c.name === 'delays with a bad one') expect(onLoop.body).toMatchObject({ inserted: 299, rejected_count: 1 });
        if (c.name.includes('__proto__') || c.name.includes('constructor')) expect(onLoop.status).toBe(400);
      });
    });
  });
}
