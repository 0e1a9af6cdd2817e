/**
 * Where the bytes of one large estimation request go, stage by stage, in one process (run by hand:
 * `node --expose-gc --import tsx bench/service-memory.child.ts <days> <json|arrow> [stages]`): GPS-like days (one
 * constellation of 30 satellites at 30 s, 7–11 in view) as columns JSON or Arrow, then the worker task
 * (handleZwdRequest) as the pool runs it. For each stage: the heap and array buffers kept after it
 * (after a full GC) and the resident-set peak during it (VmHWM, reset before the stage through
 * /proc/self/clear_refs), so the stage's own transient bytes show. With `stages` (columns JSON), the task's steps
 * one by one: body text, JSON.parse, column checks, domain columns, estimation, answer bytes. With `held`, what
 * the pool's task (zwdRequestTask) still holds when its estimation starts (heap and array buffers after a full GC
 * at the zwdEstimationStart channel), in alternate runs: the task owning its input (as in the pool) and the body
 * also held by the caller (as the task held it before it dropped it once read); `held` takes the run count.
 * With `estimator [root]` (columns JSON), the estimation step alone (runZwdEstimation on the domain request, in a
 * process that has settled after building it): its peak RSS over the RSS before it and per observation, as JSON,
 * for the source tree at root (default this one; bench/estimation.bench.ts runs it for two trees by turns).
 */

import { readFileSync, writeFileSync } from 'node:fs';
import { subscribe } from 'node:diagnostics_channel';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { getHeapStatistics } from 'node:v8';
import { handleZwdRequest, zwdEstimationStart, zwdRequestTask } from '../src/http/tasks/zwd-request.js';
import { columnsArrow, columnsJson, gpsLikeColumns } from '../test/helpers/gps-like-days.js';
import { readColumns, columnSpecsOf } from '../src/http/columns.js';
import { observationsFromColumns, toZwdRequest, zwdEstimatesResponseOf } from '../src/http/adapters/zwd-estimation.js';
import { zwdEstimatesColumnarRest, zwdObservationSchema, ZWD_ANSWER_TABLES } from '../src/http/schemas/zwd-estimates.js';
import { runZwdEstimation } from '../src/services/zwd-estimation.js';
import { tableAnswer } from '../src/http/table-answer.js';

const MB = 1024 * 1024;
const status = (field: string) => Number(new RegExp(`${field}:\\s+(\\d+) kB`).exec(readFileSync('/proc/self/status', 'utf8'))![1]) / 1024;
const gc = () => (globalThis as { gc?: () => void }).gc?.();

