/**
 * `npm run demo`: loads an invented demo network into the station archive and shows where to read
 * it. Forty stations across Europe (scripts/synthetic/network.ts DEMO_NETWORK): ids, names, heights
 * and all values are invented; the coordinates are hand-picked points on land where no station stands.
 * Every series of a station comes from that station's one known truth
 * (scripts/synthetic/demo-archive.ts), so deposits and estimation agree within their σ:
 *
 *  1. creates the stations;
 *  2. stores three days of hourly met per station: QUILL, BRACK, SALTM from fixtures/demo/ (JSON,
 *     CSV, RINEX met 2.11 and 3.04; written first if missing), the others as JSON;
 *  3. deposits a 15-minute ZTD series per station: the true ZTD plus 4 mm of white noise (seeded),
 *     and reads the PWV back against the true PWV;
 *  4. runs the ZWD estimation per station on six hours of 30 s residuals made from the same truth,
 *     and stores it as a second delay series (the first six hours then mix two model sets: the
 *     retrieval says so), and reports how often the two PWV series agree within 2σ;
 *  5. stores invented soundings of QUILL, BRACK and SALTM (00Z and 12Z, from the same truth) and prints the
 *     GNSS − sounding statistics the service computes;
 *  6. prints the URLs, the page first.
 *
 * It works on the storage the service uses (TROPO_DATA_DIR, default ./data, or DATABASE_URL), in
 * process, with the configured or generated bearer key; start the service afterwards with
 * `npm start` and open the page. Running it again changes nothing (the writes are idempotent).
 */

import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadConfig } from '../src/config.js';
import { archiveOptionsFromConfig, buildApp } from '../src/http/app.js';
import { ADMIN_KEY_FILE_NAME } from '../src/http/access/first-admin-key.js';
import { DEMO_DAYS, DEMO_START_MS, FIXTURE_DIR, writeDemoFixtures } from './generate-fixtures.js';
import {
  DEMO_DEPOSIT_SOURCE,
  DEMO_ESTIMATION_SOURCE,
  agreementWithin2Sigma,
  depositDemoDelays,
  estimateDemoZwd,
  postDemoMet,
  putDemoStation,
  readPwv,
} from './synthetic/demo-archive.js';
import { DEMO_NETWORK } from './synthetic/network.js';
import { storeDemoSoundings } from './synthetic/soundings.js';

const HOUR_MS = 3_600_000;
/** The estimation window: six hours from 01:00 on the first day. */
const ESTIMATION_START_MS = DEMO_START_MS + HOUR_MS;
const ESTIMATION_HOURS = 6;
const FIXTURE_STATIONS = new Set(['QUILL', 'BRACK', 'SALTM']);

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
const out = (line: string) => process.stdout.write(`${line}\n`);

