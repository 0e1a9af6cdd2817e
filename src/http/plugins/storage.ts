/**
 * Gives the app its station archive: builds the repository from the storage configuration (or takes
 * a ready one), decorates the app with it as `app.repository`, and closes it when the app closes.
 */

import type { FastifyInstance } from 'fastify';
import { existsSync } from 'node:fs';
import fp from 'fastify-plugin';
import { checkDataDir } from '../../storage/disk-check.js';
import { createRepository, describeStorage, type StorageConfig } from '../../storage/factory.js';
import type { Repository } from '../../storage/repository.js';

declare module 'fastify' {
  interface FastifyInstance {
    repository: Repository;
  }
}

export interface StoragePluginOptions {
  storage: StorageConfig;
  /** A repository built elsewhere (it is closed with the app all the same). */
  repository?: Repository;
}

async function storage(app: FastifyInstance, options: StoragePluginOptions): Promise<void> {
  const repository =
    options.repository ??
    (await createRepository(options.storage, {
      // A dropped connection outside a query is handled (the pool replaces it); it is worth a log line.
      onConnectionError: (err) => app.log.warn({ err }, 'database connection lost'),
    }));
  app.decorate('repository', repository);
  // GET /v1/ready answers 503 while the database does not answer or is not migrated, and while the
  // data directory (the SQLite file, the key file) is full or read-only.
  if (app.hasDecorator('addReadinessCheck')) {
    app.addReadinessCheck('database', () => repository.ping());
    const dir = options.storage.dataDir;
    // With PostgreSQL the directory holds only the generated key file and may not exist at all.
    if (dir !== ':memory:' && (repository.backend === 'sqlite' || existsSync(dir))) {
      app.addReadinessCheck('data_dir', () => checkDataDir({ dir, minFreeBytes: options.storage.minFreeDiskBytes ?? 0 }));
    }
  }
  app.addHook('onClose', async () => {
    await repository.close();
  });
  app.log.info({ storage: describeStorage(options.storage), backend: repository.backend }, 'station archive ready');
}

export default fp(storage, { name: 'storage', dependencies: ['readiness'] });
