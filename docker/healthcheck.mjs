/**
 * Container health check (HEALTHCHECK in docker/Dockerfile): exits 0 when GET /v1/health on this
 * container answers 200 {"status":"ok"} within 3 s, else prints why and exits 1. Uses node itself, so the
 * image needs no curl or shell. Reads PORT and HOST like the service; a wildcard HOST is checked on loopback.
 */

const TIMEOUT_MS = 3000;
const port = Number(process.env.PORT ?? '8080');
const configuredHost = process.env.HOST ?? '';
const host = ['', '0.0.0.0', '::', '[::]'].includes(configuredHost) ? '127.0.0.1' : configuredHost;
const url = `http://${host.includes(':') ? `[${host}]` : host}:${port}/v1/health`;

try {
  const response = await fetch(url, { signal: AbortSignal.timeout(TIMEOUT_MS) });
  const body = await response.json().catch(() => ({}));
  if (response.status === 200 && body.status === 'ok') process.exit(0);
  process.stderr.write(`unhealthy: ${url} answered ${response.status} ${JSON.stringify(body)}\n`);
} catch (err) {
  process.stderr.write(`unhealthy: ${url}: ${err instanceof Error ? err.message : String(err)}\n`);
}
process.exit(1);
