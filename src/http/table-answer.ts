/**
 * Answer shapes of an answer that holds several row tables (an estimation: zwd_nodes, gradient_nodes,
 * series, rejected), for any route: the shape (answer-shape.ts) turns every table into columns or
 * keeps rows, `fields` selects fields, and Arrow IPC carries the main table as the Arrow table with
 * the rest of the answer (the other tables as rounded columns) as JSON in the schema metadata "answer".
 *
 *   fields=zwd_m,sigma_m                     fields of the main table (its rows or columns)
 *   fields=zwd_m,zwd_nodes.sigma_m           a field of another table, qualified by the table's name
 *
 * A table named in no field keeps all its fields; a field absent from a row (met fields at epochs
 * without met) is null in its column. Columns are rounded to their decimals (the precision table,
 * src/formats/output-precision.ts) and written as JSON bytes in one pass (src/formats/json-columns.ts).
 */

import { columnsJsonBytes, jsonWithRawMembers, stringifiedBytes, type JsonColumn } from '../formats/json-columns.js';
import type { AnswerShape, FieldDecimals } from './answer-shape.js';
import { arrowAnswer, ARROW_STREAM_TYPE } from './answer-shape.js';

/** The row tables of an answer: table key → its fields with their decimals (undefined: text or flag). */
export interface TableSpecs {
  /** The table that is the Arrow table and whose fields need no qualifier in `fields`. */
  main: string;
  tables: Record<string, FieldDecimals>;
}

/** Every name `fields` accepts for these tables: the main table's fields, then `table.field` of the others. */
export function tableFieldNames(specs: TableSpecs): string[] {
  const names = Object.keys(specs.tables[specs.main]!);
  for (const [table, fields] of Object.entries(specs.tables)) {
    if (table !== specs.main) names.push(...Object.keys(fields).map((f) => `${table}.${f}`));
  }
  return names;
}

/** The fields selected per table (undefined: all), from the validated `fields` of the shape. */
export function selectedFields(specs: TableSpecs, fields: readonly string[] | undefined): Record<string, string[] | undefined> {
  const out: Record<string, string[] | undefined> = {};
  if (!fields) return out;
  for (const name of fields) {
    const dot = name.indexOf('.');
    const [table, field] = dot < 0 ? [specs.main, name] : [name.slice(0, dot), name.slice(dot + 1)];
    (out[table] ??= []).push(field);
  }
  return out;
}

type Row = Record<string, unknown>;

/** Rows → one array per field (in the spec's order; selected fields only), absent values as null. */
function rowsToColumns(rows: readonly Row[], fieldOrder: readonly string[]): Record<string, unknown[]> {
  const columns: Record<string, unknown[]> = {};
  for (const field of fieldOrder) {
    const column = new Array<unknown>(rows.length);
    let present = false;
    for (let i = 0; i < rows.length; i++) {
      const v = rows[i]![field];
      if (v !== undefined) present = true;
      column[i] = v ?? null;
    }
    if (present || rows.length === 0) columns[field] = column;
  }
  return columns;
}

/** The answer's tables as columns (rounded per field) in JSON bytes, keyed by table. */
function tableColumnBytes(answer: Row, specs: TableSpecs, selected: Record<string, string[] | undefined>, skip?: string) {
  const raw: Record<string, Uint8Array> = {};
  for (const [table, decimals] of Object.entries(specs.tables)) {
    if (table === skip || !Array.isArray(answer[table])) continue;
    const columns = rowsToColumns(answer[table] as Row[], selected[table] ?? Object.keys(decimals));
    const json: Record<string, JsonColumn> = {};
    for (const [field, values] of Object.entries(columns)) json[field] = { values, decimals: decimals[field] };
    raw[table] = columnsJsonBytes(json);
  }
  return raw;
}

/** Rows with only the selected fields (shape=rows with `fields`). */
const pick = (rows: readonly Row[], fields: readonly string[]) =>
  rows.map((r) => Object.fromEntries(fields.filter((f) => r[f] !== undefined).map((f) => [f, r[f]])));

/** The main table as Arrow columns: numbers as Float64Array (null → NaN is avoided: a column with nulls stays an array). */
function arrowColumns(rows: readonly Row[], fields: readonly string[]): Record<string, Float64Array | string[]> {
  const out: Record<string, Float64Array | string[]> = {};
  for (const [field, values] of Object.entries(rowsToColumns(rows, fields))) {
    const numbers = values.every((v) => typeof v === 'number');
    out[field] = numbers ? Float64Array.from(values as number[]) : (values as string[]);
  }
  return out;
}

export interface TableAnswer {
  bytes: Uint8Array;
  contentType: string;
}

/**
 * The answer in the shape asked for, as bytes. `tail` (optional) is added to the answer's top level
 * after the tables are shaped (e.g. what a station route stored), in rows, columns and Arrow alike.
 */
export function tableAnswer(answer: Row, specs: TableSpecs, shape: AnswerShape, tail: Row = {}): TableAnswer {
  const selected = selectedFields(specs, shape.fields);
  if (shape.format === 'arrow') {
    const mainRows = (answer[specs.main] as Row[] | undefined) ?? [];
    const columns = arrowColumns(mainRows, selected[specs.main] ?? Object.keys(specs.tables[specs.main]!));
    const raw = tableColumnBytes(answer, specs, selected, specs.main);
    const { [specs.main]: _main, ...rest } = answer;
    const restJson = Buffer.from(jsonWithRawMembers({ ...rest, ...tail }, raw)).toString('utf8');
    return { bytes: arrowAnswer(columns, undefined, JSON.parse(restJson) as unknown), contentType: ARROW_STREAM_TYPE };
  }
  if (shape.shape === 'columns') {
    return {
      bytes: jsonWithRawMembers({ ...answer, ...tail }, tableColumnBytes(answer, specs, selected)),
      contentType: 'application/json',
    };
  }
  const shaped: Row = { ...answer, ...tail };
  for (const [table, fields] of Object.entries(selected)) {
    if (fields && Array.isArray(answer[table])) shaped[table] = pick(answer[table] as Row[], fields);
  }
  // The bytes of JSON.stringify(shaped), its tables' rows stringified a piece at a time (no text of the whole answer).
  return { bytes: stringifiedBytes(shaped), contentType: 'application/json' };
}
