/**
 * docker/compose.yaml, read with an independent YAML parser (the `yaml` package, YAML 1.2 with merge
 * keys as Compose uses them). No container engine runs here: this checks the file's structure against the
 * Compose Specification and the PostgreSQL connection-URI format, not a running stack.
 */

import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { configSchema, environmentName } from '../../src/config.js';

const COMPOSE_FILE = fileURLToPath(new URL('../../docker/compose.yaml', import.meta.url));
const REPO_ROOT = fileURLToPath(new URL('../..', import.meta.url));

interface Service {
  image?: string;
  build?: { context: string; dockerfile: string; args?: Record<string, string> };
  environment?: Record<string, string>;
  secrets?: string[];
  deploy?: { resources?: { limits?: { cpus?: string; memory?: string } } };
  depends_on?: Record<string, { condition: string }>;
  healthcheck?: { test: string[] };
  volumes?: string[];
  ports?: string[];
  networks?: string[];
}
interface ComposeFile {
  name?: string;
  services: Record<string, Service>;
  volumes?: Record<string, unknown>;
  networks?: Record<string, unknown>;
  secrets?: Record<string, { file: string }>;
}

const compose = parse(readFileSync(COMPOSE_FILE, 'utf8'), { merge: true }) as ComposeFile;
const DATABASE = 'database';
const REPLICAS = ['tropodelay-1', 'tropodelay-2'] as const;

/**
 * Compose interpolation as the Compose Specification ("Interpolation") defines it: `${VAR}` and `$VAR`,
 * `${VAR:-default}` (unset or empty), `${VAR-default}` (unset), `${VAR:?message}` / `${VAR?message}`
 * (an error naming VAR), and `$$` for a literal `$`. VAR is taken from `env` only.
 */
function interpolate(value: string, env: Record<string, string>): string {
  return value.replace(
    /\$\$|\$\{([A-Za-z_][A-Za-z0-9_]*)(?:(:-|-|:\?|\?)([^}]*))?\}|\$([A-Za-z_][A-Za-z0-9_]*)/g,
    (match, braced?: string, op?: string, arg?: string, bare?: string) => {
      if (match === '$$') return '$';
      const name = (braced ?? bare)!;
      const set = env[name];
      const emptyCounts = op === ':-' || op === ':?';
      if (set !== undefined && !(emptyCounts && set === '')) return set;
      if (op === ':-' || op === '-') return arg ?? '';
      if (op === ':?' || op === '?') throw new Error(`required variable ${name} is missing a value: ${arg}`);
      return '';
    },
  );
}

/** Every string of the parsed file, interpolated (the way compose resolves the whole file before use). */
function interpolateAll(node: unknown, env: Record<string, string>): unknown {
  if (typeof node === 'string') return interpolate(node, env);
  if (Array.isArray(node)) return node.map((n) => interpolateAll(n, env));
  if (node && typeof node === 'object') return Object.fromEntries(Object.entries(node).map(([k, v]) => [k, interpolateAll(v, env)]));
  return node;
}

describe('Compose Specification: services, health-gated start, named volume', () => {
  it('has a database and two replicas of the service', () => {
    expect(Object.keys(compose.services).sort()).toEqual([DATABASE, ...REPLICAS].sort());
    expect(compose.name).toMatch(/^[a-z0-9][a-z0-9_-]*$/); // project names: lowercase, digits, _ and - (Compose Specification, "name")
  });

  it('starts each replica only when the database reports healthy (depends_on condition: service_healthy)', () => {
    for (const replica of REPLICAS) {
      expect(compose.services[replica]?.depends_on?.[DATABASE]?.condition, replica).toBe('service_healthy');
    }
    const test = compose.services[DATABASE]?.healthcheck?.test ?? [];
    expect(test[0]).toBe('CMD'); // exec form: no shell needed in the check (Compose Specification, "healthcheck")
    expect(test).toContain('pg_isready'); // PostgreSQL's own readiness probe (PostgreSQL documentation, pg_isready)
  });

  it('keeps the database files in a named volume declared at the top level', () => {
    const mounts = compose.services[DATABASE]?.volumes ?? [];
    const dataMount = mounts.find((m) => m.endsWith(':/var/lib/postgresql/data')); // PGDATA of the official image (from memory)
    expect(dataMount).toBeDefined();
    const source = dataMount!.split(':')[0]!;
    // A named volume's source is a name, not a path (Compose Specification, "volumes" short syntax).
    expect(source).toMatch(/^[a-zA-Z0-9][a-zA-Z0-9_.-]*$/);
    expect(Object.keys(compose.volumes ?? {})).toContain(source);
  });

  it('builds the replicas from docker/Dockerfile with the repository root as context', () => {
    for (const replica of REPLICAS) {
      const build = compose.services[replica]?.build;
      expect(build, replica).toBeDefined();
      const context = path.resolve(path.dirname(COMPOSE_FILE), build!.context);
      expect(path.relative(REPO_ROOT, context)).toBe('');
      expect(existsSync(path.join(context, build!.dockerfile))).toBe(true);
      expect(build!.args).toHaveProperty('NPM_REGISTRY'); // an internal npm registry for air-gapped builds
    }
  });

  it('publishes the replicas on loopback only, on different host ports', () => {
    const hostPorts = REPLICAS.map((replica) => {
      const ports = compose.services[replica]?.ports ?? [];
      expect(ports, replica).toHaveLength(1);
      const [ip, hostPort, containerPort] = ports[0]!.split(':');
      expect(ip).toBe('127.0.0.1');
      expect(containerPort).toBe('8080'); // TROPODELAY_PORT set by docker/Dockerfile
      return hostPort;
    });
    expect(new Set(hostPorts).size).toBe(REPLICAS.length);
    expect(compose.services[DATABASE]?.ports).toBeUndefined(); // the database is reachable from its network only
  });

  it('puts every service on the same user-defined network', () => {
    const networks = Object.keys(compose.networks ?? {});
    expect(networks).toHaveLength(1);
    for (const name of [DATABASE, ...REPLICAS]) expect(compose.services[name]?.networks, name).toEqual(networks);
  });
});

