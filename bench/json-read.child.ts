/**
 * Child process of bench/json-read.bench.ts: one kind of work (argument 1) on one benchmark day's columns
 * JSON (argument 2: "gps" or "four"), once per message from the parent, answering with its whole process's
 * CPU time so far [ms] (all threads: the parent takes the differences between answers, so each run's
 * garbage collection, also on helper threads, is counted where it happens). The work:
 * - "parse-text": the parse step before the reader (the bytes as text, JSON.parse, checkedObservationColumns);
 * - "parse-read": the parse step with the reader, as the estimation task runs it (readJsonColumnsBody,
 *   typedObservationsFromJsonColumns: checked domain columns, typed); "parse-read:<root>": the same with the
 *   reader and adapters of an older source tree at <root>;
 * - "task": handleZwdRequest of this tree, the body as bytes; "task-text": the same given the body as text
 *   (the general path); "task:<root>": handleZwdRequest of an older source tree at <root>.
 * BENCH_FROM_DIST=1: the code of each tree from its dist/ (the tsc output, as `npm start` runs it) instead of
 * its src/ under tsx.
 */

import { pathToFileURL } from 'node:url';
import { MAX_OBSERVATIONS } from '../src/limits.js';
import type { readJsonColumnsBody } from '../src/formats/json-columns-reader.js';
import { checkedObservationColumns } from '../src/http/adapters/zwd-estimation.js';
import type { typedObservationsFromJsonColumns } from '../src/http/adapters/zwd-estimation.js';
import { columnSpecsOf, jsonColumnSpecsOf, type ColumnSpec } from '../src/http/columns.js';
import { zwdObservationSchema } from '../src/http/schemas/zwd-estimates.js';
import type { handleZwdRequest } from '../src/http/tasks/zwd-request.js';
import { dayBody } from './json-read-day.js';

const [work = 'task', day] = process.argv.slice(2);
const bytes = dayBody(day === 'four' ? 'four' : 'gps');
const SPECS = columnSpecsOf(zwdObservationSchema.shape) as Parameters<typeof checkedObservationColumns>[1] & Record<string, ColumnSpec>;
const FROM_DIST = process.env.BENCH_FROM_DIST === '1';

/** The module at `path` (relative to src/, without extension) of the tree at `root` (this tree by default). */
async function moduleOf<T>(path: string, root = new URL('..', import.meta.url).pathname): Promise<T> {
  const file = FROM_DIST ? `${root}/dist/${path}.js` : `${root}/src/${path}.ts`;
  return (await import(pathToFileURL(file).href)) as T;
}

async function runOf(): Promise<() => Promise<unknown>> {
  const [kind, root] = work.split(/:(.*)/s) as [string, string | undefined];
  if (kind === 'parse-text') {
    return async () => {
      const raw = JSON.parse(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8')) as { observations: unknown };
      if (!checkedObservationColumns(raw.observations, SPECS, MAX_OBSERVATIONS)) throw new Error('not checked');
    };
  }
  if (kind === 'parse-read') {
    const { readJsonColumnsBody: read } = await moduleOf<{ readJsonColumnsBody: typeof readJsonColumnsBody }>(
      'formats/json-columns-reader',
      root,
    );
    const { typedObservationsFromJsonColumns: typed } = await moduleOf<{
      typedObservationsFromJsonColumns: typeof typedObservationsFromJsonColumns;
    }>('http/adapters/zwd-estimation', root);
    const columns = await moduleOf<{ columnSpecsOf: typeof columnSpecsOf; jsonColumnSpecsOf: typeof jsonColumnSpecsOf }>(
      'http/columns',
      root,
    );
    const schemas = await moduleOf<{ zwdObservationSchema: typeof zwdObservationSchema }>('http/schemas/zwd-estimates', root);
    const specs = columns.jsonColumnSpecsOf(columns.columnSpecsOf(schemas.zwdObservationSchema.shape));
    return async () => {
      const result = read(bytes, 'observations', specs, MAX_OBSERVATIONS);
      if (!result) throw new Error('not read');
      typed(result);
    };
  }
  const { handleZwdRequest: handle } = await moduleOf<{ handleZwdRequest: typeof handleZwdRequest }>('http/tasks/zwd-request', root);
  const body = kind === 'task-text' ? Buffer.from(bytes).toString('utf8') : bytes;
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
