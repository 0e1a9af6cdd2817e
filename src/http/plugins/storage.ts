/**
 * Gives the app its station archive: builds the repository from the storage configuration (or takes
 * a ready one), decorates the app with it as `app.repository`, and closes it when the app closes.
 */

import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
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
  const repository = options.repository ?? (await createRepository(options.storage));
  app.decorate('repository', repository);
  // GET /v1/ready answers 503 while the database does not answer or is not migrated.
  if (app.hasDecorator('addReadinessCheck')) app.addReadinessCheck('database', () => repository.ping());
  app.addHook('onClose', async () => {
    await repository.close();
  });
  app.log.info({ storage: describeStorage(options.storage), backend: repository.backend }, 'station archive ready');
}

export default fp(storage, { name: 'storage', dependencies: ['readiness'] });
