/**
 * The hand-over between the event loop and the worker threads (DEVELOPERS.md, "What the hand-over costs"):
 * a body handed over as the chunks it arrived in is moved (detached here) and joined in the worker into the
 * very bytes the chunks make (the reference: their SHA-256 joined on this side before the hand-over); an
 * output's buffer given back with ComputePool.release goes to a worker with the next task (detached here
 * then, not before), and giving one back twice, or one already moved, does not fail the next task. Through
 * the route: the answer's bytes are given back once sent, and they are the bytes the client got.
 */

import { createHash } from 'node:crypto';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { buildApp } from '../../src/http/app.js';
import { ComputePool } from '../../src/workers/compute-pool.js';
import { dayRequest } from '../helpers/gps-like-days.js';
import type { bodyProbeTask } from '../helpers/pool-probe-task.js';

const probe = { module: new URL('../helpers/pool-probe-task.ts', import.meta.url).href, exportName: 'bodyProbeTask' };
type Tasks = { probe: typeof bodyProbeTask };
const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/** `bytes` cut into chunks of the given sizes (the last takes the rest), each its own buffer, as Node's HTTP parser gives them. */
function chunksOf(bytes: Uint8Array, sizes: number[]): Uint8Array<ArrayBuffer>[] {
  const chunks: Uint8Array<ArrayBuffer>[] = [];
  let at = 0;
  for (const size of [...sizes, bytes.byteLength]) {
    if (at >= bytes.byteLength) break;
    chunks.push(bytes.slice(at, Math.min(bytes.byteLength, at + size)));
    at += size;
  }
  return chunks;
}

describe('ComputePool: bodies in chunks, buffers given back (real worker threads)', () => {
  let pool: ComputePool<Tasks>;
  beforeAll(() => {
    pool = new ComputePool<Tasks>({ threads: 1, queueLimit: 8, tasks: { probe } });
  });
  afterAll(async () => {
    await pool.close();
  });

  it('a body in chunks is moved, and the task sees one array of the same bytes that owns its buffer', async () => {
    const bytes = new TextEncoder().encode(JSON.stringify({ ...dayRequest().rest, note: 'ünïcode ✓'.repeat(1000) }));
    for (const sizes of [[], [1], [65_536, 7, 65_536], Array.from({ length: 40 }, (_, i) => 1 + ((i * 7919) % 4096))]) {
      const chunks = chunksOf(bytes, sizes);
      const expected = sha256(Buffer.concat(chunks));
      const output = await pool.run(
        'probe',
        { body: chunks, size: 0 },
        chunks.map((c) => c.buffer),
      );
      expect(output).toMatchObject({ length: bytes.byteLength, sha256: expected, ownsBuffer: true });
      expect(chunks.every((c) => c.byteLength === 0)).toBe(true); // moved, not copied
    }
    const none = await pool.run('probe', { body: [], size: 0 });
    expect(none).toMatchObject({ length: 0, sha256: sha256(new Uint8Array(0)) });
  }, 60_000);

  it('a body in one array reaches the task as before', async () => {
    const body = new Uint8Array([1, 2, 3, 250]);
    expect(await pool.run('probe', { body, size: 0 })).toMatchObject({ length: 4, sha256: sha256(new Uint8Array([1, 2, 3, 250])) });
  }, 60_000);

  it('a buffer given back moves to a worker with the next task, not before; twice or already moved does no harm', async () => {
    const output = await pool.run('probe', { body: new Uint8Array(1), size: 100_000 });
    expect(output.json.byteLength).toBe(100_000);
    pool.release(output.json.buffer as ArrayBuffer);
    pool.release(output.json.buffer as ArrayBuffer); // twice: moved once
    expect(output.json.byteLength).toBe(100_000); // still here until a task goes
    const moved = new ArrayBuffer(8);
    structuredClone(moved, { transfer: [moved] });
    pool.release(moved); // already detached
    const next = await pool.run('probe', { body: new Uint8Array(2), size: 10 });
    expect(next.length).toBe(2);
    expect(output.json.byteLength).toBe(0); // moved with that task
  }, 60_000);
});

describe('POST /v1/zwd-estimates: the answer bytes are given back once sent', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await buildApp();
  });
  afterAll(async () => {
    await app.close();
  });

  it('release gets the bytes the client got, and they move to the worker with the next request', async () => {
    const { rest, columns } = dayRequest();
    const payload = JSON.stringify({ ...rest, observations: columns });
    const release = vi.spyOn(app.compute, 'release');
    const send = () => app.inject({ method: 'POST', url: '/v1/zwd-estimates', headers: { 'content-type': 'application/json' }, payload });
    const first = await send();
    expect(first.statusCode).toBe(200);
    expect(release).toHaveBeenCalledTimes(1);
    const given = release.mock.calls[0]![0];
    expect(Buffer.from(given).equals(first.rawPayload)).toBe(true);
    const second = await send();
    expect(second.rawPayload.equals(first.rawPayload)).toBe(true);
    expect(given.byteLength).toBe(0); // moved to the worker with the second request's task
    release.mockRestore();
  }, 120_000);
});
