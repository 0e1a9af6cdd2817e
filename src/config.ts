/**
 * Configuration from the environment, validated at start with zod. An invalid value stops the
 * start with a message naming the variable. README.md has the table of every variable.
 */

import { readFileSync } from 'node:fs';
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

// --- Access: API keys with roles, soft-delete retention (issue 15) -------------------------------

/** A bearer key given in the configuration: its name (in the audit trail and logs), role and secret. */
export interface ConfiguredKey {
  name: string;
  role: 'read' | 'write' | 'admin';
  secret: string;
}
const KEY_NAME = /^[A-Za-z0-9][A-Za-z0-9._-]{0,63}$/;
const KEY_ROLES = new Set(['read', 'write', 'admin']);
export const MIN_KEY_SECRET_CHARS = 16;
const KEY_FORMAT = 'name:role:secret (name of letters, digits, . _ -; role read, write or admin; secret of at least 16 characters)';

/** One `name:role:secret` entry; the error never contains the secret. */
export function parseKeyEntry(entry: string): ConfiguredKey | string {
  const first = entry.indexOf(':');
  const second = first < 0 ? -1 : entry.indexOf(':', first + 1);
  if (second < 0) return `not of the form ${KEY_FORMAT}`;
  const name = entry.slice(0, first).trim();
  const role = entry.slice(first + 1, second).trim();
  const secret = entry.slice(second + 1).trim();
  if (!KEY_NAME.test(name))
    return `key name ${JSON.stringify(name.slice(0, 64))} must be 1-64 letters, digits, . _ - (starting with a letter or digit)`;
  if (!KEY_ROLES.has(role)) return `key ${name}: role ${JSON.stringify(role.slice(0, 16))} must be read, write or admin`;
  if (secret.length < MIN_KEY_SECRET_CHARS || /[\s,]/.test(secret))
    return `key ${name}: the secret must have at least ${MIN_KEY_SECRET_CHARS} characters and no spaces or commas`;
  return { name, role: role as ConfiguredKey['role'], secret };
}

const apiKeyList = z
  .string()
  .default('')
  .transform((raw, ctx): ConfiguredKey[] => {
    const keys: ConfiguredKey[] = [];
    for (const entry of raw.split(',').map((e) => e.trim())) {
      if (!entry) continue;
      const key = parseKeyEntry(entry);
      if (typeof key === 'string') ctx.addIssue({ code: 'custom', message: key });
      else keys.push(key);
    }
    return keys;
  });

/**
 * Every configured key: TROPODELAY_API_KEYS, then the lines of TROPODELAY_API_KEYS_FILE (`#` comments and
 * blank lines skipped), then the deprecated TROPO_API_KEYS (role write, named key-1, key-2, ...).
 * Names and secrets must be unique. Throws ConfigError naming the file and line, never a secret.
 */
export function configuredApiKeys(config: Config, readText: (path: string) => string = (p) => readFileSync(p, 'utf8')): ConfiguredKey[] {
  const keys = [...config.TROPODELAY_API_KEYS];
  const file = config.TROPODELAY_API_KEYS_FILE;
  if (file) {
    let text: string;
    try {
      text = readText(file);
    } catch (err) {
      throw new ConfigError(
        `TROPODELAY_API_KEYS_FILE=${JSON.stringify(file)}: cannot be read (${(err as NodeJS.ErrnoException).code ?? 'error'})`,
      );
    }
    text.split(/\r?\n/).forEach((line, i) => {
      const entry = line.trim();
      if (!entry || entry.startsWith('#')) return;
      const key = parseKeyEntry(entry);
      if (typeof key === 'string') throw new ConfigError(`TROPODELAY_API_KEYS_FILE=${JSON.stringify(file)} line ${i + 1}: ${key}`);
      keys.push(key);
    });
  }
  config.TROPO_API_KEYS.forEach((secret, i) => keys.push({ name: `key-${i + 1}`, role: 'write', secret }));
  const names = new Set<string>();
  const secrets = new Set<string>();
  for (const k of keys) {
    if (names.has(k.name))
      throw new ConfigError(`API keys: the name ${k.name} is given twice (TROPODELAY_API_KEYS, its file, TROPO_API_KEYS)`);
    if (secrets.has(k.secret)) throw new ConfigError(`API keys: key ${k.name} has the same secret as another key`);
    names.add(k.name);
    secrets.add(k.secret);
  }
  return keys;
}

const accessSettings = {
  TROPODELAY_API_KEYS: apiKeyList.describe('Comma-separated bearer keys as name:role:secret (role read, write or admin)'),
  TROPODELAY_API_KEYS_FILE: z
    .string()
    .min(1)
    .optional()
    .describe('File with one name:role:secret key per line (a container secret); # comments and blank lines skipped'),
  TROPODELAY_DELETE_RETENTION_DAYS: z.coerce
    .number({ error: 'must be a number of days in [0, 36500]' })
    .min(0, { error: 'must be a number of days in [0, 36500]' })
    .max(36500, { error: 'must be a number of days in [0, 36500]' })
    .default(30)
    .describe('Days a deleted station stays restorable before the purge removes it with its series'),
};

// --------------------------------------------------------------------------------------------------

export const configSchema = z.object({
  ...accessSettings,
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
    .describe('Deprecated: comma-separated bearer keys, each of role write, named key-1, key-2 ... (use TROPODELAY_API_KEYS)'),
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
const SECRET_VARIABLES = new Set(['TROPO_API_KEYS', 'TROPODELAY_API_KEYS', 'DATABASE_URL']);

/** Settings that work but deserve a line in the start-up log (server.ts logs them). */
export function configWarnings(env: NodeJS.ProcessEnv = process.env): string[] {
  const warnings: string[] = [];
  if (env.TROPO_API_KEYS?.trim()) {
    warnings.push(
      'TROPO_API_KEYS is deprecated: its keys have role write and are named key-1, key-2, ...; give keys as TROPODELAY_API_KEYS=name:role:secret,... or TROPODELAY_API_KEYS_FILE',
    );
  }
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
