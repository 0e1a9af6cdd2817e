/**
 * Writes the demo network's met files to fixtures/demo/ from the synthetic generator
 * (scripts/synthetic/network.ts, known truth, fixed seeds): three days of hourly met per station,
 * one station as JSON, one as CSV, one as RINEX meteorological files (2.11 for the first two days,
 * 3.04 for the third). The stations and places are invented. `npm run fixtures` rewrites them; the
 * files are small and committed.
 */

import { mkdirSync, writeFileSync } from 'node:fs';
import { writeRinexMet } from '../src/formats/rinex-met-writer.js';
import { DEMO_NETWORK, round1, truthSeries } from './synthetic/network.js';

export const DEMO_START_MS = Date.UTC(2026, 2, 1);
export const DEMO_DAYS = 3;
const HOUR = 3_600_000;
export const DEMO_SEEDS: Record<string, number> = { QUILL: 11, BRACK: 12, SALTM: 13 };
export const FIXTURE_DIR = new URL('../fixtures/demo/', import.meta.url);

export function demoMet(stationId: string) {
  const station = DEMO_NETWORK.find((s) => s.stationId === stationId)!;
  return truthSeries(station, DEMO_START_MS, DEMO_DAYS * 24, HOUR, DEMO_SEEDS[stationId]);
}

export function writeDemoFixtures(): string[] {
  mkdirSync(FIXTURE_DIR, { recursive: true });
  const written: string[] = [];
  const write = (name: string, text: string) => {
    writeFileSync(new URL(name, FIXTURE_DIR), text);
    written.push(`fixtures/demo/${name}`);
  };

  const quill = demoMet('QUILL');
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

  const brack = demoMet('BRACK');
  write(
    'BRACK-met.csv',
    ['epoch,pressure_hpa,temperature_c,relative_humidity_pct', ...brack.map((t) => `${new Date(t.epochMs).toISOString()},${round1(t.pressureHpa)},${round1(t.temperatureC)},${round1(t.relativeHumidityPct)}`)].join('\n') + '\n',
  );

  const salt = demoMet('SALTM');
  const common = {
    markerName: 'SALTM',
    program: 'tropodelay-demo',
    runBy: 'synthetic',
    createdAt: new Date(DEMO_START_MS),
    comments: ['INVENTED DEMO STATION; SYNTHETIC DATA WITH A KNOWN TRUTH'],
    observationTypes: ['PR', 'TD', 'HR'],
    sensors: [
      { model: 'DEMO-BARO', type: 'SYNTHETIC', accuracy: 0.1, observationType: 'PR' },
      { model: 'DEMO-THERMO', type: 'SYNTHETIC', accuracy: 0.1, observationType: 'TD' },
      { model: 'DEMO-HYGRO', type: 'SYNTHETIC', accuracy: 1.0, observationType: 'HR' },
    ],
  };
  const rec = (t: (typeof salt)[number]) => ({ epochMs: t.epochMs, values: [round1(t.pressureHpa), round1(t.temperatureC), round1(t.relativeHumidityPct)] });
  write('SALTM-met-days1-2.26m', writeRinexMet({ ...common, version: '2.11', records: salt.slice(0, 48).map(rec) }));
  write('SALTM-met-day3.rnx', writeRinexMet({ ...common, version: '3.04', records: salt.slice(48).map(rec) }));
  return written;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const f of writeDemoFixtures()) process.stdout.write(`wrote ${f}\n`);
}
