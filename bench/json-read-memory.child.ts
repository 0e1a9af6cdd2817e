/**
 * The resident-set peak of the parse step alone on a large columns JSON body (issue 14: a 30-day request of
 * 825 691 observations, 72.8 MB), in a fresh process (run by hand:
 * `node --expose-gc --max-semi-space-size=32 --import tsx bench/json-read-memory.child.ts <file> <text|read>`,
 * the file written once by `… json-read-memory.child.ts <file> write <days>`): the body's bytes read from
 * the file, a full GC, the peak reset (/proc/self/clear_refs), then the parse step: "text" as before the
 * reader (the bytes as text, JSON.parse, checkedObservationColumns), "read" with it (readJsonColumnsBody,
 * observationsFromJsonColumns). Prints the RSS before and the peak during the step, and the heap and array
 * buffers kept after it (a full GC, the domain columns alive).
 */

import { readFileSync, writeFileSync } from 'node:fs';
import { MAX_OBSERVATIONS } from '../src/limits.js';
import { readJsonColumnsBody } from '../src/formats/json-columns-reader.js';
import { checkedObservationColumns, observationsFromJsonColumns } from '../src/http/adapters/zwd-estimation.js';
import { columnSpecsOf, jsonColumnSpecsOf, type ColumnSpec } from '../src/http/columns.js';
import { zwdObservationSchema } from '../src/http/schemas/zwd-estimates.js';
import { columnsJson, gpsLikeColumns } from '../test/helpers/gps-like-days.js';

const [file, mode, days] = process.argv.slice(2) as [string, string, string | undefined];
if (mode === 'write') {
  writeFileSync(file, columnsJson(gpsLikeColumns(Number(days ?? 30))));
  process.exit(0);
}
const MB = 1024 * 1024;
const status = (field: string) => Number(new RegExp(`${field}:\\s+(\\d+) kB`).exec(readFileSync('/proc/self/status', 'utf8'))![1]) / 1024;
const gc = (globalThis as { gc?: () => void }).gc!;
const SPECS = columnSpecsOf(zwdObservationSchema.shape) as Parameters<typeof checkedObservationColumns>[1] & Record<string, ColumnSpec>;
const JSON_SPECS = jsonColumnSpecsOf(SPECS);

const bytes = new Uint8Array(readFileSync(file));
gc();
writeFileSync('/proc/self/clear_refs', '5');
const before = status('VmRSS');
const columns =
  mode === 'text'
    ? checkedObservationColumns(
        (JSON.parse(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8')) as { observations: unknown })
          .observations,
        SPECS,
        MAX_OBSERVATIONS,
      )
    : observationsFromJsonColumns(readJsonColumnsBody(bytes, 'observations', JSON_SPECS, MAX_OBSERVATIONS)!);
const peak = status('VmHWM');
gc();
const m = process.memoryUsage();
process.stdout.write(
  `${mode}: ${columns!.epochMs.length} observations, ${(bytes.length / 1e6).toFixed(1)} MB; RSS before ${before.toFixed(0)} MB, peak during the step +${(peak - before).toFixed(0)} MB; kept after a full GC: heap ${(m.heapUsed / MB).toFixed(0)} MB, array buffers ${(m.arrayBuffers / MB).toFixed(0)} MB\n`,
);
