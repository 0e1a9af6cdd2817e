/**
 * The Arrow answer of POST /v1/zwd-estimates (`Accept: application/vnd.apache.arrow.stream`) written straight
 * from the domain result (issue 14): the series as the Arrow table, the rest of the answer (zwd_nodes,
 * gradient_nodes and rejected as rounded columns, then statistics, apriori, models, warnings) as JSON in the
 * schema metadata "answer" — the table and the metadata of tableAnswer(zwdEstimatesResponseOf(r), …) without
 * the answer's row objects, the columns made of them, and the text of the rest parsed and written again.
 *
 * - The series columns hold what seriesEntryOf (zwd-estimation.ts) puts in a row, a missing member as null
 *   (table-answer.ts rowsToColumns), a field that no row has left out, and are written as the Arrow stream
 *   tableFromArrays + tableToIPC made of them (arrow-columns-stream.ts: numbers, texts, nulls; the epochs as bytes,
 *   told apart by their whole milliseconds). What that writer does not take (no rows, no column, a column mixing
 *   numbers and texts) goes as before: a column of numbers only a Float64Array, any other an array, through
 *   arrowAnswerOfText (answer-shape.ts) and apache-arrow's tableFromArrays.
 * - The metadata text is the JSON of the other tables written by the columns writer of zwd-estimates-answer.ts
 *   (byte for byte what json-columns.ts wrote for them) and JSON.stringify of the summary: the text the old path
 *   gave through JSON.parse and JSON.stringify, since JSON.stringify's own text reads back to itself.
 *
 * test/http/zwd-estimates-arrow.test.ts decodes both answers with apache-arrow and compares them;
 * test/http/zwd-estimates-arrow-stream.test.ts compares the bytes with tableToIPC's of the same columns.
 */

import { JsonBytes } from '../../formats/json-columns.js';
import { isoEpochText, ISO_EPOCH_MAX_BYTES, writeIsoEpochAscii } from '../../formats/iso-epoch-text.js';
import type { ZwdEstimationResult } from '../../services/zwd-estimation.js';
import { arrowAnswerOfText, ARROW_STREAM_TYPE, type AnswerShape } from '../answer-shape.js';
import { arrowColumnOf, arrowColumnsStream, keyedTextColumn, type ArrowColumn, type CellValue } from '../arrow-columns-stream.js';
import { ZWD_ANSWER_TABLES } from '../schemas/zwd-estimates.js';
import { selectedFields, type TableAnswer } from '../table-answer.js';
import { fieldsOf, gradientNodeTable, keyOf, rejectedTable, writeColumns, zwdNodeTable } from './zwd-estimates-answer.js';
import { zwdAnswerSummaryOf } from './zwd-estimation.js';

/** Per series field, its value at epoch k as seriesEntryOf gives it (undefined: the row has no such member). */
function seriesFieldsOf(r: ZwdEstimationResult): Record<string, (k: number) => CellValue> {
  const epochs = r.estimate.epochs;
  const zwd = r.epochZwd;
  const met = r.epochMet;
  const aprioriZtdM = r.aprioriZhdM + r.aprioriZwdM;
  /** A met value: absent without met, and (but zhd_m) where the epoch's met is missing. */
  const metValue = (value: (m: NonNullable<typeof met>[number]) => number | null | undefined) => (k: number) => {
    const m = met?.[k];
    return m === undefined || m.met === 'missing' ? undefined : value(m);
  };
  return {
    epoch: (k) => isoEpochText(epochs[k]!.epochMs),
    correction_m: (k) => epochs[k]!.correctionM,
    zwd_m: (k) => zwd[k]!.zwdM,
    zhd_source: (k) => zwd[k]!.zhdSource,
    sigma_m: (k) => epochs[k]!.sigmaM,
    north_gradient_m: (k) => epochs[k]!.northGradientM,
    east_gradient_m: (k) => epochs[k]!.eastGradientM,
    north_gradient_sigma_m: (k) => epochs[k]!.northGradientSigmaM,
    east_gradient_sigma_m: (k) => epochs[k]!.eastGradientSigmaM,
    epoch_bias_m: (k) => epochs[k]!.epochBiasM,
    observations: (k) => epochs[k]!.observationsUsed,
    ztd_m: (k) => aprioriZtdM + epochs[k]!.correctionM,
    met: (k) => met?.[k]?.met,
    zhd_m: (k) => {
      const m = met?.[k];
      return m === undefined ? undefined : m.met === 'missing' ? zwd[k]!.zhdM : m.zhdM;
    },
    tm_k: metValue((m) => m.tmK),
    pwv_mm: metValue((m) => m.pwvMm),
    pwv_sigma_mm: metValue((m) => m.pwvSigmaMm),
    pwv_total_sigma_mm: metValue((m) => m.pwvTotalSigmaMm),
  };
}

