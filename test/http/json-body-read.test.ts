/**
 * The JSON body reader (src/http/plugins/json-body.ts readBodyText) against fastify's own `parseAs: 'string'`
 * reader, the one it replaces: two bare fastify apps, one with each, echo what their parser made of a body or the
 * error's code and status. The same bytes sent whole (the shortcut: the body is already buffered), in pieces with
 * pauses, chunked (no Content-Length), over the limit, shorter than declared, empty, or carrying a __proto__ key
 * give the same echo from both (common practice: a replacement answers as what it replaces). Then the service
 * itself: a single-point request answers the same bytes whole, in pieces and over one kept-alive connection.
 */

import { request as httpRequest, Agent } from 'node:http';
import { connect, type AddressInfo } from 'node:net';
import Fastify, { type FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readBodyText } from '../../src/http/plugins/json-body.js';
import { useListeningApp } from '../helpers/app.js';

const LIMIT = 4096;

async function echoApp(reader: 'fastify' | 'ours'): Promise<FastifyInstance> {
  const app = Fastify({ bodyLimit: LIMIT });
  const parseJson = app.getDefaultJsonParser('error', 'error');
  app.removeContentTypeParser('application/json');
  if (reader === 'fastify') {
    app.addContentTypeParser('application/json', { parseAs: 'string' }, (request, body, done) => parseJson(request, String(body), done));
  } else {
    app.addContentTypeParser('application/json', (request, payload, done) => {
      readBodyText(request, payload, (err, text) => {
        if (err) done(err);
        else void parseJson(request, text!, done);
      });
    });
  }
  app.setErrorHandler((err: Error & { code?: string; statusCode?: number }, _request, reply) =>
    reply.status(200).send({ error: err.code ?? err.name, status: err.statusCode ?? null }),
  );
  app.post('/echo', async (request) => ({ body: request.body }));
  await app.listen({ port: 0, host: '127.0.0.1' });
  return app;
}

/** Raw bytes on a fresh connection, written in `pieces` with a pause between them; the answer's bytes after the headers. */
function rawSend(port: number, pieces: string[], pauseMs = 15): Promise<string> {
  return new Promise((resolve, reject) => {
    const socket = connect(port, '127.0.0.1');
    const parts: Buffer[] = [];
    socket.on('data', (c: Buffer) => parts.push(c));
    socket.on('error', (err: NodeJS.ErrnoException) => (err.code === 'ECONNRESET' || err.code === 'EPIPE' ? undefined : reject(err)));
    socket.on('close', () => {
      const text = Buffer.concat(parts).toString('utf8');
      resolve(text.slice(text.indexOf('\r\n\r\n') + 4));
    });
    const write = (i: number) => {
      if (i === pieces.length) return void setTimeout(() => socket.end(), 200);
      socket.write(pieces[i]!);
      setTimeout(() => write(i + 1), pauseMs);
    };
    socket.once('connect', () => write(0));
  });
}

const head = (extra: string) => `POST /echo HTTP/1.1\r\nhost: x\r\nconnection: close\r\ncontent-type: application/json\r\n${extra}\r\n`;
const withLength = (body: string) => head(`content-length: ${Buffer.byteLength(body)}\r\n`) + body;
const chunked = (parts: string[]) =>
  head('transfer-encoding: chunked\r\n') + parts.map((p) => `${Buffer.byteLength(p).toString(16)}\r\n${p}\r\n`).join('') + '0\r\n\r\n';

const body = JSON.stringify({ site: { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 }, note: 'Zürich – ☂', n: [1, 2.5, -3e-7] });
const big = JSON.stringify({ pad: 'x'.repeat(LIMIT) });

