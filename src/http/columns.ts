/**
 * Column arrays at the HTTP edge. A batch of rows may be sent as one array per field,
 *
 *   "directions": { "elevation_deg": [10, 20, …], "azimuth_deg": [0, 90, …] }
 *
 * instead of an array of objects. Each column is checked in one loop with the row schema's own rule
 * and message (a number made by bounded()/positive() is a range test; any other field is parsed by
 * its zod schema once per distinct value, so epochs and satellite names repeated on every row cost
 * one parse each). The field of an error names the column and the row: `directions.elevation_deg.12`.
 *
 * The object form stays the documented default for small calls; both give the same answer.
 */

import type { z } from 'zod';
import type { JsonColumnSpec } from '../formats/json-columns-reader.js';
import type { FieldError } from './problem.js';
import { numberRangeOf } from './schemas/common.js';

/** At most this many field errors per request (the rest are counted in the detail line). */
const MAX_COLUMN_ERRORS = 20;

/**
 * One column of a columnar batch: its row schema (unwrapped of `.optional()`), whether it may be absent,
 * and whether a value is valid (`accepts`: the schema's own answer, see acceptorOf).
 */
export interface ColumnSpec {
  schema: z.ZodType;
  optional: boolean;
  accepts: (value: unknown) => boolean;
}

/** The columns of a row schema (a strictObject's shape), in its order. */
export function columnSpecsOf(shape: Record<string, z.ZodType>): Record<string, ColumnSpec> {
  return Object.fromEntries(
    Object.entries(shape).map(([name, schema]) => {
      const optional = schema.safeParse(undefined).success;
      const inner = optional && 'unwrap' in schema && typeof schema.unwrap === 'function' ? (schema.unwrap() as z.ZodType) : schema;
      return [name, { schema: inner, optional, accepts: acceptorOf(inner) }];
    }),
  );
}

/**
 * The pattern of an ISO date-time schema (`z.iso.datetime`, as epochSchema) when the pattern is all it
 * checks: a string schema of zod's `datetime` format, no check chained to it (`.min`, `.refine` …), no
 * coercion, a pattern without state (no `g`/`y` flag). zod's own check of such a schema is "a string,
 * and `pattern.test` passes" ($ZodISODateTime is a $ZodStringFormat whose check is that test), so the
 * test alone gives the same answer. Anything else: undefined (the schema is asked).
 */
function datetimePatternOf(schema: z.ZodType): RegExp | undefined {
  const def = (schema as unknown as { _zod?: { def?: Record<string, unknown> } })._zod?.def;
  if (!def || def.type !== 'string' || def.format !== 'datetime' || def.coerce) return undefined;
  if (Array.isArray(def.checks) && def.checks.length > 0) return undefined;
  const pattern = def.pattern;
  if (!(pattern instanceof RegExp) || pattern.global || pattern.sticky) return undefined;
  return pattern;
}

/**
 * Whether a value is valid by the schema: for an ISO date-time schema its pattern tested directly (issue
 * 14: zod's safeParse around the same test cost ~0.05 µs more per distinct epoch, and a result object), else
 * `schema.safeParse(value).success`. Errors and their messages still come from the schema (checkerOf).
 */
export function acceptorOf(schema: z.ZodType): (value: unknown) => boolean {
  const pattern = datetimePatternOf(schema);
  if (pattern) return (value) => typeof value === 'string' && pattern.test(value);
  return (value) => schema.safeParse(value).success;
}

/** A value checker with the schema's message: a range test for bounded numbers, a memoised zod parse otherwise. */
function checkerOf(schema: z.ZodType): (value: unknown) => string | undefined {
  const range = numberRangeOf(schema);
  if (range) {
    const { min, max, exclusiveMin, message } = range;
    return (v) => (typeof v === 'number' && (exclusiveMin ? v > min : v >= min) && v <= max ? undefined : message);
  }
  const known = new Map<unknown, string | undefined>();
  return (v) => {
    if (known.has(v)) return known.get(v);
    const parsed = schema.safeParse(v);
    const message = parsed.success ? undefined : (parsed.error.issues[0]?.message ?? 'invalid value');
    if (known.size < 100_000 && (typeof v === 'string' || typeof v === 'number')) known.set(v, message);
    return message;
  };
}

export type Columns = Record<string, unknown[] | undefined>;

/** A column as sent: a JSON array, or a Float64Array of an Arrow number column (readArrowRequest with `typed`). */
type SentColumn = unknown[] | Float64Array;
const isColumn = (v: unknown): v is SentColumn => Array.isArray(v) || v instanceof Float64Array;

