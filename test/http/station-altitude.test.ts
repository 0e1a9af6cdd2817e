/**
 * Altitude above mean sea level in every station output (GET /v1/stations, GET /v1/stations/{id},
 * the network answer as JSON, CSV and netCDF), on both backends. Expected undulations are NGA's
 * EGM96 check values (the test points distributed with NGA's EGM96 interpolation program, from
 * memory; also in test/domain/geoid.test.ts), not the code under test: the altitude must be
 * height_m − N within the grid's few centimetres, so a sign error (h + N) or a swapped latitude and
 * longitude (tens of metres) fails.
 */

import { execFileSync } from 'node:child_process';
import { parse } from 'csv-parse/sync';
import { PANDAS_PYTHON } from '../helpers/pandas.js';
import { NetCDFReader } from 'netcdfjs';
import { describe, expect, it } from 'vitest';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const binary = (res: NodeJS.ReadableStream, done: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => done(null, Buffer.concat(chunks)));
};

/** Invented stations placed on two NGA check points (names made up); heights invented. */
const POINTS = [
  // id, latitude [deg], longitude [deg], ellipsoidal height [m], EGM96 N [m] (NGA check value)
  { id: 'ALTA', lat: 46.874319, lon: 102.448729, h: 1500, n: -43.572 },
  { id: 'ALTB', lat: -23.617446, lon: 133.874712, h: 600, n: 15.868 },
];
if (!PANDAS_PYTHON) console.warn('pandas read of the network CSV skipped: python3-pandas not installed (apt-get install python3-pandas)');

/** The grid with bilinear interpolation against the synthesis: a few cm (geoid.ts); output rounded to 1 cm. */
const TOL_M = 0.1;

for (const backend of BACKENDS) {
  describe(`station altitude above mean sea level on ${backend.name}`, () => {
    const { api, auth } = useArchiveApp(backend);

    it('GET /v1/stations and GET /v1/stations/{id} give geoid_undulation_m and altitude_m = height_m − N', async () => {
      for (const p of POINTS) {
        await api()
          .put(`/v1/stations/${p.id}`)
          .set('authorization', auth)
          .send({ name: `${p.id} (invented)`, latitude_deg: p.lat, longitude_deg: p.lon, height_m: p.h })
          .expect(201);
      }
      const list = await api().get('/v1/stations').expect(200);
      for (const p of POINTS) {
        const one = await api().get(`/v1/stations/${p.id}`).expect(200);
        const listed = list.body.stations.find((s: { station_id: string }) => s.station_id === p.id);
        for (const s of [one.body, listed]) {
          expect(s.height_m).toBe(p.h);
          expect(Math.abs(s.geoid_undulation_m - p.n)).toBeLessThan(TOL_M);
          expect(Math.abs(s.altitude_m - (p.h - p.n))).toBeLessThan(TOL_M);
        }
      }
    });

    it('the network answer carries them in JSON, as CSV columns and as CF variables in netCDF', async () => {
      for (const p of POINTS) {
        await api()
          .post(`/v1/stations/${p.id}/met`)
          .set('authorization', auth)
          .send({ records: [{ epoch: '2026-07-10T12:00:00Z', pressure_hpa: 850, temperature_c: 15 }] })
          .expect(200);
        await api()
          .post(`/v1/stations/${p.id}/delays`)
          .set('authorization', auth)
          .send({
            source: 'alt-test',
            models: { test: 'invented' },
            records: [{ epoch: '2026-07-10T12:00:00Z', ztd_m: 2.1, ztd_sigma_m: 0.004 }],
          })
          .expect(200);
      }
      const query = { epoch: '2026-07-10T12:00:00Z', stations: 'ALTA,ALTB' };
      const json = await api().get('/v1/network/precipitable-water').query(query).expect(200);
      const csv = await api()
        .get('/v1/network/precipitable-water')
        .query({ ...query, format: 'csv' })
        .expect(200);
      const rows = parse(csv.text, { columns: true }) as Record<string, string>[];
      const nc = await api()
        .get('/v1/network/precipitable-water')
        .query({ ...query, format: 'netcdf' })
        .buffer(true)
        .parse(binary as never)
        .expect(200);
      if (PANDAS_PYTHON) {
        // pandas reads the CSV directly: numeric columns come out as float64, one row per station.
        const script =
          'import sys, json, pandas as pd\n' +
          'df = pd.read_csv(sys.stdin)\n' +
          'print(json.dumps({"rows": len(df), "dtypes": {c: str(df[c].dtype) for c in ["altitude_m", "geoid_undulation_m", "pwv_mm", "ztd_m"]}, "altitude": df["altitude_m"].tolist()}))';
        const out = JSON.parse(execFileSync(PANDAS_PYTHON, ['-c', script], { input: csv.text, encoding: 'utf8' }));
        expect(out.rows).toBe(2);
        expect(out.dtypes).toEqual({ altitude_m: 'float64', geoid_undulation_m: 'float64', pwv_mm: 'float64', ztd_m: 'float64' });
        POINTS.forEach((p, k) => expect(Math.abs(out.altitude[k] - (p.h - p.n))).toBeLessThan(TOL_M));
      }
      const reader = new NetCDFReader(nc.body as Buffer);
      const ncAltitude = reader.getDataVariable('altitude') as number[];
      const ncUndulation = reader.getDataVariable('geoid_undulation') as number[];
      POINTS.forEach((p, k) => {
        const s = json.body.stations[k];
        expect(s.station_id).toBe(p.id);
        expect(Math.abs(s.altitude_m - (p.h - p.n))).toBeLessThan(TOL_M);
        const row = rows.find((r) => r.station_id === p.id)!;
        // 1 cm precision, two decimals in every cell (src/formats/output-precision.ts)
        expect(row.altitude_m).toMatch(/^-?\d+\.\d{2}$/);
        expect(row.geoid_undulation_m).toMatch(/^-?\d+\.\d{2}$/);
        expect(Math.abs(Number(row.altitude_m) - (p.h - p.n))).toBeLessThan(TOL_M);
        expect(Math.abs(Number(row.geoid_undulation_m) - p.n)).toBeLessThan(TOL_M);
        expect(Math.abs(ncAltitude[k]! - (p.h - p.n))).toBeLessThan(TOL_M);
        expect(Math.abs(ncUndulation[k]! - p.n)).toBeLessThan(TOL_M);
      });
    });
  });
}
