/**
 * What the client tests run against: the service in its own process (test/helpers/server-process.ts) on
 * an SQLite archive in a temporary folder, with keys from the environment; a counting proxy in front of it
 * that can be told to fail, so an upload is interrupted at a known request; and streams that capture what
 * the CLI writes (one of them claiming to be a terminal).
 */

import { mkdtempSync, rmSync } from 'node:fs';
import { createServer, request as httpRequest, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { main } from '../../client/src/cli.js';
import { startServerProcess, type ServerProcess } from '../helpers/server-process.js';

export const WRITE_KEY = 'client-tests-writer-0123456789';
export const ADMIN_KEY = 'client-tests-admin-0123456789';

export interface RunningService {
  baseUrl: string;
  dataDir: string;
  /** A folder for the test's input and output files (removed with the service). */
  workDir: string;
  stop(): Promise<void>;
}

export async function startRunningService(env: Record<string, string> = {}): Promise<RunningService> {
  const dataDir = mkdtempSync(join(tmpdir(), 'tropodelay-client-data-'));
  const workDir = mkdtempSync(join(tmpdir(), 'tropodelay-client-work-'));
  let server: ServerProcess;
  try {
    server = await startServerProcess({
      TROPODELAY_DATA_DIR: dataDir,
      TROPODELAY_API_KEYS: `uploader:write:${WRITE_KEY},operator:admin:${ADMIN_KEY}`,
      TROPODELAY_ESTIMATION_WORKERS: '1',
      ...env,
    });
  } catch (err) {
    rmSync(dataDir, { recursive: true, force: true });
    rmSync(workDir, { recursive: true, force: true });
    throw err;
  }
  return {
    baseUrl: server.baseUrl,
    dataDir,
    workDir,
    stop: async () => {
      await server.stop();
      rmSync(dataDir, { recursive: true, force: true });
      rmSync(workDir, { recursive: true, force: true });
    },
  };
}

/** A JSON request with the admin key, for setting up and reading back independently of the client. */
export async function adminJson(baseUrl: string, method: string, path: string, body?: unknown): Promise<{ status: number; body: any }> {
  const response = await fetch(`${baseUrl}${path}`, {
    method,
    headers: { authorization: `Bearer ${ADMIN_KEY}`, ...(body !== undefined ? { 'content-type': 'application/json' } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await response.text();
  return { status: response.status, body: text ? JSON.parse(text) : undefined };
}

/** Creates an invented station (201) for a test. */
export async function createStation(baseUrl: string, stationId: string): Promise<void> {
  const r = await adminJson(baseUrl, 'PUT', `/v1/stations/${stationId}`, {
    name: `${stationId} (invented test station)`,
    latitude_deg: 46.2,
    longitude_deg: 7.4,
    height_m: 520,
  });
  if (r.status !== 201) throw new Error(`station ${stationId}: ${r.status} ${JSON.stringify(r.body)}`);
}

/**
 * A proxy that forwards every request to `target` and counts them by "METHOD /path" (query left out).
 * `failAfter(method, n)`: the first n requests of that method pass, every later one gets 503 without
 * reaching the service, as a replica going away in the middle of an upload.
 */
export class CountingProxy {
  readonly counts = new Map<string, number>();
  private failing: { method: string; after: number; seen: number } | undefined;
  private holding: { method: string; after: number; seen: number; arrived: () => void } | undefined;
  private server: Server | undefined;
  url = '';

  constructor(private readonly target: string) {}

  async start(): Promise<this> {
    this.server = createServer((req, res) => {
      const key = `${req.method} ${(req.url ?? '').split('?')[0]}`;
      if (this.failing && req.method === this.failing.method && ++this.failing.seen > this.failing.after) {
        req.resume();
        res
          .writeHead(503, { 'content-type': 'application/problem+json' })
          .end(JSON.stringify({ title: 'Service Unavailable', status: 503 }));
        return;
      }
      if (this.holding && req.method === this.holding.method && ++this.holding.seen > this.holding.after) {
        // never forwarded, never answered: the client waits until it is killed
        this.holding.arrived();
        return;
      }
      this.counts.set(key, (this.counts.get(key) ?? 0) + 1);
      const upstream = httpRequest(`${this.target}${req.url}`, { method: req.method, headers: req.headers }, (answer) => {
        res.writeHead(answer.statusCode ?? 502, answer.headers);
        answer.pipe(res);
      });
      upstream.on('error', () => res.writeHead(502).end());
      req.pipe(upstream);
    });
    await new Promise<void>((resolve) => this.server!.listen(0, '127.0.0.1', resolve));
    this.url = `http://127.0.0.1:${(this.server.address() as { port: number }).port}`;
    return this;
  }

  failAfter(method: string, after: number): void {
    this.failing = { method, after, seen: 0 };
  }

  /**
   * The first n requests of `method` pass; the next one is held (neither forwarded nor answered), as a
   * connection that hangs. Resolves when that request has arrived.
   */
  holdAfter(method: string, after: number): Promise<void> {
    return new Promise((arrived) => {
      this.holding = { method, after, seen: 0, arrived };
    });
  }

  /** Forward everything again and forget the counts. */
  reset(): void {
    this.failing = undefined;
    this.holding = undefined;
    this.counts.clear();
  }

  /** Requests that reached the service with this method whose path matches. */
  count(method: string, path: RegExp): number {
    let n = 0;
    for (const [key, c] of this.counts) {
      const [m, p] = key.split(' ');
      if (m === method && path.test(p!)) n += c;
    }
    return n;
  }

  stop(): Promise<void> {
    this.server?.closeAllConnections();
    return new Promise((resolve) => (this.server ? this.server.close(() => resolve()) : resolve()));
  }
}

/** A stream that keeps what is written to it; `isTTY` to pass for a terminal. */
export class CapturedStream extends Writable {
  text = '';
  columns = 100;
  constructor(readonly isTTY: boolean) {
    super();
  }
  override _write(chunk: Buffer | string, _encoding: BufferEncoding, done: () => void): void {
    this.text += chunk.toString();
    done();
  }
}

/** stdout, stderr (a terminal or not) and an empty environment for `main` of the CLI. */
export function capturedIo(stderrIsTerminal = false): { stdout: CapturedStream; stderr: CapturedStream; env: Record<string, string> } {
  return { stdout: new CapturedStream(false), stderr: new CapturedStream(stderrIsTerminal), env: {} };
}

/** `tropo-client <args> --url <service> --key <write key>` in this process: its exit code and captured output. */
export async function runCli(baseUrl: string, args: string[], terminal = false): Promise<{ code: number; stdout: string; stderr: string }> {
  const io = capturedIo(terminal);
  const code = await main([...args, '--url', baseUrl, '--key', WRITE_KEY], io);
  return { code, stdout: io.stdout.text, stderr: io.stderr.text };
}
