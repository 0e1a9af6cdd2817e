/** Calls of the page to its own service (same origin, relative URLs only). */

export interface NetworkStation {
  station_id: string;
  name: string;
  latitude_deg: number;
  longitude_deg: number;
  height_m: number;
  /** EGM96 geoid undulation [m] */
  geoid_undulation_m: number;
  /** altitude above mean sea level, height_m − geoid_undulation_m [m] */
  altitude_m: number;
  sources: string[];
  record_count: number;
}

export interface IntervalMean {
  station_id: string;
  epoch: string;
  count: number;
  excluded_count: number;
  pwv_mm: number | null;
  pwv_sigma_mm: number | null;
  pwv_sd_mm: number | null;
  quality_counts: Record<string, number>;
}

export interface PwvRecord {
  station_id: string;
  epoch: string;
  source: string;
  pwv_mm: number | null;
  pwv_sigma_mm: number | null;
  pressure_hpa: number | null;
  temperature_c: number | null;
  quality: string;
}

export interface NetworkAnswer {
  from: string;
  to: string;
  stations: NetworkStation[];
  records: PwvRecord[];
  intervals: IntervalMean[];
  warnings: string[];
}

export const NETWORK_PATH = 'v1/network/precipitable-water';

export function networkUrl(params: Record<string, string>): string {
  return `${NETWORK_PATH}?${new URLSearchParams(params).toString()}`;
}

export async function getJson<T>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { accept: 'application/json' } });
  if (!res.ok) {
    let detail = `${res.status}`;
    try {
      detail = ((await res.json()) as { detail?: string }).detail ?? detail;
    } catch {
      /* not a problem body */
    }
    throw new Error(detail);
  }
  return (await res.json()) as T;
}
