/**
 * Columnar and Arrow forms of POST /v1/slant-delays (issue 14 item 1): rows sent as column arrays, or
 * as an Apache Arrow IPC table, give the same answer as rows sent as objects; answers as columns
 * (rounded to the documented precision) or as an Arrow table hold the same numbers. The reference is
 * the object form, itself checked against published values in apriori-routes.test.ts; the Arrow bytes
 * are read back with the apache-arrow package's own reader. A column's bad value gets the message of
 * the object form's field, and names the column and the row.
 */

import { Float64, tableFromArrays, tableFromIPC, tableToIPC, vectorFromArray, Table } from 'apache-arrow';
import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, mulberry32, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { OFFLOAD_BODY_BYTES } from '../../src/limits.js';
import { problemFields, useApp } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';
import { arrowBody } from './network-fixtures.js';

const ARROW = 'application/vnd.apache.arrow.stream';
const site = { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 };
const epoch = '2026-06-21T06:30:00Z';
const met = { pressure_hpa: 965.3, temperature_c: 18.2, relative_humidity_pct: 61 };
const zenith = { north_gradient_m: 0.0006, east_gradient_m: -0.0004 };

const uniform = mulberry32(20261214);
const directions = Array.from({ length: 300 }, () => ({ elevation_deg: 3 + 87 * uniform(), azimuth_deg: 360 * uniform() }));
const columnsOf = <T extends Record<string, unknown>>(rows: T[]) =>
  Object.fromEntries(Object.keys(rows[0]!).map((k) => [k, rows.map((r) => r[k])])) as { [K in keyof T]: T[K][] };

/** Arrow IPC response bytes → table (supertest buffers a binary answer). */
const binaryParser = (res: import('superagent').Response, done: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const parts: Buffer[] = [];
  stream.on('data', (c: Buffer) => parts.push(c));
  stream.on('end', () => done(null, Buffer.concat(parts)));
};

