/**
 * Issue 15, "Done when" (first bullet, part 2): an admin reads the audit trail of a scripted sequence
 * of calls (PUT station, met upload, delay upload, stored estimation, delete) with the right key names
 * and client addresses, on every backend; once with the TCP peer as the client (TRUST_PROXY off) and
 * once behind one trusted hop (TRUST_PROXY=1) with X-Forwarded-For. Expected addresses: RFC 7239 /
 * the de-facto X-Forwarded-For convention, where the rightmost entry is the one the nearest proxy
 * added (common practice); the counts are those of the uploads written here.
 */

import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { useArchiveApp, TEST_KEY, TEST_KEY_NAME } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const WRITER = 'writer-secret-0123456789abcdef';
const READER = 'reader-secret-0123456789abcdef';
const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const H = 3_600_000;
const data = generateSyntheticResiduals({ durationS: 3600, latitudeDeg: SITE.latitude_deg, seed: 9 });
const { observations } = toRequestBody(data);
const T0 = Date.parse(observations[0]!.epoch);
const MET = [0, 1, 2].map((k) => ({ epoch: new Date(T0 - H / 2 + k * H).toISOString(), pressure_hpa: 955 + k, temperature_c: 12 - k }));

const KEYS = [
  { name: TEST_KEY_NAME, role: 'admin' as const, secret: TEST_KEY },
  { name: 'field-writer', role: 'write' as const, secret: WRITER },
  { name: 'field-reader', role: 'read' as const, secret: READER },
];

interface Scenario {
  label: string;
  trustProxy: false | number;
  /** X-Forwarded-For sent with every call (absent: none). */
  forwardedFor?: string;
  /** The client address the audit trail must show. */
  expected: RegExp;
}

const SCENARIOS: Scenario[] = [
  // supertest connects over loopback: the TCP peer is 127.0.0.1 (or its IPv4-mapped IPv6 form).
  {
    label: 'no trusted proxy: the TCP peer, X-Forwarded-For ignored',
    trustProxy: false,
    forwardedFor: '198.51.100.99',
    expected: /^(::ffff:)?127\.0\.0\.1$/,
  },
  // One trusted hop (the load balancer at 127.0.0.1) appended the client it saw: 203.0.113.7; the entry
  // left of it (198.51.100.99) was written by the client itself and is not trusted.
  { label: 'TRUST_PROXY=1 with X-Forwarded-For', trustProxy: 1, forwardedFor: '198.51.100.99, 203.0.113.7', expected: /^203\.0\.113\.7$/ },
];

for (const backend of BACKENDS) {
  for (const scenario of SCENARIOS) {
    describe(`audit trail on ${backend.name}, ${scenario.label}`, () => {
      const { api } = useArchiveApp(backend, { apiKeys: KEYS, schedulePurge: false }, { config: { TRUST_PROXY: scenario.trustProxy } });
      const as = (secret: string) => ({
        authorization: `Bearer ${secret}`,
        ...(scenario.forwardedFor ? { 'x-forwarded-for': scenario.forwardedFor } : {}),
      });

      it('lists PUT, met upload, delay upload, stored estimation, a refused write and the delete with key names, addresses and counts', async () => {
        const startMs = Date.now();
        await api()
          .put('/v1/stations/AUD1')
          .set(as(WRITER))
          .send({ name: 'Auditmere (invented)', ...SITE })
          .expect(201);
        // 3 good met records and 1 bad one (pressure out of range): 3 inserted, 4 received.
        await api()
          .post('/v1/stations/AUD1/met')
          .set(as(WRITER))
          .send({ records: [...MET, { epoch: MET[0]!.epoch, pressure_hpa: 5 }], source: 'mast' })
          .expect(200);
        await api()
          .post('/v1/stations/AUD1/delays')
          .set(as(WRITER))
          .send({ source: 'outside-run', records: [{ epoch: MET[0]!.epoch, ztd_m: 2.31, ztd_sigma_m: 0.004 }] })
          .expect(200);
        const estimation = await api()
          .post('/v1/stations/AUD1/zwd-estimates?source=run-1')
          .set(as(WRITER))
          .send({ observations, apriori: { zhd_m: 2.17, zwd_m: 0.05 }, options: { zwd_interval_s: 900 } })
          .expect(200);
        await api().delete('/v1/stations/AUD1').set(as(READER)).expect(403);
        await api().delete('/v1/stations/AUD1').set(as(TEST_KEY)).expect(204);
        // Reads are not audited.
        await api().get('/v1/stations').set(as(READER)).expect(200);

        const trail = await api().get('/v1/audit').query({ station: 'AUD1' }).set(as(TEST_KEY)).expect(200);
        const events = [...trail.body.events].reverse(); // oldest first
        expect(
          events.map((e: { method: string; route: string; key_name: string; status: number }) => [e.method, e.route, e.key_name, e.status]),
        ).toEqual([
          ['PUT', '/v1/stations/:station_id', 'field-writer', 201],
          ['POST', '/v1/stations/:station_id/met', 'field-writer', 200],
          ['POST', '/v1/stations/:station_id/delays', 'field-writer', 200],
          ['POST', '/v1/stations/:station_id/zwd-estimates', 'field-writer', 200],
          ['DELETE', '/v1/stations/:station_id', 'field-reader', 403],
          ['DELETE', '/v1/stations/:station_id', TEST_KEY_NAME, 204],
        ]);
        for (const e of events) {
          expect(e.client_address).toMatch(scenario.expected);
          expect(e.station_id).toBe('AUD1');
          expect(e.path).toBe(e.route.replace(':station_id', 'AUD1'));
          expect(Date.parse(e.at)).toBeGreaterThanOrEqual(startMs - 1000);
          expect(e.request_id).toMatch(/^[0-9a-f-]{36}$/);
        }
        expect(events[1]).toMatchObject({ source: 'mast', records: 4, inserted: 3, updated: 0, unchanged: 0 });
        expect(events[2]).toMatchObject({ source: 'outside-run', records: 1, inserted: 1, updated: 0, unchanged: 0 });
        const stored = estimation.body.stored as { inserted: number };
        expect(stored.inserted).toBeGreaterThan(0);
        expect(events[3]).toMatchObject({ source: 'run-1', records: stored.inserted, inserted: stored.inserted, updated: 0, unchanged: 0 });
        expect(events[0]).toMatchObject({ records: null, inserted: null, source: null });

        // Filters: by key name, and a time window that ends before the sequence.
        const byReader = await api().get('/v1/audit').query({ key_name: 'field-reader' }).set(as(TEST_KEY)).expect(200);
        expect(byReader.body.events).toHaveLength(1);
        const before = await api()
          .get('/v1/audit')
          .query({ to: new Date(startMs - 60_000).toISOString() })
          .set(as(TEST_KEY))
          .expect(200);
        expect(before.body.events).toEqual([]);
        const limited = await api().get('/v1/audit').query({ limit: 2 }).set(as(TEST_KEY)).expect(200);
        expect(limited.body.events.map((e: { key_name: string }) => e.key_name)).toEqual([TEST_KEY_NAME, 'field-reader']);
      }, 60_000);

      it('refuses a bad audit query with a 400 naming the field', async () => {
        const res = await api().get('/v1/audit').query({ limit: 0, stationn: 'X' }).set(as(TEST_KEY)).expect(400);
        expect(res.body.errors.map((e: { field: string }) => e.field)).toEqual(expect.arrayContaining(['query.stationn']));
      });
    });
  }
}
