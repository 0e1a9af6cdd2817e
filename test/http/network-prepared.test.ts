/**
 * The storing network route parses its body once (issue 14): its scan task (scanNetworkRequest) runs the
 * estimation's own parse and checks and hands the checked body on as a PreparedNetworkRequest, which the
 * estimation task (handleNetworkRequest) takes instead of the bytes. Reference (common practice for a change of
 * path, not of method): the estimation task on the same bytes without the hand-over, i.e. the path before. For
 * every body form the answer bytes, the rows to store and where each station's met came from must be the same,
 * and the scan's epoch range, stations and met stations must be those of the request (computed here from the
 * simulation). A body the checks refuse is not handed on: the estimation reads the bytes and answers the error.
 * Stations, places and data are invented (test/estimation/network/network-simulator.ts).
 */

import { describe, expect, it } from 'vitest';
import type { Site } from '../../src/domain/site.js';
import type { MetColumns } from '../../src/services/station-met.js';
import { handleNetworkRequest, scanNetworkRequest, type NetworkRequestTaskInput } from '../../src/http/tasks/network-request.js';
import { preparedNetworkBuffers } from '../../src/http/tasks/prepared-request.js';
import { APRIORI, arrowBody, csvOf, observationsOf, RAD, sim } from './network-fixtures.js';

const s = sim(44, 'estimated');
const rows = observationsOf(s);
const ids = s.stations.map((st) => st.name);
const sites: Record<string, Site> = Object.fromEntries(
  s.stations.map((st) => [st.name, { latitudeDeg: st.latitudeRad * RAD, longitudeDeg: st.longitudeRad * RAD, heightM: st.heightM }]),
);
// Met in the request for the first two stations; stored met (as the route would read it) for the third; none for the fourth.
const met = ids.slice(0, 2).flatMap((id, i) =>
  ['2026-06-21T06:00:00Z', '2026-06-21T06:30:00Z', '2026-06-21T07:00:00Z'].map((epoch, k) => ({
    station: id,
    epoch,
    pressure_hpa: 1003 - 2 * i - 0.5 * k,
    temperature_c: 15 + k,
  })),
);
const t0 = Date.parse('2026-06-21T05:30:00Z');
const storedMet: Record<string, MetColumns> = {
  [ids[2]!]: { epochMs: [t0, t0 + 3_600_000, t0 + 7_200_000], pressureHpa: [999.5, 999.1, 998.8], temperatureC: [14, 15.5, 16] },
};
const OPTIONS = { zwd_interval_s: 600 };
const stations = ids.map((id) => ({ id, apriori: APRIORI }));
// σ on every third row only: the columns carry null on the others, the objects leave the field out.
const withSigma = rows.map((r, i) => (i % 3 === 0 ? { ...r, sigma_m: 0.004 } : r));
const columnsOf = (list: Record<string, unknown>[]) => {
  const keys = [...new Set(list.flatMap((r) => Object.keys(r)))];
  return Object.fromEntries(keys.map((k) => [k, list.map((r) => (k in r ? r[k] : null))]));
};

const utf8 = (x: unknown) => new TextEncoder().encode(JSON.stringify(x));
const FORMS: { name: string; input: () => Pick<NetworkRequestTaskInput, 'body' | 'format' | 'query'>; metStations: string[] }[] = [
  {
    name: 'JSON column arrays (σ null on some rows)',
    input: () => ({ body: utf8({ stations, observations: columnsOf(withSigma), met, options: OPTIONS }), format: 'json', query: {} }),
    metStations: ids.slice(0, 2),
  },
  {
    name: 'JSON objects (σ on some rows)',
    input: () => ({ body: utf8({ stations, observations: withSigma, met, options: OPTIONS }), format: 'json', query: {} }),
    metStations: ids.slice(0, 2),
  },
  {
    name: 'an Arrow table',
    input: () => ({ body: arrowBody(rows, { stations, met, options: OPTIONS }), format: 'arrow', query: {} }),
    metStations: ids.slice(0, 2),
  },
  {
    name: 'a CSV table with station= parameters',
    input: () => ({
      body: csvOf(rows),
      format: 'csv',
      query: { station: ids.map((id) => `${id},${APRIORI.zhd_m},${APRIORI.zwd_m}`), zwd_interval_s: '600' },
    }),
    metStations: [],
  },
];