describe('POST /v1/slant-delays in columns and Arrow', () => {
  const api = useApp();
  const base = { site, epoch, met, zenith };

  it('directions as column arrays answer exactly as directions as objects', async () => {
    const rows = await api()
      .post('/v1/slant-delays')
      .send({ ...base, directions })
      .expect(200);
    const cols = await api()
      .post('/v1/slant-delays')
      .send({ ...base, directions: columnsOf(directions) })
      .expect(200);
    expect(cols.body).toEqual(rows.body);
  });

  it('satellites as column arrays answer exactly as satellites as objects', async () => {
    // Positions on a 26 560 km orbit sphere above the site's hemisphere (GPS radius, common practice).
    const satellites = Array.from({ length: 20 }, (_, i) => {
      const lat = (20 + 50 * uniform()) * (Math.PI / 180);
      const lon = (-20 + 50 * uniform()) * (Math.PI / 180);
      const r = 26_560_000;
      return {
        id: `G${String(i + 1).padStart(2, '0')}`,
        x_m: r * Math.cos(lat) * Math.cos(lon),
        y_m: r * Math.cos(lat) * Math.sin(lon),
        z_m: r * Math.sin(lat),
      };
    });
    const rows = await api()
      .post('/v1/slant-delays')
      .send({ ...base, satellites })
      .expect(200);
    const cols = await api()
      .post('/v1/slant-delays')
      .send({ ...base, satellites: columnsOf(satellites) })
      .expect(200);
    expect(cols.body).toEqual(rows.body);
    expect(rows.body.slants[0].satellite).toBe('G01');
  });

  it('shape=columns: one array per field, equal to the rows within the documented precision; fields selects', async () => {
    const rows = (
      await api()
        .post('/v1/slant-delays')
        .send({ ...base, directions })
        .expect(200)
    ).body;
    const cols = (
      await api()
        .post('/v1/slant-delays?shape=columns')
        .send({ ...base, directions })
        .expect(200)
    ).body;
    // Documented precision (answer-shape.ts): angles 1e-6 deg, mapping factors 1e-8, delays 1e-6 m.
    const tolerance: Record<string, number> = {
      elevation_deg: 5e-7,
      azimuth_deg: 5e-7,
      mapping_wet: 5e-9,
      total_m: 5e-7,
      gradient_m: 5e-7,
    };
    for (const [field, tol] of Object.entries(tolerance)) {
      expect(cols.slants[field]).toHaveLength(directions.length);
      cols.slants[field].forEach((v: number, i: number) => expect(Math.abs(v - rows.slants[i][field])).toBeLessThanOrEqual(tol * 1.000001));
    }
    expect(cols.models).toEqual(rows.models);
    expect(cols.model_fingerprint).toBe(rows.model_fingerprint);
    const picked = (
      await api()
        .post('/v1/slant-delays?shape=columns&fields=total_m,elevation_deg')
        .send({ ...base, directions })
        .expect(200)
    ).body;
    expect(Object.keys(picked.slants)).toEqual(['total_m', 'elevation_deg']);
    const pickedRows = (
      await api()
        .post('/v1/slant-delays?fields=total_m')
        .send({ ...base, directions })
        .expect(200)
    ).body;
    expect(pickedRows.slants[7]).toEqual({ total_m: rows.slants[7].total_m });
  });

  it('Accept: Arrow answers an IPC stream with the rows at full precision and the rest in the metadata', async () => {
    const rows = (
      await api()
        .post('/v1/slant-delays')
        .send({ ...base, directions })
        .expect(200)
    ).body;
    const res = await api()
      .post('/v1/slant-delays')
      .set('accept', ARROW)
      .send({ ...base, directions })
      .buffer(true)
      .parse(binaryParser)
      .expect(200);
    expect(res.headers['content-type']).toContain(ARROW);
    const table: Table = tableFromIPC(res.body as Buffer);
    expect(table.numRows).toBe(directions.length);
    const total = table.getChild('total_m')!.toArray() as Float64Array;
    rows.slants.forEach((s: { total_m: number }, i: number) => expect(total[i]).toBe(s.total_m));
    const rest = JSON.parse(table.schema.metadata.get('answer')!);
    expect(rest.model_fingerprint).toBe(rows.model_fingerprint);
    expect(rest.zenith).toEqual(rows.zenith);
  });

  it('an Arrow request (rows as the table, the rest as JSON in the metadata) answers as the JSON request', async () => {
    const json = (
      await api()
        .post('/v1/slant-delays')
        .send({ ...base, directions })
        .expect(200)
    ).body;
    const table = tableFromArrays({
      elevation_deg: Float64Array.from(directions, (d) => d.elevation_deg),
      azimuth_deg: Float64Array.from(directions, (d) => d.azimuth_deg),
    }) as Table;
    table.schema.metadata.set('request', JSON.stringify(base));
    const body = Buffer.from(tableToIPC(table, 'stream'));
    const res = await api().post('/v1/slant-delays').set('content-type', ARROW).send(body).expect(200);
    expect(res.body).toEqual(json);
  });

  it('a large columnar request (worker pool) answers as the same rows in small object batches (event loop)', async () => {
    const many = Array.from({ length: 12_000 }, () => ({ elevation_deg: 3 + 87 * uniform(), azimuth_deg: 360 * uniform() }));
    const body = { ...base, directions: columnsOf(many) };
    expect(Buffer.byteLength(JSON.stringify(body))).toBeGreaterThan(OFFLOAD_BODY_BYTES);
    const big = (await api().post('/v1/slant-delays?shape=columns&fields=total_m').send(body).expect(200)).body;
    const small = (
      await api()
        .post('/v1/slant-delays?fields=total_m')
        .send({ ...base, directions: many.slice(0, 500) })
        .expect(200)
    ).body;
    small.slants.forEach((s: { total_m: number }, i: number) =>
      expect(Math.abs(big.slants.total_m[i] - s.total_m)).toBeLessThanOrEqual(5e-7),
    );
  });

  describe('bad columns get the object form message, naming column and row', () => {
    it('an elevation out of range', async () => {
      const bad = columnsOf(directions.slice(0, 3));
      bad.elevation_deg[1] = 95;
      const cols = await api()
        .post('/v1/slant-delays')
        .send({ ...base, directions: bad })
        .expect(400);
      const objs = await api()
        .post('/v1/slant-delays')
        .send({ ...base, directions: directions.slice(0, 3).map((d, i) => (i === 1 ? { ...d, elevation_deg: 95 } : d)) })
        .expect(400);
      expect(problemFields(cols.body)).toEqual(['directions.elevation_deg.1']);
      expect(problemFields(objs.body)).toEqual(['directions.1.elevation_deg']);
      expect(cols.body.errors[0].message).toBe(objs.body.errors[0].message);
    });

    it('columns of unequal length, an unknown column, a missing column, a text in a number column', async () => {
      const short = { elevation_deg: [10, 20, 30], azimuth_deg: [0, 90] };
      expect(
        problemFields(
          (
            await api()
              .post('/v1/slant-delays')
              .send({ ...base, directions: short })
              .expect(400)
          ).body,
        ),
      ).toEqual(['directions.azimuth_deg']);
      const extra = { elevation_deg: [10], azimuth_deg: [0], elevatoin_deg: [3] };
      expect(
        problemFields(
          (
            await api()
              .post('/v1/slant-delays')
              .send({ ...base, directions: extra })
              .expect(400)
          ).body,
        ),
      ).toEqual(['directions.elevatoin_deg']);
      expect(
        problemFields(
          (
            await api()
              .post('/v1/slant-delays')
              .send({ ...base, directions: { elevation_deg: [10] } })
              .expect(400)
          ).body,
        ),
      ).toEqual(['directions.azimuth_deg']);
      const text = { elevation_deg: [10, '20'], azimuth_deg: [0, 0] };
      expect(
        problemFields(
          (
            await api()
              .post('/v1/slant-delays')
              .send({ ...base, directions: text })
              .expect(400)
          ).body,
        ),
      ).toEqual(['directions.elevation_deg.1']);
    });

    it('a null in an Arrow number column is refused as in JSON (it was read as 0, a valid azimuth)', async () => {
      const azimuths = directions.slice(0, 3).map((d, i) => (i === 1 ? null : d.azimuth_deg));
      const table = new Table({
        elevation_deg: vectorFromArray(Float64Array.from(directions.slice(0, 3), (d) => d.elevation_deg)),
        azimuth_deg: vectorFromArray(azimuths, new Float64()),
      });
      table.schema.metadata.set('request', JSON.stringify(base));
      const res = await api()
        .post('/v1/slant-delays')
        .set('content-type', ARROW)
        .send(Buffer.from(tableToIPC(table, 'stream')))
        .expect(400);
      expect(problemFields(res.body)).toEqual(['directions.azimuth_deg.1']);
    });

    it('an unknown field in `fields`, an unknown shape, a body that is not Arrow', async () => {
      const r = await api()
        .post('/v1/slant-delays?fields=total_mm')
        .send({ ...base, directions })
        .expect(400);
      expect(problemFields(r.body)).toEqual(['query.fields']);
      expect(r.body.errors[0].message).toContain('total_m');
      expect(
        problemFields(
          (
            await api()
              .post('/v1/slant-delays?shape=table')
              .send({ ...base, directions })
              .expect(400)
          ).body,
        ),
      ).toEqual(['query.shape']);
      expect(
        problemFields((await api().post('/v1/slant-delays').set('content-type', ARROW).send(Buffer.from('not arrow')).expect(400)).body),
      ).toEqual(['body']);
    });
  });
});

