/**
 * Builds the HTTP application as a plugin tree; never listens (server.ts does). Tests build the
 * same app and talk to it in-process.
 */

import { randomUUID } from 'node:crypto';
import Fastify, { LogController, type FastifyInstance, type FastifyServerOptions } from 'fastify';
import { validatorCompiler, type ZodTypeProvider } from 'fastify-type-provider-zod';
import {
  configuredApiKeys,
  DEFAULT_AUDIT_RETENTION_DAYS,
  DEFAULT_MAX_READ_RANGE_DAYS,
  defaultConfig,
  type Config,
  type ConfiguredKey,
} from '../config.js';
import type { StorageConfig } from '../storage/factory.js';
import type { Repository } from '../storage/repository.js';
import { MAX_NETWORK_DAY_STATION_OBSERVATIONS, MAX_QUERY_VALUE_CHARS } from '../limits.js';
import { HttpProblem } from './problem.js';
import { checkResponsesAgainstSchemas } from './response-check.js';
import audit from './plugins/audit.js';
import auth from './plugins/auth.js';
import computePool from './plugins/compute-pool.js';
import edge, { trustProxyOption } from './plugins/edge.js';
import errorHandler, { routerErrorHandler } from './plugins/error-handler.js';
import jsonBody from './plugins/json-body.js';
import metrics from './plugins/metrics.js';
import openapi from './plugins/openapi.js';
import readiness from './plugins/readiness.js';
import retention from './plugins/retention.js';
import requestLog from './plugins/request-log.js';
import storage from './plugins/storage.js';
import adminAuditRoute from './routes/admin-audit.js';
import adminKeysRoute from './routes/admin-keys.js';
import adminStationsRoute from './routes/admin-stations.js';
import healthRoute from './routes/health.js';
import mappingFactorsRoute from './routes/mapping-factors.js';
import networkDaysRoute from './routes/network-days.js';
import networkEstimatesRoute from './routes/network-estimates.js';
import networkPwvRoute from './routes/network-precipitable-water.js';
import networkCoverageRoute from './routes/network-coverage.js';
import precipitableWaterRoute from './routes/precipitable-water.js';
import profileDelaysRoute from './routes/profile-delays.js';
import rootRoute from './routes/root.js';
import slantDelaysRoute from './routes/slant-delays.js';
import stationDelaysRoute from './routes/station-delays.js';
import stationMetRoute from './routes/station-met.js';
import stationPwvRoute from './routes/station-precipitable-water.js';
import stationZwdEstimatesRoute from './routes/station-zwd-estimates.js';
import stationSoundingsRoute from './routes/station-soundings.js';
import stationResidualsRoute from './routes/station-residuals.js';
import campaignsRoute from './routes/campaigns.js';
import campaignsPlugin, { type CampaignSettings } from './plugins/campaigns.js';
import stationsRoute from './routes/stations.js';
import zenithDelaysRoute from './routes/zenith-delays.js';
import zwdEstimatesRoute from './routes/zwd-estimates.js';

export interface ArchiveOptions {
  storage: StorageConfig;
  /** A repository built elsewhere instead of one from `storage` (closed with the app). */
  repository?: Repository;
  /**
   * Configured bearer keys (a bare string is a key of role write, named key-1, key-2 ... like the
   * deprecated TROPO_API_KEYS); empty = keys from the database, the first replica creating an admin key.
   */
  apiKeys: readonly (string | ConfiguredKey)[];
  /** Where the first admin key's file is written (the data directory); absent = its secret is kept nowhere. */
  keyDir?: string;
  /** Days a deleted station stays restorable (default 30). */
  deleteRetentionDays?: number;
  /** Days an audit event is kept, 0 = forever (default DEFAULT_AUDIT_RETENTION_DAYS). */
  auditRetentionDays?: number;
  /** Run the purge of deleted stations and the audit trim at start and hourly (default true). */
  schedulePurge?: boolean;
  readKeysRequired: boolean;
  maxReadRangeDays: number;
  /** Campaign items on this replica (plugins/campaigns.ts); default: one at a time. */
  campaigns?: CampaignSettings;
  /** Largest stations × observations of a network day from deposits; default MAX_NETWORK_DAY_STATION_OBSERVATIONS. */
  networkDayMaxStationObservations?: number;
}

