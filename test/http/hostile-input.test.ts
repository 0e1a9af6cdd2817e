/**
 * Hostile input of issue 11 item 3: long digit strings where a number is expected. The old number
 * pattern /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/ backtracks quadratically on a long digit string
 * that does not match (one 200 kB cell: 20–98 s of a worker, 17.9 s of event loop in a met upload;
 * a 15 000-digit query value 0.6 s). Every cell and query value is now length-capped before any
 * pattern runs, and numbers are read by a linear scanner. The answers are checked (a 400 naming the
 * field); the file's timeout is one the old pattern would exceed on these inputs, not a speed target.
 */

import { describe, expect, it } from 'vitest';
import { problemFields, useApp } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const GENEROUS_MS = 15_000;
const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const DIGITS_200K = '1'.repeat(200_000) + 'x';

describe('long digit strings in an estimation', () => {
  const api = useApp();

  it(
    'a 200 kB cell in a CSV estimation is a 400 naming the cell',
    async () => {
      const csv = `epoch,satellite,elevation_deg,azimuth_deg,residual_m\n2026-03-14T00:00:00Z,S01,30,40,${DIGITS_200K}\n`;
      const res = await api().post('/v1/zwd-estimates').query(SITE).set('content-type', 'text/csv').send(csv).expect(400);
      expect(problemFields(res.body)).toEqual(['observations.0.residual_m']);
      expect(res.body.detail).toMatch(/200001 characters; at most 256/);
    },
    GENEROUS_MS,
  );

  it(
    'a 15 000-digit query value is a 400 naming the parameter (before any schema looks at it)',
    async () => {
      const res = await api()
        .post('/v1/zwd-estimates')
        .query({ ...SITE, zwd_interval_s: '9'.repeat(15_000) + 'x' })
        .set('content-type', 'text/csv')
        .send('epoch,satellite,elevation_deg,azimuth_deg,residual_m\n2026-03-14T00:00:00Z,S01,30,40,0.1\n')
        .expect(400);
      expect(problemFields(res.body)).toEqual(['query.zwd_interval_s']);
      expect(res.body.detail).toMatch(/15001 characters; at most 256/);
    },
    GENEROUS_MS,
  );

  it(
    'the same on a route without a ZWD schema: a long value of any query parameter',
    async () => {
      const res = await api()
        .get('/v1/health')
        .query({ anything: '1'.repeat(15_000) })
        .expect(400);
      expect(problemFields(res.body)).toEqual(['query.anything']);
    },
    GENEROUS_MS,
  );
});

for (const backend of BACKENDS) {
  describe(`long digit strings in a met CSV upload (${backend.name})`, () => {
    const { api, auth } = useArchiveApp(backend);
    it(
      'a 200 kB cell rejects its row with a reason; with nothing else to store the upload is a 400 naming the line',
      async () => {
        await api()
          .put('/v1/stations/LONG')
          .set('authorization', auth)
          .send({ name: 'Long cells (invented)', ...SITE })
          .expect(201);
        const only = await api()
          .post('/v1/stations/LONG/met')
          .set('authorization', auth)
          .set('content-type', 'text/csv')
          .send(`epoch,pressure_hpa,temperature_c\n2026-03-14T00:00:00Z,${DIGITS_200K},12\n`)
          .expect(400);
        expect(problemFields(only.body)).toEqual(['line 2']);
        expect(only.body.detail).toMatch(/pressure_hpa: a cell of 200001 characters; at most 256/);
        const mixed = await api()
          .post('/v1/stations/LONG/met')
          .set('authorization', auth)
          .set('content-type', 'text/csv')
          .send(`epoch,pressure_hpa,temperature_c\n2026-03-14T00:00:00Z,${DIGITS_200K},12\n2026-03-14T00:05:00Z,1001.5,12\n`)
          .expect(200);
        expect(mixed.body.rejected).toEqual([{ line: 2, reason: 'pressure_hpa: a cell of 200001 characters; at most 256' }]);
      },
      GENEROUS_MS,
    );
  });
}