describe('interpolation (Compose Specification, "Interpolation")', () => {
  /* eslint-disable no-template-curly-in-string -- compose's own ${…} references */
  it('follows the specification on the operators it uses', () => {
    expect(interpolate('${A:-x}/${B-y}/${C:-z}/$$HOME/$D', { A: '', C: 'c', D: 'd' })).toBe('x/y/c/$HOME/d');
    expect(interpolate('${B-y}', { B: '' })).toBe('');
    expect(() => interpolate('${E:?set E}', { E: '' })).toThrow(/required variable E is missing a value: set E/);
    expect(interpolate('${E?set E}', { E: '' })).toBe('');
  });
  /* eslint-enable no-template-curly-in-string */
});

describe('PostgreSQL connection URI (PostgreSQL documentation, libpq "Connection URIs"): both replicas share one database', () => {
  const replicaEnv = (r: string) => compose.services[r]!.environment!;

  it('gives both replicas the same TROPODELAY_DATABASE_URL, pointing at the database service, user and database, without a password', () => {
    const urls = REPLICAS.map((r) => replicaEnv(r).TROPODELAY_DATABASE_URL);
    expect(urls[1]).toBe(urls[0]);
    const url = new URL(urls[0]!);
    const database = compose.services[DATABASE]!.environment!;
    expect(url.protocol).toBe('postgres:');
    expect(url.hostname).toBe(DATABASE); // service name = host name on the compose network
    expect(url.port).toBe('5432'); // PostgreSQL's default port
    expect(url.username).toBe(database.POSTGRES_USER);
    expect(url.pathname).toBe(`/${database.POSTGRES_DB}`);
    expect(url.password).toBe('');
  });

  it('gives the password to the database and the replicas as one secret file, never as a variable', () => {
    const database = compose.services[DATABASE]!;
    expect(database.environment!.POSTGRES_PASSWORD).toBeUndefined();
    // POSTGRES_PASSWORD_FILE: the official image reads the password from that file (image documentation, from memory).
    expect(database.environment!.POSTGRES_PASSWORD_FILE).toBe('/run/secrets/db_password');
    expect(database.secrets).toContain('db_password');
    for (const r of REPLICAS) {
      expect(replicaEnv(r).TROPODELAY_DATABASE_PASSWORD_FILE).toBe('/run/secrets/db_password'); // secrets mount at /run/secrets/<name>
      expect(compose.services[r]!.secrets).toEqual(expect.arrayContaining(['db_password', 'api_keys']));
    }
  });

  it('gives both replicas the same keys from one secret file (a generated key would differ per container)', () => {
    expect(REPLICAS.map((r) => replicaEnv(r).TROPODELAY_API_KEYS_FILE)).toEqual(['/run/secrets/api_keys', '/run/secrets/api_keys']);
  });

  it('sets only variables the service knows (a misspelt name would be ignored silently)', () => {
    const known = new Set(Object.keys(configSchema.shape).flatMap((k) => [environmentName(k), `${environmentName(k)}_FILE`]));
    for (const r of REPLICAS) for (const name of Object.keys(replicaEnv(r))) expect(known.has(name), name).toBe(true);
  });
});

