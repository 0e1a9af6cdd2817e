/**
 * Child process of bench/json-read.bench.ts: one kind of work (argument 1) on one benchmark day's columns
 * JSON (argument 2: "gps" or "four"), once per message from the parent, answering with its whole process's
 * CPU time so far [ms] (all threads: the parent takes the differences between answers, so each run's
 * garbage collection, also on helper threads, is counted where it happens). The work:
 * - "parse-text": the parse step before the reader (the bytes as text, JSON.parse, checkedObservationColumns);
 * - "parse-read": the parse step with the reader (readJsonColumnsBody, observationsFromJsonColumns);
 * - "task": handleZwdRequest of this tree, the body as bytes; "task-text": the same given the body as text
 *   (the general path); "task:<root>": handleZwdRequest of an older source tree at <root>.
 */

import { pathToFileURL } from 'node:url';
import { MAX_OBSERVATIONS } from '../src/limits.js';
import { readJsonColumnsBody } from '../src/formats/json-columns-reader.js';
import { checkedObservationColumns, observationsFromJsonColumns } from '../src/http/adapters/zwd-estimation.js';
import { columnSpecsOf, jsonColumnSpecsOf, type ColumnSpec } from '../src/http/columns.js';
import { zwdObservationSchema } from '../src/http/schemas/zwd-estimates.js';
import type { handleZwdRequest } from '../src/http/tasks/zwd-request.js';
import { dayBody } from './json-read-day.js';

const work = process.argv[2] ?? 'task';
const bytes = dayBody(process.argv[3] === 'four' ? 'four' : 'gps');
const SPECS = columnSpecsOf(zwdObservationSchema.shape) as Parameters<typeof checkedObservationColumns>[1] & Record<string, ColumnSpec>;
const JSON_SPECS = jsonColumnSpecsOf(SPECS);

async function runOf(): Promise<() => Promise<unknown>> {
  if (work === 'parse-text') {
    return async () => {
      const raw = JSON.parse(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8')) as { observations: unknown };
      if (!checkedObservationColumns(raw.observations, SPECS, MAX_OBSERVATIONS)) throw new Error('not checked');
    };
  }
  if (work === 'parse-read') {
    return async () => {
      const read = readJsonColumnsBody(bytes, 'observations', JSON_SPECS, MAX_OBSERVATIONS);
      if (!read) throw new Error('not read');
      observationsFromJsonColumns(read);
    };
  }
  const root = work.startsWith('task:') ? work.slice(5) : undefined;
  const url = root
    ? pathToFileURL(`${root}/src/http/tasks/zwd-request.ts`).href
    : new URL('../src/http/tasks/zwd-request.ts', import.meta.url).href;
  const handle = ((await import(url)) as { handleZwdRequest: typeof handleZwdRequest }).handleZwdRequest;
  const body = work === 'task-text' ? Buffer.from(bytes).toString('utf8') : bytes;
  return async () => {
    const outcome = await handle({ body, format: 'json', query: {} });
    if (!outcome.ok) throw new Error(JSON.stringify(outcome.error).slice(0, 300));
  };
}

const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

const run = await runOf();
process.on('message', (message) => {
  if (message === 'stop') process.exit(0);
  void run().then(() => process.send!({ cpuMs: cpuMs() }));
});
process.send!({ cpuMs: cpuMs() });