/**
 * One series column for tableFromArrays: a Float64Array while every value is a number, else an array with null for a
 * missing value; undefined when no row has the field (and there are rows), as rowsToColumns leaves such a field out.
 */
function seriesColumn(n: number, valueAt: (k: number) => CellValue): Float64Array | unknown[] | undefined {
  const values = Array.from({ length: n }, (_, k) => valueAt(k));
  if (values.every((v) => typeof v === 'number')) return Float64Array.from(values);
  return values.some((v) => v !== undefined) ? values.map((v) => v ?? null) : undefined;
}

/**
 * The epoch column, its texts (isoEpochText's) written as bytes, told apart by their whole milliseconds: the text
 * is toISOString's of the instant Date makes of epochMs (TimeClip: the whole milliseconds), so two epochs have the
 * same text exactly where they have the same whole milliseconds. (An epoch no Date holds, beyond ±8.64e15 ms, is a
 * whole number of its own: its text is written, and throws toISOString's RangeError, as before.)
 */
function epochColumn(epochs: ZwdEstimationResult['estimate']['epochs'], n: number): ArrowColumn {
  return keyedTextColumn(
    n,
    (k) => Math.trunc(epochs[k]!.epochMs),
    (k, out, at) => writeIsoEpochAscii(epochs[k]!.epochMs, out, at),
    ISO_EPOCH_MAX_BYTES,
  );
}

/**
 * The series columns as written directly (arrow-columns-stream.ts), in the order of `names` (a repeat once, as a
 * record of columns keeps it); undefined when one is not a column written there, or none is left: the answer then
 * takes tableFromArrays.
 */
function directColumns(r: ZwdEstimationResult, names: readonly string[], getters: Record<string, (k: number) => CellValue>, n: number) {
  const epochs = r.estimate.epochs;
  const columns = new Map<string, ArrowColumn>();
  for (const name of names) {
    const column = name === 'epoch' ? epochColumn(epochs, n) : arrowColumnOf(n, getters[name]!);
    if (column === undefined) return undefined;
    if (column !== 'absent') columns.set(name, column);
  }
  return columns.size > 0 ? columns : undefined; // no column: tableFromArrays makes a table of no batches
}

/** The series columns for tableFromArrays (arrowAnswerOfText), by seriesColumn. */
function generalColumns(names: readonly string[], getters: Record<string, (k: number) => CellValue>, n: number) {
  const columns: Record<string, Float64Array | unknown[]> = {};
  for (const name of names) {
    const column = seriesColumn(n, getters[name]!); // no rows: an empty Float64Array per field, as before
    if (column) columns[name] = column;
  }
  return columns as Record<string, Float64Array | string[]>;
}

/** The metadata "answer": the other tables as columns JSON, then the summary. */
function answerText(r: ZwdEstimationResult, selected: Record<string, string[] | undefined>): string {
  const { estimate: out } = r;
  const tables = {
    zwd_nodes: zwdNodeTable(out.zwdNodes, r.aprioriZwdM),
    gradient_nodes: gradientNodeTable(out.gradientNodes),
    rejected: rejectedTable(out.rejected),
  };
  const json = new JsonBytes((tables.zwd_nodes.rows + tables.gradient_nodes.rows + tables.rejected.rows) * 100 + 4096);
  json.byte(0x7b); // {
  for (const [key, table] of Object.entries(tables)) {
    json.raw(keyOf(key));
    writeColumns(json, table, fieldsOf(table, selected[key], key), ZWD_ANSWER_TABLES.tables[key]!);
    json.byte(0x2c); // ,
  }
  const summary = Buffer.from(JSON.stringify(zwdAnswerSummaryOf(r)), 'utf8');
  json.raw(summary.subarray(1)); // without its opening brace
  return Buffer.from(json.bytes.buffer, json.bytes.byteOffset, json.length).toString('utf8');
}

/** The Arrow answer of POST /v1/zwd-estimates from the domain result, with `fields` of the shape. */
export function zwdEstimatesArrowAnswer(r: ZwdEstimationResult, shape: AnswerShape): TableAnswer {
  const selected = selectedFields(ZWD_ANSWER_TABLES, shape.fields);
  const getters = seriesFieldsOf(r);
  const names = selected.series ?? Object.keys(ZWD_ANSWER_TABLES.tables.series!);
  for (const name of names) if (!getters[name]) throw new Error(`series.${name}: not a field of the estimation answer`);
  const n = r.estimate.epochs.length;
  const text = answerText(r, selected);
  const direct = n > 0 ? directColumns(r, names, getters, n) : undefined;
  const bytes = direct ? arrowColumnsStream(direct, n, text) : arrowAnswerOfText(generalColumns(names, getters, n), text);
  return { bytes, contentType: ARROW_STREAM_TYPE };
}
