/**
 * Uploads a station's met records from a file (CSV, a RINEX meteorological file, or JSON `{records,
 * source?}`: the bodies `POST /v1/stations/{station_id}/met` takes) one UTC day at a time, so that a long
 * file shows progress and an interrupted upload resumes: the resume state (upload-state.ts) remembers the
 * digest of every day the service accepted, and a rerun sends only the days not accepted yet or whose
 * rows changed. The service keeps no list of uploaded met days, so the state file is the record; without
 * it every day is sent again, which stores nothing twice (a re-sent record is counted `unchanged`).
 */

import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import type { Answer } from './api.js';
import { fileLineOf, InputFileError, isRinexMet, partText, splitCsvByDay, splitRinexMetByDay, utcDayOf } from './day-split.js';
import { SILENT, type Progress } from './progress.js';
import { segment, type Service } from './service.js';
import { defaultStatePath, sha256Hex, UploadState } from './upload-state.js';

export type MetAnswer = Answer<'/v1/stations/{station_id}/met', 'post'>;
export type MetFormat = 'csv' | 'rinex-met' | 'json';

export interface MetUploadOptions {
  stationId: string;
  /** Path of the CSV, RINEX met or JSON file. */
  file: string;
  /** Producer name for rows without their own `source` (the route's `?source=`; JSON: the body's `source` wins). */
  source?: string;
  /** Resume state file; default `<file>.tropo-state.json`. */
  statePath?: string;
  /** Send every day even when the state says it was accepted. */
  force?: boolean;
  progress?: Progress;
}

/** A record the service refused, located in the file. */
export interface MetRejection {
  day: string;
  /** 1-based line in the file (CSV, RINEX). */
  line?: number;
  /** Index in the file's `records` (JSON). */
  index?: number;
  reason: string;
}

export interface MetUploadResult {
  stationId: string;
  format: MetFormat;
  statePath: string;
  daysTotal: number;
  daysSent: number;
  /** Days the state file recorded as accepted with the same content. */
  daysSkipped: number;
  inserted: number;
  updated: number;
  unchanged: number;
  rejected: MetRejection[];
  /** The service's warnings, each once. */
  warnings: string[];
}

/** One day ready to send: its body and how to turn the service's line/index back into the file's. */
interface MetDay {
  day: string;
  body: string;
  count: number;
  contentType: string;
  locate(rejected: { line?: number; index?: number }): { line?: number; index?: number };
}

/** Reads `file` and cuts it into days in the format the service will read it as. */
export function metDaysOf(file: string): { format: MetFormat; days: MetDay[] } {
  const text = readFileSync(file, 'utf8');
  const name = basename(file);
  if (/\.json$/i.test(file)) return { format: 'json', days: jsonMetDays(text, name) };
  const rinex = isRinexMet(text);
  const split = rinex ? splitRinexMetByDay(text, name) : splitCsvByDay(text, name, 'keep-with-previous');
  return {
    format: rinex ? 'rinex-met' : 'csv',
    days: split.parts.map((part) => ({
      day: part.day,
      body: partText(split, part),
      count: rinex ? part.lines.filter((l) => /^ (\d{4}|\d{2}) /.test(l)).length : part.lines.length,
      contentType: rinex ? 'text/plain' : 'text/csv',
      locate: (r) => (r.line !== undefined ? { line: fileLineOf(split, part, r.line) } : r),
    })),
  };
}

function jsonMetDays(text: string, name: string): MetDay[] {
  let parsed: { records?: unknown; source?: unknown };
  try {
    parsed = JSON.parse(text) as typeof parsed;
  } catch (err) {
    throw new InputFileError(`${name} is not JSON: ${(err as Error).message}`);
  }
  if (!Array.isArray(parsed.records) || parsed.records.length === 0)
    throw new InputFileError(`${name}: expected {"records": [{"epoch": ..., "pressure_hpa": ...}, ...]} with at least one record`);
  const byDay = new Map<string, number[]>();
  let previous: string | undefined;
  parsed.records.forEach((record: unknown, index) => {
    const epoch = (record as { epoch?: unknown } | null)?.epoch;
    // an unreadable epoch travels with the record before it; the service rejects it with its reason
    const day = (typeof epoch === 'string' ? utcDayOf(epoch) : undefined) ?? previous ?? '0000-00-00';
    previous = day;
    (byDay.get(day) ?? byDay.set(day, []).get(day)!).push(index);
  });
  const records = parsed.records as unknown[];
  return [...byDay.entries()]
    .sort(([a], [b]) => (a < b ? -1 : 1))
    .map(([day, indices]) => ({
      day,
      body: JSON.stringify({ ...(parsed.source !== undefined ? { source: parsed.source } : {}), records: indices.map((i) => records[i]) }),
      count: indices.length,
      contentType: 'application/json',
      locate: (r) => (r.index !== undefined ? { index: indices[r.index] ?? r.index } : r),
    }));
}

/**
 * Uploads the met file day by day (see the module comment); a day the service refuses as a whole (400:
 * not what its content type claims, or no good record) stops the upload with that error, the days before
 * it stay accepted and recorded.
 */
export async function uploadMet(service: Service, options: MetUploadOptions): Promise<MetUploadResult> {
  const { format, days } = metDaysOf(options.file);
  const statePath = options.statePath ?? defaultStatePath(options.file);
  const state = UploadState.load(statePath, 'met');
  const progress = options.progress ?? SILENT;
  const result: MetUploadResult = {
    stationId: options.stationId,
    format,
    statePath,
    daysTotal: days.length,
    daysSent: 0,
    daysSkipped: 0,
    inserted: 0,
    updated: 0,
    unchanged: 0,
    rejected: [],
    warnings: [],
  };
  progress.start(days.length, `met ${options.stationId}`);
  let done = 0;
  try {
    for (const day of days) {
      // the source goes with the body: the same file under another ?source= is another upload
      const bodySha256 = sha256Hex(`source=${options.source ?? ''}\n${day.body}`);
      if (!options.force && state.get(options.stationId, day.day)?.bodySha256 === bodySha256) {
        result.daysSkipped++;
        progress.update(++done, `${day.day} already uploaded`);
        continue;
      }
      const answer = await service.json<MetAnswer>('POST', `/v1/stations/${segment(options.stationId)}/met`, {
        body: day.body,
        contentType: day.contentType,
        query: { source: options.source },
        // a re-sent record is stored once ("unchanged"), so the upload may be repeated after a dropped connection
        idempotent: true,
      });
      addAnswer(result, answer, day);
      state.record(options.stationId, day.day, { bodySha256, count: day.count, acceptedAt: new Date().toISOString() });
      result.daysSent++;
      progress.update(++done, `${day.day} +${answer.inserted} new, ${answer.rejected_count} rejected`);
    }
  } finally {
    progress.stop(
      `met ${options.stationId}: ${result.daysSent} day(s) sent, ${result.daysSkipped} already uploaded; ` +
        `${result.inserted} inserted, ${result.updated} updated, ${result.unchanged} unchanged, ${result.rejected.length} rejected`,
    );
  }
  return result;
}

function addAnswer(result: MetUploadResult, answer: MetAnswer, day: MetDay): void {
  result.inserted += answer.inserted;
  result.updated += answer.updated;
  result.unchanged += answer.unchanged;
  for (const r of answer.rejected) result.rejected.push({ day: day.day, ...day.locate(r), reason: r.reason });
  for (const w of answer.warnings) if (!result.warnings.includes(w)) result.warnings.push(w);
}
