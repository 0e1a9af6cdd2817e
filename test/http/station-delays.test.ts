/**
 * Deposited delay series, fingerprints and homogeneity through HTTP on every backend.
 * The fingerprint is recomputed here independently from its definition (src/domain/provenance.ts
 * doc comment: first 16 hex digits of SHA-256 over "tropodelay-models/1" + canonical JSON of the
 * sorted entries), not by calling the code under test.
 */

import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { geoContains } from 'd3-geo';
import { feature } from 'topojson-client';
import type { GeometryCollection, Topology } from 'topojson-specification';
import { describe, expect, it } from 'vitest';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

/** An invented station well inland (checked below against the land outline the demo uses). */
const STATION = { name: 'Thornlea Vale (invented)', latitude_deg: 47.9, longitude_deg: 10.3, height_m: 610 };
const STATION_ID = 'THRNV';

describe('the test station', () => {
  it('is on land, 0.1° from any coast (world-atlas land-50m, d3-geo geoContains, as test/scripts/demo-network.test.ts)', () => {
    const require = createRequire(import.meta.url);
    const topology = JSON.parse(readFileSync(require.resolve('world-atlas/land-50m.json'), 'utf8')) as Topology;
    const land = feature(topology, topology.objects.land as GeometryCollection);
    for (const dLat of [-0.1, 0, 0.1])
      for (const dLon of [-0.1, 0, 0.1])
        expect(geoContains(land, [STATION.longitude_deg + dLon, STATION.latitude_deg + dLat]), `${dLat}, ${dLon}`).toBe(true);
  });
});
const T0 = Date.UTC(2026, 5, 1);
const H = 3_600_000;
const iso = (ms: number) => new Date(ms).toISOString();

function expectedFingerprint(models: Record<string, string | number | boolean | null>): string {
  const sorted = Object.fromEntries(Object.entries(models).sort(([a], [b]) => (a < b ? -1 : 1)));
  return createHash('sha256')
    .update('tropodelay-models/1' + JSON.stringify(sorted))
    .digest('hex')
    .slice(0, 16);
}

