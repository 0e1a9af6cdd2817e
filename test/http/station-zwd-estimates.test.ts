/**
 * POST /v1/stations/{station_id}/zwd-estimates on every backend. References: the public
 * POST /v1/zwd-estimates route (issue 3, tested there against a dense ml-matrix solve and the
 * generator's truth) given the same observations with the station as `site` and the stored met as
 * `met` must give the same result; the stored series must read back as returned; and the PWV
 * retrieval of the stored series must equal the PWV of the estimation response (same ZTD, same met).
 * Residuals from scripts/synthetic-residuals.ts (known truth).
 */

import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toCsv, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { storedMetFor } from '../../src/http/routes/station-zwd-estimates.js';
import { handleZwdRequest, scanZwdRequest } from '../../src/http/tasks/zwd-request.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const H = 3_600_000;
const data = generateSyntheticResiduals({ durationS: 3600, latitudeDeg: SITE.latitude_deg, seed: 9 });
const { observations } = toRequestBody(data);
const T0 = Date.parse(observations[0]!.epoch);
const MET = [0, 1, 2].map((k) => ({ epoch: new Date(T0 - H / 2 + k * H).toISOString(), pressure_hpa: 955 + k, temperature_c: 12 - k }));
const APRIORI = { zhd_m: 2.17, zwd_m: 0.05 };
const OPTIONS = { zwd_interval_s: 900 };

