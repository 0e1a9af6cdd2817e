/**
 * Configuration from the environment, validated at start with zod. An invalid value stops the
 * start with a message naming the variable. README.md has the table of every variable.
 */

import { availableParallelism } from 'node:os';
import { z } from 'zod';

/** Longest from..to range one read of a station series may ask for [days] (a station-year plus a leap day). */
export const DEFAULT_MAX_READ_RANGE_DAYS = 366;

const booleanFlag = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'], { error: 'must be true or false' })
  .transform((v) => v === 'true' || v === '1' || v === 'yes');

const integer = (min: number, max: number) =>
  z.coerce
    .number({ error: `must be a whole number in ${min}..${max}` })
    .int({ error: `must be a whole number in ${min}..${max}` })
    .min(min, { error: `must be a whole number in ${min}..${max}` })
    .max(max, { error: `must be a whole number in ${min}..${max}` });

/**
 * TRUST_PROXY: which hops in front of the service may set X-Forwarded-For. `false` (default) trusts
 * none: the client address is the TCP peer. A whole number n trusts the n nearest hops (1 = one load
 * balancer in front). A comma-separated list of addresses or CIDRs trusts the hops at those
 * addresses. The old `true` means 1 hop (never "trust every hop", which let any client choose its
 * own address with a forged header); configWarnings() says so at start.
 */
export type TrustProxy = false | number | string[];
const TRUST_PROXY_MESSAGE = 'must be false, a hop count 1..16, or comma-separated addresses/CIDRs of the trusted proxies';
const ADDRESS_OR_CIDR =
  /^(?:\d{1,3}(?:\.\d{1,3}){3}(?:\/\d{1,2})?|[0-9a-fA-F:]*:[0-9a-fA-F:.]*(?:\/\d{1,3})?|loopback|linklocal|uniquelocal)$/;
const trustProxySetting = z.string().transform((raw, ctx): TrustProxy => {
  const v = raw.trim().toLowerCase();
  if (['false', '0', 'no'].includes(v)) return false;
  if (['true', 'yes'].includes(v)) return 1;
  if (/^\d+$/.test(v)) {
    const n = Number(v);
    if (n >= 1 && n <= 16) return n;
  } else {
    const list = v
      .split(',')
      .map((s) => s.trim())
      .filter(Boolean);
    if (list.length > 0 && list.every((s) => ADDRESS_OR_CIDR.test(s))) return list;
  }
  ctx.addIssue({ code: 'custom', message: TRUST_PROXY_MESSAGE });
  return z.NEVER;
});

