/**
 * Turning a series upload into rows: JSON records checked one by one against their schema, a CSV
 * table (src/formats/met-csv.ts) or a RINEX meteorological file (src/formats/rinex-met.ts). Bad
 * records are listed by index or line and left out; a body that is not what its content type
 * claims is a 400 and nothing of it is stored.
 */

import type { z } from 'zod';
import { RecordLimitError } from '../../formats/format-error.js';
import { CsvFormatError, parseMetCsv } from '../../formats/met-csv.js';
import { looksLikeRinexMet, parseRinexMet, RinexFormatError } from '../../formats/rinex-met.js';
import { provenance } from '../../domain/provenance.js';
import type { DelayRow, MetRow } from '../../storage/repository.js';
import { delayRecordSchema, type delayDepositEnvelope } from '../schemas/delays.js';
import { HttpProblem } from '../problem.js';
import { issuesToFieldErrors } from '../field-errors.js';
import { MAX_REJECTED_LISTED, metRecordSchema } from '../schemas/met.js';
import { SOURCE_PATTERN } from '../schemas/stations.js';

export interface Rejected {
  index?: number;
  line?: number;
  reason: string;
}

export function issueText(prefix: string, error: z.ZodError): string {
  return issuesToFieldErrors(error.issues)
    .map((e) => `${[prefix, e.field === 'body' ? '' : e.field].filter(Boolean).join('.')}: ${e.message}`)
    .join('; ');
}

/** Keeps the first record of each (epoch, source); later ones are rejected. */
export function dropDuplicateEpochs<T extends { epochMs: number; source?: string }>(
  items: { where: { index?: number; line?: number }; row: T }[],
  rejected: Rejected[],
): T[] {
  const seen = new Map<string, string>();
  const out: T[] = [];
  for (const { where, row } of items) {
    const key = `${row.epochMs} ${row.source ?? ''}`;
    const first = seen.get(key);
    if (first !== undefined) {
      rejected.push({
        ...where,
        reason: `epoch ${new Date(row.epochMs).toISOString()}${row.source === undefined ? '' : ` of source "${row.source}"`} appears twice in this upload (first at ${first}); the first is kept`,
      });
      continue;
    }
    seen.set(key, where.index !== undefined ? `index ${where.index}` : `line ${where.line}`);
    out.push(row);
  }
  return out;
}

export function listRejected(rejected: Rejected[]): { rejected: Rejected[]; rejected_count: number } {
  const sorted = [...rejected].sort((a, b) => (a.index ?? a.line ?? 0) - (b.index ?? b.line ?? 0));
  return { rejected: sorted.slice(0, MAX_REJECTED_LISTED), rejected_count: rejected.length };
}

/** Nothing usable: a 400 listing the first problems. */
export function nothingUsable(rejected: Rejected[]): HttpProblem {
  const first = [...rejected].sort((a, b) => (a.index ?? a.line ?? 0) - (b.index ?? b.line ?? 0)).slice(0, 100);
  return new HttpProblem(
    400,
    `none of the ${rejected.length} records can be stored; first: ${first[0] ? first[0].reason : 'no records'}`,
    first.map((r) => ({ field: r.index !== undefined ? `records.${r.index}` : `line ${r.line}`, message: r.reason })),
  );
}

export interface MetUpload {
  format: 'json' | 'csv' | 'rinex-met';
  rows: MetRow[];
  rejected: Rejected[];
  warnings: string[];
  rinex?: { version: string; marker_name: string | null; observation_types: string[]; ignored_values: Record<string, number> };
}

const toRow = (epochMs: number, source: string, r: z.infer<typeof metRecordSchema>): MetRow => ({
  epochMs,
  source,
  pressureHpa: r.pressure_hpa ?? null,
  temperatureC: r.temperature_c ?? null,
  relativeHumidityPct: r.relative_humidity_pct ?? null,
  dewpointC: r.dewpoint_c ?? null,
  vapourPressureHpa: r.vapour_pressure_hpa ?? null,
});

/** More records than an upload holds: a 413 naming the limit (the reader stopped at the first one past it). */
const tooManyRecords = (err: RecordLimitError) =>
  new HttpProblem(413, err.message, [
    { field: 'body', message: `at most ${err.limit} records per upload; record ${err.limit + 1} is at line ${err.line}` },
  ]);

