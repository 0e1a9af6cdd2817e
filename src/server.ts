/**
 * Entry point: reads the configuration, builds the app, listens, and shuts down on SIGTERM/SIGINT.
 */

import { ConfigError, loadConfig } from './config.js';
import { buildApp } from './http/app.js';

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
  const app = await buildApp({ logger: { level: config.LOG_LEVEL } });
  const close = async (signal: string) => {
    app.log.info({ signal }, 'shutting down');
    await app.close();
    process.exit(0);
  };
  process.once('SIGTERM', () => void close('SIGTERM'));
  process.once('SIGINT', () => void close('SIGINT'));
  await app.listen({ port: config.PORT, host: config.HOST });
}

void main();
