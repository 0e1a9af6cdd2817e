/**
 * Preload for a service under measurement (`node --import ./bench/gc-watch.mjs …`, used by bench/edge-swing.ts):
 * counts the event-loop thread's garbage collections by kind (minor = scavenge, major = mark-compact,
 * incremental = the marking steps before a major) and their duration, and on SIGUSR2 writes them with
 * process.memoryUsage() as JSON to GCWATCH_FILE (default /tmp/gcwatch.json). Worker threads are not counted.
 */

import { writeFileSync } from 'node:fs';
import { constants, PerformanceObserver } from 'node:perf_hooks';
import { isMainThread } from 'node:worker_threads';

if (isMainThread) {
  const kinds = {
    [constants.NODE_PERFORMANCE_GC_MINOR]: 'minor',
    [constants.NODE_PERFORMANCE_GC_MAJOR]: 'major',
    [constants.NODE_PERFORMANCE_GC_INCREMENTAL]: 'incremental',
    [constants.NODE_PERFORMANCE_GC_WEAKCB]: 'weakcb',
  };
  const stats = {};
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries()) {
      const kind = kinds[entry.detail?.kind] ?? 'other';
      const s = (stats[kind] ??= { count: 0, ms: 0 });
      s.count++;
      s.ms += entry.duration;
    }
  }).observe({ entryTypes: ['gc'] });
  process.on('SIGUSR2', () => {
    const m = process.memoryUsage();
    const file = process.env.GCWATCH_FILE ?? '/tmp/gcwatch.json';
    writeFileSync(file, JSON.stringify({ stats, heapUsed: m.heapUsed, heapTotal: m.heapTotal, external: m.external, rss: m.rss }));
  });
}
