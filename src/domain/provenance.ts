/**
 * Provenance of a result: which models and settings produced it, and a short fingerprint of that
 * set. Two delays are comparable (homogeneous) only when their fingerprints are equal.
 *
 * The fingerprint is the first 16 hex digits of SHA-256 over the canonical JSON of the sorted
 * entries, prefixed with the scheme version, so it is stable across processes and replicas.
 */

import { createHash } from 'node:crypto';

export const PROVENANCE_SCHEME = 'tropodelay-models/1';

export type ModelSet = Record<string, string | number | boolean | null>;

export interface Provenance {
  models: ModelSet;
  model_fingerprint: string;
}

const cache = new Map<string, Provenance>();
const CACHE_LIMIT = 1000;

/** Provenance of a model set; memoised, since a service sees few distinct sets. */
export function provenance(models: ModelSet): Provenance {
  const key = JSON.stringify(models);
  const hit = cache.get(key);
  if (hit) return hit;
  const computed = computeProvenance(models);
  if (cache.size >= CACHE_LIMIT) cache.clear();
  cache.set(key, computed);
  return computed;
}

function computeProvenance(models: ModelSet): Provenance {
  const sorted = Object.fromEntries(Object.entries(models).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
  const fingerprint = createHash('sha256')
    .update(PROVENANCE_SCHEME + JSON.stringify(sorted))
    .digest('hex')
    .slice(0, 16);
  return { models: sorted, model_fingerprint: fingerprint };
}

/** Names of the fixed models, as they appear in a result's `models`. */
export const MODEL_NAMES = {
  zhd: 'saastamoinen-davis-1985 (IERS 2010 eq. 9.11)',
  saturation: 'wmo-no8-2008-magnus',
  standardAtmosphere: 'berg-1948 (T0=18 C, RH0=50 %)',
  tm: 'bevis-1992',
  conversion: 'bevis-1994',
  /** The PWV σ budget, with its version: a change of any term or default is a new version (and fingerprint). */
  pwvSigmaBudget:
    "tropodelay-pwv-sigma-budget/2: first-order budget: delay, pressure (default 0.5 hPa), zhd model (IERS 2010), surface temperature (default 0.5 K), Tm (bevis 4.74 K / caller default 2 K), k2' and k3 (bevis 1994)",
} as const;
