/**
 * Reading a met upload that came as text (a CSV table, src/formats/met-csv.ts, or a RINEX
 * meteorological file, src/formats/rinex-met.ts) as a compute task: the readers and the record
 * checks (routes/series-ingest.ts) run in a worker thread for a body above OFFLOAD_BODY_BYTES, on
 * the event loop below it (the same function). The rows come back as columns of typed arrays (moved,
 * not copied; null as NaN), and the event loop only builds the row objects and stores them.
 */

import type { MetRow } from '../../storage/repository.js';
import type { TaskOutcome } from '../../workers/task-outcome.js';
import { HttpProblem } from '../problem.js';
import { readMetUpload, type MetUpload, type Rejected } from '../routes/series-ingest.js';
import { asOutcome } from './task-errors.js';

export interface MetUploadTaskInput {
  /** The body as received (text/csv or text/plain). */
  text: string;
  contentType: string;
  source: string;
}

/** The stored fields of the rows, one typed array each; NaN is null. */
export interface MetColumnsOut {
  epochMs: Float64Array;
  pressureHpa: Float64Array;
  temperatureC: Float64Array;
  relativeHumidityPct: Float64Array;
  dewpointC: Float64Array;
  vapourPressureHpa: Float64Array;
  /** Source of each row as an index into `sourceNames` (a CSV may name a source per row). */
  sourceIndex: Uint32Array;
  sourceNames: string[];
}

export interface MetUploadTaskOutput extends Omit<MetUpload, 'rows'> {
  columns: MetColumnsOut;
  /** Rows read, for the metrics. */
  observations: number;
}

const FIELDS = ['epochMs', 'pressureHpa', 'temperatureC', 'relativeHumidityPct', 'dewpointC', 'vapourPressureHpa'] as const;

export function toMetColumns(rows: MetRow[]): MetColumnsOut {
  const columns = Object.fromEntries(FIELDS.map((f) => [f, new Float64Array(rows.length)])) as unknown as MetColumnsOut;
  columns.sourceIndex = new Uint32Array(rows.length);
  const index = new Map<string, number>();
  rows.forEach((row, i) => {
    for (const f of FIELDS) columns[f][i] = row[f] ?? NaN;
    let k = index.get(row.source);
    if (k === undefined) index.set(row.source, (k = index.size));
    columns.sourceIndex[i] = k;
  });
  columns.sourceNames = [...index.keys()];
  return columns;
}

/** The rows again, with their sources. */
export function metRowsOf(columns: MetColumnsOut): MetRow[] {
  const value = (x: number) => (Number.isNaN(x) ? null : x);
  const rows = new Array<MetRow>(columns.epochMs.length);
  for (let i = 0; i < rows.length; i++) {
    rows[i] = {
      epochMs: columns.epochMs[i]!,
      source: columns.sourceNames[columns.sourceIndex[i]!]!,
      pressureHpa: value(columns.pressureHpa[i]!),
      temperatureC: value(columns.temperatureC[i]!),
      relativeHumidityPct: value(columns.relativeHumidityPct[i]!),
      dewpointC: value(columns.dewpointC[i]!),
      vapourPressureHpa: value(columns.vapourPressureHpa[i]!),
    };
  }
  return rows;
}

/** A text met upload read and checked; a body that is not what its content type claims comes back as its 400. */
export async function readMetUploadTask(input: MetUploadTaskInput): Promise<TaskOutcome<MetUploadTaskOutput>> {
  try {
    const { rows, ...rest } = readMetUpload(input.text, input.contentType, input.source);
    const rejected: Rejected[] = rest.rejected;
    return { ok: true, output: { ...rest, rejected, columns: toMetColumns(rows), observations: rows.length } };
  } catch (err) {
    if (err instanceof HttpProblem)
      return { ok: false, error: { status: err.status, detail: err.message, ...(err.errors ? { errors: err.errors } : {}) } };
    return asOutcome(err);
  }
}
