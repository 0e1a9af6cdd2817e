/**
 * Entry point: reads the configuration, builds the app, listens, and shuts down on SIGTERM/SIGINT.
 */

import { ConfigError, loadConfig } from './config.js';
import { archiveOptionsFromConfig, buildApp } from './http/app.js';

async function main(): Promise<void> {
  let config;
  try {
    config = loadConfig();
  } catch (err) {
    if (err instanceof ConfigError) {
      process.stderr.write(`tropodelay: ${err.message}\n`);
      process.exit(2);
    }
    throw err;
  }
  // Keys never reach the log: the Authorization header is redacted wherever a request is logged.
  let app;
  try {
    app = await buildApp({
      logger: { level: config.LOG_LEVEL, redact: ['req.headers.authorization', 'headers.authorization'] },
      archive: archiveOptionsFromConfig(config),
    });
  } catch (err) {
    process.stderr.write(`tropodelay: cannot start: ${(err as Error).message}\n`);
    process.exit(1);
  }
  const close = async (signal: string) => {
    app.log.info({ signal }, 'shutting down');
    await app.close(); // closes the repository (storage plugin's onClose)
    process.exit(0);
  };
  process.once('SIGTERM', () => void close('SIGTERM'));
  process.once('SIGINT', () => void close('SIGINT'));
  await app.listen({ port: config.PORT, host: config.HOST });
}

void main();
