/**
 * The audit trail: every request to a route that writes (a PUT, POST, PATCH or DELETE whose route
 * needs role write or admin, see auth.ts) gives one event: who (the key name from request.callerKey,
 * and request.ip: the client address as seen through the trusted proxies of TRUST_PROXY), what
 * (method, route pattern, path, station, source, records received and the write counts a route notes
 * in request.auditDetail), when (the time of the answer) and the outcome (the status).
 *
 * The event goes to the log (one `audit` line at info) always, and to the database's audit_events
 * table when an accepted key was presented (a refused request without a valid key is only logged, so
 * that anonymous requests cannot fill the table). It is written before the answer leaves (onSend),
 * so a client that reads the trail after its answer finds its own write there. A failure to store
 * the event is logged as an error and does not change the answer (the write itself is already done).
 */

import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import type { AuditEvent } from '../../storage/access-rows.js';
import { requiredRole, WRITE_METHODS } from './auth.js';

/** What a write route tells the audit trail about its work. */
export interface AuditDetail {
  source?: string | undefined;
  records?: number | undefined;
  inserted?: number | undefined;
  updated?: number | undefined;
  unchanged?: number | undefined;
}

declare module 'fastify' {
  interface FastifyRequest {
    /** Set by a write route: source and counts for its audit event. */
    auditDetail: AuditDetail | null;
  }
}

/** Whether a request is audited: a write method on a route that needs role write or admin. */
export function isAuditedWrite(request: FastifyRequest): boolean {
  if (!WRITE_METHODS.has(request.method) || !request.routeOptions.url) return false;
  const role = requiredRole(request.method, request.routeOptions.url, request.routeOptions.config?.role);
  return role === 'write' || role === 'admin';
}

export function auditEventOf(request: FastifyRequest, reply: FastifyReply, atMs: number): AuditEvent {
  const params = (request.params ?? {}) as { station_id?: unknown };
  const query = (request.query ?? {}) as { source?: unknown };
  const detail = request.auditDetail ?? {};
  const source = detail.source ?? (typeof query.source === 'string' ? query.source : undefined);
  return {
    atMs,
    keyName: request.callerKey?.name ?? null,
    clientAddress: request.ip,
    method: request.method,
    route: request.routeOptions.url ?? request.url,
    path: request.url.split('?')[0]!,
    stationId: typeof params.station_id === 'string' ? params.station_id : null,
    source: source ?? null,
    records: detail.records ?? null,
    inserted: detail.inserted ?? null,
    updated: detail.updated ?? null,
    unchanged: detail.unchanged ?? null,
    status: reply.statusCode,
    requestId: request.id,
  };
}

async function audit(app: FastifyInstance): Promise<void> {
  app.decorateRequest('auditDetail', null);
  app.addHook('onSend', async (request, reply, payload) => {
    if (!isAuditedWrite(request)) return payload;
    const event = auditEventOf(request, reply, Date.now());
    request.log.info({ audit: { ...event, at: new Date(event.atMs).toISOString() } }, 'audit');
    if (request.callerKey) {
      try {
        await app.repository.appendAuditEvent(event);
      } catch (err) {
        request.log.error({ err, audit: event }, 'storing the audit event failed');
      }
    }
    return payload;
  });
}

export default fp(audit, { name: 'audit', dependencies: ['auth', 'storage'] });
