/**
 * Configuration from the environment, validated at start with zod. An invalid value stops the
 * start with a message naming the variable. README.md has the table of every variable.
 */

import { availableParallelism } from 'node:os';
import { z } from 'zod';

const booleanFlag = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'], { error: 'must be true or false' })
  .transform((v) => v === 'true' || v === '1' || v === 'yes');

const integer = (min: number, max: number) =>
  z.coerce
    .number({ error: `must be a whole number in ${min}..${max}` })
    .int({ error: `must be a whole number in ${min}..${max}` })
    .min(min, { error: `must be a whole number in ${min}..${max}` })
    .max(max, { error: `must be a whole number in ${min}..${max}` });

export const configSchema = z.object({
  PORT: integer(0, 65535).default(8080).describe('TCP port to listen on'),
  HOST: z.string().min(1).default('127.0.0.1').describe('Address to bind; 0.0.0.0 in a container'),
  LOG_LEVEL: z
    .enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'], { error: 'must be one of fatal, error, warn, info, debug, trace, silent' })
    .default('info'),
  REQUEST_TIMEOUT_MS: integer(1000, 3_600_000).default(120_000).describe('Longest time to receive and answer one request'),
  SHUTDOWN_TIMEOUT_MS: integer(0, 600_000).default(25_000).describe('Longest wait for in-flight requests on SIGTERM'),
  ESTIMATION_WORKERS: integer(1, 256).default(availableParallelism()).describe('Worker threads for estimation'),
  ESTIMATION_QUEUE_LIMIT: integer(0, 10_000).default(32).describe('Estimations waiting for a worker before 503'),
  RATE_LIMIT_PER_MINUTE: integer(0, 10_000_000).default(0).describe('Requests per minute per key or address; 0 = off'),
  CORS_ORIGINS: z.string().default('').describe('Comma-separated allowed origins, or * ; empty = CORS off'),
  SECURITY_HEADERS: booleanFlag.default(false).describe('Send the usual security headers (helmet)'),
});

export type Config = z.infer<typeof configSchema>;

export class ConfigError extends Error {}

/** Defaults for everything, for tests and tools that build the app without an environment. */
export function defaultConfig(overrides: Partial<Config> = {}): Config {
  return { ...configSchema.parse({}), ...overrides };
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const relevant = Object.fromEntries(Object.keys(configSchema.shape).filter((k) => env[k] !== undefined && env[k] !== '').map((k) => [k, env[k]]));
  const parsed = configSchema.safeParse(relevant);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${String(i.path[0])}=${JSON.stringify(env[String(i.path[0])])}: ${i.message}`);
    throw new ConfigError(`invalid configuration: ${lines.join('; ')}`);
  }
  return parsed.data;
}
