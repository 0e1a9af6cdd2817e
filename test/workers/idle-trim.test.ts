/**
 * The idle trim of a worker thread (src/workers/idle-trim.ts, TROPODELAY_WORKER_IDLE_TRIM_S): a thread without a
 * task for `idleTrimMs` collects its garbage, and TRIM_RATE_WINDOW_MS later once more, which gives its young
 * generation back; it answers as before. Real worker threads with the probe task of
 * test/helpers/pool-probe-task.ts (`youngGenerationTask`: the new space's resident bytes and the thread's idle
 * collections and trims so far) and the real estimation task.
 */

import { describe, expect, it } from 'vitest';
import { COMPUTE_TASKS } from '../../src/http/compute-tasks.js';
import { warmUpBody } from '../../src/http/tasks/warm-up.js';
import type { zwdRequestTask } from '../../src/http/tasks/zwd-request.js';
import { ComputePool } from '../../src/workers/compute-pool.js';
import { TRIM_RATE_WINDOW_MS } from '../../src/workers/idle-trim.js';

const MB = 1024 * 1024;
const probeModule = new URL('../helpers/pool-probe-task.ts', import.meta.url).href;
type Tasks = {
  young: (input: { grow?: boolean }) => Promise<{
    ok: true;
    output: { threadId: number; newSpaceBytes: number; idleCollections: number; idleTrims: number; observations: number };
  }>;
  estimate: typeof zwdRequestTask;
};

function pool(idleTrimMs?: number): ComputePool<Tasks> {
  return new ComputePool<Tasks>({
    threads: 1,
    queueLimit: 8,
    tasks: { young: { module: probeModule, exportName: 'youngGenerationTask' }, estimate: COMPUTE_TASKS['zwd-estimate-request'] },
    ...(idleTrimMs !== undefined ? { idleTrimMs } : {}),
  });
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
/** Room for timers on a loaded machine [ms] (common practice). */
const SLACK_MS = 500;

describe('the idle trim of a worker thread', () => {
  it('collects once after idleTrimMs without a task, and again only after the next task', async () => {
    const p = pool(100);
    try {
      expect((await p.run('young', {})).idleCollections).toBe(0);
      await sleep(100 + SLACK_MS);
      expect((await p.run('young', {})).idleCollections).toBe(1);
      await sleep(100 + SLACK_MS);
      const later = await p.run('young', {});
      expect(later.idleCollections).toBe(2); // the task before armed it again
      expect(later.idleTrims).toBe(0); // each task came before the second collection
    } finally {
      await p.close();
    }
  });

  it('never collects with idleTrimMs 0 or absent (the pool’s default; the service passes its setting)', async () => {
    for (const p of [pool(0), pool()]) {
      try {
        await p.run('young', {});
        await sleep(400);
        expect((await p.run('young', {})).idleCollections).toBe(0);
      } finally {
        await p.close();
      }
    }
  });

  it('no collection while tasks follow each other closer than idleTrimMs', async () => {
    const p = pool(1500);
    try {
      for (let i = 0; i < 4; i++) {
        await p.run('young', {});
        await sleep(300);
      }
      expect((await p.run('young', {})).idleCollections).toBe(0);
    } finally {
      await p.close();
    }
  });

  it('gives the young generation back after the two collections, and the estimation answers byte for byte as before', async () => {
    const p = pool(100);
    try {
      const body = warmUpBody();
      const before = await p.run('estimate', { body: body.slice(), format: 'json', query: {}, queryKeys: [] });
      const grown = await p.run('young', { grow: true });
      expect(grown.newSpaceBytes).toBeGreaterThan(8 * MB); // measured 32–34 MB (vitest's default semi-space and the service's)
      await sleep(100 + TRIM_RATE_WINDOW_MS + 2 * SLACK_MS);
      const trimmed = await p.run('young', {});
      expect(trimmed.idleTrims).toBe(1);
      expect(trimmed.newSpaceBytes).toBeLessThan(grown.newSpaceBytes / 4); // measured ~1 MB after a trim
      const after = await p.run('estimate', { body: body.slice(), format: 'json', query: {}, queryKeys: [] });
      expect(Buffer.from(after.json).equals(Buffer.from(before.json))).toBe(true);
    } finally {
      await p.close();
    }
  }, 30_000);
});
