/**
 * The one-pass reader of columnar JSON bodies in the estimation tasks (src/http/tasks/zwd-request.ts with
 * src/formats/json-columns-reader.ts, issue 14) against the general path it replaces for such bodies: the
 * body as text, JSON.parse, the column checks (the same task given the body as a string takes that path).
 * The reference is that path's answer, byte for byte (common practice for a change of speed): the
 * benchmark days (test/helpers/realistic-sky.ts, as bench/columns.bench.ts builds them) as rows and as
 * `shape=columns`, the station route's prepared columns, and the error of every malformed body below
 * (status, detail and field errors as the general path gives them); the network route likewise on the
 * invented network of test/http/network-fixtures.ts.
 */

import { describe, expect, it } from 'vitest';
import type { AnswerShape } from '../../src/http/answer-shape.js';
import { handleZwdRequest, scanZwdRequest, type ZwdRequestTaskInput } from '../../src/http/tasks/zwd-request.js';
import { columnSpecsOf, jsonColumnSpecsOf } from '../../src/http/columns.js';
import { zwdObservationSchema } from '../../src/http/schemas/zwd-estimates.js';
import { readJsonColumnsBody } from '../../src/formats/json-columns-reader.js';
import { MAX_OBSERVATIONS } from '../../src/limits.js';
import { handleNetworkRequest } from '../../src/http/tasks/network-request.js';
import { networkObservationSchema } from '../../src/http/schemas/network-estimates.js';
import { networkBody, sim } from './network-fixtures.js';
import { dayRequest } from '../helpers/gps-like-days.js';

const ROWS: AnswerShape = { shape: 'rows', format: 'json', fields: undefined };
const COLUMNS: AnswerShape = { shape: 'columns', format: 'json', fields: undefined };

/** One realistic day as the request's site, apriori and observation columns (as bench/columns.bench.ts builds it). */
function realisticDay(constellations: ('gps' | 'glonass' | 'galileo' | 'beidou')[], grossErrors: number) {
  const { rest, columns } = dayRequest({ constellations, grossErrors });
  return { ...rest, observations: columns };
}

const bytesOf = (text: string) => new Uint8Array(Buffer.from(text, 'utf8'));

/** The body is one the reader reads (so the comparison is not of the general path with itself). */
const readable = (text: string) =>
  readJsonColumnsBody(bytesOf(text), 'observations', jsonColumnSpecsOf(columnSpecsOf(zwdObservationSchema.shape)), MAX_OBSERVATIONS) !==
  undefined;

/** The task's outcome for the body as bytes (the reader) and as text (the general path). */
async function bothPaths(text: string, extra: Partial<ZwdRequestTaskInput> = {}) {
  const base = { format: 'json' as const, query: {}, ...extra };
  const read = await handleZwdRequest({ ...base, body: bytesOf(text) });
  const general = await handleZwdRequest({ ...base, body: text });
  return { read, general };
}

function expectSameBytes(a: Awaited<ReturnType<typeof handleZwdRequest>>, b: Awaited<ReturnType<typeof handleZwdRequest>>) {
  expect(a.ok && b.ok, JSON.stringify(a.ok ? '' : a.error)).toBe(true);
  if (!a.ok || !b.ok) return;
  expect(a.output.json.length).toBeGreaterThan(1000);
  expect(Buffer.from(a.output.json).equals(Buffer.from(b.output.json))).toBe(true);
  expect(a.output.observations).toBe(b.output.observations);
}

describe('benchmark days: the answer of the general path, byte for byte', () => {
  it.each([
    ['GPS-like day (30 satellites, 7–11 in view)', ['gps'] as const, 25],
    ['four constellations (28–38 in view)', ['gps', 'glonass', 'galileo', 'beidou'] as const, 100],
  ])(
    '%s: rows and shape=columns',
    async (_name, constellations, grossErrors) => {
      const day = realisticDay([...constellations], grossErrors);
      const text = JSON.stringify(day);
      expect(readable(text)).toBe(true);
      for (const answer of [ROWS, COLUMNS]) {
        const { read, general } = await bothPaths(text, { answer });
        expectSameBytes(read, general);
      }
      // σ given on some rows (null on the others), the observations before the rest, and whitespace
      const sigma = day.observations.residual_m.map((_, i) => (i % 3 === 0 ? null : 0.002 + (i % 7) * 1e-4));
      const reordered = JSON.stringify(
        { observations: { ...day.observations, sigma_m: sigma }, site: day.site, options: { gradients: null } },
        null,
        1,
      );
      expect(readable(reordered)).toBe(true);
      const { read, general } = await bothPaths(reordered);
      expectSameBytes(read, general);
    },
    120_000,
  );

  it("the station route: the scan's prepared columns are those of the general path, and so is the answer", async () => {
    const day = realisticDay(['gps'], 25);
    const text = JSON.stringify({ apriori: day.apriori, observations: day.observations });
    const query = {};
    const read = await scanZwdRequest({ body: bytesOf(text), format: 'json', query, queryKeys: [] });
    const general = await scanZwdRequest({ body: text, format: 'json', query, queryKeys: [] });
    expect(read.ok && general.ok).toBe(true);
    if (!read.ok || !general.ok) return;
    expect(read.output.prepared).toBeDefined();
    expect(read.output.range).toEqual(general.output.range);
    expect(read.output.observations).toBe(general.output.observations);
    const a = read.output.prepared!;
    const b = general.output.prepared!;
    expect(a.body).toEqual(b.body);
    expect(a.satellites).toEqual(b.satellites);
    for (const k of ['epochMs', 'satelliteIndex', 'elevationRad', 'azimuthRad', 'residualM'] as const) {
      expect(
        Buffer.from(a[k].buffer, a[k].byteOffset, a[k].byteLength).equals(Buffer.from(b[k].buffer, b[k].byteOffset, b[k].byteLength)),
      ).toBe(true);
      expect(a[k].byteOffset === 0 && a[k].buffer.byteLength === a[k].byteLength).toBe(true); // own buffers: moved, not copied
    }
    expect(a.sigmaM).toBe(b.sigmaM);
    const station = { site: { latitudeDeg: day.site.latitude_deg, longitudeDeg: day.site.longitude_deg, heightM: day.site.height_m } };
    const answers = await Promise.all([
      handleZwdRequest({ body: '', format: 'json', query, queryKeys: [], station, prepared: a }),
      handleZwdRequest({ body: text, format: 'json', query, queryKeys: [], station }),
    ]);
    expectSameBytes(answers[0], answers[1]);
  }, 60_000);
});

