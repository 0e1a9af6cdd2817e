/**
 * Shorthands over the generated types (api-types.ts, from openapi/openapi.json): the JSON answer and the
 * query of a route, so the client's code names a route once and its types follow the service's schemas.
 */

import type { paths } from './api-types.js';

type Method = 'get' | 'post' | 'put' | 'delete';

/** The application/json body of the 2xx answer (200, 201 or 202) of `method` on `path`. */
export type Answer<P extends keyof paths, M extends Method> = paths[P][M] extends {
  responses: infer R;
}
  ? R extends { 200: { content: { 'application/json': infer T } } }
    ? T
    : R extends { 201: { content: { 'application/json': infer T } } }
      ? T
      : R extends { 202: { content: { 'application/json': infer T } } }
        ? T
        : never
  : never;

/** The query parameters of `method` on `path`. */
export type Query<P extends keyof paths, M extends Method> = paths[P][M] extends { parameters: { query?: infer Q } }
  ? NonNullable<Q>
  : never;
