/**
 * Soundings in the station archive (issue 13, item 4), on every backend:
 * - a stored sounding's values are those of POST /v1/profile-delays for the same profile at the station
 *   (the documented contract of the route), and a sounding without humidity above 400 hPa is accepted
 *   and says where humidity stopped;
 * - the comparison pairs each sounding with the GNSS PWV of GET .../precipitable-water (itself checked
 *   against published formulas in station-precipitable-water.test.ts), interpolated linearly in time
 *   here in the test, and its bias and SD agree with simple-statistics (an independent npm library);
 * - every bad input is a 4xx naming the field.
 */

import { mean, sampleStandardDeviation } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { column, evenHeightsM, toApiLevels } from '../../scripts/generators/us-standard-atmosphere-1976.js';
import { provenance } from '../../src/domain/provenance.js';
import { problemFields } from '../helpers/app.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const H = 3_600_000;
const T0 = Date.UTC(2026, 6, 10);
const iso = (ms: number) => new Date(ms).toISOString();
const STATION = { name: 'Orrindale Fen (invented)', latitude_deg: 46.2, longitude_deg: 9.1, height_m: 120 };
const SITE = { latitude_deg: 46.2, longitude_deg: 9.1, height_m: 120 };

/** A U.S. Standard Atmosphere 1976 column from the generator, levels every 500 m from 0 to 30 km. */
const levels = (rh0: number) =>
  toApiLevels(column(evenHeightsM(500, 0, 30_000), { surfaceRelativeHumidityPct: rh0, temperatureOffsetK: 8 }));
const withoutHumidityAbove = (ls: Record<string, number>[], cutHpa: number) =>
  ls.map((l) => {
    if (l.pressure_hpa! >= cutHpa) return l;
    const { vapour_pressure_hpa: _e, ...rest } = l;
    return rest;
  });

const MODELS = provenance({ source: 'test', mapping: 'niell' });
const MODEL_SET = { modelFingerprint: MODELS.model_fingerprint, models: MODELS.models };

