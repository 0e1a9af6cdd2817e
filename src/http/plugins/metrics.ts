/**
 * Prometheus metrics (prom-client), served at GET /metrics in the text exposition format:
 * request counts and latency per route and status, estimation run time and size, process metrics.
 * Each app has its own registry, so several apps in one process (tests) do not collide.
 */

import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { collectDefaultMetrics, Counter, Gauge, Histogram, Registry } from 'prom-client';

export interface ServiceMetrics {
  registry: Registry;
  requests: Counter<'method' | 'route' | 'status'>;
  requestDuration: Histogram<'method' | 'route' | 'status'>;
  /** Run time of one estimation, labelled by what ran [s]. */
  computeDuration: Histogram<'task'>;
  /** Size of one estimation: observations. */
  computeSize: Histogram<'task'>;
  /** Tasks waiting for a worker thread. */
  workerQueue: Gauge;
}

declare module 'fastify' {
  interface FastifyInstance {
    metrics: ServiceMetrics;
  }
}

async function metrics(app: FastifyInstance): Promise<void> {
  const registry = new Registry();
  collectDefaultMetrics({ register: registry, prefix: 'tropodelay_' });
  const m: ServiceMetrics = {
    registry,
    requests: new Counter({
      name: 'tropodelay_http_requests_total',
      help: 'HTTP requests answered, by method, route pattern and status',
      labelNames: ['method', 'route', 'status'],
      registers: [registry],
    }),
    requestDuration: new Histogram({
      name: 'tropodelay_http_request_duration_seconds',
      help: 'Time from receiving a request to sending its answer [s]',
      labelNames: ['method', 'route', 'status'],
      buckets: [0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30],
      registers: [registry],
    }),
    computeDuration: new Histogram({
      name: 'tropodelay_compute_duration_seconds',
      help: 'Run time of one computation in a worker thread (a ZWD estimation request) [s]',
      labelNames: ['task'],
      buckets: [0.001, 0.005, 0.01, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30, 60],
      registers: [registry],
    }),
    computeSize: new Histogram({
      name: 'tropodelay_compute_size',
      help: 'Size of one computation in a worker thread (observations)',
      labelNames: ['task'],
      buckets: [10, 100, 1000, 10_000, 100_000, 1_000_000],
      registers: [registry],
    }),
    workerQueue: new Gauge({
      name: 'tropodelay_worker_queue_length',
      help: 'Computations waiting for a worker thread',
      registers: [registry],
    }),
  };
  // Database connections, read at scrape time from the repository (decorated later by the storage plugin).
  new Gauge({
    name: 'tropodelay_db_connections',
    help: 'Database connections by state: total (open), idle, waiting (requests queued for a connection)',
    labelNames: ['state'],
    registers: [registry],
    collect() {
      const repository = (app as FastifyInstance & { repository?: { connectionStats(): { total: number; idle: number; waiting: number } } })
        .repository;
      if (!repository) return;
      const stats = repository.connectionStats();
      this.set({ state: 'total' }, stats.total);
      this.set({ state: 'idle' }, stats.idle);
      this.set({ state: 'waiting' }, stats.waiting);
    },
  });
  app.decorate('metrics', m);

  // Label children cached per (method, route, status): prom-client hashes a label object on every
  // call otherwise, which costs as much as a small request's own work.
  const children = new Map<string, { count: { inc(): void }; duration: { observe(v: number): void } }>();
  app.addHook('onResponse', (request, reply, done) => {
    // Unmatched URLs are counted under one label, so scanners cannot blow up the label set.
    const route = request.routeOptions.url ?? 'unmatched';
    const key = `${request.method} ${route} ${reply.statusCode}`;
    let child = children.get(key);
    if (!child) {
      const labels = { method: request.method, route, status: String(reply.statusCode) };
      child = { count: m.requests.labels(labels), duration: m.requestDuration.labels(labels) };
      children.set(key, child);
    }
    child.count.inc();
    child.duration.observe(reply.elapsedTime / 1000);
    done();
  });

  app.get('/metrics', { schema: { hide: true } }, async (_request, reply) => {
    reply.type(registry.contentType);
    return registry.metrics();
  });
}

export default fp(metrics, { name: 'metrics' });
