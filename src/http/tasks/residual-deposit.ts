/**
 * A residual deposit (PUT /v1/stations/{id}/residuals/{day}) as a compute task: the body (JSON
 * objects or column arrays, CSV, or an Arrow IPC stream) is parsed and checked with the estimation
 * routes' own readers and rules (the observation schema, src/http/columns.ts), every epoch is checked
 * to lie within the day, and the station-day is encoded in its compact stored form
 * (src/formats/residual-day-form.ts). Only the stored bytes and their digest come back.
 */

import { readObservationCsv } from '../../formats/observation-csv.js';
import { encodeResidualDay, type ResidualDay } from '../../formats/residual-day-form.js';
import { MAX_OBSERVATIONS } from '../../limits.js';
import type { TaskOutcome } from '../../workers/task-outcome.js';
import { readArrowRequest } from '../answer-shape.js';
import { columnSpecsOf, readColumns, type Columns } from '../columns.js';
import { issuesToFieldErrors } from '../field-errors.js';
import { residualDepositObjects } from '../schemas/residuals.js';
import { zwdObservationSchema } from '../schemas/zwd-estimates.js';
import { asOutcome, fail } from './task-errors.js';
import { FormatError } from '../../formats/format-error.js';

export interface ResidualDepositInput {
  body: Uint8Array | string;
  format: 'json' | 'csv' | 'arrow';
  /** The day of the deposit, `YYYY-MM-DD` (checked by the route). */
  day: string;
}

export interface ResidualDepositOutput {
  /** The compact stored form (moved back, not copied). */
  bytes: Uint8Array;
  sha256: string;
  observationCount: number;
  /** For the metrics. */
  observations: number;
}

const OBSERVATION_COLUMNS = columnSpecsOf(zwdObservationSchema.shape);

const bodyText = (body: Uint8Array | string) =>
  typeof body === 'string' ? body : Buffer.from(body.buffer, body.byteOffset, body.byteLength).toString('utf8');

/** Column arrays (checked) → the day's columns in API units. */
function dayFromColumns(c: Columns): ResidualDay {
  const sigma = c.sigma_m as (number | null)[] | undefined;
  return {
    epochMs: (c.epoch as string[]).map((e) => Date.parse(e)),
    satellite: c.satellite as string[],
    elevationDeg: c.elevation_deg as number[],
    azimuthDeg: c.azimuth_deg as number[],
    residualM: c.residual_m as number[],
    sigmaM: sigma?.some((v) => v !== null) ? sigma : undefined,
  };
}

type ObservationObject = {
  epoch: string;
  satellite: string;
  elevation_deg: number;
  azimuth_deg: number;
  residual_m: number;
  sigma_m?: number;
};

function dayFromObjects(list: readonly ObservationObject[]): ResidualDay {
  const sigma = list.some((o) => o.sigma_m !== undefined) ? list.map((o) => o.sigma_m ?? null) : undefined;
  return {
    epochMs: list.map((o) => Date.parse(o.epoch)),
    satellite: list.map((o) => o.satellite),
    elevationDeg: list.map((o) => o.elevation_deg),
    azimuthDeg: list.map((o) => o.azimuth_deg),
    residualM: list.map((o) => o.residual_m),
    sigmaM: sigma,
  };
}

/** The body as `{ observations }` (objects or columns), whatever its form. */
function rawObservations(input: ResidualDepositInput): unknown {
  if (input.format === 'arrow') return { observations: readArrowRequest(input.body as Uint8Array).columns };
  const text = bodyText(input.body);
  if (input.format === 'csv') return { observations: readObservationCsv(text) };
  try {
    return JSON.parse(text);
  } catch (err) {
    throw new FormatError('body', `not valid JSON (${err instanceof Error ? err.message : String(err)})`);
  }
}

export async function readResidualDepositTask(input: ResidualDepositInput): Promise<TaskOutcome<ResidualDepositOutput>> {
  try {
    const raw = rawObservations(input);
    const given = (raw ?? {}) as { observations?: unknown };
    let day: ResidualDay;
    if (given.observations !== null && typeof given.observations === 'object' && !Array.isArray(given.observations)) {
      const extra = Object.keys(raw as object).filter((k) => k !== 'observations');
      if (extra.length)
        return fail(
          400,
          extra.map((k) => ({ field: k, message: 'unknown key; a deposit has `observations` only' })),
        );
      const read = readColumns(given.observations, 'observations', OBSERVATION_COLUMNS, MAX_OBSERVATIONS, 'observations');
      if (!read.ok) return fail(400, read.errors);
      day = dayFromColumns(read.columns);
    } else {
      const parsed = residualDepositObjects.safeParse(raw);
      if (!parsed.success) return fail(400, issuesToFieldErrors(parsed.error.issues));
      day = dayFromObjects(parsed.data.observations);
    }
    const encoded = encodeResidualDay(input.day, day);
    return {
      ok: true,
      output: {
        bytes: new Uint8Array(encoded.bytes),
        sha256: encoded.sha256,
        observationCount: encoded.observationCount,
        observations: encoded.observationCount,
      },
    };
  } catch (err) {
    return asOutcome(err);
  }
}
