/**
 * Every estimation option through the four HTTP entry points (issue 9): POST /v1/zwd-estimates as
 * JSON and as text/csv with the options as query parameters, and POST /v1/stations/{id}/zwd-estimates
 * likewise. Each option at a non-default value (test/services/option-values.ts) must show in the
 * answer's `models` and in the model set stored with the station's series; met_max_gap_s (dropped
 * from the station's CSV query before) must also take effect: with met an hour apart and a 600 s
 * limit no epoch between met records has met. The in-process twin with a spy on the estimator is
 * test/services/zwd-options.test.ts.
 */

import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals, toCsv, toRequestBody } from '../../scripts/synthetic-residuals.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';
import { EXPECTED_MODEL_SETTINGS, jsonOptions, queryOptions } from '../services/option-values.js';

const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const H = 3_600_000;
// No epoch biases: with the non-default epoch_bias=false they would go into the ZTD, which the station
// route then refuses to store (a deposit refuses ZTD outside 1..3 m).
const data = generateSyntheticResiduals({ durationS: 3600, latitudeDeg: SITE.latitude_deg, seed: 21, biasAmplitudeM: 0 });
const { observations } = toRequestBody(data);
const T0 = Date.parse(observations[0]!.epoch);
const MET = [0, 1, 2].map((k) => ({ epoch: new Date(T0 - H / 2 + k * H).toISOString(), pressure_hpa: 955 + k, temperature_c: 12 - k }));

interface Answer {
  models: Record<string, unknown>;
  model_fingerprint: string;
  series: { epoch: string; met?: string }[];
}

function expectEveryOption(answer: Answer, withMet: boolean) {
  for (const [name, value] of Object.entries(EXPECTED_MODEL_SETTINGS)) expect(answer.models[name], name).toEqual(value);
  if (withMet) {
    expect(answer.series.filter((e) => e.met === 'interpolated')).toEqual([]);
    expect(answer.series.some((e) => e.met === 'missing')).toBe(true);
  }
}

for (const backend of BACKENDS) {
  describe(`every option through the four entry points (${backend.name})`, () => {
    const { api, auth } = useArchiveApp(backend);
    const fingerprints: string[] = [];

    it('POST /v1/zwd-estimates, JSON', async () => {
      const res = await api().post('/v1/zwd-estimates').send({ site: SITE, observations, met: MET, options: jsonOptions() }).expect(200);
      expectEveryOption(res.body, true);
      fingerprints.push(res.body.model_fingerprint);
    });

    it('POST /v1/zwd-estimates, text/csv with the options as query parameters', async () => {
      const res = await api()
        .post('/v1/zwd-estimates')
        .query({ ...SITE, ...queryOptions() })
        .set('content-type', 'text/csv')
        .send(toCsv(data))
        .expect(200);
      expectEveryOption(res.body, false);
      fingerprints.push(res.body.model_fingerprint);
    });

    for (const format of ['json', 'csv'] as const) {
      it(`POST /v1/stations/{id}/zwd-estimates, ${format}: answer and stored model set`, async () => {
        const id = `OPT${format.toUpperCase()}`;
        await api()
          .put(`/v1/stations/${id}`)
          .set('authorization', auth)
          .send({ name: 'Options test (invented)', ...SITE })
          .expect(201);
        await api().post(`/v1/stations/${id}/met`).set('authorization', auth).send({ records: MET }).expect(200);
        const call = api().post(`/v1/stations/${id}/zwd-estimates`).set('authorization', auth);
        const res =
          format === 'json'
            ? await call.send({ observations, options: jsonOptions() }).expect(200)
            : await call.query(queryOptions()).set('content-type', 'text/csv').send(toCsv(data)).expect(200);
        expect(res.body.met_used).toBe('archive');
        expectEveryOption(res.body, true);
        fingerprints.push(res.body.model_fingerprint);
        const first = res.body.series[0].epoch;
        const last = res.body.series[res.body.series.length - 1].epoch;
        const stored = await api().get(`/v1/stations/${id}/delays`).query({ from: first, to: last }).expect(200);
        expect(stored.body.model_sets).toHaveLength(1);
        expect(stored.body.model_sets[0].model_fingerprint).toBe(res.body.model_fingerprint);
        for (const [name, value] of Object.entries(EXPECTED_MODEL_SETTINGS))
          expect(stored.body.model_sets[0].models[name], name).toEqual(value);
      });
    }

    it('gives one fingerprint for the same options at all four entry points', () => {
      expect(fingerprints).toHaveLength(4);
      expect(new Set(fingerprints).size).toBe(1);
    });
  });
}
