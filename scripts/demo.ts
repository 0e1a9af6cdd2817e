/**
 * `npm run demo`: loads an invented demo network into the station archive and shows where to read
 * it. The three stations (QUILL, BRACK, SALTM), their names and places are invented; all data is
 * synthetic, made by scripts/synthetic/network.ts from a known truth.
 *
 *  1. creates the stations;
 *  2. stores three days of hourly met per station from fixtures/demo/ (QUILL as JSON, BRACK as CSV,
 *     SALTM as RINEX met 2.11 and 3.04 files), writing the fixtures first if they are missing;
 *  3. deposits a 15-minute ZTD series per station: the generator's true ZTD plus 4 mm of white noise
 *     (seeded), with the models that describe it, and reads the PWV back against the true PWV;
 *  4. runs the ZWD estimation for each station on six hours of 30 s residuals generated from a known
 *     random-walk ZWD (scripts/synthetic-residuals.ts), with the station's stored met, and stores the
 *     result as a second delay series (so the first six hours mix two model sets: the retrieval says so);
 *  5. prints the retrieval URLs.
 *
 * It works on the storage the service uses (TROPO_DATA_DIR, default ./data, or DATABASE_URL), in
 * process, with the configured or generated bearer key; start the service afterwards with
 * `npm start` and open the URLs. Running it again changes nothing (the writes are idempotent).
 */

import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadConfig } from '../src/config.js';
import { archiveOptionsFromConfig, buildApp } from '../src/http/app.js';
import { ADMIN_KEY_FILE_NAME } from '../src/http/access/first-admin-key.js';
import { DEMO_DAYS, DEMO_SEEDS, DEMO_START_MS, FIXTURE_DIR, writeDemoFixtures } from './generate-fixtures.js';
import { generateSyntheticResiduals, toRequestBody, truthZwdAt } from './synthetic-residuals.js';
import { DEMO_NETWORK, gaussian, mulberry32, saastamoinenZhdM, truthSeries } from './synthetic/network.js';
import { storeDemoSoundings } from './synthetic/soundings.js';

const QUARTER_HOUR = 900_000;
const ZTD_NOISE_M = 0.004;

const config = loadConfig();
const archive = archiveOptionsFromConfig(config);
const app = await buildApp({ archive });
// A configured key of role write or admin, else the first admin key the app created in the data directory.
const key =
  archive.apiKeys.map((k) => (typeof k === 'string' ? { role: 'write', secret: k } : k)).find((k) => k.role !== 'read')?.secret ??
  readFileSync(join(config.TROPO_DATA_DIR, ADMIN_KEY_FILE_NAME), 'utf8').trim();
const auth = { authorization: `Bearer ${key}` };

async function call(method: 'PUT' | 'POST' | 'GET', url: string, payload?: string | object, contentType = 'application/json') {
  const res = await app.inject({
    method,
    url,
    headers: { ...auth, 'content-type': contentType },
    ...(payload === undefined ? {} : { payload }),
  });
  if (res.statusCode >= 300) throw new Error(`${method} ${url}: ${res.statusCode} ${res.body}`);
  return res.json();
}

