/**
 * Configuration from the environment, validated at start with zod. An invalid value stops the
 * start with a message naming the variable. README.md's table of every variable is generated from
 * configSchema (`npm run docs:config`).
 *
 * Every variable has the prefix TROPODELAY_ (environmentName()). The names of earlier releases (`PORT`,
 * `DATABASE_URL`, `TROPO_DATA_DIR`, …) still work as deprecated aliases: configWarnings() names the new
 * one at start, and an alias set beside its new name to a different value stops the start. Secrets
 * (SECRET_SETTINGS) may also be given as a file, `<NAME>_FILE` (a container secret): its content with
 * one trailing newline removed.
 */

import { readFileSync } from 'node:fs';
import { z } from 'zod';
import { defaultWorkerCount } from './cpu-quota.js';
import { MAX_NETWORK_DAY_STATION_OBSERVATIONS } from './limits.js';

/**
 * Memory budget of the worker tasks running at once [MB] (src/workers/compute-pool.ts MemoryBudget).
 * 192 MB holds two 1-day estimations (~16 MB each as columns JSON) and a request of up to ~23 MB of
 * columns JSON (~260 000 observations) beside them; anything larger runs alone (on new threads), so two
 * near-limit requests never overlap (issue 14; bench/service-memory.bench.ts).
 */
export const DEFAULT_COMPUTE_MEMORY_BUDGET_MB = 192;

/**
 * Days an audit event is kept [days]. Audit trails are often kept a year or more (common practice); 400 days
 * is a year and a month, so that a yearly review of the past twelve months, done in the month after, finds
 * every event of them. An agency writing hourly from 1 000 stations stores ~24 000 events a day, so ~9.6 M
 * rows (a few GB with the indexes on PostgreSQL) at this setting.
 */
export const DEFAULT_AUDIT_RETENTION_DAYS = 400;

/**
 * The campaign sweep (PostgreSQL; src/http/plugins/campaigns.ts): how often a replica looks for pending items
 * whose queue job was never sent (a replica died between its commit and the send) [s], and how long an item
 * must have been ready before the sweep takes it [s], so that a submission still sending its jobs is not swept.
 * A minute each: a lost item waits one to two minutes, and a replica's sweep is one indexed query a minute.
 */
export const DEFAULT_CAMPAIGN_SWEEP_INTERVAL_S = 60;
export const DEFAULT_CAMPAIGN_SWEEP_GRACE_S = 60;

/**
 * Warm-up estimations per worker thread at start (TROPODELAY_WARM_UP_ESTIMATIONS; src/http/tasks/warm-up.ts).
 * Chosen by measurement (`npm run bench -- fresh-start` with 0, 10, 20, 40 and 80): 10 already takes most of the
 * first requests' compilation away, 40 gave the steadiest first 5 and first 40 requests for about 0.5 s more CPU
 * at start than 10 (DEVELOPERS.md, "The warm-up at start").
 */
export const DEFAULT_WARM_UP_ESTIMATIONS = 40;

/**
 * Quiet time after which an estimation worker thread collects its garbage, and 6 s later once more, which gives
 * back its young generation (TROPODELAY_WORKER_IDLE_TRIM_S; src/workers/idle-trim.ts) [s]. Off by default: the
 * young generation regrows slowly afterwards (the code is compiled by then and little survives a scavenge), and
 * the GPS-like day cost 29 instead of 26 ms of CPU a request for at least 300 requests after a trim (DEVELOPERS.md,
 * "The young generations of idle threads"), a cost on the request path. 60 suits a replica whose memory matters
 * more than the first few hundred requests after an idle minute (idle 295 → ~225 MB with 2 threads).
 */
export const DEFAULT_WORKER_IDLE_TRIM_S = 0;

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
  TROPODELAY_AUDIT_RETENTION_DAYS: integer(0, 36500)
    .default(DEFAULT_AUDIT_RETENTION_DAYS)
    .describe(
      'days an audit event is kept, 0..36 500; older ones are deleted by the retention run (at start, hourly, and `POST /v1/admin/purge`) in batches; 0 = keep every event forever',
    ),
};

// --------------------------------------------------------------------------------------------------