export function readMetUpload(body: unknown, contentType: string, source: string): MetUpload {
  const rejected: Rejected[] = [];
  if (typeof body !== 'string') {
    const records = (body as { records: unknown[] }).records;
    const items: { where: { index: number }; row: MetRow }[] = [];
    records.forEach((record, index) => {
      const parsed = metRecordSchema.safeParse(record);
      if (!parsed.success) rejected.push({ index, reason: issueText(`records.${index}`, parsed.error) });
      else items.push({ where: { index }, row: toRow(Date.parse(parsed.data.epoch), source, parsed.data) });
    });
    return { format: 'json', rows: dropDuplicateEpochs(items, rejected), rejected, warnings: [] };
  }

  if (contentType.startsWith('text/csv')) {
    let table;
    try {
      table = parseMetCsv(body);
    } catch (err) {
      if (err instanceof CsvFormatError)
        throw new HttpProblem(400, `the body is not a met CSV table: ${err.message}`, [{ field: 'body', message: err.message }]);
      if (err instanceof RecordLimitError) throw tooManyRecords(err);
      throw err;
    }
    rejected.push(...table.problems);
    const items: { where: { line: number }; row: MetRow }[] = [];
    for (const { line, values } of table.rows) {
      // A `source` cell (as GET .../met?format=csv writes it) names the row's producer; empty: the upload's source.
      const { source: cellSource, ...record } = values;
      if (cellSource !== undefined && (typeof cellSource !== 'string' || !SOURCE_PATTERN.test(cellSource))) {
        rejected.push({ line, reason: `source: must be 1-64 characters of letters, digits and . _ : @ / - (got "${cellSource}")` });
        continue;
      }
      const parsed = metRecordSchema.safeParse(record);
      if (!parsed.success) rejected.push({ line, reason: issueText('', parsed.error) });
      else items.push({ where: { line }, row: toRow(Date.parse(parsed.data.epoch), cellSource ?? source, parsed.data) });
    }
    return { format: 'csv', rows: dropDuplicateEpochs(items, rejected), rejected, warnings: [] };
  }

  // text/plain: a RINEX meteorological file, recognised by its header.
  if (!looksLikeRinexMet(body)) {
    throw new HttpProblem(
      400,
      'a text/plain body must be a RINEX meteorological file (first line: version, type "M" in column 21, label "RINEX VERSION / TYPE" in columns 61-80); send CSV as text/csv and records as application/json',
      [{ field: 'body', message: 'not a RINEX meteorological file' }],
    );
  }
  let file;
  try {
    file = parseRinexMet(body);
  } catch (err) {
    if (err instanceof RinexFormatError)
      throw new HttpProblem(400, err.message, [{ field: `body line ${err.line}`, message: err.message }]);
    if (err instanceof RecordLimitError) throw tooManyRecords(err);
    throw err;
  }
  rejected.push(...file.rejected);
  const items = file.records.map((r) => ({
    where: { line: r.line },
    row: {
      epochMs: r.epochMs,
      source,
      pressureHpa: r.pressureHpa,
      temperatureC: r.temperatureC,
      relativeHumidityPct: r.relativeHumidityPct,
      dewpointC: null,
      vapourPressureHpa: null,
    },
  }));
  const warnings: string[] = ['RINEX met epochs are GPS time; they were converted to UTC (GPS − UTC leap seconds)'];
  const ignored = Object.entries(file.ignoredValues);
  if (ignored.length) {
    warnings.push(`observation types other than PR, TD, HR are not stored: ${ignored.map(([t, n]) => `${t} (${n} values)`).join(', ')}`);
  }
  return {
    format: 'rinex-met',
    rows: dropDuplicateEpochs(items, rejected),
    rejected,
    warnings,
    rinex: {
      version: file.version,
      marker_name: file.markerName,
      observation_types: file.observationTypes,
      ignored_values: file.ignoredValues,
    },
  };
}

/** Key under which a deposit's `source` enters its model set. */
export const DEPOSIT_SOURCE_KEY = 'deposited_by';

export interface DelayDeposit {
  source: string;
  /** The deposit's model set: its `models` plus `deposited_by: source`, and their fingerprint. */
  set: ReturnType<typeof provenance>;
  /** The good records (the first of each epoch), with the set's fingerprint. */
  rows: DelayRow[];
  rejected: Rejected[];
}

/** A delay deposit whose envelope has been checked: every record checked on its own. */
export function readDelayDeposit(body: z.output<typeof delayDepositEnvelope>): DelayDeposit {
  const { records, source, models } = body;
  const set = provenance({ ...(models ?? {}), [DEPOSIT_SOURCE_KEY]: source });
  const rejected: Rejected[] = [];
  const items: { where: { index: number }; row: DelayRow }[] = [];
  records.forEach((record, index) => {
    const parsed = delayRecordSchema.safeParse(record);
    if (!parsed.success) {
      rejected.push({ index, reason: issueText(`records.${index}`, parsed.error) });
      return;
    }
    const r = parsed.data;
    items.push({
      where: { index },
      row: {
        epochMs: Date.parse(r.epoch),
        source,
        ztdM: r.ztd_m,
        ztdSigmaM: r.ztd_sigma_m ?? null,
        zwdM: r.zwd_m ?? null,
        zwdSigmaM: r.zwd_sigma_m ?? null,
        northGradientM: r.north_gradient_m ?? null,
        eastGradientM: r.east_gradient_m ?? null,
        northGradientSigmaM: r.north_gradient_sigma_m ?? null,
        eastGradientSigmaM: r.east_gradient_sigma_m ?? null,
        modelFingerprint: set.model_fingerprint,
      },
    });
  });
  return { source, set, rows: dropDuplicateEpochs(items, rejected), rejected };
}
