/**
 * The options table (src/services/zwd-options.ts) reaches the estimator from each of the four entry
 * points: the request task (src/http/tasks/zwd-request.ts) is called in-process as each route calls
 * it — JSON with site, CSV with site and options in the query, a station's JSON and a station's CSV
 * (site and stored met from the station) — with every option at a non-default value, and the
 * options the estimator is called with (a spy on estimateZwd) must equal the hand-written
 * EXPECTED_ESTIMATOR_OPTIONS; the result's models must record every setting; met_max_gap_s
 * (not an estimator setting) must change which epochs have met. Values: test/services/option-values.ts.
 */

import { describe, expect, it, vi } from 'vitest';
import { generateSyntheticResiduals, toCsv, toRequestBody } from '../../scripts/synthetic-residuals.js';
import * as estimate from '../../src/estimation/estimate.js';
import { handleZwdRequest } from '../../src/http/tasks/zwd-request.js';
import { DEFAULT_ZWD_OPTIONS, ZWD_OPTIONS } from '../../src/services/zwd-options.js';
import { EXPECTED_ESTIMATOR_OPTIONS, EXPECTED_MODEL_SETTINGS, jsonOptions, NON_DEFAULT, queryOptions, SPECS } from './option-values.js';

vi.mock('../../src/estimation/estimate.js', { spy: true });

const SITE = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
const STATION_SITE = { latitudeDeg: 46.2, longitudeDeg: 7.4, heightM: 520 };
const H = 3_600_000;
// No epoch biases: with the non-default epoch_bias=false they would go into the ZTD, which the station
// route then refuses to store (a deposit refuses ZTD outside 1..3 m).
const data = generateSyntheticResiduals({ durationS: 3600, latitudeDeg: SITE.latitude_deg, seed: 21, biasAmplitudeM: 0 });
const { observations } = toRequestBody(data);
const T0 = Date.parse(observations[0]!.epoch);
// Met an hour apart: interpolated across with the default 10 800 s gap, missing with 600 s.
const MET = [0, 1, 2].map((k) => ({ epoch: new Date(T0 - H / 2 + k * H).toISOString(), pressure_hpa: 955 + k, temperature_c: 12 - k }));
const STORED_MET = {
  epochMs: MET.map((m) => Date.parse(m.epoch)),
  pressureHpa: MET.map((m) => m.pressure_hpa),
  temperatureC: MET.map((m) => m.temperature_c),
};

const enc = (o: unknown) => new TextEncoder().encode(JSON.stringify(o));
const siteQuery = { latitude_deg: String(SITE.latitude_deg), longitude_deg: String(SITE.longitude_deg), height_m: String(SITE.height_m) };

const ENTRY_POINTS = [
  [
    'POST /v1/zwd-estimates (JSON)',
    { body: enc({ site: SITE, observations, met: MET, options: jsonOptions() }), format: 'json' as const, query: {} },
    true,
  ],
  [
    'POST /v1/zwd-estimates (text/csv + query)',
    { body: toCsv(data), format: 'csv' as const, query: { ...siteQuery, ...queryOptions() } },
    false,
  ],
  [
    'POST /v1/stations/{id}/zwd-estimates (JSON)',
    {
      body: enc({ observations, options: jsonOptions() }),
      format: 'json' as const,
      query: {},
      station: { site: STATION_SITE, storedMet: STORED_MET },
    },
    true,
  ],
  [
    'POST /v1/stations/{id}/zwd-estimates (text/csv + query)',
    { body: toCsv(data), format: 'csv' as const, query: queryOptions(), station: { site: STATION_SITE, storedMet: STORED_MET } },
    true,
  ],
] as const;

describe('the test values cover the whole table', () => {
  it.each(SPECS.map((s) => [s.key, s] as const))('%s has a non-default test value', (key, spec) => {
    expect(NON_DEFAULT[key]).toBeDefined();
    expect(NON_DEFAULT[key]).not.toEqual(spec.default);
    expect(EXPECTED_MODEL_SETTINGS[spec.flatName]).toBeDefined();
  });
  it('DEFAULT_ZWD_OPTIONS has every option at its table default', () => {
    expect(Object.keys(DEFAULT_ZWD_OPTIONS).sort()).toEqual([...ZWD_OPTIONS.map((s) => s.key), 'gradients'].sort());
  });
});

describe.each(ENTRY_POINTS)('%s: every option reaches the estimator and the fingerprint', (_name, input, hasMet) => {
  it('calls estimateZwd with the options as sent, records every setting in models, applies met_max_gap_s', async () => {
    vi.mocked(estimate.estimateZwd).mockClear();
    const outcome = await handleZwdRequest(input);
    expect(outcome.ok, JSON.stringify(outcome)).toBe(true);
    if (!outcome.ok) return;
    expect(vi.mocked(estimate.estimateZwd)).toHaveBeenCalledTimes(1);
    const called = vi.mocked(estimate.estimateZwd).mock.calls[0]![0].options;
    expect(called.zwd).toEqual(EXPECTED_ESTIMATOR_OPTIONS.zwd);
    expect(called.gradients).toEqual(EXPECTED_ESTIMATOR_OPTIONS.gradients);
    expect(called.elevationCutoffRad).toBeCloseTo(EXPECTED_ESTIMATOR_OPTIONS.elevationCutoffRad, 15);
    expect({ ...called, elevationCutoffRad: 0 }).toEqual({ ...EXPECTED_ESTIMATOR_OPTIONS, elevationCutoffRad: 0 });

    const text = new TextDecoder().decode(outcome.output.json);
    const json = 'station' in input ? `${text}}` : text;
    const answer = JSON.parse(json) as { models: Record<string, unknown>; series: { met?: string }[]; model_fingerprint: string };
    for (const [name, value] of Object.entries(EXPECTED_MODEL_SETTINGS)) expect(answer.models[name], name).toEqual(value);
    if ('station' in input) expect(outcome.output.models).toEqual(answer.models);
    if (hasMet) {
      // Met an hour apart with a 600 s gap limit: no epoch between the records has met.
      expect(answer.series.filter((e) => e.met === 'interpolated')).toEqual([]);
      expect(answer.series.some((e) => e.met === 'missing')).toBe(true);
    }
  });
});

describe('gradients off', () => {
  it('JSON null and text/csv gradients=off give no gradients to the estimator and null gradient settings in models', async () => {
    for (const input of [
      { body: enc({ site: SITE, observations, options: { gradients: null } }), format: 'json' as const, query: {} },
      { body: toCsv(data), format: 'csv' as const, query: { ...siteQuery, gradients: 'off' } },
    ]) {
      vi.mocked(estimate.estimateZwd).mockClear();
      const outcome = await handleZwdRequest(input);
      if (!outcome.ok) throw new Error(outcome.error.detail);
      expect(vi.mocked(estimate.estimateZwd).mock.calls[0]![0].options.gradients).toBeNull();
      const models = JSON.parse(new TextDecoder().decode(outcome.output.json)).models;
      expect(models).toMatchObject({
        gradient_mapping: 'none',
        gradient_interval_s: null,
        gradient_random_walk_m_per_sqrt_h: null,
        gradient_apriori_sigma_m: null,
      });
    }
  });
});
