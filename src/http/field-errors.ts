/**
 * Turning schema issues into the `errors: [{ field, message }]` of a problem response, in one
 * place for the request validation of the routes and for the validation done in worker threads.
 */

import type { FieldError } from './problem.js';

/** ['site', 'latitude_deg'] → "site.latitude_deg"; body fields carry no prefix, others "query." / "params.". */
export function fieldName(path: readonly PropertyKey[], location: 'body' | 'query' | 'params' | 'headers' = 'body'): string {
  const joined = path.map(String).join('.');
  if (location === 'body') return joined || 'body';
  return joined ? `${location}.${joined}` : location;
}

export function issuesToFieldErrors(issues: readonly { path: readonly PropertyKey[]; message: string }[], location: 'body' | 'query' = 'body'): FieldError[] {
  return issues.map((i) => ({ field: fieldName(i.path, location), message: i.message }));
}

/** "field: message (and N more)": the detail line of a problem with several field errors. */
export function detailOf(errors: readonly FieldError[]): string {
  const first = errors[0];
  if (!first) return 'invalid request';
  return `${first.field}: ${first.message}${errors.length > 1 ? ` (and ${errors.length - 1} more)` : ''}`;
}
