/**
 * Writes client/src/api-types.ts, the TypeScript types of the service's API, from the committed OpenAPI
 * document (openapi/openapi.json, itself written by `npm run openapi`). Run after `npm run openapi`:
 * `npm run client:types`. test/client/api-types.test.ts fails while the copy is stale.
 */

import { readFileSync, writeFileSync } from 'node:fs';
import openapiTS, { astToString } from 'openapi-typescript';
import prettier from 'prettier';

const OPENAPI_DOCUMENT = new URL('../../openapi/openapi.json', import.meta.url);
const API_TYPES = new URL('../src/api-types.ts', import.meta.url);

const HEADER = `/**
 * Generated from openapi/openapi.json by client/scripts/write-api-types.ts (openapi-typescript); do not edit.
 * Regenerate with \`npm run client:types\` after \`npm run openapi\`.
 */
/* eslint-disable max-len -- descriptions from the OpenAPI document, one line each */
`;

/** The text of client/src/api-types.ts for the OpenAPI document at `documentUrl`, formatted as the repository is. */
export async function apiTypesText(documentUrl: URL = OPENAPI_DOCUMENT): Promise<string> {
  const document = JSON.parse(readFileSync(documentUrl, 'utf8')) as Parameters<typeof openapiTS>[0];
  const ast = await openapiTS(document, { alphabetize: false, exportType: false });
  const options = await prettier.resolveConfig(API_TYPES.pathname);
  return prettier.format(HEADER + astToString(ast), { ...options, filepath: API_TYPES.pathname });
}

if (import.meta.url === `file://${process.argv[1]}`) {
  writeFileSync(API_TYPES, await apiTypesText());
  process.stdout.write('wrote client/src/api-types.ts\n');
}
