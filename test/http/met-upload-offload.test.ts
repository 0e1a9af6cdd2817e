/**
 * Text met uploads (CSV, RINEX met) above OFFLOAD_BODY_BYTES are read in the worker pool
 * (src/http/tasks/met-upload.ts); the storage write stays on the event loop. What is stored is the
 * same as when the same rows come in small uploads read on the loop. Which path ran is read from the
 * metrics (tropodelay_compute_size_count{task="met-upload-read"}). Rows come from a seeded generator
 * (Mulberry32); RINEX files from src/formats/rinex-met-writer.ts (checked column for column in
 * test/formats/rinex-met.test.ts). Station names are invented.
 */

import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { writeRinexMet } from '../../src/formats/rinex-met-writer.js';
import { OFFLOAD_BODY_BYTES } from '../../src/limits.js';
import { problemFields } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const STATION = { name: 'Quillhaven Moor (invented)', latitude_deg: 52.1, longitude_deg: 4.9, height_m: 44.2 };
const T0 = Date.UTC(2026, 4, 1);
const STEP_MS = 300_000;
const N = 6000; // 6 000 five-minute rows: under 21 days
const iso = (ms: number) => new Date(ms).toISOString();

const uniform = mulberry32(7_2026);
const rows = Array.from({ length: N }, (_, i) => ({
  epoch: iso(T0 + i * STEP_MS),
  pressure_hpa: (990 + 30 * uniform()).toFixed(2),
  temperature_c: (-5 + 25 * uniform()).toFixed(2),
  relative_humidity_pct: (20 + 79 * uniform()).toFixed(1),
}));
rows[1234]!.pressure_hpa = '5000'; // out of range: rejected wherever it is read
const HEADER = 'epoch,pressure_hpa,temperature_c,relative_humidity_pct';
const csvOf = (part: typeof rows) =>
  [HEADER, ...part.map((r) => `${r.epoch},${r.pressure_hpa},${r.temperature_c},${r.relative_humidity_pct}`)].join('\n');

for (const backend of BACKENDS) {
  describe(`large text met uploads are read in the worker pool (${backend.name})`, () => {
    const { api, auth } = useArchiveApp(backend, { maxReadRangeDays: 30 });
    const put = (id: string) => api().put(`/v1/stations/${id}`).set('authorization', auth).send(STATION).expect(201);
    const tasksRun = async () => {
      const m = /tropodelay_compute_size_count\{task="met-upload-read"\} (\d+)/.exec((await api().get('/metrics').expect(200)).text);
      return m ? Number(m[1]) : 0;
    };
    const readAll = async (id: string) =>
      (
        await api()
          .get(`/v1/stations/${id}/met`)
          .query({ from: iso(T0), to: iso(T0 + N * STEP_MS) })
          .expect(200)
      ).body.records;

    it('CSV: one large upload (worker) stores what the same rows in small uploads (event loop) store', async () => {
      await put('BIGCSV');
      await put('SMALLCSV');
      const large = csvOf(rows);
      expect(large.length).toBeGreaterThan(OFFLOAD_BODY_BYTES);
      const before = await tasksRun();
      const big = await api()
        .post('/v1/stations/BIGCSV/met')
        .set('authorization', auth)
        .set('content-type', 'text/csv')
        .send(large)
        .expect(200);
      expect(await tasksRun()).toBe(before + 1);
      expect(big.body).toMatchObject({ format: 'csv', inserted: N - 1, rejected_count: 1 });
      expect(big.body.rejected[0]).toMatchObject({ line: 1236 }); // header is line 1
      let inserted = 0;
      for (let k = 0; k < N; k += 1000) {
        const part = csvOf(rows.slice(k, k + 1000));
        expect(part.length).toBeLessThanOrEqual(OFFLOAD_BODY_BYTES);
        inserted += (
          await api().post('/v1/stations/SMALLCSV/met').set('authorization', auth).set('content-type', 'text/csv').send(part).expect(200)
        ).body.inserted;
      }
      expect(await tasksRun()).toBe(before + 1);
      expect(inserted).toBe(N - 1);
      expect(await readAll('BIGCSV')).toEqual(await readAll('SMALLCSV'));
    });

    it('RINEX met: a large file read in the worker stores every record with its values', async () => {
      await put('BIGRNX');
      const tenth = (x: string) => Math.round(Number(x) * 10) / 10 + 0; // RINEX met values are F7.1; + 0: no -0
      const records = rows.map((r, i) => ({
        epochMs: T0 + i * STEP_MS,
        values: [i === 1234 ? 1000 : tenth(r.pressure_hpa), tenth(r.temperature_c), tenth(r.relative_humidity_pct)],
      }));
      const text = writeRinexMet({
        version: '2.11',
        program: 'demo-writer',
        runBy: 'tests',
        createdAt: new Date(T0),
        markerName: 'BIGRNX',
        observationTypes: ['PR', 'TD', 'HR'],
        records,
      });
      expect(text.length).toBeGreaterThan(OFFLOAD_BODY_BYTES);
      const before = await tasksRun();
      const res = await api()
        .post('/v1/stations/BIGRNX/met')
        .set('authorization', auth)
        .set('content-type', 'text/plain')
        .send(text)
        .expect(200);
      expect(await tasksRun()).toBe(before + 1);
      expect(res.body).toMatchObject({
        format: 'rinex-met',
        inserted: N,
        rejected_count: 0,
        rinex: { version: '2.11', marker_name: 'BIGRNX' },
      });
      const stored = await readAll('BIGRNX');
      expect(stored).toHaveLength(N);
      // RINEX epochs are GPS time, stored as UTC: the values keep their order; compare the values.
      expect(stored.map((r: { pressure_hpa: number }) => r.pressure_hpa)).toEqual(records.map((r) => r.values[0]));
      expect(stored.map((r: { temperature_c: number }) => r.temperature_c)).toEqual(records.map((r) => r.values[1]));
    });

    it('a large CSV that is not a met table is a 400 through the worker, naming the body; nothing is stored', async () => {
      await put('BADCSV');
      const bad = csvOf(rows).replace(HEADER, 'when,pressure_hpa,temperature_c,relative_humidity_pct');
      const res = await api()
        .post('/v1/stations/BADCSV/met')
        .set('authorization', auth)
        .set('content-type', 'text/csv')
        .send(bad)
        .expect(400);
      expect(problemFields(res.body)).toEqual(['body']);
      expect(await readAll('BADCSV')).toEqual([]);
    });
  });
}