try {
  if (!existsSync(new URL('SALTM-met-day3.rnx', FIXTURE_DIR))) writeDemoFixtures();
  const fixture = (name: string) => readFileSync(new URL(name, FIXTURE_DIR), 'utf8');
  out(
    `tropodelay demo: ${DEMO_NETWORK.length} invented stations (invented names and values; coordinates are points on land), synthetic data from a known truth\n`,
  );

  for (const s of DEMO_NETWORK) await putDemoStation(call, s);

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
    out(
      `met ${id.padEnd(5)} as ${form.padEnd(10)}: ${r.inserted} inserted, ${r.updated} updated, ${r.unchanged} unchanged, ${r.rejected_count} rejected`,
    );
  }
  let metStored = 0;
  for (const s of DEMO_NETWORK.filter((x) => !FIXTURE_STATIONS.has(x.stationId))) {
    const r = await postDemoMet(call, s, DEMO_START_MS, DEMO_DAYS);
    metStored += r.inserted + r.updated + r.unchanged;
  }
  out(`met of the other ${DEMO_NETWORK.length - FIXTURE_STATIONS.size} stations as JSON: ${metStored} records`);

  const endMs = DEMO_START_MS + DEMO_DAYS * 86_400_000;
  let depositRms2 = 0;
  let depositN = 0;
  for (const s of DEMO_NETWORK) {
    const { truth } = await depositDemoDelays(call, s, DEMO_START_MS, DEMO_DAYS);
    const trueByEpoch = new Map(truth.map((t) => [new Date(t.epochMs).toISOString(), t.pwvMm]));
    for (const [epoch, r] of await readPwv(call, s.stationId, DEMO_DEPOSIT_SOURCE, DEMO_START_MS, endMs)) {
      if (r.pwv_mm === null) continue;
      depositRms2 += (r.pwv_mm - trueByEpoch.get(epoch)!) ** 2;
      depositN++;
    }
  }
  out(
    `delays: ${DEMO_NETWORK.length} stations x ${DEMO_DAYS * 96 - 4} ZTD records every 15 min; PWV for ${depositN}, rms vs truth ${Math.sqrt(depositRms2 / depositN).toFixed(2)} mm (4 mm ZTD noise ≈ 0.6 mm PWV)`,
  );

  let common = 0;
  let within = 0;
  let zwdRms2 = 0;
  for (const s of DEMO_NETWORK) {
    const { rmsM } = await estimateDemoZwd(call, s, ESTIMATION_START_MS, ESTIMATION_HOURS);
    zwdRms2 += rmsM ** 2;
    const windowEnd = ESTIMATION_START_MS + ESTIMATION_HOURS * HOUR_MS;
    const a = await readPwv(call, s.stationId, DEMO_ESTIMATION_SOURCE, ESTIMATION_START_MS, windowEnd);
    const b = await readPwv(call, s.stationId, DEMO_DEPOSIT_SOURCE, ESTIMATION_START_MS, windowEnd);
    const agreement = agreementWithin2Sigma(a, b);
    common += agreement.common;
    within += agreement.within;
  }
  out(
    `estimation: ${DEMO_NETWORK.length} stations x ${ESTIMATION_HOURS} h of 30 s residuals from each station's truth; ZWD correction rms vs truth ${(Math.sqrt(zwdRms2 / DEMO_NETWORK.length) * 1000).toFixed(1)} mm; ` +
      `estimated and deposited PWV agree within 2σ at ${within} of ${common} common epochs (${((100 * within) / common).toFixed(1)} %)`,
  );

  // Invented soundings at 00Z and 12Z of QUILL, BRACK and SALTM (scripts/synthetic/soundings.ts), each from its
  // station's truth; every other one without humidity above 400 hPa.
  const soundingStations = DEMO_NETWORK.filter((s) => FIXTURE_STATIONS.has(s.stationId));
  const seeds = Object.fromEntries(soundingStations.map((s) => [s.stationId, s.seed ?? 1]));
  for (const line of await storeDemoSoundings(soundingStations, DEMO_START_MS, DEMO_DAYS, seeds, call)) out(line);

  const base = `http://${config.HOST}:${config.PORT}`;
  const from = new Date(DEMO_START_MS).toISOString();
  const to = new Date(endMs).toISOString();
  out(`\nStart the service (npm start) and open the page:\n  ${base}/\nor read:`);
  out(`  ${base}/v1/stations`);
  out(`  ${base}/v1/network/precipitable-water?epoch=${new Date(DEMO_START_MS + 36 * HOUR_MS).toISOString()}&interval=PT1H`);
  out(`  ${base}/v1/stations/QUILL/precipitable-water?from=${from}&to=${to}&format=csv`);
  out(`  ${base}/v1/stations/QUILL/met?from=${from}&to=${to}`);
  out(`  ${base}/v1/stations/QUILL/delays?from=${from}&to=${to}   (homogeneous: false: two model sets in 01:00-07:00)`);
  out(
    `  ${base}/v1/stations/QUILL/precipitable-water?source=${DEMO_ESTIMATION_SOURCE}&from=${new Date(ESTIMATION_START_MS).toISOString()}&to=${new Date(ESTIMATION_START_MS + ESTIMATION_HOURS * HOUR_MS).toISOString()}`,
  );
} finally {
  await app.close();
}