for (const backend of BACKENDS) {
  describe(`station ZWD estimation on ${backend.name}`, () => {
    const { api, auth } = useArchiveApp(backend);

    it('uses the stored met, returns what /v1/zwd-estimates returns for the station, and stores the series', async () => {
      await api()
        .put('/v1/stations/EST1')
        .set('authorization', auth)
        .send({ name: 'Estimation test (invented)', ...SITE })
        .expect(201);
      await api().post('/v1/stations/EST1/met').set('authorization', auth).send({ records: MET, source: 'mast' }).expect(200);

      const res = await api()
        .post('/v1/stations/EST1/zwd-estimates?source=run-1')
        .set('authorization', auth)
        .send({ observations, apriori: APRIORI, options: OPTIONS })
        .expect(200);
      expect(res.body.met_used).toBe('archive');
      expect(res.body.stored).toEqual({ source: 'run-1', inserted: res.body.series.length, updated: 0, unchanged: 0 });

      const reference = await api()
        .post('/v1/zwd-estimates')
        .send({ site: SITE, observations, apriori: APRIORI, options: OPTIONS, met: MET })
        .expect(200);
      expect(res.body.zwd_nodes).toEqual(reference.body.zwd_nodes);
      expect(res.body.series).toEqual(reference.body.series);
      expect(res.body.model_fingerprint).toBe(reference.body.model_fingerprint);

      const last = res.body.series[res.body.series.length - 1];
      const stored = await api().get('/v1/stations/EST1/delays').query({ from: res.body.series[0].epoch, to: last.epoch }).expect(200);
      expect(stored.body.records).toHaveLength(res.body.series.length);
      expect(stored.body.homogeneous).toBe(true);
      stored.body.records.forEach((r: Record<string, unknown>, i: number) => {
        const e = res.body.series[i];
        expect(r).toMatchObject({
          epoch: e.epoch,
          ztd_m: e.ztd_m,
          ztd_sigma_m: e.sigma_m,
          zwd_m: e.zwd_m,
          zwd_sigma_m: e.sigma_m,
          north_gradient_m: e.north_gradient_m,
          east_gradient_m: e.east_gradient_m,
          source: 'run-1',
          model_fingerprint: res.body.model_fingerprint,
        });
      });
      expect(stored.body.model_sets[0].models).toEqual(res.body.models);

      // PWV retrieved from the stored series = PWV of the estimation (same ZTD and met), to the output precision.
      const pwv = await api()
        .get('/v1/stations/EST1/precipitable-water')
        .query({ from: res.body.series[0].epoch, to: last.epoch })
        .expect(200);
      pwv.body.records.forEach((r: { pwv_mm: number; zhd_m: number }, i: number) => {
        expect(Math.abs(r.pwv_mm - res.body.series[i].pwv_mm)).toBeLessThan(0.51e-4);
        expect(Math.abs(r.zhd_m - res.body.series[i].zhd_m)).toBeLessThan(0.51e-6);
      });

      // The same request again: the series is unchanged.
      const again = await api()
        .post('/v1/stations/EST1/zwd-estimates?source=run-1')
        .set('authorization', auth)
        .send({ observations, apriori: APRIORI, options: OPTIONS })
        .expect(200);
      expect(again.body.stored).toMatchObject({ inserted: 0, updated: 0, unchanged: res.body.series.length });
    });

    it('takes a CSV body with the options as query parameters, like /v1/zwd-estimates', async () => {
      await api()
        .put('/v1/stations/CSV1')
        .set('authorization', auth)
        .send({ name: 'Estimation CSV (invented)', ...SITE })
        .expect(201);
      await api().post('/v1/stations/CSV1/met').set('authorization', auth).send({ records: MET }).expect(200);
      const csv = await api()
        .post('/v1/stations/CSV1/zwd-estimates?source=csv-run&apriori_zhd_m=2.17&apriori_zwd_m=0.05&zwd_interval_s=900')
        .set('authorization', auth)
        .set('content-type', 'text/csv')
        .send(toCsv(data))
        .expect(200);
      const json = await api()
        .post('/v1/zwd-estimates')
        .send({ site: SITE, observations, apriori: APRIORI, options: OPTIONS, met: MET })
        .expect(200);
      expect(csv.body).toMatchObject({ met_used: 'archive', stored: { source: 'csv-run', inserted: json.body.series.length } });
      // The CSV carries the generator's residuals at 5 decimals like the JSON body, so the results agree.
      expect(csv.body.zwd_nodes).toEqual(json.body.zwd_nodes);
      expect(csv.body.model_fingerprint).toBe(json.body.model_fingerprint);
    });

    it('finds the epoch column wherever it is in a CSV body (issue 11 item 9): stored met used, no false warning', async () => {
      await api()
        .put('/v1/stations/CSV2')
        .set('authorization', auth)
        .send({ name: 'Epoch column last (invented)', ...SITE })
        .expect(201);
      await api().post('/v1/stations/CSV2/met').set('authorization', auth).send({ records: MET }).expect(200);
      const lines = toCsv(data).trim().split('\n');
      const epochLast = lines.map((line) => {
        const cells = line.split(',');
        return [...cells.slice(1), cells[0]].join(',');
      });
      const res = await api()
        .post('/v1/stations/CSV2/zwd-estimates?apriori_zhd_m=2.17&apriori_zwd_m=0.05&zwd_interval_s=900')
        .set('authorization', auth)
        .set('content-type', 'text/csv')
        .send(epochLast.join('\n') + '\n')
        .expect(200);
      expect(res.body.met_used).toBe('archive');
      expect(res.body.warnings.join(' ')).not.toMatch(/neither in the request nor stored/);
      expect(res.body.series[0].pwv_mm).toEqual(expect.any(Number));
    });

    it('bounds the stored-met read like the read routes (issue 11 item 10): observations two years apart are a 400, nothing stored', async () => {
      await api()
        .put('/v1/stations/FAR1')
        .set('authorization', auth)
        .send({ name: 'Far apart (invented)', ...SITE })
        .expect(201);
      await api().post('/v1/stations/FAR1/met').set('authorization', auth).send({ records: MET }).expect(200);
      const far = [
        { ...observations[0]!, epoch: '2024-01-01T00:00:00Z' },
        { ...observations[1]!, epoch: '2026-01-01T00:00:00Z' },
      ];
      const res = await api().post('/v1/stations/FAR1/zwd-estimates').set('authorization', auth).send({ observations: far }).expect(400);
      expect(res.body.errors).toEqual([
        {
          field: 'observations',
          message: expect.stringMatching(/span 731\.00 days.*at most 366 days of stored met: send `met` in the request or split/),
        },
      ]);
      const stored = await api()
        .get('/v1/stations/FAR1/delays')
        .query({ from: '2023-12-31T00:00:00Z', to: '2024-12-30T00:00:00Z' })
        .expect(200);
      expect(stored.body.records).toEqual([]);
    });

    it('prefers the request met; says when there is none; refuses `site`, unknown stations and missing keys', async () => {
      await api()
        .put('/v1/stations/EST2')
        .set('authorization', auth)
        .send({ name: 'Estimation test 2 (invented)', ...SITE })
        .expect(201);
      const withMet = await api()
        .post('/v1/stations/EST2/zwd-estimates')
        .set('authorization', auth)
        .send({ observations, apriori: APRIORI, met: MET, options: OPTIONS })
        .expect(200);
      expect(withMet.body).toMatchObject({ met_used: 'request', stored: { source: 'zwd-estimates' } });
      await api().post('/v1/stations/EST3/zwd-estimates').set('authorization', auth).send({ observations, options: OPTIONS }).expect(404);
      await api()
        .put('/v1/stations/EST3')
        .set('authorization', auth)
        .send({ name: 'Estimation test 3 (invented)', ...SITE })
        .expect(201);
      const noMet = await api()
        .post('/v1/stations/EST3/zwd-estimates')
        .set('authorization', auth)
        .send({ observations, apriori: APRIORI, options: OPTIONS })
        .expect(200);
      expect(noMet.body.met_used).toBe('none');
      expect(noMet.body.warnings.join(' ')).toMatch(/no ZHD or PWV per epoch/);
      expect(noMet.body.series[0].pwv_mm).toBeUndefined();
      const withSite = await api()
        .post('/v1/stations/EST3/zwd-estimates')
        .set('authorization', auth)
        .send({ site: SITE, observations })
        .expect(400);
      expect(withSite.body.detail).toMatch(/site/); // an unrecognised key of the strict body
      await api().post('/v1/stations/EST3/zwd-estimates').send({ observations }).expect(401);
    });
  });
}

