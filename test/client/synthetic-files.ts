/**
 * Input files for the client tests from the committed generator of synthetic residuals
 * (scripts/synthetic-residuals.ts: invented site and satellites, a known random-walk truth).
 */

import { generateSyntheticResiduals, toCsv } from '../../scripts/synthetic-residuals.js';

/** An observation CSV of `hours` of 30 s epochs from `startIso` (default 2026-03-14T00:00:00Z). */
export function buildSyntheticCsv(o: { hours: number; startIso?: string; seed?: number; samplingS?: number }): string {
  return toCsv(
    generateSyntheticResiduals({
      durationS: o.hours * 3600,
      ...(o.startIso ? { startIso: o.startIso } : {}),
      ...(o.seed !== undefined ? { seed: o.seed } : {}),
      ...(o.samplingS !== undefined ? { samplingS: o.samplingS } : {}),
    }),
  );
}

/** Rows per UTC day of an observation CSV, by the first 10 characters of its Z epochs. */
export function rowsPerDay(csv: string): Record<string, number> {
  const counts: Record<string, number> = {};
  for (const line of csv.trim().split('\n').slice(1)) counts[line.slice(0, 10)] = (counts[line.slice(0, 10)] ?? 0) + 1;
  return counts;
}