/**
 * The first row of a Float64Array column outside the bounded range (one loop, no per-value call), or -1.
 * A NaN fails every comparison, so it is caught like any out-of-range value.
 */
function firstOutOfRange(column: Float64Array, range: NonNullable<ReturnType<typeof numberRangeOf>>): number {
  const { min, max, exclusiveMin } = range;
  for (let i = 0; i < column.length; i++) {
    const v = column[i]!;
    if (!((exclusiveMin ? v > min : v >= min) && v <= max)) return i;
  }
  return -1;
}

/**
 * Checks a columnar batch: an object with one array per column, all of one length in 1..maxRows,
 * no unknown column, every value valid. Returns the columns (as sent) and the row count, or the
 * field errors.
 */
export function readColumns(
  raw: unknown,
  path: string,
  specs: Record<string, ColumnSpec>,
  maxRows: number,
  noun: string,
): { ok: true; columns: Columns; rows: number } | { ok: false; errors: FieldError[] } {
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) {
    return { ok: false, errors: [{ field: path, message: `must be an array of ${noun} or an object of column arrays` }] };
  }
  const errors: FieldError[] = [];
  const given = raw as Record<string, unknown>;
  const names = Object.keys(specs);
  for (const key of Object.keys(given)) {
    if (!(key in specs)) errors.push({ field: `${path}.${key}`, message: `unknown column; the columns are ${names.join(', ')}` });
  }
  let rows = -1;
  for (const [name, spec] of Object.entries(specs)) {
    const column = given[name];
    if (column === undefined) {
      if (!spec.optional)
        errors.push({ field: `${path}.${name}`, message: `required column (an array of one value per ${noun.replace(/s$/, '')})` });
      continue;
    }
    if (!isColumn(column)) {
      errors.push({ field: `${path}.${name}`, message: 'must be an array' });
      continue;
    }
    if (rows < 0) rows = column.length;
    else if (column.length !== rows) {
      errors.push({ field: `${path}.${name}`, message: `has ${column.length} values; the other columns have ${rows}` });
      continue;
    }
  }
  if (errors.length) return { ok: false, errors };
  if (rows < 1 || rows > maxRows) return { ok: false, errors: [{ field: path, message: `must hold 1..${maxRows} ${noun}` }] };

  for (const [name, spec] of Object.entries(specs)) {
    const column = given[name] as SentColumn | undefined;
    if (!column) continue;
    const range = numberRangeOf(spec.schema);
    if (column instanceof Float64Array && range && firstOutOfRange(column, range) < 0) continue; // all valid: one loop
    const check = checkerOf(spec.schema);
    for (let i = 0; i < rows; i++) {
      const v = column[i];
      if (v === null && spec.optional) continue; // an optional column may leave a row empty
      const message = check(v);
      if (message !== undefined) {
        errors.push({ field: `${path}.${name}.${i}`, message });
        if (errors.length >= MAX_COLUMN_ERRORS) return { ok: false, errors };
      }
    }
  }
  if (errors.length) return { ok: false, errors };
  return { ok: true, columns: given as Columns, rows };
}

/** A number column as a Float64Array (a missing column → undefined; null entries → NaN); a Float64Array at scale 1 as it is. */
export function float64Column(column: unknown[] | Float64Array | undefined, scale = 1): Float64Array | undefined {
  if (!column) return undefined;
  if (column instanceof Float64Array && scale === 1) return column;
  const out = new Float64Array(column.length);
  for (let i = 0; i < column.length; i++) out[i] = column[i] === null ? NaN : (column[i] as number) * scale;
  return out;
}

/**
 * The checks of `specs` as the one-pass JSON reader takes them (src/formats/json-columns-reader.ts): a
 * bounded number column by its range (null allowed where the column is optional, as readColumns allows
 * it), any other column as text checked by its schema once per distinct text. The reader answers only
 * when every check passes, so it accepts exactly what readColumns accepts among the bodies it reads.
 */
export function jsonColumnSpecsOf(specs: Record<string, ColumnSpec>): Record<string, JsonColumnSpec> {
  return Object.fromEntries(
    Object.entries(specs).map(([name, spec]): [string, JsonColumnSpec] => {
      const range = numberRangeOf(spec.schema);
      if (range) {
        const { min, max, exclusiveMin } = range;
        return [name, { kind: 'number', required: !spec.optional, min, max, exclusiveMin, nullable: spec.optional }];
      }
      return [name, { kind: 'text', required: !spec.optional, accept: spec.accepts }];
    }),
  );
}