async function main() {
  const days = Number(process.argv[2] ?? 30);
  const format = (process.argv[3] ?? 'json') as 'json' | 'arrow';
  let body: Uint8Array<ArrayBuffer> | undefined;
  {
    const req = gpsLikeColumns(days);
    body = format === 'json' ? columnsJson(req) : columnsArrow(req);
    process.stdout.write(`${days} GPS-like days: ${req.count} observations, ${format} ${(body.byteLength / 1e6).toFixed(1)} MB\n`);
  }
  gc();
  const line = (stage: string) => {
    const m = process.memoryUsage();
    process.stdout.write(
      `${stage.padEnd(28)} peak RSS ${status('VmHWM').toFixed(0).padStart(5)} MB, after: RSS ${(m.rss / MB).toFixed(0).padStart(5)}, heap ${(m.heapUsed / MB).toFixed(0).padStart(4)}, buffers ${(m.arrayBuffers / MB).toFixed(0).padStart(4)}\n`,
    );
  };
  line('before the task');
  if (process.argv[4] === 'held') {
    // At the estimation's start, after a full GC: the heap over that before the task, and whether the body's
    // bytes were collected (a WeakRef to them, made in an earlier job so that it does not keep them alive).
    const runs = Number(process.argv[5] ?? 4);
    const bytes = body!;
    body = undefined;
    let atStart: { heapMb: number; bodyCollected: boolean } | undefined;
    let bodyRef: WeakRef<ArrayBuffer> | undefined;
    const heapMb = () => {
      gc();
      return getHeapStatistics().used_heap_size / MB;
    };
    subscribe(zwdEstimationStart.name, () => (atStart = { heapMb: heapMb(), bodyCollected: bodyRef!.deref() === undefined }));
    for (let r = 0; r < runs; r++) {
      const callerHolds = r % 2 === 1;
      const base = heapMb();
      // The input object is the task's alone (as the pool's thread receives it); the caller's copy is the only other holder.
      let held: Uint8Array | undefined = bytes.slice();
      bodyRef = new WeakRef(held.buffer as ArrayBuffer);
      const input = {
        body: held,
        format,
        query: {},
        answer: { shape: 'rows' as const, format: 'json' as const, fields: ['ztd_m', 'sigma_m'] },
      };
      if (!callerHolds) held = undefined;
      await new Promise((resolve) => setImmediate(resolve));
      const rssBefore = status('VmRSS');
      writeFileSync('/proc/self/clear_refs', '5');
      const outcome = await zwdRequestTask(input);
      const peakMb = status('VmHWM') - rssBefore;
      if (!outcome.ok) throw new Error(JSON.stringify(outcome.error));
      held = undefined;
      process.stdout.write(
        `${callerHolds ? 'body held by the caller' : 'task owns its input    '}: at the estimation's start heap +${(atStart!.heapMb - base).toFixed(1)} MB, body bytes ${atStart!.bodyCollected ? 'collected' : 'alive'}; the task's peak RSS +${peakMb.toFixed(0)} MB\n`,
      );
    }
    return;
  }
  if (format === 'json' && process.argv[4] === 'estimator') {
    // The estimation step alone (runZwdEstimation on the domain request), in a process that has settled: its
    // peak RSS over the RSS before it, per observation. argv[5]: the root of the source tree whose estimation
    // service runs (default this one; `git archive <commit> src | tar -x -C <dir>` for the code before).
    const root = process.argv[5] ?? fileURLToPath(new URL('..', import.meta.url));
    const run = (
      (await import(pathToFileURL(`${root}/src/services/zwd-estimation.ts`).href)) as { runZwdEstimation: typeof runZwdEstimation }
    ).runZwdEstimation;
    let request: Parameters<typeof runZwdEstimation>[0] | undefined;
    {
      const raw = JSON.parse(Buffer.from(body!).toString('utf8')) as { observations: Record<string, unknown[]> };
      const read = readColumns(raw.observations, 'observations', columnSpecsOf(zwdObservationSchema.shape), Infinity, 'observations');
      if (!read.ok) throw new Error('columns');
      const rest = zwdEstimatesColumnarRest.parse(raw) as unknown as Parameters<typeof toZwdRequest>[1] & {
        site: { latitude_deg: number; longitude_deg: number; height_m: number };
      };
      const site = { latitudeDeg: rest.site.latitude_deg, longitudeDeg: rest.site.longitude_deg, heightM: rest.site.height_m };
      request = toZwdRequest(site, rest, observationsFromColumns(read.columns));
    }
    body = undefined;
    const observations = request.observations.epochMs.length;
    // Let the collector and V8's page unmapper hand back what building the request freed.
    for (let i = 0; i < 3; i++) {
      gc();
      await new Promise((resolve) => setTimeout(resolve, 300));
    }
    const before = status('VmRSS');
    const heapBefore = process.memoryUsage();
    writeFileSync('/proc/self/clear_refs', '5');
    const started = process.cpuUsage();
    const result = run(request);
    const cpu = process.cpuUsage(started);
    const peak = status('VmHWM') - before;
    gc();
    const after = process.memoryUsage();
    process.stdout.write(
      `${JSON.stringify({
        root,
        observations,
        solutions: result.estimate.statistics.solutions,
        rssBeforeMb: +before.toFixed(1),
        peakOverBeforeMb: +peak.toFixed(1),
        peakBytesPerObservation: Math.round((peak * MB) / observations),
        keptHeapMb: +((after.heapUsed - heapBefore.heapUsed) / MB).toFixed(1),
        keptArrayBuffersMb: +((after.arrayBuffers - heapBefore.arrayBuffers) / MB).toFixed(1),
        cpuMs: Math.round((cpu.user + cpu.system) / 1000),
      })}\n`,
    );
    return;
  }
  if (format === 'json' && process.argv[4] === 'stages') {
    // The task's stages one by one (as handleZwdRequest runs them for columns JSON), each kept alive.
    const stage = <T>(name: string, run: () => T): T => {
      writeFileSync('/proc/self/clear_refs', '5');
      const out = run();
      gc();
      line(name);
      return out;
    };
    const text = stage('body as text', () => Buffer.from(body!).toString('utf8'));
    const raw = stage('JSON.parse', () => JSON.parse(text) as { observations: Record<string, unknown[]> });
    const read = stage('column checks', () =>
      readColumns(raw.observations, 'observations', columnSpecsOf(zwdObservationSchema.shape), Infinity, 'observations'),
    );
    if (!read.ok) throw new Error('columns');
    const obs = stage('domain columns', () => observationsFromColumns(read.columns));
    const rest = zwdEstimatesColumnarRest.parse(raw) as unknown as Parameters<typeof toZwdRequest>[1] & {
      site: { latitude_deg: number; longitude_deg: number; height_m: number };
    };
    const site = { latitudeDeg: rest.site.latitude_deg, longitudeDeg: rest.site.longitude_deg, heightM: rest.site.height_m };
    const result = stage('estimation', () => runZwdEstimation(toZwdRequest(site, rest, obs)));
    stage('answer bytes', () =>
      tableAnswer(zwdEstimatesResponseOf(result), ZWD_ANSWER_TABLES, { shape: 'rows', format: 'json', fields: ['ztd_m', 'sigma_m'] }),
    );
    return;
  }
  writeFileSync('/proc/self/clear_refs', '5');
  const outcome = await handleZwdRequest({
    body: body!,
    format,
    query: {},
    answer: { shape: 'rows', format: 'json', fields: ['ztd_m', 'sigma_m'] },
  });
  line('task (kept: body, answer)');
  if (!outcome.ok) throw new Error(JSON.stringify(outcome.error));
  process.stdout.write(`answer ${(outcome.output.json.byteLength / 1e6).toFixed(1)} MB\n`);
  body = undefined;
  gc();
  line('after, body dropped');
}

if (import.meta.url === `file://${process.argv[1]}`) await main();
