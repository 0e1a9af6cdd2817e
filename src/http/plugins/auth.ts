/**
 * Bearer-key access to the station archive (/v1/stations...). Writes (PUT, POST, PATCH, DELETE)
 * need `Authorization: Bearer <key>` with one of the configured keys; reads need one only when
 * readKeysRequired is set. 401 without a key, 403 with a key that is not one of them.
 *
 * Keys are compared in constant time: both sides are hashed with SHA-256 and the equal-length
 * digests compared with crypto.timingSafeEqual, against every configured key without stopping at a
 * match. Keys are never logged (the logger redacts the Authorization header as well).
 *
 * When no key is configured, one is generated at first start and stored in `<keyDir>/api-key` with
 * mode 0600 (owner read/write only); later starts read it back. The log names the file, never the key.
 */

import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { FastifyInstance, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { HttpProblem } from '../problem.js';

declare module 'fastify' {
  interface FastifyInstance {
    /** Short hash of the bearer key in an Authorization header when it is an accepted key, else null. */
    acceptedKeyId(authorization: string | undefined): string | null;
  }
}

export const KEY_FILE_NAME = 'api-key';
/**
 * The station archive's routes: one station's series, the network reads across stations and the
 * storing network estimation (/v1/network/...; /v1/network-estimates, which stores nothing, is open).
 */
const PROTECTED_PREFIXES = ['/v1/stations', '/v1/network/'];
const WRITE_METHODS = new Set(['PUT', 'POST', 'PATCH', 'DELETE']);

export interface AuthPluginOptions {
  /** Accepted keys; empty = use (or create) the key file in keyDir. */
  keys: readonly string[];
  /** Whether reads need a key too. */
  readKeysRequired: boolean;
  /** Directory of the generated key file; absent = a throw-away key held in memory only. */
  keyDir?: string;
}

const digest = (key: string) => createHash('sha256').update(key, 'utf8').digest();

/** Reads the generated key, creating it (mode 0600) when missing. @returns the key and its path */
export function loadOrCreateKeyFile(keyDir: string): { key: string; path: string; created: boolean } {
  const path = join(keyDir, KEY_FILE_NAME);
  if (existsSync(path)) {
    if ((statSync(path).mode & 0o077) !== 0) chmodSync(path, 0o600);
    const key = readFileSync(path, 'utf8').trim();
    if (key.length >= 16) return { key, path, created: false };
  }
  mkdirSync(keyDir, { recursive: true });
  const key = randomBytes(32).toString('base64url');
  writeFileSync(path, `${key}\n`, { mode: 0o600 });
  chmodSync(path, 0o600); // in case the file existed (empty) with other permissions
  return { key, path, created: true };
}

async function auth(app: FastifyInstance, options: AuthPluginOptions): Promise<void> {
  let keys = [...options.keys];
  if (keys.length === 0) {
    if (options.keyDir) {
      const file = loadOrCreateKeyFile(options.keyDir);
      keys = [file.key];
      app.log.info(
        { keyFile: file.path },
        `no TROPO_API_KEYS configured: writes to /v1/stations need the bearer key ${file.created ? 'generated into' : 'stored in'} ${file.path} (owner-only file)`,
      );
    } else {
      keys = [randomBytes(32).toString('base64url')];
    }
  }
  const digests = keys.map(digest);

  const isAccepted = (presented: string): boolean => {
    const d = digest(presented);
    let ok = false;
    for (const k of digests) ok = timingSafeEqual(d, k) || ok; // no early exit
    return ok;
  };

  // For the rate limit: a budget per accepted key, identified by a short hash (never the key).
  app.decorate('acceptedKeyId', (authorization: string | undefined): string | null => {
    const match = authorization ? /^Bearer\s+(\S+)\s*$/i.exec(authorization) : null;
    if (!match || !isAccepted(match[1]!)) return null;
    return digest(match[1]!).toString('hex').slice(0, 16);
  });

  app.addHook('onRequest', async (request: FastifyRequest) => {
    const url = request.routeOptions.url ?? request.url;
    if (!PROTECTED_PREFIXES.some((p) => url.startsWith(p))) return;
    const isWrite = WRITE_METHODS.has(request.method);
    if (!isWrite && !options.readKeysRequired) return;
    const header = request.headers.authorization;
    const what = isWrite ? 'writing to the station archive' : 'reading the station archive (TROPO_READ_KEYS_REQUIRED=true)';
    if (!header) {
      throw new HttpProblem(
        401,
        `${what} needs an Authorization: Bearer <key> header`,
        [{ field: 'header.authorization', message: 'missing' }],
        {
          'www-authenticate': 'Bearer realm="tropodelay"',
        },
      );
    }
    const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
    if (!match) {
      throw new HttpProblem(
        401,
        'the Authorization header must be "Bearer <key>"',
        [{ field: 'header.authorization', message: 'not a bearer key' }],
        {
          'www-authenticate': 'Bearer realm="tropodelay", error="invalid_request"',
        },
      );
    }
    if (!isAccepted(match[1]!)) {
      throw new HttpProblem(403, `the bearer key is not one of the keys allowed for ${isWrite ? 'writing' : 'reading'}`, [
        { field: 'header.authorization', message: 'key not accepted' },
      ]);
    }
  });
}

export default fp(auth, { name: 'auth' });
