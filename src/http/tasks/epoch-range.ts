/**
 * The first and last epoch of a request's observations, from the epoch texts wherever the body keeps them
 * (objects or a column), for the scans that decide which stored met a route reads. Texts that are not
 * epochs are skipped here: the estimation task reports them with their field and row.
 */

/** The `epoch` of each observation, as objects or as a column; [] when there is none. */
export function epochTextsOf(observations: unknown): unknown[] {
  if (Array.isArray(observations))
    return observations.map((o) => (o !== null && typeof o === 'object' ? (o as { epoch?: unknown }).epoch : undefined));
  if (observations !== null && typeof observations === 'object') {
    const column = (observations as { epoch?: unknown }).epoch;
    if (Array.isArray(column)) return column;
  }
  return [];
}

/** First and last epoch [ms] of the readable texts; null when none can be read. */
export function epochRangeOf(epochs: readonly unknown[]): { firstMs: number; lastMs: number } | null {
  let firstMs = Infinity;
  let lastMs = -Infinity;
  for (const e of epochs) {
    if (typeof e !== 'string' || e.length > 64) continue;
    const ms = Date.parse(e);
    if (Number.isNaN(ms)) continue;
    if (ms < firstMs) firstMs = ms;
    if (ms > lastMs) lastMs = ms;
  }
  return firstMs <= lastMs ? { firstMs, lastMs } : null;
}
