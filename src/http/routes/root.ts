/**
 * GET /: the workspace page (built into dist/web/ by scripts/build-web.ts from web/), and its assets
 * under /assets/. Everything the page needs is served here: no CDN, tiles or fonts from elsewhere,
 * and the Content-Security-Policy of the page forbids requests to any other origin.
 */

import { readFile } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { FastifyPluginAsync } from 'fastify';
import { HttpProblem } from '../problem.js';

/** dist/web of the package, from src/http/routes (tests, tsx) and from dist/http/routes alike. */
export const WEB_DIR = join(dirname(fileURLToPath(import.meta.url)), '..', '..', '..', 'dist', 'web');

/** The only files served under /assets/, with their media types. */
const ASSETS: Record<string, string> = {
  'app.js': 'text/javascript; charset=utf-8',
  'app.css': 'text/css; charset=utf-8',
  'land-50m.json': 'application/json',
};

export const PAGE_CSP = [
  "default-src 'self'",
  "script-src 'self'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "connect-src 'self'",
  "font-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join('; ');

export interface RootRouteOptions {
  /** Folder of the built page (default: dist/web of the package). */
  webDir?: string;
}

const rootRoute: FastifyPluginAsync<RootRouteOptions> = async (app, options) => {
  const webDir = options.webDir ?? WEB_DIR;
  const cache = new Map<string, Buffer>();
  async function file(path: string): Promise<Buffer> {
    let body = cache.get(path);
    if (!body) {
      try {
        body = await readFile(join(webDir, path));
      } catch {
        throw new HttpProblem(503, `the workspace page is not built (no ${path} in ${webDir}); run npm run build`);
      }
      cache.set(path, body);
    }
    return body;
  }

  app.get('/', { schema: { hide: true } }, async (_request, reply) => {
    const body = await file('index.html');
    return reply
      .header('content-security-policy', PAGE_CSP)
      .header('cache-control', 'no-cache')
      .type('text/html; charset=utf-8')
      .send(body);
  });

  app.get<{ Params: { name: string } }>('/assets/:name', { schema: { hide: true } }, async (request, reply) => {
    const type = ASSETS[request.params.name];
    if (!type) throw new HttpProblem(404, `no asset ${request.params.name}`);
    const body = await file(join('assets', request.params.name));
    return reply.header('cache-control', 'public, max-age=300').type(type).send(body);
  });
};

export default rootRoute;
