/**
 * Whether a range of stored delays is homogeneous: produced by one model set (one fingerprint).
 * Summarises the model sets met in the range with the epochs and sources they cover, and words a
 * warning when there is more than one.
 */

import type { StoredModelSet } from '../storage/repository.js';

export interface ModelSetSummary {
  model_fingerprint: string;
  models: StoredModelSet['models'];
  sources: string[];
  first_epoch: string;
  last_epoch: string;
  count: number;
}

type SpanRow = { epochMs: number; source: string; modelFingerprint: string };

/**
 * The model sets met so far in rows that may come page by page (a paged station-year read): per
 * fingerprint, in order of first appearance, the first and last epoch, the count and the sources.
 */
export class ModelSetSpans {
  private readonly byFingerprint = new Map<string, { first: number; last: number; count: number; sources: Set<string> }>();

  add(rows: readonly SpanRow[]): void {
    for (const r of rows) {
      let s = this.byFingerprint.get(r.modelFingerprint);
      if (!s) this.byFingerprint.set(r.modelFingerprint, (s = { first: r.epochMs, last: r.epochMs, count: 0, sources: new Set() }));
      s.first = Math.min(s.first, r.epochMs);
      s.last = Math.max(s.last, r.epochMs);
      s.count++;
      s.sources.add(r.source);
    }
  }

  /** The fingerprints in order of first appearance. */
  fingerprints(): string[] {
    return [...this.byFingerprint.keys()];
  }

  summary(sets: readonly StoredModelSet[]): { homogeneous: boolean; model_sets: ModelSetSummary[]; warnings: string[] } {
    return summarise(this.byFingerprint, sets);
  }
}

export function summariseModelSets(
  rows: readonly SpanRow[],
  sets: readonly StoredModelSet[],
): { homogeneous: boolean; model_sets: ModelSetSummary[]; warnings: string[] } {
  const spans = new ModelSetSpans();
  spans.add(rows);
  return spans.summary(sets);
}

function summarise(
  byFingerprint: ReadonlyMap<string, { first: number; last: number; count: number; sources: Set<string> }>,
  sets: readonly StoredModelSet[],
): { homogeneous: boolean; model_sets: ModelSetSummary[]; warnings: string[] } {
  const models = new Map(sets.map((s) => [s.modelFingerprint, s.models]));
  const model_sets = [...byFingerprint.entries()]
    .map(([fp, s]) => ({
      model_fingerprint: fp,
      models: models.get(fp) ?? {},
      sources: [...s.sources].sort(),
      first_epoch: new Date(s.first).toISOString(),
      last_epoch: new Date(s.last).toISOString(),
      count: s.count,
    }))
    .sort((a, b) =>
      a.first_epoch < b.first_epoch ? -1 : a.first_epoch > b.first_epoch ? 1 : a.model_fingerprint < b.model_fingerprint ? -1 : 1,
    );
  const homogeneous = model_sets.length <= 1;
  const warnings = homogeneous
    ? []
    : [
        `the range mixes ${model_sets.length} model sets, so the series is not homogeneous: ${model_sets
          .map(
            (m) =>
              `${m.model_fingerprint} (${m.sources.join(', ')}) ${m.first_epoch}..${m.last_epoch}, ${m.count} record${m.count === 1 ? '' : 's'}`,
          )
          .join('; ')}`,
      ];
  return { homogeneous, model_sets, warnings };
}
