/**
 * Configuration from the environment, validated at start. An invalid value stops the start with a
 * message naming the variable.
 */

import { z } from 'zod';

/** Longest from..to range one read request may ask for [days] (default: one year plus a leap day). */
export const DEFAULT_MAX_READ_RANGE_DAYS = 366;

const booleanFlag = z
  .enum(['true', 'false', '1', '0', ''], { error: 'must be true or false' })
  .default('false')
  .transform((v) => v === 'true' || v === '1');

const configSchema = z.object({
  PORT: z.coerce.number().int().min(0).max(65535).default(8080).describe('TCP port to listen on'),
  HOST: z.string().min(1).default('127.0.0.1').describe('Address to bind; 0.0.0.0 in a container'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info').describe('pino log level'),
  TROPO_DATA_DIR: z
    .string()
    .min(1, { error: 'must be a directory path' })
    .default('./data')
    .describe('Directory of the SQLite database and of the generated API key file'),
  DATABASE_URL: z
    .string()
    .regex(/^postgres(ql)?:\/\//, { error: 'must be a postgres:// or postgresql:// connection URL' })
    .optional()
    .or(z.literal('').transform(() => undefined))
    .describe('PostgreSQL connection URL; when set, the archive is stored there instead of SQLite'),
  TROPO_PG_SCHEMA: z
    .string()
    .regex(/^[a-z_][a-z0-9_]{0,62}$/, { error: 'must be a lower-case SQL identifier (a-z, 0-9, _; at most 63 characters)' })
    .default('public')
    .describe('PostgreSQL schema that holds the archive tables'),
  TROPO_API_KEYS: z
    .string()
    .default('')
    .transform((v) => v.split(',').map((k) => k.trim()).filter(Boolean))
    .refine((keys) => keys.every((k) => k.length >= 16), { error: 'every key must have at least 16 characters' })
    .describe('Comma-separated bearer keys allowed to write (and to read when TROPO_READ_KEYS_REQUIRED=true)'),
  TROPO_READ_KEYS_REQUIRED: booleanFlag.describe('Whether reads of /v1/stations need a key too'),
  TROPO_MAX_READ_RANGE_DAYS: z.coerce
    .number({ error: 'must be a number of days' })
    .positive({ error: 'must be a number of days > 0' })
    .max(36600, { error: 'must be at most 36600 days' })
    .default(DEFAULT_MAX_READ_RANGE_DAYS)
    .describe('Longest from..to range of one read of a station series [days]'),
});

export type Config = z.infer<typeof configSchema>;

export class ConfigError extends Error {}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = configSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => {
      const name = String(i.path[0]);
      // Never echo a key back: name the variable only.
      const shown = name === 'TROPO_API_KEYS' || name === 'DATABASE_URL' ? '(value hidden)' : JSON.stringify(env[name]);
      return `${name}=${shown}: ${i.message}`;
    });
    throw new ConfigError(`invalid configuration: ${lines.join('; ')}`);
  }
  return parsed.data;
}
