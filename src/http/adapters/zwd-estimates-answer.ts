/**
 * The `shape=columns` JSON answer of POST /v1/zwd-estimates written as bytes straight from the domain
 * result (issue 14): the same bytes as the answer objects of zwdEstimatesResponseOf turned into columns
 * by tableAnswer (json-columns.ts), without the row objects and the arrays of columns made of them
 * (3.8–4.1 ms → 1.5–1.7 ms of a GPS-like day's answer, in-process).
 *
 * Each row table (zwd_nodes, gradient_nodes, series, rejected) is built as columns, one per field in the
 * order of ZWD_ANSWER_TABLES (the key order of the row objects): numbers, texts, and which rows have no
 * such field (the met fields). The writer writes one array per field, numbers rounded to its decimals
 * (rounded-decimal-bytes.ts), absent values null, a field without a value in any row left out (all kept
 * for a table without rows), as tableAnswer's rowsToColumns; texts as JSON.stringify escapes them. The
 * rest of the answer (statistics, apriori, models, warnings: small) goes through JSON.stringify.
 *
 * Rows (the default shape) and Arrow still go through the answer objects: written from the result
 * directly, rows cost as much as JSON.stringify of the objects or more (DEVELOPERS.md "The HTTP edge of
 * the estimation routes": the numbers are most of it, and V8's own number text inside JSON.stringify is
 * the cheapest there is from JavaScript); their epoch texts come from isoEpochText now.
 *
 * Byte for byte the old path's answer: test/http/zwd-estimates-answer-bytes.test.ts builds both.
 */

import { JsonBytes } from '../../formats/json-columns.js';
import { ISO_EPOCH_MAX_BYTES, writeIsoEpochAscii } from '../../formats/iso-epoch-text.js';
import { MAX_ROUNDED_DECIMAL_BYTES, writeRoundedDecimal } from '../../formats/rounded-decimal-bytes.js';
import type { ZwdEstimationResult } from '../../services/zwd-estimation.js';
import type { AnswerShape } from '../answer-shape.js';
import { ZWD_ANSWER_TABLES } from '../schemas/zwd-estimates.js';
import { selectedFields, tableAnswer, type TableAnswer } from '../table-answer.js';
import { zwdAnswerSummaryOf, zwdEstimatesResponseOf } from './zwd-estimation.js';

/**
 * One field of a row table, as a column: numbers (NaN for null: the rounded writer writes a non-finite
 * value as null, as it wrote the null of a row object) with the rows that have no such field marked in
 * `absent`, texts (undefined: no such field in the row), or epochs [ms since 1970] written as the text
 * isoEpochText gives (writeIsoEpochAscii: no string made per epoch); none of them when no row has the
 * field (met fields of an answer without met).
 */
export interface AnswerField {
  name: string;
  numbers?: number[];
  absent?: Uint8Array;
  texts?: (string | undefined)[];
  epochsMs?: number[];
}

export interface AnswerTable {
  rows: number;
  fields: AnswerField[];
}

/** The four row tables of the answer, by the key of ZWD_ANSWER_TABLES, from the domain result (the values of zwdEstimatesResponseOf). */
function answerTables(r: ZwdEstimationResult): Record<string, AnswerTable> {
  const { estimate: out, aprioriZwdM } = r;
  const aprioriZtdM = r.aprioriZhdM + aprioriZwdM;
  return {
    zwd_nodes: zwdNodeTable(out.zwdNodes, aprioriZwdM),
    gradient_nodes: gradientNodeTable(out.gradientNodes),
    series: seriesTable(r, aprioriZtdM),
    rejected: rejectedTable(out.rejected),
  };
}

const numberColumn = (n: number) => new Array<number>(n);
const textColumn = (n: number) => new Array<string | undefined>(n);

