/**
 * The `warnings` column of the PWV CSV answers (issue 13: "the CSV download loses the warnings"):
 * GET /v1/stations/{id}/precipitable-water?format=csv and GET /v1/network/precipitable-water?format=csv
 * (records and interval means) carry, per row, the codes of the warnings that concern that row,
 * joined by ";" — and pandas still reads the file with a bare pd.read_csv(url).
 *
 * The rows are built so that each warning follows from a fact outside the code under test:
 *   - ZHD at 1000 hPa, sea level, φ = 45°: 0.0022768 × 1000 / (1 − 0.00266 cos 90° − 0) = 2.2768 m
 *     (Saastamoinen/Davis, IERS Conventions 2010 eq. 9.11, from memory); a ZTD of 2.10 m is below it,
 *     so ZWD and PWV are negative → wet-delay-negative;
 *   - −40 °C = 233.15 K is below the surface temperatures of the Bevis et al. (1992) Tm regression
 *     (about 240–320 K; the range documented in src/domain/water-vapour/mean-temperature.ts) → tm-extrapolated;
 *   - ztd_sigma_m 0.05 m > the documented default limit 0.01 m → delay-sigma-large;
 *   - no ztd_sigma_m → delay-sigma-unknown; an epoch after the last met record → met-missing
 *     (met is interpolated, never extrapolated: documented rule of the route).
 */

import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import type { AddressInfo } from 'node:net';
import { parse } from 'csv-parse/sync';
import { PANDAS_PYTHON } from '../helpers/pandas.js';
import { beforeAll, describe, expect, it } from 'vitest';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const ID = 'CWA';
const STATION = { name: 'Cwmhallow Flats (invented)', latitude_deg: 45, longitude_deg: 7, height_m: 0 };
const MET = [
  { epoch: '2026-07-10T12:00:00Z', pressure_hpa: 1000, temperature_c: 15 },
  { epoch: '2026-07-10T12:30:00Z', pressure_hpa: 1000, temperature_c: -40 },
  { epoch: '2026-07-10T13:00:00Z', pressure_hpa: 1000, temperature_c: 15 },
];
/** Each delay epoch with the warnings its row must carry (see the header for why). */
const ROWS: { epoch: string; ztd_m: number; ztd_sigma_m?: number; warnings: string }[] = [
  { epoch: '2026-07-10T12:00:00Z', ztd_m: 2.4, ztd_sigma_m: 0.004, warnings: '' },
  { epoch: '2026-07-10T12:05:00Z', ztd_m: 2.1, ztd_sigma_m: 0.004, warnings: 'wet-delay-negative' },
  { epoch: '2026-07-10T12:30:00Z', ztd_m: 2.4, ztd_sigma_m: 0.004, warnings: 'tm-extrapolated' },
  { epoch: '2026-07-10T12:45:00Z', ztd_m: 2.4, ztd_sigma_m: 0.05, warnings: 'delay-sigma-large' },
  { epoch: '2026-07-10T13:00:00Z', ztd_m: 2.4, warnings: 'delay-sigma-unknown' },
  { epoch: '2026-07-10T14:00:00Z', ztd_m: 2.4, ztd_sigma_m: 0.004, warnings: 'met-missing' },
];
const RANGE = { from: '2026-07-10T12:00:00Z', to: '2026-07-10T14:59:59Z' };

if (!PANDAS_PYTHON) console.warn('pandas read of the CSV warnings skipped: python3-pandas not installed (apt-get install python3-pandas)');

const isoMs = (epoch: string) => new Date(epoch).toISOString();