const epochs = rows.map((r) => Date.parse(r.epoch));
const RANGE = { firstMs: Math.min(...epochs), lastMs: Math.max(...epochs) };

describe('scanNetworkRequest hands the checked body on; the estimation answers as from the bytes', () => {
  for (const form of FORMS) {
    it(`${form.name}: the same answer bytes, stored rows and met sources`, { timeout: 120_000 }, async () => {
      const scanned = await scanNetworkRequest(form.input());
      if (!scanned.ok) throw new Error(scanned.error.detail);
      const { prepared, body, ...scan } = scanned.output;
      expect(scan).toEqual({ range: RANGE, stations: ids, metStations: form.metStations, observations: rows.length });
      expect(prepared).toBeDefined();
      expect(body).toBeUndefined(); // nothing to read again
      // Every buffer of the hand-over listed once, as the route moves them.
      const buffers = preparedNetworkBuffers(prepared!);
      expect(new Set(buffers).size).toBe(buffers.length);

      const fromPrepared = await handleNetworkRequest({
        body: '',
        format: form.input().format,
        query: form.input().query,
        archiveSites: sites,
        storedMet,
        prepared,
      });
      const fromBytes = await handleNetworkRequest({ ...form.input(), archiveSites: sites, storedMet });
      if (!fromBytes.ok || !fromPrepared.ok) throw new Error('an estimation failed');
      expect(Buffer.from(fromPrepared.output.json).equals(Buffer.from(fromBytes.output.json))).toBe(true);
      expect(fromPrepared.output.delays).toEqual(fromBytes.output.delays);
      expect(fromPrepared.output.metUsed).toEqual(fromBytes.output.metUsed);
      expect(fromPrepared.output.modelFingerprint).toBe(fromBytes.output.modelFingerprint);
      expect(fromPrepared.output.observations).toBe(rows.length);
      // The met sources the storing route documents: request, archive, none.
      expect(fromBytes.output.metUsed).toEqual(
        form.input().format === 'csv' ? ['none', 'none', 'archive', 'none'] : ['request', 'request', 'archive', 'none'],
      );
    });
  }

  it('a station not in the archive is the same 404 from the hand-over as from the bytes', { timeout: 60_000 }, async () => {
    const input = FORMS[0]!.input();
    const scanned = await scanNetworkRequest({ ...input, body: (input.body as Uint8Array).slice() });
    if (!scanned.ok) throw new Error(scanned.error.detail);
    const { [ids[1]!]: _gone, ...partial } = sites;
    const fromPrepared = await handleNetworkRequest({ ...input, body: '', archiveSites: partial, prepared: scanned.output.prepared });
    const fromBytes = await handleNetworkRequest({ ...input, archiveSites: partial });
    expect(fromPrepared).toEqual(fromBytes);
    expect(fromBytes.ok).toBe(false);
    if (!fromBytes.ok) expect(fromBytes.error.errors?.map((e) => e.field)).toEqual(['stations.1.id']);
  });

  it('a body the checks refuse is not handed on: the bytes come back and the estimation names the field', async () => {
    const bad = { stations, observations: columnsOf(rows.map((r, i) => (i === 7 ? { ...r, elevation_deg: 95 } : r))), options: OPTIONS };
    const scanned = await scanNetworkRequest({ body: utf8(bad), format: 'json', query: {} });
    if (!scanned.ok) throw new Error(scanned.error.detail);
    expect(scanned.output.prepared).toBeUndefined();
    expect(scanned.output.body).toBeInstanceOf(Uint8Array);
    // The rough scan still gives what the route needs to read the stored met.
    expect(scanned.output).toMatchObject({ range: RANGE, stations: ids, metStations: [] });
    const answer = await handleNetworkRequest({ body: scanned.output.body!, format: 'json', query: {}, archiveSites: sites, storedMet });
    expect(answer.ok).toBe(false);
    if (!answer.ok) {
      expect(answer.error.status).toBe(400);
      expect(answer.error.errors?.map((e) => e.field)).toEqual(['observations.elevation_deg.7']);
    }
  });
});