export const configSchema = z.object({
  ...accessSettings,
  PORT: integer(0, 65535).default(8080).describe('TCP port (0..65535)'),
  HOST: z.string().min(1).default('127.0.0.1').describe('address to bind (0.0.0.0 in a container; the image sets it)'),
  LOG_LEVEL: z
    .enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'], {
      error: 'must be one of fatal, error, warn, info, debug, trace, silent',
    })
    .default('info')
    .describe('lowest level logged: fatal, error, warn, info, debug, trace, silent'),
  TROPODELAY_LOG_FORMAT: z
    .enum(['iso', 'epoch'], { error: 'must be iso or epoch' })
    .default('iso')
    .describe(
      'log line shape: `iso` = level names ("info") and ISO 8601 UTC times ("time":"2026-…Z"); `epoch` = numeric levels (30) and epoch milliseconds',
    ),
  REQUEST_TIMEOUT_MS: integer(1000, 3_600_000).default(120_000).describe('longest time to receive one request [ms], 1000..3 600 000'),
  TRUST_PROXY: trustProxySetting
    .default(false)
    .describe(
      'proxies trusted to set `X-Forwarded-For` (the rate limit keys on the client address it gives): `false` = none; addresses/CIDRs of the load balancers, comma-separated (preferred); or a hop count 1..16 (only where clients cannot bypass the proxy). `true` = 1 hop, warned at start. See [docs/operations.md](docs/operations.md#cors-security-headers-rate-limit)',
    ),
  SHUTDOWN_TIMEOUT_MS: integer(0, 600_000)
    .default(25_000)
    .describe('longest wait for in-flight requests after SIGTERM/SIGINT before exiting 1 [ms], 0..600 000'),
  ESTIMATION_WORKERS: integer(1, 256)
    .default(defaultWorkerCount())
    .describe(
      'worker threads for estimations, 1..256; by default the CPU quota of the container (cgroup v2 `cpu.max`, v1 `cpu.cfs_quota_us`) rounded up, else the number of cores',
    ),
  TROPODELAY_CAMPAIGN_CONCURRENCY: integer(0, 256)
    .default(1)
    .describe(
      'campaign items (station-days) one replica estimates at once, 0..256; 0 = this replica takes no campaign items (it still accepts campaigns)',
    ),
  TROPODELAY_NETWORK_DAY_MAX_STATION_OBSERVATIONS: integer(1, 1_000_000_000)
    .default(MAX_NETWORK_DAY_STATION_OBSERVATIONS)
    .describe(
      'largest stations × observations of one network estimation from residual deposits (`POST /v1/network/days/{day}/zwd-estimates`), 1..1 000 000 000; the default holds a 50-station day of 30-s data (about 1.9 GB of memory in the replica)',
    ),
  TROPODELAY_CAMPAIGN_ITEM_TIMEOUT_S: integer(5, 86_400)
    .default(600)
    .describe(
      "a campaign item not finished after this long is given to another replica [s], 5..86 400 (PostgreSQL; a killed replica's items wait this long); longer than one station-day takes",
    ),
  TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S: integer(1, 86_400)
    .default(DEFAULT_CAMPAIGN_SWEEP_INTERVAL_S)
    .describe(
      'how often a replica looks for pending campaign items whose queue job was never sent (a replica died between its commit and the send) and queues them [s], 1..86 400 (PostgreSQL; SQLite takes up every unfinished item at start)',
    ),
  TROPODELAY_CAMPAIGN_SWEEP_GRACE_S: integer(1, 86_400)
    .default(DEFAULT_CAMPAIGN_SWEEP_GRACE_S)
    .describe(
      'how long a campaign item must have been ready before the sweep queues it [s], 1..86 400; longer than a submission takes to send its jobs (PostgreSQL)',
    ),
  TROPODELAY_REPLICA_NAME: z
    .string()
    .regex(/^[A-Za-z0-9._:@-]{1,64}$/, { error: 'must be 1-64 characters of letters, digits and . _ : @ -' })
    .optional()
    .describe('name of this replica in campaign progress and reports; default host name and process id'),
  ESTIMATION_QUEUE_LIMIT: integer(0, 10_000)
    .default(32)
    .describe('estimations that may wait for a worker before new ones get 503 + Retry-After, 0..10 000'),
  TROPODELAY_COMPUTE_MEMORY_BUDGET_MB: integer(0, 1_048_576)
    .default(DEFAULT_COMPUTE_MEMORY_BUDGET_MB)
    .describe(
      'memory the worker tasks running at once may take together [MB], each estimated from its body (src/limits.ts TASK_MEMORY_PER_BODY_BYTE); a task that does not fit waits (it counts against ESTIMATION_QUEUE_LIMIT), one larger than the budget runs alone; 0 = no budget',
    ),
  TROPODELAY_WARM_UP_ESTIMATIONS: integer(0, 1000)
    .default(DEFAULT_WARM_UP_ESTIMATIONS)
    .describe(
      'estimations of an invented 3-hour slice each worker thread runs at start before it takes requests, so that the first requests do not pay for compiling the estimator; `/v1/ready` answers 503 until every thread is done (requests are still served, more slowly), 0..1000; 0 = no warm-up',
    ),
  TROPODELAY_WORKER_IDLE_TRIM_S: integer(0, 86_400)
    .default(DEFAULT_WORKER_IDLE_TRIM_S)
    .describe(
      'seconds without a task after which an estimation worker thread collects its garbage, and 6 s later once more, giving its young generation back to the system (~30 MB a thread; 60: idle replica 295 → ~225 MB); the next few hundred requests cost ~10 % more CPU while it grows again, 0..86 400; 0 = never',
    ),
  RATE_LIMIT_PER_MINUTE: integer(0, 10_000_000)
    .default(0)
    .describe('requests per minute per API key or client address; health, ready and metrics exempt'),
  CORS_ORIGINS: z.string().default('').describe('comma-separated allowed origins, or `*`'),
  SECURITY_HEADERS: booleanFlag
    .default(false)
    .describe('`true`: send the usual security headers (helmet, without a Content-Security-Policy)'),
  TROPO_DATA_DIR: z
    .string()
    .min(1, { error: 'must be a directory path' })
    .default('./data')
    .describe('directory of the SQLite archive (`tropodelay.sqlite`) and of the generated key file `api-key`; created on start'),
  DATABASE_URL: z
    .string()
    .regex(/^postgres(ql)?:\/\//, { error: 'must be a postgres:// or postgresql:// connection URL' })
    .optional()
    .describe(
      '`postgres://` or `postgresql://` URL; when set, the archive lives in PostgreSQL (the key file still goes to `TROPODELAY_DATA_DIR`). Keep the password out of it: `TROPODELAY_DATABASE_PASSWORD`',
    ),
  TROPODELAY_DATABASE_PASSWORD: z
    .string()
    .min(1, { error: 'must not be empty' })
    .optional()
    .describe('PostgreSQL password, passed to the driver apart from the URL (it overrides one inside the URL)'),
  TROPO_PG_SCHEMA: z
    .string()
    .regex(/^[a-z_][a-z0-9_]{0,62}$/, { error: 'must be a lower-case SQL identifier (a-z, 0-9, _; at most 63 characters)' })
    .default('public')
    .describe('PostgreSQL schema of the archive tables (created if missing)'),
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
  TROPO_READ_KEYS_REQUIRED: booleanFlag.default(false).describe('`true`: reads of `/v1/stations...` need a key too'),
  DB_CONNECT_TIMEOUT_MS: integer(100, 600_000)
    .default(5_000)
    .describe('longest wait for a PostgreSQL connection, new or from the pool, before a 503 [ms], 100..600 000'),
  DB_STATEMENT_TIMEOUT_MS: integer(100, 3_600_000)
    .default(30_000)
    .describe(
      'PostgreSQL `statement_timeout` [ms], 100..3 600 000; the client gives up 1 s later (a blackholed database), then 503. SQLite waits for a lock at most the smaller of it and 5 s',
    ),
  READY_CHECK_TIMEOUT_MS: integer(100, 60_000).default(2_000).describe('deadline of each check of `GET /v1/ready` [ms], 100..60 000'),
  TROPO_MIN_FREE_DISK_MB: integer(0, 10_000_000)
    .default(64)
    .describe(
      'free space of `TROPODELAY_DATA_DIR` below which `GET /v1/ready` answers 503 [MiB]; 0 = no floor (the write probe still runs)',
    ),
  TROPO_MAX_READ_RANGE_DAYS: z.coerce
    .number({ error: 'must be a number of days in (0, 36600]' })
    .positive({ error: 'must be a number of days in (0, 36600]' })
    .max(36600, { error: 'must be a number of days in (0, 36600]' })
    .default(DEFAULT_MAX_READ_RANGE_DAYS)
    .describe('longest `from..to` of one read of a station series [days], (0, 36 600]'),
});

