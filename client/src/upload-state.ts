/**
 * The resume state of an upload: a small JSON file next to the input (`<input>.tropo-state.json` unless
 * the caller names another) that lists, per station and day, the digest of the body the client sent and
 * what the service answered. It is rewritten whole after every accepted day (written to a temporary file,
 * then renamed over the old one), so a process killed at any moment leaves either the old or the new
 * state, never half of one; a day sent but not yet recorded is simply sent again on the rerun, which the
 * idempotent routes turn into "unchanged".
 */

import { createHash } from 'node:crypto';
import { existsSync, readFileSync, renameSync, writeFileSync } from 'node:fs';

/** What the client remembers of one day (or met chunk) the service accepted. */
export interface DayRecord {
  /** sha256 (hex) of the exact body the client sent for the day. */
  bodySha256: string;
  /** The service's sha256 of its stored form (residual deposits), to notice a day replaced since. */
  serviceSha256?: string;
  /** Observations or records in the body. */
  count: number;
  /** When the service accepted it (ISO 8601). */
  acceptedAt: string;
}

interface StateFile {
  /** Layout version of this file. */
  version: 1;
  /** What kind of upload: residual deposits or met records. */
  kind: 'residuals' | 'met';
  /** station id → day (YYYY-MM-DD) → record. */
  stations: Record<string, Record<string, DayRecord>>;
}

export class UploadState {
  private readonly state: StateFile;

  private constructor(
    readonly path: string,
    kind: StateFile['kind'],
    state: StateFile | undefined,
  ) {
    this.state = state ?? { version: 1, kind, stations: {} };
  }

  /** Reads the state at `path` (a fresh one when the file is absent); refuses a file of another kind. */
  static load(path: string, kind: StateFile['kind']): UploadState {
    if (!existsSync(path)) return new UploadState(path, kind, undefined);
    let parsed: StateFile;
    try {
      parsed = JSON.parse(readFileSync(path, 'utf8')) as StateFile;
    } catch (err) {
      throw new Error(`the resume state ${path} is not JSON (${(err as Error).message}): delete it to upload every day again`);
    }
    if (parsed.version !== 1 || parsed.kind !== kind || typeof parsed.stations !== 'object')
      throw new Error(`the resume state ${path} is not a ${kind} upload state: name another file with --state or delete it`);
    return new UploadState(path, kind, parsed);
  }

  get(stationId: string, day: string): DayRecord | undefined {
    return this.state.stations[stationId]?.[day];
  }

  /** Records an accepted day and writes the file at once (atomically: temporary file, then rename). */
  record(stationId: string, day: string, record: DayRecord): void {
    (this.state.stations[stationId] ??= {})[day] = record;
    const temporary = `${this.path}.${process.pid}.tmp`;
    writeFileSync(temporary, JSON.stringify(this.state, null, 1) + '\n');
    renameSync(temporary, this.path);
  }
}

/** The state file used for `inputPath` when the caller names none. */
export function defaultStatePath(inputPath: string): string {
  return `${inputPath}.tropo-state.json`;
}

export function sha256Hex(body: string | Uint8Array): string {
  return createHash('sha256').update(body).digest('hex');
}
