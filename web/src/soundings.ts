/**
 * Soundings of the chosen station: their PWV as points on the PWV chart, and GNSS minus sounding
 * statistics (bias, SD, count) from GET /v1/stations/{id}/sounding-comparison next to it.
 */
import { getJson } from './api.js';
import type { PwvColumns } from './chart.js';

export interface ListedSounding {
  epoch: string;
  pwv_mm: number;
  last_humidity_pressure_hpa: number | null;
}

export interface SoundingComparison {
  window_s: number;
  statistics: { count: number; bias_mm: number | null; sd_mm: number | null; rms_mm: number | null };
  unpaired: string[];
}

export interface StationSoundings {
  soundings: ListedSounding[];
  comparison: SoundingComparison;
}

const stationPath = (id: string) => `v1/stations/${encodeURIComponent(id)}`;

export async function loadSoundings(stationId: string, from: string, to: string, source: string): Promise<StationSoundings> {
  const range = new URLSearchParams({ from, to });
  const compare = new URLSearchParams({ from, to, ...(source ? { source } : {}) });
  const [list, comparison] = await Promise.all([
    getJson<{ soundings: ListedSounding[] }>(`${stationPath(stationId)}/soundings?${range.toString()}`),
    getJson<SoundingComparison>(`${stationPath(stationId)}/sounding-comparison?${compare.toString()}`),
  ]);
  return { soundings: list.soundings, comparison };
}

/** Linear interpolation between two values of a column at fraction w; null when either is null. */
const between = (a: number | null | undefined, b: number | null | undefined, w: number): number | null =>
  a === null || a === undefined || b === null || b === undefined ? null : a + w * (b - a);

/**
 * The chart columns with the soundings' PWV as an extra column. A sounding between two GNSS epochs gets a
 * row of its own; its other columns are interpolated linearly between the neighbours (exactly where the
 * drawn lines pass), or null at the ends, so the lines are not broken.
 */
export function withSoundings(c: PwvColumns, soundings: readonly ListedSounding[]): PwvColumns {
  if (soundings.length === 0) return c;
  const points = soundings.map((s) => ({ t: Date.parse(s.epoch) / 1000, pwv: s.pwv_mm })).sort((a, b) => a.t - b.t);
  const n = c.t.length;
  const t: number[] = [];
  const out: Record<Exclude<keyof PwvColumns, 't'>, (number | null)[]> = {
    pwv: [],
    lower: [],
    upper: [],
    flagged: [],
    pressure: [],
    temperature: [],
    sounding: [],
  };
  const keys = ['pwv', 'lower', 'upper', 'pressure', 'temperature'] as const;
  let k = 0;
  for (let i = 0; i <= n; i++) {
    const ti = i < n ? c.t[i]! : Infinity;
    while (k < points.length && points[k]!.t < ti) {
      const p = points[k++]!;
      const w = i > 0 && i < n ? (p.t - c.t[i - 1]!) / (ti - c.t[i - 1]!) : 0;
      t.push(p.t);
      for (const key of keys) out[key].push(i > 0 && i < n ? between(c[key][i - 1], c[key][i], w) : null);
      out.flagged.push(null);
      out.sounding.push(p.pwv);
    }
    if (i === n) break;
    t.push(ti);
    for (const key of keys) out[key].push(c[key][i] ?? null);
    out.flagged.push(c.flagged[i] ?? null);
    out.sounding.push(k < points.length && points[k]!.t === ti ? points[k++]!.pwv : null);
  }
  return { t: Float64Array.from(t), ...out };
}

const mm = (x: number | null) => (x === null ? '–' : `${x.toFixed(2)} mm`);

/** The statistics as a definition list, and the count on the body (data-soundings) for tests and scripts. */
export function showSoundingStatistics(dl: HTMLElement, s: StationSoundings): void {
  const st = s.comparison.statistics;
  const items: [string, string][] = [
    ['soundings in this span', String(s.soundings.length)],
    ['pairs with GNSS', `${st.count} (within ±${s.comparison.window_s / 60} min)`],
    ['bias (GNSS − sounding)', mm(st.bias_mm)],
    ['SD', mm(st.sd_mm)],
    ['RMS', mm(st.rms_mm)],
  ];
  const stopped = s.soundings.filter((x) => x.last_humidity_pressure_hpa !== null).length;
  if (stopped) items.push(['humidity extended aloft', `${stopped} of ${s.soundings.length} (measured humidity stopped below the top)`]);
  dl.replaceChildren();
  for (const [term, text] of items) {
    const dt = document.createElement('dt');
    dt.textContent = term;
    const dd = document.createElement('dd');
    dd.textContent = text;
    dl.append(dt, dd);
  }
  document.body.dataset.soundings = String(s.soundings.length);
}