export type Config = z.infer<typeof configSchema>;
type SettingName = keyof typeof configSchema.shape;

export class ConfigError extends Error {}

/** Defaults for everything, for tests and tools that build the app without an environment. */
export function defaultConfig(overrides: Partial<Config> = {}): Config {
  return { ...configSchema.parse({}), ...overrides };
}

/** Settings that are secrets: their values never appear in a message, and `<NAME>_FILE` may give them. */
const SECRET_SETTINGS = new Set<string>(['TROPO_API_KEYS', 'TROPODELAY_API_KEYS', 'DATABASE_URL', 'TROPODELAY_DATABASE_PASSWORD']);

const PREFIX = 'TROPODELAY_';

/**
 * The environment variable of a setting: the setting itself when it already has the prefix, else
 * TROPODELAY_ + its name without an old `TROPO_` prefix (`PORT` → `TROPODELAY_PORT`, `TROPO_DATA_DIR` →
 * `TROPODELAY_DATA_DIR`). A setting whose derived name is another setting's keeps its own name.
 */
export function environmentName(setting: string): string {
  if (setting.startsWith(PREFIX)) return setting;
  const derived = PREFIX + setting.replace(/^TROPO_/, '');
  return derived in configSchema.shape ? setting : derived;
}

/** The deprecated name of a setting (its name in earlier releases), if it has one. */
export function deprecatedName(setting: string): string | undefined {
  return environmentName(setting) === setting ? undefined : setting;
}