export function zwdNodeTable(nodes: ZwdEstimationResult['estimate']['zwdNodes'], aprioriZwdM: number): AnswerTable {
  const n = nodes.length;
  const epoch = numberColumn(n);
  const [correction, zwd, sigma, nearby] = [numberColumn(n), numberColumn(n), numberColumn(n), numberColumn(n)];
  for (let i = 0; i < n; i++) {
    const node = nodes[i]!;
    epoch[i] = node.epochMs;
    correction[i] = node.correctionM;
    zwd[i] = aprioriZwdM + node.correctionM;
    sigma[i] = node.sigmaM;
    nearby[i] = node.observationsNearby;
  }
  return {
    rows: n,
    fields: [
      { name: 'epoch', epochsMs: epoch },
      { name: 'correction_m', numbers: correction },
      { name: 'zwd_m', numbers: zwd },
      { name: 'sigma_m', numbers: sigma },
      { name: 'observations_nearby', numbers: nearby },
    ],
  };
}

export function gradientNodeTable(nodes: ZwdEstimationResult['estimate']['gradientNodes']): AnswerTable {
  const n = nodes.length;
  const epoch = numberColumn(n);
  const [north, east, northSigma, eastSigma, nearby] = [
    numberColumn(n),
    numberColumn(n),
    numberColumn(n),
    numberColumn(n),
    numberColumn(n),
  ];
  for (let i = 0; i < n; i++) {
    const g = nodes[i]!;
    epoch[i] = g.epochMs;
    north[i] = g.northM;
    east[i] = g.eastM;
    northSigma[i] = g.northSigmaM;
    eastSigma[i] = g.eastSigmaM;
    nearby[i] = g.observationsNearby;
  }
  return {
    rows: n,
    fields: [
      { name: 'epoch', epochsMs: epoch },
      { name: 'north_m', numbers: north },
      { name: 'east_m', numbers: east },
      { name: 'north_sigma_m', numbers: northSigma },
      { name: 'east_sigma_m', numbers: eastSigma },
      { name: 'observations_nearby', numbers: nearby },
    ],
  };
}

/** A met value of a row: NaN for null; absent (marked) when undefined. */
function putMet(column: number[], absent: Uint8Array, k: number, v: number | null | undefined): void {
  if (v === undefined) {
    absent[k] = 1;
    column[k] = NaN;
  } else column[k] = v ?? NaN;
}

/** The series as seriesEntryOf (zwd-estimation.ts) gives it: met fields only with met, ZHD alone where met is missing. */
function seriesTable(r: ZwdEstimationResult, aprioriZtdM: number): AnswerTable {
  const epochs = r.estimate.epochs;
  const n = epochs.length;
  const epoch = numberColumn(n);
  const zhdSource = textColumn(n);
  const [correction, zwd, sigma, north, east, northSigma, eastSigma, bias, used, ztd] = Array.from({ length: 10 }, () =>
    numberColumn(n),
  ) as [number[], number[], number[], number[], number[], number[], number[], number[], number[], number[]];
  for (let k = 0; k < n; k++) {
    const e = epochs[k]!;
    const z = r.epochZwd[k]!;
    epoch[k] = e.epochMs;
    correction[k] = e.correctionM;
    zwd[k] = z.zwdM;
    zhdSource[k] = z.zhdSource;
    sigma[k] = e.sigmaM;
    north[k] = e.northGradientM ?? NaN;
    east[k] = e.eastGradientM ?? NaN;
    northSigma[k] = e.northGradientSigmaM ?? NaN;
    eastSigma[k] = e.eastGradientSigmaM ?? NaN;
    bias[k] = e.epochBiasM ?? NaN;
    used[k] = e.observationsUsed;
    ztd[k] = aprioriZtdM + e.correctionM;
  }
  const fields: AnswerField[] = [
    { name: 'epoch', epochsMs: epoch },
    { name: 'correction_m', numbers: correction },
    { name: 'zwd_m', numbers: zwd },
    { name: 'zhd_source', texts: zhdSource },
    { name: 'sigma_m', numbers: sigma },
    { name: 'north_gradient_m', numbers: north },
    { name: 'east_gradient_m', numbers: east },
    { name: 'north_gradient_sigma_m', numbers: northSigma },
    { name: 'east_gradient_sigma_m', numbers: eastSigma },
    { name: 'epoch_bias_m', numbers: bias },
    { name: 'observations', numbers: used },
    { name: 'ztd_m', numbers: ztd },
  ];
  const met = r.epochMet;
  const metNames = ['zhd_m', 'tm_k', 'pwv_mm', 'pwv_sigma_mm', 'pwv_total_sigma_mm'];
  if (!met) {
    fields.push({ name: 'met' }, ...metNames.map((name) => ({ name })));
    return { rows: n, fields };
  }
  const quality = textColumn(n);
  const values = metNames.map(() => numberColumn(n));
  const absent = metNames.map(() => new Uint8Array(n));
  const [zhd, tm, pwv, pwvSigma, pwvTotalSigma] = values as [number[], number[], number[], number[], number[]];
  const [zhdAbsent, tmAbsent, pwvAbsent, pwvSigmaAbsent, pwvTotalSigmaAbsent] = absent as [
    Uint8Array,
    Uint8Array,
    Uint8Array,
    Uint8Array,
    Uint8Array,
  ];
  for (let k = 0; k < n; k++) {
    const m = met[k];
    quality[k] = m?.met;
    const missing = m === undefined || m.met === 'missing';
    putMet(zhd, zhdAbsent, k, m === undefined ? undefined : m.met === 'missing' ? r.epochZwd[k]!.zhdM : m.zhdM);
    putMet(tm, tmAbsent, k, missing ? undefined : m.tmK);
    putMet(pwv, pwvAbsent, k, missing ? undefined : m.pwvMm);
    putMet(pwvSigma, pwvSigmaAbsent, k, missing ? undefined : m.pwvSigmaMm);
    putMet(pwvTotalSigma, pwvTotalSigmaAbsent, k, missing ? undefined : m.pwvTotalSigmaMm);
  }
  fields.push({ name: 'met', texts: quality }, ...metNames.map((name, j) => ({ name, numbers: values[j], absent: absent[j] })));
  return { rows: n, fields };
}