// Estimation: one hour of 30-s synthetic residuals with gross errors (scripts/synthetic-residuals.ts, known truth;
// the object form is checked against a dense ml-matrix solve and the truth in zwd-estimates.test.ts).
const ESTIMATION_SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const estimation = toRequestBody(
  generateSyntheticResiduals({ durationS: 3600, latitudeDeg: ESTIMATION_SITE.latitude_deg, seed: 14, grossErrors: 2 }),
);
const withSigma = estimation.observations.map((o, i) => (i % 3 === 0 ? { ...o, sigma_m: 0.004 } : o));
const estimationBody = { site: ESTIMATION_SITE, apriori: { zhd_m: 2.17 }, options: { zwd_interval_s: 900 } };

/** Columns of objects where some rows lack a field: that column holds null on those rows. */
const columnsWithGaps = (rows: Record<string, unknown>[]) => {
  const keys = [...new Set(rows.flatMap((r) => Object.keys(r)))];
  return Object.fromEntries(keys.map((k) => [k, rows.map((r) => (k in r ? r[k] : null))]));
};

describe('POST /v1/zwd-estimates with observations as columns or an Arrow table', () => {
  const api = useApp();

  it('observations as column arrays (sigma_m null on some rows) answer exactly as observations as objects', async () => {
    const objects = await api()
      .post('/v1/zwd-estimates')
      .send({ ...estimationBody, observations: withSigma })
      .expect(200);
    const columns = await api()
      .post('/v1/zwd-estimates')
      .send({ ...estimationBody, observations: columnsWithGaps(withSigma) })
      .expect(200);
    expect(columns.body).toEqual(objects.body);
    expect(objects.body.statistics.observations_rejected).toBeGreaterThan(0);
  });

  it('an Arrow table of observations (the rest in the metadata) answers exactly as JSON', async () => {
    const json = await api()
      .post('/v1/zwd-estimates')
      .send({ ...estimationBody, observations: estimation.observations })
      .expect(200);
    const arrow = await api()
      .post('/v1/zwd-estimates')
      .set('content-type', ARROW)
      .send(arrowBody(estimation.observations, estimationBody))
      .expect(200);
    expect(arrow.body).toEqual(json.body);
  });

  it('a bad value in a column gets the message of the object form, naming column and row', async () => {
    const cols = columnsWithGaps(estimation.observations) as Record<string, unknown[]>;
    cols.elevation_deg![5] = -3;
    cols.epoch![7] = '2026-13-01T00:00:00Z';
    const res = await api()
      .post('/v1/zwd-estimates')
      .send({ ...estimationBody, observations: cols })
      .expect(400);
    const objects = estimation.observations.map((r, i) =>
      i === 5 ? { ...r, elevation_deg: -3 } : i === 7 ? { ...r, epoch: '2026-13-01T00:00:00Z' } : r,
    );
    const ref = await api()
      .post('/v1/zwd-estimates')
      .send({ ...estimationBody, observations: objects })
      .expect(400);
    expect(problemFields(res.body).sort()).toEqual(['observations.elevation_deg.5', 'observations.epoch.7']);
    const message = (body: { errors: { field: string; message: string }[] }, part: string) =>
      body.errors.find((e) => e.field.includes(part))!.message;
    expect(message(res.body, 'elevation_deg')).toBe(message(ref.body, 'elevation_deg'));
    expect(message(res.body, 'epoch')).toBe(message(ref.body, 'epoch'));
  });
});