for (const backend of BACKENDS) {
  describe(`delay series on ${backend.name}`, () => {
    const { api, auth } = useArchiveApp(backend);

    it('a deposit stores ZTD records with the fingerprint of its models plus its source', async () => {
      await api().put(`/v1/stations/${STATION_ID}`).set('authorization', auth).send(STATION).expect(201);
      const models = { mapping: 'niell', cutoff_deg: 7, random_walk_m_per_sqrt_h: 0.01 };
      const res = await api()
        .post(`/v1/stations/${STATION_ID}/delays`)
        .set('authorization', auth)
        .send({
          source: 'batch-run-7',
          models,
          records: [
            { epoch: iso(T0), ztd_m: 2.4012, ztd_sigma_m: 0.0041, north_gradient_m: 0.0004, east_gradient_m: -0.0002 },
            { epoch: iso(T0 + H), ztd_m: 2.4056 },
            { epoch: iso(T0 + 2 * H), ztd_m: 0.4 }, // out of range
          ],
        })
        .expect(200);
      const fp = expectedFingerprint({ ...models, deposited_by: 'batch-run-7' });
      expect(res.body).toMatchObject({
        inserted: 2,
        rejected_count: 1,
        model_fingerprint: fp,
        models: { ...models, deposited_by: 'batch-run-7' },
      });
      expect(res.body.rejected[0].reason).toMatch(/records\.2\.ztd_m: must be a number in \[1, 3\] m/);

      const read = await api()
        .get(`/v1/stations/${STATION_ID}/delays`)
        .query({ from: iso(T0), to: iso(T0 + 2 * H) })
        .expect(200);
      expect(read.body.records).toEqual([
        {
          epoch: iso(T0),
          ztd_m: 2.4012,
          ztd_sigma_m: 0.0041,
          zwd_m: null,
          zwd_sigma_m: null,
          north_gradient_m: 0.0004,
          east_gradient_m: -0.0002,
          north_gradient_sigma_m: null,
          east_gradient_sigma_m: null,
          source: 'batch-run-7',
          model_fingerprint: fp,
        },
        expect.objectContaining({ epoch: iso(T0 + H), ztd_m: 2.4056, ztd_sigma_m: null, model_fingerprint: fp }),
      ]);
      expect(read.body.homogeneous).toBe(true);
      expect(read.body.model_sets).toEqual([
        {
          model_fingerprint: fp,
          models: { ...models, deposited_by: 'batch-run-7' },
          sources: ['batch-run-7'],
          first_epoch: iso(T0),
          last_epoch: iso(T0 + H),
          count: 2,
        },
      ]);
      expect(read.body.warnings).toEqual([]);
    });

    it('a range that mixes model sets is flagged: homogeneous false, a warning with each fingerprint and its epochs', async () => {
      await api().put('/v1/stations/MIXED').set('authorization', auth).send(STATION).expect(201);
      const deposit = (source: string, models: Record<string, string>, hours: number[]) =>
        api()
          .post('/v1/stations/MIXED/delays')
          .set('authorization', auth)
          .send({ source, models, records: hours.map((h) => ({ epoch: iso(T0 + h * H), ztd_m: 2.3, ztd_sigma_m: 0.004 })) })
          .expect(200);
      await deposit('run-a', { mapping: 'niell' }, [0, 1, 2]);
      await deposit('run-a', { mapping: 'vmf1' }, [3, 4]); // same source, other models
      const fa = expectedFingerprint({ mapping: 'niell', deposited_by: 'run-a' });
      const fb = expectedFingerprint({ mapping: 'vmf1', deposited_by: 'run-a' });
      const read = await api()
        .get('/v1/stations/MIXED/delays')
        .query({ from: iso(T0), to: iso(T0 + 4 * H) })
        .expect(200);
      expect(read.body.homogeneous).toBe(false);
      expect(
        read.body.model_sets.map((m: { model_fingerprint: string; first_epoch: string; last_epoch: string; count: number }) => [
          m.model_fingerprint,
          m.first_epoch,
          m.last_epoch,
          m.count,
        ]),
      ).toEqual([
        [fa, iso(T0), iso(T0 + 2 * H), 3],
        [fb, iso(T0 + 3 * H), iso(T0 + 4 * H), 2],
      ]);
      expect(read.body.warnings[0]).toContain(`${fa} (run-a) ${iso(T0)}..${iso(T0 + 2 * H)}`);
      expect(read.body.warnings[0]).toContain(`${fb} (run-a) ${iso(T0 + 3 * H)}..${iso(T0 + 4 * H)}`);
      // Within one model set the range is homogeneous again.
      const part = await api()
        .get('/v1/stations/MIXED/delays')
        .query({ from: iso(T0), to: iso(T0 + 2 * H) })
        .expect(200);
      expect(part.body.homogeneous).toBe(true);
      // CSV: one header row with the field names; homogeneity in the response headers.
      const csv = await api()
        .get('/v1/stations/MIXED/delays')
        .query({ from: iso(T0), to: iso(T0 + 4 * H), format: 'csv' })
        .expect(200);
      expect(csv.text.split('\n')[0]).toBe(
        'epoch,ztd_m,ztd_sigma_m,zwd_m,zwd_sigma_m,north_gradient_m,east_gradient_m,north_gradient_sigma_m,east_gradient_sigma_m,source,model_fingerprint',
      );
      expect(csv.text.split('\n')[1]).toBe(`${iso(T0)},2.3,0.004,,,,,,,run-a,${fa}`);
      expect(csv.headers['x-homogeneous']).toBe('false');
      expect(csv.headers['x-model-fingerprints']).toBe(`${fa},${fb}`);
    });

    it('source is required and validated; the key is (epoch, source) so a re-deposit replaces', async () => {
      await api().put('/v1/stations/REDO').set('authorization', auth).send(STATION).expect(201);
      const noSource = await api()
        .post('/v1/stations/REDO/delays')
        .set('authorization', auth)
        .send({ records: [{ epoch: iso(T0), ztd_m: 2.3 }] })
        .expect(400);
      expect(noSource.body.errors.map((e: { field: string }) => e.field)).toEqual(['source']);
      await api()
        .post('/v1/stations/REDO/delays')
        .set('authorization', auth)
        .send({ source: 'bad source!', records: [{ epoch: iso(T0), ztd_m: 2.3 }] })
        .expect(400);
      const first = await api()
        .post('/v1/stations/REDO/delays')
        .set('authorization', auth)
        .send({ source: 's', records: [{ epoch: iso(T0), ztd_m: 2.3 }] })
        .expect(200);
      expect(first.body).toMatchObject({ inserted: 1, updated: 0 });
      const second = await api()
        .post('/v1/stations/REDO/delays')
        .set('authorization', auth)
        .send({ source: 's', records: [{ epoch: iso(T0), ztd_m: 2.31 }] })
        .expect(200);
      expect(second.body).toMatchObject({ inserted: 0, updated: 1 });
    });
  });
}