/** Whether `<NAME>_FILE` gives a setting (a secret whose _FILE form is not a setting of its own). */
function hasFileForm(setting: string): boolean {
  const name = environmentName(setting);
  return SECRET_SETTINGS.has(setting) && name.startsWith(PREFIX) && !(`${name}_FILE` in configSchema.shape);
}

/** A file's content with one trailing newline (LF or CRLF) removed, as container secrets are written. */
export function secretFromFile(text: string): string {
  return text.replace(/\r?\n$/, '');
}

export type ReadSecretFile = (path: string) => string;

interface ResolvedEnvironment {
  /** Raw values by setting name, for configSchema. */
  values: Record<string, string>;
  /** The variable each value came from (for messages). */
  from: Record<string, string>;
  problems: string[];
  warnings: string[];
}

/** Finds each setting's raw value under its name, its `_FILE` form or its deprecated name. */
function resolveEnvironment(env: NodeJS.ProcessEnv, readFile: ReadSecretFile): ResolvedEnvironment {
  const out: ResolvedEnvironment = { values: {}, from: {}, problems: [], warnings: [] };
  const given = (name: string) => (env[name] !== undefined && env[name] !== '' ? env[name] : undefined);
  for (const setting of Object.keys(configSchema.shape)) {
    const name = environmentName(setting);
    const old = deprecatedName(setting);
    const secret = SECRET_SETTINGS.has(setting);
    let value = given(name);
    let from = name;
    const fileName = `${name}_FILE`;
    const filePath = hasFileForm(setting) ? given(fileName) : undefined;
    if (filePath !== undefined) {
      if (value !== undefined) {
        out.problems.push(`${name} and ${fileName} are both set: set one of them`);
        continue;
      }
      try {
        value = secretFromFile(readFile(filePath));
        from = fileName;
      } catch (err) {
        const code = (err as NodeJS.ErrnoException).code ?? 'unreadable';
        out.problems.push(`${fileName}=${JSON.stringify(filePath)}: cannot read the file (${code})`);
        continue;
      }
    }
    const oldValue = old !== undefined ? given(old) : undefined;
    if (old !== undefined && oldValue !== undefined) {
      if (value !== undefined && value !== oldValue) {
        const shown = secret ? '' : ` (${JSON.stringify(oldValue)} and ${JSON.stringify(value)})`;
        out.problems.push(`${old} (deprecated) and ${from} are both set to different values${shown}: keep ${name} only`);
        continue;
      }
      out.warnings.push(`${old} is deprecated: rename it to ${name}`);
      if (value === undefined) {
        value = oldValue;
        from = old;
      }
    }
    if (value !== undefined) {
      out.values[setting] = value;
      out.from[setting] = from;
    }
  }
  return out;
}