/**
 * Every numeric column of a columns answer against the rows answer: equal within half a unit of the
 * documented last decimal (delays 1e-6 m, PWV 1e-4 mm, Tm 1e-4 K: src/formats/output-precision.ts);
 * text and counts exactly; a field a row lacks is null.
 */
function expectColumnsOfRows(
  columns: Record<string, unknown[]>,
  rows: Record<string, unknown>[],
  decimals: Record<string, number | undefined>,
) {
  const fields = [...new Set(rows.flatMap((r) => Object.keys(r)))];
  expect(Object.keys(columns).sort()).toEqual(fields.sort());
  for (const f of fields) {
    expect(columns[f]).toHaveLength(rows.length);
    rows.forEach((r, i) => {
      const [want, got] = [r[f], columns[f]![i]];
      if (typeof want === 'number') expect(Math.abs((got as number) - want)).toBeLessThanOrEqual(0.5 * 10 ** -decimals[f]! * (1 + 1e-9));
      else expect(got).toEqual(want ?? null);
    });
  }
}

/** The documented decimals per field (README "Large requests"; delays 6, PWV 4, Tm 4, τ 4, counts 0). */
const PRECISION: Record<string, Record<string, number | undefined>> = {
  series: {
    correction_m: 6,
    zwd_m: 6,
    sigma_m: 6,
    north_gradient_m: 6,
    east_gradient_m: 6,
    north_gradient_sigma_m: 6,
    east_gradient_sigma_m: 6,
    epoch_bias_m: 6,
    observations: 0,
    ztd_m: 6,
    zhd_m: 6,
    tm_k: 4,
    pwv_mm: 4,
    pwv_sigma_mm: 4,
    pwv_total_sigma_mm: 4,
  },
  zwd_nodes: { correction_m: 6, zwd_m: 6, sigma_m: 6, observations_nearby: 0 },
  gradient_nodes: { north_m: 6, east_m: 6, north_sigma_m: 6, east_sigma_m: 6, observations_nearby: 0 },
  rejected: { index: 0, residual_m: 6, fitted_residual_m: 6, normalized_residual: 4 },
};

