/**
 * Station reads when the storage fails: the error handler answers 503 with Retry-After
 * (src/http/plugins/error-handler.ts, storageUnavailable), so every GET route of the station archive
 * declares 503 in its response schemas and the OpenAPI document shows it. The response check
 * (src/http/response-check.ts) passes 5xx answers unchecked, so the declaration is checked here
 * on the served OpenAPI document, and the answer itself on a repository whose read fails.
 * The failure is simulated with the storage layer's own error (StorageUnavailableError, "unreachable").
 */

import { describe, expect, it } from 'vitest';
import { StorageUnavailableError } from '../../src/storage/errors.js';
import { useArchiveApp } from '../helpers/archive-app.js';
import { BACKENDS } from '../helpers/storage.js';

const SQLITE = BACKENDS.find((b) => b.name.toLowerCase().includes('sqlite')) ?? BACKENDS[0]!;

describe('station reads declare and answer 503 when the storage fails', () => {
  const { api, app, auth } = useArchiveApp(SQLITE);

  it('every GET route under /v1/stations documents 503', async () => {
    const doc = (await api().get('/openapi.json').expect(200)).body as { paths: Record<string, Record<string, { responses: object }>> };
    const reads = Object.entries(doc.paths).filter(([path, ops]) => path.startsWith('/v1/stations') && ops.get);
    // The station list and record, delays, met, PWV and the three sounding reads.
    expect(reads.length).toBeGreaterThanOrEqual(8);
    const undeclared = reads.filter(([, ops]) => !('503' in ops.get!.responses)).map(([path]) => path);
    expect(undeclared).toEqual([]);
  });

  it('GET /v1/stations/{id}/delays with the storage unreachable: 503 problem with Retry-After, then 200 again', async () => {
    await api()
      .put('/v1/stations/FENWYK')
      .set('authorization', auth)
      .send({ name: 'Fenwyk Hollow (invented)', latitude_deg: 47.9, longitude_deg: 10.3, height_m: 610 })
      .expect(201);
    const repository = app().repository;
    const getStation = repository.getStation.bind(repository);
    repository.getStation = async () => {
      throw new StorageUnavailableError('unreachable');
    };
    try {
      const res = await api().get('/v1/stations/FENWYK/delays').query({ from: '2026-06-01', to: '2026-06-02' }).expect(503);
      expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
      expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
      expect(res.body.detail).toMatch(/retry after \d+ s/);
    } finally {
      repository.getStation = getStation;
    }
    await api().get('/v1/stations/FENWYK/delays').query({ from: '2026-06-01', to: '2026-06-02' }).expect(200);
  });
});