describe('scanZwdRequest (first pass of a station estimation: the stored met window)', () => {
  const scan = async (body: string, format: 'json' | 'csv') => {
    const outcome = await scanZwdRequest({ body, format });
    if (!outcome.ok) throw new Error(outcome.error.detail);
    return outcome.output;
  };
  it('reads the first and last observation epoch of JSON and CSV bodies, and whether JSON carries met', async () => {
    const json = JSON.stringify({
      observations: [{ epoch: '2026-01-01T00:00:30Z' }, { epoch: '2026-01-01T00:00:00Z' }, { epoch: '2026-01-01T02:00:00+01:00' }],
    });
    expect(await scan(json, 'json')).toMatchObject({
      range: { firstMs: Date.UTC(2026, 0, 1), lastMs: Date.UTC(2026, 0, 1, 1) },
      hasMet: false,
    });
    expect((await scan(JSON.stringify({ observations: [{ epoch: '2026-01-01T00:00:00Z' }], met: [] }), 'json')).hasMet).toBe(true);
    const csv =
      'epoch,satellite,elevation_deg,azimuth_deg,residual_m\n2026-01-01T00:00:30Z,G01,30,40,0.1\n2026-01-01T00:00:00Z,G02,30,40,0.1\n';
    expect((await scan(csv, 'csv')).range).toEqual({ firstMs: Date.UTC(2026, 0, 1), lastMs: Date.UTC(2026, 0, 1, 0, 0, 30) });
    expect((await scan('{"observations": []}', 'json')).range).toBeNull();
    expect((await scan('{not json', 'json')).range).toBeNull();
  });

  it('finds the epoch column wherever it is (issue 11 item 9: only the first column worked)', async () => {
    const csv =
      'satellite,elevation_deg,azimuth_deg,residual_m,epoch\nG01,30,40,0.1,2026-01-01T00:00:30Z\nG02,30,40,0.1,2026-01-01T00:05:00Z\n';
    expect((await scan(csv, 'csv')).range).toEqual({ firstMs: Date.UTC(2026, 0, 1, 0, 0, 30), lastMs: Date.UTC(2026, 0, 1, 0, 5) });
  });
});

