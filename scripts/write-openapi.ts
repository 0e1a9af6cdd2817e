/**
 * Writes the OpenAPI document the running service serves to openapi/openapi.json.
 * Run after changing a route or schema: `npm run openapi`. A test fails while the copy is stale.
 */

import { writeFileSync } from 'node:fs';
import { buildApp } from '../src/http/app.js';

export async function currentOpenApiDocument(): Promise<string> {
  const app = await buildApp();
  try {
    const response = await app.inject({ method: 'GET', url: '/openapi.json' });
    return JSON.stringify(JSON.parse(response.body), null, 2) + '\n';
  } finally {
    await app.close();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  writeFileSync(new URL('../openapi/openapi.json', import.meta.url), await currentOpenApiDocument());
  process.stdout.write('wrote openapi/openapi.json\n');
}
