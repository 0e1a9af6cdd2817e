/**
 * Rolling update and rollback on one shared database (issue 15 item 5): replicas of the previous release
 * keep serving while a replica of the next release applies an expanding migration, a replica rolled back
 * becomes ready again, and a contracting migration makes the previous release not-ready with the reason.
 *
 * Source of the rule: the expand/contract ("parallel change") practice of schema evolution, where a change
 * that only adds to a schema leaves older readers working and a change that removes or renames does not
 * (common practice). The migrations of the "next release" below are samples written for this test; the
 * previous release is this repository's own MIGRATIONS, whose last version is never hard-coded.
 */

import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../src/http/app.js';
import type { StorageConfig } from '../../src/storage/factory.js';
import { MIGRATIONS, SchemaMismatchError, checkSchemaCompatibility, type Migration } from '../../src/storage/migrations.js';
import { BACKENDS } from '../helpers/storage.js';

const KEY = 'rolling-update-key-0123456789';
const N = MIGRATIONS.at(-1)!.version;

/** An expanding migration (a new nullable column): the previous release keeps working. */
const EXPAND: Migration = {
  version: N + 1,
  name: 'sample: a nullable note column on stations',
  sql: 'ALTER TABLE stations ADD COLUMN sample_note TEXT',
  minReaderVersion: N,
};
/** A contracting migration: it declares nothing, so only releases that know it may serve. */
const CONTRACT: Migration = {
  version: N + 2,
  name: 'sample: a table the previous release does not know how to keep consistent',
  sql: 'CREATE TABLE sample_contracted (station_id TEXT PRIMARY KEY)',
};

const PREVIOUS_RELEASE = MIGRATIONS;
const NEXT_RELEASE = [...MIGRATIONS, EXPAND];
const RELEASE_AFTER = [...MIGRATIONS, EXPAND, CONTRACT];

const STATION = { name: 'Larkspur Ridge (invented)', latitude_deg: 46.2, longitude_deg: 8.9, height_m: 512 };

describe('schema compatibility rule (expand/contract, common practice)', () => {
  const applied = (ms: readonly Migration[]) =>
    ms.map((m) => ({ version: m.version, name: m.name, minReaderVersion: m.minReaderVersion ?? m.version }));

  it('accepts its own schema', () => {
    expect(() => checkSchemaCompatibility(applied(PREVIOUS_RELEASE), PREVIOUS_RELEASE)).not.toThrow();
  });
  it('accepts a newer schema whose newer migrations all declare it compatible', () => {
    expect(() => checkSchemaCompatibility(applied(NEXT_RELEASE), PREVIOUS_RELEASE)).not.toThrow();
  });
  it('refuses a newer migration that declares nothing, naming it', () => {
    expect(() => checkSchemaCompatibility(applied(RELEASE_AFTER), PREVIOUS_RELEASE)).toThrow(SchemaMismatchError);
    expect(() => checkSchemaCompatibility(applied(RELEASE_AFTER), PREVIOUS_RELEASE)).toThrow(
      new RegExp(`migration ${N + 2} .*this release knows up to ${N}`),
    );
  });
  it('refuses a row written before min_reader_version existed (NULL) when it is newer than the reader', () => {
    const rows = [...applied(PREVIOUS_RELEASE), { version: N + 1, name: 'old row', minReaderVersion: null }];
    expect(() => checkSchemaCompatibility(rows, PREVIOUS_RELEASE)).toThrow(/migration \d+ \(old row\)/);
  });
  it('refuses a schema that lacks a migration of the reader (not migrated yet)', () => {
    expect(() => checkSchemaCompatibility(applied(PREVIOUS_RELEASE), NEXT_RELEASE)).toThrow(/lacks migration \d+ .*not migrated yet/);
  });
});

for (const backend of BACKENDS) {
  describe(`rolling update of two replicas on one ${backend.name} database`, { timeout: 120_000 }, () => {
    let storage: StorageConfig;
    let cleanup: () => Promise<void>;
    const open: FastifyInstance[] = [];

    /** A replica of the release that knows `migrations`, on the shared database. */
    async function replica(migrations: readonly Migration[]): Promise<FastifyInstance> {
      const app = await buildApp({
        validateResponses: true,
        archive: {
          storage: { ...storage, migrations },
          apiKeys: [KEY],
          keyDir: storage.dataDir,
          readKeysRequired: false,
          maxReadRangeDays: 366,
        },
      });
      open.push(app);
      return app;
    }
    const ready = (app: FastifyInstance) => request(app.server).get('/v1/ready');

    beforeAll(async () => {
      const fresh = await backend.fresh();
      storage = fresh.config;
      cleanup = fresh.cleanup;
    });
    afterAll(async () => {
      for (const app of open) await app.close();
      await cleanup?.();
    });

    it('both replicas stay ready when one is updated to an expanding migration, and a write through one reads through the other', async () => {
      const a = await replica(PREVIOUS_RELEASE);
      let b = await replica(PREVIOUS_RELEASE);
      expect((await ready(a)).status).toBe(200);
      expect((await ready(b)).status).toBe(200);

      await b.close();
      b = await replica(NEXT_RELEASE);
      const afterUpdate = await Promise.all([ready(a), ready(b)]);
      expect(afterUpdate.map((r) => r.status)).toEqual([200, 200]);
      expect(afterUpdate[0]!.body.checks.database).toBe('ok');

      await request(a.server).put('/v1/stations/LARK1').set('authorization', `Bearer ${KEY}`).send(STATION).expect(201);
      const read = await request(b.server).get('/v1/stations/LARK1').expect(200);
      expect(read.body.name).toBe(STATION.name);

      // Rollback of the updated replica: the schema stays at N+1, which declares N compatible.
      await b.close();
      const rolledBack = await replica(PREVIOUS_RELEASE);
      expect((await ready(rolledBack)).status).toBe(200);
      expect((await ready(a)).status).toBe(200);
      await request(rolledBack.server).get('/v1/stations/LARK1').expect(200);
    });

    it('a contracting migration makes the previous release not-ready with the reason, the new one ready', async () => {
      const after = await replica(RELEASE_AFTER);
      const old = await replica(PREVIOUS_RELEASE);
      expect((await ready(after)).status).toBe(200);
      const answer = await ready(old);
      expect(answer.status).toBe(503);
      expect(answer.body.status).toBe('not-ready');
      expect(answer.body.checks.database).toMatch(new RegExp(`migration ${N + 2} \\(sample: .*this release knows up to ${N}`));
    });
  });
}