for (const backend of BACKENDS) {
  describe(`warnings column of the PWV CSV answers on ${backend.name}`, () => {
    const { api, app, auth } = useArchiveApp(backend);
    let base = '';

    beforeAll(async () => {
      await api().put(`/v1/stations/${ID}`).set('authorization', auth).send(STATION).expect(201);
      await api().post(`/v1/stations/${ID}/met`).set('authorization', auth).send({ records: MET }).expect(200);
      await api()
        .post(`/v1/stations/${ID}/delays`)
        .set('authorization', auth)
        .send({ source: 'cw-run', models: { test: 'invented' }, records: ROWS.map(({ warnings: _, ...r }) => r) })
        .expect(200);
      await app().listen({ port: 0, host: '127.0.0.1' });
      base = `http://127.0.0.1:${(app().server.address() as AddressInfo).port}`;
    });

    const csvRows = async (path: string, query: Record<string, string>) => {
      const res = await api()
        .get(path)
        .query({ ...query, format: 'csv' })
        .expect(200);
      return parse(res.text, { columns: true }) as Record<string, string>[];
    };

    it('station CSV: each row carries the codes of its own warnings, last column', async () => {
      const rows = await csvRows(`/v1/stations/${ID}/precipitable-water`, RANGE);
      expect(Object.keys(rows[0]!).at(-1)).toBe('warnings');
      expect(rows.map((r) => [r.epoch, r.warnings])).toEqual(ROWS.map((r) => [isoMs(r.epoch), r.warnings]));
      // The JSON answer says the same in words: one text per kind.
      const json = await api().get(`/v1/stations/${ID}/precipitable-water`).query(RANGE).expect(200);
      const texts = (json.body.warnings as string[]).join('\n');
      expect(texts).toMatch(/wet delay .* is negative/);
      expect(texts).toMatch(/Tm is extrapolated/);
      expect(texts).toMatch(/met-missing/);
      expect(texts).toMatch(/delay-sigma-large/);
      expect(texts).toMatch(/delay-sigma-unknown/);
    });

    it('network CSV of records: the same cells as the station CSV', async () => {
      const rows = await csvRows('/v1/network/precipitable-water', { stations: ID, ...RANGE });
      expect(Object.keys(rows[0]!).at(-1)).toBe('warnings');
      expect(rows.map((r) => [r.station_id, r.epoch, r.warnings])).toEqual(ROWS.map((r) => [ID, isoMs(r.epoch), r.warnings]));
    });

    it('network CSV of hourly means: the codes of any record of the hour, in the documented order', async () => {
      const rows = await csvRows('/v1/network/precipitable-water', { stations: ID, ...RANGE, interval: 'PT1H' });
      expect(rows.map((r) => [r.epoch, r.warnings])).toEqual([
        ['2026-07-10T12:00:00.000Z', 'delay-sigma-large;wet-delay-negative;tm-extrapolated'],
        ['2026-07-10T13:00:00.000Z', 'delay-sigma-unknown'],
        ['2026-07-10T14:00:00.000Z', 'met-missing'],
      ]);
    });

    it.skipIf(!PANDAS_PYTHON)('pandas reads both CSV answers with a bare pd.read_csv(url)', async () => {
      const urls = [
        `${base}/v1/stations/${ID}/precipitable-water?${new URLSearchParams({ ...RANGE, format: 'csv' })}`,
        `${base}/v1/network/precipitable-water?${new URLSearchParams({ stations: ID, ...RANGE, format: 'csv' })}`,
      ];
      const script =
        'import sys, json, pandas as pd\n' +
        'out = []\n' +
        'for url in sys.argv[1:]:\n' +
        '    df = pd.read_csv(url)\n' +
        '    out.append({"rows": len(df), "pwv": str(df["pwv_mm"].dtype), "warnings": df["warnings"].fillna("").tolist()})\n' +
        'print(json.dumps(out))';
      // Asynchronous: python fetches from this process's server, which must keep answering meanwhile.
      const { stdout } = await promisify(execFile)(PANDAS_PYTHON!, ['-c', script, ...urls], { encoding: 'utf8', timeout: 60_000 });
      const out = JSON.parse(stdout) as {
        rows: number;
        pwv: string;
        warnings: string[];
      }[];
      for (const o of out) {
        expect(o.rows).toBe(ROWS.length);
        expect(o.pwv).toBe('float64');
        expect(o.warnings).toEqual(ROWS.map((r) => r.warnings));
      }
    });
  });
}