/** Settings that work but deserve a line in the start-up log (server.ts logs them). */
export function configWarnings(env: NodeJS.ProcessEnv = process.env): string[] {
  const resolved = resolveEnvironment(env, () => '');
  const warnings = [...resolved.warnings];
  if (resolved.values['TROPO_API_KEYS']?.trim()) {
    warnings.push(
      'TROPO_API_KEYS is deprecated: its keys have role write and are named key-1, key-2, ...; give keys as TROPODELAY_API_KEYS=name:role:secret,... or TROPODELAY_API_KEYS_FILE',
    );
  }
  const trust = resolved.values['TRUST_PROXY']?.trim().toLowerCase();
  if (trust === 'true' || trust === 'yes') {
    warnings.push(
      `${resolved.from['TRUST_PROXY']}=true is taken as 1 trusted hop (the load balancer in front): set the hop count or the proxy addresses/CIDRs explicitly`,
    );
  }
  return warnings;
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env, readFile: ReadSecretFile = (p) => readFileSync(p, 'utf8')): Config {
  const resolved = resolveEnvironment(env, readFile);
  if (resolved.problems.length > 0) throw new ConfigError(`invalid configuration: ${resolved.problems.join('; ')}`);
  const parsed = configSchema.safeParse(resolved.values);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => {
      const setting = String(i.path[0]);
      const name = resolved.from[setting] ?? environmentName(setting);
      const shown = SECRET_SETTINGS.has(setting) ? '(value hidden)' : JSON.stringify(resolved.values[setting]);
      return `${name}=${shown}: ${i.message}`;
    });
    throw new ConfigError(`invalid configuration: ${lines.join('; ')}`);
  }
  return parsed.data;
}

/** Defaults shown in the README table where the schema's default is not the whole story. */
const SHOWN_DEFAULTS: Partial<Record<SettingName, string>> = {
  ESTIMATION_WORKERS: 'the container CPU quota rounded up, else the number of cores',
  DATABASE_URL: '(unset: SQLite)',
  TROPODELAY_DATABASE_PASSWORD: '(unset)',
  TROPO_API_KEYS: '(unset: the generated key file)',
  CORS_ORIGINS: '(empty: CORS off)',
  RATE_LIMIT_PER_MINUTE: '0 (off)',
};

/**
 * The README's table of variables (`npm run docs:config`; test/ops/config.test.ts checks the README
 * holds it): new name, deprecated name, `_FILE` form, default and meaning, all from configSchema.
 */
export function configurationTable(): string {
  const defaults = configSchema.parse({}) as Record<string, unknown>;
  const rows = Object.entries(configSchema.shape).map(([setting, schema]) => {
    const name = environmentName(setting);
    const names = [`\`${name}\``];
    if (hasFileForm(setting)) names.push(`\`${name}_FILE\``);
    const old = deprecatedName(setting);
    const value = defaults[setting];
    const shown =
      SHOWN_DEFAULTS[setting as SettingName] ??
      (value === undefined || (Array.isArray(value) && value.length === 0)
        ? '(unset)'
        : typeof value === 'object'
          ? JSON.stringify(value)
          : String(value as string | number | boolean));
    const meaning = (schema.description ?? '').replace(/\|/g, '\\|');
    return `| ${names.join(' or ')} | ${old ? `\`${old}\`` : ''} | ${shown} | ${meaning} |`;
  });
  return ['| variable | deprecated name | default | meaning |', '|---|---|---|---|', ...rows].join('\n');
}

/** Replaces the table between the README's config-table markers. */
export function withConfigurationTable(readme: string): string {
  const start = '<!-- config-table:start -->';
  const end = '<!-- config-table:end -->';
  const i = readme.indexOf(start);
  const j = readme.indexOf(end);
  if (i < 0 || j < i) throw new Error(`README.md lacks the markers ${start} … ${end}`);
  return `${readme.slice(0, i + start.length)}\n${configurationTable()}\n${readme.slice(j)}`;
}