export function rejectedTable(rejected: ZwdEstimationResult['estimate']['rejected']): AnswerTable {
  const n = rejected.length;
  const epoch = numberColumn(n);
  const satellite = textColumn(n);
  const [index, residual, fitted, normalized] = [numberColumn(n), numberColumn(n), numberColumn(n), numberColumn(n)];
  for (let i = 0; i < n; i++) {
    const x = rejected[i]!;
    index[i] = x.index;
    epoch[i] = x.epochMs;
    satellite[i] = x.satellite;
    residual[i] = x.residualM;
    fitted[i] = x.fittedResidualM;
    normalized[i] = x.normalizedResidual;
  }
  return {
    rows: n,
    fields: [
      { name: 'index', numbers: index },
      { name: 'epoch', epochsMs: epoch },
      { name: 'satellite', texts: satellite },
      { name: 'residual_m', numbers: residual },
      { name: 'fitted_residual_m', numbers: fitted },
      { name: 'normalized_residual', numbers: normalized },
    ],
  };
}

const NULL = Uint8Array.from([0x6e, 0x75, 0x6c, 0x6c]);
const COMMA = 0x2c;
const QUOTE = 0x22;
const CLOSE_BRACKET = 0x5d;

/** `"name":` as bytes, once per field name. */
const keyBytes = new Map<string, Uint8Array>();
export const keyOf = (name: string) =>
  keyBytes.get(name) ?? (keyBytes.set(name, Buffer.from(`${JSON.stringify(name)}:`, 'utf8')), keyBytes.get(name)!);

/** Whether any row has the field (a column is written), or the table has no rows (every column is, empty). */
function hasColumn(table: AnswerTable, field: AnswerField): boolean {
  if (table.rows === 0) return true;
  if (field.epochsMs) return true; // every row has its epoch
  if (field.numbers) return !field.absent || field.absent.includes(0);
  return field.texts?.some((v) => v !== undefined) ?? false;
}

