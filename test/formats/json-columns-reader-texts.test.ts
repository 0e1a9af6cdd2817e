/**
 * The texts of readJsonColumnsBody (src/formats/json-columns-reader.ts) against JSON.parse (ECMA-262
 * JSON.parse): texts of every length around 1024 bytes (where they were once made in pieces) and long ones
 * give JSON.parse's strings. The column check here is the test's own (any text).
 */

import { describe, expect, it } from 'vitest';
import { readJsonColumnsBody, type JsonColumnSpec } from '../../src/formats/json-columns-reader.js';

const SPECS: Record<string, JsonColumnSpec> = { t: { kind: 'text', required: true, accept: () => true } };

/** Printable ASCII without the quote and the backslash, repeated to `length` characters, from `offset`. */
const printable = (length: number, offset: number) =>
  Array.from({ length }, (_, i) => {
    const c = 0x20 + ((i + offset) % 95);
    return c === 0x22 || c === 0x5c ? 'x' : String.fromCharCode(c);
  }).join('');

describe('long texts as JSON.parse gives them (ECMA-262 JSON.parse)', () => {
  it('lengths 1–3 and around 1024, 2048 and 3072 bytes', () => {
    const lengths = [1, 2, 3, 1023, 1024, 1025, 2047, 2048, 2049, 3071, 3072, 3073, 5000];
    const texts = lengths.map((n, k) => printable(n, k));
    const body = JSON.stringify({ observations: { t: [...texts, texts[4]!] } });
    const read = readJsonColumnsBody(new Uint8Array(Buffer.from(body)), 'observations', SPECS, 100);
    expect(read).toBeDefined();
    const expected = (JSON.parse(body) as { observations: { t: string[] } }).observations.t;
    expect(Array.from(read!.texts.t!.index, (k) => read!.texts.t!.distinct[k])).toEqual(expected);
    expect(read!.texts.t!.distinct.length).toBe(lengths.length);
  });
});
