/**
 * Bounded work for open requests, through HTTP (issue 11): met uploads of 1.1 M records in CSV and
 * in RINEX are refused with a 413 naming MAX_MET_RECORDS (100 000) and nothing is stored; a RINEX
 * header that lies about its types is a 400 naming the line; the amplification request (two epochs
 * 55 h apart at 1-s nodes) is a 422 naming zwd_interval_s. RINEX layout: version 2.11, Tables A3/A4.
 * Station names invented.
 */

import { describe, expect, it } from 'vitest';
import { problemFields, useApp } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const STATION = { name: 'Oxley Hollow (invented)', latitude_deg: 52.1, longitude_deg: 9.3, height_m: 88.4 };
const T0 = Date.UTC(2026, 0, 1);
const RECORDS = 1_100_000;

// 25 bytes a row: 1.1 M rows (27.5 MB) stay under the 32 MiB body limit, so the record limit is what answers.
const csv = () => 'epoch,pressure_hpa\n' + `${new Date(T0).toISOString().replace('.000', '')},900\n`.repeat(RECORDS);
// PR only: 18-character epoch (1X,I2.2,5(1X,I2)) + F7.1 = 25 characters a line.
const RINEX_HEADER = [
  '     2.11           METEOROLOGICAL DATA                     RINEX VERSION / TYPE',
  'OXLEY HOLLOW                                                MARKER NAME         ',
  '     1    PR                                                # / TYPES OF OBSERV ',
  '                                                            END OF HEADER       ',
];
const rinex = () => RINEX_HEADER.join('\n') + '\n' + ' 26  1  1  0  0  0  900.0\n'.repeat(RECORDS);

for (const backend of BACKENDS) {
  describe(`met upload limits on ${backend.name}`, () => {
    const { api, auth } = useArchiveApp(backend);

    it('1.1 M CSV rows and 1.1 M RINEX records: 413 naming the limit of 100 000; nothing stored', async () => {
      await api().put('/v1/stations/LIM1').set('authorization', auth).send(STATION).expect(201);
      const a = await api().post('/v1/stations/LIM1/met').set('authorization', auth).set('content-type', 'text/csv').send(csv());
      expect(a.status).toBe(413);
      expect(a.headers['content-type']).toMatch(/application\/problem\+json/);
      expect(a.body.detail).toMatch(/more than 100000 met records \(record 100001 at line 100002\)/);
      const b = await api().post('/v1/stations/LIM1/met').set('authorization', auth).set('content-type', 'text/plain').send(rinex());
      expect(b.status).toBe(413);
      expect(b.body.detail).toMatch(/more than 100000 met records \(record 100001 at line 100005\)/);
      const read = await api().get('/v1/stations/LIM1/met').expect(200);
      expect(read.body.records).toEqual([]);
    }, 180_000);

    it('a RINEX types line listing more types than its count: 400 naming the line; nothing stored', async () => {
      await api().put('/v1/stations/LIM2').set('authorization', auth).send(STATION).expect(201);
      const lying = [
        ...RINEX_HEADER.slice(0, 2),
        '     1    PR    TD                                          # / TYPES OF OBSERV ',
        RINEX_HEADER[3],
        ' 26  1  1  0  0  0  900.0   10.0',
      ].join('\n');
      const res = await api()
        .post('/v1/stations/LIM2/met')
        .set('authorization', auth)
        .set('content-type', 'text/plain')
        .send(lying)
        .expect(400);
      expect(problemFields(res.body)).toEqual(['body line 3']);
      expect(res.body.detail).toMatch(/line 3: the line lists 1 observation type\(s\) more than the declared 1/);
      expect((await api().get('/v1/stations/LIM2/met').expect(200)).body.records).toEqual([]);
    });
  });
}

describe('answer-size cap through HTTP', () => {
  const api = useApp();
  it('two epochs 55 h apart at 1-s nodes: 422 naming zwd_interval_s and the interval that fits', async () => {
    const body = {
      site: { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 },
      observations: [
        { epoch: new Date(T0).toISOString(), satellite: 'G05', elevation_deg: 41.5, azimuth_deg: 120, residual_m: 0.012 },
        { epoch: new Date(T0 + 55 * 3_600_000).toISOString(), satellite: 'G07', elevation_deg: 38.2, azimuth_deg: 250, residual_m: -0.004 },
      ],
      options: { zwd_interval_s: 1 },
    };
    const res = await api().post('/v1/zwd-estimates').send(body);
    expect(res.status).toBe(422);
    expect(problemFields(res.body)).toEqual(['options.zwd_interval_s']);
    expect(res.body.detail).toMatch(/at most 90000; ask for less: zwd_interval_s of at least 3 s/);
  });
});
