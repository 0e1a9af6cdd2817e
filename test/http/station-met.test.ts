/**
 * Met ingest and reads through HTTP on every backend. Files follow the published RINEX met layout
 * (written by src/formats/rinex-met-writer.ts, itself checked column for column against hand-written
 * lines in test/formats/rinex-met.test.ts); CSV per RFC 4180. Station names are invented.
 */

import { describe, expect, it } from 'vitest';
import { writeRinexMet } from '../../src/formats/rinex-met-writer.js';
import { problemFields } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const STATION = { name: 'Brackenwold Ridge (invented)', latitude_deg: 47.52, longitude_deg: 11.08, height_m: 1312.7 };
const T0 = Date.UTC(2026, 2, 14);
const H = 3_600_000;
const iso = (ms: number) => new Date(ms).toISOString();

for (const backend of BACKENDS) {
  describe(`met series on ${backend.name}`, () => {
    const { api, auth } = useArchiveApp(backend, { maxReadRangeDays: 30 });
    const put = (id: string) => api().put(`/v1/stations/${id}`).set('authorization', auth).send(STATION).expect(201);

    it('JSON: good records stored, bad ones listed by index with the reason; a re-send is unchanged', async () => {
      await put('JSON1');
      const body = {
        records: [
          { epoch: iso(T0), pressure_hpa: 870.1, temperature_c: 2.5, relative_humidity_pct: 81 },
          { epoch: iso(T0 + H), pressure_hpa: 870.4, temperature_c: 2.1, dewpoint_c: -1.2 },
          { epoch: iso(T0 + 2 * H), pressure_hpa: 1200, temperature_c: 2 }, // out of range
          { epoch: 'yesterday', pressure_hpa: 870 }, // not ISO 8601
          { epoch: iso(T0 + 3 * H), relative_humidity_pct: 50 }, // neither pressure nor temperature
          { epoch: iso(T0 + 4 * H), pressure_hpa: 870, relative_humidity_pct: 50, dewpoint_c: 1 }, // two humidities
          { epoch: iso(T0 + 5 * H), pressure: 870 }, // unknown field
          { epoch: iso(T0), pressure_hpa: 871, temperature_c: 2.5 }, // same epoch twice
          { epoch: '2026-03-14T07:00:00+01:00', temperature_c: 3 }, // offset converted to UTC: 06:00Z
        ],
        source: 'mast-sensor',
      };
      const res = await api().post('/v1/stations/JSON1/met').set('authorization', auth).send(body).expect(200);
      expect(res.body).toMatchObject({
        station_id: 'JSON1',
        source: 'mast-sensor',
        format: 'json',
        inserted: 3,
        updated: 0,
        unchanged: 0,
        rejected_count: 6,
      });
      expect(res.body.rejected.map((r: { index: number }) => r.index)).toEqual([2, 3, 4, 5, 6, 7]);
      expect(res.body.rejected[0].reason).toMatch(/records\.2\.pressure_hpa: must be a number in \[300, 1100\] hPa/);
      expect(res.body.rejected[1].reason).toMatch(/records\.3\.epoch: must be an ISO 8601/);
      expect(res.body.rejected[2].reason).toMatch(/needs pressure_hpa .* or temperature_c/);
      expect(res.body.rejected[3].reason).toMatch(/at most one of/);
      expect(res.body.rejected[4].reason).toMatch(/records\.\d+\.pressure: unknown key; did you mean pressure_hpa\?/);
      expect(res.body.rejected[5].reason).toMatch(/appears twice in this upload \(first at index 0\)/);

      const again = await api().post('/v1/stations/JSON1/met').set('authorization', auth).send(body).expect(200);
      expect(again.body).toMatchObject({ inserted: 0, updated: 0, unchanged: 3 });

      const read = await api()
        .get('/v1/stations/JSON1/met')
        .query({ from: iso(T0), to: iso(T0 + 6 * H) })
        .expect(200);
      expect(read.body.records).toEqual([
        {
          epoch: iso(T0),
          source: 'mast-sensor',
          pressure_hpa: 870.1,
          temperature_c: 2.5,
          relative_humidity_pct: 81,
          dewpoint_c: null,
          vapour_pressure_hpa: null,
        },
        {
          epoch: iso(T0 + H),
          source: 'mast-sensor',
          pressure_hpa: 870.4,
          temperature_c: 2.1,
          relative_humidity_pct: null,
          dewpoint_c: -1.2,
          vapour_pressure_hpa: null,
        },
        {
          epoch: iso(T0 + 6 * H),
          source: 'mast-sensor',
          pressure_hpa: null,
          temperature_c: 3,
          relative_humidity_pct: null,
          dewpoint_c: null,
          vapour_pressure_hpa: null,
        },
      ]);
    });

    it('JSON with no good record, or a broken envelope, is a 400 and stores nothing', async () => {
      await put('JSON2');
      const bad = await api()
        .post('/v1/stations/JSON2/met')
        .set('authorization', auth)
        .send({ records: [{ epoch: iso(T0), pressure_hpa: 5 }] })
        .expect(400);
      expect(problemFields(bad.body)).toEqual(['records.0']);
      await api().post('/v1/stations/JSON2/met').set('authorization', auth).send({ records: [] }).expect(400);
      await api().post('/v1/stations/JSON2/met').set('authorization', auth).send({ rows: [] }).expect(400);
      await api()
        .post('/v1/stations/JSON2/met')
        .set('authorization', auth)
        .set('content-type', 'application/json')
        .send('{"records": [')
        .expect(400);
      const read = await api().get('/v1/stations/JSON2/met').expect(200);
      expect(read.body.records).toEqual([]);
      await api()
        .post('/v1/stations/NOSUCH/met')
        .set('authorization', auth)
        .send({ records: [{ epoch: iso(T0), pressure_hpa: 900 }] })
        .expect(404);
    });

    it('CSV: header of field names; bad rows listed by line; format=csv reads back the same columns', async () => {
      await put('CSV1');
      const csv = [
        'epoch,pressure_hpa,temperature_c,relative_humidity_pct',
        `${iso(T0)},870.0,1.5,80`,
        `${iso(T0 + H)},870.5,,`,
        `${iso(T0 + 2 * H)},abc,1.0,70`,
        `${iso(T0 + 3 * H)},870.9,1.2,101`,
      ].join('\n');
      const res = await api()
        .post('/v1/stations/CSV1/met?source=csv-feed')
        .set('authorization', auth)
        .set('content-type', 'text/csv')
        .send(csv)
        .expect(200);
      expect(res.body).toMatchObject({ format: 'csv', source: 'csv-feed', inserted: 2, rejected_count: 2 });
      expect(res.body.rejected).toEqual([
        { line: 4, reason: 'pressure_hpa: must be a number in [300, 1100] hPa' },
        { line: 5, reason: 'relative_humidity_pct: must be a number in [0, 100] %' },
      ]);
      const out = await api()
        .get('/v1/stations/CSV1/met')
        .query({ from: iso(T0), to: iso(T0 + 3 * H), format: 'csv' })
        .expect(200);
      expect(out.headers['content-type']).toMatch(/^text\/csv/);
      expect(out.text.split('\n')).toEqual([
        'epoch,source,pressure_hpa,temperature_c,relative_humidity_pct,dewpoint_c,vapour_pressure_hpa',
        `${iso(T0)},csv-feed,870,1.5,80,,`,
        `${iso(T0 + H)},csv-feed,870.5,,,,`,
        '',
      ]);
      const unknown = await api()
        .post('/v1/stations/CSV1/met')
        .set('authorization', auth)
        .set('content-type', 'text/csv')
        .send('epoch,pressure\nx,1\n')
        .expect(400);
      expect(unknown.body.detail).toMatch(/unknown column "pressure"/);
    });

    it('RINEX 2.11 and 3.04 met files as text/plain: PR, TD, HR stored, GPS time converted to UTC, other types counted', async () => {
      await put('RNX1');
      const common = { program: 'demo-writer', runBy: 'tests', createdAt: new Date(T0), markerName: 'RNX1' };
      const v2 = writeRinexMet({
        ...common,
        version: '2.11',
        observationTypes: ['PR', 'TD', 'HR', 'WS'],
        records: [0, 1, 2].map((k) => ({ epochMs: T0 + k * H, values: [871 + k, 1 + k, 60 + k, 3] })),
      });
      const res2 = await api()
        .post('/v1/stations/RNX1/met?source=rinex-v2')
        .set('authorization', auth)
        .set('content-type', 'text/plain')
        .send(v2)
        .expect(200);
      expect(res2.body).toMatchObject({
        format: 'rinex-met',
        inserted: 3,
        rejected_count: 0,
        rinex: { version: '2.11', marker_name: 'RNX1', ignored_values: { WS: 3 } },
      });
      expect(res2.body.warnings.join(' ')).toMatch(/GPS time/);
      const v3 = writeRinexMet({
        ...common,
        version: '3.04',
        observationTypes: ['PR', 'TD', 'HR', 'ZW', 'ZD', 'ZT', 'WD', 'WS', 'RI', 'HI'],
        records: [{ epochMs: T0 + 10 * H, values: [880, 4, 55, 100, 2000, 2100, 90, 2, 0, 0] }],
      });
      const res3 = await api()
        .post('/v1/stations/RNX1/met?source=rinex-v3')
        .set('authorization', auth)
        .set('content-type', 'text/plain')
        .send(v3)
        .expect(200);
      expect(res3.body).toMatchObject({
        inserted: 1,
        rinex: { version: '3.04', ignored_values: { ZW: 1, ZD: 1, ZT: 1, WD: 1, WS: 1, RI: 1, HI: 1 } },
      });
      const read = await api()
        .get('/v1/stations/RNX1/met')
        .query({ from: iso(T0), to: iso(T0 + 10 * H) })
        .expect(200);
      expect(
        read.body.records.map((r: { epoch: string; pressure_hpa: number; source: string }) => [r.epoch, r.pressure_hpa, r.source]),
      ).toEqual([
        [iso(T0), 871, 'rinex-v2'],
        [iso(T0 + H), 872, 'rinex-v2'],
        [iso(T0 + 2 * H), 873, 'rinex-v2'],
        [iso(T0 + 10 * H), 880, 'rinex-v3'],
      ]);
    });

    it('a text/plain body that is not a RINEX met file, or a broken header, is a 400 and stores nothing', async () => {
      await put('RNX2');
      const notRinex = await api()
        .post('/v1/stations/RNX2/met')
        .set('authorization', auth)
        .set('content-type', 'text/plain')
        .send('hello\n')
        .expect(400);
      expect(notRinex.body.detail).toMatch(/must be a RINEX meteorological file/);
      const broken = writeRinexMet({
        version: '2.11',
        program: 'x',
        runBy: 'y',
        createdAt: new Date(T0),
        markerName: 'RNX2',
        observationTypes: ['PR'],
        records: [{ epochMs: T0, values: [900] }],
      }).replace('END OF HEADER', 'END OF HEADEX');
      const res = await api()
        .post('/v1/stations/RNX2/met')
        .set('authorization', auth)
        .set('content-type', 'text/plain')
        .send(broken)
        .expect(400);
      expect(res.body.detail).toMatch(/no "END OF HEADER"/);
      expect((await api().get('/v1/stations/RNX2/met').expect(200)).body.records).toEqual([]);
    });

    it('read ranges: from ≤ to, at most the maximum range, ISO 8601; the range read is stated', async () => {
      await put('RANGE');
      const swapped = await api()
        .get('/v1/stations/RANGE/met')
        .query({ from: iso(T0 + H), to: iso(T0) })
        .expect(400);
      expect(problemFields(swapped.body)).toEqual(['query.from']);
      const tooLong = await api()
        .get('/v1/stations/RANGE/met')
        .query({ from: iso(T0), to: iso(T0 + 31 * 24 * H) })
        .expect(400);
      expect(problemFields(tooLong.body)).toEqual(['query.to']);
      expect(tooLong.body.detail).toMatch(/at most 30 days/);
      const notIso = await api().get('/v1/stations/RANGE/met').query({ from: 'last week' }).expect(400);
      expect(problemFields(notIso.body)).toEqual(['query.from']);
      const fmt = await api().get('/v1/stations/RANGE/met').query({ format: 'xml' }).expect(400);
      expect(problemFields(fmt.body)).toEqual(['query.format']);
      const onlyFrom = await api()
        .get('/v1/stations/RANGE/met')
        .query({ from: iso(T0) })
        .expect(200);
      expect(onlyFrom.body).toMatchObject({ from: iso(T0), to: iso(T0 + 30 * 24 * H) });
    });

    it('purging a station deletes its met series (DELETE ?purge=true), so a new station of that id starts empty', async () => {
      await put('DEL1');
      await api()
        .post('/v1/stations/DEL1/met')
        .set('authorization', auth)
        .send({ records: [{ epoch: iso(T0), pressure_hpa: 900 }] })
        .expect(200);
      await api().delete('/v1/stations/DEL1?purge=true').set('authorization', auth).expect(204);
      await put('DEL1');
      expect(
        (
          await api()
            .get('/v1/stations/DEL1/met')
            .query({ from: iso(T0), to: iso(T0) })
            .expect(200)
        ).body.records,
      ).toEqual([]);
    });
  });
}
