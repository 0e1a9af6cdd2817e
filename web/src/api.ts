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

/**
 * The read key, when the service requires keys for reads (TROPO_READ_KEYS_REQUIRED=true): kept in
 * sessionStorage only (gone when the tab closes, never in localStorage, a cookie or a URL), sent as
 * `Authorization: Bearer <key>` on every call of the page, downloads included.
 */
const KEY_ITEM = 'tropodelay.read-key';
export function readKey(): string {
  return sessionStorage.getItem(KEY_ITEM) ?? '';
}
export function setReadKey(key: string): void {
  if (key) sessionStorage.setItem(KEY_ITEM, key);
  else sessionStorage.removeItem(KEY_ITEM);
}

/** A call refused for want of a (valid) key: 401 without one, 403 with one not accepted. */
export class KeyRefusedError extends Error {
  constructor(
    readonly status: 401 | 403,
    detail: string,
  ) {
    super(
      status === 401
        ? `This service needs a read key for its data: enter one in "Read key" above (${detail}).`
        : `The read key was refused: check it and enter it again in "Read key" above (${detail}).`,
    );
  }
}

async function call(url: string, accept: string): Promise<Response> {
  const headers: Record<string, string> = { accept };
  const key = readKey();
  if (key) headers.authorization = `Bearer ${key}`;
  const res = await fetch(url, { headers });
  if (res.ok) return res;
  let detail = `HTTP ${res.status}`;
  try {
    detail = ((await res.json()) as { detail?: string }).detail ?? detail;
  } catch {
    /* not a problem body */
  }
  if (res.status === 401 || res.status === 403) throw new KeyRefusedError(res.status, detail);
  throw new Error(detail);
}

export async function getJson<T>(url: string): Promise<T> {
  return (await (await call(url, 'application/json')).json()) as T;
}

/**
 * Downloads the answer of `url` as a file: fetched with the key, saved from a blob (a plain link
 * would carry no Authorization header). The file name is the one of Content-Disposition.
 */
export async function download(url: string, fallbackName: string): Promise<void> {
  const res = await call(url, '*/*');
  const name = /filename="([^"]+)"/.exec(res.headers.get('content-disposition') ?? '')?.[1] ?? fallbackName;
  saveBlob(await res.blob(), name);
}

export function saveBlob(blob: Blob, name: string): void {
  const a = document.createElement('a');
  a.href = URL.createObjectURL(blob);
  a.download = name;
  a.click();
  setTimeout(() => URL.revokeObjectURL(a.href), 10_000);
}