describe('the scan hands its parsed body to the estimation (issue 14: a station body is parsed once)', () => {
  const station = { site: { latitudeDeg: SITE.latitude_deg, longitudeDeg: SITE.longitude_deg, heightM: SITE.height_m } };
  const columns = Object.fromEntries(
    Object.keys(observations[0]!).map((k) => [k, observations.map((o) => o[k as keyof (typeof observations)[0]])]),
  );
  // The reference: the estimation task reading the body itself, as before the hand-over.
  const bodies: [string, string, 'json' | 'csv', Record<string, unknown>][] = [
    ['JSON objects with met', JSON.stringify({ observations, met: MET, apriori: APRIORI, options: OPTIONS }), 'json', {}],
    [
      'JSON columns with σ on some rows',
      JSON.stringify({ observations: { ...columns, sigma_m: observations.map((_, i) => (i % 3 ? null : 0.004)) } }),
      'json',
      {},
    ],
    ['CSV with options in the query', toCsv(data), 'csv', { zwd_interval_s: '900' }],
  ];
  for (const [name, body, format, query] of bodies) {
    it(`${name}: the same answer bytes and stored columns as from the body`, async () => {
      const queryKeys = Object.keys(query);
      const scanned = await scanZwdRequest({ body, format, query, queryKeys });
      if (!scanned.ok) throw new Error(scanned.error.detail);
      const prepared = scanned.output.prepared;
      expect(prepared).toBeDefined();
      expect(prepared!.epochMs).toBeInstanceOf(Float64Array);
      const [viaScan, direct] = await Promise.all([
        handleZwdRequest({ body: '', format, query, queryKeys, station, prepared }),
        handleZwdRequest({ body, format, query, queryKeys, station }),
      ]);
      if (!viaScan.ok || !direct.ok) throw new Error('estimation failed');
      expect(Buffer.from(viaScan.output.json).equals(Buffer.from(direct.output.json))).toBe(true);
      expect(viaScan.output.delays).toEqual(direct.output.delays);
      const epochs = observations.map((o) => Date.parse(o.epoch));
      expect(scanned.output.range).toEqual({ firstMs: Math.min(...epochs), lastMs: Math.max(...epochs) });
    });
  }
  it('a body the checks refuse is not handed on: the estimation reads it and names the field', async () => {
    const bad = JSON.stringify({ observations: { ...columns, elevation_deg: columns.elevation_deg!.map((v, i) => (i === 4 ? 91 : v)) } });
    const scanned = await scanZwdRequest({ body: bad, format: 'json', query: {}, queryKeys: [] });
    expect(scanned.ok && scanned.output.prepared).toBeFalsy();
    const outcome = await handleZwdRequest({ body: bad, format: 'json', query: {}, queryKeys: [], station });
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) expect(outcome.error.errors?.[0]?.field).toBe('observations.elevation_deg.4');
  });
});

describe('storedMetFor (the bounded stored-met read of a station estimation, issue 11 item 10)', () => {
  const station = {
    stationId: 'X',
    name: 'x',
    latitudeDeg: 46.2,
    longitudeDeg: 7.4,
    heightM: 520,
    metHeightM: null,
    description: null,
    createdAt: '',
    updatedAt: '',
  };
  const rows = (n: number) =>
    Array.from({ length: n }, (_, k) => ({
      epochMs: k * 1000,
      source: 's',
      pressureHpa: 950,
      temperatureC: 10,
      relativeHumidityPct: null,
      dewpointC: null,
      vapourPressureHpa: null,
    }));
  const repositoryWith = (n: number, reads: { fromMs: number; toMs: number }[]) =>
    ({
      readMet: async (_id: string, range: { fromMs: number; toMs: number }) => {
        reads.push(range);
        return rows(n);
      },
    }) as unknown as Parameters<typeof storedMetFor>[0];

  it('reads the range ± 1 day, and refuses more than 100 000 records naming observations', async () => {
    const reads: { fromMs: number; toMs: number }[] = [];
    const met = await storedMetFor(
      repositoryWith(100_000, reads),
      station as never,
      { range: { firstMs: 0, lastMs: 3_600_000 }, hasMet: false },
      366,
    );
    expect(met?.epochMs.length).toBe(100_000);
    expect(reads).toEqual([{ fromMs: -86_400_000, toMs: 3_600_000 + 86_400_000 }]);
    await expect(
      storedMetFor(repositoryWith(100_001, []), station as never, { range: { firstMs: 0, lastMs: 3_600_000 }, hasMet: false }, 366),
    ).rejects.toMatchObject({
      status: 400,
      errors: [{ field: 'observations', message: expect.stringMatching(/100001 stored met records.*at most 100000/) }],
    });
  });

  it('does not read when the body has met or no epoch could be read', async () => {
    const reads: { fromMs: number; toMs: number }[] = [];
    expect(
      await storedMetFor(repositoryWith(10, reads), station as never, { range: { firstMs: 0, lastMs: 1 }, hasMet: true }, 366),
    ).toBeUndefined();
    expect(await storedMetFor(repositoryWith(10, reads), station as never, { range: null, hasMet: false }, 366)).toBeUndefined();
    expect(reads).toEqual([]);
  });
});
