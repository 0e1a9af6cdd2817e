/**
 * The station-year reads (stored met, stored delays, station PWV; JSON and CSV) are read in keyset
 * pages and answered in pieces, yielding to the event loop between pages (src/http/streamed-answer.ts).
 * The answer must not change by a byte: the digests below are of the answers of commit 3c3e566, the
 * last one that read and serialised each range in one piece (same seeded data, same requests),
 * recorded before the change. Beside them, the answers are checked against the generator's own rows
 * (the independent truth: counts, order, first and last epochs, values).
 *
 * The data: 14 000 five-minute epochs (48.6 days) of met from two sources (one with a comma in its
 * name, so CSV cells are quoted), a 6-hour met gap, and delays from two model sets, several pages
 * long on every read. Station names are invented.
 */

import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { provenance } from '../../src/domain/provenance.js';
import type { DelayRow, MetRow } from '../../src/storage/repository.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const STATION = { name: 'Brackenfold Weir (invented)', latitude_deg: 46.3, longitude_deg: 7.6, height_m: 612.4, met_height_m: 600.4 };
const T0 = Date.UTC(2026, 0, 10);
const STEP_MS = 300_000;
const N = 14_000;
const GAP = [5000, 5072] as const; // met rows left out: six hours without met (PWV "met-missing" there)
const SOURCE_B = 'mast-b, roof';
const iso = (ms: number) => new Date(ms).toISOString();

function generate() {
  const u = mulberry32(11_2026);
  const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;
  const met: MetRow[] = [];
  let pressureHpa = 948;
  for (let i = 0; i < N; i++) {
    pressureHpa = round(pressureHpa + (u() - 0.5) * 0.4, 2);
    if (i >= GAP[0] && i < GAP[1]) continue;
    const epochMs = T0 + i * STEP_MS;
    const temperatureC = round(-3 + 12 * u(), 2);
    met.push({
      epochMs,
      source: 'mast-a',
      pressureHpa: i % 997 === 0 ? null : pressureHpa,
      temperatureC,
      relativeHumidityPct: round(30 + 69 * u(), 1),
      dewpointC: null,
      vapourPressureHpa: null,
    });
    if (i % 5 === 0) {
      met.push({
        epochMs,
        source: SOURCE_B,
        pressureHpa: round(pressureHpa + 0.3, 2),
        temperatureC: round(temperatureC - 0.4, 2),
        relativeHumidityPct: null,
        dewpointC: round(temperatureC - 6, 2),
        vapourPressureHpa: null,
      });
    }
  }
  const sets = [provenance({ mapping: 'niell', cutoff_deg: 7 }), provenance({ mapping: 'vmf1', cutoff_deg: 10 })];
  const delays: DelayRow[][] = [[], []];
  for (let i = 0; i < N; i++) {
    const set = i < 9000 ? 0 : 1;
    delays[set]!.push({
      epochMs: T0 + i * STEP_MS,
      source: 'solution-q',
      ztdM: round(2.18 + 0.2 * u(), 5),
      ztdSigmaM: i % 211 === 0 ? null : i % 307 === 0 ? 0.02 : round(0.003 + 0.002 * u(), 5),
      zwdM: null,
      zwdSigmaM: null,
      northGradientM: round((u() - 0.5) * 0.002, 6),
      eastGradientM: null,
      northGradientSigmaM: null,
      eastGradientSigmaM: null,
      modelFingerprint: sets[set]!.model_fingerprint,
    });
  }
  return { met, delays, sets };
}

/**
 * sha256 of each answer of commit 3c3e566 (read and serialised in one piece), from this file's data
 * and requests; content type and fingerprint headers are compared separately.
 */
const DIGESTS_BEFORE_PAGING: Record<string, string> = {
  'met json': 'ed934a190a7b8cd89d8febbb53bae66c50de61ff2c0895d65db9d48ce205f579',
  'met csv': '540fa8bb020f327de82907783c5a22111ae927ea800c51549feb38f781680d53',
  'met json of one source': '8345b7b12aea2662f8e855edd0636ed3fdd94e9c68691e2f61daced9ec55e27a',
  'delays json': '845a194186c766dfc662a4f53e990af0b9b1a261397f45fcfe57909253491179',
  'delays csv': '17d406f2d1a6a9db6cdcac19bd81afc3e68c47f04701d206e26d76df7fcc7cfb',
  // Re-recorded after merging issue 10's `pwv_sigma_budget` (the models entry renamed, hence the fingerprint): a
  // diff against the paged answer before that merge showed those two values as the only difference.
  'pwv json': '91b6439019366279a36e517cf55b3409a06dac6733ae5ccbeb6ccdacfffc0195',
  // Re-recorded after the `warnings` column was appended (issue 13): the answer with its last column cut off
  // still gives the digest of before, 2fd6e581193968f697d955606dfc4103bbc34841a596a0003a78e3f50d474596.
  'pwv csv': 'c1a4b448a0dda30653cf33218946a34d411f8f4b51cdc043cb7bbadb6de88eef',
};

