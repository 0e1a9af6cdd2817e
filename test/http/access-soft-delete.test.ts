/**
 * Issue 15 item 3: soft delete with a retention period. A deleted station is hidden from every read,
 * refuses writes and keeps its id; an admin lists, restores or purges it; the purge removes what was
 * deleted longer than TROPODELAY_DELETE_RETENTION_DAYS ago, with its series. Expected behaviour: the
 * issue's text and the contract in src/storage/repository.ts (common practice for soft deletes).
 */

import { describe, expect, it } from 'vitest';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const STATION = { name: 'Softley (invented)', latitude_deg: 51, longitude_deg: 4, height_m: 20 };
const EPOCH = '2026-06-01T12:00:00.000Z';
const DAY_MS = 86_400_000;

for (const backend of BACKENDS) {
  describe(`soft delete on ${backend.name}`, () => {
    const { api, app, auth } = useArchiveApp(backend, { deleteRetentionDays: 30, schedulePurge: false });

    it('hides the station and its series, reserves its id, lists it, and restores it unchanged', async () => {
      await api().put('/v1/stations/SD1').set('authorization', auth).send(STATION).expect(201);
      await api()
        .post('/v1/stations/SD1/met')
        .set('authorization', auth)
        .send({ records: [{ epoch: EPOCH, pressure_hpa: 1005 }] })
        .expect(200);
      const before = Date.now();
      await api().delete('/v1/stations/SD1').set('authorization', auth).expect(204);

      await api().get('/v1/stations/SD1').expect(404);
      expect((await api().get('/v1/stations').expect(200)).body.stations.map((s: { station_id: string }) => s.station_id)).not.toContain(
        'SD1',
      );
      await api().get('/v1/stations/SD1/met').query({ from: EPOCH, to: EPOCH }).expect(404);
      await api()
        .post('/v1/stations/SD1/met')
        .set('authorization', auth)
        .send({ records: [{ epoch: EPOCH, pressure_hpa: 1006 }] })
        .expect(404);
      const reuse = await api().put('/v1/stations/SD1').set('authorization', auth).send(STATION).expect(409);
      expect(reuse.body.detail).toContain('/v1/stations/SD1/restore');
      await api().delete('/v1/stations/SD1').set('authorization', auth).expect(404);

      const deleted = await api().get('/v1/admin/deleted-stations').set('authorization', auth).expect(200);
      expect(deleted.body.retention_days).toBe(30);
      const mark = deleted.body.stations.find((s: { station_id: string }) => s.station_id === 'SD1');
      expect(Date.parse(mark.deleted_at)).toBeGreaterThanOrEqual(before - 1000);
      expect(Date.parse(mark.purge_after) - Date.parse(mark.deleted_at)).toBe(30 * DAY_MS);

      const restored = await api().post('/v1/stations/SD1/restore').set('authorization', auth).expect(200);
      expect(restored.body).toMatchObject({ station_id: 'SD1', name: STATION.name });
      const met = await api().get('/v1/stations/SD1/met').query({ from: EPOCH, to: EPOCH }).expect(200);
      expect(met.body.records.map((r: { pressure_hpa: number }) => r.pressure_hpa)).toEqual([1005]);
      await api().post('/v1/stations/SD1/restore').set('authorization', auth).expect(404);
    });

    it('the purge keeps what is inside the retention period and removes what is past it, with its series', async () => {
      await api().put('/v1/stations/SD2').set('authorization', auth).send(STATION).expect(201);
      await api()
        .post('/v1/stations/SD2/met')
        .set('authorization', auth)
        .send({ records: [{ epoch: EPOCH, pressure_hpa: 1001 }] })
        .expect(200);
      await api().delete('/v1/stations/SD2').set('authorization', auth).expect(204);
      const now = Date.now();
      expect((await app().purgeExpired(now + 29 * DAY_MS)).purged).toEqual([]);
      // On demand: nothing is past 30 days yet.
      const manual = await api().post('/v1/admin/purge').set('authorization', auth).expect(200);
      expect(manual.body.purged).toEqual([]);
      expect(Date.parse(manual.body.cutoff)).toBeLessThanOrEqual(Date.now() - 30 * DAY_MS + 1000);
      expect((await app().purgeExpired(now + 31 * DAY_MS)).purged).toEqual(['SD2']);
      await api().post('/v1/stations/SD2/restore').set('authorization', auth).expect(404);
      // The id is free and the old series is gone.
      await api().put('/v1/stations/SD2').set('authorization', auth).send(STATION).expect(201);
      expect((await api().get('/v1/stations/SD2/met').query({ from: EPOCH, to: EPOCH }).expect(200)).body.records).toEqual([]);
    });

    it('DELETE ?purge=true removes a station at once; a bad purge value is a 400 naming it', async () => {
      await api().put('/v1/stations/SD3').set('authorization', auth).send(STATION).expect(201);
      const bad = await api().delete('/v1/stations/SD3?purge=yes').set('authorization', auth).expect(400);
      expect(bad.body.errors[0].field).toBe('query.purge');
      await api().delete('/v1/stations/SD3?purge=true').set('authorization', auth).expect(204);
      expect(
        (await api().get('/v1/admin/deleted-stations').set('authorization', auth).expect(200)).body.stations.map(
          (s: { station_id: string }) => s.station_id,
        ),
      ).not.toContain('SD3');
      await api().put('/v1/stations/SD3').set('authorization', auth).send(STATION).expect(201);
    });
  });
}
