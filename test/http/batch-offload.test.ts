/**
 * The a-priori batch routes above OFFLOAD_BODY_BYTES run in the worker pool (src/http/batch-body.ts,
 * src/http/tasks/apriori-batch.ts); smaller bodies run on the event loop. The same request answers the
 * same either way: a large batch (worker) is compared with the same items sent in small batches
 * (event loop), item by item, exactly. Bad input through the worker path still names the field.
 * Which path ran is read from the metrics (tropodelay_compute_size_count per task).
 * Data: a seeded generator (Mulberry32, scripts/synthetic-residuals.ts), no truth needed: the
 * reference is the in-loop answer, itself checked against published values in apriori-routes.test.ts.
 */

import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { OFFLOAD_BODY_BYTES, OFFLOAD_COST_PER_BYTE } from '../../src/limits.js';
import { problemFields, useApp } from '../helpers/app.js';

const site = { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 };
const epoch = '2026-06-21T06:30:00Z';
const N = 4000;
const CHUNK = 500;

const uniform = mulberry32(20261202);
const directions = Array.from({ length: N }, () => ({ elevation_deg: 3 + 87 * uniform(), azimuth_deg: 360 * uniform() }));
const elevations = Array.from({ length: 10_000 }, () => 3 + 87 * uniform());
const records = Array.from({ length: N }, (_, i) => ({
  epoch: new Date(Date.parse(epoch) + i * 300_000).toISOString(),
  ztd_m: 2.3 + 0.2 * uniform(), // ZHD at 950–970 hPa is 2.17–2.22 m: every ZWD positive, no warnings
  ztd_sigma_m: 0.004,
  pressure_hpa: 950 + 20 * uniform(),
  temperature_c: 5 + 20 * uniform(),
}));

const chunks = <T>(xs: T[]) => Array.from({ length: Math.ceil(xs.length / CHUNK) }, (_, k) => xs.slice(k * CHUNK, (k + 1) * CHUNK));
const size = (body: unknown) => Buffer.byteLength(JSON.stringify(body));

/** Tasks of this name the worker pool has run so far (the metric's count). */
async function tasksRun(api: ReturnType<typeof useApp>, task: string): Promise<number> {
  const metrics = (await api().get('/metrics').expect(200)).text;
  const m = new RegExp(`tropodelay_compute_size_count\\{task="${task}"\\} (\\d+)`).exec(metrics);
  return m ? Number(m[1]) : 0;
}

describe('a-priori batches above OFFLOAD_BODY_BYTES run in the worker pool, with the answers of the event-loop path', () => {
  const api = useApp();

  it('slant delays: 4 000 directions in one batch (worker) equal the same directions in batches of 500 (event loop)', async () => {
    const common = { site, epoch, zenith: { zhd_m: 2.3, zwd_m: 0.12, north_gradient_m: 0.0005, east_gradient_m: -0.0003 } };
    const large = { ...common, directions };
    expect(size(large)).toBeGreaterThan(OFFLOAD_BODY_BYTES);
    const before = await tasksRun(api, 'slant-delays-request');
    const big = await api().post('/v1/slant-delays').send(large).expect(200);
    expect(await tasksRun(api, 'slant-delays-request')).toBe(before + 1);
    const small = [];
    for (const part of chunks(directions)) {
      expect(size({ ...common, directions: part })).toBeLessThanOrEqual(OFFLOAD_BODY_BYTES);
      small.push(
        (
          await api()
            .post('/v1/slant-delays')
            .send({ ...common, directions: part })
            .expect(200)
        ).body,
      );
    }
    expect(await tasksRun(api, 'slant-delays-request')).toBe(before + 1); // the small ones stayed on the loop
    expect(big.body.slants).toHaveLength(N);
    expect(big.body.slants).toEqual(small.flatMap((s) => s.slants));
    for (const s of small) {
      expect(s.zenith).toEqual(big.body.zenith);
      expect(s.models).toEqual(big.body.models);
      expect(s.model_fingerprint).toBe(big.body.model_fingerprint);
      expect(s.geoid_undulation_m).toBe(big.body.geoid_undulation_m);
    }
  });

  it('slant delays from met (zenith values computed): the same in the worker as on the loop', async () => {
    const common = { site, epoch, met: { pressure_hpa: 960, temperature_c: 15, relative_humidity_pct: 60 } };
    const big = await api()
      .post('/v1/slant-delays')
      .send({ ...common, directions })
      .expect(200);
    const first = await api()
      .post('/v1/slant-delays')
      .send({ ...common, directions: directions.slice(0, CHUNK) })
      .expect(200);
    expect(big.body.slants.slice(0, CHUNK)).toEqual(first.body.slants);
    expect(big.body.zenith).toEqual(first.body.zenith);
    expect(big.body.met_used).toEqual(first.body.met_used);
  });

  it('mapping factors: 10 000 elevations (worker) equal batches of 500 (event loop)', async () => {
    const large = { site, epoch, elevations_deg: elevations, model: 'niell' };
    expect(size(large)).toBeGreaterThan(OFFLOAD_BODY_BYTES);
    const before = await tasksRun(api, 'mapping-factors-request');
    const big = await api().post('/v1/mapping-factors').send(large).expect(200);
    expect(await tasksRun(api, 'mapping-factors-request')).toBe(before + 1);
    const small = [];
    for (const part of chunks(elevations))
      small.push(
        (
          await api()
            .post('/v1/mapping-factors')
            .send({ ...large, elevations_deg: part })
            .expect(200)
        ).body,
      );
    for (const key of ['hydrostatic', 'wet', 'gradient'] as const) expect(big.body[key]).toEqual(small.flatMap((s) => s[key]));
    expect(big.body.model_fingerprint).toBe(small[0].model_fingerprint);
  });

  it('precipitable water: 4 000 records (worker) equal batches of 500 (event loop)', async () => {
    const large = { site, records, sigma_budget: true };
    expect(size(large)).toBeGreaterThan(OFFLOAD_BODY_BYTES);
    const before = await tasksRun(api, 'precipitable-water-request');
    const big = await api().post('/v1/precipitable-water').send(large).expect(200);
    expect(await tasksRun(api, 'precipitable-water-request')).toBe(before + 1);
    const small = [];
    for (const part of chunks(records))
      small.push(
        (
          await api()
            .post('/v1/precipitable-water')
            .send({ ...large, records: part })
            .expect(200)
        ).body,
      );
    expect(big.body.records).toEqual(small.flatMap((s) => s.records));
    expect(big.body.models).toEqual(small[0].models);
    expect(big.body.warnings).toEqual(small[0].warnings);
  });
});

