/**
 * Container health check (HEALTHCHECK in docker/Dockerfile, healthcheck of the replicas in
 * docker/compose.yaml): exits 0 when GET /v1/ready on this container answers 200 {"status":"ready"}
 * within 3 s, else prints why and exits 1. Readiness, not liveness: an instance whose database is
 * unreachable, or whose schema was migrated by a release it cannot serve beside, is unhealthy and a load
 * balancer that follows the health status stops sending it requests. `--live` checks GET /v1/health
 * (the process serves) instead.
 *
 * Uses node itself, so the image needs no curl or shell. Reads the port and host like the service
 * (TROPODELAY_PORT / TROPODELAY_HOST, or the deprecated PORT / HOST); a wildcard host is checked on loopback.
 */

const TIMEOUT_MS = 3000;
const live = process.argv.includes('--live');
const setting = (name) => process.env[`TROPODELAY_${name}`] || process.env[name] || '';
const port = Number(setting('PORT') || '8080');
const configuredHost = setting('HOST');
const host = ['', '0.0.0.0', '::', '[::]'].includes(configuredHost) ? '127.0.0.1' : configuredHost;
const path = live ? '/v1/health' : '/v1/ready';
const healthyStatus = live ? 'ok' : 'ready';
const url = `http://${host.includes(':') ? `[${host}]` : host}:${port}${path}`;

try {
  const response = await fetch(url, { signal: AbortSignal.timeout(TIMEOUT_MS) });
  const body = await response.json().catch(() => ({}));
  if (response.status === 200 && body.status === healthyStatus) process.exit(0);
  process.stderr.write(`unhealthy: ${url} answered ${response.status} ${JSON.stringify(body)}\n`);
} catch (err) {
  process.stderr.write(`unhealthy: ${url}: ${err instanceof Error ? err.message : String(err)}\n`);
}
process.exit(1);
