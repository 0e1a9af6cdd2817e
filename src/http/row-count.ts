/**
 * Rows of an estimation body counted while it arrives, chunk by chunk, so that a request over the
 * observation limit is refused before the whole body is held (issue 14: a body over 500 000
 * observations was refused only after it was read and parsed, 515 MB of memory). Each counter gives
 * a lower bound of the rows seen so far — it never refuses a request the full reader would accept:
 *
 * - CSV: line ends after the header line (a blank line at the end is not a row: at most one too many
 *   per blank line, far below any limit);
 * - JSON: the elements of the top-level `observations` value, objects (commas in that array) or
 *   column arrays (commas in the longest column), by a small scanner that tracks strings and depth
 *   only (no values are parsed or kept);
 * - Arrow IPC stream: the lengths of the record batches, from each message's metadata (the batch
 *   bodies are skipped, never decoded).
 *
 * Pure: bytes in, a count out.
 */

import { Message } from 'apache-arrow';
import type { z } from 'zod';

export interface RowCounter {
  push(chunk: Uint8Array): void;
  /** Rows seen so far (a lower bound of the rows of the whole body). */
  readonly rows: number;
}

const NEWLINE = 0x0a;

/** The shortest date-time an ISO 8601 epoch schema (`z.iso.datetime`, src/http/schemas/common.ts) accepts: 2026-03-14T12:00:00Z. */
const SHORTEST_ISO_DATETIME_CHARS = 20;

/**
 * The fewest bytes one row of `shape` takes in a JSON body, in the form that takes fewest: column arrays (a
 * value and a comma per required column; as objects a row also repeats its keys). Optional fields count 0, a
 * number 1 byte (one digit), a string its quotes and the schema's minimum length, an ISO date-time 20
 * characters, any other value 1 byte (no JSON value is shorter). A body of R rows takes at least
 * R × this many bytes (its last commas are fewer than the bytes of the column names), so a body declared
 * shorter than (maxRows + 1) × this cannot hold more than maxRows valid rows: its rows need not be counted
 * while it arrives (the full check after parsing still names the field of anything off).
 */
export function fewestJsonBytesPerRow(shape: Record<string, z.ZodType>): number {
  let bytes = 0;
  for (const field of Object.values(shape)) {
    if (field.safeParse(undefined).success) continue; // optional: absent in the fewest bytes
    const spec = field as unknown as { type: string; format?: string | null; minLength?: number | null };
    const value =
      spec.type === 'number'
        ? 1
        : spec.type === 'string'
          ? 2 + (spec.format === 'datetime' ? SHORTEST_ISO_DATETIME_CHARS : (spec.minLength ?? 0))
          : 1;
    bytes += value + 1; // and its comma
  }
  return bytes;
}

/** CSV: data lines so far (line ends minus the header's). */
export function csvRowCounter(): RowCounter {
  let lineEnds = 0;
  return {
    push(chunk) {
      const bytes = Buffer.from(chunk.buffer, chunk.byteOffset, chunk.byteLength);
      for (let at = bytes.indexOf(NEWLINE); at >= 0; at = bytes.indexOf(NEWLINE, at + 1)) lineEnds++;
    },
    get rows() {
      return Math.max(0, lineEnds - 1);
    },
  };
}

const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const OPEN_OBJECT = 0x7b;
const CLOSE_OBJECT = 0x7d;
const OPEN_ARRAY = 0x5b;
const CLOSE_ARRAY = 0x5d;
const COMMA = 0x2c;
const COLON = 0x3a;
const KEY = 'observations';

/**
 * JSON: the rows of the top-level `observations`. Depth 1 is inside the root object; a string there is
 * remembered (up to the key's length) so that the value opened after `"observations":` is recognised.
 *
 * The state lives in fields that `push` copies into locals for its loop (a closure's captured variables
 * cost a context load and store per byte: 25 ms of event-loop CPU per 2.3 MB body, issue 14), and a
 * string below depth 1 (an epoch, a satellite name) is skipped in a loop of its own.
 */
export function jsonRowCounter(): RowCounter {
  return new JsonRowCounter();
}

class JsonRowCounter implements RowCounter {
  private inString = false;
  private escaped = false;
  private depth = 0;
  private text = ''; // the current string at depth 1, while it is no longer than KEY
  private lastString = '';
  private key = '';
  private observations = 0; // the container of `observations` (OPEN_ARRAY or OPEN_OBJECT) while inside it, else 0
  private objectCommas = 0; // commas at depth 2 inside observations as objects
  private columnCommas = 0; // commas at depth 3 inside the current column
  private longestColumn = 0;
  private inColumn = false;

