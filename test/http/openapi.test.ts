import { readFileSync } from 'node:fs';
import { Validator } from '@seriousme/openapi-schema-validator';
import { describe, expect, it } from 'vitest';
import { currentOpenApiDocument } from '../../scripts/write-openapi.js';
import { useApp } from '../helpers/app.js';

const COMMITTED = new URL('../../openapi/openapi.json', import.meta.url);

describe('OpenAPI document', () => {
  const api = useApp();

  it('the committed copy equals what the service generates (run `npm run openapi` when this fails)', async () => {
    const generated = await currentOpenApiDocument();
    expect(readFileSync(COMMITTED, 'utf8')).toBe(generated);
  });

  it('is a valid OpenAPI 3.1 document by an independent validator (@seriousme/openapi-schema-validator)', async () => {
    const validator = new Validator();
    const result = await validator.validate(JSON.parse(readFileSync(COMMITTED, 'utf8')));
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe('3.1');
  });

  it('is served at /openapi.json with interactive docs at /docs', async () => {
    const doc = await api().get('/openapi.json').expect(200);
    expect(doc.body.openapi).toBe('3.1.0');
    expect(Object.keys(doc.body.paths)).toEqual(
      expect.arrayContaining(['/v1/health', '/v1/zenith-delays', '/v1/mapping-factors', '/v1/slant-delays', '/v1/precipitable-water']),
    );
    const docs = await api().get('/docs/').redirects(1);
    expect(docs.status).toBe(200);
    expect(docs.text).toContain('<html');
  });

  it('states the body limit of the batch routes', async () => {
    const doc = await api().get('/openapi.json').expect(200);
    expect(doc.body.paths['/v1/slant-delays'].post.description).toMatch(/Body limit: 33554432 bytes/);
  });

  it('the service version matches package.json', async () => {
    const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8'));
    const doc = await api().get('/openapi.json').expect(200);
    expect(doc.body.info.version).toBe(pkg.version);
  });
});