export interface AppOptions {
  config?: Partial<Config>;
  logger?: FastifyServerOptions['logger'];
  /**
   * The station archive. server.ts passes archiveOptionsFromConfig(config); absent = an empty
   * in-memory SQLite archive that nobody can write to (tests of other routes, `npm run openapi`).
   */
  archive?: ArchiveOptions;
  /** Check every JSON answer against its route's response schema (tests; see response-check.ts). */
  validateResponses?: boolean;
  /**
   * Start the worker threads with the app, each warmed by TROPODELAY_WARM_UP_ESTIMATIONS estimations, with
   * /v1/ready not ready until they are (server.ts). Absent: the threads start cold with the first task (the
   * in-process apps of the tests, which mostly never use them).
   */
  startWorkers?: boolean;
}

/** Archive options from the validated environment (server.ts, the demo). */
export function archiveOptionsFromConfig(config: Config): ArchiveOptions {
  return {
    storage: {
      dataDir: config.TROPO_DATA_DIR,
      databaseUrl: config.DATABASE_URL,
      databasePassword: config.TROPODELAY_DATABASE_PASSWORD,
      pgSchema: config.TROPO_PG_SCHEMA,
      connectTimeoutMs: config.DB_CONNECT_TIMEOUT_MS,
      statementTimeoutMs: config.DB_STATEMENT_TIMEOUT_MS,
      minFreeDiskBytes: config.TROPO_MIN_FREE_DISK_MB * 1024 * 1024,
    },
    apiKeys: configuredApiKeys(config),
    keyDir: config.TROPO_DATA_DIR,
    deleteRetentionDays: config.TROPODELAY_DELETE_RETENTION_DAYS,
    auditRetentionDays: config.TROPODELAY_AUDIT_RETENTION_DAYS,
    readKeysRequired: config.TROPO_READ_KEYS_REQUIRED,
    maxReadRangeDays: config.TROPO_MAX_READ_RANGE_DAYS,
    networkDayMaxStationObservations: config.TROPODELAY_NETWORK_DAY_MAX_STATION_OBSERVATIONS,
    campaigns: {
      concurrency: config.TROPODELAY_CAMPAIGN_CONCURRENCY,
      itemTimeoutS: config.TROPODELAY_CAMPAIGN_ITEM_TIMEOUT_S,
      replica: config.TROPODELAY_REPLICA_NAME,
      sweepIntervalS: config.TROPODELAY_CAMPAIGN_SWEEP_INTERVAL_S,
      sweepGraceS: config.TROPODELAY_CAMPAIGN_SWEEP_GRACE_S,
    },
  };
}

const IN_MEMORY_ARCHIVE: ArchiveOptions = {
  storage: { dataDir: ':memory:' },
  apiKeys: [],
  readKeysRequired: false,
  schedulePurge: false,
  maxReadRangeDays: DEFAULT_MAX_READ_RANGE_DAYS,
  campaigns: { concurrency: 0 },
};

/** Bare strings as keys of role write named key-1, key-2 ... (the deprecated form). */
const namedKeys = (keys: readonly (string | ConfiguredKey)[]): ConfiguredKey[] =>
  keys.map((k, i) => (typeof k === 'string' ? { name: `key-${i + 1}`, role: 'write', secret: k } : k));

/** A 400 naming the first query parameter whose value is longer than MAX_QUERY_VALUE_CHARS, else undefined. */
function overlongQueryValue(query: unknown): HttpProblem | undefined {
  if (!query || typeof query !== 'object') return undefined;
  for (const [name, value] of Object.entries(query)) {
    for (const v of Array.isArray(value) ? value : [value]) {
      if (typeof v === 'string' && v.length > MAX_QUERY_VALUE_CHARS) {
        const message = `a value of ${v.length} characters; at most ${MAX_QUERY_VALUE_CHARS}`;
        return new HttpProblem(400, `query.${name}: ${message}`, [{ field: `query.${name}`, message }]);
      }
    }
  }
  return undefined;
}