describe('the loop-or-pool choice weighs the form of the rows (OFFLOAD_COST_PER_BYTE)', () => {
  const api = useApp();
  const common = { site, epoch, zenith: { zhd_m: 2.3, zwd_m: 0.12 } };
  const cols = { elevation_deg: directions.map((d) => d.elevation_deg), azimuth_deg: directions.map((d) => d.azimuth_deg) };

  it('4 000 directions as column arrays stay on the loop where the same directions as objects go to the pool; same answer', async () => {
    const asColumns = { ...common, directions: cols };
    // Above the objects' threshold in bytes, below it once weighted as column arrays.
    expect(size(asColumns)).toBeGreaterThan(OFFLOAD_BODY_BYTES);
    expect(size(asColumns) * OFFLOAD_COST_PER_BYTE.jsonColumns).toBeLessThanOrEqual(OFFLOAD_BODY_BYTES);
    const before = await tasksRun(api, 'slant-delays-request');
    const loop = await api().post('/v1/slant-delays').send(asColumns).expect(200);
    expect(await tasksRun(api, 'slant-delays-request')).toBe(before);
    const pool = await api()
      .post('/v1/slant-delays')
      .send({ ...common, directions })
      .expect(200);
    expect(await tasksRun(api, 'slant-delays-request')).toBe(before + 1);
    expect(loop.body).toEqual(pool.body);
  });
});

describe('bad input through the worker path names the field', () => {
  const api = useApp();

  it('a schema error deep in a large slant batch: 400 naming directions.3500.elevation_deg', async () => {
    const bad = directions.map((d, i) => (i === 3500 ? { ...d, elevation_deg: 95 } : d));
    const res = await api()
      .post('/v1/slant-delays')
      .send({ site, epoch, zenith: { zhd_m: 2.3, zwd_m: 0.1 }, directions: bad })
      .expect(400);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(problemFields(res.body)).toEqual(['directions.3500.elevation_deg']);
    expect(res.body.detail).toMatch(/^directions\.3500\.elevation_deg: /);
  });

  it("a model refusal (elevation under the mapping functions' 1° floor) in a large batch names the elevation", async () => {
    const bad = elevations.map((e, i) => (i === 9500 ? 0.5 : e));
    const res = await api().post('/v1/mapping-factors').send({ site, epoch, elevations_deg: bad }).expect(400);
    expect(problemFields(res.body)).toEqual(['elevations_deg.9500']);
  });

  it('a large PWV batch with a pressure out of range names the record', async () => {
    const bad = records.map((r, i) => (i === 3999 ? { ...r, pressure_hpa: 5000 } : r));
    const res = await api().post('/v1/precipitable-water').send({ site, records: bad }).expect(400);
    expect(problemFields(res.body)).toContain('records.3999.pressure_hpa');
  });

  it('a large body that is not JSON is a 400 naming the body', async () => {
    const text = `{"site": ${JSON.stringify(site)}, "elevations_deg": [${elevations.join(',')}`; // no closing brackets
    expect(text.length).toBeGreaterThan(OFFLOAD_BODY_BYTES);
    const res = await api().post('/v1/mapping-factors').set('content-type', 'application/json').send(text).expect(400);
    expect(problemFields(res.body)).toEqual(['body']);
  });

  it('a body that is not JSON at all is a 415', async () => {
    await api().post('/v1/precipitable-water').set('content-type', 'text/plain').send('records').expect(415);
  });
});

describe('health answers while a large batch runs in a worker', () => {
  const api = useApp();

  it('health is answered before a 100 000-direction slant batch finishes', async () => {
    const many = Array.from({ length: 100_000 }, (_, i) => directions[i % N]!);
    let batchDone = false;
    const batch = api()
      .post('/v1/slant-delays')
      .send({ site, epoch, zenith: { zhd_m: 2.3, zwd_m: 0.1 }, directions: many })
      .then((r) => {
        batchDone = true;
        return r;
      });
    let healthBefore = 0;
    while (!batchDone) {
      await api().get('/v1/health').expect(200);
      if (!batchDone) healthBefore++;
      await new Promise((r) => setTimeout(r, 10));
    }
    expect((await batch).status).toBe(200);
    // On the event loop the batch held it for its whole run; in the worker health keeps being answered.
    expect(healthBefore).toBeGreaterThan(5);
  });
});
