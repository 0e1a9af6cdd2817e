/**
 * Fractional day of year of an instant in UTC, with 1 January 00:00 UTC = 1.0
 * (the convention the Niell (1996) seasonal term is written in).
 *
 * @param epoch instant [Date]
 * @returns day of year [d], in [1, 367)
 */
export function fractionalDayOfYear(epoch: Date): number {
  const startOfYearMs = Date.UTC(epoch.getUTCFullYear(), 0, 1);
  return 1 + (epoch.getTime() - startOfYearMs) / 86_400_000;
}
