// The client's generated API types follow the committed OpenAPI document (as openapi.test.ts checks that
// document against the service): a route or schema change without `npm run client:types` fails here.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { apiTypesText } from '../../client/scripts/write-api-types.js';

describe('client/src/api-types.ts', () => {
  it('is what openapi-typescript makes of openapi/openapi.json today (run `npm run client:types` if not)', async () => {
    const committed = readFileSync(new URL('../../client/src/api-types.ts', import.meta.url), 'utf8');
    expect(committed).toBe(await apiTypesText());
  });

  it('has every route of the OpenAPI document', () => {
    const document = JSON.parse(readFileSync(new URL('../../openapi/openapi.json', import.meta.url), 'utf8')) as { paths: object };
    const types = readFileSync(new URL('../../client/src/api-types.ts', import.meta.url), 'utf8');
    for (const path of Object.keys(document.paths)) expect(types, path).toContain(`'${path}': {`);
  });
});
