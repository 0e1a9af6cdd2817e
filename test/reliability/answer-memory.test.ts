/**
 * Issue 11 "done when": 24 clients that ask for the largest allowed answer (two epochs 30 days apart
 * at 30-s ZWD nodes: 86 401 + 121 nodes, under MAX_ANSWER_NODES) and never read it keep the
 * server's resident memory under 1 GB (read from /proc/<pid>/status, VmRSS). The server runs in a
 * child process (test/helpers/server-process.ts); the clients are raw sockets that send the request
 * and pause, so the answers pile up in the server. The test waits until the server has finished all
 * 24 computations (the compute-duration count of GET /metrics), bounded in time, then reads RSS.
 * Linux only (/proc).
 */

import { readFileSync } from 'node:fs';
import { connect, type Socket } from 'node:net';
import { afterAll, describe, expect, it } from 'vitest';
import { startServerProcess, type ServerProcess } from '../helpers/server-process.js';

const CLIENTS = 24;
const T0 = Date.UTC(2026, 2, 14);
const BODY = JSON.stringify({
  site: { latitude_deg: 46.2, longitude_deg: 7.4, height_m: 520 },
  observations: [
    { epoch: new Date(T0).toISOString(), satellite: 'G05', elevation_deg: 41.5, azimuth_deg: 120, residual_m: 0.012 },
    { epoch: new Date(T0 + 30 * 86_400_000).toISOString(), satellite: 'G07', elevation_deg: 38.2, azimuth_deg: 250, residual_m: -0.004 },
  ],
  options: { zwd_interval_s: 30 },
});

const rssBytes = (pid: number) => Number(/VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))![1]) * 1024;

async function computationsDone(baseUrl: string): Promise<number> {
  const text = await (await fetch(`${baseUrl}/metrics`)).text();
  let n = 0;
  for (const m of text.matchAll(/^tropodelay_compute_duration_seconds_count\{[^}]*\} (\d+)/gm)) n += Number(m[1]);
  return n;
}

describe.runIf(process.platform === 'linux')('24 clients that never read the largest allowed answer', () => {
  let server: ServerProcess | undefined;
  const sockets: Socket[] = [];
  afterAll(async () => {
    for (const s of sockets) s.destroy();
    await server?.stop();
  });

  it('keep the server under 1 GB RSS', async () => {
    server = await startServerProcess({ ESTIMATION_WORKERS: '2', ESTIMATION_QUEUE_LIMIT: '32', REQUEST_TIMEOUT_MS: '600000' }, true);
    const { port } = new URL(server.baseUrl);
    const before = await computationsDone(server.baseUrl);
    for (let k = 0; k < CLIENTS; k++) {
      const s = connect(Number(port), '127.0.0.1');
      s.on('error', () => {});
      s.write(
        `POST /v1/zwd-estimates HTTP/1.1\r\nHost: 127.0.0.1\r\nContent-Type: application/json\r\nContent-Length: ${Buffer.byteLength(BODY)}\r\n\r\n${BODY}`,
      );
      s.pause(); // never read: the answer stays in the server's buffers
      sockets.push(s);
    }
    const deadline = Date.now() + 400_000;
    let peak = 0;
    let done = 0;
    while (Date.now() < deadline) {
      peak = Math.max(peak, rssBytes(server.child.pid!));
      done = (await computationsDone(server.baseUrl)) - before;
      if (done >= CLIENTS) break;
      await new Promise((r) => setTimeout(r, 500));
    }
    await new Promise((r) => setTimeout(r, 1000)); // the last answers are written to their sockets
    peak = Math.max(peak, rssBytes(server.child.pid!));
    expect(done).toBe(CLIENTS);
    expect(peak).toBeLessThan(1024 ** 3);
    // The answers held were the real ones: each socket, read now, starts with a 200.
    const statusLines = await Promise.all(
      sockets.map(
        (s) =>
          new Promise<string>((resolve) => {
            s.once('data', (chunk: Buffer) => resolve(chunk.subarray(0, 12).toString('latin1')));
            s.resume();
          }),
      ),
    );
    expect(statusLines).toEqual(new Array(CLIENTS).fill('HTTP/1.1 200'));
    console.log(`peak RSS ${(peak / 1024 ** 2).toFixed(0)} MiB with ${CLIENTS} unread answers`);
  }, 480_000);
});
