/**
 * The met CSV the service writes (GET /v1/stations/{id}/met?format=csv) uploads back unchanged
 * (issue 13, item 3), on both backends, on the event loop and through the worker pool (a body above
 * OFFLOAD_BODY_BYTES). The check is against what was sent first, not the code under test: after
 * download → delete → upload of the downloaded text → download, the second CSV is byte for byte the
 * first, the JSON read equals the records sent (two sources, every humidity form, empty cells), and
 * a re-upload of the same text is all `unchanged`. Values and station names are invented (seeded
 * Mulberry32 generator).
 */

import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { OFFLOAD_BODY_BYTES } from '../../src/limits.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const STATION = { name: 'Wrenlow Heath (invented)', latitude_deg: 51.2, longitude_deg: 7.4, height_m: 180 };
const T0 = Date.UTC(2026, 5, 1);
const STEP_MS = 600_000;
const iso = (ms: number) => new Date(ms).toISOString();

/** Records of two invented producers; humidity as RH, dew point or vapour pressure, some cells missing. */
function records(count: number, seed: number) {
  const u = mulberry32(seed);
  const out: { source: string; records: Record<string, string | number>[] }[] = [
    { source: 'mast-a', records: [] },
    { source: 'van.b:2', records: [] },
  ];
  for (let i = 0; i < count; i++) {
    const r: Record<string, string | number> = { epoch: iso(T0 + i * STEP_MS), temperature_c: Math.round((5 + 20 * u()) * 100) / 100 };
    if (i % 5 !== 3) r.pressure_hpa = Math.round((980 + 40 * u()) * 10) / 10;
    if (i % 3 === 0) r.relative_humidity_pct = Math.round(100 * (30 + 60 * u())) / 100;
    else if (i % 3 === 1) r.dewpoint_c = Math.round((-5 + 10 * u()) * 10) / 10 || 0; // no -0: JSON writes it as 0
    const main = i % 7 === 0 ? 1 : 0;
    out[main]!.records.push(r);
    if (i % 11 === 0) out[1 - main]!.records.push({ ...r, temperature_c: Number(r.temperature_c) + 0.5 }); // same epoch, other source
  }
  return out;
}

for (const backend of BACKENDS) {
  describe(`met CSV round trip on ${backend.name}`, () => {
    const { api, auth } = useArchiveApp(backend, { maxReadRangeDays: 120 });
    const download = async (id: string, to: number) =>
      api()
        .get(`/v1/stations/${id}/met`)
        .query({ from: iso(T0), to: iso(to), format: 'csv' })
        .expect(200);

    for (const [label, count, seed] of [
      ['on the event loop', 300, 41],
      ['through the worker pool (body above OFFLOAD_BODY_BYTES)', 4000, 42],
    ] as const) {
      it(`the written CSV uploads back unchanged, ${label}`, async () => {
        const id = `RT${seed}`;
        const to = T0 + count * STEP_MS;
        await api().put(`/v1/stations/${id}`).set('authorization', auth).send(STATION).expect(201);
        const sent = records(count, seed);
        for (const s of sent) await api().post(`/v1/stations/${id}/met`).set('authorization', auth).send(s).expect(200);
        const first = (await download(id, to)).text;
        expect(first.split('\n')[0]).toBe('epoch,source,pressure_hpa,temperature_c,relative_humidity_pct,dewpoint_c,vapour_pressure_hpa');
        if (count > 1000) expect(first.length).toBeGreaterThan(OFFLOAD_BODY_BYTES);

        // Re-sending the downloaded text changes nothing.
        const again = await api().post(`/v1/stations/${id}/met`).set('authorization', auth).type('text/csv').send(first).expect(200);
        const total = sent.reduce((n, s) => n + s.records.length, 0);
        expect(again.body).toMatchObject({ format: 'csv', inserted: 0, updated: 0, unchanged: total, rejected_count: 0 });
        expect(again.body.sources.sort()).toEqual(['mast-a', 'van.b:2']);

        // Into an empty station: the same records, the same CSV byte for byte.
        const copy = `${id}C`;
        await api().put(`/v1/stations/${copy}`).set('authorization', auth).send(STATION).expect(201);
        const up = await api().post(`/v1/stations/${copy}/met`).set('authorization', auth).type('text/csv').send(first).expect(200);
        expect(up.body).toMatchObject({ inserted: total, rejected_count: 0 });
        expect((await download(copy, to)).text).toBe(first);
        const json = await api()
          .get(`/v1/stations/${copy}/met`)
          .query({ from: iso(T0), to: iso(to) })
          .expect(200);
        for (const s of sent) {
          const stored = json.body.records.filter((r: { source: string }) => r.source === s.source);
          expect(stored).toHaveLength(s.records.length);
          const byEpoch = new Map(stored.map((r: { epoch: string }) => [r.epoch, r]));
          for (const r of s.records) {
            const back = byEpoch.get(r.epoch as string) as Record<string, unknown>;
            for (const [k, v] of Object.entries(r)) expect(back[k]).toBe(v);
            expect(back.pressure_hpa).toBe(r.pressure_hpa ?? null);
          }
        }
      });
    }

    it('a CSV row without a source cell takes ?source=; a bad source cell is rejected by line', async () => {
      await api().put('/v1/stations/RTS').set('authorization', auth).send(STATION).expect(201);
      const text = [
        'epoch,source,pressure_hpa',
        `${iso(T0)},,1001.5`,
        `${iso(T0)},cell-src,1002.5`,
        `${iso(T0 + STEP_MS)},bad source!,1003`,
      ].join('\n');
      const res = await api()
        .post('/v1/stations/RTS/met?source=query-src')
        .set('authorization', auth)
        .type('text/csv')
        .send(text)
        .expect(200);
      expect(res.body).toMatchObject({ source: 'query-src', inserted: 2, rejected_count: 1 });
      expect(res.body.sources.sort()).toEqual(['cell-src', 'query-src']);
      expect(res.body.rejected[0]).toMatchObject({ line: 4 });
      expect(res.body.rejected[0].reason).toMatch(/^source: /);
    });
  });
}
