/** Median of the finite values; null when there is none. */
export function median(values: readonly number[]): number | null {
  const v = values.filter((x) => Number.isFinite(x)).sort((a, b) => a - b);
  if (v.length === 0) return null;
  const h = Math.floor(v.length / 2);
  return v.length % 2 ? v[h]! : (v[h - 1]! + v[h]!) / 2;
}