describe('resource limits and health (issue 15 item 7)', () => {
  /** Compose byte values: a number with b, k, m or g (Compose Specification, "Values in byte format"). */
  const bytes = (v: string) => {
    const m = /^(\d+(?:\.\d+)?)([bkmg])?b?$/i.exec(v)!;
    return Number(m[1]) * 1024 ** 'bkmg'.indexOf((m[2] ?? 'b').toLowerCase());
  };
  const PEAK_ESTIMATION_BYTES = 823e6; // a near-limit estimation peaks at 823 MB (issue 15, measured by the project)

  it('limits CPU and memory of every service, leaving the replicas room for a near-limit estimation', () => {
    for (const name of [DATABASE, ...REPLICAS]) {
      const limits = compose.services[name]!.deploy?.resources?.limits;
      expect(Number(limits?.cpus), name).toBeGreaterThan(0);
      expect(bytes(limits!.memory!), name).toBeGreaterThan(0);
    }
    for (const r of REPLICAS) expect(bytes(compose.services[r]!.deploy!.resources!.limits!.memory!)).toBeGreaterThan(PEAK_ESTIMATION_BYTES);
  });

  it('checks the replicas with docker/healthcheck.mjs, which asks GET /v1/ready', () => {
    for (const r of REPLICAS) {
      const test = compose.services[r]!.healthcheck!.test;
      expect(test.slice(0, 3)).toEqual(['CMD', 'node', 'docker/healthcheck.mjs']);
      expect(test).not.toContain('--live');
    }
    expect(readFileSync(path.join(REPO_ROOT, 'docker/healthcheck.mjs'), 'utf8')).toContain("'/v1/ready'");
  });
});

describe('docs/container.md and docker/compose.yaml together: the documented commands start the stack', () => {
  const DOCS = readFileSync(path.join(REPO_ROOT, 'docs/container.md'), 'utf8');
  const shellLines = [...DOCS.matchAll(/```sh\n([\s\S]*?)```/g)]
    .flatMap((m) => m[1]!.split('\n'))
    .map((l) => l.replace(/\s+#.*$/, '').trim());
  /** Exactly what the docs export: `export NAME=value` lines of their shell blocks (quotes removed). */
  const exported = Object.fromEntries(
    shellLines.flatMap((l) => {
      const m = /^export ([A-Za-z_][A-Za-z0-9_]*)=(.*)$/.exec(l);
      return m ? [[m[1]!, m[2]!.replace(/^(['"])(.*)\1$/, '$2')]] : [];
    }),
  ) as Record<string, string>;
  const raw = parse(readFileSync(COMPOSE_FILE, 'utf8'), { merge: true }) as unknown;

  it('the compose file resolves with exactly the variables the docs export, leaving no reference unresolved', () => {
    const resolved = JSON.stringify(interpolateAll(raw, exported));
    expect(resolved).not.toMatch(/\$\{/);
  });

  it('each variable the compose file requires (a `:?` reference) is exported by the docs', () => {
    const required = [...readFileSync(COMPOSE_FILE, 'utf8').matchAll(/\$\{([A-Za-z0-9_]+):?\?/g)].map((m) => m[1]!);
    for (const name of required) expect(Object.keys(exported), name).toContain(name);
  });

  it('the docs create every secret file the compose file reads, before the command that starts the stack', () => {
    const up = shellLines.findIndex((l) => /^(docker|podman) compose -f docker\/compose\.yaml up\b/.test(l));
    expect(up).toBeGreaterThanOrEqual(0);
    for (const [name, secret] of Object.entries(compose.secrets ?? {})) {
      const file = path.relative(REPO_ROOT, path.resolve(path.dirname(COMPOSE_FILE), secret.file));
      const creates = shellLines.findIndex((l) => l.includes(`> ${file}`));
      expect(creates, `${name}: ${file}`).toBeGreaterThanOrEqual(0);
      expect(creates, `${name} is created before compose up`).toBeLessThan(up);
    }
  });

  it('the docs check the replicas on the ports the compose file publishes', () => {
    for (const r of REPLICAS) {
      const hostPort = compose.services[r]!.ports![0]!.split(':')[1];
      expect(
        shellLines.some((l) => l.includes(`curl`) && l.includes(`127.0.0.1:${hostPort}/v1/ready`)),
        r,
      ).toBe(true);
    }
  });

  it('keeps the secret files out of git and out of the build context', () => {
    expect(readFileSync(path.join(REPO_ROOT, '.gitignore'), 'utf8')).toMatch(/^\/docker\/secrets\/$/m);
    expect(readFileSync(path.join(REPO_ROOT, '.dockerignore'), 'utf8')).toMatch(/^docker\/secrets$/m);
  });
});
