/**
 * Series uploads sent as JSON (met records, delay deposits) as compute tasks: above OFFLOAD_BODY_BYTES
 * the route keeps the body as bytes (src/http/json-upload-body.ts) and this parses it, checks the
 * envelope and every record in a worker thread; the rows come back as typed-array columns (moved,
 * not copied). A body up to OFFLOAD_BODY_BYTES takes fastify's own path on the event loop, and the
 * answers are the same (test/http/json-upload-offload.test.ts): the JSON is read as fastify's parser
 * reads it (secure-json-parse: the same refusal of `__proto__` and `constructor.prototype`; fastify's
 * own text for any body it refuses), the envelope is checked by the same zod schema, and its issues become
 * field errors by the same rule (field-errors.ts).
 */

import secureJson from 'secure-json-parse';
import type { z } from 'zod';
import { provenance } from '../../domain/provenance.js';
import type { DelayRow } from '../../storage/repository.js';
import type { TaskOutcome } from '../../workers/task-outcome.js';
import { detailOf, issuesToFieldErrors } from '../field-errors.js';
import { HttpProblem } from '../problem.js';
import { delayDepositEnvelope } from '../schemas/delays.js';
import { DEFAULT_MET_SOURCE, metIngestEnvelope } from '../schemas/met.js';
import { readDelayDeposit, readMetUpload, type Rejected } from '../routes/series-ingest.js';
import { toMetColumns, type MetUploadTaskOutput } from './met-upload.js';
import { asOutcome } from './task-errors.js';

export interface JsonUploadTaskInput {
  /** The body bytes (UTF-8 JSON). */
  body: Uint8Array;
  /** `?source=` of the request (a JSON met body names its source itself; this is the fallback). */
  querySource?: string | undefined;
}

/** fastify's text for a body its JSON parser refuses (FST_ERR_CTP_INVALID_JSON_BODY, fastify 5). */
const INVALID_JSON = "Body is not valid JSON but content-type is set to 'application/json'";

/** Parsed as fastify's JSON parser parses (its 400 texts), then checked against `envelope`. */
function parseEnvelope<S extends z.ZodType>(bytes: Uint8Array, envelope: S): z.output<S> {
  const text = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8');
  let raw: unknown;
  try {
    raw = secureJson.parse(text, undefined, { protoAction: 'error', constructorAction: 'error' });
  } catch {
    throw new HttpProblem(400, INVALID_JSON);
  }
  const parsed = envelope.safeParse(raw);
  if (!parsed.success) {
    const errors = issuesToFieldErrors(parsed.error.issues);
    throw new HttpProblem(400, detailOf(errors), errors);
  }
  return parsed.data;
}

const problemOutcome = (err: unknown): TaskOutcome<never> => {
  if (err instanceof HttpProblem)
    return { ok: false, error: { status: err.status, detail: err.message, ...(err.errors ? { errors: err.errors } : {}) } };
  return asOutcome(err);
};

/** A JSON met upload: `{ records, source? }` read and checked; the rows come back as columns. */
export async function readMetJsonUploadTask(input: JsonUploadTaskInput): Promise<TaskOutcome<MetUploadTaskOutput & { source: string }>> {
  try {
    const body = parseEnvelope(input.body, metIngestEnvelope);
    const source = body.source ?? input.querySource ?? DEFAULT_MET_SOURCE;
    const { rows, ...rest } = readMetUpload(body, 'application/json', source);
    const rejected: Rejected[] = rest.rejected;
    return { ok: true, output: { ...rest, rejected, source, columns: toMetColumns(rows), observations: rows.length } };
  } catch (err) {
    return problemOutcome(err);
  }
}

/** The numeric fields of delay rows, one typed array each; NaN is null. */
export interface DelayColumnsOut {
  epochMs: Float64Array;
  ztdM: Float64Array;
  ztdSigmaM: Float64Array;
  zwdM: Float64Array;
  zwdSigmaM: Float64Array;
  northGradientM: Float64Array;
  eastGradientM: Float64Array;
  northGradientSigmaM: Float64Array;
  eastGradientSigmaM: Float64Array;
}
const DELAY_FIELDS = [
  'epochMs',
  'ztdM',
  'ztdSigmaM',
  'zwdM',
  'zwdSigmaM',
  'northGradientM',
  'eastGradientM',
  'northGradientSigmaM',
  'eastGradientSigmaM',
] as const;

export interface DelayDepositTaskOutput {
  source: string;
  set: ReturnType<typeof provenance>;
  columns: DelayColumnsOut;
  rejected: Rejected[];
  /** Rows read, for the metrics. */
  observations: number;
}

/** Delay rows again from their columns, with the deposit's source and fingerprint. */
export function delayRowsOf(columns: DelayColumnsOut, source: string, modelFingerprint: string): DelayRow[] {
  const value = (x: number) => (Number.isNaN(x) ? null : x);
  const rows = new Array<DelayRow>(columns.epochMs.length);
  for (let i = 0; i < rows.length; i++) {
    rows[i] = {
      epochMs: columns.epochMs[i]!,
      source,
      ztdM: columns.ztdM[i]!,
      ztdSigmaM: value(columns.ztdSigmaM[i]!),
      zwdM: value(columns.zwdM[i]!),
      zwdSigmaM: value(columns.zwdSigmaM[i]!),
      northGradientM: value(columns.northGradientM[i]!),
      eastGradientM: value(columns.eastGradientM[i]!),
      northGradientSigmaM: value(columns.northGradientSigmaM[i]!),
      eastGradientSigmaM: value(columns.eastGradientSigmaM[i]!),
      modelFingerprint,
    };
  }
  return rows;
}

/** A delay deposit `{ records, source, models? }` read and checked; the rows come back as columns. */
export async function readDelayDepositTask(input: JsonUploadTaskInput): Promise<TaskOutcome<DelayDepositTaskOutput>> {
  try {
    const deposit = readDelayDeposit(parseEnvelope(input.body, delayDepositEnvelope));
    const columns = Object.fromEntries(DELAY_FIELDS.map((f) => [f, new Float64Array(deposit.rows.length)])) as unknown as DelayColumnsOut;
    deposit.rows.forEach((row, i) => {
      for (const f of DELAY_FIELDS) columns[f][i] = row[f] ?? NaN;
    });
    return {
      ok: true,
      output: { source: deposit.source, set: deposit.set, columns, rejected: deposit.rejected, observations: deposit.rows.length },
    };
  } catch (err) {
    return problemOutcome(err);
  }
}