describe('malformed and unusual bodies: the status and errors of the general path', () => {
  const site = { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 };
  const columns = {
    epoch: ['2026-03-14T12:00:00Z', '2026-03-14T12:00:00Z', '2026-03-14T12:00:30Z', '2026-03-14T12:00:30Z'],
    satellite: ['G01', 'G02', 'G01', 'G02'],
    elevation_deg: [35.5, 60.25, 35.4, 60.3],
    azimuth_deg: [120, 240, 121, 241],
    residual_m: [100.1, 100.2, 100.15, 100.25],
  };
  const obs = JSON.stringify(columns);
  const withColumn = (name: string, json: string) =>
    `{"site":${JSON.stringify(site)},"observations":${obs.replace(new RegExp(`"${name}":\\[[^\\]]*\\]`), `"${name}":${json}`)}}`;
  const cases: [string, string][] = [
    ['a bad number (leading zero)', withColumn('elevation_deg', '[35.5,060,35.4,60.3]')],
    ['a bad number (two points)', withColumn('azimuth_deg', '[1.2.3,240,121,241]')],
    ['NaN', withColumn('residual_m', '[NaN,1,2,3]')],
    ['a huge exponent (Infinity)', withColumn('residual_m', '[1e400,1,2,3]')],
    ['a tiny exponent (0, out of the elevation range)', withColumn('elevation_deg', '[1e-400,60,35,60]')],
    ['a tiny exponent (0, a valid residual)', withColumn('residual_m', '[1e-400,1,2,3]')],
    ['negative zero azimuth (valid)', withColumn('azimuth_deg', '[-0,240,121,241]')],
    ['out of range', withColumn('elevation_deg', '[95,60,35,60]')],
    ['a residual out of range', withColumn('residual_m', '[2e6,1,2,3]')],
    ['a string for a number', withColumn('azimuth_deg', '["120",240,121,241]')],
    ['null where not allowed', withColumn('azimuth_deg', '[null,240,121,241]')],
    ['a number for a satellite', withColumn('satellite', '[1,"G02","G01","G02"]')],
    [
      'an invalid epoch',
      withColumn('epoch', '["2026-13-14T12:00:00Z","2026-03-14T12:00:00Z","2026-03-14T12:00:30Z","2026-03-14T12:00:30Z"]'),
    ],
    [
      'an epoch without a zone',
      withColumn('epoch', '["2026-03-14T12:00:00","2026-03-14T12:00:00","2026-03-14T12:00:30Z","2026-03-14T12:00:30Z"]'),
    ],
    ['a satellite too long', withColumn('satellite', `["${'G'.repeat(33)}","G02","G01","G02"]`)],
    ['an empty satellite', withColumn('satellite', '["","G02","G01","G02"]')],
    ['an escape in a satellite', withColumn('satellite', '["G\\u00301","G02","G01","G02"]')],
    ['a missing column', `{"site":${JSON.stringify(site)},"observations":${JSON.stringify({ ...columns, residual_m: undefined })}}`],
    ['ragged columns', withColumn('azimuth_deg', '[120,240,121]')],
    ['an unknown column', `{"site":${JSON.stringify(site)},"observations":${JSON.stringify({ ...columns, snr: [1, 2, 3, 4] })}}`],
    [
      'empty columns',
      `{"site":${JSON.stringify(site)},"observations":{"epoch":[],"satellite":[],"elevation_deg":[],"azimuth_deg":[],"residual_m":[]}}`,
    ],
    ['a column twice (the last one wins)', `{"site":${JSON.stringify(site)},"observations":${obs.slice(0, -1)},"azimuth_deg":[1,2,3,4]}}`],
    ['observations twice (the last one wins)', `{"site":${JSON.stringify(site)},"observations":{"epoch":[]},"observations":${obs}}`],
    ['site twice (the last one wins)', `{"site":{"latitude_deg":99},"observations":${obs},"site":${JSON.stringify(site)}}`],
    ['an escaped member name', `{"s\\u0069te":${JSON.stringify(site)},"observ\\u0061tions":${obs}}`],
    ['a bad site', `{"site":{"latitude_deg":95,"longitude_deg":7.4,"height_m":520},"observations":${obs}}`],
    ['an unknown member', `{"site":${JSON.stringify(site)},"observations":${obs},"optoins":{}}`],
    ['a bad option', `{"site":${JSON.stringify(site)},"observations":${obs},"options":{"elevation_cutoff_deg":"x"}}`],
    ['no site', `{"observations":${obs}}`],
    ['deep nesting', `{"site":${JSON.stringify(site)},"observations":${obs},"x":${'['.repeat(2000)}${']'.repeat(2000)}}`],
    ['truncated', `{"site":${JSON.stringify(site)},"observations":${obs}`.slice(0, -20)],
    ['a byte-order mark', `\uFEFF{"site":${JSON.stringify(site)},"observations":${obs}}`],
    ['trailing text', `{"site":${JSON.stringify(site)},"observations":${obs}} {}`],
    ['not an object', `[${obs}]`],
    ['null', 'null'],
    [
      'observations as objects',
      JSON.stringify({
        site,
        observations: [{ epoch: columns.epoch[0], satellite: 'G01', elevation_deg: 30, azimuth_deg: 1, residual_m: 1 }],
      }),
    ],
    ['observations as a string', `{"site":${JSON.stringify(site)},"observations":"x"}`],
    ['whitespace everywhere (valid)', `\r\n{ "site" :\t${JSON.stringify(site)} , "observations" : ${obs.replace(/,/g, ' ,\n ')} }\n`],
  ];

  it.each(cases)('%s', async (_name, text) => {
    const { read, general } = await bothPaths(text);
    if (read.ok && general.ok) expect(Buffer.from(read.output.json).equals(Buffer.from(general.output.json))).toBe(true);
    else expect(read).toEqual(general);
  });

  it('the query parameters of text/csv bodies are refused with a JSON body, as before', async () => {
    const text = `{"site":${JSON.stringify(site)},"observations":${obs}}`;
    const { read, general } = await bothPaths(text, { query: { latitude_deg: '1' }, queryKeys: ['latitude_deg'] });
    expect(read.ok).toBe(false);
    expect(read).toEqual(general);
  });
});