/** `{"field":[…],…}`: numbers rounded to the field's decimals, absent values null, fields without any value left out. */
export function writeColumns(
  out: JsonBytes,
  table: AnswerTable,
  fields: readonly AnswerField[],
  decimals: Record<string, number | undefined>,
) {
  out.byte(0x7b); // {
  let first = true;
  for (const field of fields) {
    if (!hasColumn(table, field)) continue;
    if (!first) out.byte(COMMA);
    first = false;
    out.raw(keyOf(field.name));
    out.byte(0x5b); // [
    const d = decimals[field.name];
    const { numbers, absent, texts, epochsMs } = field;
    if (epochsMs) {
      out.reserve(table.rows * (ISO_EPOCH_MAX_BYTES + 3));
      const b = out.bytes;
      let at = out.length;
      for (let i = 0; i < table.rows; i++) {
        if (i > 0) b[at++] = COMMA;
        b[at++] = QUOTE;
        at = writeIsoEpochAscii(epochsMs[i]!, b, at);
        b[at++] = QUOTE;
      }
      out.length = at;
    } else if (numbers && d !== undefined) {
      out.reserve(table.rows * (MAX_ROUNDED_DECIMAL_BYTES + 1));
      const b = out.bytes;
      let at = out.length;
      for (let i = 0; i < table.rows; i++) {
        if (i > 0) b[at++] = COMMA;
        at = writeRoundedDecimal(b, at, absent?.[i] === 1 ? NaN : numbers[i]!, d);
      }
      out.length = at;
    } else {
      for (let i = 0; i < table.rows; i++) {
        if (i > 0) out.byte(COMMA);
        const v = numbers ? (absent?.[i] === 1 ? NaN : numbers[i]!) : texts?.[i];
        if (typeof v === 'number') out.number(v);
        else if (v === undefined) out.raw(NULL);
        else out.string(v);
      }
    }
    out.byte(CLOSE_BRACKET);
  }
  out.byte(0x7d); // }
}

/** The fields of a table in the answer: all in the spec's order, or those `fields` selects (in its order, once each). */
export function fieldsOf(table: AnswerTable, selected: readonly string[] | undefined, tableKey: string): AnswerField[] {
  if (!selected) return table.fields;
  const byName = new Map(table.fields.map((f) => [f.name, f]));
  const out: AnswerField[] = [];
  for (const name of new Set(selected)) {
    const field = byName.get(name);
    if (!field) throw new Error(`${tableKey}.${name}: not a field of the estimation answer`);
    out.push(field);
  }
  return out;
}

/**
 * The answer of POST /v1/zwd-estimates in the shape asked for: `shape=columns` JSON written by this
 * module; rows and Arrow through the answer objects and tableAnswer as before. (The route's Arrow answer is
 * written from the result by zwd-estimates-arrow.ts; this Arrow branch is the path its test compares with.)
 */
export function zwdEstimatesAnswer(r: ZwdEstimationResult, shape: AnswerShape): TableAnswer {
  if (shape.format === 'arrow' || shape.shape === 'rows') return tableAnswer(zwdEstimatesResponseOf(r), ZWD_ANSWER_TABLES, shape);
  const tables = answerTables(r);
  const selected = selectedFields(ZWD_ANSWER_TABLES, shape.fields);
  // About 12 bytes a rounded value: room for a day without growing.
  const out = new JsonBytes((tables.series!.rows + tables.zwd_nodes!.rows) * 250 + 4096);
  out.byte(0x7b); // {
  for (const [key, table] of Object.entries(tables)) {
    out.raw(keyOf(key));
    writeColumns(out, table, fieldsOf(table, selected[key], key), ZWD_ANSWER_TABLES.tables[key]!);
    out.byte(COMMA);
  }
  // The rest after the tables: JSON.stringify's text of it without its opening brace.
  const rest = Buffer.from(JSON.stringify(zwdAnswerSummaryOf(r)), 'utf8');
  out.raw(rest.subarray(1));
  // Bytes that own their buffer exactly: the worker moves them to the event loop instead of copying
  // (compute-worker.ts ownedBuffers; a view of part of a buffer would be copied with all of it).
  return { bytes: out.bytes.slice(0, out.length), contentType: 'application/json' };
}
