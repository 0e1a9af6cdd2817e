/**
 * The station estimation never stores a ZTD that a direct deposit would refuse (issue 10, item 4:
 * residuals sent in millimetres stored ZTD = 85 m). The range is the deposit's own
 * (src/limits.ts STORED_ZTD_RANGE_M, 1..3 m): a ZTD of tens of metres is a unit mistake (a real
 * ZTD is ~2.3 m at sea level, ~1.3 m at 9 km; common practice).
 */

import { beforeAll, describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const data = generateSyntheticResiduals({ durationS: 1800, latitudeDeg: SITE.latitude_deg, seed: 33, biasAmplitudeM: 100 });
const { observations } = toRequestBody(data);
// Epoch biases of ±100 m (a clock of ~0.3 µs) keep the millimetre residuals inside the accepted ±1e6.
const inMillimetres = observations.map((o) => ({ ...o, residual_m: o.residual_m * 1000 }));

const backend = BACKENDS[0]!;
describe(`station estimation and the stored range (${backend.name})`, () => {
  const { api, auth } = useArchiveApp(backend);
  beforeAll(async () => {
    await api()
      .put('/v1/stations/MMRES')
      .set('authorization', auth)
      .send({ name: 'Millimetre residuals (invented)', ...SITE })
      .expect(201);
  });

  it('a direct deposit of ZTD = 85 m is refused (the range the estimation must respect)', async () => {
    const res = await api()
      .post('/v1/stations/MMRES/delays')
      .set('authorization', auth)
      .send({ records: [{ epoch: '2026-03-14T12:00:00Z', ztd_m: 85 }] });
    expect(res.body.rejected?.length ?? (res.status >= 400 ? 1 : 0)).toBe(1);
  });

  it('residuals in millimetres: 400 from the unit guard (src/services/unit-guards.ts), nothing stored', async () => {
    const res = await api()
      .post('/v1/stations/MMRES/zwd-estimates')
      .set('authorization', auth)
      .send({ observations: inMillimetres })
      .expect(400);
    expect(res.body.errors[0].field).toBe('observations');
    expect(res.body.detail).toMatch(/look like millimetres; send residual_m \(and sigma_m\) in metres/);
    const stored = await api().get('/v1/stations/MMRES/delays').expect(200);
    expect(stored.body.records ?? []).toHaveLength(0);
  });

  it('a ZTD above 3 m (a-priori ZHD 2.9 m + ZWD 0.9 m): 422 naming observations and the epochs, nothing stored', async () => {
    const res = await api()
      .post('/v1/stations/MMRES/zwd-estimates')
      .set('authorization', auth)
      .send({ observations, apriori: { zhd_m: 2.9, zwd_m: 0.9 } })
      .expect(422);
    expect(res.body.errors[0].field).toBe('observations');
    expect(res.body.detail).toMatch(/outside the stored range \[1, 3\] m at \d+ epochs: \d{4}-\d\d-\d\dT/);
    const stored = await api().get('/v1/stations/MMRES/delays').expect(200);
    expect(stored.body.records ?? []).toHaveLength(0);
  });

  it('residuals with the opposite sign: 422 (the deposit refuses a negative ZWD), nothing stored', async () => {
    const flipped = observations.map((o) => ({ ...o, residual_m: -o.residual_m }));
    const res = await api()
      .post('/v1/stations/MMRES/zwd-estimates?source=flipped')
      .set('authorization', auth)
      .send({ observations: flipped, apriori: { zwd_m: 0 } })
      .expect(422);
    expect(res.body.detail).toMatch(/ZWD is never negative/);
  });

  it('the same residuals in metres are stored (the guard does not refuse a valid series)', async () => {
    const res = await api().post('/v1/stations/MMRES/zwd-estimates').set('authorization', auth).send({ observations }).expect(200);
    expect(res.body.stored.inserted).toBeGreaterThan(0);
  });
});