const CASES: { name: string; pieces: string[] }[] = [
  { name: 'whole, with its headers', pieces: [withLength(body)] },
  { name: 'headers, then the body', pieces: [head(`content-length: ${Buffer.byteLength(body)}\r\n`), body] },
  {
    name: 'the body in three pieces, a multi-byte character cut',
    pieces: (() => {
      const all = Buffer.from(withLength(body));
      const cut = all.indexOf('☂') + 1;
      return [all.subarray(0, 60).toString('latin1'), all.subarray(60, cut).toString('latin1'), all.subarray(cut).toString('latin1')];
    })(),
  },
  { name: 'chunked, no Content-Length', pieces: [chunked([body.slice(0, 20), body.slice(20)])] },
  { name: 'declared over the limit', pieces: [withLength(big)] },
  { name: 'chunked over the limit', pieces: [chunked([big.slice(0, 2000), big.slice(2000)])] },
  { name: 'shorter than its Content-Length, then closed', pieces: [head('content-length: 50\r\n') + '{"a":1}'] },
  { name: 'empty', pieces: [withLength('')] },
  { name: 'a __proto__ key', pieces: [withLength('{"a":1,"__proto__":{"polluted":true}}')] },
  { name: 'a constructor.prototype key', pieces: [withLength('{"constructor":{"prototype":{"polluted":true}}}')] },
  { name: 'malformed', pieces: [withLength('{"a":')] },
];

describe('readBodyText against fastify`s parseAs: "string" reader (common practice: the same answers)', () => {
  let theirs: FastifyInstance;
  let ours: FastifyInstance;
  beforeAll(async () => {
    theirs = await echoApp('fastify');
    ours = await echoApp('ours');
  });
  afterAll(async () => {
    await theirs.close();
    await ours.close();
  });
  const port = (app: FastifyInstance) => (app.server.address() as AddressInfo).port;

  for (const c of CASES) {
    it(c.name, async () => {
      const expected = await rawSend(port(theirs), c.pieces);
      const got = await rawSend(port(ours), c.pieces);
      expect(got).toBe(expected);
      expect(got.length).toBeGreaterThan(0);
    });
  }
});

describe('POST /v1/zenith-delays through the reader', () => {
  const servicePort = useListeningApp();
  const zenithBody = (i: number) =>
    JSON.stringify({
      site: { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 + i },
      epoch: '2026-06-21T06:30:00Z',
      met: { pressure_hpa: 965.3, temperature_c: 18.2, relative_humidity_pct: 61 },
    });
  const zenithRequest = (b: string) =>
    `POST /v1/zenith-delays HTTP/1.1\r\nhost: x\r\nconnection: close\r\ncontent-type: application/json\r\ncontent-length: ${Buffer.byteLength(b)}\r\n\r\n${b}`;

  it('answers the same bytes to a body sent whole and one sent in pieces', async () => {
    const whole = await rawSend(servicePort(), [zenithRequest(zenithBody(0))]);
    const request = zenithRequest(zenithBody(0));
    const pieces = await rawSend(servicePort(), [request.slice(0, request.length - 40), request.slice(-40, -10), request.slice(-10)]);
    expect(JSON.parse(whole).zhd_m).toBeGreaterThan(2);
    expect(pieces).toBe(whole);
  });

  it('answers every request of a kept-alive connection, each as if sent alone', async () => {
    const agent = new Agent({ keepAlive: true, maxSockets: 1 });
    const post = (b: string) =>
      new Promise<{ text: string; socket: unknown }>((resolve, reject) => {
        const req = httpRequest(
          {
            host: '127.0.0.1',
            port: servicePort(),
            path: '/v1/zenith-delays',
            method: 'POST',
            agent,
            headers: { 'content-type': 'application/json' },
          },
          (res) => {
            const parts: Buffer[] = [];
            res.on('data', (c: Buffer) => parts.push(c));
            res.on('end', () => resolve({ text: Buffer.concat(parts).toString('utf8'), socket: req.socket }));
          },
        );
        req.on('error', reject);
        req.end(b);
      });
    try {
      const answers = [];
      for (let i = 0; i < 20; i++) answers.push(await post(zenithBody(i)));
      expect(new Set(answers.map((a) => a.socket)).size).toBe(1);
      for (let i = 0; i < 20; i++) {
        const alone = await fetch(`http://127.0.0.1:${servicePort()}/v1/zenith-delays`, {
          method: 'POST',
          headers: { 'content-type': 'application/json', connection: 'close' },
          body: zenithBody(i),
        });
        expect(answers[i]!.text).toBe(await alone.text());
      }
    } finally {
      agent.destroy();
    }
  });
});
