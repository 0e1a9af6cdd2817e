/**
 * Entry point: reads the configuration, builds the app, listens, and shuts down gracefully on
 * SIGTERM/SIGINT: stop accepting, close idle keep-alive connections at once (Node's server.close),
 * answer in-flight requests with `Connection: close` (the readiness plugin) so their connections
 * close after the answer, refuse requests that still arrive on an open connection with 503
 * (fastify's return503OnClosing), let in-flight requests finish (bounded by SHUTDOWN_TIMEOUT_MS),
 * close the database (the storage plugin's onClose) and the worker pool, exit 0.
 */

import { ConfigError, configWarnings, loadConfig, type Config } from './config.js';
import { archiveOptionsFromConfig, buildApp, type ArchiveOptions } from './http/app.js';
import { loggerOptions } from './http/logger-options.js';
import { raiseMallocThresholds } from './malloc-heap.js';

async function main(): Promise<void> {
  raiseMallocThresholds();
  let config: Config;
  let archive: ArchiveOptions;
  try {
    config = loadConfig();
    archive = archiveOptionsFromConfig(config); // reads TROPODELAY_API_KEYS_FILE
  } catch (err) {
    if (err instanceof ConfigError) {
      process.stderr.write(`tropodelay: ${err.message}\n`);
      process.exit(2);
    }
    throw err;
  }
  const app = await buildApp({
    config,
    logger: loggerOptions(config),
    archive,
    startWorkers: true, // warmed before /v1/ready says ready (TROPODELAY_WARM_UP_ESTIMATIONS)
  });
  for (const warning of configWarnings()) app.log.warn(warning);
  app.log.info({ estimationWorkers: config.ESTIMATION_WORKERS, logFormat: config.TROPODELAY_LOG_FORMAT }, 'configuration read');

  let closing = false;
  const shutdown = async (signal: string) => {
    if (closing) return;
    closing = true;
    app.log.info({ signal, timeoutMs: config.SHUTDOWN_TIMEOUT_MS }, 'shutting down: finishing in-flight requests');
    const timer = setTimeout(() => {
      app.log.error({ timeoutMs: config.SHUTDOWN_TIMEOUT_MS }, 'in-flight requests did not finish in time; exiting');
      process.exit(1);
    }, config.SHUTDOWN_TIMEOUT_MS);
    timer.unref();
    try {
      await app.close();
      app.log.info('shut down cleanly');
      process.exit(0);
    } catch (err) {
      app.log.error({ err }, 'error while shutting down');
      process.exit(1);
    }
  };
  process.once('SIGTERM', () => void shutdown('SIGTERM'));
  process.once('SIGINT', () => void shutdown('SIGINT'));

  await app.listen({ port: config.PORT, host: config.HOST });
}

main().catch((err: unknown) => {
  process.stderr.write(`tropodelay: failed to start: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exit(1);
});