  push(chunk: Uint8Array): void {
    const bytes = chunk;
    let { inString, escaped, depth, text, lastString, key, observations, objectCommas, columnCommas, longestColumn, inColumn } = this;
    const n = bytes.length;
    for (let i = 0; i < n; i++) {
      if (inString) {
        if (depth !== 1) {
          // A string below depth 1 (an epoch, a satellite name): only its end matters.
          for (; i < n; i++) {
            const c = bytes[i]!;
            if (escaped) escaped = false;
            else if (c === BACKSLASH) escaped = true;
            else if (c === QUOTE) {
              inString = false;
              break;
            }
          }
          continue;
        }
        const b = bytes[i]!;
        if (escaped) escaped = false;
        else if (b === BACKSLASH) escaped = true;
        else if (b === QUOTE) {
          inString = false;
          lastString = text;
        } else if (text.length <= KEY.length) text += String.fromCharCode(b);
        continue;
      }
      if (inColumn && depth === 3) {
        // Inside a column: count its commas in a loop of their own up to the next string or bracket.
        for (; i < n; i++) {
          const c = bytes[i]!;
          if (c === COMMA) columnCommas++;
          else if (c === QUOTE || c === OPEN_ARRAY || c === CLOSE_ARRAY || c === OPEN_OBJECT || c === CLOSE_OBJECT) break;
        }
        if (columnCommas + 1 > longestColumn) longestColumn = columnCommas + 1;
        if (i === n) break;
      }
      const b = bytes[i]!;
      switch (b) {
        case QUOTE:
          inString = true;
          text = '';
          break;
        case COLON:
          if (depth === 1) key = lastString;
          break;
        case OPEN_OBJECT:
        case OPEN_ARRAY:
          depth++;
          if (depth === 2) observations = key === KEY ? b : 0;
          else if (depth === 3 && observations === OPEN_OBJECT && b === OPEN_ARRAY) {
            inColumn = true;
            columnCommas = 0;
          }
          break;
        case CLOSE_OBJECT:
        case CLOSE_ARRAY:
          if (depth === 3) inColumn = false;
          if (depth === 2) observations = 0;
          if (depth === 1) key = '';
          depth--;
          break;
        case COMMA:
          if (depth === 1) key = '';
          else if (depth === 2 && observations === OPEN_ARRAY) objectCommas++;
          else if (depth === 3 && inColumn && ++columnCommas + 1 > longestColumn) longestColumn = columnCommas + 1; // (after a string)
          break;
      }
    }
    Object.assign(this, {
      inString,
      escaped,
      depth,
      text,
      lastString,
      key,
      observations,
      objectCommas,
      columnCommas,
      longestColumn,
      inColumn,
    });
  }

  get rows(): number {
    return Math.max(this.objectCommas > 0 ? this.objectCommas + 1 : 0, this.longestColumn);
  }
}

const CONTINUATION = 0xffffffff;

/**
 * Arrow IPC stream: record batch lengths from the message metadata. Each message is [0xFFFFFFFF]
 * [int32 metadata length][flatbuffer Message][body of bodyLength bytes] (the continuation marker may be
 * absent in the pre-1.0 format); only the metadata is held, the bodies are counted past.
 */
export function arrowRowCounter(): RowCounter {
  let pending = Buffer.alloc(0);
  let skip = 0;
  let rows = 0;
  let ended = false;
  const step = (): boolean => {
    if (pending.length < 4) return false;
    let at = 0;
    if (pending.readUInt32LE(0) === CONTINUATION) {
      if (pending.length < 8) return false;
      at = 4;
    }
    const metadataLength = pending.readInt32LE(at);
    if (metadataLength <= 0) {
      ended = true; // end of stream
      return false;
    }
    if (pending.length < at + 4 + metadataLength) return false;
    const message = Message.decode(pending.subarray(at + 4, at + 4 + metadataLength));
    if (message.isRecordBatch()) rows += Number(message.header().length);
    pending = pending.subarray(at + 4 + metadataLength);
    skip = Number(message.bodyLength);
    return true;
  };
  return {
    push(chunk) {
      let bytes = Buffer.from(chunk.buffer, chunk.byteOffset, chunk.byteLength);
      while (!ended && bytes.length > 0) {
        if (skip > 0) {
          const n = Math.min(skip, bytes.length);
          skip -= n;
          bytes = bytes.subarray(n);
          continue;
        }
        pending = Buffer.concat([pending, bytes]);
        bytes = Buffer.alloc(0);
        while (!ended && skip === 0 && step());
        if (skip > 0 && pending.length > 0) {
          bytes = pending; // what followed the metadata: the start of the body (and maybe more)
          pending = Buffer.alloc(0);
        }
      }
    },
    get rows() {
      return rows;
    },
  };
}