describe('estimation answers as columns and Arrow (shape, fields, Accept)', () => {
  const api = useApp();
  const body = {
    ...estimationBody,
    met: [{ epoch: estimation.observations[0]!.epoch, pressure_hpa: 955, temperature_c: 12 }],
    observations: estimation.observations,
  };

  it('shape=columns: every table as one array per field, equal to the rows within the documented precision', async () => {
    const rows = (await api().post('/v1/zwd-estimates').send(body).expect(200)).body;
    const cols = (await api().post('/v1/zwd-estimates?shape=columns').send(body).expect(200)).body;
    for (const [table, decimals] of Object.entries(PRECISION)) expectColumnsOfRows(cols[table], rows[table], decimals);
    expect(rows.rejected.length).toBeGreaterThan(0);
    expect(rows.series.some((e: { pwv_mm?: number }) => e.pwv_mm !== undefined)).toBe(true);
    // Delays at 1e-6 m: the text holds no more than six decimals.
    expect(cols.series.ztd_m.every((x: number) => Math.abs(x * 1e6 - Math.round(x * 1e6)) < 1e-6)).toBe(true);
    expect(cols.statistics).toEqual(rows.statistics);
    expect(cols.model_fingerprint).toBe(rows.model_fingerprint);
  });

  it('fields selects series fields and table.field of the other tables, in rows and in columns', async () => {
    const q = 'fields=epoch,zwd_m,zwd_nodes.sigma_m';
    const rows = (await api().post(`/v1/zwd-estimates?${q}`).send(body).expect(200)).body;
    const cols = (await api().post(`/v1/zwd-estimates?shape=columns&${q}`).send(body).expect(200)).body;
    expect(Object.keys(rows.series[0])).toEqual(['epoch', 'zwd_m']);
    expect(Object.keys(rows.zwd_nodes[0])).toEqual(['sigma_m']);
    expect(Object.keys(cols.series)).toEqual(['epoch', 'zwd_m']);
    expect(Object.keys(cols.zwd_nodes)).toEqual(['sigma_m']);
    expect(Object.keys(cols.gradient_nodes)).toContain('north_m'); // a table named in no field keeps all its fields
  });

  it('Accept: Arrow answers series as the table at full precision, the rest (other tables as columns) in the metadata', async () => {
    const rows = (await api().post('/v1/zwd-estimates').send(body).expect(200)).body;
    const res = await api().post('/v1/zwd-estimates').set('accept', ARROW).buffer(true).parse(binaryParser).send(body).expect(200);
    expect(res.headers['content-type']).toContain(ARROW);
    const table = tableFromIPC(res.body as Buffer);
    expect(table.numRows).toBe(rows.series.length);
    const ztd = table.getChild('ztd_m')!.toArray() as Float64Array;
    rows.series.forEach((e: { ztd_m: number }, i: number) => expect(ztd[i]).toBe(e.ztd_m));
    const rest = JSON.parse(table.schema.metadata.get('answer')!);
    expectColumnsOfRows(rest.zwd_nodes, rows.zwd_nodes, PRECISION.zwd_nodes!);
    expect(rest.series).toBeUndefined();
    expect(rest.model_fingerprint).toBe(rows.model_fingerprint);
  });

  it('an unknown field is a 400 naming the fields allowed', async () => {
    const res = await api().post('/v1/zwd-estimates?fields=zwd_m,pwv').send(body).expect(400);
    expect(problemFields(res.body)).toEqual(['query.fields']);
    expect(res.body.errors[0].message).toContain('unknown field pwv');
    expect(res.body.errors[0].message).toContain('zwd_nodes.sigma_m');
  });
});