const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

for (const backend of BACKENDS) {
  describe(`station-year reads in pages give the same bytes as one piece (${backend.name})`, () => {
    const { api, app, auth } = useArchiveApp(backend);
    const data = generate();
    const range = { from: iso(T0), to: iso(T0 + N * STEP_MS) };
    let ready: Promise<void> | undefined;
    const seed = () =>
      (ready ??= (async () => {
        await api().put('/v1/stations/BRW-1').set('authorization', auth).send(STATION).expect(201);
        const repo = app().repository;
        await repo.writeMet('BRW-1', data.met);
        for (let s = 0; s < 2; s++)
          await repo.writeDelays('BRW-1', data.delays[s]!, {
            modelFingerprint: data.sets[s]!.model_fingerprint,
            models: data.sets[s]!.models,
          });
      })());

    const READS: { name: string; path: string; query: Record<string, string> }[] = [
      { name: 'met json', path: 'met', query: {} },
      { name: 'met csv', path: 'met', query: { format: 'csv' } },
      { name: 'met json of one source', path: 'met', query: { source: 'mast-a' } },
      { name: 'delays json', path: 'delays', query: {} },
      { name: 'delays csv', path: 'delays', query: { format: 'csv' } },
      { name: 'pwv json', path: 'precipitable-water', query: {} },
      { name: 'pwv csv', path: 'precipitable-water', query: { format: 'csv' } },
    ];

    for (const read of READS) {
      it(`${read.name}: the bytes of the one-piece answer`, async () => {
        await seed();
        const res = await api()
          .get(`/v1/stations/BRW-1/${read.path}`)
          .query({ ...range, ...read.query })
          .buffer(true)
          .parse((r, done) => {
            const chunks: Buffer[] = [];
            r.on('data', (c: Buffer) => chunks.push(c));
            r.on('end', () => done(null, Buffer.concat(chunks).toString('utf8')));
          })
          .expect(200);
        const text = res.body as string;
        const isCsv = read.query.format === 'csv';
        expect(res.headers['content-type']).toBe(isCsv ? 'text/csv; charset=utf-8' : 'application/json; charset=utf-8');
        if (read.path !== 'met' && isCsv) {
          expect(res.headers['x-homogeneous']).toBe('false');
          expect(res.headers['x-model-fingerprints']).toBe(data.sets.map((s) => s.model_fingerprint).join(','));
          expect(res.headers['x-model-fingerprint-count']).toBe('2');
        }
        // Against the generator (independent of the service): row counts, order, first and last epochs.
        const metRows = read.query.source ? data.met.filter((r) => r.source === read.query.source) : data.met;
        const expectedRows = read.path === 'met' ? metRows.length : N;
        const firstEpoch = iso(T0);
        const lastEpoch = iso((read.path === 'met' ? metRows.at(-1)! : data.delays[1]!.at(-1)!).epochMs);
        if (isCsv) {
          const lines = text.split('\n');
          expect(lines.length).toBe(expectedRows + 2); // header, rows, the empty string after the last newline
          expect(lines.at(-1)).toBe('');
          expect(lines[1]!.startsWith(firstEpoch)).toBe(true);
          expect(lines.at(-2)!.startsWith(lastEpoch)).toBe(true);
          if (read.path === 'met' && !read.query.source) expect(lines[2]!.startsWith(`${firstEpoch},"${SOURCE_B}",`)).toBe(true); // quoted
        } else {
          const body = JSON.parse(text) as { records: { epoch: string; source: string }[] };
          expect(body.records).toHaveLength(expectedRows);
          expect(body.records[0]!.epoch).toBe(firstEpoch);
          expect(body.records.at(-1)!.epoch).toBe(lastEpoch);
          if (read.path === 'met' && !read.query.source)
            expect(body.records.slice(0, 2).map((r) => r.source)).toEqual(['mast-a', SOURCE_B]); // epoch, then source
        }
        const digest = sha256(text);
        if (process.env.RECORD_DIGESTS) console.log(`DIGEST ${JSON.stringify(read.name)}: '${digest}',`);
        else expect(digest, `sha256 of the ${read.name} answer (${text.length} characters)`).toBe(DIGESTS_BEFORE_PAGING[read.name]);
      }, 120_000);
    }
  });
}
