/**
 * The compact stored form of one station-day of residuals (PUT /v1/stations/{id}/residuals/{day};
 * docs/campaigns.md, "The stored form"). Canonical, so that the same observations sent twice (in any
 * row order, in any of the accepted body forms) give the same bytes and the same SHA-256:
 *
 *   rows sorted by (epoch, satellite); satellites dictionary-coded in sorted order;
 *   header   "TDR1" (4 bytes), row count n (uint32), dictionary size m (uint16), flags (uint8: bit 0 = sigma column present),
 *            the dictionary as UTF-8 JSON (uint32 length, then the bytes);
 *   columns  epoch offset from 00:00 UTC of the day [ms] (uint32 × n), satellite index (uint16 × n),
 *            elevation [deg], azimuth [deg], residual [m] (float64 × n each), sigma [m] (float64 × n, NaN = none; only with flag bit 0);
 *   all little-endian, then compressed with zlib deflate (node:zlib, level 6).
 *
 * The values are kept exactly as received (degrees, metres; float64), so a GET returns what was sent.
 */

import { createHash } from 'node:crypto';
import { deflateSync, inflateSync } from 'node:zlib';
import { FormatError } from './format-error.js';

const MAGIC = 'TDR1';
const DAY_MS = 86_400_000;
const SIGMA_FLAG = 1;
/** Most distinct satellites in one day (uint16 indices); far above any GNSS constellation set. */
export const MAX_DAY_SATELLITES = 65_535;

/** One station-day of residuals as columns in the API's units (epochs as ms since 1970, UTC). */
export interface ResidualDay {
  epochMs: number[];
  satellite: string[];
  elevationDeg: number[];
  azimuthDeg: number[];
  residualM: number[];
  /** Standard deviation per observation [m]; null = from the weighting scheme; absent = none given. */
  sigmaM?: (number | null)[] | undefined;
}

export interface EncodedResidualDay {
  bytes: Buffer;
  /** SHA-256 (hex) of `bytes`. */
  sha256: string;
  observationCount: number;
}

/** 00:00 UTC of a `YYYY-MM-DD` day [ms]; NaN for anything else (including 2025-02-30). */
export function dayStartMs(day: string): number {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(day)) return NaN;
  const ms = Date.parse(`${day}T00:00:00Z`);
  return Number.isNaN(ms) || new Date(ms).toISOString().slice(0, 10) !== day ? NaN : ms;
}

/**
 * The canonical compact form of a station-day.
 * @throws FormatError naming `observations.<row>` for an epoch outside the day or a repeated (epoch, satellite)
 */
export function encodeResidualDay(day: string, obs: ResidualDay): EncodedResidualDay {
  const start = dayStartMs(day);
  const n = obs.epochMs.length;
  for (let i = 0; i < n; i++) {
    const offset = obs.epochMs[i]! - start;
    if (!(offset >= 0 && offset < DAY_MS)) {
      throw new FormatError(
        `observations.${i}.epoch`,
        `${new Date(obs.epochMs[i]!).toISOString()} is outside the day ${day} (00:00:00.000 to 23:59:59.999 UTC); deposit each UTC day under its own date`,
      );
    }
  }
  const order = Array.from({ length: n }, (_, i) => i).sort(
    (a, b) =>
      obs.epochMs[a]! - obs.epochMs[b]! || (obs.satellite[a]! < obs.satellite[b]! ? -1 : obs.satellite[a]! > obs.satellite[b]! ? 1 : 0),
  );
  for (let k = 1; k < n; k++) {
    const [a, b] = [order[k - 1]!, order[k]!];
    if (obs.epochMs[a] === obs.epochMs[b] && obs.satellite[a] === obs.satellite[b]) {
      throw new FormatError(
        `observations.${Math.max(a, b)}`,
        `repeats epoch and satellite of observations.${Math.min(a, b)} (${obs.satellite[a]}); each satellite once per epoch`,
      );
    }
  }
  const dictionary = [...new Set(obs.satellite)].sort();
  if (dictionary.length > MAX_DAY_SATELLITES) {
    throw new FormatError('observations', `${dictionary.length} distinct satellites in one day; at most ${MAX_DAY_SATELLITES}`);
  }
  const index = new Map(dictionary.map((s, i) => [s, i]));
  const hasSigma = obs.sigmaM !== undefined && obs.sigmaM.some((v) => v !== null);
  const dictBytes = Buffer.from(JSON.stringify(dictionary), 'utf8');
  const headerBytes = 4 + 4 + 2 + 1 + 4 + dictBytes.length;
  const buffer = Buffer.alloc(headerBytes + n * (4 + 2 + 8 * (hasSigma ? 4 : 3)));
  buffer.write(MAGIC, 0, 'ascii');
  buffer.writeUInt32LE(n, 4);
  buffer.writeUInt16LE(dictionary.length, 8);
  buffer.writeUInt8(hasSigma ? SIGMA_FLAG : 0, 10);
  buffer.writeUInt32LE(dictBytes.length, 11);
  dictBytes.copy(buffer, 15);
  let at = headerBytes;
  for (const i of order) at = buffer.writeUInt32LE(obs.epochMs[i]! - start, at);
  for (const i of order) at = buffer.writeUInt16LE(index.get(obs.satellite[i]!)!, at);
  const floats = [obs.elevationDeg, obs.azimuthDeg, obs.residualM];
  for (const column of floats) for (const i of order) at = buffer.writeDoubleLE(column[i]!, at);
  if (hasSigma) for (const i of order) at = buffer.writeDoubleLE(obs.sigmaM![i] ?? NaN, at);
  const bytes = deflateSync(buffer, { level: 6 });
  return { bytes, sha256: createHash('sha256').update(bytes).digest('hex'), observationCount: n };
}

/** The stored form back to columns (rows in canonical order). @throws Error for bytes that are not the form */
export function decodeResidualDay(day: string, bytes: Uint8Array): ResidualDay {
  const buffer = inflateSync(bytes);
  if (buffer.toString('ascii', 0, 4) !== MAGIC) throw new Error('not a stored residual day (magic)');
  const n = buffer.readUInt32LE(4);
  const hasSigma = (buffer.readUInt8(10) & SIGMA_FLAG) !== 0;
  const dictLength = buffer.readUInt32LE(11);
  const dictionary = JSON.parse(buffer.toString('utf8', 15, 15 + dictLength)) as string[];
  const start = dayStartMs(day);
  let at = 15 + dictLength;
  const epochMs = new Array<number>(n);
  const satellite = new Array<string>(n);
  for (let k = 0; k < n; k++, at += 4) epochMs[k] = start + buffer.readUInt32LE(at);
  for (let k = 0; k < n; k++, at += 2) satellite[k] = dictionary[buffer.readUInt16LE(at)]!;
  const float64s = () => {
    const out = new Array<number>(n);
    for (let k = 0; k < n; k++, at += 8) out[k] = buffer.readDoubleLE(at);
    return out;
  };
  const elevationDeg = float64s();
  const azimuthDeg = float64s();
  const residualM = float64s();
  const sigmaM = hasSigma ? float64s().map((v) => (Number.isNaN(v) ? null : v)) : undefined;
  return { epochMs, satellite, elevationDeg, azimuthDeg, residualM, sigmaM };
}