for (const backend of BACKENDS) {
  describe(`station estimation with observations as columns on ${backend.name}`, () => {
    const { api, auth } = useArchiveApp(backend);

    it('stores the same series as the object form', async () => {
      await api()
        .put('/v1/stations/COL1')
        .set('authorization', auth)
        .send({ name: 'Columns test (invented)', ...ESTIMATION_SITE })
        .expect(201);
      const { site: _site, ...body } = estimationBody;
      const objects = await api()
        .post('/v1/stations/COL1/zwd-estimates?source=objects')
        .set('authorization', auth)
        .send({ ...body, observations: estimation.observations })
        .expect(200);
      const columns = await api()
        .post('/v1/stations/COL1/zwd-estimates?source=columns')
        .set('authorization', auth)
        .send({ ...body, observations: columnsWithGaps(estimation.observations) })
        .expect(200);
      expect(columns.body.series).toEqual(objects.body.series);
      // The answer as columns and as Arrow: the same series, station_id and stored as in the rows answer.
      const shaped = await api()
        .post('/v1/stations/COL1/zwd-estimates?source=objects&shape=columns&fields=ztd_m')
        .set('authorization', auth)
        .send({ ...body, observations: estimation.observations })
        .expect(200);
      expect(shaped.body.series.ztd_m).toEqual(objects.body.series.map((e: { ztd_m: number }) => Math.round(e.ztd_m * 1e6) / 1e6));
      expect(shaped.body.stored).toEqual({ source: 'objects', inserted: 0, updated: 0, unchanged: objects.body.series.length });
      const arrow = await api()
        .post('/v1/stations/COL1/zwd-estimates?source=objects')
        .set('authorization', auth)
        .set('accept', ARROW)
        .buffer(true)
        .parse(binaryParser)
        .send({ ...body, observations: estimation.observations })
        .expect(200);
      const table = tableFromIPC(arrow.body as Buffer);
      expect(Array.from(table.getChild('ztd_m')!.toArray() as Float64Array)).toEqual(
        objects.body.series.map((e: { ztd_m: number }) => e.ztd_m),
      );
      expect(JSON.parse(table.schema.metadata.get('answer')!).station_id).toBe('COL1');
      const read = async (source: string) =>
        (await api().get(`/v1/stations/COL1/delays?source=${source}`).set('authorization', auth).expect(200)).body;
      const [a, b] = [await read('objects'), await read('columns')];
      expect(b.records.map((r: { ztd_m: number }) => r.ztd_m)).toEqual(a.records.map((r: { ztd_m: number }) => r.ztd_m));
      expect(a.records.length).toBeGreaterThan(100);
    });
  });
}
