/**
 * Bearer keys with names and roles. Every route has a required role, declared by the route or
 * derived here:
 *  - `config: { role: 'admin' }` (or 'write', 'read') on the route: that role;
 *  - otherwise, under the station archive's prefixes (/v1/stations, /v1/network/): `admin` for DELETE
 *    (irreversible, or hiding data from every reader), `write` for PUT, POST and PATCH, `read` for reads
 *    (enforced only when TROPO_READ_KEYS_REQUIRED=true);
 *  - otherwise none (the model routes, health, documents).
 * admin ⊇ write ⊇ read. No key: 401; a key that is not accepted, or whose role is below the route's:
 * 403. `request.callerKey` is `{ name, role }` whenever an accepted key was presented (on any route),
 * else null; the request log and the audit trail read it.
 *
 * Keys: see access/key-store.ts (configured keys and database keys, compared in constant time) and
 * access/first-admin-key.ts (the first admin key when none is configured). Secrets are never logged
 * (the logger redacts the Authorization header as well).
 */

import type { FastifyInstance, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import type { ConfiguredKey } from '../../config.js';
import { HttpProblem } from '../problem.js';
import { ensureFirstAdminKey } from '../access/first-admin-key.js';
import { KeyStore, roleAllows, type CallerKey, type KeyRole } from '../access/key-store.js';

declare module 'fastify' {
  interface FastifyInstance {
    /** Short hash of the bearer key in an Authorization header when it is an accepted key, else null. */
    acceptedKeyId(authorization: string | undefined): string | null;
    /** The keys this replica accepts (admin routes create, list and revoke through it). */
    keyStore: KeyStore;
    /** Every route with the role it needs (null = open), in registration order. */
    routeRoles(): readonly RouteRole[];
  }
  interface FastifyRequest {
    /** The key presented, when accepted: its name and role; null otherwise. */
    callerKey: { name: string; role: 'read' | 'write' | 'admin' } | null;
  }
  interface FastifyContextConfig {
    /** The role a route needs (see src/http/plugins/auth.ts for the default). */
    role?: 'read' | 'write' | 'admin';
  }
}

export interface RouteRole {
  method: string;
  url: string;
  role: KeyRole | null;
}

/**
 * The station archive's routes: one station's series, the network reads across stations and the
 * storing network estimation (/v1/network/...; /v1/network-estimates, which stores nothing, is open).
 */
const PROTECTED_PREFIXES = ['/v1/stations', '/v1/network/', '/v1/campaigns'];
export const WRITE_METHODS = new Set(['PUT', 'POST', 'PATCH', 'DELETE']);

export interface AuthPluginOptions {
  /** Keys from the configuration; empty = keys from the database (the first replica creates an admin key). */
  keys: readonly ConfiguredKey[];
  /** Whether reads of the archive need a key too. */
  readKeysRequired: boolean;
  /** Directory of the first admin key file; absent = its secret is held nowhere (tests, tools). */
  keyDir?: string;
}

/** The role a route needs: declared, else derived from its prefix and method (see the file comment). */
export function requiredRole(method: string, url: string, declared: KeyRole | undefined): KeyRole | null {
  if (declared) return declared;
  if (!PROTECTED_PREFIXES.some((p) => url.startsWith(p))) return null;
  // Deleting is irreversible or hides data from every reader: admin, whatever the route (issue 15).
  if (method === 'DELETE') return 'admin';
  return WRITE_METHODS.has(method) ? 'write' : 'read';
}

const ROLE_TEXT: Record<KeyRole, string> = {
  read: 'Reads need a key of role read or above when TROPO_READ_KEYS_REQUIRED=true.',
  write: 'Needs `Authorization: Bearer <key>` of role write or admin (401 without a key, 403 with a key of role read or one not accepted).',
  admin: 'Needs `Authorization: Bearer <key>` of role admin (401 without a key, 403 with a key of role read or write or one not accepted).',
};

const bearerSecret = (header: string | undefined): string | null => (header ? (/^Bearer\s+(\S+)\s*$/i.exec(header)?.[1] ?? null) : null);

async function auth(app: FastifyInstance, options: AuthPluginOptions): Promise<void> {
  const store = new KeyStore(options.keys, app.repository, (err) => app.log.warn({ err }, 'reading the API keys from the database failed'));
  if (options.keys.length === 0) {
    const outcome = await ensureFirstAdminKey(app.repository, options.keyDir);
    if (outcome.kind === 'created' && outcome.file) {
      app.log.info(
        { keyFile: outcome.file },
        `no API keys configured: ${outcome.fromLegacyFile ? 'the key of' : 'an admin key named "admin" was generated into'} ${outcome.file} (owner-only file)${outcome.fromLegacyFile ? ' is now the admin key "admin"' : ''}; keys are shared with every replica through the database`,
      );
    } else if (outcome.kind === 'created-elsewhere') {
      app.log.info(
        "no API keys configured: another replica created the admin key at the same moment; its secret is in that replica's data directory (api-key)",
      );
    } else if (outcome.kind === 'keys-exist') {
      app.log.info(`no API keys configured: ${outcome.count} valid key(s) from the database`);
    }
  }
  await store.refresh();
  app.decorate('keyStore', store);
  app.decorateRequest('callerKey', null);

  const roles: RouteRole[] = [];
  app.decorate('routeRoles', () => roles);
  app.addHook('onRoute', (route) => {
    const methods = Array.isArray(route.method) ? route.method : [route.method];
    const declared = (route.config as { role?: KeyRole } | undefined)?.role;
    for (const method of methods) {
      if (method === 'HEAD') continue;
      const role = requiredRole(method, route.url, declared);
      roles.push({ method, url: route.url, role });
      // The OpenAPI document states the role and the security scheme of every guarded route.
      if (role && route.schema && !route.schema.hide) {
        route.schema.security = [{ bearerKey: [] }];
        const description = route.schema.description ?? '';
        if (!description.includes('Role needed:')) {
          route.schema.description = `${description}${description ? ' ' : ''}Role needed: ${role}. ${ROLE_TEXT[role]}`;
        }
      }
    }
  });

  // For the rate limit: a budget per accepted key, identified by a short hash (never the key).
  app.decorate('acceptedKeyId', (authorization: string | undefined): string | null => {
    const secret = bearerSecret(authorization);
    if (!secret || !store.matchCached(secret)) return null;
    return KeyStore.shortId(secret);
  });

  app.addHook('onRequest', async (request: FastifyRequest) => {
    const header = request.headers.authorization;
    const secret = bearerSecret(header);
    const caller: CallerKey | null = secret ? await store.match(secret) : null;
    request.callerKey = caller;

    const url = request.routeOptions.url ?? request.url;
    const role = requiredRole(request.method, url, request.routeOptions.config?.role);
    if (!role) return;
    if (role === 'read' && !options.readKeysRequired && !request.routeOptions.config?.role) return;
    const what = `this route needs a key of role ${role}${role === 'read' ? ' (TROPO_READ_KEYS_REQUIRED=true)' : ''}`;
    if (!header) {
      throw new HttpProblem(
        401,
        `${what}: send an Authorization: Bearer <key> header`,
        [{ field: 'header.authorization', message: 'missing' }],
        {
          'www-authenticate': 'Bearer realm="tropodelay"',
        },
      );
    }
    if (!secret) {
      throw new HttpProblem(
        401,
        'the Authorization header must be "Bearer <key>"',
        [{ field: 'header.authorization', message: 'not a bearer key' }],
        { 'www-authenticate': 'Bearer realm="tropodelay", error="invalid_request"' },
      );
    }
    if (!caller) {
      throw new HttpProblem(403, `the bearer key is not one of the accepted keys; ${what}`, [
        { field: 'header.authorization', message: 'key not accepted' },
      ]);
    }
    if (!roleAllows(caller.role, role)) {
      throw new HttpProblem(403, `key "${caller.name}" has role ${caller.role}; ${what}`, [
        { field: 'header.authorization', message: `role ${caller.role} is below ${role}` },
      ]);
    }
  });
}

export default fp(auth, { name: 'auth', dependencies: ['storage'] });