for (const backend of BACKENDS) {
  describe(`soundings of a station on ${backend.name}`, () => {
    const ctx = useArchiveApp(backend);
    const put = (id: string, epoch: string, body: object) =>
      ctx.api().put(`/v1/stations/${id}/soundings/${epoch}`).set('Authorization', ctx.auth).send(body);

    it('stores a sounding with the values of POST /v1/profile-delays at the station; GET, list and DELETE', async () => {
      await ctx.api().put('/v1/stations/ORF1').set('Authorization', ctx.auth).send(STATION).expect(201);
      const body = { levels: levels(70) };
      const epoch = iso(T0 + 12 * H);
      const first = await put('ORF1', epoch, body).expect(201);
      const reference = await ctx
        .api()
        .post('/v1/profile-delays')
        .send({ site: SITE, epoch, ...body })
        .expect(200);
      for (const k of ['zhd_m', 'zwd_m', 'ztd_m', 'pwv_mm', 'tm_k'] as const) expect(first.body.sounding[k]).toBe(reference.body[k]);
      expect(first.body).toMatchObject({ station_id: 'ORF1', created: true, humidity_extension: null });
      expect(first.body.sounding).toMatchObject({ epoch, levels: body.levels.length, last_humidity_pressure_hpa: null });
      expect(first.body.models).not.toHaveProperty('ray_tracing');

      const again = await put('ORF1', epoch.replace('.000Z', 'Z'), body).expect(200);
      expect(again.body.created).toBe(false);

      const one = await ctx.api().get(`/v1/stations/ORF1/soundings/${epoch}`).expect(200);
      expect(one.body.profile.levels).toEqual(body.levels);
      expect(one.body.models).toEqual(first.body.models);
      const list = await ctx.api().get(`/v1/stations/ORF1/soundings?from=2026-07-10&to=2026-07-10`).expect(200);
      expect(list.body.soundings.map((s: { epoch: string }) => s.epoch)).toEqual([epoch]);

      await ctx.api().delete(`/v1/stations/ORF1/soundings/${epoch}`).set('Authorization', ctx.auth).expect(204);
      await ctx.api().delete(`/v1/stations/ORF1/soundings/${epoch}`).set('Authorization', ctx.auth).expect(404);
      await ctx.api().get(`/v1/stations/ORF1/soundings/${epoch}`).expect(404);
    });

    it('accepts a sounding without humidity above 400 hPa: PWV within 0.5 mm of the full one, and says where humidity stopped', async () => {
      await ctx.api().put('/v1/stations/ORF2').set('Authorization', ctx.auth).send(STATION).expect(201);
      const full = levels(80);
      const fullAnswer = await put('ORF2', iso(T0), { levels: full }).expect(201);
      const cut = await put('ORF2', iso(T0 + H), { levels: withoutHumidityAbove(full, 400) }).expect(201);
      expect(Math.abs(cut.body.sounding.pwv_mm - fullAnswer.body.sounding.pwv_mm)).toBeLessThan(0.5); // bound of docs/profile-delays.md
      const lastHumid = full.findLastIndex((l) => l.pressure_hpa! >= 400);
      expect(cut.body.humidity_extension).toMatchObject({ method: 'smith-1966-power-law', last_humidity_level: lastHumid });
      expect(cut.body.sounding.last_humidity_pressure_hpa).toBe(full[lastHumid]!.pressure_hpa);
      expect(cut.body.warnings.join('\n')).toMatch(/measured humidity stops at level/);
      expect(cut.body.models.humidity_extension).toMatch(/smith-1966/);
      expect(cut.body.model_fingerprint).not.toBe(fullAnswer.body.model_fingerprint);
    });

    it('compares GNSS with sounding PWV: pairs by the documented rule, bias and SD as simple-statistics computes them', async () => {
      await ctx.api().put('/v1/stations/ORF3').set('Authorization', ctx.auth).send(STATION).expect(201);
      const repo = ctx.app().repository;
      // GNSS delays every 15 min over a day, met every hour; invented values with a daily cycle.
      const delays = Array.from({ length: 96 }, (_, i) => ({
        epochMs: T0 + i * 15 * 60_000,
        source: 'gnss-a',
        ztdM: 2.38 + 0.03 * Math.sin(i / 10),
        ztdSigmaM: 0.004,
        zwdM: null,
        zwdSigmaM: null,
        northGradientM: null,
        eastGradientM: null,
        northGradientSigmaM: null,
        eastGradientSigmaM: null,
        modelFingerprint: MODEL_SET.modelFingerprint,
      }));
      await repo.writeDelays('ORF3', delays, MODEL_SET);
      const met = Array.from({ length: 25 }, (_, h) => ({
        epochMs: T0 + h * H,
        source: 'met-a',
        pressureHpa: 1000 + 0.3 * h,
        temperatureC: 22 - 0.2 * h,
        relativeHumidityPct: null,
        dewpointC: null,
        vapourPressureHpa: null,
      }));
      await repo.writeMet('ORF3', met);
      // Soundings at 00:00 (on a GNSS epoch), 06:05 (between two), 12:00 and 18:10, and one at 23:59:59 + 1 h
      // (no GNSS within 30 min: unpaired).
      const epochs = [0, 6 * H + 5 * 60_000, 12 * H, 18 * H + 10 * 60_000, 25 * H].map((d) => T0 + d);
      for (const [k, e] of epochs.entries()) await put('ORF3', iso(e), { levels: levels(60 + 5 * k) }).expect(201);

      const gnss = await ctx
        .api()
        .get(`/v1/stations/ORF3/precipitable-water?from=${iso(T0)}&to=${iso(T0 + 24 * H)}`)
        .expect(200);
      const records = gnss.body.records as { epoch: string; pwv_mm: number }[];
      const gnssAt = (t: number): number => {
        const after = records.findIndex((r) => Date.parse(r.epoch) >= t);
        const b = records[after]!;
        if (Date.parse(b.epoch) === t) return b.pwv_mm;
        const a = records[after - 1]!;
        const w = (t - Date.parse(a.epoch)) / (Date.parse(b.epoch) - Date.parse(a.epoch));
        return a.pwv_mm + w * (b.pwv_mm - a.pwv_mm); // linear in time (common practice; the documented rule)
      };
      const list = await ctx
        .api()
        .get(`/v1/stations/ORF3/soundings?from=${iso(T0)}&to=${iso(T0 + 26 * H)}`)
        .expect(200);
      const soundingPwv = new Map<string, number>(list.body.soundings.map((s: { epoch: string; pwv_mm: number }) => [s.epoch, s.pwv_mm]));
      const expectedDifferences = epochs.slice(0, 4).map((e) => gnssAt(e) - soundingPwv.get(iso(e))!);

      const cmp = await ctx
        .api()
        .get(`/v1/stations/ORF3/sounding-comparison?from=${iso(T0)}&to=${iso(T0 + 26 * H)}`)
        .expect(200);
      expect(cmp.body.pairs.map((p: { difference_mm: number }) => p.difference_mm)).toEqual(
        expectedDifferences.map((d) => expect.closeTo(d, 3)), // the PWV route rounds to 0.0001 mm,
      );
      expect(cmp.body.pairs.map((p: { pairing: string }) => p.pairing)).toEqual([
        'interpolated',
        'interpolated',
        'interpolated',
        'interpolated',
      ]);
      expect(cmp.body.pairs[1].gnss_epochs).toEqual([iso(T0 + 6 * H), iso(T0 + 6 * H + 15 * 60_000)]);
      expect(cmp.body.unpaired).toEqual([iso(epochs[4]!)]);
      expect(cmp.body.statistics.count).toBe(4);
      expect(cmp.body.statistics.bias_mm).toBeCloseTo(mean(expectedDifferences), 3);
      expect(cmp.body.statistics.sd_mm).toBeCloseTo(sampleStandardDeviation(expectedDifferences), 3);
      expect(cmp.body.gnss_sources).toEqual(['gnss-a']);

      // A window of 0 s pairs only the soundings on a GNSS epoch (00:00 and 12:00).
      const tight = await ctx
        .api()
        .get(`/v1/stations/ORF3/sounding-comparison?from=${iso(T0)}&to=${iso(T0 + 26 * H)}&window_s=0`)
        .expect(200);
      expect(tight.body.statistics).toMatchObject({
        count: 2,
        bias_mm: expect.closeTo(mean([expectedDifferences[0]!, expectedDifferences[2]!]), 3),
      });
    });

    it('refuses bad input with a 4xx naming the field', async () => {
      await ctx.api().put('/v1/stations/ORF4').set('Authorization', ctx.auth).send(STATION).expect(201);
      const good = { levels: levels(50) };
      expect(problemFields((await put('ORF4', iso(T0), { ...good, lvels: [] }).expect(400)).body)).toContain('lvels');
      expect(problemFields((await put('ORF4', 'yesterday', good).expect(400)).body)).toContain('params.epoch');
      await put('NOPE', iso(T0), good).expect(404);
      await ctx
        .api()
        .put(`/v1/stations/ORF4/soundings/${iso(T0)}`)
        .send(good)
        .expect(401);
      const gap = good.levels.map((l, i) => {
        if (i !== 4) return l;
        const { vapour_pressure_hpa: _e, ...rest } = l;
        return rest;
      });
      const refused = await put('ORF4', iso(T0), { levels: gap }).expect(400);
      expect(refused.body.detail).toMatch(/may stop above some level/);
      const window = await ctx.api().get(`/v1/stations/ORF4/sounding-comparison?window_s=90000`).expect(400);
      expect(problemFields(window.body)).toContain('query.window_s');
      await ctx
        .api()
        .get(`/v1/stations/ORF4/soundings/${iso(T0)}`)
        .expect(404);
      // Nothing was stored by the refused writes.
      expect((await ctx.api().get(`/v1/stations/ORF4/soundings?from=2026-07-01&to=2026-07-31`).expect(200)).body.soundings).toEqual([]);
    });
  });
}
