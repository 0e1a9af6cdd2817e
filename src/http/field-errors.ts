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

export function issuesToFieldErrors(
  issues: readonly { path: readonly PropertyKey[]; message: string; code?: string; keys?: readonly string[] }[],
  location: 'body' | 'query' = 'body',
): FieldError[] {
  return issues.flatMap((i) =>
    i.code === 'unrecognized_keys' && i.keys?.length
      ? expandUnknownKeys(i.path, i.keys, i.message, location)
      : [{ field: fieldName(i.path, location), message: i.message }],
  );
}

/** "field: message (and N more)": the detail line of a problem with several field errors. */
export function detailOf(errors: readonly FieldError[]): string {
  const first = errors[0];
  if (!first) return 'invalid request';
  return `${first.field}: ${first.message}${errors.length > 1 ? ` (and ${errors.length - 1} more)` : ''}`;
}

// ---------------------------------------------------------------------------------------------
// Unknown keys: every request object and query string is strict (schemas/common.ts strictObject).
// A key that is not known is a 400 naming the key and the closest known one, never silently
// dropped (a misspelt `met.pressure` must not turn into the standard atmosphere).

/** Edit distance (insertions, deletions, substitutions), Levenshtein 1966; keys are short. */
export function editDistance(a: string, b: string): number {
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const row = [i];
    for (let j = 1; j <= b.length; j++) {
      row[j] = Math.min(prev[j]! + 1, row[j - 1]! + 1, prev[j - 1]! + (a[i - 1] === b[j - 1] ? 0 : 1));
    }
    prev = row;
  }
  return prev[b.length]!;
}

/**
 * The known key a caller most likely meant: one that extends the unknown key by a unit suffix or
 * word (`pressure` → `pressure_hpa`, `wetmodel` → `wet_model`), or the one key that has it as a
 * word (`humidity` → `relative_humidity_pct`), else the nearest by edit distance
 * when that is at most a third of the key's length (at least 2). Undefined when nothing is close.
 */
export function closestKey(unknown: string, known: readonly string[]): string | undefined {
  const u = unknown.toLowerCase();
  const squash = (s: string) => s.toLowerCase().replace(/[_\-\s]/g, '');
  const extending = known.filter((k) => k.toLowerCase().startsWith(`${u}_`) || squash(k) === squash(u));
  if (extending.length === 1) return extending[0];
  const containing = known.filter((k) => k.toLowerCase().split('_').includes(u));
  if (containing.length === 1) return containing[0];
  let best: string | undefined;
  let bestD = Infinity;
  for (const k of known) {
    const d = Math.min(editDistance(u, k.toLowerCase()), editDistance(squash(u), squash(k)));
    if (d < bestD) [best, bestD] = [k, d];
  }
  return bestD <= Math.max(2, Math.floor(unknown.length / 3)) ? best : undefined;
}

/** The message for one unknown key: the suggestion, or the known keys when nothing is close. */
export function unknownKeyMessage(key: string, known: readonly string[]): string {
  const near = closestKey(key, known);
  if (near) return `unknown key; did you mean ${near}?`;
  if (!known.length) return 'unknown key; no keys are accepted here';
  const listed = known.slice(0, 12).join(', ');
  return `unknown key; known keys here: ${listed}${known.length > 12 ? ` and ${known.length - 12} more` : ''}`;
}

/**
 * zod's `unrecognized_keys` issue carries all unknown keys of one object in one issue, whose path
 * is the object's. Its message (strictObject's error map) is one line per key; this splits it into
 * one field error per key, named with the key's own path ("met.pressure").
 */
export function expandUnknownKeys(
  path: readonly PropertyKey[],
  keys: readonly string[],
  message: string,
  location: 'body' | 'query' | 'params' | 'headers' = 'body',
): FieldError[] {
  const lines = message.split('\n');
  return keys.map((k, i) => ({ field: fieldName([...path, k], location), message: lines.length === keys.length ? lines[i]! : message }));
}
