/**
 * Writer of RINEX meteorological observation files, versions 2.11 and 3.04, in the layout of the
 * published format description (see rinex-met.ts for the source and the field formats). Used by the
 * demo and the tests to produce files in the published format; epochs are given in UTC and written
 * in GPS time, as the format asks.
 *
 * Pure: values in, text out.
 */

import { utcToGpsMs } from '../domain/time-scales.js';

export interface RinexMetWriterInput {
  version: '2.11' | '3.04';
  markerName: string;
  markerNumber?: string;
  program: string;
  runBy: string;
  /** Creation time written in "PGM / RUN BY / DATE" [Date]. */
  createdAt: Date;
  comments?: string[];
  observationTypes: string[];
  sensors?: { model: string; type: string; accuracy: number; observationType: string; xyzM?: [number, number, number]; heightM?: number }[];
  /** Epoch in UTC [ms] and one value per observation type (null = blank). */
  records: { epochMs: number; values: (number | null)[] }[];
}

const headerLine = (content: string, label: string) => `${content.slice(0, 60).padEnd(60)}${label.padEnd(20)}`;
const f = (v: number, width: number, decimals: number) => v.toFixed(decimals).padStart(width).slice(-width);
const i2 = (v: number) => String(v).padStart(2);
const two = (v: number) => String(v).padStart(2, '0');

export function writeRinexMet(input: RinexMetWriterInput): string {
  const major = Number(input.version) < 3 ? 2 : 3;
  const out: string[] = [];
  out.push(headerLine(`${input.version.padStart(9)}${' '.repeat(11)}METEOROLOGICAL DATA`, 'RINEX VERSION / TYPE'));
  const c = input.createdAt;
  const date =
    major === 2
      ? `${two(c.getUTCDate())}-${['JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC'][c.getUTCMonth()]}-${two(c.getUTCFullYear() % 100)} ${two(c.getUTCHours())}:${two(c.getUTCMinutes())}`
      : `${c.getUTCFullYear()}${two(c.getUTCMonth() + 1)}${two(c.getUTCDate())} ${two(c.getUTCHours())}${two(c.getUTCMinutes())}${two(c.getUTCSeconds())} UTC`;
  out.push(
    headerLine(`${input.program.padEnd(20).slice(0, 20)}${input.runBy.padEnd(20).slice(0, 20)}${date.padEnd(20)}`, 'PGM / RUN BY / DATE'),
  );
  for (const comment of input.comments ?? []) out.push(headerLine(comment, 'COMMENT'));
  out.push(headerLine(input.markerName, 'MARKER NAME'));
  if (input.markerNumber) out.push(headerLine(input.markerNumber, 'MARKER NUMBER'));
  const types = input.observationTypes;
  for (let k = 0; k < Math.max(1, Math.ceil(types.length / 9)); k++) {
    const chunk = types
      .slice(9 * k, 9 * k + 9)
      .map((t) => `    ${t.padEnd(2)}`)
      .join('');
    out.push(headerLine(`${k === 0 ? String(types.length).padStart(6) : ' '.repeat(6)}${chunk}`, '# / TYPES OF OBSERV'));
  }
  for (const s of input.sensors ?? []) {
    out.push(
      headerLine(
        `${s.model.padEnd(20).slice(0, 20)}${s.type.padEnd(20).slice(0, 20)}${' '.repeat(6)}${f(s.accuracy, 7, 1)}    ${s.observationType.padEnd(2)} `,
        'SENSOR MOD/TYPE/ACC',
      ),
    );
  }
  for (const s of input.sensors ?? []) {
    if (!s.xyzM) continue;
    out.push(
      headerLine(
        `${s.xyzM.map((v) => f(v, 14, 4)).join('')}${f(s.heightM ?? 0, 14, 4)} ${s.observationType.padEnd(2)} `,
        'SENSOR POS XYZ/H',
      ),
    );
  }
  out.push(headerLine('', 'END OF HEADER'));

  for (const r of input.records) {
    const g = new Date(utcToGpsMs(r.epochMs));
    const epoch =
      major === 2
        ? ` ${two(g.getUTCFullYear() % 100)} ${i2(g.getUTCMonth() + 1)} ${i2(g.getUTCDate())} ${i2(g.getUTCHours())} ${i2(g.getUTCMinutes())} ${i2(g.getUTCSeconds())}`
        : ` ${g.getUTCFullYear()} ${i2(g.getUTCMonth() + 1)} ${i2(g.getUTCDate())} ${i2(g.getUTCHours())} ${i2(g.getUTCMinutes())} ${i2(g.getUTCSeconds())}`;
    const cell = (v: number | null | undefined) => (v === null || v === undefined ? ' '.repeat(7) : f(v, 7, 1));
    out.push((epoch + r.values.slice(0, 8).map(cell).join('')).trimEnd());
    for (let k = 8; k < r.values.length; k += 10)
      out.push(
        (
          '    ' +
          r.values
            .slice(k, k + 10)
            .map(cell)
            .join('')
        ).trimEnd(),
      );
  }
  return out.join('\n') + '\n';
}
