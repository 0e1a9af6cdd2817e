/**
 * Writes the demo network's met files to fixtures/demo/ from the synthetic generator
 * (scripts/synthetic/network.ts, known truth, fixed seeds): three days of hourly met per station,
 * one station as JSON, one as CSV, one as RINEX meteorological files (2.11 for the first two days,
 * 3.04 for the third). The stations and places are invented. `npm run fixtures` rewrites them; the
 * files are small and committed.
 */

import { mkdirSync, writeFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { writeRinexMet } from '../src/formats/rinex-met-writer.js';
import { type CliSpec, epochOption, runCli } from './cli.js';
import { DEMO_NETWORK, round1, truthSeries } from './synthetic/network.js';

export const DEMO_START_MS = Date.UTC(2026, 2, 1);
export const DEMO_DAYS = 3;
const HOUR = 3_600_000;
export const DEMO_SEEDS: Record<string, number> = { QUILL: 11, BRACK: 12, SALTM: 13 };
export const FIXTURE_DIR = new URL('../fixtures/demo/', import.meta.url);

export function demoMet(stationId: string, startMs = DEMO_START_MS) {
  const station = DEMO_NETWORK.find((s) => s.stationId === stationId)!;
  return truthSeries(station, startMs, DEMO_DAYS * 24, HOUR, DEMO_SEEDS[stationId]);
}

/**
 * Writes the four demo files. Defaults: the committed fixtures (start DEMO_START_MS, folder
 * fixtures/demo/); another start or folder gives the same network and seeds shifted in time.
 */
export function writeDemoFixtures(startMs = DEMO_START_MS, dir: URL = FIXTURE_DIR, shownDir = 'fixtures/demo/'): string[] {
  mkdirSync(dir, { recursive: true });
  const written: string[] = [];
  const write = (name: string, text: string) => {
    writeFileSync(new URL(name, dir), text);
    written.push(`${shownDir}${name}`);
  };

  const quill = demoMet('QUILL', startMs);
  write(
    'QUILL-met.json',
    JSON.stringify(
      {
        source: 'quill-mast',
        records: quill.map((t) => ({
          epoch: new Date(t.epochMs).toISOString(),
          pressure_hpa: round1(t.pressureHpa),
          temperature_c: round1(t.temperatureC),
          relative_humidity_pct: round1(t.relativeHumidityPct),
        })),
      },
      null,
      1,
    ) + '\n',
  );

  const brack = demoMet('BRACK', startMs);
  write(
    'BRACK-met.csv',
    [
      'epoch,pressure_hpa,temperature_c,relative_humidity_pct',
      ...brack.map(
        (t) => `${new Date(t.epochMs).toISOString()},${round1(t.pressureHpa)},${round1(t.temperatureC)},${round1(t.relativeHumidityPct)}`,
      ),
    ].join('\n') + '\n',
  );

  const salt = demoMet('SALTM', startMs);
  const common = {
    markerName: 'SALTM',
    program: 'tropodelay-demo',
    runBy: 'synthetic',
    createdAt: new Date(startMs),
    comments: ['INVENTED DEMO STATION; SYNTHETIC DATA WITH A KNOWN TRUTH'],
    observationTypes: ['PR', 'TD', 'HR'],
    sensors: [
      { model: 'DEMO-BARO', type: 'SYNTHETIC', accuracy: 0.1, observationType: 'PR' },
      { model: 'DEMO-THERMO', type: 'SYNTHETIC', accuracy: 0.1, observationType: 'TD' },
      { model: 'DEMO-HYGRO', type: 'SYNTHETIC', accuracy: 1.0, observationType: 'HR' },
    ],
  };
  const rec = (t: (typeof salt)[number]) => ({
    epochMs: t.epochMs,
    values: [round1(t.pressureHpa), round1(t.temperatureC), round1(t.relativeHumidityPct)],
  });
  write('SALTM-met-days1-2.26m', writeRinexMet({ ...common, version: '2.11', records: salt.slice(0, 48).map(rec) }));
  write('SALTM-met-day3.rnx', writeRinexMet({ ...common, version: '3.04', records: salt.slice(48).map(rec) }));
  return written;
}

export const FIXTURES_CLI: CliSpec = {
  command: 'npx tsx scripts/generate-fixtures.ts',
  summary:
    `Writes the invented demo network's met files (${DEMO_DAYS} days of hourly met per station: QUILL as JSON, BRACK as CSV,\n` +
    'SALTM as RINEX met 2.11 and 3.04) from the seeded generator. `npm run fixtures` rewrites the committed ones.',
  options: {
    start: {
      type: 'string',
      value: 'EPOCH',
      description: 'first epoch, ISO 8601 with a zone',
      default: new Date(DEMO_START_MS).toISOString(),
    },
    out: { type: 'string', value: 'FOLDER', description: 'folder to write the four files into (created)', default: 'fixtures/demo/' },
  },
  examples: ['npx tsx scripts/generate-fixtures.ts --start 2026-07-10T00:00:00Z --out demo-met/'],
};

if (import.meta.url === `file://${process.argv[1]}`) {
  runCli(FIXTURES_CLI, (values) => {
    const out = String(values.out).endsWith('/') ? String(values.out) : `${String(values.out)}/`;
    const dir = out === 'fixtures/demo/' ? FIXTURE_DIR : pathToFileURL(out.startsWith('/') ? out : `${process.cwd()}/${out}`);
    for (const f of writeDemoFixtures(epochOption(values, 'start'), dir, out)) process.stdout.write(`wrote ${f}\n`);
  });
}