export const configSchema = z.object({
  PORT: integer(0, 65535).default(8080).describe('TCP port to listen on'),
  HOST: z.string().min(1).default('127.0.0.1').describe('Address to bind; 0.0.0.0 in a container'),
  LOG_LEVEL: z
    .enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'], {
      error: 'must be one of fatal, error, warn, info, debug, trace, silent',
    })
    .default('info'),
  REQUEST_TIMEOUT_MS: integer(1000, 3_600_000).default(120_000).describe('Longest time to receive one whole request from the client'),
  TRUST_PROXY: trustProxySetting
    .default(false)
    .describe('Proxies trusted to set X-Forwarded-For: false, a hop count, or addresses/CIDRs (true = 1 hop)'),
  SHUTDOWN_TIMEOUT_MS: integer(0, 600_000).default(25_000).describe('Longest wait for in-flight requests on SIGTERM'),
  ESTIMATION_WORKERS: integer(1, 256).default(availableParallelism()).describe('Worker threads for estimation'),
  ESTIMATION_QUEUE_LIMIT: integer(0, 10_000).default(32).describe('Estimations waiting for a worker before 503'),
  RATE_LIMIT_PER_MINUTE: integer(0, 10_000_000).default(0).describe('Requests per minute per key or address; 0 = off'),
  CORS_ORIGINS: z.string().default('').describe('Comma-separated allowed origins, or * ; empty = CORS off'),
  SECURITY_HEADERS: booleanFlag.default(false).describe('Send the usual security headers (helmet)'),
  TROPO_DATA_DIR: z
    .string()
    .min(1, { error: 'must be a directory path' })
    .default('./data')
    .describe('Directory of the SQLite database and of the generated API key file'),
  DATABASE_URL: z
    .string()
    .regex(/^postgres(ql)?:\/\//, { error: 'must be a postgres:// or postgresql:// connection URL' })
    .optional()
    .describe('PostgreSQL connection URL; when set, the archive is stored there instead of SQLite'),
  TROPO_PG_SCHEMA: z
    .string()
    .regex(/^[a-z_][a-z0-9_]{0,62}$/, { error: 'must be a lower-case SQL identifier (a-z, 0-9, _; at most 63 characters)' })
    .default('public')
    .describe('PostgreSQL schema that holds the archive tables'),
  TROPO_API_KEYS: z
    .string()
    .default('')
    .transform((v) =>
      v
        .split(',')
        .map((k) => k.trim())
        .filter(Boolean),
    )
    .refine((keys) => keys.every((k) => k.length >= 16), { error: 'every key must have at least 16 characters' })
    .describe('Comma-separated bearer keys allowed to write (and to read when TROPO_READ_KEYS_REQUIRED=true)'),
  TROPO_READ_KEYS_REQUIRED: booleanFlag.default(false).describe('Whether reads of /v1/stations need a key too'),
  DB_CONNECT_TIMEOUT_MS: integer(100, 600_000)
    .default(5_000)
    .describe('Longest wait for a PostgreSQL connection (a new one or one from the pool) before 503 [ms]'),
  DB_STATEMENT_TIMEOUT_MS: integer(100, 3_600_000)
    .default(30_000)
    .describe('Longest run of one SQL statement (server side) and wait for its answer (client side, + 1 s) before 503 [ms]'),
  READY_CHECK_TIMEOUT_MS: integer(100, 60_000).default(2_000).describe('Deadline of each readiness check of GET /v1/ready [ms]'),
  TROPO_MIN_FREE_DISK_MB: integer(0, 10_000_000)
    .default(64)
    .describe('Free space below which the data directory counts as full for GET /v1/ready [MiB]; 0 = no check'),
  TROPO_MAX_READ_RANGE_DAYS: z.coerce
    .number({ error: 'must be a number of days in (0, 36600]' })
    .positive({ error: 'must be a number of days in (0, 36600]' })
    .max(36600, { error: 'must be a number of days in (0, 36600]' })
    .default(DEFAULT_MAX_READ_RANGE_DAYS)
    .describe('Longest from..to range of one read of a station series [days]'),
});

export type Config = z.infer<typeof configSchema>;

export class ConfigError extends Error {}

/** Defaults for everything, for tests and tools that build the app without an environment. */
export function defaultConfig(overrides: Partial<Config> = {}): Config {
  return { ...configSchema.parse({}), ...overrides };
}

/** Variables whose values never appear in an error message. */
const SECRET_VARIABLES = new Set(['TROPO_API_KEYS', 'DATABASE_URL']);

/** Settings that work but deserve a line in the start-up log (server.ts logs them). */
export function configWarnings(env: NodeJS.ProcessEnv = process.env): string[] {
  const warnings: string[] = [];
  const trust = env.TRUST_PROXY?.trim().toLowerCase();
  if (trust === 'true' || trust === 'yes') {
    warnings.push(
      'TRUST_PROXY=true is taken as 1 trusted hop (the load balancer in front): set the hop count or the proxy addresses/CIDRs explicitly',
    );
  }
  return warnings;
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const relevant = Object.fromEntries(
    Object.keys(configSchema.shape)
      .filter((k) => env[k] !== undefined && env[k] !== '')
      .map((k) => [k, env[k]]),
  );
  const parsed = configSchema.safeParse(relevant);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => {
      const name = String(i.path[0]);
      const shown = SECRET_VARIABLES.has(name) ? '(value hidden)' : JSON.stringify(env[name]);
      return `${name}=${shown}: ${i.message}`;
    });
    throw new ConfigError(`invalid configuration: ${lines.join('; ')}`);
  }
  return parsed.data;
}
