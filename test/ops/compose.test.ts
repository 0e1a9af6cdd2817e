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

const COMPOSE_FILE = fileURLToPath(new URL('../../docker/compose.yaml', import.meta.url));
const REPO_ROOT = fileURLToPath(new URL('../..', import.meta.url));

interface Service {
  image?: string;
  build?: { context: string; dockerfile: string; args?: Record<string, string> };
  environment?: Record<string, string>;
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
}

const compose = parse(readFileSync(COMPOSE_FILE, 'utf8'), { merge: true }) as ComposeFile;
const DATABASE = 'database';
const REPLICAS = ['tropodelay-1', 'tropodelay-2'] as const;

/**
 * Compose interpolation as the Compose Specification defines it (${VAR}, ${VAR:-default},
 * ${VAR:?error}), with VAR taken from `env`; an unset required variable throws.
 */
function interpolate(value: string, env: Record<string, string>): string {
  return value.replace(/\$\{([A-Z0-9_]+)(?:(:-|:\?)([^}]*))?\}/g, (_m, name: string, op?: string, arg?: string) => {
    const set = env[name];
    if (set !== undefined && set !== '') return set;
    if (op === ':-') return arg ?? '';
    if (op === ':?') throw new Error(`${name}: ${arg}`);
    return '';
  });
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
      expect(build!.args?.BASE_IMAGE).toBeDefined();
    }
  });

  it('publishes the replicas on loopback only, on different host ports', () => {
    const hostPorts = REPLICAS.map((replica) => {
      const ports = compose.services[replica]?.ports ?? [];
      expect(ports, replica).toHaveLength(1);
      const [ip, hostPort, containerPort] = ports[0]!.split(':');
      expect(ip).toBe('127.0.0.1');
      expect(containerPort).toBe('8080'); // PORT set by docker/Dockerfile
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

describe('PostgreSQL connection URI (PostgreSQL documentation, libpq "Connection URIs"): both replicas share one database', () => {
  const env = { TROPODELAY_DB_PASSWORD: 'pw-for-the-test' };
  const database = compose.services[DATABASE]!.environment!;

  it('gives both replicas the same DATABASE_URL', () => {
    const urls = REPLICAS.map((r) => compose.services[r]?.environment?.DATABASE_URL);
    expect(urls[0]).toBeDefined();
    expect(urls[1]).toBe(urls[0]);
  });

  it('points DATABASE_URL at the database service with its user, password and database name', () => {
    const url = new URL(interpolate(compose.services[REPLICAS[0]]!.environment!.DATABASE_URL!, env));
    expect(url.protocol).toBe('postgres:');
    expect(url.hostname).toBe(DATABASE); // service name = host name on the compose network
    expect(url.port).toBe('5432'); // PostgreSQL's default port
    expect(url.username).toBe(database.POSTGRES_USER);
    expect(url.pathname).toBe(`/${database.POSTGRES_DB}`);
    expect(decodeURIComponent(url.password)).toBe(interpolate(database.POSTGRES_PASSWORD!, env));
  });

  it('gives both replicas the same write keys from the environment (a generated key would differ per container)', () => {
    const keys = REPLICAS.map((r) => compose.services[r]?.environment?.TROPO_API_KEYS);
    expect(keys[0]).toMatch(/^\$\{TROPODELAY_API_KEYS:\?[^}]+\}$/);
    expect(keys[1]).toBe(keys[0]);
    expect(() => interpolate(keys[0]!, {})).toThrow(/TROPODELAY_API_KEYS/);
  });

  it('ships no password: it must come from the environment, and compose refuses to start without it', () => {
    expect(database.POSTGRES_PASSWORD).toMatch(/^\$\{TROPODELAY_DB_PASSWORD:\?[^}]+\}$/);
    expect(() => interpolate(compose.services[REPLICAS[0]]!.environment!.DATABASE_URL!, {})).toThrow(/TROPODELAY_DB_PASSWORD/);
  });
});