try {
  if (!existsSync(new URL('SALTM-met-day3.rnx', FIXTURE_DIR))) writeDemoFixtures();
  const fixture = (name: string) => readFileSync(new URL(name, FIXTURE_DIR), 'utf8');
  process.stdout.write('tropodelay demo: an invented network (names and places are not real), synthetic data with a known truth\n\n');

  for (const s of DEMO_NETWORK) {
    await call('PUT', `/v1/stations/${s.stationId}`, {
      name: s.name,
      latitude_deg: s.latitudeDeg,
      longitude_deg: s.longitudeDeg,
      height_m: s.heightM,
      description: s.description,
    });
  }

  const met = [
    ['QUILL', 'JSON', await call('POST', '/v1/stations/QUILL/met', fixture('QUILL-met.json'))],
    ['BRACK', 'CSV', await call('POST', '/v1/stations/BRACK/met?source=brack-logger', fixture('BRACK-met.csv'), 'text/csv')],
    [
      'SALTM',
      'RINEX 2.11',
      await call('POST', '/v1/stations/SALTM/met?source=saltm-rinex', fixture('SALTM-met-days1-2.26m'), 'text/plain'),
    ],
    ['SALTM', 'RINEX 3.04', await call('POST', '/v1/stations/SALTM/met?source=saltm-rinex', fixture('SALTM-met-day3.rnx'), 'text/plain')],
  ] as const;
  for (const [id, form, r] of met) {
    process.stdout.write(
      `met ${id.padEnd(5)} as ${form.padEnd(10)}: ${r.inserted} inserted, ${r.updated} updated, ${r.unchanged} unchanged, ${r.rejected_count} rejected\n`,
    );
  }

  const count = DEMO_DAYS * 96 - 4; // inside the met coverage (hourly met over 3 days)
  for (const s of DEMO_NETWORK) {
    const truth = truthSeries(s, DEMO_START_MS, count, QUARTER_HOUR, DEMO_SEEDS[s.stationId]);
    const noise = mulberry32(100 + DEMO_SEEDS[s.stationId]!);
    const res = await call('POST', `/v1/stations/${s.stationId}/delays`, {
      source: 'demo-truth-plus-noise',
      models: {
        generator: 'scripts/synthetic/network.ts',
        ztd_noise_m: ZTD_NOISE_M,
        zhd: 'saastamoinen (IERS 2010 eq. 9.11)',
        tm: 'bevis-1992',
      },
      records: truth.map((t) => ({
        epoch: new Date(t.epochMs).toISOString(),
        ztd_m: Math.round((t.ztdM + ZTD_NOISE_M * gaussian(noise)) * 1e5) / 1e5,
        ztd_sigma_m: ZTD_NOISE_M,
      })),
    });
    const pwv = await call(
      'GET',
      `/v1/stations/${s.stationId}/precipitable-water?source=demo-truth-plus-noise&from=${new Date(DEMO_START_MS).toISOString()}&to=${new Date(DEMO_START_MS + DEMO_DAYS * 86_400_000).toISOString()}`,
    );
    let sum2 = 0;
    let n = 0;
    pwv.records.forEach((r: { pwv_mm: number | null }, i: number) => {
      if (r.pwv_mm === null) return;
      sum2 += (r.pwv_mm - truth[i]!.pwvMm) ** 2;
      n++;
    });
    process.stdout.write(
      `delays ${s.stationId.padEnd(5)}: ${res.inserted + res.updated + res.unchanged} ZTD records (fingerprint ${res.model_fingerprint}); PWV for ${n}, rms vs truth ${Math.sqrt(sum2 / n).toFixed(2)} mm (4 mm ZTD noise ≈ 0.6 mm PWV)\n`,
    );
  }

  process.stdout.write('\n');
  for (const s of DEMO_NETWORK) {
    // Six hours of 30 s residuals from a known random-walk ZWD (δw) with the station's coordinates.
    const data = generateSyntheticResiduals({
      seed: DEMO_SEEDS[s.stationId]!,
      startIso: new Date(DEMO_START_MS + 3_600_000).toISOString(),
      durationS: 6 * 3600,
      latitudeDeg: s.latitudeDeg,
      longitudeDeg: s.longitudeDeg,
      heightM: s.heightM,
    });
    const { observations } = toRequestBody(data, { latitudeDeg: s.latitudeDeg, longitudeDeg: s.longitudeDeg, heightM: s.heightM });
    // The residuals were formed with this a-priori: ZHD of the met at the start, ZWD 0.
    const startMet = truthSeries(s, DEMO_START_MS + 3_600_000, 1, 1, DEMO_SEEDS[s.stationId])[0]!;
    const aprioriZhdM = Math.round(saastamoinenZhdM(startMet.pressureHpa, s.latitudeDeg, s.heightM) * 1e4) / 1e4;
    const res = await call('POST', `/v1/stations/${s.stationId}/zwd-estimates?source=demo-estimation`, {
      observations,
      apriori: { zhd_m: aprioriZhdM, zwd_m: 0 },
      options: { zwd_interval_s: 900 },
    });
    let sum2 = 0;
    for (const e of res.series) sum2 += (e.correction_m - truthZwdAt(data.truth, Date.parse(e.epoch))) ** 2;
    process.stdout.write(
      `estimation ${s.stationId.padEnd(5)}: ${observations.length} residuals, ${res.series.length} epochs stored (met: ${res.met_used}, fingerprint ${res.model_fingerprint}); ZWD correction rms vs truth ${(Math.sqrt(sum2 / res.series.length) * 1000).toFixed(1)} mm\n`,
    );
  }

  // Invented soundings at 00Z and 12Z (scripts/synthetic/soundings.ts), every other one without humidity above 400 hPa.
  for (const line of await storeDemoSoundings(DEMO_NETWORK, DEMO_START_MS, DEMO_DAYS, DEMO_SEEDS, call)) process.stdout.write(`${line}\n`);

  const base = `http://${config.HOST}:${config.PORT}`;
  const from = new Date(DEMO_START_MS).toISOString();
  const to = new Date(DEMO_START_MS + DEMO_DAYS * 86_400_000).toISOString();
  process.stdout.write(`\nStart the service (npm start) and read:\n`);
  process.stdout.write(`  ${base}/v1/stations\n`);
  for (const s of DEMO_NETWORK) {
    process.stdout.write(`  ${base}/v1/stations/${s.stationId}/precipitable-water?from=${from}&to=${to}&format=csv\n`);
  }
  process.stdout.write(`  ${base}/v1/stations/QUILL/met?from=${from}&to=${to}\n`);
  process.stdout.write(`  ${base}/v1/stations/QUILL/delays?from=${from}&to=${to}   (homogeneous: false: two model sets in 01:00-07:00)\n`);
  process.stdout.write(
    `  ${base}/v1/stations/QUILL/precipitable-water?source=demo-estimation&from=${new Date(DEMO_START_MS + 3_600_000).toISOString()}&to=${new Date(DEMO_START_MS + 7 * 3_600_000).toISOString()}\n`,
  );
} finally {
  await app.close();
}