describe('the network route (handleNetworkRequest): the answer and errors of the general path', () => {
  const s = sim(51, 'estimated');
  const body = networkBody(s, { zwd_interval_s: 600 });
  const rows = body.observations;
  const columns = {
    station: rows.map((r) => r.station!),
    epoch: rows.map((r) => r.epoch),
    satellite: rows.map((r) => r.satellite),
    elevation_deg: rows.map((r) => r.elevation_deg),
    azimuth_deg: rows.map((r) => r.azimuth_deg),
    residual_m: rows.map((r) => r.residual_m),
    sigma_m: rows.map((_, i) => (i % 3 === 0 ? 0.004 : null)),
  };
  const both = async (text: string) => ({
    read: await handleNetworkRequest({ body: bytesOf(text), format: 'json', query: {} }),
    general: await handleNetworkRequest({ body: text, format: 'json', query: {} }),
  });

  it('a network hour as columns (σ on some rows): byte for byte', { timeout: 120_000 }, async () => {
    const text = JSON.stringify({ ...body, observations: columns });
    const specs = jsonColumnSpecsOf(columnSpecsOf(networkObservationSchema.shape));
    expect(readJsonColumnsBody(bytesOf(text), 'observations', specs, MAX_OBSERVATIONS)).toBeDefined(); // the reader's path
    const { read, general } = await both(text);
    expect(read.ok && general.ok).toBe(true);
    if (!read.ok || !general.ok) return;
    expect(Buffer.from(read.output.json).equals(Buffer.from(general.output.json))).toBe(true);
  });

  it.each([
    ['a station not in stations', { ...columns, station: columns.station.map((v, i) => (i === 5 ? 'NOWHERE' : v)) }],
    ['a bad station id', { ...columns, station: columns.station.map((v, i) => (i === 5 ? '' : v)) }],
    ['a missing station column', { ...columns, station: undefined }],
    ['an elevation out of range', { ...columns, elevation_deg: columns.elevation_deg.map((v, i) => (i === 7 ? -1 : v)) }],
  ])('%s', { timeout: 60_000 }, async (_name, observations) => {
    const { read, general } = await both(JSON.stringify({ ...body, observations }));
    expect(read.ok).toBe(false);
    expect(read).toEqual(general);
  });
});