export async function buildApp(options: AppOptions = {}): Promise<FastifyInstance> {
  const config = defaultConfig(options.config);
  const app = Fastify({
    logger: options.logger ?? false,
    // plugins/request-log.ts writes one line per request instead of fastify's two.
    logController: new LogController({ disableRequestLogging: true }),
    bodyLimit: 1024 * 1024,
    requestTimeout: config.REQUEST_TIMEOUT_MS,
    trustProxy: trustProxyOption(config.TRUST_PROXY),
    requestIdHeader: 'x-request-id',
    genReqId: () => randomUUID(),
    // Bad percent-encoding and over-long path segments get the problem shape too.
    frameworkErrors: routerErrorHandler,
  }).withTypeProvider<ZodTypeProvider>();

  // Tables (CSV) and RINEX meteorological files arrive as text; routes that take them parse them.
  app.addContentTypeParser(['text/csv', 'text/plain'], { parseAs: 'string' }, (_request, body, done) => done(null, body));
  app.setValidatorCompiler(validatorCompiler);
  // Responses are built field by field in the handlers, so they are serialised with plain
  // JSON.stringify; the response schemas document them (OpenAPI) and test/http/response-schemas.test.ts
  // checks every route's answers against them. (Validating each response with zod costs a third of
  // the throughput of a single-point request.)
  app.setSerializerCompiler(() => (data) => JSON.stringify(data));
  app.addHook('onRequest', (request, reply, done) => {
    reply.header('x-request-id', request.id);
    done();
  });
  if (options.validateResponses) checkResponsesAgainstSchemas(app);
  // Every query value is length-capped before any schema or pattern looks at it (issue 11 item 3).
  app.addHook('preValidation', (request, _reply, done) => done(overlongQueryValue(request.query)));

  // Plugins, in this order (each declares what it needs with fastify-plugin `dependencies`, so a
  // wrong order fails at start instead of misbehaving):
  //  1. error-handler   first, so that every later plugin's and route's error becomes a problem
  //  2. request-log     one line per request, for everything below
  //  3. metrics         app.metrics, used by compute-pool (dependency) and read by /metrics
  //  4. edge            helmet, CORS, rate limit: before any route answers
  //  5. openapi         collects the routes registered after it
  //  6. readiness       app.addReadinessCheck, used by compute-pool and storage (dependency)
  //  7. compute-pool    app.compute (depends on metrics; readiness for its warm-up check)
  //  8. storage         app.repository (depends on readiness)
  //  9. auth            bearer keys with roles, request.callerKey; its hooks guard the routes registered after it
  // 10. audit           the audit trail of writes (depends on auth and storage)
  // 11. retention       the purge of deleted stations and the audit trim (depends on storage)
  // then the routes, which use app.compute, app.repository and auth's guards.
  await app.register(errorHandler);
  await app.register(jsonBody);
  await app.register(requestLog);
  await app.register(metrics);
  await app.register(edge, { config });
  await app.register(openapi);
  await app.register(readiness, { timeoutMs: config.READY_CHECK_TIMEOUT_MS });
  await app.register(computePool, { config, start: options.startWorkers === true });
  const archive = options.archive ?? IN_MEMORY_ARCHIVE;
  await app.register(storage, { storage: archive.storage, ...(archive.repository ? { repository: archive.repository } : {}) });
  await app.register(auth, {
    keys: namedKeys(archive.apiKeys),
    readKeysRequired: archive.readKeysRequired,
    ...(archive.keyDir ? { keyDir: archive.keyDir } : {}),
  });
  await app.register(audit);
  await app.register(retention, {
    retentionDays: archive.deleteRetentionDays ?? 30,
    auditRetentionDays: archive.auditRetentionDays ?? DEFAULT_AUDIT_RETENTION_DAYS,
    schedule: archive.schedulePurge ?? true,
  });
  await app.register(rootRoute);
  await app.register(healthRoute);
  await app.register(zenithDelaysRoute);
  await app.register(mappingFactorsRoute);
  await app.register(slantDelaysRoute);
  await app.register(precipitableWaterRoute);
  await app.register(zwdEstimatesRoute);
  const stationOptions = { maxReadRangeDays: archive.maxReadRangeDays };
  await app.register(networkEstimatesRoute, stationOptions);
  await app.register(networkDaysRoute, {
    ...stationOptions,
    maxStationObservations: archive.networkDayMaxStationObservations ?? MAX_NETWORK_DAY_STATION_OBSERVATIONS,
  });
  await app.register(stationsRoute);
  await app.register(stationMetRoute, stationOptions);
  await app.register(stationDelaysRoute, stationOptions);
  await app.register(stationPwvRoute, stationOptions);
  await app.register(stationZwdEstimatesRoute, stationOptions);
  await app.register(stationSoundingsRoute, stationOptions);
  await app.register(stationResidualsRoute);
  await app.register(campaignsPlugin, { storage: archive.storage, settings: archive.campaigns ?? {} });
  await app.register(campaignsRoute);
  await app.register(networkPwvRoute, stationOptions);
  await app.register(networkCoverageRoute);
  await app.register(profileDelaysRoute);
  await app.register(adminKeysRoute);
  await app.register(adminAuditRoute);
  await app.register(adminStationsRoute);
  await app.ready();
  return app;
}
